#pragma once
// Electrical or mechanical? Cut the supply while recording (REFERENCE.md 9): components of
// electrical origin vanish at once, mechanical ones decay with the coast-down speed. Compares a
// recording made while energised with one made right after the cut (same sensor).

#include "core/diagnosis/Finding.h"
#include "core/diagnosis/RuleContext.h"
#include "core/diagnosis/VibrationAnalysis.h"

#include <string>
#include <vector>

namespace humwise::diagnosis {

struct PowerOffLine {
    std::string label;      // "2x line frequency", "1X running speed", ...
    double energisedHz = 0;
    double energisedMmPerSecond = 0;
    double afterMmPerSecond = 0; // strongest line within the coast-down window after the cut
    double dropDb = 0;
    Origin verdict = Origin::Unknown;
};

// Judges each line that stands out in the energised spectrum: 2 x line frequency, 1X, 2X.
// A mechanical line is sought from its energised frequency down to 80 % of it (coast-down).
std::vector<PowerOffLine> comparePowerOff(const VibrationProducts& energised, const VibrationProducts& afterCut, const RuleContext& ctx);

// Adds the power-off evidence to the findings it concerns (electrical_2lf), or when a line at 2f
// that the rules attributed to electricity does not vanish, re-attributes it as mechanical.
void applyPowerOff(std::vector<Finding>& findings, const std::vector<PowerOffLine>& lines, const RuleContext& ctx);

} // namespace humwise::diagnosis
