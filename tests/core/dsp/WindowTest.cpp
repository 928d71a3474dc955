// Window metrics against Harris 1978 / Heinzel, Ruediger & Schilling 2002, as tabulated in
// REFERENCE.md 1.3 (computed there from the published formulas; the Hann, Hamming,
// Blackman-Harris and HFT95 rows also match Heinzel's Table 2 as published). Tolerances are the
// ones REFERENCE.md 1.3 suggests: CG, NENBW +-1e-4; SL +-1e-3 dB; PSLL +-0.1 dB; 3-dB width
// +-0.005 bin.
#include "core/dsp/Window.h"

#include <gtest/gtest.h>

#include <cmath>
#include <numbers>

namespace humwise::dsp {
namespace {

struct Row {
    const char* name;
    WindowSpec spec;
    double cg, nenbw, slDb, psllDb, width3dB;
};

class WindowMetricsTable : public ::testing::TestWithParam<Row> {};

TEST_P(WindowMetricsTable, MatchesPublishedValues) {
    const Row& r = GetParam();
    const auto w = makeWindow(r.spec, 4096);
    const auto m = computeWindowMetrics(w, 64);
    EXPECT_NEAR(m.coherentGain, r.cg, 1e-4);
    EXPECT_NEAR(m.nenbwBins, r.nenbw, 1e-4);
    EXPECT_NEAR(m.scallopingLossDb, r.slDb, 1e-3);
    EXPECT_NEAR(m.highestSidelobeDb, r.psllDb, 0.1);
    EXPECT_NEAR(m.halfPowerWidthBins, r.width3dB, 0.005);
}

constexpr double pi = std::numbers::pi;
INSTANTIATE_TEST_SUITE_P(
    Reference13, WindowMetricsTable,
    ::testing::Values(Row{"rect", {WindowKind::Rectangular}, 1.0, 1.0, 3.9224, -13.26, 0.8845},
                      Row{"hann", {WindowKind::Hann}, 0.5, 1.5, 1.4236, -31.47, 1.4382},
                      Row{"hamming", {WindowKind::Hamming}, 0.54, 1.3628, 1.7514, -42.68, 1.3008},
                      Row{"blackman_harris", {WindowKind::BlackmanHarris}, 0.3588, 2.0044, 0.8256, -92.01, 1.8962},
                      Row{"kaiser_2pi", {WindowKind::Kaiser, 2 * pi}, 0.4892, 1.4963, 1.4527, -45.85, 1.427},
                      Row{"kaiser_3pi", {WindowKind::Kaiser, 3 * pi}, 0.4025, 1.7952, 1.0226, -69.62, 1.7025},
                      Row{"kaiser_3_5pi", {WindowKind::Kaiser, 3.5 * pi}, 0.3735, 1.9284, 0.8900, -81.92, 1.826},
                      Row{"hft95", {WindowKind::FlatTop}, 0.2136, 3.8112, 0.0039, -95.00, 3.7592}),
    [](const ::testing::TestParamInfo<Row>& row) { return std::string(row.param.name); });

// REFERENCE.md 1.7: the symmetric N-point Hann has NENBW 1.5 N/(N-1): 1.6000 at N=16.
TEST(Window, SymmetricHannDiffersFromPeriodic) {
    const auto sym = computeWindowMetrics(makeWindow({WindowKind::Hann}, 16, WindowSymmetry::Symmetric), 64);
    const auto per = computeWindowMetrics(makeWindow({WindowKind::Hann}, 16, WindowSymmetry::Periodic), 64);
    EXPECT_NEAR(sym.nenbwBins, 1.6, 1e-4);
    EXPECT_NEAR(per.nenbwBins, 1.5, 1e-12);
}

TEST(Window, PeriodicWindowsArePeakNormalisedAndDftEven) {
    for (auto kind : {WindowKind::Hann, WindowKind::Hamming, WindowKind::BlackmanHarris, WindowKind::FlatTop}) {
        const auto w = makeWindow({kind}, 64);
        EXPECT_NEAR(w[32], 1.0, 1e-12);          // the centre of a DFT-even window is its peak
        EXPECT_NEAR(w[1], w[63], 1e-12);          // symmetric about N/2
    }
}

// The cached window carries its sums S1, S2 (as Heinzel, Ruediger & Schilling 2002 define them):
// for the periodic Hann window w = 1/2 - cos(2 pi n / N) / 2, S1 = N / 2 and S2 = 3 N / 8 (the
// cosine sums to zero over whole periods, its square to N / 2). A second call gives the same
// samples.
TEST(Window, CachedWindowCarriesItsSums) {
    const auto hann = cachedWindow({WindowKind::Hann}, 1024);
    ASSERT_EQ(hann.samples->size(), 1024u);
    EXPECT_NEAR(hann.s1, 512.0, 1e-9);
    EXPECT_NEAR(hann.s2, 384.0, 1e-9);
    EXPECT_EQ(cachedWindow({WindowKind::Hann}, 1024).samples, hann.samples);
    const auto flat = cachedWindow({WindowKind::Rectangular}, 100);
    EXPECT_EQ(flat.s1, 100.0);
    EXPECT_EQ(flat.s2, 100.0);
}

TEST(Window, ParsesNamesAndKaiserBeta) {
    EXPECT_EQ(parseWindowSpec("hann")->kind, WindowKind::Hann);
    EXPECT_EQ(parseWindowSpec("FlatTop")->kind, WindowKind::FlatTop);
    const auto k = parseWindowSpec("kaiser:7.5");
    ASSERT_TRUE(k);
    EXPECT_DOUBLE_EQ(k->kaiserBeta, 7.5);
    EXPECT_FALSE(parseWindowSpec("kaiser:abc"));
    EXPECT_FALSE(parseWindowSpec("kaiser:-1"));
    EXPECT_FALSE(parseWindowSpec("triangle"));
    EXPECT_EQ(windowName(*parseWindowSpec("blackman-harris")), "blackman-harris");
}

// Abramowitz & Stegun table 9.8 values of I0 (from memory, verify): I0(1) = 1.266065878, I0(5) = 27.23987182.
TEST(Window, BesselI0) {
    EXPECT_NEAR(besselI0(0.0), 1.0, 1e-15);
    EXPECT_NEAR(besselI0(1.0), 1.2660658777520082, 1e-14);
    EXPECT_NEAR(besselI0(5.0), 27.239871823604442, 1e-11);
}

} // namespace
} // namespace humwise::dsp
