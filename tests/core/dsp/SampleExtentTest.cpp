// The vectorised extent and central sums (core/dsp/SampleExtent.h) against plain loops: the
// smallest, largest and non-finite sample at every position of records of every length around
// the split into vectors of lanes, so that no lane and no tail sample is lost.
#include "core/dsp/SampleExtent.h"

#include "core/util/DoubleLanes.h"

#include <gtest/gtest.h>

#include <cmath>
#include <limits>
#include <vector>

namespace humwise::dsp {
namespace {

constexpr std::size_t kLongest = 2 * util::kReductionWidth + 5;

std::vector<double> ramp(std::size_t n) { // small halves: sums exact in double
    std::vector<double> x(n);
    for (std::size_t i = 0; i < n; ++i) x[i] = 0.5 * static_cast<double>(i % 7) - 1.0;
    return x;
}

TEST(SampleExtent, ExtremesAtEveryPosition) {
    for (std::size_t n = 1; n <= kLongest; ++n)
        for (std::size_t at = 0; at < n; ++at) {
            auto x = ramp(n);
            x[at] = -50.0;
            x[n - 1 - at] = (n - 1 - at == at) ? -50.0 : 75.0;
            double lo = INFINITY, hi = -INFINITY, sum = 0;
            for (double v : x) {
                lo = std::min(lo, v);
                hi = std::max(hi, v);
                sum += v;
            }
            const SampleExtent e = sampleExtent(x);
            EXPECT_EQ(e.lo, lo) << n << " " << at;
            EXPECT_EQ(e.hi, hi) << n << " " << at;
            EXPECT_EQ(e.sum, sum) << n << " " << at;
            EXPECT_EQ(e.nonFinite, 0u);
        }
}

TEST(SampleExtent, NonFiniteSampleAtEveryPosition) {
    const double bad[] = {std::numeric_limits<double>::quiet_NaN(), std::numeric_limits<double>::infinity(),
                          -std::numeric_limits<double>::infinity()};
    for (double b : bad)
        for (std::size_t at = 0; at < kLongest; ++at) {
            auto x = ramp(kLongest);
            x[at] = b;
            double lo = INFINITY, hi = -INFINITY, sum = 0;
            for (double v : x)
                if (std::isfinite(v)) {
                    lo = std::min(lo, v);
                    hi = std::max(hi, v);
                    sum += v;
                }
            const SampleExtent e = sampleExtent(x);
            EXPECT_EQ(e.nonFinite, 1u) << b << " at " << at;
            EXPECT_EQ(e.lo, lo) << b << " at " << at;
            EXPECT_EQ(e.hi, hi) << b << " at " << at;
            EXPECT_EQ(e.sum, sum) << b << " at " << at;
        }
}

TEST(SampleExtent, CentralPowerSumsEveryLength) {
    for (std::size_t n = 0; n <= kLongest; ++n) {
        const auto x = ramp(n);
        double m2 = 0, m3 = 0, m4 = 0;
        for (double v : x) {
            const double d = v - 0.25;
            m2 += d * d;
            m3 += d * d * d;
            m4 += d * d * d * d;
        }
        for (bool allFinite : {true, false}) {
            const CentralPowerSums p = centralPowerSums(x, 0.25, allFinite);
            EXPECT_EQ(p.m2, m2) << n;
            EXPECT_EQ(p.m3, m3) << n;
            EXPECT_EQ(p.m4, m4) << n;
        }
    }
}

} // namespace
} // namespace humwise::dsp
