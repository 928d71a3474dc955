#pragma once
// Vibration rules: deterministic functions of the channels' spectra, the operating point and the
// thresholds. Each returns the findings it supports (severity >= 1), or for iso_zone always one.
// Signatures follow REFERENCE.md 9 (common practice (no source)); bearing analysis follows
// Randall & Antoni 2011 (envelope families BPFO; BPFI with 1X sidebands; 2 x BSF with FTF
// sidebands; FTF).

#include "core/diagnosis/Finding.h"
#include "core/diagnosis/RuleContext.h"
#include "core/diagnosis/VibrationAnalysis.h"

#include <vector>

namespace humwise::diagnosis {

using Channels = std::vector<VibrationProducts>;

std::vector<Finding> isoZoneRule(const Channels& channels, const RuleContext& ctx);
std::vector<Finding> unbalanceRule(const Channels& channels, const RuleContext& ctx);
std::vector<Finding> misalignmentRule(const Channels& channels, const RuleContext& ctx);
std::vector<Finding> loosenessRule(const Channels& channels, const RuleContext& ctx);
std::vector<Finding> bearingRules(const Channels& channels, const RuleContext& ctx);
std::vector<Finding> electricalTwiceLineRule(const Channels& channels, const RuleContext& ctx);

} // namespace humwise::diagnosis
