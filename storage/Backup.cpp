#include "storage/Backup.h"

#include "storage/Schema.h"

#include <sqlite3.h>

#include <fcntl.h>
#include <unistd.h>

#include <chrono>
#include <cstring>
#include <fstream>
#include <functional>
#include <string>
#include <system_error>
#include <thread>
#include <vector>

namespace humwise::storage {
namespace {

namespace fs = std::filesystem;
using Code = StorageError::Code;

constexpr int kBusyTimeoutMs = 5000; // as Database's default

[[noreturn]] void raise(Code code, std::string message) { throw StorageException{{code, std::move(message), 0}}; }

// One raw connection (the backup API works on two of them), closed by the destructor.
class Connection {
public:
    Connection(const fs::path& path, int flags, std::string role) : m_path(path), m_role(std::move(role)) {
        const int rc = sqlite3_open_v2(path.string().c_str(), &m_db, flags | SQLITE_OPEN_NOMUTEX, nullptr);
        if (rc != SQLITE_OK) {
            StorageError e = error(rc, "cannot open " + m_role);
            if ((rc & 0xff) == SQLITE_CANTOPEN) e.code = Code::CannotOpen;
            sqlite3_close(m_db);
            m_db = nullptr;
            throw StorageException{e};
        }
        sqlite3_extended_result_codes(m_db, 1);
        sqlite3_busy_timeout(m_db, kBusyTimeoutMs);
    }
    ~Connection() {
        if (m_db) sqlite3_close(m_db);
    }
    Connection(const Connection&) = delete;
    Connection& operator=(const Connection&) = delete;

    sqlite3* handle() { return m_db; }
    const fs::path& path() const { return m_path; }
    const std::string& role() const { return m_role; }

    StorageError error(int rc, const std::string& what) const {
        const char* detail = m_db ? sqlite3_errmsg(m_db) : sqlite3_errstr(rc);
        const Code code = codeForSqlite(rc);
        return {code, m_path.string() + ": " + what + ": " + (detail ? detail : sqlite3_errstr(rc)) + adviceFor(rc, code), rc};
    }

    // Runs one statement (SQL text of this file only, no parameters) and returns the first
    // column of every row as text.
    std::vector<std::string> rows(const char* sql) {
        sqlite3_stmt* s = nullptr;
        int rc = sqlite3_prepare_v2(m_db, sql, -1, &s, nullptr);
        if (rc != SQLITE_OK) throw StorageException{error(rc, std::string("cannot read ") + m_role)};
        std::vector<std::string> out;
        while ((rc = sqlite3_step(s)) == SQLITE_ROW) {
            const auto* t = sqlite3_column_text(s, 0);
            out.emplace_back(t ? reinterpret_cast<const char*>(t) : "");
        }
        sqlite3_finalize(s);
        if (rc != SQLITE_DONE) throw StorageException{error(rc, std::string("cannot read ") + m_role)};
        return out;
    }

    void close() {
        if (!m_db) return;
        const int rc = sqlite3_close(m_db);
        if (rc != SQLITE_OK) throw StorageException{error(rc, "cannot close " + m_role)};
        m_db = nullptr;
    }

private:
    sqlite3* m_db = nullptr;
    fs::path m_path;
    std::string m_role;
};

// PRAGMA integrity_check must answer exactly one row "ok".
void checkIntegrity(Connection& c) {
    const auto r = c.rows("PRAGMA integrity_check");
    if (r.size() == 1 && r.front() == "ok") return;
    raise(Code::Corrupt, c.path().string() + ": " + c.role() + " is damaged (PRAGMA integrity_check: " + (r.empty() ? "no answer" : r.front()) +
                             (r.size() > 1 ? ", and " + std::to_string(r.size() - 1) + " more problem(s)" : "") + ")");
}

// Copies every page of `source` into `dest` in one step, retrying while a lock is held by
// another connection for up to kBusyTimeoutMs.
void copyPages(sqlite3* source, Connection& dest, const std::string& what) {
    sqlite3_backup* b = sqlite3_backup_init(dest.handle(), "main", source, "main");
    if (!b) throw StorageException{dest.error(sqlite3_extended_errcode(dest.handle()), what)};
    const auto deadline = std::chrono::steady_clock::now() + std::chrono::milliseconds(kBusyTimeoutMs);
    int rc = SQLITE_OK;
    while (true) {
        rc = sqlite3_backup_step(b, -1);
        const bool busy = (rc & 0xff) == SQLITE_BUSY || (rc & 0xff) == SQLITE_LOCKED;
        if (!busy || std::chrono::steady_clock::now() >= deadline) break;
        std::this_thread::sleep_for(std::chrono::milliseconds(20));
    }
    const int finish = sqlite3_backup_finish(b); // the step's error, now also on dest
    if (rc == SQLITE_DONE && finish == SQLITE_OK) return;
    const int code = rc != SQLITE_DONE ? rc : finish;
    StorageError e = dest.error(code, what);
    throw StorageException{e};
}

// Removes a file we created (and SQLite's companions of it) unless released.
class Cleanup {
public:
    explicit Cleanup(fs::path path) : m_path(std::move(path)) {}
    ~Cleanup() {
        if (m_armed) removeNow();
    }
    void removeNow() const {
        removeDatabaseFiles(m_path);
    }
    void release() { m_armed = false; }

private:
    fs::path m_path;
    bool m_armed = true;
};

// Makes the rename durable. A failure here leaves a complete backup under its final name;
// only its survival across a power cut in the next seconds is less certain, so it is not an error.
void syncFolder(const fs::path& folder) {
    const int fd = ::open(folder.empty() ? "." : folder.c_str(), O_RDONLY | O_DIRECTORY);
    if (fd < 0) return;
    ::fsync(fd);
    ::close(fd);
}

bool same(const fs::path& a, const fs::path& b) {
    std::error_code ec;
    return fs::exists(a, ec) && fs::exists(b, ec) && fs::equivalent(a, b, ec);
}

// Writes a copy of `source` into the new file `to` (through "<to>.part", then a rename): one
// self-contained file in rollback-journal mode, integrity-checked before it is put in place.
void copyIntoNewFile(sqlite3* source, const std::string& failure, const fs::path& to, const std::string& role) {
    std::error_code ec;
    const fs::path part = to.string() + ".part";
    Cleanup cleanup(part);
    cleanup.removeNow(); // left by an earlier run that was killed
    {
        Connection dest(part, SQLITE_OPEN_READWRITE | SQLITE_OPEN_CREATE, role);
        copyPages(source, dest, failure);
        // One self-contained file: no -wal/-shm needed to read it, read-only media included.
        const auto mode = dest.rows("PRAGMA journal_mode = DELETE");
        if (mode.size() != 1 || mode.front() != "delete")
            raise(Code::Internal, part.string() + ": cannot switch the copy to a rollback journal");
        checkIntegrity(dest);
        dest.close();
    }
    fs::rename(part, to, ec);
    if (ec) raise(Code::Io, to.string() + ": cannot put the copy in place: " + ec.message());
    cleanup.release();
    syncFolder(to.parent_path());
}

// True when the file starts with SQLite's header string (https://www.sqlite.org/fileformat.html,
// 1.3: "SQLite format 3\0"); an empty file counts as no database either.
bool hasSqliteHeader(const fs::path& file) {
    std::ifstream in(file, std::ios::binary);
    char header[16] = {};
    return in.read(header, sizeof header) && std::memcmp(header, "SQLite format 3", 16) == 0;
}

} // namespace

void backupDatabase(Database& from, const fs::path& to) {
    std::error_code ec;
    if (to.empty()) raise(Code::Invalid, "no file name given for the backup");
    if (same(to, from.path())) raise(Code::Invalid, to.string() + ": this is the database itself; give another file for the backup");
    if (fs::is_directory(to, ec)) raise(Code::Invalid, to.string() + ": is a folder; give a file name for the backup");
    if (sqlite3_get_autocommit(from.handle()) == 0)
        raise(Code::Invalid, from.path().string() + ": a transaction is open on this connection; back up outside a transaction");
    copyIntoNewFile(from.handle(), "cannot back up " + from.path().string(), to, "the backup");
}

namespace {

// The checks on the backup, opened read-only as `source` (see Backup.h).
void checkBackup(Connection& source, const fs::path& backup) {
    try {
        checkIntegrity(source);
    } catch (StorageException& e) {
        e.error.message += " - nothing was changed";
        throw;
    }
    const auto version = source.rows("PRAGMA user_version");
    const long long v = version.empty() ? 0 : std::stoll(version.front());
    if (v > kSchemaVersion)
        raise(Code::TooNew, backup.string() + ": the backup has schema version " + std::to_string(v) + ", newer than this Humwise understands (" +
                                std::to_string(kSchemaVersion) + "); restore it with a newer Humwise - nothing was changed");
    const auto rounds = source.rows("SELECT COUNT(*) FROM sqlite_schema WHERE type = 'table' AND name = 'rounds'");
    if (v < 1 || rounds.empty() || rounds.front() != "1")
        raise(Code::Invalid, backup.string() + ": not a Humwise fleet store (schema version " + std::to_string(v) + ", no rounds table) - nothing was changed");
}

} // namespace

void restoreDatabase(const fs::path& backup, const fs::path& to, const std::function<void()>& beforeReplacing) {
    std::error_code ec;
    if (same(backup, to)) raise(Code::Invalid, to.string() + ": the backup and the database are the same file");
    if (fs::is_directory(to, ec)) raise(Code::Invalid, to.string() + ": is a folder, not a database file");
    if (!fs::exists(backup, ec)) raise(Code::NotFound, backup.string() + ": no such backup file");
    if (!fs::is_regular_file(backup, ec)) raise(Code::Invalid, backup.string() + ": not a file");
    Connection source(backup, SQLITE_OPEN_READONLY, "the backup");
    checkBackup(source, backup);
    if (beforeReplacing) beforeReplacing();

    if (fs::exists(to, ec) && !hasSqliteHeader(to)) {
        // Not a database at all (overwritten, truncated): no connection can be using it, so it
        // is replaced as a file, and any -wal/-shm/-journal beside it (stale) goes: a journal
        // left there would be rolled back into the restored file at its first open.
        removeFilesBeside(to);
        copyIntoNewFile(source.handle(), "cannot restore " + backup.string() + " into the database (it is unchanged)", to, "the database");
        return;
    }
    const bool created = !fs::exists(to, ec);
    Cleanup cleanup(to);
    if (!created) cleanup.release(); // never remove a database that was there before
    Connection dest(to, SQLITE_OPEN_READWRITE | SQLITE_OPEN_CREATE, "the database");
    copyPages(source.handle(), dest, "cannot restore " + backup.string() + " into the database (it is unchanged)");
    checkIntegrity(dest);
    dest.close();
    cleanup.release();
}

} // namespace humwise::storage
