#pragma once
// The two ways a command fails: the user asked wrongly (exit 2) or the data could not be
// processed (exit 1). main() turns them into a message on stderr and the exit code.

#include <stdexcept>
#include <string>

namespace humwise::cli {

inline constexpr int kExitOk = 0;
inline constexpr int kExitProcessingError = 1;
inline constexpr int kExitUsageError = 2;

struct UsageError : std::runtime_error {
    using std::runtime_error::runtime_error;
};

struct ProcessingError : std::runtime_error {
    using std::runtime_error::runtime_error;
};

} // namespace humwise::cli
