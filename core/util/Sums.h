#pragma once
// Sums over long records, written so that the additions do not wait on each other: with one
// accumulator every addition waits for the previous one (the loop runs at the adder's latency,
// about 4x slower than its throughput). Four interleaved partial sums, added pairwise at the
// end. The order of the additions differs from a plain left-to-right loop, so the last bits may
// too; the error bound is the same (Higham, "Accuracy and Stability of Numerical Algorithms",
// chapter 4, recursive summation).

#include <cstddef>
#include <span>

namespace humwise::util {

// sum_n x[n]
inline double sumOf(std::span<const double> x) {
    double p[4] = {0, 0, 0, 0};
    std::size_t i = 0;
    for (; i + 4 <= x.size(); i += 4)
        for (std::size_t j = 0; j < 4; ++j) p[j] += x[i + j];
    for (; i < x.size(); ++i) p[0] += x[i];
    return (p[0] + p[1]) + (p[2] + p[3]);
}

struct DeviationSums {
    double sum = 0;     // sum_n (x[n] - about)
    double squares = 0; // sum_n (x[n] - about)^2
};

// The sums of the deviations from `about` (usually the mean) and of their squares, in one pass.
inline DeviationSums deviationSums(std::span<const double> x, double about) {
    double s[4] = {0, 0, 0, 0}, q[4] = {0, 0, 0, 0};
    std::size_t i = 0;
    for (; i + 4 <= x.size(); i += 4)
        for (std::size_t j = 0; j < 4; ++j) {
            const double d = x[i + j] - about;
            s[j] += d;
            q[j] += d * d;
        }
    for (; i < x.size(); ++i) {
        const double d = x[i] - about;
        s[0] += d;
        q[0] += d * d;
    }
    return {(s[0] + s[1]) + (s[2] + s[3]), (q[0] + q[1]) + (q[2] + q[3])};
}

} // namespace humwise::util
