#include "core/dsp/SampleExtent.h"

#include "core/util/DoubleLanes.h"
#include "core/util/VectorClones.h"

#include <algorithm>
#include <utility>

namespace humwise::dsp {
namespace {

// The minimum, maximum and sum in one pass, in vectors of lanes (DoubleLanes.h: four chains of
// dependent minima, maxima and additions in flight). A pass for the range and another for the
// sum read every record twice; this pass and its three callers per channel were a twentieth of an
// import.
struct LaneExtent {
    double lo, hi, sum;
};

using util::DoubleLanes;
using util::kReductionVectors;
using util::kReductionWidth;

HUMWISE_VECTOR_CLONES
LaneExtent laneExtent(std::span<const double> x) {
    DoubleLanes lo[kReductionVectors], hi[kReductionVectors], s[kReductionVectors] = {};
    for (std::size_t v = 0; v < kReductionVectors; ++v) {
        lo[v] = DoubleLanes{} + INFINITY;
        hi[v] = DoubleLanes{} - INFINITY;
    }
    std::size_t i = 0;
    for (; i + kReductionWidth <= x.size(); i += kReductionWidth)
        for (std::size_t v = 0; v < kReductionVectors; ++v) {
            DoubleLanes y;
            util::loadLanes(y, x.data() + i + 4 * v);
            lo[v] = y < lo[v] ? y : lo[v]; // a NaN compares false: it leaves both alone
            hi[v] = y > hi[v] ? y : hi[v];
            s[v] += y;
        }
    LaneExtent out{INFINITY, -INFINITY, util::sumOfLanes(s)};
    for (std::size_t v = 0; v < kReductionVectors; ++v)
        for (int j = 0; j < 4; ++j) {
            out.lo = lo[v][j] < out.lo ? lo[v][j] : out.lo;
            out.hi = hi[v][j] > out.hi ? hi[v][j] : out.hi;
        }
    for (; i < x.size(); ++i) {
        out.lo = x[i] < out.lo ? x[i] : out.lo;
        out.hi = x[i] > out.hi ? x[i] : out.hi;
        out.sum += x[i];
    }
    return out;
}

// Every sample finite: vectors of lanes again, so that the additions do not wait on each other.
HUMWISE_VECTOR_CLONES
CentralPowerSums laneCentralPowerSums(std::span<const double> x, double about) {
    DoubleLanes a2[kReductionVectors] = {}, a3[kReductionVectors] = {}, a4[kReductionVectors] = {};
    std::size_t i = 0;
    for (; i + kReductionWidth <= x.size(); i += kReductionWidth)
        for (std::size_t v = 0; v < kReductionVectors; ++v) {
            DoubleLanes d;
            util::loadLanes(d, x.data() + i + 4 * v);
            d -= about;
            const DoubleLanes d2 = d * d;
            a2[v] += d2;
            a3[v] += d2 * d;
            a4[v] += d2 * d2;
        }
    CentralPowerSums out{util::sumOfLanes(a2), util::sumOfLanes(a3), util::sumOfLanes(a4)};
    for (; i < x.size(); ++i) {
        const double d = x[i] - about, d2 = d * d;
        out.m2 += d2;
        out.m3 += d2 * d;
        out.m4 += d2 * d2;
    }
    return out;
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
