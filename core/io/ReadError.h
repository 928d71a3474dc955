#pragma once
// The typed error every reader returns: what went wrong, in which file, and where.

#include <cstdint>
#include <optional>
#include <string>

namespace humwise::io {

struct ReadError {
    enum class Code {
        CannotOpen,        // the file does not exist or cannot be read
        Empty,             // zero bytes
        TooLarge,          // larger than the reader accepts
        NotRecognised,     // not the expected format at all (wrong magic)
        TruncatedHeader,   // ends inside the header or a chunk header
        BadChunk,          // a chunk size or layout that cannot be right
        UnsupportedFormat, // a valid file in a variant Humwise does not read
        BadField,          // a header field with an impossible value (rate, channels, bits)
        TruncatedData,     // fewer sample bytes than the header promises
        NoData,            // a valid header with no samples
        BadNumber,         // text that is not a number where one is needed
        BadHeader,         // CSV header line missing or malformed
        WrongColumnCount,  // a row with a different number of fields than the header
        NonUniformTime,    // time column not increasing at a constant step
    };
    Code code = Code::NotRecognised;
    std::string source;                  // file name or stream label
    std::optional<std::uint64_t> offset; // byte offset, for binary formats
    std::optional<std::size_t> line;     // 1-based line, for text formats
    std::string detail;                  // what is wrong, in words

    // "FILE: byte 36: detail" / "FILE: line 12: detail"
    std::string message() const;
};

const char* codeName(ReadError::Code code); // "truncated_header", ...

} // namespace humwise::io
