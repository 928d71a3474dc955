#include "core/dsp/Statistics.h"

#include "core/dsp/SampleExtent.h"
#include "core/util/VectorClones.h"

#include <algorithm>
#include <cmath>
#include <limits>

namespace humwise::dsp {
namespace {

struct PowerSums {
    double m2 = 0, m3 = 0, m4 = 0; // sums of d^2, d^3, d^4 with d = x - about
};

// Every sample finite: four interleaved lanes, so that the additions do not wait on each other.
HUMWISE_VECTOR_CLONES
PowerSums centralPowerSums(std::span<const double> x, double about) {
    double a2[4] = {0, 0, 0, 0}, a3[4] = {0, 0, 0, 0}, a4[4] = {0, 0, 0, 0};
    std::size_t i = 0;
    for (; i + 4 <= x.size(); i += 4)
        for (std::size_t j = 0; j < 4; ++j) {
            const double d = x[i + j] - about, d2 = d * d;
            a2[j] += d2;
            a3[j] += d2 * d;
            a4[j] += d2 * d2;
        }
    for (; i < x.size(); ++i) {
        const double d = x[i] - about, d2 = d * d;
        a2[0] += d2;
        a3[0] += d2 * d;
        a4[0] += d2 * d2;
    }
    return {(a2[0] + a2[1]) + (a2[2] + a2[3]), (a3[0] + a3[1]) + (a3[2] + a3[3]), (a4[0] + a4[1]) + (a4[2] + a4[3])};
}

// Some samples not finite: they are skipped.
PowerSums finiteCentralPowerSums(std::span<const double> x, double about) {
    PowerSums p;
    for (double v : x) {
        if (!std::isfinite(v)) continue;
        const double d = v - about, d2 = d * d;
        p.m2 += d2;
        p.m3 += d2 * d;
        p.m4 += d2 * d2;
    }
    return p;
}

} // namespace

WaveformStatistics waveformStatistics(std::span<const double> x) {
    WaveformStatistics s;
    const SampleExtent e = sampleExtent(x);
    s.nonFiniteCount = e.nonFinite;
    s.count = x.size() - e.nonFinite;
    if (s.count == 0) return s;
    s.minimum = e.lo;
    s.maximum = e.hi;
    const double n = static_cast<double>(s.count);
    s.dcOffset = e.sum / n;
    // max |x - mean| sits at an extreme (rounding is monotonic, so this is exact).
    s.peak = std::max(s.maximum - s.dcOffset, s.dcOffset - s.minimum);
    auto [m2, m3, m4] = e.nonFinite == 0 ? centralPowerSums(x, s.dcOffset) : finiteCentralPowerSums(x, s.dcOffset);
    m2 /= n;
    m3 /= n;
    m4 /= n;
    s.rms = std::sqrt(m2);
    s.peakToPeak = s.maximum - s.minimum;
    if (m2 > 0) {
        s.crestFactor = s.peak / s.rms;
        s.kurtosis = m4 / (m2 * m2);
        s.skewness = m3 / (m2 * s.rms);
    }
    return s;
}

} // namespace humwise::dsp
