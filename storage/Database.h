#pragma once
// RAII wrappers around the SQLite C API. No SQL string is ever built from user data: every
// value goes through Statement::bind. Foreign keys are on, the journal is WAL and a busy timeout
// lets a second process read while one writes.
//
// Thread safety: one Database object per thread (SQLite connections are not shared here).

#include "storage/StorageError.h"

#include <cstdint>
#include <filesystem>
#include <map>
#include <memory>
#include <optional>
#include <span>
#include <string>
#include <string_view>
#include <vector>

struct sqlite3;
struct sqlite3_stmt;

namespace humwise::storage {

class Statement;

class Database {
public:
    enum class Mode { ReadWrite, ReadWriteCreate, ReadOnly };

    // Opens (and with ReadWriteCreate creates) the database; throws StorageException.
    Database(const std::filesystem::path& path, Mode mode = Mode::ReadWriteCreate, int busyTimeoutMs = 5000);
    ~Database();
    Database(const Database&) = delete;
    Database& operator=(const Database&) = delete;

    const std::filesystem::path& path() const { return m_path; }
    Statement prepare(std::string_view sql);
    // A prepared statement kept for the life of the connection, reset and unbound, for hot
    // paths (bulk inserts, lookups). Do not hold two uses of the same SQL at once.
    Statement& cached(const char* sql);
    void execute(std::string_view sql);       // statements without parameters or results (DDL, PRAGMA)
    std::int64_t lastInsertId() const;
    int changes() const;
    // The connection's journal mode as SQLite names it ("wal", "delete", ...).
    std::string journalMode();
    sqlite3* handle() { return m_db; }

    // The SQLite error of the connection as a StorageError naming the database.
    StorageError errorFrom(int rc, std::string_view what) const;

private:
    sqlite3* m_db = nullptr;
    std::filesystem::path m_path;
    std::map<std::string, std::unique_ptr<Statement>, std::less<>> m_cache;
};

class Statement {
public:
    Statement(Database& db, sqlite3_stmt* stmt) : m_db(&db), m_stmt(stmt) {}
    ~Statement();
    Statement(Statement&& other) noexcept;
    Statement& operator=(Statement&&) = delete;
    Statement(const Statement&) = delete;

    // Parameters are 1-based, as in SQLite.
    Statement& bind(int index, std::int64_t value);
    Statement& bind(int index, int value) { return bind(index, static_cast<std::int64_t>(value)); }
    Statement& bind(int index, double value);
    Statement& bind(int index, std::string_view text);
    Statement& bind(int index, const char* text) { return bind(index, std::string_view(text)); }
    Statement& bind(int index, const std::string& text) { return bind(index, std::string_view(text)); }
    Statement& bindBlob(int index, std::span<const std::byte> bytes);
    // Without SQLite's copy (SQLITE_STATIC), for large blobs: the bytes must stay valid until this
    // statement is gone or the parameter is bound again.
    Statement& bindBlobInPlace(int index, std::span<const std::byte> bytes);
    Statement& bindNull(int index);
    template <class T>
    Statement& bind(int index, const std::optional<T>& v) { return v ? bind(index, *v) : bindNull(index); }

    bool step();   // true while a row is available; throws StorageException on error
    void run();    // step() to completion, for statements without rows
    void reset();  // ready to bind and step again

    bool isNull(int column) const;
    std::int64_t integer(int column) const;
    double real(int column) const;
    std::string text(int column) const;
    std::vector<std::byte> blob(int column) const;
    std::optional<double> optionalReal(int column) const;
    std::optional<std::int64_t> optionalInteger(int column) const;

private:
    void check(int rc, std::string_view what);
    Database* m_db;
    sqlite3_stmt* m_stmt;
};

// The files SQLite keeps beside a database file: the write-ahead log and its index, and the
// rollback journal of a write in progress or cut off (SoleWriterJournal below). Whatever copies,
// moves or removes a store handles them with it: a stale journal beside a new file of the same
// name would be rolled back into it at its first open.
inline constexpr const char* kFilesBesideDatabase[] = {"-wal", "-shm", "-journal"};
// Removes those files beside `db` (not `db` itself); errors are ignored (a file not there).
void removeFilesBeside(const std::filesystem::path& db);
// Removes `db` and the files beside it; errors are ignored.
void removeDatabaseFiles(const std::filesystem::path& db);

// BEGIN IMMEDIATE ... COMMIT, rolled back by the destructor unless committed.
class Transaction {
public:
    explicit Transaction(Database& db);
    ~Transaction();
    void commit();
    Transaction(const Transaction&) = delete;
    Transaction& operator=(const Transaction&) = delete;

private:
    Database& m_db;
    bool m_done = false;
};

// A rollback journal instead of the write-ahead log for one large write on a store that no
// other connection has open; taken before the transaction begins, given back after it ends.
//
// Why: in WAL mode every page a transaction writes goes into the log, and again into the
// database file at the checkpoint that follows a large commit. With a rollback journal, pages
// past the end of the file at the start of the transaction (and free-list leaves) are written
// once, straight into the file; only pages that held data are first copied into the journal
// (SQLite source, doc/pager-invariants.txt: "overwriteable" pages). SQLite's own advice: WAL
// "does not work well for very large transactions"; beyond about 100 MB a rollback journal is
// likely faster (https://www.sqlite.org/wal.html, "Performance Considerations"). A walkdown's
// import appends hundreds of megabytes of raw files: measured in bench/README.md.
//
// The price: once the transaction has written into the file, no other connection can read
// until it commits: one opened meanwhile waits for its busy timeout, then fails as "locked"
// (an import usually takes longer). So the switch is made only when SQLite grants it, which is
// when no other connection has the store open, and only outside a transaction; otherwise
// taken() is false and the write goes through the log as usual, readers carrying on. While a
// journal exists the store's file alone is not consistent: a copy must take the -journal beside
// it along (or be made with the backup API), and the journal must never be deleted by hand.
// Synchronous EXTRA while it lasts: FULL syncs the journal before the file is written and the
// file before the commit, and EXTRA also syncs the folder once the journal is deleted (the
// deletion is the commit), so that a power cut right after the commit cannot bring the journal
// back and undo the round (https://www.sqlite.org/pragma.html#pragma_synchronous). If the
// process dies inside the transaction, the journal left beside the store is rolled back by the
// next connection that opens it for writing, which also puts the log back (Database's
// constructor); a read-only connection cannot, and says so.
class SoleWriterJournal {
public:
    explicit SoleWriterJournal(Database& db); // never throws for a store in use: taken() is false
    ~SoleWriterJournal();                     // the log and synchronous NORMAL again; never throws
    SoleWriterJournal(const SoleWriterJournal&) = delete;
    SoleWriterJournal& operator=(const SoleWriterJournal&) = delete;
    bool taken() const { return m_taken; }

    // While taken: asks the system to start writing to the disk what the transaction has written
    // into the database file so far, without waiting for it (Linux: sync_file_range with
    // SYNC_FILE_RANGE_WRITE on the descriptor SQLite has open on the file). The commit syncs the
    // file and would otherwise find the whole round still to write: the writer asks after each
    // motor, and the disk works while the analysis goes on. Durability is unchanged (the commit
    // still syncs; SQLite expects any page it writes to reach the disk at any time). Returns
    // whether it was asked: false when not taken, elsewhere than Linux, or when the descriptor is
    // not found. Never throws.
    bool startWriteBack() noexcept;

private:
    Database& m_db;
    bool m_taken = false;
    [[maybe_unused]] int m_descriptor = -1; // SQLite's descriptor on the file, found at a write-back (Linux)
};

} // namespace humwise::storage
