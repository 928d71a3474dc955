#include "core/io/RecordingReader.h"

#include "core/io/FileBytes.h"
#include "core/util/Text.h"

#include <cstring>

namespace humwise::io {

Result<Recording, ReadError> readRecordingFile(const std::filesystem::path& path, const RecordingReadOptions& options) {
    auto bytes = readFileBytes(path);
    if (!bytes) return fail(bytes.error());
    const auto& b = bytes.value();
    const std::string source = path.string();
    const std::string ext = text::lower(path.extension().string());
    const bool riff = b.size() >= 4 && (std::memcmp(b.data(), "RIFF", 4) == 0 || std::memcmp(b.data(), "RF64", 4) == 0 ||
                                        std::memcmp(b.data(), "RIFX", 4) == 0);
    if (riff || ext == ".wav") return parseWav(b, source, options.channels);
    if (ext == ".csv" || ext == ".txt") {
        CsvReadOptions csv;
        csv.channels = options.channels;
        csv.sampleRateHz = options.sampleRateHz;
        return parseCsv(std::string_view(reinterpret_cast<const char*>(b.data()), b.size()), source, csv);
    }
    if (b.empty()) return fail(ReadError{ReadError::Code::Empty, source, {}, {}, "the file is empty"});
    return fail(ReadError{ReadError::Code::NotRecognised, source, {}, {},
                          "not a recording Humwise reads (WAV by content, or CSV named *.csv / *.txt)"});
}

} // namespace humwise::io
