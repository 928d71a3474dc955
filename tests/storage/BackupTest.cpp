// Backup and restore (storage/Backup.h) and the `db backup` / `db restore` commands
// (app/cli/BackupCommand.h): a backup restores to the same data, row for row and value for
// value; backing up the restored store gives the same bytes as the first backup; a broken,
// foreign or newer backup is refused with a clear message and the target left untouched; the
// backup is taken while another connection writes, and holds only committed data.
#include "app/cli/BackupCommand.h"
#include "app/cli/CliError.h"
#include "core/io/WavTestWriter.h"
#include "storage/Backup.h"
#include "storage/FleetStore.h"
#include "support/TestSupport.h"
#include "workflow/FixtureFleet.h"

#include <gtest/gtest.h>

#include <sys/wait.h>
#include <unistd.h>

#include <cstring>
#include <functional>
#include <filesystem>
#include <fstream>
#include <iterator>
#include <random>
#include <sstream>

namespace humwise::storage {
namespace {

namespace fs = std::filesystem;
using Code = StorageError::Code;

fs::path dir() {
    const fs::path d = test::outputDir() / "storage" / "backup";
    fs::create_directories(d);
    return d;
}

fs::path fresh(const std::string& name) {
    const fs::path p = dir() / name;
    for (const char* suffix : {"", "-wal", "-shm", "-journal", ".part", ".before-restore", ".before-restore-wal", ".before-restore-journal"})
        fs::remove(p.string() + suffix);
    return p;
}

std::vector<char> bytesOf(const fs::path& p) {
    std::ifstream in(p, std::ios::binary);
    return {std::istreambuf_iterator<char>(in), std::istreambuf_iterator<char>()};
}

// A store with something in every table: the fleet, two rounds with raw files large enough
// for overflow pages, recordings, a spectrum, indicators, a finding, an alarm limit, and the
// free pages a deleted round leaves behind.
fs::path populatedStore(const std::string& name, int rounds = 2) {
    const fs::path p = fresh(name);
    auto s = FleetStore::open(p);
    Transaction tx(s->database());
    s->saveFleet(test::smallFleet());
    std::mt19937_64 rng(42);
    for (int r = 0; r <= rounds; ++r) {
        RoundRow round;
        round.route = "Monthly";
        round.startedAt = "2026-0" + std::to_string(r + 1) + "-02T08:00:00.000Z";
        round.technician = "technician 1";
        round.manifestHash = "hash-" + std::to_string(r);
        round.importedAt = "2026-05-01T00:00:00.000Z";
        const auto id = s->insertRound(round);
        std::vector<std::byte> raw(70000 + static_cast<std::size_t>(r) * 1000);
        for (auto& b : raw) b = static_cast<std::byte>(rng() & 0xff);
        const std::string hash = "file-" + std::to_string(r);
        s->storeSourceFile(hash, raw);
        RecordingRow rec;
        rec.roundId = id;
        rec.motorTag = "P-1";
        rec.pointName = "DE-H";
        rec.recordedAt = round.startedAt;
        rec.sampleRateHz = 12800;
        rec.sampleCount = 25600;
        rec.fileName = "P-1/DE-H.wav";
        rec.fileHash = hash;
        rec.fileFormat = "wav";
        rec.unit = "g";
        rec.speedRpm = 1476.25 + r;
        const auto recId = s->insertRecording(rec);
        SpectrumRow sp;
        sp.recordingId = recId;
        sp.kind = "velocity";
        sp.quantity = "velocity";
        sp.unit = "m/s";
        sp.scale = "rms";
        sp.window = "hann";
        sp.resolutionHz = 0.25;
        for (int i = 0; i < 3200; ++i) sp.values.push_back(static_cast<float>(1e-3 / (1 + i)));
        s->insertSpectrum(sp);
        s->insertRoundMotor({id, "P-1", 50.0, "current", 1476.0 + r, "1X", 0.9, 0.016, 80.0, 1, "note"});
        s->insertIndicator(id, {"P-1", "DE-H", "velocity_rms", 0.1 + 0.7 * r, "mm/s"});
        s->insertIndicator(id, {"P-1", "", "slip", 1.0 / 3.0, ""});
        diagnosis::Finding f;
        f.fault = "unbalance";
        f.severity = r % 4;
        f.origin = diagnosis::Origin::Mechanical;
        f.confidence = 0.8;
        f.rule = "vib.unbalance/1";
        f.explanation = "1X is high";
        f.action = "balance";
        s->insertFinding(id, "P-1", f);
    }
    AlarmLimitRow a;
    a.motorTag = "P-1";
    a.pointName = "DE-H";
    a.indicator = "velocity_rms";
    a.method = "absolute";
    a.alert = 2.8;
    a.alarm = 4.5;
    a.source = "ISO 20816-3 group 2 rigid";
    a.updatedAt = "2026-03-01T00:00:00Z";
    s->setAlarmLimit(a);
    tx.commit();
    Transaction del(s->database());
    s->deleteRound(s->rounds().front().id); // frees pages: the freelist is copied too
    del.commit();
    EXPECT_TRUE(s->checkConsistency().empty());
    return p;
}

// Every row of every table (and the schema itself), each value with its SQLite type and its
// exact content (reals by their bit pattern, blobs byte by byte), tables by name, rows by rowid.
std::vector<std::string> dump(Database& db) {
    std::vector<std::string> out;
    auto version = db.prepare("PRAGMA user_version");
    version.step();
    out.push_back("user_version " + std::to_string(version.integer(0)));
    std::vector<std::string> tables;
    auto schema = db.prepare("SELECT type, name, IFNULL(sql, '') FROM sqlite_schema ORDER BY name");
    while (schema.step()) {
        out.push_back(schema.text(0) + " " + schema.text(1) + ": " + schema.text(2));
        if (schema.text(0) == "table" && schema.text(1).rfind("sqlite_", 0) != 0) tables.push_back(schema.text(1));
    }
    for (const auto& t : tables) {
        std::vector<std::string> columns;
        auto info = db.prepare("SELECT name FROM pragma_table_info(?1) ORDER BY cid");
        info.bind(1, t);
        while (info.step()) columns.push_back(info.text(0));
        // Table and column names come from sqlite_schema of the test's own store, not from users.
        std::string sql = "SELECT rowid";
        for (const auto& c : columns) sql += ", typeof(\"" + c + "\"), \"" + c + "\"";
        sql += " FROM \"" + t + "\" ORDER BY rowid";
        auto rows = db.prepare(sql);
        std::size_t n = 0;
        while (rows.step()) {
            std::string row = t + " #" + std::to_string(rows.integer(0));
            for (int i = 0; i < static_cast<int>(columns.size()); ++i) {
                const std::string type = rows.text(1 + 2 * i);
                const int c = 2 + 2 * i;
                row += " | " + type + ":";
                if (type == "integer") row += std::to_string(rows.integer(c));
                if (type == "text") row += rows.text(c);
                if (type == "real") {
                    const double d = rows.real(c);
                    std::uint64_t bits = 0;
                    std::memcpy(&bits, &d, sizeof bits);
                    row += std::to_string(bits);
                }
                if (type == "blob") {
                    const auto b = rows.blob(c);
                    row += std::to_string(b.size()) + ":";
                    for (std::byte x : b) row += static_cast<char>(x);
                }
            }
            out.push_back(std::move(row));
            ++n;
        }
        out.push_back(t + ": " + std::to_string(n) + " row(s)");
    }
    return out;
}

std::vector<std::string> dumpFile(const fs::path& p) {
    Database db(p, Database::Mode::ReadOnly);
    return dump(db);
}

Code codeOf(const std::function<void()>& f, std::string* message = nullptr) {
    try {
        f();
    } catch (const StorageException& e) {
        if (message) *message = e.error.message;
        return e.error.code;
    }
    ADD_FAILURE() << "no StorageException";
    return Code::Internal;
}

TEST(Backup, RestoredStoreHoldsTheSameDataAndBacksUpToTheSameBytes) {
    const fs::path original = populatedStore("original.db");
    const auto before = dumpFile(original);
    ASSERT_GT(before.size(), 20u);

    const fs::path first = fresh("first.backup");
    {
        auto store = FleetStore::open(original, false);
        backupDatabase(store->database(), first);
    }
    EXPECT_FALSE(fs::exists(first.string() + ".part"));
    EXPECT_FALSE(fs::exists(first.string() + "-journal"));
    EXPECT_FALSE(fs::exists(first.string() + "-wal"));
    EXPECT_EQ(dumpFile(first), before);

    const fs::path restored = fresh("restored.db");
    restoreDatabase(first, restored);
    {
        auto store = FleetStore::open(restored, false); // the way the program opens it (WAL, migrations)
        EXPECT_EQ(dump(store->database()), before);
        EXPECT_TRUE(store->checkConsistency().empty());
        ASSERT_EQ(store->rounds().size(), 2u);
        EXPECT_EQ(store->sourceFile("file-2").size(), 72000u);
        const auto trend = store->trend("P-1", "DE-H", "velocity_rms");
        ASSERT_EQ(trend.size(), 2u);
        EXPECT_DOUBLE_EQ(trend[1].value, 0.1 + 0.7 * 2);

        // Bit-exact: the backup API copies page images, and backupDatabase leaves the copy in
        // the same (rollback-journal) mode every time, so the restored store backs up to the
        // very bytes of the first backup.
        const fs::path second = fresh("second.backup");
        backupDatabase(store->database(), second);
        const auto a = bytesOf(first), b = bytesOf(second);
        ASSERT_GT(a.size(), 200000u);
        EXPECT_EQ(a.size(), b.size());
        EXPECT_TRUE(a == b) << "the second backup differs from the first";
    }
}

TEST(Backup, TakesACommittedSnapshotWhileAnotherConnectionWrites) {
    const fs::path p = populatedStore("busy.db");
    const auto committed = dumpFile(p);
    auto writer = FleetStore::open(p, false);
    auto reader = FleetStore::open(p, false);
    Transaction tx(writer->database()); // holds the write lock during the backup
    RoundRow r;
    r.startedAt = "2026-09-01T08:00:00.000Z";
    r.manifestHash = "uncommitted";
    r.importedAt = r.startedAt;
    writer->insertRound(r);
    const fs::path b = fresh("busy.backup");
    backupDatabase(reader->database(), b);
    EXPECT_EQ(dumpFile(b), committed); // the uncommitted round is not in it
    tx.commit();
    EXPECT_EQ(writer->rounds().size(), 3u);
}

TEST(Backup, RefusesItselfAFolderAndAnOpenTransactionAndLeavesNothingBehind) {
    const fs::path p = populatedStore("refuse.db", 1);
    auto store = FleetStore::open(p, false);
    std::string msg;
    EXPECT_EQ(codeOf([&] { backupDatabase(store->database(), p); }, &msg), Code::Invalid);
    EXPECT_NE(msg.find("the database itself"), std::string::npos) << msg;
    EXPECT_EQ(codeOf([&] { backupDatabase(store->database(), dir()); }, &msg), Code::Invalid);
    EXPECT_NE(msg.find("is a folder"), std::string::npos) << msg;
    const fs::path target = fresh("refuse.backup");
    {
        Transaction tx(store->database());
        EXPECT_EQ(codeOf([&] { backupDatabase(store->database(), target); }, &msg), Code::Invalid);
        EXPECT_NE(msg.find("transaction"), std::string::npos) << msg;
    }
    EXPECT_FALSE(fs::exists(target));
    const fs::path nowhere = dir() / "no-such-folder" / "x.backup";
    EXPECT_EQ(codeOf([&] { backupDatabase(store->database(), nowhere); }, &msg), Code::CannotOpen);
    EXPECT_NE(msg.find("no-such-folder"), std::string::npos) << msg;
    EXPECT_FALSE(fs::exists(nowhere.string() + ".part"));
    EXPECT_TRUE(store->checkConsistency().empty());
}

TEST(Backup, ReplacesAnOldFileAndAStalePartFileWhole) {
    const fs::path p = populatedStore("replace.db", 1);
    const fs::path b = fresh("replace.backup");
    test::writeText(b, "an older backup that is not even a database");
    test::writeText(b.string() + ".part", "left by a backup that was killed");
    auto store = FleetStore::open(p, false);
    backupDatabase(store->database(), b);
    EXPECT_FALSE(fs::exists(b.string() + ".part"));
    EXPECT_EQ(dumpFile(b), dump(store->database()));
}

class RestoreRefuses : public ::testing::Test {
protected:
    void SetUp() override {
        // Names of their own: ctest runs the tests of this fixture in parallel processes.
        const std::string prefix = ::testing::UnitTest::GetInstance()->current_test_info()->name();
        target = populatedStore(prefix + "-target.db", 1);
        targetBefore = dumpFile(target);
        source = populatedStore(prefix + "-source.db", 2);
        auto s = FleetStore::open(source, false);
        good = fresh(prefix + "-good.backup");
        backupDatabase(s->database(), good);
    }
    // The refusal leaves the target exactly as it was.
    void expectRefused(const fs::path& backup, Code code, const std::string& words) {
        std::string msg;
        EXPECT_EQ(codeOf([&] { restoreDatabase(backup, target); }, &msg), code) << msg;
        EXPECT_NE(msg.find(words), std::string::npos) << msg;
        EXPECT_NE(msg.find(backup.filename().string()), std::string::npos) << msg;
        EXPECT_EQ(dumpFile(target), targetBefore);
    }
    fs::path target, source, good;
    std::vector<std::string> targetBefore;
};

TEST_F(RestoreRefuses, AMissingFileAndAFolder) {
    expectRefused(dir() / "no-such.backup", Code::NotFound, "no such backup file");
    const fs::path folder = dir() / "a-folder.backup";
    fs::create_directories(folder);
    expectRefused(folder, Code::Invalid, "not a file");
}

TEST_F(RestoreRefuses, RandomBytesAndATruncatedBackup) {
    const fs::path junk = fresh("junk.backup");
    std::vector<std::byte> bytes(8192);
    std::mt19937 rng(7);
    for (auto& b : bytes) b = static_cast<std::byte>(rng() & 0xff);
    test::writeBytes(junk, bytes);
    expectRefused(junk, Code::Corrupt, "file is not a database - nothing was changed");

    const fs::path cut = fresh("cut.backup");
    fs::copy_file(good, cut);
    fs::resize_file(cut, fs::file_size(good) / 2);
    expectRefused(cut, Code::Corrupt, "nothing was changed");
}

TEST_F(RestoreRefuses, ABackupWithACorruptPage) {
    const fs::path bad = fresh("corrupt.backup");
    auto bytes = bytesOf(good);
    ASSERT_GT(bytes.size(), 5u * 4096);
    // Garble the b-tree page headers of pages 2..5 (offset 0 of each page; page 1 keeps the
    // file header, so the file still opens and only the integrity check can tell).
    for (std::size_t page = 1; page <= 4; ++page)
        for (std::size_t i = 0; i < 12; ++i) bytes[page * 4096 + i] = static_cast<char>(0xA5);
    std::ofstream(bad, std::ios::binary).write(bytes.data(), static_cast<std::streamsize>(bytes.size()));
    expectRefused(bad, Code::Corrupt, "nothing was changed");
}

TEST_F(RestoreRefuses, ANewerSchemaAndAForeignDatabase) {
    const fs::path newer = fresh("newer.backup");
    fs::copy_file(good, newer);
    {
        Database db(newer, Database::Mode::ReadWrite);
        db.execute("PRAGMA user_version = 99");
    }
    expectRefused(newer, Code::TooNew, "schema version 99, newer than this Humwise");

    const fs::path foreign = fresh("foreign.backup");
    {
        Database db(foreign);
        db.execute("CREATE TABLE notes (id INTEGER PRIMARY KEY, text TEXT)");
    }
    expectRefused(foreign, Code::Invalid, "not a Humwise fleet store");
}

TEST_F(RestoreRefuses, TheTargetItself) {
    std::string msg;
    EXPECT_EQ(codeOf([&] { restoreDatabase(target, target); }, &msg), Code::Invalid);
    EXPECT_NE(msg.find("same file"), std::string::npos) << msg;
    EXPECT_EQ(dumpFile(target), targetBefore);
}

TEST_F(RestoreRefuses, NothingWhenTheBackupIsGoodAndReplacesTheTargetUnderAnOpenConnection) {
    auto open = FleetStore::open(target, false); // e.g. the workbench still running
    EXPECT_EQ(open->rounds().size(), 1u);
    restoreDatabase(good, target);
    EXPECT_EQ(open->rounds().size(), 2u); // the open connection sees the restored content
    EXPECT_EQ(dumpFile(target), dumpFile(source));
    EXPECT_TRUE(open->checkConsistency().empty());
}

TEST(Restore, IntoAMissingFolderFailsAndCreatesNothing) {
    const fs::path p = populatedStore("for-missing.db", 1);
    const fs::path b = fresh("for-missing.backup");
    {
        auto s = FleetStore::open(p, false);
        backupDatabase(s->database(), b);
    }
    const fs::path target = dir() / "missing-folder" / "fleet.db";
    std::string msg;
    EXPECT_EQ(codeOf([&] { restoreDatabase(b, target); }, &msg), Code::CannotOpen);
    EXPECT_NE(msg.find("missing-folder"), std::string::npos) << msg;
    EXPECT_FALSE(fs::exists(target));
}

// The usual reason for a restore: the store file was overwritten. It is no database any more, so
// it is replaced as a file (its stale -wal with it) and the result is the backup's content.
TEST(Restore, ReplacesAFileThatIsNoDatabaseAnyMore) {
    const fs::path p = populatedStore("for-trashed.db", 1);
    const fs::path b = fresh("for-trashed.backup");
    {
        auto s = FleetStore::open(p, false);
        backupDatabase(s->database(), b);
    }
    const fs::path target = fresh("trashed.db");
    test::writeText(target, std::string(5000, 'x'));
    test::writeText(target.string() + "-wal", "stale");
    test::writeText(target.string() + "-journal", "stale"); // would be rolled back into the restored file
    restoreDatabase(b, target);
    EXPECT_FALSE(fs::exists(target.string() + "-wal"));
    EXPECT_FALSE(fs::exists(target.string() + "-journal"));
    EXPECT_EQ(dumpFile(target), dumpFile(p));
    EXPECT_TRUE(FleetStore::open(target, false)->checkConsistency().empty());
}

// --- humwise-cli db backup / db restore, in process (main.cpp turns the exceptions into the
// exit codes: UsageError 2, ProcessingError 1).

TEST(DbBackupCommand, BacksUpAndRestoresWithTheirMessages) {
    const fs::path p = populatedStore("cli.db");
    const fs::path b = fresh("cli.backup");
    std::ostringstream out;
    EXPECT_EQ(cli::runDbBackup({"backup", b.string(), "--db", p.string()}, out), 0);
    EXPECT_NE(out.str().find("backed up to " + b.string()), std::string::npos) << out.str();
    EXPECT_NE(out.str().find("schema version " + std::to_string(kSchemaVersion)), std::string::npos) << out.str();
    EXPECT_FALSE(fs::exists(p.string() + "-wal")); // the store is left as tidy as it was
    const fs::path r = fresh("cli-restored.db");
    std::ostringstream out2;
    EXPECT_EQ(cli::runDbRestore({"--db", r.string(), "restore", b.string()}, out2), 0);
    EXPECT_NE(out2.str().find("restored from " + b.string()), std::string::npos) << out2.str();
    EXPECT_EQ(dumpFile(r), dumpFile(p));
    EXPECT_FALSE(fs::exists(r.string() + ".before-restore")); // there was nothing to keep
    // Over a trashed store: its bytes are kept as they were (no database to back up), then replaced.
    const std::string trash(6000, '#');
    test::writeText(r, trash);
    fs::remove(r.string() + "-wal");
    std::ostringstream out3;
    EXPECT_EQ(cli::runDbRestore({"restore", b.string(), "--db", r.string()}, out3), 0);
    EXPECT_NE(out3.str().find("kept in " + r.string() + ".before-restore"), std::string::npos) << out3.str();
    const auto kept = bytesOf(r.string() + ".before-restore");
    EXPECT_EQ(std::string(kept.begin(), kept.end()), trash);
    EXPECT_EQ(dumpFile(r), dumpFile(p));
}

// A store whose last write was cut off inside a rollback journal (an import that had the store
// to itself, killed): a read-only connection cannot roll it back, so the safety copy is made
// byte for byte, and it must take the journal along, or it would hold half of that write.
TEST(DbBackupCommand, KeepsAStoreInterruptedInsideItsJournalWithTheJournal) {
    const fs::path p = populatedStore("cli-interrupted.db", 1);
    const auto before = dumpFile(p);
    const fs::path b = fresh("cli-interrupted.backup");
    {
        auto s = FleetStore::open(p, false);
        backupDatabase(s->database(), b);
    }
    const pid_t pid = fork();
    ASSERT_GE(pid, 0);
    if (pid == 0) {
        try {
            Database db(p, Database::Mode::ReadWrite);
            SoleWriterJournal journal(db);
            if (!journal.taken()) _exit(3);
            Transaction tx(db);
            db.execute("DELETE FROM findings");
            db.execute("DELETE FROM indicators");
            const std::vector<std::byte> blob(8 << 20, std::byte{7}); // past SQLite's page cache
            db.prepare("INSERT INTO source_files(hash, size, bytes) VALUES ('interrupted', 1, ?1)").bindBlob(1, blob).run();
            _exit(0); // no destructor: the journal stays hot, as after a kill
        } catch (...) {
            _exit(4);
        }
    }
    int status = 0;
    ASSERT_EQ(waitpid(pid, &status, 0), pid);
    ASSERT_TRUE(WIFEXITED(status) && WEXITSTATUS(status) == 0) << "the child could not write inside the journal";
    ASSERT_TRUE(fs::exists(p.string() + "-journal"));

    std::ostringstream out;
    EXPECT_EQ(cli::runDbRestore({"restore", b.string(), "--db", p.string()}, out), 0) << out.str();
    const fs::path kept = p.string() + ".before-restore";
    ASSERT_TRUE(fs::exists(kept.string() + "-journal")) << "the safety copy left the journal behind";
    // Opened for writing, the copy rolls the cut-off write back: the store as it was before it.
    EXPECT_TRUE(FleetStore::open(kept, false)->checkConsistency().empty());
    EXPECT_FALSE(fs::exists(kept.string() + "-journal"));
    EXPECT_EQ(dumpFile(kept), before);
    EXPECT_EQ(dumpFile(p), before); // the restored store: the backup, taken before the write
}

TEST(DbBackupCommand, WrongCommandLinesAndBadFilesGiveTheirErrors) {
    const fs::path p = populatedStore("cli-errors.db", 1);
    std::ostringstream out;
    EXPECT_THROW(cli::runDbBackup({"backup", "--db", p.string()}, out), cli::UsageError);
    EXPECT_THROW(cli::runDbBackup({"backup", "a", "b", "--db", p.string()}, out), cli::UsageError);
    EXPECT_THROW(cli::runDbRestore({"restore", "--dbx", p.string()}, out), cli::UsageError);
    try {
        cli::runDbBackup({"backup", (dir() / "x.backup").string(), "--db", (dir() / "no-such.db").string()}, out);
        ADD_FAILURE() << "no error for a missing database";
    } catch (const cli::ProcessingError& e) {
        EXPECT_NE(std::string(e.what()).find("no-such.db: no such database"), std::string::npos) << e.what();
    }
    EXPECT_FALSE(fs::exists(dir() / "no-such.db"));
    const fs::path junk = fresh("cli-junk.backup");
    test::writeText(junk, "not a database at all, but long enough to look like one to a careless reader............");
    const auto before = dumpFile(p);
    try {
        cli::runDbRestore({"restore", junk.string(), "--db", p.string()}, out);
        ADD_FAILURE() << "no error for a junk backup";
    } catch (const cli::ProcessingError& e) {
        EXPECT_NE(std::string(e.what()).find("cli-junk.backup"), std::string::npos) << e.what();
    }
    EXPECT_EQ(dumpFile(p), before);
}

} // namespace
} // namespace humwise::storage
