#pragma once
// A small fleet and walkdown folders written by the tests: two 4-pole motors with vibration and
// current points, recordings synthesised with known content.

#include "core/fleet/Fleet.h"

#include <filesystem>
#include <string>
#include <vector>

namespace humwise::test {

fleet::Fleet smallFleet();

struct WalkdownSpec {
    std::string roundStart = "2026-03-02T08:00:00Z";
    double oneXmmsP1 = 0.6;   // P-1 DE-H 1X velocity
    bool writeManifest = true;
    std::uint64_t seed = 1;
};

// Writes folder/manifest.csv and the WAV files of every point of smallFleet(); returns the
// manifest text it wrote.
std::string writeWalkdown(const std::filesystem::path& folder, const WalkdownSpec& spec = {});

// A fresh empty folder under the test output directory.
std::filesystem::path freshFolder(const std::string& name);

} // namespace humwise::test
