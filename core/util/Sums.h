#pragma once
// Sums over long records, written so that the additions do not wait on each other: with one
// accumulator every addition waits for the previous one (the loop runs at the adder's latency,
// about 4x slower than its throughput). Partial sums in four vectors of four (DoubleLanes.h),
// added pairwise at the end. The order of the additions differs from a plain left-to-right
// loop, so the last bits may too; the error bound is the same (Higham, "Accuracy and Stability
// of Numerical Algorithms", chapter 4, recursive summation).

#include <cstddef>
#include <span>

namespace humwise::util {

// sum_n x[n]
double sumOf(std::span<const double> x);

struct DeviationSums {
    double sum = 0;     // sum_n (x[n] - about)
    double squares = 0; // sum_n (x[n] - about)^2
};

// The sums of the deviations from `about` (usually the mean) and of their squares, in one pass.
DeviationSums deviationSums(std::span<const double> x, double about);

} // namespace humwise::util
