// Power quality: NEMA and IEC unbalance against the worked examples of REFERENCE.md 6.1-6.2,
// the NEMA derating table of 6.3, THD against the analytic values of 6.5, and the negative-
// sequence ratio of the ITSC motor-current recordings (../shared, SOURCES.md).
#include "core/power/PowerQuality.h"

#include "core/dsp/Peaks.h"
#include "core/dsp/Zoom.h"
#include "core/io/WavReader.h"
#include "support/TestSupport.h"

#include <gtest/gtest.h>

#include <array>
#include <cmath>
#include <complex>
#include <numbers>
#include <ostream>
#include <stdexcept>
#include <vector>

namespace humwise::power {
namespace {

using Complex = std::complex<double>;
constexpr double kPi = std::numbers::pi;

// REFERENCE.md 6.1, published worked examples (recomputed there), quoted to two decimals.
TEST(Unbalance, NemaPublishedExamples) {
    EXPECT_NEAR(nemaUnbalancePercent(462, 463, 455), 1.09, 0.005);
    EXPECT_NEAR(nemaUnbalancePercent(462, 468, 450), 2.17, 0.005);
    EXPECT_NEAR(nemaUnbalancePercent(460, 467, 450), 1.96, 0.005);
    EXPECT_NEAR(nemaUnbalancePercent(460, 467, 450), 100.0 * 9.0 / 459.0, 1e-12); // exact: max dev 9 on avg 459
    EXPECT_NEAR(nemaUnbalancePercent(400, 400, 400), 0.0, 1e-12);
}

// REFERENCE.md 6.1 pitfall (published technical note): (max-min)/avg of 460/467/450 is 3.70 %,
// not the NEMA 1.96 %.
TEST(Unbalance, MaxMinusMinIsNotNema) {
    EXPECT_NEAR(maxMinusMinPercent(460, 467, 450), 3.70, 0.005);
    EXPECT_GT(maxMinusMinPercent(460, 467, 450), nemaUnbalancePercent(460, 467, 450) + 1.0);
}

// Current unbalance uses the same formula (REFERENCE.md 6.4): 10.0/10.5/9.5 A -> 5 %.
TEST(Unbalance, NemaFormulaOnCurrents) { EXPECT_NEAR(nemaUnbalancePercent(10.0, 10.5, 9.5), 5.0, 1e-12); }

// Line voltages with the given magnitudes as an exact phasor triangle (Vab + Vbc + Vca = 0,
// Kirchhoff): Vab on the real axis, Vca at the angle phi from it given by the law of cosines
// |Vab + Vca|^2 = Vbc^2, phi near +120 deg for the a-b-c sequence (Vca leads Vab).
SequenceComponents lineVoltageTriangle(double vab, double vbc, double vca) {
    const double cosPhi = (vbc * vbc - vab * vab - vca * vca) / (2 * vab * vca);
    const Complex ab{vab, 0.0}, ca = std::polar(vca, std::acos(cosPhi));
    return symmetricalComponents(ab, -(ab + ca), ca);
}

// REFERENCE.md 6.2: 460/467/450 -> VUF 2.1465 % by the beta formula (formula from memory
// (verify)), and the same from the exact triangle + Fortescue construction built here.
TEST(Unbalance, IecBetaFormulaAgainstExactTriangle) {
    EXPECT_NEAR(iecUnbalanceFromLineVoltages(460, 467, 450), 2.1465, 5e-5);
    for (const auto& v : std::vector<std::array<double, 3>>{{460, 467, 450}, {462, 463, 455}, {400, 380, 430}, {1, 1.2, 0.9}}) {
        const auto s = lineVoltageTriangle(v[0], v[1], v[2]);
        EXPECT_NEAR(std::abs(s.zero), 0.0, 1e-9 * v[0]); // line voltages have no zero sequence
        EXPECT_GT(std::abs(s.positive), std::abs(s.negative)); // a-b-c construction
        EXPECT_NEAR(iecUnbalanceFromLineVoltages(v[0], v[1], v[2]), 100 * negativeSequenceRatio(s), 1e-9)
            << v[0] << "/" << v[1] << "/" << v[2];
    }
    EXPECT_NEAR(iecUnbalanceFromLineVoltages(400, 400, 400), 0.0, 1e-6);
    EXPECT_NEAR(iecUnbalanceFromLineVoltages(1, 1, 2), 100.0, 1e-6); // flat triangle: |V2| = |V1|
    EXPECT_THROW(iecUnbalanceFromLineVoltages(1, 1, 3), std::invalid_argument);
    EXPECT_THROW(iecUnbalanceFromLineVoltages(0, 1, 1), std::invalid_argument);
}

// REFERENCE.md 6.3, NEMA MG-1 derating curve (published; lower reading where a range is given:
// 0.88 at 3 %, 0.75 at 5 %).
TEST(Derating, NemaTableAndInterpolation) {
    EXPECT_DOUBLE_EQ(nemaDeratingFactor(0), 1.00);
    EXPECT_DOUBLE_EQ(nemaDeratingFactor(1), 1.00);
    EXPECT_DOUBLE_EQ(nemaDeratingFactor(2), 0.95);
    EXPECT_DOUBLE_EQ(nemaDeratingFactor(3), 0.88);
    EXPECT_DOUBLE_EQ(nemaDeratingFactor(4), 0.82);
    EXPECT_DOUBLE_EQ(nemaDeratingFactor(5), 0.75);
    EXPECT_NEAR(nemaDeratingFactor(2.75), (0.93 + 0.88) / 2, 1e-12); // midpoint 2.5 .. 3
    EXPECT_NEAR(nemaDeratingFactor(1.25), (1.00 + 0.97) / 2, 1e-12);
    EXPECT_DOUBLE_EQ(nemaDeratingFactor(7.5), 0.75); // held at the 5 % value...
    EXPECT_FALSE(nemaOperationRecommended(7.5));     // ...and flagged (published: not recommended)
    EXPECT_TRUE(nemaOperationRecommended(5.0));
    EXPECT_THROW(nemaDeratingFactor(-0.1), std::invalid_argument);
}

// sum_h amplitude_h cos(2 pi h f n / fs + phase_h)
std::vector<double> harmonicSignal(const std::vector<std::pair<int, double>>& orders, double f, double fs,
                                   std::size_t count) {
    std::vector<double> x(count, 0.0);
    for (const auto& [h, amplitude] : orders)
        for (std::size_t n = 0; n < count; ++n)
            x[n] += amplitude * std::cos(2 * kPi * h * f * static_cast<double>(n) / fs + 0.37 * h);
    return x;
}

// REFERENCE.md 6.5 (computed there): fundamental 1, 5th 0.20, 7th 0.14 -> THD_F 24.41 %,
// THD_R 23.72 %. Fundamental 50.3 Hz at 5 kHz over 50 087 samples (10.017 s, 503.9 cycles:
// off-bin and not whole cycles); the fit stays exact to 1e-6.
TEST(Harmonics, FifthAndSeventhOffBin) {
    const double fs = 5000, f = 50.3;
    const auto x = harmonicSignal({{1, 1.0}, {5, 0.2}, {7, 0.14}}, f, fs, 50'087);
    const auto r = harmonicAnalysis(x, fs, f);
    EXPECT_EQ(r.highestOrder, 45); // 45 x 50.3 = 2263.5 Hz <= 2500 / 1.1 = 2272.7 Hz < 46 x 50.3
    ASSERT_EQ(r.harmonicRms.size(), 44u);
    EXPECT_NEAR(r.fundamentalRms, 1.0 / std::numbers::sqrt2, 1e-6);
    for (int h = 2; h <= r.highestOrder; ++h) {
        const double expected = (h == 5 ? 0.2 : h == 7 ? 0.14 : 0.0) / std::numbers::sqrt2;
        EXPECT_NEAR(r.harmonicRms[h - 2], expected, 1e-6) << "order " << h;
    }
    EXPECT_NEAR(r.thdFundamentalPercent, 24.41, 0.005);
    EXPECT_NEAR(r.thdRmsPercent, 23.72, 0.005);
    EXPECT_NEAR(r.thdFundamentalPercent, 100 * std::hypot(0.2, 0.14), 1e-6);
    EXPECT_NEAR(r.thdRmsPercent, 100 * std::hypot(0.2, 0.14) / std::sqrt(1 + 0.04 + 0.0196), 1e-6);

    // A single-frequency fit at 5f over the same partial-cycle record is not exact (the
    // fundamental leaks in): the reason harmonicAnalysis fits all orders jointly.
    EXPECT_GT(std::abs(phasorAt(x, fs, 5 * f).magnitude - 0.2 / std::numbers::sqrt2), 1e-6);
}

// Band-limited square wave: odd harmonics 1/h up to h = 49 (Fourier series of a square wave,
// truncated). THD_F must equal the truncated series computed here; adding back the tail beyond
// 49 must give the infinite-series value sqrt(pi^2/8 - 1) = 48.34 % (REFERENCE.md 6.5, analytic).
TEST(Harmonics, BandLimitedSquareWave) {
    const double fs = 20000, f = 49.7;
    std::vector<std::pair<int, double>> orders;
    double inBand = 0;
    for (int h = 1; h <= 49; h += 2) {
        orders.emplace_back(h, 1.0 / h);
        if (h > 1) inBand += 1.0 / (h * h);
    }
    const auto x = harmonicSignal(orders, f, fs, 20'123);
    const auto r = harmonicAnalysis(x, fs, f);
    EXPECT_EQ(r.highestOrder, 50);
    EXPECT_NEAR(r.thdFundamentalPercent, 100 * std::sqrt(inBand), 1e-6);
    double tail = 0;
    for (int h = 51; h < 400'001; h += 2) tail += 1.0 / (static_cast<double>(h) * h);
    EXPECT_NEAR(100 * std::sqrt(r.thdFundamentalPercent * r.thdFundamentalPercent / 1e4 + tail), 48.34, 0.005);
    EXPECT_NEAR(100 * std::sqrt(r.thdFundamentalPercent * r.thdFundamentalPercent / 1e4 + tail),
                100 * std::sqrt(kPi * kPi / 8 - 1), 1e-3);
    for (int h = 2; h <= 50; h += 2) EXPECT_NEAR(r.harmonicRms[h - 2], 0.0, 1e-9) << "even order " << h;
}

// X_rms includes what the fit leaves (noise here): THD_R uses the total RMS (REFERENCE.md 6.5).
TEST(Harmonics, RmsIncludesNoise) {
    const double fs = 5000, f = 50.0;
    auto x = harmonicSignal({{1, 1.0}, {3, 0.1}}, f, fs, 50'000); // 10 s, whole cycles
    test::add(x, test::gaussianNoise(0.05, x.size(), 11));
    const auto r = harmonicAnalysis(x, fs, f);
    double mean = 0, ms = 0;
    for (double v : x) mean += v;
    mean /= static_cast<double>(x.size());
    for (double v : x) ms += (v - mean) * (v - mean);
    EXPECT_NEAR(r.rms, std::sqrt(ms / static_cast<double>(x.size())), 1e-9); // whole cycles: plain RMS
    EXPECT_NEAR(r.rms, std::sqrt(0.5 + 0.005 + 0.0025), 1e-3);
    EXPECT_NEAR(r.thdFundamentalPercent, 10.0, 0.1); // noise adds sigma sqrt(2/N) per order
}

// Orders above (fs/2)/1.1 are skipped: 60 Hz at 1 kHz -> 7 x 60 = 420 <= 454.5 < 480.
TEST(Harmonics, OrdersNearNyquistSkippedAndBadParameters) {
    const auto x = harmonicSignal({{1, 1.0}, {3, 0.05}}, 60.0, 1000.0, 5000);
    const auto r = harmonicAnalysis(x, 1000.0, 60.0);
    EXPECT_EQ(r.highestOrder, 7);
    EXPECT_EQ(r.harmonicRms.size(), 6u);
    EXPECT_NEAR(r.thdFundamentalPercent, 5.0, 1e-9);
    EXPECT_EQ(harmonicAnalysis(x, 1000.0, 60.0, 3).harmonicRms.size(), 2u);
    EXPECT_THROW(harmonicAnalysis(x, 1000.0, 60.0, 1), std::invalid_argument);
    EXPECT_THROW(harmonicAnalysis(x, 1000.0, 230.0), std::invalid_argument); // 2 x 230 > 454.5
    EXPECT_THROW(harmonicAnalysis(std::span<const double>(x).first(15), 1000.0, 60.0), std::invalid_argument);
}

// ---- Real data: ITSC stator currents (J.-J. Cardenas-Cornejo et al., "Classification of
// inter-turn short-circuit faults in induction motors based on quaternion analysis",
// Measurement 222 (2023) 113680, via ../shared/data/recordings/SOURCES.md): 3 channels I_A,
// I_B, I_C at 1 kHz, 60 Hz supply, 5 s. SOURCES.md: |I2|/|I1| ~ 0.037 healthy, ~ 0.139 with a
// 40 % inter-turn short in phase A.

// Supply frequency: strongest line of a zoom spectrum 56-64 Hz, interpolated (Zoom.h, Peaks.h).
double supplyFrequencyHz(const std::vector<double>& x, double fs) {
    dsp::ZoomRequest z;
    z.centreHz = 60.0;
    z.spanHz = 8.0;
    const auto s = dsp::zoomSpectrum(x, fs, z);
    if (!s.ok()) throw std::runtime_error(s.error().message);
    const auto peaks = dsp::findPeaks(s.value(), {.maxPeaks = 1});
    if (peaks.empty()) throw std::runtime_error("no peak near 60 Hz");
    return peaks.front().frequencyHz;
}

struct ItscCase {
    const char* file;
    double expectedRatio;
};

std::ostream& operator<<(std::ostream& out, const ItscCase& c) { return out << c.file; }

class ItscCurrents : public ::testing::TestWithParam<ItscCase> {};

TEST_P(ItscCurrents, NegativeSequenceRatioMatchesSources) {
    const ItscCase& c = GetParam();
    HUMWISE_REQUIRE_SHARED_RECORDING(path, c.file);
    io::ChannelSettings settings; // the sidecar: values proportional to amperes (WAV default is g)
    settings.defaults.unit = Unit::Ampere;
    const auto rec = io::readWavFile(path, settings);
    ASSERT_TRUE(rec.ok()) << rec.error().message();
    const Recording& r = rec.value();
    ASSERT_EQ(r.channels.size(), 3u);
    ASSERT_DOUBLE_EQ(r.sampleRateHz, 1000.0);
    for (const auto& ch : r.channels) ASSERT_EQ(ch.quantity, Quantity::Current);

    double f = 0;
    for (const auto& ch : r.channels) f += supplyFrequencyHz(ch.samples, r.sampleRateHz) / 3.0;
    // The three phases must agree on one supply frequency within a tenth of the 0.2 Hz line
    // spacing of a 5 s record (observed: within 0.01 Hz of the mean on the fault record, whose
    // supply line has a broad skirt, -27 dB at 60.8 Hz; within 0.001 Hz on the healthy one).
    for (const auto& ch : r.channels)
        EXPECT_NEAR(supplyFrequencyHz(ch.samples, r.sampleRateHz), f, 0.02);
    EXPECT_NEAR(f, 60.0, 0.1); // SOURCES.md: 60 Hz supply

    Complex p[3];
    for (int i = 0; i < 3; ++i) p[i] = toComplex(phasorAt(r.channels[i].samples, r.sampleRateHz, f));
    const auto s = symmetricalComponents(p[0], p[1], p[2]);
    EXPECT_GT(std::abs(s.positive), 5 * std::abs(s.negative)) << "phase order is not a-b-c"; // b lags a
    EXPECT_NEAR(negativeSequenceRatio(s), c.expectedRatio, 0.01)
        << c.file << ": f = " << f << " Hz, |I0|/|I1| = " << std::abs(s.zero) / std::abs(s.positive);
}

INSTANTIATE_TEST_SUITE_P(OpenDataset, ItscCurrents,
                         ::testing::Values(ItscCase{"itsc_current_healthy_rep1.wav", 0.037},
                                           ItscCase{"itsc_current_phaseA_40pct_rep1.wav", 0.139}));

} // namespace
} // namespace humwise::power
