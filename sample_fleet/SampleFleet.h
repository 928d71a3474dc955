#pragma once
// The sample fleet: a fictional water treatment works (Plant.h) and a year of its monthly
// walkdowns (Scenario.h), synthesised from physical signal models (SignalModels.h) into the same
// files a user's walkdown has - the fleet file, and per round a folder of WAV files with its
// manifest - plus truth.json saying what was seeded (for tests; the diagnosis never reads it).
//
// Layout under outDir: fleet.json, truth.json, walkdown-01 ... walkdown-13, each with
// manifest.csv and TAG/POINT.wav (walkdown-12 also holds the unlisted power-off pair).
// Deterministic: fixed seeds, the same bytes on every run and for any thread count.
// Thread safety: generateSampleFleet may run concurrently for different outDirs.

#include <filesystem>
#include <vector>

namespace humwise::sample {

struct SampleFleetOptions {
    std::filesystem::path outDir;
    unsigned threads = 0; // 0: the machine's cores
};

struct SampleFleetSummary {
    std::filesystem::path fleetFile, truthFile;
    std::vector<std::filesystem::path> walkdowns; // 13 folders, oldest first
};

// Throws std::runtime_error with the file and the reason when something cannot be written.
SampleFleetSummary generateSampleFleet(const SampleFleetOptions& options);

} // namespace humwise::sample
