// The fleet view's and route summary's status of every motor (app/common/FleetStatus.h): latest
// round, worst severity, what is new or worse than the round before, and the points whose data
// were flagged - from rows written through the repository API.
#include "app/common/FleetStatus.h"
#include "support/StorePaths.h"
#include "workflow/FixtureFleet.h"

#include <gtest/gtest.h>

#include <algorithm>

namespace humwise::workflow {
namespace {

using storage::FleetStore;

diagnosis::Finding finding(const std::string& fault, int severity) {
    diagnosis::Finding f;
    f.fault = fault;
    f.severity = severity;
    f.rule = "test/" + fault;
    return f;
}

struct Store {
    std::unique_ptr<FleetStore> store;
    std::int64_t march = 0, april = 0;
};

// P-1 and P-2 in March, P-1 alone in April (worse unbalance, new misalignment, DE-H clipped);
// P-3 never measured.
// A store of its own per test (`name`): ctest runs the tests of one file side by side.
Store history(const std::string& name) {
    Store h;
    h.store = FleetStore::open(test::freshDatabasePath("workflow", name));
    auto& s = *h.store;
    storage::Transaction tx(s.database());
    auto fleet = test::smallFleet();
    fleet.motors.push_back(fleet.motors.back());
    fleet.motors.back().motor.tag = "P-3";
    s.saveFleet(fleet);
    s.storeSourceFile("h", std::vector<std::byte>(8, std::byte{1}));
    const auto round = [&](const std::string& date, const std::string& hash) {
        storage::RoundRow r;
        r.startedAt = date;
        r.manifestHash = hash;
        r.importedAt = date;
        return s.insertRound(r);
    };
    const auto recording = [&](std::int64_t roundId, const std::string& tag, const std::string& point, const std::string& quality) {
        storage::RecordingRow rec;
        rec.roundId = roundId;
        rec.motorTag = tag;
        rec.pointName = point;
        rec.recordedAt = "2026-03-01T08:00:00.000Z";
        rec.sampleRateHz = 12800;
        rec.sampleCount = 4;
        rec.fileName = "file.wav"; // one per row is enough here
        rec.fileHash = std::string("h"); // (assigning the literal trips a false -Wrestrict of GCC 12)
        rec.fileFormat = "wav";
        rec.unit = std::string("g");
        rec.quality = quality;
        s.insertRecording(rec);
    };
    const auto analysed = [&](std::int64_t roundId, const std::string& tag) {
        storage::RoundMotorRow m;
        m.roundId = roundId;
        m.motorTag = tag;
        s.insertRoundMotor(m);
    };
    h.march = round("2026-03-01T08:00:00.000Z", "march");
    h.april = round("2026-04-01T08:00:00.000Z", "april");
    for (const char* tag : {"P-1", "P-2"}) {
        analysed(h.march, tag);
        recording(h.march, tag, "DE-H", "");
    }
    s.insertFinding(h.march, "P-1", finding("unbalance", 1));
    s.insertFinding(h.march, "P-2", finding("looseness", 1));
    analysed(h.april, "P-1");
    recording(h.april, "P-1", "DE-H", "clipping");
    recording(h.april, "P-1", "NDE-H", "");
    s.insertFinding(h.april, "P-1", finding("misalignment", 1));
    s.insertFinding(h.april, "P-1", finding("unbalance", 2));
    s.insertFinding(h.april, "P-1", finding("note", 0));
    tx.commit();
    return h;
}

const MotorStatus& of(const std::vector<MotorStatus>& all, const std::string& tag) {
    const auto it = std::find_if(all.begin(), all.end(), [&](const MotorStatus& m) { return m.tag == tag; });
    if (it == all.end()) throw std::runtime_error("no status for " + tag);
    return *it;
}

TEST(FleetStatus, LatestRoundWhatChangedAndFlaggedData) {
    auto h = history("fleet-status-latest.db");
    const auto all = fleetStatus(*h.store);
    ASSERT_EQ(all.size(), 3u);

    const auto& p1 = of(all, "P-1");
    EXPECT_EQ(p1.roundId, h.april);
    EXPECT_TRUE(p1.measuredInLatestRound);
    EXPECT_EQ(p1.worstSeverity, 2);
    EXPECT_EQ(p1.previousWorstSeverity, 1);
    EXPECT_EQ(p1.newFaults, std::vector<std::string>{"misalignment"});
    EXPECT_EQ(p1.worsenedFaults, std::vector<std::string>{"unbalance"});
    EXPECT_EQ(p1.changeSummary(), "new: misalignment; worse: unbalance");
    ASSERT_EQ(p1.findings.size(), 3u);
    EXPECT_EQ(p1.findings.front().finding.fault, "unbalance"); // most severe first
    EXPECT_EQ(p1.flaggedPoints, std::vector<std::string>{"DE-H (clipping)"});

    const auto& p2 = of(all, "P-2");
    EXPECT_EQ(p2.roundId, h.march);
    EXPECT_FALSE(p2.measuredInLatestRound);
    EXPECT_EQ(p2.worstSeverity, 1);
    EXPECT_FALSE(p2.previousWorstSeverity);
    EXPECT_EQ(p2.changeSummary(), "first round");
    EXPECT_TRUE(p2.flaggedPoints.empty());

    const auto& p3 = of(all, "P-3");
    EXPECT_FALSE(p3.roundId);
    EXPECT_EQ(p3.worstSeverity, -1);
    EXPECT_EQ(p3.changeSummary(), "not measured");
}

TEST(FleetStatus, AsOfAnEarlierRound) {
    auto h = history("fleet-status-march.db");
    const auto all = fleetStatus(*h.store, h.march);
    const auto& p1 = of(all, "P-1");
    EXPECT_EQ(p1.roundId, h.march);
    EXPECT_TRUE(p1.measuredInLatestRound);
    EXPECT_EQ(p1.worstSeverity, 1);
    EXPECT_TRUE(p1.flaggedPoints.empty()); // April's clipping is not March's
    EXPECT_EQ(p1.changeSummary(), "first round");
    EXPECT_TRUE(of(all, "P-2").measuredInLatestRound);
}

} // namespace
} // namespace humwise::workflow
