#include "core/dsp/Window.h"

#include "core/dsp/Fft.h"
#include "core/util/Sums.h"

#include <algorithm>
#include <array>
#include <charconv>
#include <cctype>
#include <cmath>
#include <cstdio>
#include <map>
#include <mutex>
#include <tuple>
#include <span>
#include <numbers>
#include <stdexcept>
#include <string>

namespace humwise::dsp {
namespace {

using std::numbers::pi;

std::vector<double> cosineSum(std::span<const double> a, std::size_t n, double denominator) {
    std::vector<double> w(n);
    for (std::size_t i = 0; i < n; ++i) {
        const double x = 2.0 * pi * static_cast<double>(i) / denominator;
        double v = 0.0;
        double sign = 1.0;
        for (std::size_t k = 0; k < a.size(); ++k) {
            v += sign * a[k] * std::cos(static_cast<double>(k) * x);
            sign = -sign;
        }
        w[i] = v;
    }
    return w;
}

void normalisePeak(std::vector<double>& w) {
    const double peak = *std::max_element(w.begin(), w.end());
    if (peak > 0)
        for (double& v : w) v /= peak;
}

std::string lower(std::string_view s) {
    std::string out(s);
    std::transform(out.begin(), out.end(), out.begin(), [](unsigned char c) { return static_cast<char>(std::tolower(c)); });
    return out;
}

} // namespace

std::optional<WindowSpec> parseWindowSpec(std::string_view text) {
    const std::string s = lower(text);
    if (s == "rect" || s == "rectangular" || s == "boxcar" || s == "uniform") return WindowSpec{WindowKind::Rectangular};
    if (s == "hann" || s == "hanning") return WindowSpec{WindowKind::Hann};
    if (s == "hamming") return WindowSpec{WindowKind::Hamming};
    if (s == "blackman-harris" || s == "blackmanharris") return WindowSpec{WindowKind::BlackmanHarris};
    if (s == "flattop" || s == "flat-top" || s == "hft95") return WindowSpec{WindowKind::FlatTop};
    if (s == "kaiser") return WindowSpec{WindowKind::Kaiser};
    if (s.rfind("kaiser:", 0) == 0) {
        const std::string num = s.substr(7);
        double beta = 0;
        auto [ptr, ec] = std::from_chars(num.data(), num.data() + num.size(), beta);
        if (ec != std::errc() || ptr != num.data() + num.size() || !(beta >= 0) || beta > 100) return std::nullopt;
        return WindowSpec{WindowKind::Kaiser, beta};
    }
    return std::nullopt;
}

std::string windowName(const WindowSpec& spec) {
    switch (spec.kind) {
    case WindowKind::Rectangular: return "rect";
    case WindowKind::Hann: return "hann";
    case WindowKind::Hamming: return "hamming";
    case WindowKind::BlackmanHarris: return "blackman-harris";
    case WindowKind::FlatTop: return "flattop";
    case WindowKind::Kaiser: {
        char buf[32];
        std::snprintf(buf, sizeof buf, "kaiser:%.4g", spec.kaiserBeta);
        return buf;
    }
    }
    return "?";
}

double besselI0(double x) {
    // I0(x) = sum_k ((x/2)^k / k!)^2
    const double q = 0.25 * x * x;
    double term = 1.0, sum = 1.0;
    for (int k = 1; k < 500; ++k) {
        term *= q / (static_cast<double>(k) * static_cast<double>(k));
        sum += term;
        if (term < sum * 1e-17) break;
    }
    return sum;
}

std::vector<double> makeWindow(const WindowSpec& spec, std::size_t n, WindowSymmetry symmetry) {
    if (n == 0) throw std::invalid_argument("makeWindow: length must be at least 1");
    if (n == 1) return {1.0};
    const double denominator = static_cast<double>(symmetry == WindowSymmetry::Periodic ? n : n - 1);
    std::vector<double> w;
    switch (spec.kind) {
    case WindowKind::Rectangular: w.assign(n, 1.0); break;
    case WindowKind::Hann: {
        static constexpr std::array<double, 2> a{0.5, 0.5};
        w = cosineSum(a, n, denominator);
        break;
    }
    case WindowKind::Hamming: {
        static constexpr std::array<double, 2> a{0.54, 0.46};
        w = cosineSum(a, n, denominator);
        break;
    }
    case WindowKind::BlackmanHarris: {
        static constexpr std::array<double, 4> a{0.35875, 0.48829, 0.14128, 0.01168};
        w = cosineSum(a, n, denominator);
        break;
    }
    case WindowKind::FlatTop: {
        static constexpr std::array<double, 5> a{1.0, 1.9383379, 1.3045202, 0.4028270, 0.0350665};
        w = cosineSum(a, n, denominator);
        break;
    }
    case WindowKind::Kaiser: {
        if (!(spec.kaiserBeta >= 0)) throw std::invalid_argument("makeWindow: Kaiser beta must be >= 0");
        w.resize(n);
        const double norm = besselI0(spec.kaiserBeta);
        for (std::size_t i = 0; i < n; ++i) {
            const double r = 2.0 * static_cast<double>(i) / denominator - 1.0;
            w[i] = besselI0(spec.kaiserBeta * std::sqrt(std::max(0.0, 1.0 - r * r))) / norm;
        }
        break;
    }
    }
    normalisePeak(w);
    return w;
}

SummedWindow cachedWindow(const WindowSpec& spec, std::size_t n) {
    using Key = std::tuple<int, double, std::size_t>;
    static std::mutex mutex;
    static std::map<Key, SummedWindow> cache;
    const Key key{static_cast<int>(spec.kind), spec.kind == WindowKind::Kaiser ? spec.kaiserBeta : 0.0, n};
    std::lock_guard lock(mutex);
    if (auto it = cache.find(key); it != cache.end()) return it->second;
    if (cache.size() >= 256) cache.clear(); // bounded: a route uses a handful of lengths
    SummedWindow w;
    w.samples = std::make_shared<const std::vector<double>>(makeWindow(spec, n));
    w.s1 = util::sumOf(*w.samples);
    w.s2 = util::deviationSums(*w.samples, 0.0).squares;
    cache.emplace(key, w);
    return w;
}

double windowResponse(const std::vector<double>& w, double offsetBins) {
    const double n = static_cast<double>(w.size());
    double re = 0, im = 0, s1 = 0;
    for (std::size_t i = 0; i < w.size(); ++i) {
        const double phase = -2.0 * pi * offsetBins * static_cast<double>(i) / n;
        re += w[i] * std::cos(phase);
        im += w[i] * std::sin(phase);
        s1 += w[i];
    }
    return std::hypot(re, im) / s1;
}

WindowMetrics computeWindowMetrics(const std::vector<double>& w, std::size_t padFactor) {
    if (w.size() < 4) throw std::invalid_argument("computeWindowMetrics: window too short");
    if (padFactor < 4) throw std::invalid_argument("computeWindowMetrics: pad factor must be >= 4");
    const double n = static_cast<double>(w.size());
    double s1 = 0, s2 = 0;
    for (double v : w) {
        s1 += v;
        s2 += v * v;
    }
    const double peak = *std::max_element(w.begin(), w.end());
    WindowMetrics m;
    m.coherentGain = s1 / n / peak;
    m.nenbwBins = n * s2 / (s1 * s1);
    m.scallopingLossDb = -20.0 * std::log10(windowResponse(w, 0.5));

    // Zero-padded transform: bin j of the padded FFT is offset j / padFactor bins.
    const std::size_t m2 = w.size() * padFactor;
    RealFft<double> fft(m2);
    auto in = fft.input();
    std::fill(in.begin(), in.end(), 0.0);
    std::copy(w.begin(), w.end(), in.begin());
    fft.execute();
    const auto out = fft.output();
    std::vector<double> mag(out.size());
    for (std::size_t j = 0; j < out.size(); ++j) mag[j] = std::abs(out[j]) / s1;

    // Main lobe ends at the first local minimum past its peak (a flat-top's response rises by a
    // few thousandths of a dB before it falls); the highest sidelobe is the maximum beyond it.
    std::size_t j = static_cast<std::size_t>(
        std::max_element(mag.begin(), mag.begin() + static_cast<std::ptrdiff_t>(padFactor)) - mag.begin());
    while (j + 1 < mag.size() && mag[j + 1] <= mag[j]) ++j;
    const double sidelobe = *std::max_element(mag.begin() + static_cast<std::ptrdiff_t>(j), mag.end());
    m.highestSidelobeDb = 20.0 * std::log10(sidelobe);

    // -3.0 dB full width, refined on the exact DTFT by bisection between padded bins.
    const double target = std::pow(10.0, -3.0 / 20.0);
    std::size_t k = 0;
    while (k + 1 < mag.size() && mag[k + 1] > target) ++k;
    double lo = static_cast<double>(k) / static_cast<double>(padFactor);
    double hi = static_cast<double>(k + 1) / static_cast<double>(padFactor);
    for (int it = 0; it < 40; ++it) {
        const double mid = 0.5 * (lo + hi);
        (windowResponse(w, mid) > target ? lo : hi) = mid;
    }
    m.halfPowerWidthBins = lo + hi;
    return m;
}

} // namespace humwise::dsp
