#pragma once
// Motor-current and supply rules (MCSA): deterministic functions of the current (and voltage)
// products, the operating point and the thresholds; formulas in FaultFrequencies.h, thresholds
// with their sources in Thresholds.h.

#include "core/diagnosis/CurrentAnalysis.h"
#include "core/diagnosis/Finding.h"
#include "core/diagnosis/RuleContext.h"
#include "core/diagnosis/VibrationAnalysis.h"

#include <optional>
#include <vector>

namespace humwise::diagnosis {

// Broken rotor bars from the (1 -+ 2s) f sidebands (mean of both, dB below f); withheld below the
// load floor or when the record cannot resolve 2 s f. With vibration, the 1X +- 2 s f
// (pole-pass) sidebands are cited as well (fusion).
std::vector<Finding> brokenRotorBarRule(const PhaseSetProducts& current, const std::vector<VibrationProducts>& vibration,
                                        const RuleContext& ctx);
std::vector<Finding> eccentricityRule(const PhaseSetProducts& current, const RuleContext& ctx);
// Negative-sequence current and shorted-turn components; a supply unbalance that explains the
// negative sequence (current unbalance is typically 6-10 x the voltage unbalance, REFERENCE.md
// 6.4) moves the verdict to the supply.
std::vector<Finding> statorWindingRule(const PhaseSetProducts& current, const std::optional<PhaseSetProducts>& voltage,
                                       const RuleContext& ctx);
std::vector<Finding> currentUnbalanceRule(const PhaseSetProducts& current, const std::optional<PhaseSetProducts>& voltage,
                                          const RuleContext& ctx);
std::vector<Finding> bearingInCurrentRule(const PhaseSetProducts& current, const RuleContext& ctx);
std::vector<Finding> voltageUnbalanceRule(const PhaseSetProducts& voltage, bool lineToLine, const RuleContext& ctx);
std::vector<Finding> harmonicDistortionRule(const PhaseSetProducts& voltage, const RuleContext& ctx);

// |negative| / |positive| sequence, whatever the phase order the clamps were put on in.
double sequenceRatio(const power::SequenceComponents& s);

} // namespace humwise::diagnosis
