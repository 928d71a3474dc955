#pragma once
// What every rule may read besides its own spectra: the motor, the operating point the round
// ran at, the thresholds, and the zone boundaries of the motor's severity class.

#include "core/diagnosis/Thresholds.h"
#include "core/motor/FaultFrequencies.h"
#include "core/motor/Motor.h"

#include <optional>

namespace humwise::diagnosis {

struct RuleContext {
    const motor::Motor& motor;
    motor::OperatingPoint op;
    bool lineFromCurrent = false;         // f measured on the current (else the nameplate's)
    std::optional<double> loadPercent;
    const Thresholds& thresholds;
    ZoneBoundaries zones;

    // Component grade against the zone boundaries (Thresholds.h): velocity in mm/s r.m.s.
    int componentSeverity(double mmPerSecond) const {
        return mmPerSecond > zones.cd ? 3 : mmPerSecond > zones.bc ? 2 : mmPerSecond > zones.ab ? 1 : 0;
    }
};

} // namespace humwise::diagnosis
