// Waveform statistics. Check values: REFERENCE.md 8.2 (definitions published, values computed
// there): sine CF sqrt(2), K 1.5; square CF 1, K 1; uniform CF sqrt(3), K 1.8; Gaussian K 3.
#include "core/dsp/Statistics.h"
#include "support/TestSupport.h"

#include <gtest/gtest.h>

#include <cmath>
#include <limits>
#include <random>
#include <utility>
#include <vector>

namespace humwise::dsp {
namespace {

TEST(Statistics, Sine) {
    auto x = test::sine(2.0, 50.0, 10000.0, 10000);
    for (double& v : x) v += 0.5; // DC offset reported apart from the AC RMS
    const auto s = waveformStatistics(x);
    EXPECT_NEAR(s.dcOffset, 0.5, 1e-12);
    EXPECT_NEAR(s.rms, std::sqrt(2.0), 1e-9);
    EXPECT_NEAR(s.crestFactor, std::sqrt(2.0), 1e-6);
    EXPECT_NEAR(s.kurtosis, 1.5, 1e-9);
    EXPECT_NEAR(s.skewness, 0.0, 1e-9);
    EXPECT_NEAR(s.peakToPeak, 4.0, 1e-6);
}

TEST(Statistics, SquareUniformGaussian) {
    std::vector<double> square(1000);
    for (std::size_t i = 0; i < square.size(); ++i) square[i] = (i / 10) % 2 ? 1.0 : -1.0;
    const auto sq = waveformStatistics(square);
    EXPECT_NEAR(sq.crestFactor, 1.0, 1e-12);
    EXPECT_NEAR(sq.kurtosis, 1.0, 1e-12);

    std::mt19937_64 rng(11);
    std::uniform_real_distribution<double> u(-1.0, 1.0);
    std::vector<double> uni(2'000'000);
    for (double& v : uni) v = u(rng);
    const auto us = waveformStatistics(uni);
    EXPECT_NEAR(us.kurtosis, 1.8, 0.005);
    EXPECT_NEAR(us.crestFactor, std::sqrt(3.0), 0.005);

    const auto g = waveformStatistics(test::gaussianNoise(1.0, 2'000'000, 12));
    EXPECT_NEAR(g.kurtosis, 3.0, 0.02);
    EXPECT_NEAR(g.skewness, 0.0, 0.01);
}

TEST(Statistics, NonFiniteSamplesAreCountedAndSkipped) {
    std::vector<double> x = {1.0, -1.0, std::numeric_limits<double>::quiet_NaN(), 1.0, -1.0,
                             std::numeric_limits<double>::infinity()};
    const auto s = waveformStatistics(x);
    EXPECT_EQ(s.count, 4u);
    EXPECT_EQ(s.nonFiniteCount, 2u);
    EXPECT_NEAR(s.rms, 1.0, 1e-12);
}

// Records with every sample finite take a vectorised path, others a careful one
// (core/dsp/SampleExtent.h): a noisy record with NaN and infinities sprinkled in must give what
// the same record without them gives, and the peak is the largest |x - mean| of the samples.
TEST(Statistics, FiniteAndSprinkledRecordsAgree) {
    auto clean = test::gaussianNoise(0.7, 10001, 12);
    for (std::size_t i = 0; i < clean.size(); i += 97) clean[i] += 3.0; // some skew and kurtosis
    std::vector<double> sprinkled;
    for (std::size_t i = 0; i < clean.size(); ++i) {
        if (i % 1000 == 5) sprinkled.push_back(i % 2000 == 5 ? std::numeric_limits<double>::quiet_NaN() : -std::numeric_limits<double>::infinity());
        sprinkled.push_back(clean[i]);
    }
    const auto a = waveformStatistics(clean), b = waveformStatistics(sprinkled);
    EXPECT_EQ(b.count, a.count);
    EXPECT_EQ(b.nonFiniteCount, 10u);
    EXPECT_EQ(b.minimum, a.minimum);
    EXPECT_EQ(b.maximum, a.maximum);
    for (const auto& [x, y] : {std::pair{a.dcOffset, b.dcOffset}, {a.rms, b.rms}, {a.peak, b.peak}, {a.kurtosis, b.kurtosis}, {a.skewness, b.skewness}})
        EXPECT_NEAR(x, y, 1e-12 * std::max(1.0, std::abs(x)));
    double largest = 0;
    for (double v : clean) largest = std::max(largest, std::abs(v - a.dcOffset));
    EXPECT_EQ(a.peak, largest);
}

TEST(Statistics, EmptyAndConstantInputsAreSafe) {
    EXPECT_EQ(waveformStatistics({}).count, 0u);
    const std::vector<double> c(100, 3.0);
    const auto s = waveformStatistics(c);
    EXPECT_EQ(s.rms, 0.0);
    EXPECT_EQ(s.crestFactor, 0.0);
    EXPECT_EQ(s.kurtosis, 0.0);
}

} // namespace
} // namespace humwise::dsp
