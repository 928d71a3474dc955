#pragma once
// Motors and recordings with a known truth for the diagnosis tests.

#include "core/diagnosis/Diagnose.h"
#include "support/SyntheticMotor.h"

#include <optional>
#include <string>
#include <vector>

namespace humwise::diagnosis::test {

inline constexpr double kMm = 1e-3; // mm/s -> m/s

// A 4-pole 50 Hz 55 kW motor, rated 1470 r/min (slip 2 %), 6309-like bearings at both ends
// (8 balls, 17.5 mm on 72.5 mm), 28 rotor bars, ISO 20816-3 group 2 rigid (zones 1.4/2.8/4.5 mm/s).
motor::Motor fourPoleMotor();
// A 2-pole 50 Hz 90 kW motor, rated 2970 r/min (slip 1 %).
motor::Motor twoPoleMotor();

struct HealthyVibration {
    double shaftHz = 24.6;
    double lineHz = 50;
    double oneXmms = 0.6, twoXmms = 0.15, twoLFmms = 0.08;
    double noiseG = 0.02;
};
humwise::test::SyntheticVibration healthyVibration(const HealthyVibration& h, std::uint64_t seed);

// One vibration channel input from a spec.
VibrationInput vibrationChannel(const humwise::test::SyntheticVibration& spec, Location where, Direction direction);

// Healthy currents: eccentricity lines 58 dB down (they carry the speed), rotor sidebands 60 dB down.
humwise::test::SyntheticCurrent healthyCurrent(double lineHz, double shaftHz, int poles, std::uint64_t seed);

const Finding* findFault(const DiagnosisResult& r, const std::string& fault);
int worstSeverity(const DiagnosisResult& r);
std::string describe(const DiagnosisResult& r); // for failure messages

} // namespace humwise::diagnosis::test
