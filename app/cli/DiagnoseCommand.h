#pragma once
#include <ostream>
#include <string>
#include <vector>

namespace humwise::cli {
// humwise-cli diagnose FILE [...]: operating point, indicators and findings for one motor.
int runDiagnose(const std::vector<std::string>& args, std::ostream& out);
} // namespace humwise::cli
