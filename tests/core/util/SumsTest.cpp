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

} // namespace
} // namespace humwise::util
