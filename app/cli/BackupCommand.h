#pragma once
// humwise-cli db backup FILE [--db PATH] and db restore FILE [--db PATH] (storage/Backup.h).
// `args` are the arguments after "db", the sub-command word included ("backup FILE --db x").
//
//   backup   copies the store (default: defaultDatabasePath()) into FILE with SQLite's online
//            backup API while other processes may keep using the store; FILE is written whole
//            or not at all (replaced when it exists).
//   restore  checks FILE (integrity, a Humwise store, schema not newer than this program), keeps
//            the store as it was in "<store>.before-restore" (replacing an older one), then
//            replaces the content of the store by FILE (created when missing).
// Throws UsageError for a wrong command line and ProcessingError (the file and the problem)
// when the store or the file cannot be used; returns 0 on success.

#include <ostream>
#include <string>
#include <vector>

namespace humwise::cli {

int runDbBackup(const std::vector<std::string>& args, std::ostream& out);
int runDbRestore(const std::vector<std::string>& args, std::ostream& out);

} // namespace humwise::cli
