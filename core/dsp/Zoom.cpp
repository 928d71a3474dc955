#include "core/dsp/Zoom.h"

#include "core/dsp/Fft.h"
#include "core/util/Sums.h"

#include <algorithm>
#include <cmath>

namespace humwise::dsp {

Result<Spectrum, AnalysisError> zoomSpectrum(std::span<const double> x, double fs, const ZoomRequest& r) {
    using Code = AnalysisError::Code;
    if (!(fs > 0)) return fail(AnalysisError{Code::InvalidRequest, "zoom: sample rate must be > 0"});
    if (x.size() < 16) return fail(AnalysisError{Code::RecordTooShort, "zoom: the record needs at least 16 samples"});
    if (!(r.spanHz > 0) || !(r.centreHz >= 0) || r.centreHz + r.spanHz / 2 > fs / 2)
        return fail(AnalysisError{Code::InvalidRequest, "zoom: the band centre +- span/2 must lie within 0 .. fs/2"});
    if (r.resolutionHz && !(*r.resolutionHz > 0))
        return fail(AnalysisError{Code::InvalidRequest, "zoom: resolution must be > 0 Hz"});
    const std::size_t n = x.size();
    std::size_t nfft = n;
    if (r.resolutionHz) {
        const double wanted = std::ceil(fs / *r.resolutionHz);
        if (wanted > static_cast<double>(1u << 28))
            return fail(AnalysisError{Code::InvalidRequest, "zoom: the asked resolution needs a transform longer than 2^28 points"});
        nfft = std::max(n, static_cast<std::size_t>(wanted));
    }
    nfft = nextFastFftSize(nfft);

    // Cached: a route zooms every motor's current records, all of one length (the window of
    // 200 000 points costs 800 000 cosines to build).
    const auto window = cachedWindow(r.window, n);
    const std::vector<double>& w = *window;
    const double s1 = util::sumOf(w), s2 = util::deviationSums(w, 0.0).squares;
    const double mean = util::sumOf(x) / static_cast<double>(n);
    RealFft<double> fft(nfft);
    auto in = fft.input();
    for (std::size_t i = 0; i < n; ++i) in[i] = (x[i] - mean) * w[i];
    std::fill(in.begin() + static_cast<std::ptrdiff_t>(n), in.end(), 0.0);
    fft.execute();
    const auto out = fft.output();

    Spectrum s;
    s.sampleRateHz = fs;
    s.resolutionHz = fs / static_cast<double>(nfft);
    s.enbwHz = fs * s2 / (s1 * s1);
    s.segmentLength = n;
    s.transformLength = nfft;
    s.averages = 1;
    s.window = r.window;
    s.scale = r.scale;
    s.quantity = r.quantity;
    const double lo = std::max(0.0, r.centreHz - r.spanHz / 2);
    const double hi = r.centreHz + r.spanHz / 2;
    const auto k0 = static_cast<std::size_t>(std::ceil(lo / s.resolutionHz));
    const auto k1 = std::min(out.size() - 1, static_cast<std::size_t>(std::floor(hi / s.resolutionHz)));
    s.startHz = static_cast<double>(k0) * s.resolutionHz;
    for (std::size_t k = k0; k <= k1; ++k) {
        const bool edge = k == 0 || (nfft % 2 == 0 && k == nfft / 2);
        s.values.push_back(scaleLine(std::norm(out[k]), edge, r.scale, s1, s2, fs));
    }
    return s;
}

} // namespace humwise::dsp
