#pragma once
// humwise-cli limits: the alarm limits of the fleet's trended indicators.
//
//   limits [--motor TAG] [--json]
//       every limit-worthy indicator of the latest round with its value and the limits in force
//       (the analyst's stored ones, or the defaults of app/common/LimitRules.h) and its state
//   limits set --motor TAG [--point NAME] --indicator NAME --alarm X [--alert Y]
//       stores the analyst's own (absolute) limits
//   limits clear --motor TAG [--point NAME] --indicator NAME
//       removes the stored limits; the defaults apply again
//   limits suggest --method iso-zone|statistical|percent [--motor TAG] [--indicator NAME]
//                  [--baseline N] [--store]
//       limits from the first N rounds (default 6) of every limit-worthy indicator; with --store
//       they are kept, all in one transaction (all or none)
// Throws UsageError / ProcessingError like every command; returns 0 on success.

#include <ostream>
#include <string>
#include <vector>

namespace humwise::cli {

int runLimits(const std::vector<std::string>& args, std::ostream& out);

} // namespace humwise::cli
