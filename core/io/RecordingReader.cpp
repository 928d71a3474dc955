#include "core/io/RecordingReader.h"

#include "core/io/FileBytes.h"
#include "core/io/UffReader.h"
#include "core/util/Text.h"

#include <cstring>

namespace humwise::io {

Result<ParsedRecording, ReadError> parseRecordingBytes(std::span<const std::byte> b, const std::string& source,
                                                       const RecordingReadOptions& options) {
    const std::string ext = text::lower(std::filesystem::path(source).extension().string());
    const bool riff = b.size() >= 4 && (std::memcmp(b.data(), "RIFF", 4) == 0 || std::memcmp(b.data(), "RF64", 4) == 0 ||
                                        std::memcmp(b.data(), "RIFX", 4) == 0);
    const auto wrap = [](Result<Recording, ReadError> r, const char* format) -> Result<ParsedRecording, ReadError> {
        if (!r) return fail(r.error());
        return ParsedRecording{std::move(r).value(), format};
    };
    if (riff) return wrap(parseWav(b, source, options.channels), "wav");
    if (looksLikeUff58(b) || ext == ".uff" || ext == ".unv") {
        UffReadOptions uff;
        uff.channels = options.channels;
        return wrap(parseUffRecording(b, source, uff), "uff");
    }
    if (ext == ".wav") return wrap(parseWav(b, source, options.channels), "wav");
    if (ext == ".csv" || ext == ".txt") {
        CsvReadOptions csv;
        csv.channels = options.channels;
        csv.sampleRateHz = options.sampleRateHz;
        return wrap(parseCsv(std::string_view(reinterpret_cast<const char*>(b.data()), b.size()), source, csv), "csv");
    }
    if (b.empty()) return fail(ReadError{ReadError::Code::Empty, source, {}, {}, "the file is empty"});
    return fail(ReadError{ReadError::Code::NotRecognised, source, {}, {},
                          "not a recording Humwise reads (WAV or UFF58 by content, UFF named *.uff / *.unv, or CSV named *.csv / *.txt)"});
}

Result<Recording, ReadError> readRecordingFile(const std::filesystem::path& path, const RecordingReadOptions& options) {
    auto bytes = readFileBytes(path);
    if (!bytes) return fail(bytes.error());
    auto parsed = parseRecordingBytes(bytes.value(), path.string(), options);
    if (!parsed) return fail(parsed.error());
    return std::move(parsed).value().recording;
}

} // namespace humwise::io
