// Schema versions and migrations: every earlier version migrates to the current one with its
// data intact; a database from a newer program is refused untouched; foreign keys, WAL and the
// busy timeout are on.
#include "storage/FleetStore.h"
#include "support/StorePaths.h"
#include "support/TestSupport.h"

#include <gtest/gtest.h>

#include <filesystem>
#include <fstream>

namespace humwise::storage {
namespace {

namespace fs = std::filesystem;

fs::path freshDb(const std::string& name) {
    return test::freshDatabasePath("storage", name);
}

TEST(Schema, FreshDatabaseIsCurrentWithForeignKeysAndWal) {
    const auto path = freshDb("fresh.db");
    auto store = FleetStore::open(path);
    EXPECT_EQ(store->schemaVersion(), kSchemaVersion);
    auto fk = store->database().prepare("PRAGMA foreign_keys");
    ASSERT_TRUE(fk.step());
    EXPECT_EQ(fk.integer(0), 1);
    auto jm = store->database().prepare("PRAGMA journal_mode");
    ASSERT_TRUE(jm.step());
    EXPECT_EQ(jm.text(0), "wal");
    // A foreign key that points nowhere is refused.
    EXPECT_THROW(store->database().execute("INSERT INTO areas(site_id, name, position) VALUES (999, 'x', 0)"), StorageException);
}

TEST(Schema, VersionOneMigratesWithItsData) {
    const auto path = freshDb("v1.db");
    {
        Database db(path);
        migrate(db, 1);
        EXPECT_EQ(schemaVersion(db), 1);
        db.execute("INSERT INTO sites(name) VALUES ('Old works')");
        db.execute("INSERT INTO areas(site_id, name, position) VALUES (1, 'Hall', 0)");
        db.execute(R"SQL(INSERT INTO motors(area_id, position, tag, rated_power_kw, rated_voltage_v, rated_current_a, supply_hz, rated_speed_rpm,
                     drive, driven_kind, driven_speed_ratio, severity_standard, severity_group, severity_support)
                     VALUES (1, 0, 'M-1', 11, 400, 21, 50, 1460, 'direct-on-line', 'fan', 1, 'ISO 20816-3', 2, 'rigid'))SQL");
        auto t = db.prepare("SELECT COUNT(*) FROM sqlite_master WHERE name = 'spectra'");
        t.step();
        EXPECT_EQ(t.integer(0), 0); // version 1 has no analysis products yet
    }
    auto store = FleetStore::open(path);
    EXPECT_EQ(store->schemaVersion(), kSchemaVersion);
    const auto fleet = store->loadFleet();
    ASSERT_EQ(fleet.motors.size(), 1u);
    EXPECT_EQ(fleet.motors[0].motor.tag, "M-1");
    EXPECT_EQ(fleet.site, "Old works");
    auto t = store->database().prepare("SELECT COUNT(*) FROM sqlite_master WHERE name IN ('spectra', 'alarm_limits')");
    t.step();
    EXPECT_EQ(t.integer(0), 2);
}

TEST(Schema, NewerDatabaseIsRefusedAndLeftAlone) {
    const auto path = freshDb("newer.db");
    {
        auto store = FleetStore::open(path);
        store->database().execute("PRAGMA user_version = 99");
    }
    const auto sizeBefore = fs::file_size(path);
    try {
        FleetStore::open(path);
        ADD_FAILURE() << "a newer schema was accepted";
    } catch (const StorageException& e) {
        EXPECT_EQ(e.error.code, StorageError::Code::TooNew);
        EXPECT_NE(e.error.message.find("newer"), std::string::npos) << e.error.message;
        EXPECT_NE(e.error.message.find(path.string()), std::string::npos);
    }
    EXPECT_EQ(fs::file_size(path), sizeBefore);
}

TEST(Schema, NotADatabaseAndMissingFolderGiveTypedErrors) {
    const auto garbage = freshDb("garbage.db");
    {
        std::ofstream(garbage) << std::string(4096, 'x');
    }
    try {
        FleetStore::open(garbage);
        ADD_FAILURE() << "garbage accepted";
    } catch (const StorageException& e) {
        EXPECT_EQ(e.error.code, StorageError::Code::Corrupt) << e.error.message;
    }
    try {
        FleetStore::open("/nonexistent-folder/fleet.db");
        ADD_FAILURE() << "missing folder accepted";
    } catch (const StorageException& e) {
        EXPECT_EQ(e.error.code, StorageError::Code::CannotOpen) << e.error.message;
        EXPECT_NE(e.error.message.find("/nonexistent-folder/fleet.db"), std::string::npos);
    }
}

} // namespace
} // namespace humwise::storage

namespace humwise::storage {
namespace {

// WAL and the busy timeout: while one process writes, a second reads the last committed state;
// a second writer waits, then gets a clear Busy error instead of corrupting anything.
TEST(Schema, ReadersWorkWhileOneWrites) {
    const auto path = freshDb("concurrent.db");
    auto writer = FleetStore::open(path);
    writer->database().execute("INSERT INTO sites(name) VALUES ('Works')");
    Transaction tx(writer->database());
    writer->database().execute("INSERT INTO areas(site_id, name, position) VALUES (1, 'Hall', 0)");
    auto reader = FleetStore::open(path, false);
    const auto seen = reader->loadFleet();
    EXPECT_EQ(seen.site, "Works");
    EXPECT_TRUE(seen.areas.empty()); // the uncommitted area is not visible
    Database second(path, Database::Mode::ReadWrite, 100);
    try {
        Transaction other(second);
        ADD_FAILURE() << "a second writer got in";
    } catch (const StorageException& e) {
        EXPECT_EQ(e.error.code, StorageError::Code::Busy) << e.error.message;
        EXPECT_NE(e.error.message.find(path.string()), std::string::npos);
    }
    tx.commit();
    EXPECT_EQ(reader->loadFleet().areas.size(), 1u);
}

} // namespace
} // namespace humwise::storage

namespace humwise::storage {
namespace {

TEST(Schema, VersionTwoSpectraGainTheirLengthsOnMigration) {
    const auto path = freshDb("v2.db");
    {
        Database db(path);
        migrate(db, 2);
        db.execute("INSERT INTO sites(name) VALUES ('W')");
        db.execute("INSERT INTO areas(site_id, name, position) VALUES (1, 'A', 0)");
        db.execute(R"SQL(INSERT INTO motors(area_id, position, tag, rated_power_kw, rated_voltage_v, rated_current_a, supply_hz, rated_speed_rpm,
                     drive, driven_kind, driven_speed_ratio, severity_standard, severity_group, severity_support)
                     VALUES (1, 0, 'M', 11, 400, 21, 50, 1460, 'direct-on-line', 'fan', 1, 'ISO 20816-3', 2, 'rigid'))SQL");
        db.execute("INSERT INTO points(motor_id, position, name, quantity, unit, sensitivity) VALUES (1, 0, 'DE-H', 'acceleration', 'g', 1)");
        db.execute("INSERT INTO rounds(started_at, manifest_hash, imported_at) VALUES ('2026-01-01', 'h', '2026-01-01')");
        db.execute("INSERT INTO source_files(hash, size, bytes) VALUES ('f', 1, x'00')");
        db.execute(R"SQL(INSERT INTO recordings(round_id, point_id, recorded_at, sample_rate_hz, sample_count, file_name, file_hash, file_format,
                     channel_index, unit, sensitivity) VALUES (1, 1, '2026-01-01', 12800, 100, 'x.wav', 'f', 'wav', 0, 'g', 1))SQL");
        db.execute(R"SQL(INSERT INTO spectra(recording_id, kind, quantity, unit, scale, window_name, start_hz, resolution_hz, enbw_hz, averages,
                     analysis_version, line_values) VALUES (1, 'velocity', 'velocity', 'm/s', 'rms', 'hann', 0, 0.25, 0.375, 1, 1, x'0000803F'))SQL");
    }
    auto store = FleetStore::open(path);
    EXPECT_EQ(store->schemaVersion(), kSchemaVersion);
    const auto row = store->spectrum(1, "velocity");
    ASSERT_TRUE(row.has_value());
    EXPECT_EQ(row->values, std::vector<float>{1.0f});
    EXPECT_EQ(row->segmentLength, 0); // unknown in version 2, filled with 0 by the migration
}

} // namespace
} // namespace humwise::storage
