#include "core/util/Sums.h"

#include "core/util/DoubleLanes.h"
#include "core/util/VectorClones.h"

namespace humwise::util {

HUMWISE_VECTOR_CLONES double sumOf(std::span<const double> x) {
    DoubleLanes p[kReductionVectors] = {};
    std::size_t i = 0;
    for (; i + kReductionWidth <= x.size(); i += kReductionWidth)
        for (std::size_t v = 0; v < kReductionVectors; ++v) {
            DoubleLanes y;
            loadLanes(y, x.data() + i + 4 * v);
            p[v] += y;
        }
    double tail = 0;
    for (; i < x.size(); ++i) tail += x[i];
    return sumOfLanes(p) + tail;
}

HUMWISE_VECTOR_CLONES DeviationSums deviationSums(std::span<const double> x, double about) {
    DoubleLanes s[kReductionVectors] = {}, q[kReductionVectors] = {};
    std::size_t i = 0;
    for (; i + kReductionWidth <= x.size(); i += kReductionWidth)
        for (std::size_t v = 0; v < kReductionVectors; ++v) {
            DoubleLanes d;
            loadLanes(d, x.data() + i + 4 * v);
            d -= about;
            s[v] += d;
            q[v] += d * d;
        }
    double ts = 0, tq = 0;
    for (; i < x.size(); ++i) {
        const double d = x[i] - about;
        ts += d;
        tq += d * d;
    }
    return {sumOfLanes(s) + ts, sumOfLanes(q) + tq};
}

} // namespace humwise::util
