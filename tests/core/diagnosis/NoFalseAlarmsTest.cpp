// No false alarms: over 50 random seeds, pure noise and clean healthy synthetic motors (vibration
// at DE and NDE, three currents) give no finding of severity >= 1.
#include "DiagnosisTestSupport.h"

#include <gtest/gtest.h>

#include <random>

namespace humwise::diagnosis::test {
namespace {

constexpr int kSeeds = 50;

TEST(NoFalseAlarms, PureNoise) {
    for (int seed = 1; seed <= kSeeds; ++seed) {
        DiagnosisInput in;
        in.motor = fourPoleMotor();
        for (auto [where, dir] : {std::pair{Location::DriveEnd, Direction::Horizontal}, std::pair{Location::NonDriveEnd, Direction::Vertical}}) {
            humwise::test::SyntheticVibration noise;
            noise.seconds = 2;
            noise.noiseG = 0.05;
            noise.seed = static_cast<std::uint64_t>(seed * 7 + static_cast<int>(where));
            in.vibration.push_back(vibrationChannel(noise, where, dir));
        }
        humwise::test::SyntheticCurrent c;
        c.rmsA = 0;           // no supply line: nothing but noise
        c.noiseRms = 1;       // relative to rmsA = 0 -> overridden below
        c.seconds = 4;
        c.seed = static_cast<std::uint64_t>(seed);
        auto phases = humwise::test::synthCurrents(c);
        std::mt19937_64 rng(static_cast<std::uint64_t>(seed) + 1000);
        std::normal_distribution<double> n(0.0, 0.5);
        for (auto& p : phases)
            for (double& v : p) v = n(rng);
        in.current = CurrentInput{"current", c.sampleRateHz, phases};
        const auto r = diagnose(in);
        EXPECT_EQ(worstSeverity(r), 0) << "seed " << seed << "\n" << describe(r);
    }
}

TEST(NoFalseAlarms, HealthyMotors) {
    for (int seed = 1; seed <= kSeeds; ++seed) {
        const double rpm = 1460 + (seed % 7) * 4.0; // loads from 50 % to 100 %
        DiagnosisInput in;
        in.motor = fourPoleMotor();
        HealthyVibration h;
        h.shaftHz = rpm / 60;
        h.oneXmms = 0.4 + 0.02 * (seed % 10);
        for (auto [where, dir] : {std::pair{Location::DriveEnd, Direction::Horizontal}, std::pair{Location::DriveEnd, Direction::Axial},
                                  std::pair{Location::NonDriveEnd, Direction::Vertical}}) {
            auto spec = healthyVibration(h, static_cast<std::uint64_t>(seed * 13 + static_cast<int>(dir)));
            spec.seconds = 2;
            in.vibration.push_back(vibrationChannel(spec, where, dir));
        }
        auto c = healthyCurrent(50.0 + 0.01 * (seed % 5), rpm / 60, 4, static_cast<std::uint64_t>(seed));
        c.seconds = 10;
        in.current = CurrentInput{"current", c.sampleRateHz, humwise::test::synthCurrents(c)};
        const auto r = diagnose(in);
        EXPECT_EQ(worstSeverity(r), 0) << "seed " << seed << "\n" << describe(r);
        EXPECT_NEAR(r.operatingPoint.point.speedRpm(), rpm, 0.005 * rpm) << "seed " << seed;
    }
}

} // namespace
} // namespace humwise::diagnosis::test
