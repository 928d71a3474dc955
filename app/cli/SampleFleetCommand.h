#pragma once
#include <ostream>
#include <string>
#include <vector>

namespace humwise::cli {
// humwise-cli sample-fleet --out DIR [--db PATH]: writes the sample fleet (a fictional plant and a
// year of its walkdowns) under DIR; with --db also builds that store: the fleet and the first
// twelve walkdowns imported (walkdown-13 is left for the user).
int runSampleFleet(const std::vector<std::string>& args, std::ostream& out);
} // namespace humwise::cli
