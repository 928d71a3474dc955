#include "core/dsp/BandSignal.h"

#include "core/dsp/Fft.h"

#include <algorithm>
#include <cmath>
#include <memory>
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

namespace {

// The band's analytic signal, inverse-transformed in place in `inverse` (made here, of the
// length the band needs); returns the band limits actually used (rounded to lines).
template <class Real>
struct BandCut {
    std::unique_ptr<ComplexFft<Real>> inverse;
    double sampleRateHz = 0, loHz = 0, hiHz = 0;
};

template <class Real>
BandCut<Real> cutBand(const RecordSpectrum& spectrum, double loHz, double hiHz, std::size_t minLength, double taperFraction) {
    const double df = spectrum.lineSpacingHz();
    const std::size_t last = spectrum.bins().size() - 1;
    if (!(hiHz > loHz) || loHz < 0)
        throw std::invalid_argument("extractBand: the band must satisfy 0 <= lo < hi");
    const auto kl = std::min<std::size_t>(last, static_cast<std::size_t>(std::ceil(loHz / df)));
    const auto kh = std::min<std::size_t>(last, static_cast<std::size_t>(std::floor(hiHz / df)));
    if (kh <= kl) throw std::invalid_argument("extractBand: the band is narrower than one line or above Nyquist");
    const std::size_t width = kh - kl + 1;
    const std::size_t m = nextFastFftSize(std::max(width, minLength));
    BandCut<Real> cut;
    cut.inverse = std::make_unique<ComplexFft<Real>>(m, FftDirection::Backward);
    auto data = cut.inverse->data();
    std::fill(data.begin(), data.end(), std::complex<Real>(0, 0));
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
        data[i] = std::complex<Real>(bins[k] * ((outerLine ? 0.5 * scale : scale) * t));
    }
    cut.inverse->execute();
    cut.sampleRateHz = static_cast<double>(m) * df;
    cut.loHz = static_cast<double>(kl) * df;
    cut.hiHz = static_cast<double>(kh) * df;
    return cut;
}

} // namespace

BandSignal extractBand(const RecordSpectrum& spectrum, double loHz, double hiHz, std::size_t minLength, double taperFraction) {
    const auto cut = cutBand<double>(spectrum, loHz, hiHz, minLength, taperFraction);
    BandSignal out;
    const auto data = cut.inverse->data();
    out.samples.assign(data.begin(), data.end());
    out.sampleRateHz = cut.sampleRateHz;
    out.loHz = cut.loHz;
    out.hiHz = cut.hiHz;
    return out;
}

namespace {

template <class Real>
BandMoments momentsOf(const RecordSpectrum& spectrum, double loHz, double hiHz, std::size_t minLength, double taperFraction) {
    const auto cut = cutBand<Real>(spectrum, loHz, hiHz, minLength, taperFraction);
    double m2 = 0, m4 = 0; // accumulated in double whatever the transform's precision
    for (const auto& z : cut.inverse->data()) {
        const double p = std::norm(std::complex<double>(z));
        m2 += p;
        m4 += p * p;
    }
    const double n = static_cast<double>(cut.inverse->data().size());
    m2 /= n;
    m4 /= n;
    return {m2, m2 > 0 ? m4 / (m2 * m2) - 2.0 : 0.0};
}

} // namespace

BandMoments bandMoments(const RecordSpectrum& spectrum, double loHz, double hiHz, std::size_t minLength, double taperFraction, Precision precision) {
    return precision == Precision::Single ? momentsOf<float>(spectrum, loHz, hiHz, minLength, taperFraction)
                                          : momentsOf<double>(spectrum, loHz, hiHz, minLength, taperFraction);
}

} // namespace humwise::dsp
