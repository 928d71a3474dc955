#pragma once
// What the analyst sees first: for every motor, the worst severity of its latest round, what
// changed since the round before, and the findings behind it. Plain data for the workbench's
// fleet view and the route summary report.

#include "storage/FleetStore.h"

#include <optional>
#include <string>
#include <vector>

namespace humwise::workflow {

struct MotorStatus {
    std::string tag;
    std::string area;
    std::string description;
    std::optional<std::int64_t> roundId;         // latest round with an analysis of this motor
    std::string roundStart;
    int worstSeverity = -1;                      // -1: never analysed
    std::optional<int> previousWorstSeverity;    // in the round before, when there is one
    std::vector<std::string> newFaults;          // faults (severity >= 1) not seen the round before
    std::vector<std::string> worsenedFaults;     // seen before at a lower severity
    std::vector<storage::FindingRow> findings;   // of the latest round, most severe first
    bool measuredInLatestRound = false;          // the store's latest round holds this motor
    std::vector<std::string> flaggedPoints;      // points with quality flags in the latest round

    std::string changeSummary() const; // "new: bearing_outer_race; worse: unbalance" or "no change"
};

// Status of every motor of the fleet as of `roundId` (default: the latest round).
std::vector<MotorStatus> fleetStatus(storage::FleetStore& store, std::optional<std::int64_t> roundId = std::nullopt);

} // namespace humwise::workflow
