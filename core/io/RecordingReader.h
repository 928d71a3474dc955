#pragma once
// Reads a recording file of any format Humwise knows, choosing the reader by content first:
// a file that starts with RIFF (or RF64/RIFX, which the WAV reader then refuses by name) or is
// named *.wav goes to the WAV reader; otherwise a file named *.csv or *.txt is read as CSV;
// anything else is refused with a message naming the file.

#include "core/io/CsvReader.h"
#include "core/io/WavReader.h"

#include <filesystem>
#include <optional>

namespace humwise::io {

struct RecordingReadOptions {
    ChannelSettings channels;           // WAV: meaning of every channel; CSV: defaults for unitless columns
    std::optional<double> sampleRateHz; // CSV without time column or metadata
};

[[nodiscard]] Result<Recording, ReadError> readRecordingFile(const std::filesystem::path& path,
                                                             const RecordingReadOptions& options = {});

} // namespace humwise::io
