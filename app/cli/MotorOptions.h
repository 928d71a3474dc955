#pragma once
// Options that describe a motor on the command line (faults, diagnose):
//   --line-hz F --poles P [--rated-rpm N] [--rotor-bars R] [--vanes N]
//   [--bearing n=..,d=..,D=..[,angle=DEG] | --bearing-factors BPFO=..,BPFI=..,BSF=..,FTF=..]
// d and D share one unit of length; factors are multiples of shaft frequency (BSF single spin).

#include "app/cli/ArgParser.h"
#include "core/motor/Motor.h"

#include <vector>

namespace humwise::cli {

std::vector<OptionSpec> motorOptionSpecs();

// Builds and validates the motor; throws UsageError naming the option and the problem.
motor::Motor motorFromArgs(const ParsedArgs& args);

} // namespace humwise::cli
