#pragma once
// Reads a recording file of any format Humwise knows, choosing the reader by content first:
// a file that starts with RIFF (or RF64/RIFX, which the WAV reader then refuses by name) goes to
// the WAV reader; UFF dataset 58 content or a name *.uff / *.unv to the UFF reader; then *.wav to
// the WAV reader and *.csv / *.txt to the CSV reader; anything else is refused with a message
// naming the file.

#include "core/io/CsvReader.h"
#include "core/io/WavReader.h"

#include <filesystem>
#include <optional>
#include <span>
#include <string>

namespace humwise::io {

struct RecordingReadOptions {
    ChannelSettings channels;           // WAV: meaning of every channel; CSV: defaults for unitless columns
    std::optional<double> sampleRateHz; // CSV without time column or metadata
};

struct ParsedRecording {
    Recording recording;
    std::string format; // "wav", "csv", "uff"
};

// The same choice on bytes already read; `source` names the file (its extension counts).
[[nodiscard]] Result<ParsedRecording, ReadError> parseRecordingBytes(std::span<const std::byte> bytes, const std::string& source,
                                                                     const RecordingReadOptions& options = {});

[[nodiscard]] Result<Recording, ReadError> readRecordingFile(const std::filesystem::path& path,
                                                             const RecordingReadOptions& options = {});

} // namespace humwise::io
