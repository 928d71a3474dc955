#pragma once
// The sample database the workbench opens on by default: the sample fleet (sample_fleet/) is
// generated into a folder, then imported through the user's own code paths - the fleet file, then
// the first twelve walkdowns. The thirteenth walkdown stays in the folder for the user to import.

#include "app/common/Walkdown.h"

#include <filesystem>
#include <string>

namespace humwise::workflow {

struct SampleDatabaseResult {
    std::filesystem::path database;
    std::filesystem::path folder;          // the generated fleet file and walkdown folders
    std::filesystem::path nextWalkdown;    // the one left for the user
    std::size_t roundsImported = 0;
};

// Generates under `folder` and builds `database` (which must not exist yet). Throws
// std::runtime_error naming what failed.
SampleDatabaseResult buildSampleDatabase(const std::filesystem::path& folder, const std::filesystem::path& database,
                                         const ProgressCallback& progress = {});

// The default place: $XDG_DATA_HOME/humwise/sample (or ~/.local/share/humwise/sample).
std::filesystem::path defaultSampleFolder();

} // namespace humwise::workflow
