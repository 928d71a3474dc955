#include "core/dsp/SampleExtent.h"

#include "core/util/VectorClones.h"

#include <algorithm>
#include <utility>

namespace humwise::dsp {
namespace {

// The four-lane minimum, maximum and sum in one pass (vectorises; the lanes are plain locals so
// that they stay in registers). A pass for the range and another for the sum read every record
// twice; this pass and its three callers per channel were a twentieth of an import.
struct LaneExtent {
    double lo, hi, sum;
};

HUMWISE_VECTOR_CLONES
LaneExtent laneExtent(std::span<const double> x) {
    double lo0 = INFINITY, lo1 = INFINITY, lo2 = INFINITY, lo3 = INFINITY;
    double hi0 = -INFINITY, hi1 = -INFINITY, hi2 = -INFINITY, hi3 = -INFINITY;
    double s0 = 0, s1 = 0, s2 = 0, s3 = 0;
    std::size_t i = 0;
    for (; i + 4 <= x.size(); i += 4) {
        lo0 = x[i] < lo0 ? x[i] : lo0;
        lo1 = x[i + 1] < lo1 ? x[i + 1] : lo1;
        lo2 = x[i + 2] < lo2 ? x[i + 2] : lo2;
        lo3 = x[i + 3] < lo3 ? x[i + 3] : lo3;
        hi0 = x[i] > hi0 ? x[i] : hi0;
        hi1 = x[i + 1] > hi1 ? x[i + 1] : hi1;
        hi2 = x[i + 2] > hi2 ? x[i + 2] : hi2;
        hi3 = x[i + 3] > hi3 ? x[i + 3] : hi3;
        s0 += x[i];
        s1 += x[i + 1];
        s2 += x[i + 2];
        s3 += x[i + 3];
    }
    for (; i < x.size(); ++i) {
        lo0 = x[i] < lo0 ? x[i] : lo0;
        hi0 = x[i] > hi0 ? x[i] : hi0;
        s0 += x[i];
    }
    return {std::min({lo0, lo1, lo2, lo3}), std::max({hi0, hi1, hi2, hi3}), (s0 + s1) + (s2 + s3)};
}

// Every sample finite: four interleaved lanes, so that the additions do not wait on each other.
HUMWISE_VECTOR_CLONES
CentralPowerSums laneCentralPowerSums(std::span<const double> x, double about) {
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

} // namespace

// First the lanes, with no test per sample: a NaN leaves the minimum and maximum alone but poisons
// the sum, an infinity shows in them, so when all three come out finite every sample was.
// Otherwise (or when the sum overflows) the careful loop looks at each sample.
SampleExtent sampleExtent(std::span<const double> x) {
    const LaneExtent lanes = laneExtent(x);
    SampleExtent e{lanes.lo, lanes.hi, lanes.sum, 0};
    if (std::isfinite(e.sum) && (x.empty() || (std::isfinite(e.lo) && std::isfinite(e.hi)))) return e;
    e = SampleExtent{};
    for (double v : x) {
        if (!std::isfinite(v)) {
            ++e.nonFinite;
            continue;
        }
        e.lo = std::min(e.lo, v);
        e.hi = std::max(e.hi, v);
        e.sum += v;
    }
    return e;
}

CentralPowerSums centralPowerSums(std::span<const double> x, double about, bool allFinite) {
    if (allFinite) return laneCentralPowerSums(x, about);
    CentralPowerSums p;
    for (double v : x) {
        if (!std::isfinite(v)) continue;
        const double d = v - about, d2 = d * d;
        p.m2 += d2;
        p.m3 += d2 * d;
        p.m4 += d2 * d2;
    }
    return p;
}

} // namespace humwise::dsp
