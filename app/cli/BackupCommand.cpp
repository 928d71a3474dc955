#include "app/cli/BackupCommand.h"

#include "app/cli/ArgParser.h"
#include "app/cli/CliError.h"
#include "app/cli/StoreAccess.h"
#include "storage/Backup.h"
#include "storage/Database.h"
#include "storage/Schema.h"

#include <cstdint>
#include <filesystem>
#include <memory>
#include <string>
#include <utility>

namespace humwise::cli {
namespace {

namespace fs = std::filesystem;

struct Target {
    std::string file;   // the backup file
    std::string db;     // the store
    bool defaultDb;     // no --db given: the user's data directory
};

// "SUBCOMMAND FILE [--db PATH]".
Target parse(const std::vector<std::string>& args, const char* sub) {
    const ParsedArgs a(args, {{"db"}});
    const auto& p = a.positional();
    if (p.size() != 2 || p[0] != sub) throw UsageError(std::string("db ") + sub + " takes one file: db " + sub + " FILE [--db PATH]");
    return {p[1], a.value("db").value_or(defaultDatabasePath()), !a.has("db")};
}

std::uintmax_t sizeOf(const std::string& file) {
    std::error_code ec;
    const auto n = fs::file_size(file, ec);
    return ec ? 0 : n;
}

// Copies the store about to be replaced to "<db>.before-restore" (replacing an older one): with
// the backup API when the store can be read, else byte for byte (a damaged store is often the
// reason for a restore, and its pages may still matter). Returns the copy's name.
std::string keepSafetyCopy(const std::string& db) {
    const std::string copy = db + ".before-restore";
    try {
        storage::Database current(db, storage::Database::Mode::ReadOnly);
        storage::backupDatabase(current, copy);
        return copy;
    } catch (const storage::StorageException&) {
        // fall through to the byte copy
    }
    std::error_code ec;
    // The store with what SQLite keeps beside it: the log, or the journal of a write that was
    // interrupted (without it the copy would hold half of that write).
    for (const char* suffix : {"", "-wal", "-journal"}) {
        const std::string from = db + suffix;
        if (suffix[0] && !fs::exists(from)) {
            fs::remove(copy + suffix, ec);
            continue;
        }
        fs::copy_file(from, copy + suffix, fs::copy_options::overwrite_existing, ec);
        if (ec) throw ProcessingError(db + ": cannot keep a copy of the store before restoring (" + ec.message() + "); nothing was changed");
    }
    return copy;
}

} // namespace

int runDbBackup(const std::vector<std::string>& args, std::ostream& out) {
    const auto [file, db, defaultDb] = parse(args, "backup");
    if (!fs::exists(db)) throw ProcessingError(db + ": no such database");
    try {
        // Never migrated or written. Opened read-write when it can be, so that closing the last
        // connection folds the WAL back and removes the -wal and -shm files (a read-only
        // connection leaves them behind); read-only for a file or folder that is.
        std::unique_ptr<storage::Database> source;
        try {
            source = std::make_unique<storage::Database>(db, storage::Database::Mode::ReadWrite);
        } catch (const storage::StorageException& e) {
            if (e.error.code != storage::StorageError::Code::ReadOnly && e.error.code != storage::StorageError::Code::CannotOpen) throw;
            source = std::make_unique<storage::Database>(db, storage::Database::Mode::ReadOnly);
        }
        const int version = storage::schemaVersion(*source);
        storage::backupDatabase(*source, file);
        out << db << ": backed up to " << file << " (" << sizeOf(file) << " bytes, schema version " << version << ")\n";
    } catch (const storage::StorageException& e) {
        throw ProcessingError(e.error.message);
    }
    return kExitOk;
}

int runDbRestore(const std::vector<std::string>& args, std::ostream& out) {
    const auto [file, db, defaultDb] = parse(args, "restore");
    std::error_code ec;
    if (defaultDb) fs::create_directories(fs::path(db).parent_path(), ec); // as the other store commands do
    try {
        storage::restoreDatabase(file, db, [&, db = db] { // once the backup passed its checks
            if (sizeOf(db) > 0) out << db << ": the store as it was is kept in " << keepSafetyCopy(db) << '\n';
        });
        storage::Database restored(db, storage::Database::Mode::ReadOnly);
        out << db << ": restored from " << file << " (schema version " << storage::schemaVersion(restored) << ")\n";
    } catch (const storage::StorageException& e) {
        throw ProcessingError(e.error.message);
    }
    return kExitOk;
}

} // namespace humwise::cli
