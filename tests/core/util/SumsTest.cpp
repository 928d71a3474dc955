// Sums with partial accumulators (core/util/Sums.h): exact on values whose sums are exact in
// double, every length around the split into vectors of lanes (the tail must not be lost),
// empty input, and a non-finite value in any lane.
#include "core/util/Sums.h"

#include "core/util/DoubleLanes.h"

#include <gtest/gtest.h>

#include <cmath>
#include <limits>
#include <vector>

namespace humwise::util {
namespace {

TEST(Sums, EveryLengthAroundTheSplitIntoLanes) {
    for (std::size_t n = 0; n <= 2 * kReductionWidth + 5; ++n) {
        std::vector<double> x;
        double naive = 0, naiveSquares = 0;
        for (std::size_t i = 0; i < n; ++i) {
            x.push_back(static_cast<double>(i) + 0.5); // small halves: every sum exact in double
            naive += x.back();
            naiveSquares += (x.back() - 1.0) * (x.back() - 1.0);
        }
        EXPECT_EQ(sumOf(x), naive) << n;
        std::vector<double> copy(n, -1.0);
        EXPECT_EQ(copyAndSum(x, copy.data()), naive) << n;
        EXPECT_EQ(copy, x) << n;
        std::vector<double> w(n), weighted(n, -1.0), expected(n);
        for (std::size_t i = 0; i < n; ++i) {
            w[i] = 0.25 * static_cast<double>(i % 5);
            expected[i] = x[i] * w[i];
        }
        EXPECT_EQ(weightedCopyAndSum(x, w.data(), weighted.data()), naive) << n;
        EXPECT_EQ(weighted, expected) << n;
        const DeviationSums d = deviationSums(x, 1.0);
        EXPECT_EQ(d.sum, naive - static_cast<double>(n)) << n;
        EXPECT_EQ(d.squares, naiveSquares) << n;
    }
}

TEST(Sums, NonFiniteValuesShowInTheSumFromAnyLane) {
    for (std::size_t at = 0; at < 2 * kReductionWidth + 3; ++at) {
        std::vector<double> x(2 * kReductionWidth + 3, 1.0);
        x[at] = std::numeric_limits<double>::quiet_NaN();
        EXPECT_TRUE(std::isnan(sumOf(x))) << at;
        EXPECT_TRUE(std::isnan(deviationSums(x, 0.5).squares)) << at;
    }
}

// The one-pass mean and spread against a two-pass reference in long double: a large offset under a
// small tone, and a spike among the first samples (the provisional centre then sits far from the
// mean), lose no more than a few digits. A non-finite sample shows.
TEST(Sums, MeanAndDeviationsInOnePass) {
    for (double spike : {0.0, 1e4}) {
        std::vector<double> x(200'000);
        for (std::size_t i = 0; i < x.size(); ++i) x[i] = 1e6 + std::sin(0.0314 * static_cast<double>(i));
        x[3] += spike;
        long double mean = 0, squares = 0;
        for (double v : x) mean += v;
        mean /= static_cast<long double>(x.size());
        for (double v : x) squares += (v - mean) * (v - mean);
        const MeanAndDeviations m = meanAndDeviations(x);
        EXPECT_NEAR(m.mean, static_cast<double>(mean), 1e-9) << spike;
        EXPECT_NEAR(m.about.squares, static_cast<double>(squares), 1e-8 * static_cast<double>(squares)) << spike;
        EXPECT_NEAR(m.about.sum, 0.0, 1e-6) << spike;
    }
    std::vector<double> bad(3000, 1.0);
    bad[2500] = std::numeric_limits<double>::infinity();
    EXPECT_FALSE(std::isfinite(meanAndDeviations(bad).about.squares));
    EXPECT_EQ(meanAndDeviations({}).mean, 0.0);
}

} // namespace
} // namespace humwise::util
