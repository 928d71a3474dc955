#pragma once
// The fictional plant of the sample fleet: a water treatment works supplied at 400 V, 50 Hz,
// its twelve motors (nameplates, bearings, driven machines, ISO 20816-3 classes, points) and
// the one route that covers every point; plus, per motor, how it runs and vibrates when
// healthy (the constants the signal models start from).

#include "core/fleet/Fleet.h"

#include <optional>
#include <string>
#include <vector>

namespace humwise::sample {

inline constexpr double kPlantSupplyHz = 50.0;
inline constexpr double kPlantLineVoltageV = 400.0;
inline constexpr const char* kRouteName = "Monthly motor route";

// The healthy state of one motor; faults (Scenario.h) are added on top.
struct MotorProfile {
    std::string tag;
    double loadFraction = 0.8;        // typical torque / rated torque
    double loadSpread = 0.04;         // round-to-round variation, +- (absolute)
    double driveHzLow = 0, driveHzHigh = 0; // drive-fed: output frequency range (0: direct on line)
    double magnetisingFraction = 0.35; // no-load current / rated current
    // Healthy vibration at DE-H, velocity mm/s r.m.s. (other points scaled, MotorSignals.cpp).
    double oneXmms = 0.6;
    double twoXmms = 0.12;
    double twoLFmms = 0.1;
    double vanePassMms = 0.1;
    double noiseG = 0.015;
    double resonanceDeHz = 3300;      // housing resonances the bearing impacts ring
    double resonanceNdeHz = 3900;
    // Healthy current: small winding asymmetry and air-gap / rotor imperfections.
    double negativeSequence = 0.012;  // |I2| / |I1|
    double eccentricityDb = 57;       // f -+ fr below f (they let the diagnosis find the speed)
    double rotorSidebandDb = 60;      // (1 -+ 2s) f below f
    bool onFeeder = false;            // on the motor control centre whose voltages are recorded
};

struct Plant {
    fleet::Fleet fleet;
    std::vector<MotorProfile> profiles; // same order as fleet.motors

    const MotorProfile& profile(const std::string& tag) const;
};

// Built once; thread-safe to read.
const Plant& plant();

} // namespace humwise::sample
