// Motor-current rules on synthetic currents with a known truth. Broken-bar grading: Thomson &
// Fenger 2001 sideband table (REFERENCE.md 4.1, from memory (verify)); other thresholds in
// Thresholds.h with their sources.
#include "DiagnosisTestSupport.h"

#include <gtest/gtest.h>

#include <cmath>

namespace humwise::diagnosis::test {
namespace {

using humwise::test::Tone;

DiagnosisResult runCurrent(const humwise::test::SyntheticCurrent& spec, const motor::Motor& m = fourPoleMotor()) {
    DiagnosisInput in;
    in.motor = m;
    in.current = CurrentInput{"current", spec.sampleRateHz, humwise::test::synthCurrents(spec)};
    return diagnose(in);
}

humwise::test::SyntheticCurrent brokenBars(double sidebandDb, double slip, std::uint64_t seed) {
    const double f = 50, fr = f / 2 * (1 - slip);
    auto spec = healthyCurrent(f, fr, 4, seed);
    spec.components[2] = Tone{f * (1 - 2 * slip), humwise::test::relativeRms(sidebandDb - 1.0), 0.7};
    spec.components[3] = Tone{f * (1 + 2 * slip), humwise::test::relativeRms(sidebandDb + 1.0), 2.2};
    return spec;
}

struct BarCase {
    double db;
    double slip;
    int severity;
};

class BrokenBars : public ::testing::TestWithParam<BarCase> {};

TEST_P(BrokenBars, SidebandLevelGradesTheRotor) {
    const auto c = GetParam();
    const auto r = runCurrent(brokenBars(c.db, c.slip, 30));
    EXPECT_NEAR(r.operatingPoint.point.slip(), c.slip, 0.005 * (1 - c.slip)) << describe(r);
    const Finding* f = findFault(r, "broken_rotor_bar");
    if (c.severity == 0) {
        EXPECT_TRUE(f == nullptr || f->severity == 0) << describe(r);
    } else {
        ASSERT_NE(f, nullptr) << describe(r);
        EXPECT_FALSE(f->withheld) << f->withheldReason;
        EXPECT_EQ(f->severity, c.severity) << describe(r);
        const double f1 = 50 * (1 - 2 * c.slip), f2 = 50 * (1 + 2 * c.slip);
        bool lower = false, upper = false;
        for (const auto& e : f->evidence) {
            if (e.label == "(1 - 2s) f sideband" && e.measuredHz) lower = std::abs(*e.measuredHz - f1) < 0.02;
            if (e.label == "(1 + 2s) f sideband" && e.measuredHz) upper = std::abs(*e.measuredHz - f2) < 0.02;
        }
        EXPECT_TRUE(lower && upper) << describe(r);
    }
}

INSTANTIATE_TEST_SUITE_P(LevelsAndSlips, BrokenBars,
                         ::testing::Values(BarCase{57, 0.02, 0}, BarCase{45, 0.02, 1}, BarCase{39, 0.02, 2}, BarCase{33, 0.02, 3},
                                           BarCase{45, 0.03, 1}, BarCase{39, 0.015, 2}, BarCase{33, 0.025, 3}));

// Light load: slip 0.6 % on a motor rated 2 % is about 30 % load: the verdict is withheld.
TEST(CurrentRules, BrokenBarVerdictWithheldAtLowLoad) {
    const auto r = runCurrent(brokenBars(36, 0.006, 31));
    const Finding* f = findFault(r, "broken_rotor_bar");
    ASSERT_NE(f, nullptr) << describe(r);
    EXPECT_TRUE(f->withheld);
    EXPECT_EQ(f->severity, 0);
    EXPECT_NE(f->withheldReason.find("load"), std::string::npos) << f->withheldReason;
    ASSERT_TRUE(r.operatingPoint.loadPercent.has_value());
    EXPECT_NEAR(*r.operatingPoint.loadPercent, 30, 3);
}

TEST(CurrentRules, EccentricitySidebands) {
    const double f = 50, fr = 24.55;
    auto spec = healthyCurrent(f, fr, 4, 32);
    spec.components[0].rms = humwise::test::relativeRms(37);
    spec.components[1].rms = humwise::test::relativeRms(39);
    const auto r = runCurrent(spec);
    const Finding* e = findFault(r, "eccentricity");
    ASSERT_NE(e, nullptr) << describe(r);
    EXPECT_EQ(e->severity, 2);
    bool both = true;
    for (const char* label : {"f - fr", "f + fr"}) {
        bool seen = false;
        for (const auto& ev : e->evidence)
            if (ev.label == label && ev.measuredHz) seen = std::abs(*ev.measuredHz - (label[2] == '-' ? f - fr : f + fr)) < 0.05;
        both &= seen;
    }
    EXPECT_TRUE(both) << describe(r);
}

TEST(CurrentRules, StatorAsymmetryGivesNegativeSequence) {
    auto spec = healthyCurrent(50, 24.6, 4, 33);
    spec.phaseBShiftRad = 0.4; // |exp(j 0.4) - 1| / 3 = 0.13 negative sequence
    const auto r = runCurrent(spec);
    const Finding* s = findFault(r, "stator_winding");
    ASSERT_NE(s, nullptr) << describe(r);
    EXPECT_EQ(s->severity, 2);
    EXPECT_EQ(s->origin, Origin::Electrical);
}

TEST(CurrentRules, SupplyUnbalanceIsNotBlamedOnTheStator) {
    auto spec = healthyCurrent(50, 24.6, 4, 34);
    spec.phaseBScale = 0.9;
    spec.phaseCScale = 1.05;
    spec.phaseBShiftRad = 0.1;
    DiagnosisInput in;
    in.motor = fourPoleMotor();
    in.current = CurrentInput{"current", spec.sampleRateHz, humwise::test::synthCurrents(spec)};
    // Line-to-line voltages 462 / 468 / 450 V: NEMA 2.17 % (REFERENCE.md 6.1, published example).
    humwise::test::SyntheticCurrent v;
    v.lineHz = 50;
    v.rmsA = 462;
    v.phaseBScale = 468.0 / 462.0;
    v.phaseCScale = 450.0 / 462.0;
    v.noiseRms = 1e-4;
    v.seed = 35;
    in.voltage = VoltageInput{"voltage", v.sampleRateHz, true, humwise::test::synthCurrents(v)};
    const auto r = diagnose(in);
    const Finding* vu = findFault(r, "voltage_unbalance");
    ASSERT_NE(vu, nullptr) << describe(r);
    EXPECT_EQ(vu->severity, 2);
    EXPECT_NEAR(vu->evidence.front().amplitude, 2.17, 0.01);
    EXPECT_EQ(findFault(r, "stator_winding"), nullptr) << describe(r);
}

TEST(CurrentRules, VoltageDistortion) {
    humwise::test::SyntheticCurrent v;
    v.lineHz = 50;
    v.rmsA = 230;
    v.components = {Tone{250, 0.08, 0.3}, Tone{350, 0.05, 1.0}}; // THD 9.4 %
    v.noiseRms = 1e-4;
    DiagnosisInput in;
    in.motor = fourPoleMotor();
    in.voltage = VoltageInput{"voltage", v.sampleRateHz, false, humwise::test::synthCurrents(v)};
    const auto r = diagnose(in);
    const Finding* h = findFault(r, "harmonic_distortion");
    ASSERT_NE(h, nullptr) << describe(r);
    EXPECT_EQ(h->severity, 2); // above the IEEE 519 8 % limit for <= 1 kV
    EXPECT_NEAR(h->evidence.front().amplitude, 100 * std::hypot(0.08, 0.05), 0.05);
}

// Fusion: with vibration as well, a broken-bar finding cites the pole-pass sidebands of 1X.
TEST(CurrentRules, BrokenBarsCiteVibrationToo) {
    const double slip = 0.02, f = 50, fr = f / 2 * (1 - slip), pp = 2 * slip * f;
    DiagnosisInput in;
    in.motor = fourPoleMotor();
    const auto spec = brokenBars(38, slip, 36);
    in.current = CurrentInput{"current", spec.sampleRateHz, humwise::test::synthCurrents(spec)};
    HealthyVibration h;
    h.shaftHz = fr;
    auto vib = healthyVibration(h, 37);
    vib.velocityTones.push_back(Tone{fr - pp, 0.25 * kMm, 0.1});
    vib.velocityTones.push_back(Tone{fr + pp, 0.22 * kMm, 0.5});
    vib.seconds = 8;
    in.vibration.push_back(vibrationChannel(vib, Location::DriveEnd, Direction::Horizontal));
    const auto r = diagnose(in);
    const Finding* b = findFault(r, "broken_rotor_bar");
    ASSERT_NE(b, nullptr) << describe(r);
    bool cited = false;
    for (const auto& e : b->evidence) cited |= e.label.find("pole pass (vibration)") != std::string::npos;
    EXPECT_TRUE(cited) << describe(r);
}

} // namespace
} // namespace humwise::diagnosis::test
