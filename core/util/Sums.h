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

// Copies x to out (x.size() doubles, not overlapping x) and returns sum_n x[n]: one pass.
double copyAndSum(std::span<const double> x, double* out);

// Writes x[n] w[n] to out (w and out of x.size() doubles, out overlapping neither) and returns
// sum_n x[n]: a windowed segment and its mean in one pass.
double weightedCopyAndSum(std::span<const double> x, const double* w, double* out);

struct DeviationSums {
    double sum = 0;     // sum_n (x[n] - about)
    double squares = 0; // sum_n (x[n] - about)^2
};

// The sums of the deviations from `about` (usually the mean) and of their squares, in one pass.
DeviationSums deviationSums(std::span<const double> x, double about);

// The mean of x and the sums of the deviations from it, in one pass over x: the sums of d = x - c
// and d^2 about a provisional centre c, the mean of the first samples, then
// mean = c + sum d / N and sum (x - mean)^2 = sum d^2 - (sum d)^2 / N (the shifted-data formula,
// T. F. Chan, G. H. Golub and R. J. LeVeque, "Algorithms for computing the sample variance:
// analysis and recommendations", The American Statistician 37, 1983; citation from memory
// (verify)). With c near the mean the subtraction loses almost nothing: the first 1024 samples of
// a current span several cycles. Not finite when a sample is not (or the squares overflow).
struct MeanAndDeviations {
    double mean = 0;
    DeviationSums about; // about the mean: sum (zero but for rounding) and squares
};
MeanAndDeviations meanAndDeviations(std::span<const double> x);

} // namespace humwise::util
