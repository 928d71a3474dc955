#include "core/io/ReadError.h"

namespace humwise::io {

std::string ReadError::message() const {
    std::string m = source.empty() ? std::string("<input>") : source;
    if (offset) m += ": byte " + std::to_string(*offset);
    if (line) m += ": line " + std::to_string(*line);
    m += ": " + detail;
    return m;
}

const char* codeName(ReadError::Code code) {
    using C = ReadError::Code;
    switch (code) {
    case C::CannotOpen: return "cannot_open";
    case C::Empty: return "empty";
    case C::TooLarge: return "too_large";
    case C::NotRecognised: return "not_recognised";
    case C::TruncatedHeader: return "truncated_header";
    case C::BadChunk: return "bad_chunk";
    case C::UnsupportedFormat: return "unsupported_format";
    case C::BadField: return "bad_field";
    case C::TruncatedData: return "truncated_data";
    case C::NoData: return "no_data";
    case C::BadNumber: return "bad_number";
    case C::BadHeader: return "bad_header";
    case C::WrongColumnCount: return "wrong_column_count";
    case C::NonUniformTime: return "non_uniform_time";
    }
    return "unknown";
}

} // namespace humwise::io
