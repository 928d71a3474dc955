#include "core/dsp/BandSignal.h"

#include "core/dsp/Fft.h"

#include <algorithm>
#include <cmath>
#include <numbers>
#include <stdexcept>

namespace humwise::dsp {

RecordSpectrum::RecordSpectrum(std::span<const double> x, double fs) : m_n(x.size()), m_fs(fs) {
    if (x.size() < 4) throw std::invalid_argument("RecordSpectrum: the record needs at least 4 samples");
    if (!(fs > 0)) throw std::invalid_argument("RecordSpectrum: sample rate must be > 0");
    double mean = 0;
    for (double v : x) mean += v;
    mean /= static_cast<double>(x.size());
    RealFft<double> fft(m_n);
    auto in = fft.input();
    for (std::size_t i = 0; i < m_n; ++i) in[i] = x[i] - mean;
    fft.execute();
    const auto out = fft.output();
    m_bins.assign(out.begin(), out.end());
}

BandSignal extractBand(const RecordSpectrum& spectrum, double loHz, double hiHz, std::size_t minLength,
                       double taperFraction) {
    const double df = spectrum.lineSpacingHz();
    const std::size_t last = spectrum.bins().size() - 1;
    if (!(hiHz > loHz) || loHz < 0)
        throw std::invalid_argument("extractBand: the band must satisfy 0 <= lo < hi");
    const auto kl = std::min<std::size_t>(last, static_cast<std::size_t>(std::ceil(loHz / df)));
    const auto kh = std::min<std::size_t>(last, static_cast<std::size_t>(std::floor(hiHz / df)));
    if (kh <= kl) throw std::invalid_argument("extractBand: the band is narrower than one line or above Nyquist");
    const std::size_t width = kh - kl + 1;
    const std::size_t m = nextFastFftSize(std::max(width, minLength));
    ComplexFft<double> inverse(m, FftDirection::Backward);
    auto data = inverse.data();
    std::fill(data.begin(), data.end(), std::complex<double>(0.0, 0.0));
    const auto bins = spectrum.bins();
    const double taper = std::clamp(taperFraction, 0.0, 0.5) * static_cast<double>(width);
    const double scale = 2.0 / static_cast<double>(spectrum.length());
    for (std::size_t i = 0; i < width; ++i) {
        const double edge = std::min(static_cast<double>(i), static_cast<double>(width - 1 - i));
        const double t = (taper > 0 && edge < taper) ? 0.5 - 0.5 * std::cos(std::numbers::pi * (edge + 0.5) / taper) : 1.0;
        // The analytic signal weights DC and (even N) the Nyquist line by 1/N, the others by 2/N
        // (Marple 1999, "Computing the discrete-time analytic signal via FFT").
        const std::size_t k = kl + i;
        const bool outerLine = k == 0 || (spectrum.length() % 2 == 0 && k == spectrum.length() / 2);
        data[i] = bins[k] * ((outerLine ? 0.5 * scale : scale) * t);
    }
    inverse.execute();
    BandSignal out;
    out.samples.assign(data.begin(), data.end());
    out.sampleRateHz = static_cast<double>(m) * df;
    out.loHz = static_cast<double>(kl) * df;
    out.hiHz = static_cast<double>(kh) * df;
    return out;
}

} // namespace humwise::dsp
