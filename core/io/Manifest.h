#pragma once
// The walkdown manifest: a CSV file named manifest.csv in the walkdown folder that says which
// file (and channel) holds which motor's measurement point. Layout (README.md, "Walkdown
// manifest"):
//   # round_start: 2026-03-04T08:00:00Z    metadata lines "# key: value" before the header:
//   # route: ROUTE NAME                     round_start (required), route, technician, notes
//   # technician: TEXT
//   file,channel,motor,point,quantity,unit,sensitivity,time,speed_rpm,load_percent
//   P-101/DE-H.wav,1,P-101,DE-H,,,,2026-03-04T08:12:05Z,1478,
// Required columns: file, motor, point. Optional: channel (1-based, default 1), quantity, unit and
// sensitivity (override the point's definition), time (ISO 8601, default round_start),
// speed_rpm and load_percent (measured on site). Unknown columns are refused. Paths are relative
// to the folder and may not leave it (checked by the import, ManifestEntry keeps the text).

#include "core/io/ReadError.h"
#include "core/model/Result.h"
#include "core/model/Units.h"

#include <chrono>
#include <optional>
#include <string>
#include <string_view>
#include <vector>

namespace humwise::io {

struct ManifestEntry {
    std::size_t line = 0;           // where it was written, for messages
    std::string file;               // relative path as written
    int channel = 1;                // 1-based
    std::string motorTag;
    std::string pointName;
    std::optional<Quantity> quantity;
    std::optional<Unit> unit;
    std::optional<double> sensitivity;
    std::optional<std::chrono::sys_time<std::chrono::milliseconds>> time;
    std::optional<double> speedRpm;
    std::optional<double> loadPercent;
};

struct Manifest {
    std::chrono::sys_time<std::chrono::milliseconds> roundStart;
    std::optional<std::string> route;
    std::string technician;
    std::string notes;
    std::vector<ManifestEntry> entries;
};

[[nodiscard]] Result<Manifest, ReadError> parseManifest(std::string_view text, const std::string& source);

} // namespace humwise::io
