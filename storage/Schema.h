#pragma once
// The fleet store's schema and its migrations. PRAGMA user_version holds the schema version;
// opening a database runs every migration from its version up to kSchemaVersion, each in its
// own transaction. A database from a newer Humwise (version above ours) is refused.
//
// Version history:
//   1  sites, areas, motors, bearings, points, routes, rounds, source files, recordings,
//      indicators, findings, per-motor operating point of each round
//   2  analysis products (spectra), alarm limits, indexes for trend queries
//   3  spectra keep their sample rate, segment and transform lengths (peak interpolation and
//      band levels need them when a view reads a stored spectrum)

#include "storage/Database.h"

namespace humwise::storage {

inline constexpr int kSchemaVersion = 3;

int schemaVersion(Database& db);
// Brings the database to `target` (default: the current version); throws StorageException
// (TooNew when the file is newer than this program).
void migrate(Database& db, int target = kSchemaVersion);

} // namespace humwise::storage
