#pragma once
// Runs the real humwise-cli binary (HUMWISE_CLI, set by CMake) as a subprocess and captures
// its exit status, stdout and stderr.

#include <string>
#include <vector>

namespace humwise::test {

struct CliRun {
    int exitCode = -1; // the process's exit status; 128 + signal when it was killed
    std::string out;
    std::string err;
};

CliRun runCli(const std::vector<std::string>& args);

} // namespace humwise::test
