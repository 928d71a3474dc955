#pragma once
#include <ostream>
#include <string>
#include <vector>

namespace humwise::cli {
// humwise-cli inspect FILE [--json]: channels, rate, duration, per-channel statistics and quality flags.
int runInspect(const std::vector<std::string>& args, std::ostream& out);
} // namespace humwise::cli
