#pragma once
// What one diagnosis looks at: one motor's recordings from one round, already read and in SI.

#include "core/model/Units.h"
#include "core/motor/Motor.h"

#include <optional>
#include <string>
#include <vector>

namespace humwise::diagnosis {

enum class Location { DriveEnd, NonDriveEnd };
enum class Direction { Horizontal, Vertical, Axial };

const char* locationName(Location l);   // "DE", "NDE"
const char* directionName(Direction d); // "H", "V", "A"

struct VibrationInput {
    std::string name;                       // e.g. "DE-H"
    Location location = Location::DriveEnd;
    Direction direction = Direction::Horizontal;
    Quantity quantity = Quantity::Acceleration; // acceleration or velocity, SI samples
    double sampleRateHz = 0;
    std::vector<double> samples;
};

// Up to three phase currents sampled together (phase order A, B, C), SI (A).
struct CurrentInput {
    std::string name = "current";
    double sampleRateHz = 0;
    std::vector<std::vector<double>> phases;
};

// Three voltages sampled together: line-to-line (AB, BC, CA) or line-to-neutral (A, B, C), SI (V).
struct VoltageInput {
    std::string name = "voltage";
    double sampleRateHz = 0;
    bool lineToLine = true;
    std::vector<std::vector<double>> phases;
};

// A recording made while the motor runs and one made just after the supply is cut, of the same
// sensor (vibration): lines that vanish at once are electrical, lines that decay with the
// coast-down are mechanical (REFERENCE.md 9).
struct PowerOffInput {
    VibrationInput energised;
    VibrationInput afterCut;
};

struct DiagnosisInput {
    motor::Motor motor;
    std::vector<VibrationInput> vibration;
    std::optional<CurrentInput> current;
    std::optional<VoltageInput> voltage;
    std::optional<double> measuredSpeedRpm;  // from a tachometer, when the walkdown has one
    std::optional<PowerOffInput> powerOff;
};

} // namespace humwise::diagnosis
