#include "core/dsp/Spectrum.h"

#include "core/dsp/BandSignal.h"
#include "core/dsp/Fft.h"
#include "core/util/Sums.h"
#include "core/util/VectorClones.h"

#include <algorithm>
#include <cctype>
#include <cmath>
#include <complex>
#include <cstdio>
#include <limits>
#include <map>
#include <memory>
#include <mutex>
#include <optional>
#include <string>
#include <tuple>

namespace humwise::dsp {
namespace {

constexpr double kSqrt2 = 1.4142135623730951;

std::string requestError(const std::string& what) { return "spectrum: " + what; }

// A window prepared for averaging: its samples and sums (cachedWindow) and the leading lines of
// its own DFT.
// Removing a segment's mean m after the transform, X[k] -= m W[k], is exact (the DFT is linear)
// and saves a pass over the data: W[k] of a cosine-sum window vanishes beyond a few lines, so
// only the lines where |W[k]| exceeds 1e-13 S1 are kept.
struct PreparedWindow : SummedWindow {
    std::vector<std::complex<double>> dftHead;
};

std::shared_ptr<const PreparedWindow> preparedWindow(const WindowSpec& spec, std::size_t n) {
    using Key = std::tuple<int, double, std::size_t>;
    static std::mutex mutex;
    static std::map<Key, std::shared_ptr<const PreparedWindow>> cache;
    const Key key{static_cast<int>(spec.kind), spec.kind == WindowKind::Kaiser ? spec.kaiserBeta : 0.0, n};
    {
        std::lock_guard lock(mutex);
        if (auto it = cache.find(key); it != cache.end()) return it->second;
    }
    auto p = std::make_shared<PreparedWindow>(PreparedWindow{cachedWindow(spec, n), {}});
    const auto& w = *p->samples;
    RealFft<double> fft(n);
    std::copy(w.begin(), w.end(), fft.input().begin());
    fft.execute();
    const auto out = fft.output();
    std::size_t last = 0;
    for (std::size_t k = 0; k < out.size(); ++k)
        if (std::abs(out[k]) > 1e-13 * p->s1) last = k;
    p->dftHead.assign(out.begin(), out.begin() + static_cast<std::ptrdiff_t>(last + 1));
    std::lock_guard lock(mutex);
    if (cache.size() >= 256) cache.clear();
    cache.emplace(key, p);
    return p;
}

Result<std::size_t, AnalysisError> chooseSegmentLength(std::size_t available, double fs, const SpectrumRequest& r,
                                                       double fmax) {
    if (r.resolutionHz) {
        if (!(*r.resolutionHz > 0) || !std::isfinite(*r.resolutionHz))
            return fail(AnalysisError{AnalysisError::Code::InvalidRequest, requestError("resolution must be > 0 Hz")});
        return static_cast<std::size_t>(std::llround(fs / *r.resolutionHz));
    }
    if (r.lines) {
        if (*r.lines < 1 || *r.lines > (1u << 26))
            return fail(AnalysisError{AnalysisError::Code::InvalidRequest, requestError("lines must be between 1 and 2^26")});
        return static_cast<std::size_t>(std::llround(fs * static_cast<double>(*r.lines) / fmax));
    }
    const auto wanted = static_cast<std::size_t>(std::llround(fs * static_cast<double>(kDefaultLines) / fmax));
    return std::min(wanted, available);
}

} // namespace

std::optional<SpectrumScale> parseSpectrumScale(std::string_view text) {
    if (text == "peak" || text == "pk") return SpectrumScale::Peak;
    if (text == "rms") return SpectrumScale::Rms;
    if (text == "pp" || text == "peak-to-peak" || text == "pk-pk") return SpectrumScale::PeakToPeak;
    if (text == "psd") return SpectrumScale::Psd;
    return std::nullopt;
}

std::string_view spectrumScaleName(SpectrumScale scale) {
    switch (scale) {
    case SpectrumScale::Peak: return "peak";
    case SpectrumScale::Rms: return "rms";
    case SpectrumScale::PeakToPeak: return "pp";
    case SpectrumScale::Psd: return "psd";
    }
    return "?";
}

double scaleLine(double meanSquaredMagnitude, bool isEdge, SpectrumScale scale, double s1, double s2, double fs) {
    const double factor = isEdge ? 1.0 : 2.0;
    if (scale == SpectrumScale::Psd) return factor * meanSquaredMagnitude / (fs * s2);
    const double peak = factor * std::sqrt(meanSquaredMagnitude) / s1;
    switch (scale) {
    case SpectrumScale::Peak: return peak;
    case SpectrumScale::Rms: return isEdge ? peak : peak / kSqrt2;
    case SpectrumScale::PeakToPeak: return 2.0 * peak;
    case SpectrumScale::Psd: break;
    }
    return peak;
}

namespace {

// What a request asks of a record of `available` samples, checked: the segment length, the step
// between segments, how many are averaged, the highest frequency kept.
struct SegmentPlan {
    std::size_t n = 0, step = 0, averages = 0;
    double fmax = 0;
};

Result<SegmentPlan, AnalysisError> planSegments(std::size_t available, double fs, const SpectrumRequest& r) {
    using Code = AnalysisError::Code;
    if (!(fs > 0) || !std::isfinite(fs))
        return fail(AnalysisError{Code::InvalidRequest, requestError("sample rate must be > 0")});
    if (!(r.overlap >= 0.0 && r.overlap < 1.0))
        return fail(AnalysisError{Code::InvalidRequest, requestError("overlap must be in [0, 1)")});
    if (available < 2)
        return fail(AnalysisError{Code::RecordTooShort, requestError("the record has fewer than 2 samples")});
    SegmentPlan plan;
    const double nyquist = fs / 2.0;
    plan.fmax = r.fmaxHz.value_or(fs / 2.56);
    if (!(plan.fmax > 0) || !std::isfinite(plan.fmax))
        return fail(AnalysisError{Code::InvalidRequest, requestError("fmax must be > 0 Hz")});
    plan.fmax = std::min(plan.fmax, nyquist);

    auto segment = chooseSegmentLength(available, fs, r, plan.fmax);
    if (!segment) return fail(segment.error());
    const std::size_t n = plan.n = segment.value();
    if (n < 2)
        return fail(AnalysisError{Code::InvalidRequest, requestError("the asked resolution is coarser than fs/2")});
    plan.step = std::max<std::size_t>(1, static_cast<std::size_t>(std::llround(static_cast<double>(n) * (1.0 - r.overlap))));
    const std::size_t wantedAverages = r.averages.value_or(0);
    if (r.averages && wantedAverages == 0)
        return fail(AnalysisError{Code::InvalidRequest, requestError("averages must be >= 1")});
    const std::size_t needed = n + (std::max<std::size_t>(wantedAverages, 1) - 1) * plan.step;
    if (available < needed) {
        const double haveS = static_cast<double>(available) / fs, needS = static_cast<double>(needed) / fs;
        char buf[256];
        std::snprintf(buf, sizeof buf,
                      "record too short for the requested resolution: %.4g Hz lines x %zu averages need %.4g s, the record has %.4g s",
                      fs / static_cast<double>(n), std::max<std::size_t>(wantedAverages, 1), needS, haveS);
        return fail(AnalysisError{Code::RecordTooShort, requestError(buf)});
    }
    plan.averages = r.averages ? wantedAverages : 1 + (available - n) / plan.step;
    return plan;
}

// The index of the last line at or below fmax of an n-point transform.
std::size_t linesUpTo(double fmax, double fs, std::size_t n) {
    return std::min(n / 2, static_cast<std::size_t>(std::floor(fmax / (fs / static_cast<double>(n)) + 1e-9)));
}

// The lines up to fmax of the summed squared magnitudes `power` of `plan.averages` transforms.
Spectrum assembleSpectrum(const std::vector<double>& power, double fs, const SegmentPlan& plan, const PreparedWindow& window,
                          const SpectrumRequest& r) {
    const std::size_t n = plan.n;
    Spectrum s;
    s.sampleRateHz = fs;
    s.resolutionHz = fs / static_cast<double>(n);
    s.enbwHz = fs * window.s2 / (window.s1 * window.s1);
    s.segmentLength = n;
    s.transformLength = n;
    s.averages = plan.averages;
    s.window = r.window;
    s.scale = r.scale;
    s.quantity = r.quantity;
    const std::size_t lines = linesUpTo(plan.fmax, fs, n);
    s.values.resize(lines + 1);
    const double inv = 1.0 / static_cast<double>(plan.averages);
    for (std::size_t k = 0; k <= lines; ++k) {
        const bool edge = k == 0 || (n % 2 == 0 && k == n / 2);
        s.values[k] = scaleLine(power[k] * inv, edge, r.scale, window.s1, window.s2, fs);
    }
    return s;
}

// |DFT((x - mean) w)[k]|^2 for k = 0 .. last, from the record's DFT X of x - mean (n points) by
// the DFT's circular convolution property: DFT(x w)[k] = (1/n) sum_m W[m] X[k - m], with W the
// window's DFT, which for a periodic cosine-sum window of K terms has the 2K - 1 lines
// -(K-1) .. K-1 only (`head` holds W[0] .. W[K-1]; W[-m] = conj W[m]; Harris 1978 writes these
// windows' transforms as such sums of shifted kernels). X of a real record is Hermitian:
// X[-j] = conj X[j], X[n - j] = conj X[j].
std::vector<double> windowedPowerFromRecord(std::span<const std::complex<double>> x, std::size_t n,
                                            std::span<const std::complex<double>> head, std::size_t last) {
    const auto lineOf = [&](std::ptrdiff_t j) {
        const auto nn = static_cast<std::ptrdiff_t>(n);
        j %= nn;
        if (j < 0) j += nn;
        return j <= nn / 2 ? x[static_cast<std::size_t>(j)] : std::conj(x[static_cast<std::size_t>(nn - j)]);
    };
    const auto kCount = static_cast<std::ptrdiff_t>(head.size());
    const double invN = 1.0 / static_cast<double>(n);
    std::vector<double> power(last + 1);
    for (std::size_t k = 0; k <= last; ++k) {
        const auto kk = static_cast<std::ptrdiff_t>(k);
        std::complex<double> y = head[0] * x[k];
        if (kk >= kCount && kk + kCount <= static_cast<std::ptrdiff_t>(n / 2)) {
            for (std::ptrdiff_t m = 1; m < kCount; ++m) {
                const auto um = static_cast<std::size_t>(m);
                y += head[um] * x[k - um] + std::conj(head[um]) * x[k + um];
            }
        } else {
            for (std::ptrdiff_t m = 1; m < kCount; ++m) {
                const auto um = static_cast<std::size_t>(m);
                y += head[um] * lineOf(kk - m) + std::conj(head[um]) * lineOf(kk + m);
            }
        }
        power[k] = std::norm(y * invN);
    }
    return power;
}

// Windows whose DFT this short are derived from the record's transform (cosine sums: Hann and
// Hamming 2 lines, Blackman-Harris 4, flat top 5); others (Kaiser) are transformed directly.
constexpr std::size_t kMaxDerivedWindowLines = 8;

// The convolution needs the window's lines -(K-1) .. K-1 to be distinct lines of the n-point
// DFT (2K - 1 <= n); on shorter records, or windows with longer DFTs, the direct transform.
bool derivable(std::size_t headLines, std::size_t n) {
    return headLines <= kMaxDerivedWindowLines && 2 * headLines - 1 <= n;
}

// power[k] += |out[k]|^2 (vectorises in the clones).
HUMWISE_VECTOR_CLONES void addPower(const std::complex<double>* out, std::size_t bins, double* power) {
    const auto* f = reinterpret_cast<const double*>(out); // std::complex<double> is two doubles ([complex.numbers])
    for (std::size_t k = 0; k < bins; ++k) power[k] += f[2 * k] * f[2 * k] + f[2 * k + 1] * f[2 * k + 1];
}

// The summed squared magnitudes of the planned segments' windowed transforms, all bins.
std::vector<double> segmentPower(std::span<const double> x, const SegmentPlan& plan, const PreparedWindow& window, bool removeMean) {
    const std::size_t n = plan.n;
    const std::vector<double>& w = *window.samples;
    const auto& head = window.dftHead;
    std::optional<RealFft<double>> own;
    RealFft<double>& fft = keptRealFft<double>(n, own);
    const std::size_t bins = n / 2 + 1;
    std::vector<double> power(bins, 0.0);
    auto in = fft.input();
    const double invN = 1.0 / static_cast<double>(n);
    for (std::size_t a = 0; a < plan.averages; ++a) {
        const double* seg = x.data() + a * plan.step;
        const double sum = util::weightedCopyAndSum({seg, n}, w.data(), in.data()); // for the mean, removed after the transform
        fft.execute();
        auto out = fft.output();
        if (removeMean) {
            const double mean = sum * invN;
            for (std::size_t k = 0; k < head.size() && k < bins; ++k) out[k] -= mean * head[k];
        }
        addPower(out.data(), bins, power.data());
    }
    return power;
}

} // namespace

Result<Spectrum, AnalysisError> averagedSpectrum(std::span<const double> x, double fs, const SpectrumRequest& r) {
    auto planned = planSegments(x.size(), fs, r);
    if (!planned) return fail(planned.error());
    const SegmentPlan& plan = planned.value();
    const auto prepared = preparedWindow(r.window, plan.n);
    return assembleSpectrum(segmentPower(x, plan, *prepared, r.removeMean), fs, plan, *prepared, r);
}

Result<Spectrum, AnalysisError> averagedSpectrum(const RecordSpectrum& record, std::span<const double> x, const SpectrumRequest& r) {
    const double fs = record.sampleRateHz();
    if (x.size() != record.length())
        return fail(AnalysisError{AnalysisError::Code::InvalidRequest, requestError("the record's transform is not of this record")});
    auto planned = planSegments(x.size(), fs, r);
    if (!planned) return fail(planned.error());
    const SegmentPlan& plan = planned.value();
    const auto prepared = preparedWindow(r.window, plan.n);
    const bool derive = plan.averages == 1 && plan.n == record.length() && r.removeMean && derivable(prepared->dftHead.size(), plan.n);
    const auto power = derive ? windowedPowerFromRecord(record.bins(), plan.n, prepared->dftHead, linesUpTo(plan.fmax, fs, plan.n))
                              : segmentPower(x, plan, *prepared, r.removeMean);
    return assembleSpectrum(power, fs, plan, *prepared, r);
}

double lineMeanSquare(const Spectrum& s, std::size_t k) {
    const double v = s.values[k];
    const double nenbw = s.enbwHz / (s.sampleRateHz / static_cast<double>(s.segmentLength));
    // Zero padding spreads one line's power over Nfft/N lines: divide by that too.
    const double pad = static_cast<double>(s.transformLength) / static_cast<double>(s.segmentLength);
    switch (s.scale) {
    case SpectrumScale::Psd: return v * s.resolutionHz;
    case SpectrumScale::Rms: return v * v / nenbw / pad;
    case SpectrumScale::Peak: return v * v / 2.0 / nenbw / pad;
    case SpectrumScale::PeakToPeak: return v * v / 8.0 / nenbw / pad;
    }
    return 0;
}

double bandRms(const Spectrum& s, double loHz, double hiHz) {
    double sum = 0;
    for (std::size_t k = 0; k < s.values.size(); ++k) {
        const double f = s.frequencyHz(k);
        if (f >= loHz && f <= hiHz) sum += lineMeanSquare(s, k);
    }
    return std::sqrt(sum);
}

void rescale(Spectrum& s, SpectrumScale to) {
    if (s.scale == to) return;
    for (std::size_t k = 0; k < s.values.size(); ++k) {
        // Go through the per-line power PS = (rms amplitude)^2, which all scales share.
        const bool edge = s.startHz == 0 && (k == 0 || (s.transformLength % 2 == 0 && k == s.transformLength / 2));
        double ps = 0;
        const double v = s.values[k];
        switch (s.scale) {
        case SpectrumScale::Psd: ps = v * s.enbwHz; break;
        case SpectrumScale::Rms: ps = v * v; break;
        case SpectrumScale::Peak: ps = edge ? v * v : v * v / 2.0; break;
        case SpectrumScale::PeakToPeak: ps = edge ? v * v / 4.0 : v * v / 8.0; break;
        }
        switch (to) {
        case SpectrumScale::Psd: s.values[k] = ps / s.enbwHz; break;
        case SpectrumScale::Rms: s.values[k] = std::sqrt(ps); break;
        case SpectrumScale::Peak: s.values[k] = edge ? std::sqrt(ps) : std::sqrt(2.0 * ps); break;
        case SpectrumScale::PeakToPeak: s.values[k] = edge ? 2.0 * std::sqrt(ps) : 2.0 * std::sqrt(2.0 * ps); break;
        }
    }
    s.scale = to;
}

double toDb(double value, SpectrumScale scale, double reference) {
    if (value <= 0) return -std::numeric_limits<double>::infinity();
    return scale == SpectrumScale::Psd ? 10.0 * std::log10(value / (reference * reference))
                                       : 20.0 * std::log10(value / reference);
}

} // namespace humwise::dsp
