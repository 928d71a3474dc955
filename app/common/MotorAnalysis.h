#pragma once
// Analyses one motor of one round from its stored or freshly read recordings and writes the
// products (operating point, indicators, findings, spectra) to the store. Shared by the
// walkdown import and by reanalysis, so both give the same answer.

#include "core/diagnosis/Diagnose.h"
#include "core/fleet/Fleet.h"
#include "core/model/Recording.h"
#include "storage/FleetStore.h"

#include <string>
#include <vector>

namespace humwise::workflow {

// Bump when the analysis or the rules change, so stored products say which version made them.
inline constexpr int kAnalysisVersion = 1;

struct PointRecording {
    std::int64_t recordingId = 0;
    std::string pointName;
    double sampleRateHz = 0;
    Quantity quantity = Quantity::Acceleration;
    std::vector<double> samples;   // SI
    bool usable = true;            // false when quality flags exclude it from the diagnosis
    std::optional<double> speedRpm;
};

struct MotorAnalysis {
    std::string motorTag;
    diagnosis::DiagnosisResult result;
    std::vector<std::string> notes;
};

// Builds the diagnosis input from the point definitions and runs it (throws std::invalid_argument
// when nothing of the motor is usable). The samples of the recordings it uses are moved into the
// input, not copied - they are most of a motor's memory in flight - and are gone when it returns;
// the recordings keep everything else (ids, names) for storeAnalysis. Otherwise pure.
MotorAnalysis analyseMotor(const fleet::MotorDefinition& motor, std::vector<PointRecording>& recordings);

// Writes one motor's products into the open transaction of `store`.
void storeAnalysis(storage::FleetStore& store, std::int64_t roundId, const MotorAnalysis& analysis,
                   const std::vector<PointRecording>& recordings);

} // namespace humwise::workflow
