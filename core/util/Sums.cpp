#include "core/util/Sums.h"

#include "core/util/DoubleLanes.h"
#include "core/util/VectorClones.h"

#include <algorithm>
#include <cmath>

namespace humwise::util {

namespace {

// sum_n x[n], and x copied to out when Copy: one pass for both.
template <bool Copy>
HUMWISE_VECTOR_CLONES double sumPass(std::span<const double> x, double* out) {
    DoubleLanes p[kReductionVectors] = {};
    std::size_t i = 0;
    for (; i + kReductionWidth <= x.size(); i += kReductionWidth)
        for (std::size_t v = 0; v < kReductionVectors; ++v) {
            DoubleLanes y;
            loadLanes(y, x.data() + i + 4 * v);
            p[v] += y;
            if constexpr (Copy) storeLanes(out + i + 4 * v, y);
        }
    double tail = 0;
    for (; i < x.size(); ++i) {
        tail += x[i];
        if constexpr (Copy) out[i] = x[i];
    }
    return sumOfLanes(p) + tail;
}

} // namespace

double sumOf(std::span<const double> x) { return sumPass<false>(x, nullptr); }

double copyAndSum(std::span<const double> x, double* out) { return sumPass<true>(x, out); }

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

MeanAndDeviations meanAndDeviations(std::span<const double> x) {
    if (x.empty()) return {};
    const std::size_t head = std::min<std::size_t>(x.size(), 1024);
    const double centre = sumOf(x.first(head)) / static_cast<double>(head);
    const DeviationSums d = deviationSums(x, std::isfinite(centre) ? centre : 0.0);
    const double n = static_cast<double>(x.size());
    const double shift = d.sum / n; // mean - centre
    const double squares = d.squares - d.sum * shift;
    return {centre + shift, {d.sum - shift * n, squares < 0 ? 0.0 : squares}}; // a NaN stays a NaN
}

} // namespace humwise::util
