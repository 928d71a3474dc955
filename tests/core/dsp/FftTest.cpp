// FFT wrapper: compared with a naive DFT (tolerance scaled by size and precision), sizes
// including odd and prime ones; float and double; the plan cache from several threads.
#include "core/dsp/Fft.h"
#include "support/TestSupport.h"

#include <gtest/gtest.h>

#include <cmath>
#include <complex>
#include <numbers>
#include <thread>

namespace humwise::dsp {
namespace {

std::vector<std::complex<double>> naiveDft(const std::vector<double>& x) {
    const std::size_t n = x.size();
    std::vector<std::complex<double>> out(n / 2 + 1);
    for (std::size_t k = 0; k < out.size(); ++k) {
        std::complex<double> sum = 0;
        for (std::size_t i = 0; i < n; ++i)
            sum += x[i] * std::polar(1.0, -2.0 * std::numbers::pi * static_cast<double>(k * i % n) / static_cast<double>(n));
        out[k] = sum;
    }
    return out;
}

class RealFftSizes : public ::testing::TestWithParam<std::size_t> {};

TEST_P(RealFftSizes, MatchesNaiveDftInDoubleAndFloat) {
    const std::size_t n = GetParam();
    const auto x = test::gaussianNoise(1.0, n, 1234 + n);
    const auto ref = naiveDft(x);
    RealFft<double> fd(n);
    RealFft<float> ff(n);
    for (std::size_t i = 0; i < n; ++i) {
        fd.input()[i] = x[i];
        ff.input()[i] = static_cast<float>(x[i]);
    }
    fd.execute();
    ff.execute();
    const double scale = std::sqrt(static_cast<double>(n));
    for (std::size_t k = 0; k < ref.size(); ++k) {
        SCOPED_TRACE("n=" + std::to_string(n) + " k=" + std::to_string(k));
        EXPECT_NEAR(std::abs(fd.output()[k] - ref[k]), 0.0, 1e-10 * scale * std::log2(n + 1.0));
        EXPECT_NEAR(std::abs(std::complex<double>(ff.output()[k]) - ref[k]), 0.0, 2e-5 * scale * std::log2(n + 1.0));
    }
}

INSTANTIATE_TEST_SUITE_P(Sizes, RealFftSizes, ::testing::Values(1, 2, 3, 7, 16, 97, 100, 127, 1000, 1024, 4093));

TEST(ComplexFft, ForwardThenBackwardScalesByN) {
    const std::size_t n = 360;
    ComplexFft<double> fwd(n, FftDirection::Forward), bwd(n, FftDirection::Backward);
    const auto re = test::gaussianNoise(1.0, n, 7), im = test::gaussianNoise(1.0, n, 8);
    for (std::size_t i = 0; i < n; ++i) fwd.data()[i] = {re[i], im[i]};
    fwd.execute();
    std::copy(fwd.data().begin(), fwd.data().end(), bwd.data().begin());
    bwd.execute();
    for (std::size_t i = 0; i < n; ++i) {
        EXPECT_NEAR(bwd.data()[i].real() / n, re[i], 1e-12);
        EXPECT_NEAR(bwd.data()[i].imag() / n, im[i], 1e-12);
    }
}

TEST(Fft, RejectsZeroSize) {
    EXPECT_THROW(RealFft<double>(0), std::invalid_argument);
    EXPECT_THROW(ComplexFft<float>(0, FftDirection::Forward), std::invalid_argument);
}

TEST(Fft, NextFastSizeHasOnlySmallFactors) {
    EXPECT_EQ(nextFastFftSize(1), 1u);
    EXPECT_EQ(nextFastFftSize(11), 12u);
    EXPECT_EQ(nextFastFftSize(4093), 4096u);
    EXPECT_EQ(nextFastFftSize(1000), 1000u);
}

// Plans are created under the planner mutex; transforms of shared plans run concurrently.
TEST(Fft, PlanCacheIsSafeAcrossThreads) {
    const auto x = test::gaussianNoise(1.0, 4096, 99);
    RealFft<double> single(4096);
    std::copy(x.begin(), x.end(), single.input().begin());
    single.execute();
    const std::complex<double> expected = single.output()[123];
    std::vector<std::thread> threads;
    std::vector<int> ok(8, 0);
    for (int t = 0; t < 8; ++t)
        threads.emplace_back([&, t] {
            int good = 0;
            for (int rep = 0; rep < 50; ++rep) {
                RealFft<double> fft(4096);
                RealFft<float> other(1000 + static_cast<std::size_t>(t * 7 + rep)); // new plans while others execute
                std::copy(x.begin(), x.end(), fft.input().begin());
                fft.execute();
                good += std::abs(fft.output()[123] - expected) < 1e-9;
            }
            ok[t] = good;
        });
    for (auto& th : threads) th.join();
    for (int v : ok) EXPECT_EQ(v, 50);
    EXPECT_GT(cachedPlanCount(), 8u);
}

} // namespace
} // namespace humwise::dsp
