// The rollback journal for one large write on a store nobody else has open (Database.h,
// SoleWriterJournal): taken only when SQLite grants it, the log back afterwards, a rolled-back
// write leaves the file as it was, and a process killed inside the write leaves a journal that
// the next connection opening for writing rolls back (a read-only one says what to do).
#include "storage/Database.h"
#include "support/StorePaths.h"
#include "support/TestSupport.h"

#include <gtest/gtest.h>

#include <fcntl.h>
#include <sys/wait.h>
#include <unistd.h>

#include <cstddef>
#include <filesystem>
#include <iterator>
#include <string>
#include <vector>

namespace humwise::storage {
namespace {

namespace fs = std::filesystem;

fs::path freshPath(const std::string& name) { return test::freshDatabasePath("storage", name); }

// A store with 16 KiB pages in WAL mode (as Database opens it) holding one small row.
void makeStore(const fs::path& p) {
    Database db(p);
    db.execute("CREATE TABLE raw(id INTEGER PRIMARY KEY, bytes BLOB NOT NULL)");
    db.execute("INSERT INTO raw(bytes) VALUES (x'0102')");
}

std::int64_t rowCount(Database& db) {
    auto s = db.prepare("SELECT COUNT(*) FROM raw");
    s.step();
    return s.integer(0);
}

// Blobs of `bytes` each: far more than SQLite's page cache, so pages spill to the file mid-way.
void insertBlobs(Database& db, int count, std::size_t bytes) {
    const std::vector<std::byte> blob(bytes, std::byte{0x5a});
    auto s = db.prepare("INSERT INTO raw(bytes) VALUES (?1)");
    for (int i = 0; i < count; ++i) {
        s.bindBlob(1, blob).run();
        s.reset();
    }
}

// SoleWriterJournal::startWriteBack asks the system only on Linux.
#ifdef __linux__
constexpr bool kWriteBackAvailable = true;
#else
constexpr bool kWriteBackAvailable = false;
#endif

// SQLite's own check of the whole file: "ok", or what it found.
std::string integrityCheck(Database& db) {
    auto check = db.prepare("PRAGMA integrity_check");
    return check.step() ? check.text(0) : "no answer";
}

// PRAGMA synchronous as SQLite numbers it: 1 NORMAL, 2 FULL, 3 EXTRA.
std::int64_t synchronousLevel(Database& db) {
    auto s = db.prepare("PRAGMA synchronous");
    s.step();
    return s.integer(0);
}

std::uintmax_t sizeOr0(const fs::path& p) {
    std::error_code ec;
    const auto n = fs::file_size(p, ec);
    return ec ? 0 : n;
}

// bindBlobInPlace hands SQLite the caller's bytes without a copy: what is stored is exactly
// them, large (overflow pages) or empty (an empty blob, not NULL), and a bound parameter can be
// bound again. bindBlob stores an empty blob as empty too.
TEST(Statement, BlobBoundInPlaceIsStoredExactly) {
    const auto p = freshPath("blob-in-place.db");
    makeStore(p);
    Database db(p);
    std::vector<std::byte> big(700 * 1024 + 13);
    for (std::size_t i = 0; i < big.size(); ++i) big[i] = static_cast<std::byte>((i * 131u + 7u) % 251u);
    const std::vector<std::byte> empty;
    {
        auto s = db.prepare("INSERT INTO raw(id, bytes) VALUES (?1, ?2)");
        s.bind(1, 10).bindBlobInPlace(2, big).run();
        s.reset();
        s.bind(1, 11).bindBlobInPlace(2, empty).run();
    }
    auto read = db.prepare("SELECT bytes FROM raw WHERE id = ?1");
    ASSERT_TRUE(read.bind(1, 10).step());
    EXPECT_EQ(read.blob(0), big);
    read.reset();
    ASSERT_TRUE(read.bind(1, 11).step());
    EXPECT_TRUE(read.blob(0).empty());
    db.prepare("INSERT INTO raw(id, bytes) VALUES (12, ?1)").bindBlob(1, empty).run();
    auto type = db.prepare("SELECT typeof(bytes) FROM raw WHERE id IN (11, 12)");
    for (int row = 0; row < 2; ++row) {
        ASSERT_TRUE(type.step());
        EXPECT_EQ(type.text(0), "blob");
    }
}

TEST(SoleWriterJournal, TakenWhenAloneWritesOnceAndGivesTheLogBack) {
    const auto p = freshPath("sole-alone.db");
    makeStore(p);
    Database db(p);
    ASSERT_EQ(db.journalMode(), "wal");
    {
        SoleWriterJournal journal(db);
        ASSERT_TRUE(journal.taken());
        EXPECT_EQ(db.journalMode(), "delete");
        EXPECT_EQ(synchronousLevel(db), 3) << "the commit must survive a power cut: EXTRA";
        Transaction tx(db);
        insertBlobs(db, 40, 256 * 1024); // 10 MiB
        tx.commit();
        // The pages went into the file, not into a log (none is left to checkpoint).
        EXPECT_EQ(sizeOr0(p.string() + "-wal"), 0u);
        EXPECT_FALSE(fs::exists(p.string() + "-journal"));
        EXPECT_GT(sizeOr0(p), 10u * 1024 * 1024);
    }
    EXPECT_EQ(db.journalMode(), "wal");
    EXPECT_EQ(synchronousLevel(db), 1);
    EXPECT_EQ(rowCount(db), 41);
    EXPECT_EQ(integrityCheck(db), "ok");
}

TEST(SoleWriterJournal, RefusedWhileAnotherConnectionHasTheStoreOpenAndReadersCarryOn) {
    const auto p = freshPath("sole-shared.db");
    makeStore(p);
    Database reader(p, Database::Mode::ReadOnly);
    ASSERT_EQ(rowCount(reader), 1);
    Database db(p);
    SoleWriterJournal journal(db);
    EXPECT_FALSE(journal.taken());
    EXPECT_EQ(db.journalMode(), "wal");
    Transaction tx(db);
    insertBlobs(db, 40, 256 * 1024);
    EXPECT_FALSE(journal.startWriteBack()) << "only asked for a write through the rollback journal";
    // Through the log, the other connection still reads the last committed state meanwhile.
    EXPECT_EQ(rowCount(reader), 1);
    tx.commit();
    EXPECT_EQ(rowCount(reader), 41);
}

TEST(SoleWriterJournal, NotTakenInsideATransaction) {
    const auto p = freshPath("sole-in-tx.db");
    makeStore(p);
    Database db(p);
    Transaction tx(db);
    SoleWriterJournal journal(db);
    EXPECT_FALSE(journal.taken());
    EXPECT_EQ(db.journalMode(), "wal");
    insertBlobs(db, 1, 1024);
    tx.commit();
    EXPECT_EQ(rowCount(db), 2);
}

TEST(SoleWriterJournal, RolledBackWriteLeavesTheFileAsItWas) {
    const auto p = freshPath("sole-rollback.db");
    makeStore(p);
    const auto before = sizeOr0(p);
    Database db(p);
    {
        SoleWriterJournal journal(db);
        ASSERT_TRUE(journal.taken());
        Transaction tx(db);
        insertBlobs(db, 40, 256 * 1024);
        db.execute("DELETE FROM raw WHERE id = 1"); // a page that held data: journaled, restored
        EXPECT_GT(sizeOr0(p), before);              // spilled into the file already
        // Pages sent to the disk early are rolled back all the same (the journal holds what they
        // replaced): the rollback does not depend on when they reached it.
        EXPECT_EQ(journal.startWriteBack(), kWriteBackAvailable);
    } // not committed: rolled back
    EXPECT_EQ(db.journalMode(), "wal");
    EXPECT_EQ(rowCount(db), 1);
    EXPECT_LE(sizeOr0(p), before);
}

TEST(SoleWriterJournal, ConnectionOpenedDuringTheWriteWaitsThenSaysLocked) {
    const auto p = freshPath("sole-busy.db");
    makeStore(p);
    Database db(p);
    SoleWriterJournal journal(db);
    ASSERT_TRUE(journal.taken());
    Transaction tx(db);
    insertBlobs(db, 40, 256 * 1024); // spilled: the writer holds the file exclusively
    try {
        Database late(p, Database::Mode::ReadWrite, 200);
        rowCount(late);
        FAIL() << "a connection opened during the write read the store";
    } catch (const StorageException& e) {
        EXPECT_EQ(e.error.code, StorageError::Code::Busy) << e.error.message;
        EXPECT_NE(e.error.message.find("locked by another process"), std::string::npos) << e.error.message;
        EXPECT_NE(e.error.message.find(p.filename().string()), std::string::npos) << e.error.message;
    }
    tx.commit();
    Database late(p, Database::Mode::ReadWrite, 200);
    EXPECT_EQ(rowCount(late), 41);
}

std::size_t openDescriptors() {
    return static_cast<std::size_t>(std::distance(fs::directory_iterator("/proc/self/fd"), fs::directory_iterator{}));
}

// startWriteBack uses SQLite's own descriptor and closes none: a descriptor of the file opened
// and closed beside SQLite's would drop the process's POSIX locks on it, and another process
// could read a half-written round (checked: with such a descriptor this test fails). The lock holds, the round commits whole, no
// descriptor is left behind.
TEST(SoleWriterJournal, WriteBackMidWriteKeepsTheLockAndTheRound) {
    if (!fs::exists("/proc/self/fd")) GTEST_SKIP() << "no /proc/self/fd to count descriptors on this system";
    const auto p = freshPath("sole-writeback.db");
    makeStore(p);
    const std::size_t before = openDescriptors();
    {
        Database db(p);
        SoleWriterJournal journal(db);
        ASSERT_TRUE(journal.taken());
        Transaction tx(db);
        insertBlobs(db, 20, 256 * 1024);
        EXPECT_EQ(journal.startWriteBack(), kWriteBackAvailable);
        insertBlobs(db, 20, 256 * 1024);
        EXPECT_EQ(journal.startWriteBack(), kWriteBackAvailable);
        // Another process still sees the writer's lock on the file. Asked of the system with
        // F_GETLK over the lock bytes (512 from 2^30: https://www.sqlite.org/fileformat.html,
        // "The Lock-Byte Page"), not through SQLite: a forked child inherits SQLite's own record
        // of this process's locks and would answer "locked" from it when the system holds none.
        const pid_t pid = fork();
        ASSERT_GE(pid, 0);
        if (pid == 0) {
            const int fd = ::open(p.c_str(), O_RDONLY);
            if (fd < 0) _exit(2);
            struct flock probe {};
            probe.l_type = F_WRLCK;
            probe.l_whence = SEEK_SET;
            probe.l_start = 0x40000000;
            probe.l_len = 512;
            if (::fcntl(fd, F_GETLK, &probe) != 0) _exit(3);
            _exit(probe.l_type == F_UNLCK ? 1 : 0);
        }
        int status = 0;
        ASSERT_EQ(waitpid(pid, &status, 0), pid);
        ASSERT_TRUE(WIFEXITED(status));
        EXPECT_EQ(WEXITSTATUS(status), 0) << "1: the writer holds no lock on the file any more; 2: the child could not "
                                             "open the file; 3: F_GETLK failed";
        tx.commit();
    }
    EXPECT_EQ(openDescriptors(), before);
    Database db(p);
    EXPECT_EQ(rowCount(db), 41);
    EXPECT_EQ(integrityCheck(db), "ok");
}

TEST(SoleWriterJournal, KilledInsideTheWriteIsRolledBackByTheNextWriterOpen) {
    const auto p = freshPath("sole-killed.db");
    makeStore(p);
    const pid_t pid = fork();
    ASSERT_GE(pid, 0);
    if (pid == 0) {
        // The child dies inside the transaction, with pages already in the file.
        try {
            Database db(p);
            SoleWriterJournal journal(db);
            if (!journal.taken()) _exit(3);
            Transaction tx(db);
            db.execute("DELETE FROM raw");
            insertBlobs(db, 40, 256 * 1024);
            _exit(0); // no destructor runs: as a kill -9 would leave it
        } catch (...) {
            _exit(4);
        }
    }
    int status = 0;
    ASSERT_EQ(waitpid(pid, &status, 0), pid);
    ASSERT_TRUE(WIFEXITED(status));
    ASSERT_EQ(WEXITSTATUS(status), 0) << "the child could not take the journal or write";
    ASSERT_TRUE(fs::exists(p.string() + "-journal")) << "no journal was left to roll back";

    // Read-only: cannot roll back; the error says what happened and what to do.
    try {
        Database ro(p, Database::Mode::ReadOnly);
        rowCount(ro);
        FAIL() << "a read-only connection read past a journal it cannot roll back";
    } catch (const StorageException& e) {
        EXPECT_NE(e.error.message.find("interrupted"), std::string::npos) << e.error.message;
        EXPECT_NE(e.error.message.find("which open it for writing"), std::string::npos) << e.error.message;
    }
    // Opening for writing rolls it back and restores the log.
    Database db(p);
    EXPECT_EQ(db.journalMode(), "wal");
    EXPECT_EQ(rowCount(db), 1);
    EXPECT_EQ(integrityCheck(db), "ok");
    EXPECT_FALSE(fs::exists(p.string() + "-journal"));
}

} // namespace
} // namespace humwise::storage
