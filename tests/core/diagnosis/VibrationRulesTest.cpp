// Vibration rules on synthetic motors with a known truth. Each case asserts the fault id, the
// severity band and the evidence frequencies. Zone boundaries: ISO 20816-3 group 2 rigid,
// 1.4 / 2.8 / 4.5 mm/s (REFERENCE.md 2.1, from memory (verify)); component grading and pattern
// ratios are the project's (Thresholds.h, common practice).
#include "DiagnosisTestSupport.h"

#include <gtest/gtest.h>

#include <cmath>

namespace humwise::diagnosis::test {
namespace {

using humwise::test::BearingImpacts;
using humwise::test::Tone;

constexpr double kShaftHz = 24.6; // 1476 r/min

DiagnosisResult run(const std::vector<VibrationInput>& channels, const motor::Motor& m = fourPoleMotor()) {
    DiagnosisInput in;
    in.motor = m;
    in.vibration = channels;
    return diagnose(in);
}

void expectEvidenceNear(const Finding& f, const std::string& labelPart, double hz, double relTol) {
    for (const auto& e : f.evidence)
        if (e.label.find(labelPart) != std::string::npos && e.measuredHz) {
            EXPECT_NEAR(*e.measuredHz, hz, relTol * hz) << e.label;
            return;
        }
    ADD_FAILURE() << "no evidence '" << labelPart << "' with a measured frequency in " << f.fault;
}

TEST(VibrationRules, UnbalanceGradedOnItsOneX) {
    HealthyVibration h;
    h.shaftHz = kShaftHz;
    h.oneXmms = 3.5; // zone C for the component: plan repair
    const auto spec = healthyVibration(h, 5);
    auto vertical = spec;
    vertical.velocityTones[0].rms = 3.0 * kMm;
    vertical.seed = 6;
    const auto r = run({vibrationChannel(spec, Location::DriveEnd, Direction::Horizontal),
                        vibrationChannel(vertical, Location::DriveEnd, Direction::Vertical)});
    const Finding* f = findFault(r, "unbalance");
    ASSERT_NE(f, nullptr) << describe(r);
    EXPECT_EQ(f->severity, 2);
    EXPECT_EQ(f->origin, Origin::Mechanical);
    expectEvidenceNear(*f, "1X", kShaftHz, 0.005);
    EXPECT_EQ(findFault(r, "misalignment"), nullptr) << describe(r);
    EXPECT_EQ(findFault(r, "iso_zone")->severity, 2); // 3.5 mm/s overall: zone C
}

TEST(VibrationRules, ParallelAndAngularMisalignment) {
    HealthyVibration h;
    h.shaftHz = kShaftHz;
    h.oneXmms = 1.6;
    h.twoXmms = 2.0; // radial 2X above 1X: offset misalignment, component 2.0 mm/s -> watch
    const auto radial = healthyVibration(h, 7);
    auto axial = healthyVibration(h, 8);
    axial.velocityTones[0].rms = 1.5 * kMm; // axial 1X ~ radial 1X: angular
    axial.velocityTones[1].rms = 0.5 * kMm;
    const auto r = run({vibrationChannel(radial, Location::DriveEnd, Direction::Horizontal),
                        vibrationChannel(axial, Location::DriveEnd, Direction::Axial)});
    const Finding* f = findFault(r, "misalignment");
    ASSERT_NE(f, nullptr) << describe(r);
    EXPECT_EQ(f->severity, 1);
    EXPECT_NE(f->explanation.find("angular and parallel"), std::string::npos) << f->explanation;
    expectEvidenceNear(*f, "2X running speed (radial)", 2 * kShaftHz, 0.005);
    EXPECT_EQ(findFault(r, "unbalance"), nullptr) << describe(r);
}

TEST(VibrationRules, LoosenessFromAHarmonicFamily) {
    HealthyVibration h;
    h.shaftHz = kShaftHz;
    h.oneXmms = 1.5;
    auto spec = healthyVibration(h, 9);
    for (int n = 2; n <= 8; ++n) spec.velocityTones.push_back(Tone{n * kShaftHz, (1.1 - 0.1 * n) * kMm, 0.7 * n});
    spec.velocityTones.push_back(Tone{0.5 * kShaftHz, 0.5 * kMm, 0.2});
    spec.velocityTones.push_back(Tone{1.5 * kShaftHz, 0.4 * kMm, 0.9});
    const auto r = run({vibrationChannel(spec, Location::DriveEnd, Direction::Horizontal)});
    const Finding* f = findFault(r, "looseness");
    ASSERT_NE(f, nullptr) << describe(r);
    EXPECT_GE(f->severity, 1);
    EXPECT_LE(f->severity, 2);
    expectEvidenceNear(*f, "3X", 3 * kShaftHz, 0.005);
    expectEvidenceNear(*f, "0.5X", 0.5 * kShaftHz, 0.01);
}

// Bearing impacts through a structural resonance in noise (Randall & Antoni 2011 model).
humwise::test::SyntheticVibration withImpacts(double rateHz, double peakG, double modulationDepth, std::uint64_t seed) {
    HealthyVibration h;
    h.shaftHz = kShaftHz;
    h.noiseG = 0.08;
    auto spec = healthyVibration(h, seed);
    BearingImpacts b;
    b.rateHz = rateHz;
    b.resonanceHz = 3400;
    b.peakG = peakG;
    b.modulationHz = kShaftHz;
    b.modulationDepth = modulationDepth;
    spec.impacts.push_back(b);
    return spec;
}

TEST(VibrationRules, OuterRaceDefectFromTheEnvelope) {
    const auto bf = motor::factorsOf(*fourPoleMotor().driveEndBearing);
    const double bpfo = bf.bpfo * kShaftHz;
    for (const auto& [peakG, minSeverity] : {std::pair{0.6, 1}, std::pair{3.0, 2}}) {
        const auto r = run({vibrationChannel(withImpacts(bpfo, peakG, 0.0, 12), Location::DriveEnd, Direction::Horizontal)});
        const Finding* f = findFault(r, "bearing_outer_race");
        ASSERT_NE(f, nullptr) << "impacts " << peakG << " g\n" << describe(r);
        EXPECT_GE(f->severity, minSeverity) << describe(r);
        expectEvidenceNear(*f, "BPFO (DE) x1", bpfo, 0.02);
        EXPECT_EQ(findFault(r, "bearing_inner_race"), nullptr) << describe(r);
    }
}

TEST(VibrationRules, InnerRaceDefectWithShaftSidebands) {
    const auto bf = motor::factorsOf(*fourPoleMotor().driveEndBearing);
    const double bpfi = bf.bpfi * kShaftHz;
    const auto r = run({vibrationChannel(withImpacts(bpfi, 1.5, 0.8, 13), Location::DriveEnd, Direction::Horizontal)});
    const Finding* f = findFault(r, "bearing_inner_race");
    ASSERT_NE(f, nullptr) << describe(r);
    EXPECT_GE(f->severity, 1);
    expectEvidenceNear(*f, "BPFI (DE) x1", bpfi, 0.02);
    bool sideband = false;
    for (const auto& e : f->evidence) sideband |= e.label.find("1X sideband") != std::string::npos;
    EXPECT_TRUE(sideband) << describe(r);
}

// The same bearing type at both ends puts both ends' defect lines on one frequency; a defect at
// the DE also reaches the NDE sensor through the frame, weaker. It is one defect, at the end
// where its line is strongest, not two.
TEST(VibrationRules, ADefectHeardAtBothEndsOfTwinBearingsIsPlacedAtTheLouderEnd) {
    const auto bf = motor::factorsOf(*fourPoleMotor().driveEndBearing);
    const double bpfo = bf.bpfo * kShaftHz;
    for (const bool defectAtDe : {true, false}) {
        const double deG = defectAtDe ? 3.0 : 1.0, ndeG = defectAtDe ? 1.0 : 3.0;
        const auto r = run({vibrationChannel(withImpacts(bpfo, deG, 0.0, 21), Location::DriveEnd, Direction::Horizontal),
                            vibrationChannel(withImpacts(bpfo, ndeG, 0.0, 22), Location::NonDriveEnd, Direction::Horizontal)});
        int outerRace = 0;
        for (const auto& f : r.findings) outerRace += f.fault == "bearing_outer_race";
        ASSERT_EQ(outerRace, 1) << describe(r);
        const Finding* f = findFault(r, "bearing_outer_race");
        expectEvidenceNear(*f, defectAtDe ? "BPFO (DE) x1" : "BPFO (NDE) x1", bpfo, 0.02);
        EXPECT_NE(f->explanation.find(defectAtDe ? "also at the NDE sensor" : "also at the DE sensor"), std::string::npos) << f->explanation;
    }
}

// Two real defects, one per end, each louder at its own end, stay two findings when the bearing
// types differ enough to separate their lines.
TEST(VibrationRules, DefectsOnDifferentBearingsAtEachEndStaySeparate) {
    auto m = fourPoleMotor();
    const motor::Bearing nde{"6209", motor::BearingGeometry{9, 12.7, 65.0, 0.0}}; // BPFO 3.62 vs 3.03 x shaft
    m.nonDriveEndBearing = nde;
    const double bpfoDe = motor::factorsOf(*m.driveEndBearing).bpfo * kShaftHz;
    const double bpfoNde = motor::factorsOf(nde).bpfo * kShaftHz;
    const auto r = run({vibrationChannel(withImpacts(bpfoDe, 3.0, 0.0, 23), Location::DriveEnd, Direction::Horizontal),
                        vibrationChannel(withImpacts(bpfoNde, 3.0, 0.0, 24), Location::NonDriveEnd, Direction::Horizontal)},
                       m);
    int outerRace = 0;
    for (const auto& f : r.findings) outerRace += f.fault == "bearing_outer_race";
    EXPECT_EQ(outerRace, 2) << describe(r);
}

// 2-pole motor: 2 x line frequency and 2X sit only 2 s f = 1 Hz apart (REFERENCE.md 9).
TEST(VibrationRules, TwoPoleTwiceLineFrequencyIsResolvedFromTwoX) {
    const double f = 50.0, fr = 49.5; // s = 1 %
    HealthyVibration h;
    h.shaftHz = fr;
    h.lineHz = f;
    h.oneXmms = 1.0;
    h.twoXmms = 0.3;
    h.twoLFmms = 3.2; // plan repair
    const auto r = run({vibrationChannel(healthyVibration(h, 14), Location::DriveEnd, Direction::Horizontal)}, twoPoleMotor());
    const Finding* e = findFault(r, "electrical_2lf");
    ASSERT_NE(e, nullptr) << describe(r);
    EXPECT_EQ(e->severity, 2);
    EXPECT_EQ(e->origin, Origin::Electrical);
    expectEvidenceNear(*e, "2x line frequency", 100.0, 0.0005);

    // The converse: a strong 2X and a weak 2 x line frequency is no electrical finding.
    h.twoXmms = 3.2;
    h.twoLFmms = 0.2;
    const auto m = run({vibrationChannel(healthyVibration(h, 15), Location::DriveEnd, Direction::Horizontal)}, twoPoleMotor());
    EXPECT_EQ(findFault(m, "electrical_2lf"), nullptr) << describe(m);
}

// Cutting the supply: 2 x line frequency vanishes at once, 1X decays with the coast-down
// (REFERENCE.md 9).
TEST(VibrationRules, PowerOffSeparatesElectricalFromMechanical) {
    HealthyVibration on;
    on.shaftHz = kShaftHz;
    on.oneXmms = 1.8;
    on.twoLFmms = 3.0;
    HealthyVibration off = on;
    off.shaftHz = kShaftHz * 0.93; // coasting down
    off.oneXmms = 1.6;
    off.twoLFmms = 0.0;
    auto afterSpec = healthyVibration(off, 17);
    afterSpec.seconds = 2;
    DiagnosisInput in;
    in.motor = fourPoleMotor();
    in.vibration.push_back(vibrationChannel(healthyVibration(on, 16), Location::DriveEnd, Direction::Horizontal));
    in.powerOff = PowerOffInput{in.vibration.front(), vibrationChannel(afterSpec, Location::DriveEnd, Direction::Horizontal)};
    const auto r = diagnose(in);
    ASSERT_FALSE(r.powerOff.empty()) << describe(r);
    bool sawLine = false, sawShaft = false;
    for (const auto& l : r.powerOff) {
        if (l.label == "2x line frequency") {
            sawLine = true;
            EXPECT_EQ(l.verdict, Origin::Electrical) << l.dropDb << " dB";
        }
        if (l.label == "1X running speed") {
            sawShaft = true;
            EXPECT_EQ(l.verdict, Origin::Mechanical) << l.dropDb << " dB";
        }
    }
    EXPECT_TRUE(sawLine && sawShaft);
    const Finding* f = findFault(r, "electrical_2lf");
    ASSERT_NE(f, nullptr) << describe(r);
    EXPECT_EQ(f->origin, Origin::Electrical);
    EXPECT_GE(f->confidence, 0.95);
    EXPECT_NE(f->explanation.find("vanished"), std::string::npos);
}

} // namespace
} // namespace humwise::diagnosis::test
