#include "core/util/Sums.h"

#include "core/util/DoubleLanes.h"
#include "core/util/VectorClones.h"

#include <algorithm>
#include <cmath>

namespace humwise::util {

namespace {

// What a summing pass also writes to out: nothing, x itself, or x[n] w[n].
enum class Copy { None, Plain, Weighted };

// sum_n x[n], and the copy asked for: one pass for both.
template <Copy C>
HUMWISE_VECTOR_CLONES double sumPass(std::span<const double> x, const double* w, double* out) {
    DoubleLanes p[kReductionVectors] = {};
    std::size_t i = 0;
    for (; i + kReductionWidth <= x.size(); i += kReductionWidth)
        for (std::size_t v = 0; v < kReductionVectors; ++v) {
            DoubleLanes y;
            loadLanes(y, x.data() + i + 4 * v);
            p[v] += y;
            if constexpr (C == Copy::Plain) storeLanes(out + i + 4 * v, y);
            if constexpr (C == Copy::Weighted) {
                DoubleLanes wv;
                loadLanes(wv, w + i + 4 * v);
                storeLanes(out + i + 4 * v, y * wv);
            }
        }
    double tail = 0;
    for (; i < x.size(); ++i) {
        tail += x[i];
        if constexpr (C == Copy::Plain) out[i] = x[i];
        if constexpr (C == Copy::Weighted) out[i] = x[i] * w[i];
    }
    return sumOfLanes(p) + tail;
}

} // namespace

double sumOf(std::span<const double> x) { return sumPass<Copy::None>(x, nullptr, nullptr); }

double copyAndSum(std::span<const double> x, double* out) { return sumPass<Copy::Plain>(x, nullptr, out); }

double weightedCopyAndSum(std::span<const double> x, const double* w, double* out) {
    return sumPass<Copy::Weighted>(x, w, out);
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
