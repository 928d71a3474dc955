#pragma once
// Writes a walkdown folder the way a data collector and a technician leave it: one WAV file per
// point (TAG/POINT.wav) and the manifest (manifest.csv, format in core/io/Manifest.h) that says
// which file holds which motor's point, when it was recorded and in what unit.

#include "sample_fleet/Scenario.h"

#include <filesystem>
#include <string>
#include <vector>

namespace humwise::sample {

struct ManifestRow {
    std::string file;   // relative to the walkdown folder
    std::string motorTag, pointName, quantity, unit;
    std::string time;   // ISO 8601, UTC
};

// Synthesises one motor's recordings of one round into `folder` and returns their manifest rows
// in route order. Throws std::runtime_error when a file cannot be written.
std::vector<ManifestRow> writeMotorRound(const std::filesystem::path& folder, const Round& round, std::size_t motorIndex);

// The power-off pair (Scenario.h) when `round` and `motorIndex` are its; not listed in the manifest.
void writePowerOffPair(const std::filesystem::path& folder, const Round& round, std::size_t motorIndex);

void writeManifest(const std::filesystem::path& folder, const Round& round, const std::vector<ManifestRow>& rows);

std::string roundStartIso(const Round& round);

} // namespace humwise::sample
