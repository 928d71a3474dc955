#pragma once
#include <ostream>
#include <string>
#include <vector>

namespace humwise::cli {
// humwise-cli faults --line-hz F --poles P [--speed-rpm N | --slip S] [...]: the fault-frequency table.
int runFaults(const std::vector<std::string>& args, std::ostream& out);
} // namespace humwise::cli
