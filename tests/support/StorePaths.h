#pragma once
// Paths for the stores the suites that link storage/ write (header only, so that the test
// support library itself needs no SQLite).

#include "storage/Database.h"
#include "support/TestSupport.h"

#include <filesystem>
#include <string>

namespace humwise::test {

// outputDir()/folder/name, the folder created and any database there removed with the files
// SQLite keeps beside it (storage::removeDatabaseFiles): a fresh store path.
inline std::filesystem::path freshDatabasePath(const std::string& folder, const std::string& name) {
    const auto dir = outputDir() / folder;
    std::filesystem::create_directories(dir);
    const auto p = dir / name;
    storage::removeDatabaseFiles(p);
    return p;
}

} // namespace humwise::test
