#pragma once
#include <ostream>
#include <string>
#include <vector>

namespace humwise::cli {
// humwise-cli spectrum FILE [...]: averaged, envelope or zoom spectrum of one channel.
int runSpectrum(const std::vector<std::string>& args, std::ostream& out);
} // namespace humwise::cli
