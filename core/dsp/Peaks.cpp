#include "core/dsp/Peaks.h"

#include <algorithm>
#include <cmath>
#include <complex>
#include <map>
#include <memory>
#include <mutex>
#include <numbers>
#include <span>
#include <tuple>

namespace humwise::dsp {
namespace {

using std::numbers::pi;

// Dirichlet kernel D(u) = sum_{n=0}^{N-1} exp(-j 2 pi u n / N).
std::complex<double> dirichlet(double u, double n) {
    const double s = std::sin(pi * u / n);
    if (std::abs(s) < 1e-12) {
        // u is a multiple of N: every term has the same phase.
        return std::polar(n, -pi * u * (n - 1.0) / n);
    }
    return std::polar(std::sin(pi * u) / s, -pi * u * (n - 1.0) / n);
}

std::span<const double> cosineCoefficients(WindowKind kind) {
    static constexpr double rect[] = {1.0};
    static constexpr double hann[] = {0.5, 0.5};
    static constexpr double hamming[] = {0.54, 0.46};
    static constexpr double bh[] = {0.35875, 0.48829, 0.14128, 0.01168};
    static constexpr double flat[] = {1.0, 1.9383379, 1.3045202, 0.4028270, 0.0350665};
    switch (kind) {
    case WindowKind::Rectangular: return rect;
    case WindowKind::Hann: return hann;
    case WindowKind::Hamming: return hamming;
    case WindowKind::BlackmanHarris: return bh;
    case WindowKind::FlatTop: return flat;
    case WindowKind::Kaiser: break;
    }
    return {};
}

// |W(d)| of the periodic cosine-sum window w[n] = sum_m (-1)^m a_m cos(2 pi m n / N):
// W(d) = sum_m (-1)^m a_m / 2 [D(d - m) + D(d + m)].
double cosineSumResponse(std::span<const double> a, double n, double d) {
    std::complex<double> sum = a[0] * dirichlet(d, n);
    double sign = -1.0;
    for (std::size_t m = 1; m < a.size(); ++m) {
        const double md = static_cast<double>(m);
        sum += sign * a[m] * 0.5 * (dirichlet(d - md, n) + dirichlet(d + md, n));
        sign = -sign;
    }
    return std::abs(sum);
}

// Kaiser: tabulate the numerical DTFT once per (beta, N) on a fine grid over [0, 1.5] lines.
class KaiserTable {
public:
    KaiserTable(double beta, std::size_t n) {
        const std::vector<double> w = makeWindow(WindowSpec{WindowKind::Kaiser, beta}, n);
        m_values.resize(kSteps + 1);
        for (std::size_t i = 0; i <= kSteps; ++i)
            m_values[i] = windowResponse(w, kMax * static_cast<double>(i) / kSteps);
    }
    double at(double d) const {
        d = std::min(std::abs(d), kMax);
        const double x = d / kMax * kSteps;
        const auto i = std::min<std::size_t>(static_cast<std::size_t>(x), kSteps - 1);
        const double t = x - static_cast<double>(i);
        return m_values[i] * (1 - t) + m_values[i + 1] * t;
    }

private:
    static constexpr std::size_t kSteps = 1536;
    static constexpr double kMax = 1.5;
    std::vector<double> m_values;
};

double kaiserResponse(double beta, std::size_t n, double d) {
    static std::mutex mutex;
    static std::map<std::pair<double, std::size_t>, KaiserTable> tables;
    std::lock_guard lock(mutex);
    auto key = std::make_pair(beta, n);
    auto it = tables.find(key);
    if (it == tables.end()) {
        if (tables.size() > 64) tables.clear();
        it = tables.emplace(key, KaiserTable(beta, n)).first;
    }
    return it->second.at(d);
}

double lineAmplitude(const Spectrum& s, std::size_t k) {
    return s.scale == SpectrumScale::Psd ? std::sqrt(std::max(0.0, s.values[k])) : s.values[k];
}

} // namespace

namespace {

// windowKernel with the cosine-sum window's response at 0 found once (the peak interpolation
// below asks for the kernel a dozen times per peak).
class Kernel {
public:
    Kernel(const WindowSpec& spec, std::size_t n)
        : m_spec(spec), m_n(n), m_a(cosineCoefficients(spec.kind)),
          m_atZero(spec.kind == WindowKind::Kaiser ? 1.0 : cosineSumResponse(m_a, static_cast<double>(n), 0.0)) {}
    double operator()(double d) const {
        if (m_spec.kind == WindowKind::Kaiser) return kaiserResponse(m_spec.kaiserBeta, m_n, d);
        return cosineSumResponse(m_a, static_cast<double>(m_n), d) / m_atZero;
    }

private:
    WindowSpec m_spec;
    std::size_t m_n;
    std::span<const double> m_a;
    double m_atZero;
};

} // namespace

double windowKernel(const WindowSpec& spec, std::size_t n, double d) { return Kernel(spec, n)(d); }

namespace {

// r(d) = |W(1 - d)| / |W(d)|, the ratio of the two largest lines of a tone d lines (0 <= d <= 0.5)
// from the larger one, tabulated on a fine grid once per window and offset scale: it rises
// monotonically from r(0) to r(0.5) = 1, so a measured ratio is bracketed by table lookup and
// then solved exactly by a few secant steps (instead of 40 bisection steps of exact
// kernel evaluations per peak).
class RatioTable {
public:
    static constexpr std::size_t kSteps = 512;
    RatioTable(const WindowSpec& w, std::size_t n, double scale) : m_kernel(w, n), m_scale(scale), m_r(kSteps + 1) {
        for (std::size_t i = 0; i <= kSteps; ++i) m_r[i] = exact(offsetAt(i));
        m_monotonic = std::is_sorted(m_r.begin(), m_r.end());
    }
    double kernel(double d) const { return m_kernel(d * m_scale); }
    double exact(double d) const { return kernel(1.0 - d) / kernel(d); }
    static double offsetAt(std::size_t i) { return 0.5 * static_cast<double>(i) / kSteps; }
    // The offset d whose ratio is r (r within [r(0), 1]).
    double solve(double r) const {
        if (!m_monotonic) return bisect(r);
        const auto it = std::upper_bound(m_r.begin(), m_r.end(), r);
        if (it == m_r.begin()) return 0.0;
        if (it == m_r.end()) return 0.5;
        const auto i = static_cast<std::size_t>(it - m_r.begin()) - 1;
        const double a = offsetAt(i), b = offsetAt(i + 1);
        // Secant steps from the table's two bracketing points (smooth and nearly linear over one
        // grid step: each step squares the error, roughly), kept inside the bracket.
        double x0 = a, f0 = m_r[i] - r, x1 = b, f1 = m_r[i + 1] - r;
        double d = a;
        for (int step = 0; step < 6 && f1 != f0; ++step) {
            d = std::clamp(x1 - f1 * (x1 - x0) / (f1 - f0), a, b);
            if (std::abs(d - x1) < 1e-15) break;
            x0 = x1;
            f0 = f1;
            x1 = d;
            f1 = exact(d) - r;
        }
        return d;
    }

private:
    // The flat-top's kernel ripples (within 0.0044 dB) over its flat main lobe, so its ratio is
    // not monotonic and the table cannot bracket: plain bisection on the exact ratio there.
    double bisect(double r) const {
        if (r <= exact(0.0)) return 0.0;
        double lo = 0.0, hi = 0.5;
        for (int it = 0; it < 40; ++it) (exact(0.5 * (lo + hi)) < r ? lo : hi) = 0.5 * (lo + hi);
        return 0.5 * (lo + hi);
    }
    Kernel m_kernel;
    double m_scale;
    std::vector<double> m_r;
    bool m_monotonic = true;
};

std::shared_ptr<const RatioTable> ratioTable(const WindowSpec& w, std::size_t n, double scale) {
    using Key = std::tuple<int, double, std::size_t, double>;
    static std::mutex mutex;
    static std::map<Key, std::shared_ptr<const RatioTable>> tables;
    const Key key{static_cast<int>(w.kind), w.kind == WindowKind::Kaiser ? w.kaiserBeta : 0.0, n, scale};
    {
        std::lock_guard lock(mutex);
        if (auto it = tables.find(key); it != tables.end()) return it->second;
    }
    auto table = std::make_shared<const RatioTable>(w, n, scale); // built outside the lock
    std::lock_guard lock(mutex);
    if (tables.size() >= 64) tables.clear(); // bounded: a route uses a handful of spectrum shapes
    return tables.emplace(key, table).first->second;
}

} // namespace

Peak interpolatePeak(const Spectrum& s, std::size_t k) {
    Peak p;
    p.line = k;
    p.frequencyHz = s.frequencyHz(k);
    const double ak = lineAmplitude(s, k);
    p.amplitude = s.values[k];
    if (ak <= 0 || s.values.size() < 3) return p;
    const double left = k > 0 ? lineAmplitude(s, k - 1) : 0.0;
    const double right = k + 1 < s.values.size() ? lineAmplitude(s, k + 1) : 0.0;
    const int side = right >= left ? 1 : -1;
    const double r = std::min(1.0, std::max(left, right) / ak);
    // Offsets in lines of the padded transform map to window lines through N / Nfft.
    const double scale = static_cast<double>(s.segmentLength) / static_cast<double>(std::max<std::size_t>(1, s.transformLength));
    const auto table = ratioTable(s.window, s.segmentLength, scale);
    const double d = table->solve(r);
    const double corrected = ak / table->kernel(d);
    p.frequencyHz = s.frequencyHz(k) + side * d * s.resolutionHz;
    p.amplitude = s.scale == SpectrumScale::Psd ? corrected * corrected : corrected;
    return p;
}

double localFloor(const Spectrum& s, std::size_t line, std::size_t halfWidth) {
    std::vector<double> v;
    const std::size_t lo = line > halfWidth ? line - halfWidth : 0;
    const std::size_t hi = std::min(s.values.size() - 1, line + halfWidth);
    for (std::size_t k = lo; k <= hi; ++k)
        if (k + 3 < line || k > line + 3) v.push_back(s.values[k]);
    if (v.empty()) return 0;
    auto mid = v.begin() + static_cast<std::ptrdiff_t>(v.size() / 2);
    std::nth_element(v.begin(), mid, v.end());
    return *mid;
}

std::vector<Peak> findPeaks(const Spectrum& s, const PeakRequest& r) {
    std::vector<Peak> peaks;
    const std::size_t n = s.values.size();
    if (n < 3 || r.maxPeaks == 0) return peaks;
    // Only lines inside the (widened) range can be candidates: their indices follow from the line
    // spacing, one line of margin each side for rounding, and the test below stays the judge. A
    // single-line reading asks for a few lines of a 50 000-line spectrum dozens of times a motor.
    std::size_t first = 1, last = n - 2;
    if (s.resolutionHz > 0) {
        const double lo = std::floor((r.minFrequencyHz - s.resolutionHz - s.startHz) / s.resolutionHz) - 1;
        const double hi = std::ceil((r.maxFrequencyHz + s.resolutionHz - s.startHz) / s.resolutionHz) + 1;
        if (lo > static_cast<double>(first)) first = lo < static_cast<double>(n) ? static_cast<std::size_t>(lo) : n;
        if (hi < static_cast<double>(last)) last = hi >= 0 ? static_cast<std::size_t>(hi) : 0;
    }
    std::vector<std::size_t> candidates;
    for (std::size_t k = first; k <= last && k + 1 < n; ++k) {
        // A tone inside the range may have its highest line just outside it: widen by one line
        // here and judge the interpolated frequency below.
        const double f = s.frequencyHz(k);
        if (f < r.minFrequencyHz - s.resolutionHz || f > r.maxFrequencyHz + s.resolutionHz) continue;
        if (s.values[k] > s.values[k - 1] && s.values[k] >= s.values[k + 1] && s.values[k] > 0) candidates.push_back(k);
    }
    // Interpolate only the strongest candidates (each interpolation costs a few kernel evaluations).
    const std::size_t keep = std::min(candidates.size(), std::max<std::size_t>(r.maxPeaks * 4, 32));
    std::partial_sort(candidates.begin(), candidates.begin() + static_cast<std::ptrdiff_t>(keep), candidates.end(),
                      [&](std::size_t a, std::size_t b) { return s.values[a] > s.values[b]; });
    candidates.resize(keep);
    for (std::size_t k : candidates) {
        Peak p = interpolatePeak(s, k);
        const double floor = localFloor(s, k, r.floorHalfWidth);
        p.prominence = floor > 0 ? s.values[k] / floor : std::numeric_limits<double>::infinity();
        if (p.prominence >= r.minProminence && p.frequencyHz >= r.minFrequencyHz && p.frequencyHz <= r.maxFrequencyHz)
            peaks.push_back(p);
    }
    std::sort(peaks.begin(), peaks.end(), [](const Peak& a, const Peak& b) { return a.amplitude > b.amplitude; });
    if (peaks.size() > r.maxPeaks) peaks.resize(r.maxPeaks);
    return peaks;
}

} // namespace humwise::dsp
