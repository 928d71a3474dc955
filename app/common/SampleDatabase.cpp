#include "app/common/SampleDatabase.h"

#include "core/io/FleetFile.h"
#include "sample_fleet/SampleFleet.h"
#include "storage/FleetStore.h"

#include <cstdlib>
#include <stdexcept>

namespace humwise::workflow {

namespace fs = std::filesystem;

fs::path defaultSampleFolder() {
    if (const char* xdg = std::getenv("XDG_DATA_HOME"); xdg && *xdg) return fs::path(xdg) / "humwise" / "sample";
    if (const char* home = std::getenv("HOME"); home && *home) return fs::path(home) / ".local" / "share" / "humwise" / "sample";
    return fs::temp_directory_path() / "humwise-sample";
}

SampleDatabaseResult buildSampleDatabase(const fs::path& folder, const fs::path& database, const ProgressCallback& progress) {
    if (fs::exists(database)) throw std::runtime_error(database.string() + ": exists already; the sample database is built only into a new file");
    sample::SampleFleetOptions options;
    options.outDir = folder;
    if (progress) progress({0, 13, "generating the sample fleet"});
    const auto summary = sample::generateSampleFleet(options);
    const auto fleet = io::readFleetFile(summary.fleetFile);
    if (!fleet) throw std::runtime_error(fleet.error().message());
    const fs::path partial = database.string() + ".building";
    storage::removeDatabaseFiles(partial); // whatever an interrupted build left, its journal too
    SampleDatabaseResult out;
    try {
        auto store = storage::FleetStore::open(partial);
        {
            storage::Transaction tx(store->database());
            store->saveFleet(fleet.value());
            tx.commit();
        }
        for (std::size_t i = 0; i + 1 < summary.walkdowns.size(); ++i) {
            if (progress && !progress({i + 1, summary.walkdowns.size(), "importing " + summary.walkdowns[i].filename().string()}))
                throw std::runtime_error("building the sample database was cancelled");
            auto r = importWalkdown(*store, summary.walkdowns[i]);
            if (!r) throw std::runtime_error(r.error().message);
            ++out.roundsImported;
        }
        store->checkpoint();
    } catch (const storage::StorageException& e) {
        throw std::runtime_error(e.error.message);
    }
    // The finished database appears under its name only when complete.
    fs::rename(partial, database);
    storage::removeFilesBeside(partial);
    out.database = database;
    out.folder = folder;
    out.nextWalkdown = summary.walkdowns.back();
    return out;
}

} // namespace humwise::workflow
