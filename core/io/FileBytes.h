#pragma once
// Reading a whole file or stream into memory, bounded, with typed errors.

#include "core/io/ReadError.h"
#include "core/model/Result.h"

#include <cstddef>
#include <cstdint>
#include <filesystem>
#include <istream>
#include <string>
#include <vector>

namespace humwise::io {

inline constexpr std::uint64_t kMaxInputBytes = std::uint64_t{4} << 30; // 4 GiB

// expectedBytes, when known (a file's size), is read in one piece into one allocation; whatever
// the stream holds beyond it is read too (a file may grow meanwhile), up to maxBytes.
[[nodiscard]] Result<std::vector<std::byte>, ReadError> readAllBytes(std::istream& in, const std::string& source,
                                                                     std::uint64_t maxBytes = kMaxInputBytes,
                                                                     std::uint64_t expectedBytes = 0);
[[nodiscard]] Result<std::vector<std::byte>, ReadError> readFileBytes(const std::filesystem::path& path,
                                                                      std::uint64_t maxBytes = kMaxInputBytes);

} // namespace humwise::io
