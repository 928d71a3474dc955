// Sums with partial accumulators (core/util/Sums.h): exact on values whose sums are exact in
// double, every length around the four-way split (the tail must not be lost), empty input.
#include "core/util/Sums.h"

#include <gtest/gtest.h>

#include <cmath>
#include <limits>
#include <vector>

namespace humwise::util {
namespace {

TEST(Sums, EveryLengthAroundTheFourWaySplit) {
    for (std::size_t n = 0; n <= 11; ++n) {
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

TEST(Sums, NonFiniteValuesShowInTheSum) {
    std::vector<double> x(9, 1.0);
    x[6] = std::numeric_limits<double>::quiet_NaN();
    EXPECT_TRUE(std::isnan(sumOf(x)));
}

} // namespace
} // namespace humwise::util
