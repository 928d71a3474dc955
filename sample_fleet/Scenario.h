#pragma once
// The year the sample fleet lives through: thirteen monthly walkdowns (the first working day of
// each month of 2026, and January 2027 left for the user to import) and the faults seeded into
// them, each with its start round, its strength per round and the round from which the
// diagnosis is meant to see it.

#include <array>
#include <chrono>
#include <string>
#include <vector>

namespace humwise::sample {

inline constexpr int kRounds = 13;     // walkdown-01 .. walkdown-13
inline constexpr int kImportedRounds = 12; // walkdown-13 is left for the user

struct Round {
    int number = 1;                    // 1-based
    std::chrono::sys_days date;
    int startMinuteOfDay = 7 * 60;     // UTC
    double supplyHz = 50.0;            // the grid's frequency during the round
    std::string technician;
    std::string notes;
    std::string folder() const;        // "walkdown-01"
};

const std::vector<Round>& rounds();

enum class FaultKind {
    OuterRace, InnerRace, Unbalance, Misalignment, Looseness, BrokenBars, StaticEccentricity, StatorWinding,
    VoltageUnbalance, LightLoadBrokenBars,
};

using PerRound = std::array<double, kRounds>;

struct SeededFault {
    FaultKind kind;
    std::string faultId;               // the diagnosis' fault id ("withheld_broken_rotor_bar" for the light-load case)
    std::string motorTag;
    std::vector<std::string> points;   // where the evidence is expected
    int startRound = 1;
    int detectableFrom = 1;
    std::string strengthMeaning;       // what the per-round number is, with its unit
    PerRound strength{};               // round 1 first; the healthy value before the start
    std::array<int, kRounds> expectedSeverity{};
    std::vector<std::string> consequences; // other findings the fault may raise on the same motor
    std::string story;
    int velocityFrom = 0;              // bearings: round from which the defect line shows in velocity too (0: n/a)
};

const std::vector<SeededFault>& seededFaults();

// The fault of `kind` on `tag`, or nullptr.
const SeededFault* faultOn(const std::string& tag, FaultKind kind);
// Its strength in round `number` (1-based), or `healthy` when the motor has no such fault.
double strengthOf(const std::string& tag, FaultKind kind, int number, double healthy);

// Motors no fault touches (the diagnosis must keep them at severity 0 all year).
std::vector<std::string> healthyMotors();

// The bad recording and the power-off pair.
struct BadRecording {
    int round = 8;
    std::string motorTag, pointName, flag, story;
    double biasStepG = 0, biasTauS = 0;
};
const BadRecording& badRecording();

struct PowerOffPair {
    int round = 12;
    std::string motorTag, pointName, energisedFile, afterFile, story;
    double energisedSeconds = 4, afterSeconds = 2;
    double speedTauS = 25, fluxTauS = 0.05;
};
const PowerOffPair& powerOffPair();

} // namespace humwise::sample
