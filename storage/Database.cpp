#include "storage/Database.h"

#include <sqlite3.h>

#include <cstdlib>
#include <utility>

#ifdef __linux__
#include <dirent.h>
#include <fcntl.h>
#include <sys/stat.h>
#endif

namespace humwise::storage {
StorageError::Code codeForSqlite(int rc) {
    switch (rc & 0xff) {
    case SQLITE_CANTOPEN: return StorageError::Code::CannotOpen;
    case SQLITE_NOTADB: return StorageError::Code::Corrupt;
    case SQLITE_READONLY: return StorageError::Code::ReadOnly;
    case SQLITE_BUSY:
    case SQLITE_LOCKED: return StorageError::Code::Busy;
    case SQLITE_CORRUPT: return StorageError::Code::Corrupt;
    case SQLITE_FULL: return StorageError::Code::Full;
    case SQLITE_CONSTRAINT: return StorageError::Code::Constraint;
    case SQLITE_IOERR: return StorageError::Code::Io;
    case SQLITE_PERM:
    case SQLITE_AUTH: return StorageError::Code::ReadOnly;
    default: return StorageError::Code::Internal;
    }
}

const char* adviceFor(int rc, StorageError::Code code) {
    if (rc == SQLITE_READONLY_ROLLBACK)
        return " (a write that was interrupted left its journal beside the database; open it once with the workbench or any "
               "humwise-cli command that takes a store, which open it for writing, and SQLite rolls the interrupted write back)";
    switch (code) {
    case StorageError::Code::Busy: return " (the database is locked by another process that is writing to it; try again when it is done)";
    default: return "";
    }
}

const char* codeName(StorageError::Code code) {
    using C = StorageError::Code;
    switch (code) {
    case C::CannotOpen: return "cannot_open";
    case C::ReadOnly: return "read_only";
    case C::Busy: return "busy";
    case C::Corrupt: return "corrupt";
    case C::Full: return "full";
    case C::TooNew: return "too_new";
    case C::Constraint: return "constraint";
    case C::NotFound: return "not_found";
    case C::Invalid: return "invalid";
    case C::Io: return "io";
    case C::Internal: return "internal";
    }
    return "internal";
}

Database::Database(const std::filesystem::path& path, Mode mode, int busyTimeoutMs) : m_path(path) {
    int flags = SQLITE_OPEN_NOMUTEX;
    flags |= mode == Mode::ReadOnly ? SQLITE_OPEN_READONLY : SQLITE_OPEN_READWRITE;
    if (mode == Mode::ReadWriteCreate) flags |= SQLITE_OPEN_CREATE;
    const int rc = sqlite3_open_v2(path.string().c_str(), &m_db, flags, nullptr);
    if (rc != SQLITE_OK) {
        StorageError e = errorFrom(rc, "cannot open the database");
        if ((rc & 0xff) == SQLITE_CANTOPEN) e.code = StorageError::Code::CannotOpen;
        sqlite3_close(m_db);
        m_db = nullptr;
        throw StorageException{e};
    }
    sqlite3_extended_result_codes(m_db, 1);
    sqlite3_busy_timeout(m_db, busyTimeoutMs);
    try {
        execute("PRAGMA foreign_keys = ON");
        if (mode != Mode::ReadOnly) {
            // A new file gets 16 KiB pages (no effect on an existing one): raw recordings of
            // 0.5-4 MB are most of a store, and larger pages write them with a quarter of the
            // page and WAL-frame overhead (https://www.sqlite.org/intern-v-extern-blob.html).
            execute("PRAGMA page_size = 16384");
            // WAL lets readers work while one process writes; synchronous NORMAL is durable in WAL
            // across application crashes (a power cut may lose the last commit, never corrupt).
            auto s = prepare("PRAGMA journal_mode = WAL");
            while (s.step()) {}
            execute("PRAGMA synchronous = NORMAL");
        }
    } catch (...) {
        sqlite3_close(m_db);
        m_db = nullptr;
        throw;
    }
}

Database::~Database() {
    m_cache.clear(); // finalize the kept statements before closing
    if (m_db) sqlite3_close(m_db);
}

Statement& Database::cached(const char* sql) {
    auto it = m_cache.find(sql);
    if (it == m_cache.end()) it = m_cache.emplace(sql, std::make_unique<Statement>(prepare(sql))).first;
    it->second->reset();
    return *it->second;
}

StorageError Database::errorFrom(int rc, std::string_view what) const {
    StorageError e;
    e.code = codeForSqlite(rc);
    e.sqliteCode = rc;
    const char* detail = m_db ? sqlite3_errmsg(m_db) : sqlite3_errstr(rc);
    e.message = m_path.string() + ": " + std::string(what) + ": " + (detail ? detail : sqlite3_errstr(rc)) + adviceFor(rc, e.code);
    return e;
}

Statement Database::prepare(std::string_view sql) {
    sqlite3_stmt* stmt = nullptr;
    const int rc = sqlite3_prepare_v2(m_db, sql.data(), static_cast<int>(sql.size()), &stmt, nullptr);
    if (rc != SQLITE_OK) throw StorageException{errorFrom(rc, "cannot prepare a statement")};
    return Statement(*this, stmt);
}

void Database::execute(std::string_view sql) {
    auto s = prepare(sql);
    s.run();
}

namespace {
// Runs a journal_mode pragma; SQLite answers with the mode in force afterwards (the old one when
// a change was refused, or an error such as SQLITE_BUSY).
std::string journalModePragma(Database& db, const char* sql) {
    auto s = db.prepare(sql);
    return s.step() ? s.text(0) : std::string();
}
} // namespace

std::string Database::journalMode() { return journalModePragma(*this, "PRAGMA journal_mode"); }

std::int64_t Database::lastInsertId() const { return sqlite3_last_insert_rowid(m_db); }
int Database::changes() const { return sqlite3_changes(m_db); }

Statement::~Statement() {
    if (m_stmt) sqlite3_finalize(m_stmt);
}

Statement::Statement(Statement&& other) noexcept : m_db(other.m_db), m_stmt(std::exchange(other.m_stmt, nullptr)) {}

void Statement::check(int rc, std::string_view what) {
    if (rc != SQLITE_OK) throw StorageException{m_db->errorFrom(rc, what)};
}

Statement& Statement::bind(int i, std::int64_t v) {
    check(sqlite3_bind_int64(m_stmt, i, v), "bind");
    return *this;
}
Statement& Statement::bind(int i, double v) {
    check(sqlite3_bind_double(m_stmt, i, v), "bind");
    return *this;
}
Statement& Statement::bind(int i, std::string_view t) {
    check(sqlite3_bind_text(m_stmt, i, t.data(), static_cast<int>(t.size()), SQLITE_TRANSIENT), "bind");
    return *this;
}
namespace {
// An empty span may have no data pointer, and SQLite binds a null pointer as NULL, not as an empty
// blob: a zero-length blob is bound as such.
int bindBlobAs(sqlite3_stmt* stmt, int i, std::span<const std::byte> b, sqlite3_destructor_type keep) {
    return b.empty() ? sqlite3_bind_zeroblob(stmt, i, 0) : sqlite3_bind_blob64(stmt, i, b.data(), b.size(), keep);
}
} // namespace
Statement& Statement::bindBlob(int i, std::span<const std::byte> b) {
    check(bindBlobAs(m_stmt, i, b, SQLITE_TRANSIENT), "bind");
    return *this;
}
Statement& Statement::bindBlobInPlace(int i, std::span<const std::byte> b) {
    check(bindBlobAs(m_stmt, i, b, SQLITE_STATIC), "bind");
    return *this;
}
Statement& Statement::bindNull(int i) {
    check(sqlite3_bind_null(m_stmt, i), "bind");
    return *this;
}

bool Statement::step() {
    const int rc = sqlite3_step(m_stmt);
    if (rc == SQLITE_ROW) return true;
    if (rc == SQLITE_DONE) return false;
    throw StorageException{m_db->errorFrom(rc, "statement failed")};
}

void Statement::run() {
    while (step()) {}
}

void Statement::reset() {
    sqlite3_reset(m_stmt);
    sqlite3_clear_bindings(m_stmt);
}

bool Statement::isNull(int c) const { return sqlite3_column_type(m_stmt, c) == SQLITE_NULL; }
std::int64_t Statement::integer(int c) const { return sqlite3_column_int64(m_stmt, c); }
double Statement::real(int c) const { return sqlite3_column_double(m_stmt, c); }
std::string Statement::text(int c) const {
    const auto* p = sqlite3_column_text(m_stmt, c);
    return p ? std::string(reinterpret_cast<const char*>(p), static_cast<std::size_t>(sqlite3_column_bytes(m_stmt, c))) : std::string();
}
std::vector<std::byte> Statement::blob(int c) const {
    const auto* p = static_cast<const std::byte*>(sqlite3_column_blob(m_stmt, c));
    const auto n = static_cast<std::size_t>(sqlite3_column_bytes(m_stmt, c));
    return p ? std::vector<std::byte>(p, p + n) : std::vector<std::byte>();
}
std::optional<double> Statement::optionalReal(int c) const {
    if (isNull(c)) return std::nullopt;
    return real(c);
}
std::optional<std::int64_t> Statement::optionalInteger(int c) const {
    if (isNull(c)) return std::nullopt;
    return integer(c);
}

void removeFilesBeside(const std::filesystem::path& db) {
    std::error_code ec;
    for (const char* suffix : kFilesBesideDatabase) std::filesystem::remove(db.string() + suffix, ec);
}

void removeDatabaseFiles(const std::filesystem::path& db) {
    std::error_code ec;
    std::filesystem::remove(db, ec);
    removeFilesBeside(db);
}

Transaction::Transaction(Database& db) : m_db(db) { m_db.execute("BEGIN IMMEDIATE"); }

Transaction::~Transaction() {
    if (!m_done) {
        try {
            m_db.execute("ROLLBACK");
        } catch (...) {
            // The connection is already rolled back (e.g. after SQLITE_FULL); nothing to undo.
        }
    }
}

void Transaction::commit() {
    m_db.execute("COMMIT");
    m_done = true;
}

SoleWriterJournal::SoleWriterJournal(Database& db) : m_db(db) {
    // Inside a transaction (or with a statement left mid-row) the mode cannot change.
    if (!sqlite3_get_autocommit(m_db.handle())) return;
    try {
        if (journalModePragma(m_db, "PRAGMA journal_mode = DELETE") != "delete") return;
    } catch (const StorageException&) {
        // Refused: SQLITE_BUSY when another connection has the store open (the usual case),
        // or any other reason. The log is always correct, only slower for this write.
        return;
    }
    try {
        m_db.execute("PRAGMA synchronous = EXTRA");
        m_taken = true;
    } catch (const StorageException&) {
        // Without EXTRA the journal would not be durable across a power cut: back to the log (no
        // destructor runs for a constructor that throws, so this one gives it back itself).
        try {
            journalModePragma(m_db, "PRAGMA journal_mode = WAL");
        } catch (...) {
            // Left in rollback mode: correct, and the next open for writing restores the log.
        }
    }
}

namespace {

#ifdef __linux__
bool isFile(int fd, const struct stat& target) {
    struct stat st {};
    return ::fstat(fd, &st) == 0 && st.st_dev == target.st_dev && st.st_ino == target.st_ino;
}

// The descriptor SQLite has open on the file `target` describes, found among /proc/self/fd, or -1.
// SQLite's own, used and never closed: closing any descriptor of a file drops every POSIX lock the
// process holds on it, SQLite's locks included (so no descriptor of our own is opened and closed).
int descriptorOpenOn(const struct stat& target) noexcept {
    DIR* dir = ::opendir("/proc/self/fd");
    if (!dir) return -1;
    const int own = ::dirfd(dir);
    int found = -1;
    while (const dirent* entry = ::readdir(dir)) {
        char* end = nullptr;
        const long fd = std::strtol(entry->d_name, &end, 10);
        if (end == entry->d_name || *end != '\0' || fd == own) continue;
        if (isFile(static_cast<int>(fd), target)) {
            found = static_cast<int>(fd);
            break;
        }
    }
    ::closedir(dir);
    return found;
}
#endif

} // namespace

bool SoleWriterJournal::startWriteBack() noexcept {
#ifdef __linux__
    if (!m_taken) return false;
    // SQLite's own name for the file (absolute, whatever the working folder is now).
    const char* file = sqlite3_db_filename(m_db.handle(), "main");
    struct stat target {};
    if (!file || !*file || ::stat(file, &target) != 0) return false;
    // The number found last time, if it still names this file (SQLite may have closed it and the
    // number gone to another file since).
    if (m_descriptor < 0 || !isFile(m_descriptor, target)) m_descriptor = descriptorOpenOn(target);
    return m_descriptor >= 0 && ::sync_file_range(m_descriptor, 0, 0, SYNC_FILE_RANGE_WRITE) == 0;
#else
    return false;
#endif
}

SoleWriterJournal::~SoleWriterJournal() {
    if (!m_taken) return;
    // Each on its own: a failure of the first must not leave the connection at EXTRA.
    try {
        journalModePragma(m_db, "PRAGMA journal_mode = WAL");
    } catch (...) {
        // Still a rollback journal (e.g. a connection opened meanwhile holds a read lock):
        // correct, only without concurrent readers; the next open for writing restores the log.
    }
    try {
        m_db.execute("PRAGMA synchronous = NORMAL");
    } catch (...) {
        // Only the connection's setting; it goes with the connection.
    }
}

} // namespace humwise::storage
