#pragma once
// What every store command of humwise-cli needs: opening the store named by --db (default
// defaultDatabasePath()), turning storage exceptions into ProcessingError, and picking a round.

#include "app/cli/ArgParser.h"
#include "app/cli/CliError.h"
#include "storage/FleetStore.h"

#include <memory>
#include <string>

namespace humwise::cli {

// $XDG_DATA_HOME/humwise/fleet.db, else ~/.local/share/humwise/fleet.db.
std::string defaultDatabasePath();

// Opens the store; with create=false a missing file is an error that says how to create one.
std::unique_ptr<storage::FleetStore> openStore(const ParsedArgs& a, bool create);

// Runs f; a StorageException becomes a ProcessingError with the store's message.
template <class F>
auto guarded(F&& f) {
    try {
        return f();
    } catch (const storage::StorageException& e) {
        throw ProcessingError(e.error.message);
    }
}

// "latest", a round id, or a date prefix (2026-03 or 2026-03-04) naming exactly one round.
storage::RoundRow pickRound(storage::FleetStore& store, const std::string& which);

// Writes content to path whole or not at all (through path.part and a rename).
void writeFileWhole(const std::string& path, const std::string& content);

} // namespace humwise::cli
