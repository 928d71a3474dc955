#include "core/io/FileBytes.h"

#include <fstream>
#include <system_error>

namespace humwise::io {

Result<std::vector<std::byte>, ReadError> readAllBytes(std::istream& in, const std::string& source, std::uint64_t maxBytes,
                                                       std::uint64_t expectedBytes) {
    std::vector<std::byte> bytes;
    if (expectedBytes > 0 && expectedBytes <= maxBytes) {
        // One allocation and one read: growing the vector 64 KiB at a time copied each file about
        // twice over and made the system map fresh pages at every step.
        bytes.resize(static_cast<std::size_t>(expectedBytes));
        in.read(reinterpret_cast<char*>(bytes.data()), static_cast<std::streamsize>(expectedBytes));
        bytes.resize(static_cast<std::size_t>(in.gcount()));
    }
    char buffer[1 << 16];
    while (in) {
        in.read(buffer, sizeof buffer);
        const auto got = static_cast<std::size_t>(in.gcount());
        if (bytes.size() + got > maxBytes)
            return fail(ReadError{ReadError::Code::TooLarge, source, {}, {},
                                  "larger than the " + std::to_string(maxBytes >> 20) + " MiB a recording may have"});
        const auto* p = reinterpret_cast<const std::byte*>(buffer);
        bytes.insert(bytes.end(), p, p + got);
    }
    if (in.bad()) return fail(ReadError{ReadError::Code::CannotOpen, source, {}, {}, "read error"});
    return bytes;
}

Result<std::vector<std::byte>, ReadError> readFileBytes(const std::filesystem::path& path, std::uint64_t maxBytes) {
    const std::string source = path.string();
    std::error_code ec;
    if (std::filesystem::is_directory(path, ec))
        return fail(ReadError{ReadError::Code::CannotOpen, source, {}, {}, "is a folder, not a file"});
    std::ifstream in(path, std::ios::binary);
    if (!in) return fail(ReadError{ReadError::Code::CannotOpen, source, {}, {}, "cannot open the file (missing or not readable)"});
    const auto size = std::filesystem::file_size(path, ec);
    return readAllBytes(in, source, maxBytes, ec ? 0 : size);
}

} // namespace humwise::io
