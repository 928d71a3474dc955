// The repository API: fleet round trip, rounds, recordings, findings with evidence, trends in
// date order, alarm limits and the consistency check.
#include "storage/FleetStore.h"
#include "support/StorePaths.h"
#include "support/TestSupport.h"
#include "workflow/FixtureFleet.h"

#include <gtest/gtest.h>

#include <filesystem>

namespace humwise::storage {
namespace {

namespace fs = std::filesystem;

std::unique_ptr<FleetStore> freshStore(const std::string& name) {
    auto s = FleetStore::open(test::freshDatabasePath("storage", name));
    Transaction tx(s->database());
    s->saveFleet(test::smallFleet());
    tx.commit();
    return s;
}

std::int64_t addRound(FleetStore& s, const std::string& date, const std::string& hash) {
    RoundRow r;
    r.route = "Monthly";
    r.startedAt = date;
    r.manifestHash = hash;
    r.importedAt = date;
    return s.insertRound(r);
}

TEST(FleetStore, FleetRoundTrip) {
    auto s = freshStore("fleet.db");
    const auto f = s->loadFleet();
    const auto g = test::smallFleet();
    ASSERT_EQ(f.motors.size(), g.motors.size());
    EXPECT_EQ(f.site, g.site);
    EXPECT_EQ(f.areas, g.areas);
    EXPECT_EQ(f.motors[1].motor.tag, "P-2");
    EXPECT_EQ(f.motors[1].points.size(), g.motors[1].points.size());
    EXPECT_EQ(f.motors[0].points[3].phase, "A");
    ASSERT_TRUE(f.motors[0].motor.nonDriveEndBearing.has_value());
    EXPECT_DOUBLE_EQ(std::get<motor::BearingFactors>(f.motors[0].motor.nonDriveEndBearing->data).bpfi, 4.95);
    ASSERT_EQ(f.routes.size(), 1u);
    EXPECT_EQ(f.routes[0].points.size(), 12u);
    // Saving again updates in place: no duplicates.
    Transaction tx(s->database());
    s->saveFleet(g);
    tx.commit();
    EXPECT_EQ(s->loadFleet().motors.size(), 2u);
}

TEST(FleetStore, RoundsRecordingsFindingsAndTrends) {
    auto s = freshStore("rounds.db");
    Transaction tx(s->database());
    const auto later = addRound(*s, "2026-04-01T08:00:00.000Z", "b");
    const auto earlier = addRound(*s, "2026-03-01T08:00:00.000Z", "a");
    const std::vector<std::byte> bytes(16, std::byte{7});
    s->storeSourceFile("h1", bytes);
    s->storeSourceFile("h1", bytes); // content-addressed: stored once
    RecordingRow rec;
    rec.roundId = earlier;
    rec.motorTag = "P-1";
    rec.pointName = "DE-H";
    rec.recordedAt = "2026-03-01T08:01:00.000Z";
    rec.sampleRateHz = 12800;
    rec.sampleCount = 25600;
    rec.fileName = "P-1/DE-H.wav";
    rec.fileHash = "h1";
    rec.fileFormat = "wav";
    rec.unit = "g";
    const auto recId = s->insertRecording(rec);
    EXPECT_THROW(s->insertRecording(rec), StorageException); // one recording per point and round
    for (auto [round, value] : {std::pair{later, 2.5}, std::pair{earlier, 1.5}})
        s->insertIndicator(round, {"P-1", "DE-H", "velocity_rms", value, "mm/s"});
    diagnosis::Finding f;
    f.fault = "unbalance";
    f.severity = 2;
    f.origin = diagnosis::Origin::Mechanical;
    f.confidence = 0.8;
    f.rule = "vib.unbalance/1";
    f.explanation = "text";
    f.action = "balance";
    diagnosis::Evidence e;
    e.label = "1X running speed";
    e.expectedHz = 24.6;
    e.measuredHz = 24.58;
    e.amplitude = 3.2;
    e.unit = "mm/s rms";
    e.threshold = 2.8;
    e.thresholdSource = "ISO";
    f.evidence.push_back(e);
    s->insertFinding(later, "P-1", f);
    SpectrumRow sp;
    sp.recordingId = recId;
    sp.kind = "velocity";
    sp.quantity = "velocity";
    sp.unit = "m/s";
    sp.scale = "rms";
    sp.window = "hann";
    sp.resolutionHz = 0.25;
    sp.values = {1.0f, 2.5f, -0.0f, 3.25f};
    s->insertSpectrum(sp);
    tx.commit();

    const auto rounds = s->rounds();
    ASSERT_EQ(rounds.size(), 2u);
    EXPECT_EQ(rounds[0].id, earlier); // oldest first
    const auto trend = s->trend("P-1", "DE-H", "velocity_rms");
    ASSERT_EQ(trend.size(), 2u);
    EXPECT_DOUBLE_EQ(trend[0].value, 1.5);
    EXPECT_DOUBLE_EQ(trend[1].value, 2.5);
    const auto found = s->findings(later, "P-1");
    ASSERT_EQ(found.size(), 1u);
    ASSERT_EQ(found[0].finding.evidence.size(), 1u);
    EXPECT_DOUBLE_EQ(*found[0].finding.evidence[0].measuredHz, 24.58);
    EXPECT_EQ(found[0].finding.evidence[0].thresholdSource, "ISO");
    const auto back = s->spectrum(recId, "velocity");
    ASSERT_TRUE(back.has_value());
    EXPECT_EQ(back->values, sp.values);
    EXPECT_EQ(s->sourceFile("h1"), bytes);
    EXPECT_THROW(s->trend("P-9", "DE-H", "x"), StorageException);
}

TEST(FleetStore, AlarmLimitsAreReplacedNotDuplicated) {
    auto s = freshStore("alarms.db");
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
    a.alarm = 5.0;
    s->setAlarmLimit(a);
    const auto limits = s->alarmLimits("P-1");
    ASSERT_EQ(limits.size(), 1u);
    EXPECT_DOUBLE_EQ(*limits[0].alarm, 5.0);
    a.method = "made-up";
    EXPECT_THROW(s->setAlarmLimit(a), StorageException); // CHECK constraint
}

TEST(FleetStore, ConsistencyCheckSeesAMissingAnalysis) {
    auto s = freshStore("consistency.db");
    EXPECT_TRUE(s->checkConsistency().empty());
    Transaction tx(s->database());
    const auto r = addRound(*s, "2026-03-01T08:00:00.000Z", "x");
    s->storeSourceFile("h", std::vector<std::byte>(4));
    RecordingRow rec;
    rec.roundId = r;
    rec.motorTag = "P-1";
    rec.pointName = "DE-H";
    rec.fileHash = "h";
    rec.fileName = "f";
    rec.fileFormat = "wav";
    rec.unit = "g";
    s->insertRecording(rec);
    tx.commit();
    const auto problems = s->checkConsistency();
    ASSERT_EQ(problems.size(), 1u);
    EXPECT_NE(problems[0].find("without their analysis"), std::string::npos);
}

} // namespace
} // namespace humwise::storage

namespace humwise::storage {
namespace {

// A store that cannot be written (opened read-only, as for a file on a write-protected medium):
// every write is refused with ReadOnly and a message naming the file, reads keep working, and
// nothing already stored is lost.
TEST(FleetStoreProblems, AReadOnlyStoreRefusesWritesByNameAndKeepsItsData) {
    const fs::path p = test::outputDir() / "storage" / "read-only.db";
    {
        auto s = freshStore("read-only.db");
        Transaction tx(s->database());
        addRound(*s, "2026-01-05T08:00:00Z", "kept");
        tx.commit();
    }
    {
        auto store = FleetStore::openReadOnly(p);
        FleetStore& ro = *store;
        EXPECT_EQ(ro.rounds().size(), 1u);
        try {
            Transaction tx(ro.database());
            addRound(ro, "2026-02-05T08:00:00Z", "lost?");
            tx.commit();
            ADD_FAILURE() << "a read-only store took a write";
        } catch (const StorageException& e) {
            EXPECT_EQ(e.error.code, StorageError::Code::ReadOnly) << e.error.message;
            EXPECT_NE(e.error.message.find("read-only.db"), std::string::npos) << e.error.message;
        }
    }
    auto s = FleetStore::open(p, false);
    EXPECT_TRUE(s->checkConsistency().empty());
    ASSERT_EQ(s->rounds().size(), 1u);
    EXPECT_EQ(s->rounds()[0].manifestHash, "kept");
}

} // namespace
} // namespace humwise::storage
