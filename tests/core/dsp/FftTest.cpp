// FFT wrapper: compared with a naive DFT (tolerance scaled by size and precision), sizes
// including odd and prime ones; float and double; the plan cache from several threads.
#include "core/dsp/Fft.h"
#include "support/TestSupport.h"

#include <gtest/gtest.h>

#include <cmath>
#include <complex>
#include <numbers>
#include <optional>
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
    for (std::size_t i = 0; i < n; ++i) fwd.input()[i] = {re[i], im[i]};
    fwd.execute();
    std::copy(fwd.output().begin(), fwd.output().end(), bwd.input().begin());
    bwd.execute();
    for (std::size_t i = 0; i < n; ++i) {
        EXPECT_NEAR(bwd.output()[i].real() / n, re[i], 1e-12);
        EXPECT_NEAR(bwd.output()[i].imag() / n, im[i], 1e-12);
    }
}

// Out of place with FFTW_PRESERVE_INPUT (Fft.h): the band cuts rely on the input surviving
// execute(), rewriting only part of it for the next transform.
TEST(ComplexFft, KeepsItsInputAcrossExecute) {
    const std::size_t n = 8640; // 2^6 3^3 5: FFTW's mixed-radix plans
    ComplexFft<float> bwd(n, FftDirection::Backward);
    const auto re = test::gaussianNoise(1.0, n, 3);
    for (std::size_t i = 0; i < n; ++i) bwd.input()[i] = {static_cast<float>(re[i]), 0.0f};
    bwd.execute();
    const std::vector<std::complex<float>> first(bwd.output().begin(), bwd.output().end());
    for (std::size_t i = 0; i < n; ++i) ASSERT_EQ(bwd.input()[i], std::complex<float>(static_cast<float>(re[i]), 0.0f)) << i;
    bwd.execute();
    for (std::size_t i = 0; i < n; ++i) ASSERT_EQ(bwd.output()[i], first[i]) << i;
}

// Kept transforms (Fft.h): one per length and thread, reused, each thread its own; the same
// plan as a fresh transform, so the same numbers to the bit.
TEST(KeptRealFft, ReusedPerLengthAndThreadAndTransformsLikeAFreshOne) {
    std::optional<RealFft<double>> own;
    std::optional<RealFft<float>> ownFloat;
    RealFft<double>& a = keptRealFft<double>(1000, own);
    EXPECT_EQ(&keptRealFft<double>(1000, own), &a);
    EXPECT_NE(static_cast<void*>(&keptRealFft<float>(1000, ownFloat)), static_cast<void*>(&a));
    EXPECT_FALSE(own.has_value());
    const RealFft<double>* other = nullptr;
    std::thread([&] {
        std::optional<RealFft<double>> theirs;
        other = &keptRealFft<double>(1000, theirs);
    }).join();
    EXPECT_NE(other, &a);

    const auto x = test::gaussianNoise(1.0, 1000, 5);
    RealFft<double>& kept = keptRealFft<double>(1000, own);
    RealFft<double> fresh(1000);
    std::copy(x.begin(), x.end(), kept.input().begin());
    std::copy(x.begin(), x.end(), fresh.input().begin());
    kept.execute();
    fresh.execute();
    for (std::size_t k = 0; k < fresh.binCount(); ++k) ASSERT_EQ(kept.output()[k], fresh.output()[k]) << k;
}

// Bounded: a length that would take the thread past 32 MiB drops the others first; one larger
// than that alone is made in the caller's `own` and not kept; a refused length keeps nothing.
TEST(KeptRealFft, StaysWithinItsBudget) {
    std::thread([] {
        const auto bytesOf = [](std::size_t n) { return n * sizeof(double) + (n / 2 + 1) * sizeof(std::complex<double>); };
        std::optional<RealFft<double>> own;
        EXPECT_EQ(keptRealFftBytes<double>(), 0u);
        keptRealFft<double>(4096, own);
        keptRealFft<double>(std::size_t{1} << 20, own); // 8 + 8 MiB
        EXPECT_EQ(keptRealFftBytes<double>(), bytesOf(4096) + bytesOf(std::size_t{1} << 20));
        keptRealFft<double>(std::size_t{3} << 19, own); // 12 + 12 MiB: past 32 MiB with the others
        EXPECT_EQ(keptRealFftBytes<double>(), bytesOf(std::size_t{3} << 19));
        keptRealFft<double>(std::size_t{3} << 19, own);
        EXPECT_EQ(keptRealFftBytes<double>(), bytesOf(std::size_t{3} << 19)) << "the same length is reused, not added";
        EXPECT_FALSE(own.has_value());

        RealFft<double>& large = keptRealFft<double>(std::size_t{3} << 20, own); // 24 + 24 MiB
        ASSERT_TRUE(own.has_value());
        EXPECT_EQ(&large, &*own);
        EXPECT_EQ(keptRealFftBytes<double>(), bytesOf(std::size_t{3} << 19)) << "not kept";

        // A length the transform refuses throws and keeps nothing (a kept empty slot would crash
        // the next call for it).
        EXPECT_THROW(keptRealFft<double>(0, own), std::invalid_argument);
        EXPECT_THROW(keptRealFft<double>(0, own), std::invalid_argument);
        EXPECT_EQ(keptRealFftBytes<double>(), bytesOf(std::size_t{3} << 19));
    }).join();
}

// Moves hand over the buffers and the plan; the moved-from transform is empty and refuses to
// execute; a move assignment frees what the target held (the sanitizer build sees a leak or a
// double free).
TEST(Fft, MovesHandOverTheBuffersAndLeaveAnEmptyTransform) {
    RealFft<double> a(8);
    for (std::size_t i = 0; i < 8; ++i) a.input()[i] = 1.0;
    const double* buffer = a.input().data();
    RealFft<double> b(std::move(a));
    EXPECT_EQ(b.input().data(), buffer);
    EXPECT_EQ(a.size(), 0u); // NOLINT(bugprone-use-after-move): the moved-from state is the point
    EXPECT_THROW(a.execute(), std::logic_error);
    b.execute();
    EXPECT_DOUBLE_EQ(b.output()[0].real(), 8.0);

    ComplexFft<float> c(16, FftDirection::Forward), d(32, FftDirection::Backward);
    c.input()[0] = {1.0f, 0.0f};
    for (std::size_t i = 1; i < 16; ++i) c.input()[i] = {0.0f, 0.0f};
    d = std::move(c);
    EXPECT_EQ(d.size(), 16u);
    EXPECT_THROW(c.execute(), std::logic_error); // NOLINT(bugprone-use-after-move)
    d.execute();
    for (std::size_t k = 0; k < 16; ++k) EXPECT_EQ(d.output()[k], std::complex<float>(1.0f, 0.0f)) << k;
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
    EXPECT_EQ(nextFastFftSize(0), 1u);
}

TEST(Fft, NextFastSizeCanBeAMultiple) {
    // 8534 lines: 8575 = 5^2 7^3 is the next size of small factors, 8640 = 2^6 3^3 5 the next
    // that is also a multiple of 8 (1067..1079 times 8 all have a factor above 7).
    EXPECT_EQ(nextFastFftSize(8534), 8575u);
    EXPECT_EQ(nextFastFftSize(8534, 8), 8640u);
    EXPECT_EQ(nextFastFftSize(8640, 8), 8640u);
    EXPECT_EQ(nextFastFftSize(3, 8), 8u);
    EXPECT_EQ(nextFastFftSize(0, 8), 8u);
    EXPECT_EQ(nextFastFftSize(100, 0), 100u);
    EXPECT_THROW(nextFastFftSize(100, 11), std::invalid_argument);
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
