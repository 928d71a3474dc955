#include "core/dsp/Zoom.h"

#include "core/dsp/Fft.h"
#include "core/util/Sums.h"

#include <algorithm>
#include <cmath>
#include <optional>

namespace humwise::dsp {

Result<ZoomTransform, AnalysisError> ZoomTransform::of(std::span<const double> x, double fs, std::optional<double> resolutionHz,
                                                      const WindowSpec& window) {
    using Code = AnalysisError::Code;
    if (!(fs > 0)) return fail(AnalysisError{Code::InvalidRequest, "zoom: sample rate must be > 0"});
    if (x.size() < 16) return fail(AnalysisError{Code::RecordTooShort, "zoom: the record needs at least 16 samples"});
    if (resolutionHz && !(*resolutionHz > 0))
        return fail(AnalysisError{Code::InvalidRequest, "zoom: resolution must be > 0 Hz"});
    const std::size_t n = x.size();
    std::size_t nfft = n;
    if (resolutionHz) {
        const double wanted = std::ceil(fs / *resolutionHz);
        if (wanted > static_cast<double>(1u << 28))
            return fail(AnalysisError{Code::InvalidRequest, "zoom: the asked resolution needs a transform longer than 2^28 points"});
        nfft = std::max(n, static_cast<std::size_t>(wanted));
    }
    nfft = nextFastFftSize(nfft);

    // Cached: a route zooms every motor's current records, all of one length (the window of
    // 200 000 points costs 800 000 cosines to build).
    const SummedWindow cached = cachedWindow(window, n);
    const std::vector<double>& w = *cached.samples;
    ZoomTransform t;
    t.m_fs = fs;
    t.m_n = n;
    t.m_nfft = nfft;
    t.m_window = window;
    t.m_s1 = cached.s1;
    t.m_s2 = cached.s2;
    const double mean = util::sumOf(x) / static_cast<double>(n);
    std::optional<RealFft<double>> own;
    RealFft<double>& fft = keptRealFft<double>(nfft, own);
    auto in = fft.input();
    for (std::size_t i = 0; i < n; ++i) in[i] = (x[i] - mean) * w[i];
    std::fill(in.begin() + static_cast<std::ptrdiff_t>(n), in.end(), 0.0);
    fft.execute();
    const auto out = fft.output();
    t.m_power.resize(out.size());
    for (std::size_t k = 0; k < out.size(); ++k) t.m_power[k] = std::norm(out[k]);
    return t;
}

Result<Spectrum, AnalysisError> ZoomTransform::band(double centreHz, double spanHz, SpectrumScale scale, Quantity quantity) const {
    using Code = AnalysisError::Code;
    if (!(spanHz > 0) || !(centreHz >= 0) || centreHz + spanHz / 2 > m_fs / 2)
        return fail(AnalysisError{Code::InvalidRequest, "zoom: the band centre +- span/2 must lie within 0 .. fs/2"});
    Spectrum s;
    s.sampleRateHz = m_fs;
    s.resolutionHz = m_fs / static_cast<double>(m_nfft);
    s.enbwHz = m_fs * m_s2 / (m_s1 * m_s1);
    s.segmentLength = m_n;
    s.transformLength = m_nfft;
    s.averages = 1;
    s.window = m_window;
    s.scale = scale;
    s.quantity = quantity;
    const double lo = std::max(0.0, centreHz - spanHz / 2);
    const double hi = centreHz + spanHz / 2;
    const auto k0 = static_cast<std::size_t>(std::ceil(lo / s.resolutionHz));
    const auto k1 = std::min(m_power.size() - 1, static_cast<std::size_t>(std::floor(hi / s.resolutionHz)));
    s.startHz = static_cast<double>(k0) * s.resolutionHz;
    for (std::size_t k = k0; k <= k1; ++k) {
        const bool edge = k == 0 || (m_nfft % 2 == 0 && k == m_nfft / 2);
        s.values.push_back(scaleLine(m_power[k], edge, scale, m_s1, m_s2, m_fs));
    }
    return s;
}

Result<Spectrum, AnalysisError> zoomSpectrum(std::span<const double> x, double fs, const ZoomRequest& r) {
    using Code = AnalysisError::Code;
    if (!(fs > 0)) return fail(AnalysisError{Code::InvalidRequest, "zoom: sample rate must be > 0"});
    if (x.size() < 16) return fail(AnalysisError{Code::RecordTooShort, "zoom: the record needs at least 16 samples"});
    // The band is checked before the transform is paid for.
    if (!(r.spanHz > 0) || !(r.centreHz >= 0) || r.centreHz + r.spanHz / 2 > fs / 2)
        return fail(AnalysisError{Code::InvalidRequest, "zoom: the band centre +- span/2 must lie within 0 .. fs/2"});
    auto t = ZoomTransform::of(x, fs, r.resolutionHz, r.window);
    if (!t) return fail(t.error());
    return t.value().band(r.centreHz, r.spanHz, r.scale, r.quantity);
}

} // namespace humwise::dsp
