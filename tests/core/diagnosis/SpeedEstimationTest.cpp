// Operating point without a tachometer, on synthetic motors with a known speed: within 0.5 %
// (the diagnosis issue's target) from vibration 1X, from current eccentricity lines and from the
// principal slot harmonic; supply frequency within 0.005 Hz on a clean 20 s record.
#include "DiagnosisTestSupport.h"
#include "core/motor/SpeedEstimation.h"

#include <gtest/gtest.h>

#include <cmath>

namespace humwise::diagnosis::test {
namespace {

using humwise::test::Tone;

TEST(SpeedEstimation, SupplyFrequencyWithinFiveMillihertz) {
    for (double f : {49.9731, 50.0, 50.0217, 59.9912, 60.0384}) {
        auto spec = healthyCurrent(f, f / 2 * 0.985, 4, 3);
        spec.seconds = 20;
        const auto phases = humwise::test::synthCurrents(spec);
        const auto e = motor::estimateSupplyFrequency(phases[0], spec.sampleRateHz, f > 55 ? 60 : 50, false);
        ASSERT_TRUE(e.has_value());
        EXPECT_NEAR(e->hz, f, 0.005);
        EXPECT_NEAR(e->rms, spec.rmsA, 0.01 * spec.rmsA);
    }
}

TEST(SpeedEstimation, DriveFedSupplyFrequency) {
    auto spec = healthyCurrent(37.3, 37.3 / 2 * 0.98, 4, 4);
    const auto phases = humwise::test::synthCurrents(spec);
    const auto e = motor::estimateSupplyFrequency(phases[0], spec.sampleRateHz, 50, true);
    ASSERT_TRUE(e.has_value());
    EXPECT_NEAR(e->hz, 37.3, 0.005);
}

TEST(SpeedEstimation, FromVibrationWithinHalfAPercent) {
    for (double rpm : {1488.0, 1476.0, 1455.0}) {
        DiagnosisInput in;
        in.motor = fourPoleMotor();
        HealthyVibration h;
        h.shaftHz = rpm / 60;
        in.vibration.push_back(vibrationChannel(healthyVibration(h, 11), Location::DriveEnd, Direction::Horizontal));
        const auto r = diagnose(in);
        EXPECT_EQ(r.operatingPoint.speedMethod, "vibration_1x");
        EXPECT_NEAR(r.operatingPoint.point.speedRpm(), rpm, 0.005 * rpm) << describe(r);
        EXPECT_GT(r.operatingPoint.speedConfidence, 0.5);
    }
}

TEST(SpeedEstimation, FromCurrentEccentricityWithinHalfAPercent) {
    motor::Motor m = fourPoleMotor();
    m.nameplate.rotorBars.reset(); // no slot harmonic to lean on
    for (double rpm : {1485.0, 1470.0, 1452.0}) {
        DiagnosisInput in;
        in.motor = m;
        const auto spec = healthyCurrent(50, rpm / 60, 4, 21);
        in.current = CurrentInput{"current", spec.sampleRateHz, humwise::test::synthCurrents(spec)};
        const auto r = diagnose(in);
        EXPECT_EQ(r.operatingPoint.speedMethod, "current_eccentricity") << describe(r);
        EXPECT_NEAR(r.operatingPoint.point.speedRpm(), rpm, 0.005 * rpm) << describe(r);
    }
}

// Principal slot harmonic f [R (1 - s) / p + 1] (REFERENCE.md 4 and 5; Hurst & Habetler 1996).
TEST(SpeedEstimation, FromSlotHarmonicWithinHalfAPercent) {
    const double rpm = 1467, f = 50, fr = rpm / 60, s = 1 - fr * 2 / f;
    auto spec = healthyCurrent(f, fr, 4, 22);
    spec.components = {Tone{f * (28 * (1 - s) / 2 + 1), humwise::test::relativeRms(45), 0.1}};
    const auto phases = humwise::test::synthCurrents(spec);
    dsp::SpectrumRequest w;
    w.resolutionHz = 0.1;
    w.fmaxHz = 1500;
    const auto wide = dsp::averagedSpectrum(phases[0], spec.sampleRateHz, w).value();
    const auto e = motor::speedFromSlotHarmonic(wide, f, 4, 28, 0.06);
    ASSERT_TRUE(e.has_value());
    EXPECT_NEAR(e->shaftHz * 60, rpm, 0.005 * rpm);
    EXPECT_EQ(e->method, "slot_harmonic");
}

TEST(SpeedEstimation, LoadFromSlip) {
    motor::Nameplate n;
    n.supplyHz = 50;
    n.ratedSpeedRpm = 1470;
    EXPECT_NEAR(*motor::loadFromSlip(0.01, 50.0, n), 50.0, 1e-9);
    // A drive at 25 Hz: the same torque needs the same slip frequency, i.e. twice the slip.
    EXPECT_NEAR(*motor::loadFromSlip(0.02, 25.0, n), 50.0, 1e-9);
    EXPECT_NEAR(motor::maxPlausibleSlip(n), 0.05, 1e-12);
}

} // namespace
} // namespace humwise::diagnosis::test
