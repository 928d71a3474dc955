#pragma once
// Backup and restore of the fleet store with SQLite's online backup API (sqlite3_backup_init /
// step / finish, https://www.sqlite.org/backup.html): a page-by-page copy of a consistent
// snapshot, taken while other connections keep reading and writing (WAL).
//
// backupDatabase writes `to` whole or not at all: the copy goes to "<to>.part" in the same
// folder, is switched to a rollback journal (journal_mode DELETE, so the backup is one
// self-contained file that opens read-only anywhere), checked with PRAGMA integrity_check and
// only then renamed over `to` (the folder is synced after the rename). The source is only read.
// Backing up the same content twice gives the same bytes (tests/storage/BackupTest.cpp).
//
// restoreDatabase first checks the backup: it opens read-only, passes PRAGMA integrity_check,
// is a Humwise fleet store (schema version >= 1 and a rounds table) and is not newer than this
// program (schema version <= kSchemaVersion). Then it copies it over `to` (created when missing)
// through the backup API, inside SQLite's own transaction on `to`: a failure leaves `to` as it
// was, and other connections to `to` see the restored content at their next transaction. The
// restored store keeps the backup's schema version; FleetStore::open migrates it forward.
//
// Errors: StorageException with a StorageError naming the file and the problem (CannotOpen,
// NotFound, Invalid, Corrupt, TooNew, Busy, ReadOnly, Full, Io). Nothing is left behind on
// failure (no "<to>.part", `to` unchanged).
//
// Thread safety: `from` is used by the calling thread only, like every Database.

#include "storage/Database.h"

#include <filesystem>
#include <functional>

namespace humwise::storage {

// Copies the database `from` is connected to into the file `to` (replaced when it exists;
// refused when it is the source itself).
void backupDatabase(Database& from, const std::filesystem::path& to);

// Replaces the content of the database `to` by that of the backup file `backup`. beforeReplacing,
// when given, runs once every check has passed and before `to` is touched (the CLI keeps a copy
// of the store there); what it throws stops the restore with `to` unchanged.
void restoreDatabase(const std::filesystem::path& backup, const std::filesystem::path& to, const std::function<void()>& beforeReplacing = {});

} // namespace humwise::storage
