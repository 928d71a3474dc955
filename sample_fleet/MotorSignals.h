#pragma once
// From the plant, the round and the seeded faults to the signal models of one motor's points.
//
// Operating point (REFERENCE.md 5): slip = rated slip x load fraction (the linear part of the
// torque-slip curve), fr = f (1 - s) / p; a drive-fed fan's load follows the fan law,
// torque ~ speed^2. Stator current I = I_rated sqrt(m^2 + load^2 (1 - m^2)), m the no-load
// (magnetising) fraction (common practice (no source): magnetising and load currents roughly
// in quadrature).

#include "core/fleet/Fleet.h"
#include "sample_fleet/Plant.h"
#include "sample_fleet/Scenario.h"
#include "sample_fleet/SignalModels.h"

#include <cstdint>

namespace humwise::sample {

inline constexpr double kVibrationRateHz = 12800;
inline constexpr double kVibrationSeconds = 4;
inline constexpr double kElectricalRateHz = 5000;
inline constexpr double kElectricalSeconds = 20;

struct OperatingState {
    double lineHz = 50;   // supply (or drive output) frequency at the motor
    double slip = 0;
    double shaftHz = 0;
    double loadFraction = 0;
    double currentA = 0;  // r.m.s. per phase
    int poles = 4;
};

struct MotorContext {
    const fleet::MotorDefinition& definition;
    const MotorProfile& profile;
    const Round& round;
    std::size_t motorIndex = 0;
    OperatingState op;
};

OperatingState operatingState(const fleet::MotorDefinition& definition, const MotorProfile& profile, const Round& round,
                              std::size_t motorIndex);

// One vibration point's record (acceleration points of the fleet).
VibrationRecord vibrationRecord(const MotorContext& c, const fleet::PointDefinition& point, std::uint64_t seed);
// The three phase currents, recorded together.
PhaseSetRecord currentRecord(const MotorContext& c, std::uint64_t seed);
// The three line voltages of the motor's supply (motors on the recorded feeder).
PhaseSetRecord voltageRecord(const MotorContext& c, std::uint64_t seed);

// Sag of one phase-to-neutral voltage that gives `nemaPercent` line-voltage unbalance (NEMA MG-1,
// REFERENCE.md 6.1), and the resulting negative / positive sequence ratio d / (3 - d).
double phaseSagForNema(double nemaPercent);

} // namespace humwise::sample
