// Walkdown import: atomic, every bad file named with its reason, re-imports refused by hash,
// flagged data stored but not analysed, storage failures leave the store untouched, and
// reanalysis is idempotent.
#include "app/common/Walkdown.h"
#include "core/io/WavTestWriter.h"
#include "core/util/Sha256.h"
#include "support/TestSupport.h"
#include "workflow/FixtureFleet.h"

#include <gtest/gtest.h>

#include <algorithm>
#include <cmath>
#include <fstream>
#include <functional>
#include <iterator>
#include <sstream>

namespace humwise::workflow {
namespace {

namespace fs = std::filesystem;
using Code = ImportError::Code;

std::unique_ptr<storage::FleetStore> storeWithFleet(const std::string& name) {
    const fs::path p = test::freshFolder("db-" + name) / "fleet.db";
    auto s = storage::FleetStore::open(p);
    storage::Transaction tx(s->database());
    s->saveFleet(test::smallFleet());
    tx.commit();
    return s;
}

std::size_t count(storage::FleetStore& s, const char* table) {
    auto q = s.database().prepare(std::string("SELECT COUNT(*) FROM ") + table); // table names are literals here
    q.step();
    return static_cast<std::size_t>(q.integer(0));
}

void expectNothingStored(storage::FleetStore& s) {
    for (const char* t : {"rounds", "recordings", "source_files", "findings", "indicators", "spectra", "round_motors"}) EXPECT_EQ(count(s, t), 0u) << t;
}

bool hasProblem(const ImportReport& r, const std::string& file, const std::string& kind) {
    return std::any_of(r.bad.begin(), r.bad.end(), [&](const ImportProblem& p) { return p.file == file && p.kind == kind; });
}

void appendManifest(const fs::path& folder, const std::string& row) {
    std::ofstream(folder / "manifest.csv", std::ios::app) << row << "\n";
}

// Each file is read once: the bytes hashed, checked, analysed and stored are the same bytes, so
// every stored raw file hashes to the address it is stored under.
TEST(WalkdownImport, EveryStoredRawFileHashesToItsAddress) {
    auto s = storeWithFleet("addresses");
    const auto folder = test::freshFolder("addresses");
    test::writeWalkdown(folder);
    const auto r = importWalkdown(*s, folder);
    ASSERT_TRUE(r.ok()) << r.error().message;
    std::size_t checked = 0;
    for (const auto& rec : s->recordings(*r.value().roundId)) {
        EXPECT_EQ(util::sha256Hex(s->sourceFile(rec.fileHash)), rec.fileHash) << rec.fileName;
        ++checked;
    }
    EXPECT_EQ(checked, 12u);
}

TEST(WalkdownImport, ImportsAnalysesAndStoresOneRound) {
    auto s = storeWithFleet("happy");
    const auto folder = test::freshFolder("happy");
    test::writeWalkdown(folder);
    std::size_t progressCalls = 0;
    ImportOptions o;
    o.progress = [&](const ImportProgress&) { ++progressCalls; return true; };
    const auto r = importWalkdown(*s, folder, o);
    ASSERT_TRUE(r.ok()) << r.error().message;
    EXPECT_EQ(r.value().matched.size(), 12u);
    EXPECT_TRUE(r.value().bad.empty());
    EXPECT_EQ(r.value().motorsAnalysed, 2u);
    EXPECT_GT(progressCalls, 12u);
    EXPECT_EQ(count(*s, "rounds"), 1u);
    EXPECT_EQ(count(*s, "recordings"), 12u);
    EXPECT_EQ(count(*s, "source_files"), 8u); // 6 vibration files and 2 three-phase current files
    EXPECT_EQ(count(*s, "round_motors"), 2u);
    EXPECT_GT(count(*s, "spectra"), 0u);
    const auto rm = s->roundMotors(*r.value().roundId);
    ASSERT_EQ(rm.size(), 2u);
    EXPECT_NEAR(rm[0].speedRpm, 1476, 0.005 * 1476);
    EXPECT_NEAR(rm[0].lineHz, 50.0, 0.01);
    EXPECT_TRUE(s->checkConsistency().empty());
    const auto trend = s->trend("P-1", "DE-H", "velocity_rms");
    ASSERT_EQ(trend.size(), 1u);
    EXPECT_GT(trend[0].value, 0.4);
}

TEST(WalkdownImport, SameWalkdownTwiceIsRefusedOrReplaced) {
    auto s = storeWithFleet("twice");
    const auto folder = test::freshFolder("twice");
    test::writeWalkdown(folder);
    ASSERT_TRUE(importWalkdown(*s, folder).ok());
    const auto again = importWalkdown(*s, folder);
    ASSERT_FALSE(again.ok());
    EXPECT_EQ(again.error().code, Code::AlreadyImported);
    EXPECT_NE(again.error().message.find("imported already"), std::string::npos);
    EXPECT_EQ(count(*s, "rounds"), 1u);
    ImportOptions replace;
    replace.replace = true;
    const auto replaced = importWalkdown(*s, folder, replace);
    ASSERT_TRUE(replaced.ok()) << replaced.error().message;
    EXPECT_TRUE(replaced.value().replaced);
    EXPECT_EQ(count(*s, "rounds"), 1u);
    EXPECT_EQ(count(*s, "recordings"), 12u);
}

// A store nobody else has open takes the round through a rollback journal (storage/Database.h);
// with another connection open, through the write-ahead log, that connection reading on. The
// stored round is the same either way, and the store is back in WAL mode afterwards.
TEST(WalkdownImport, RoundGoesThroughTheJournalOnlyWhenTheStoreIsUnused) {
    auto alone = storeWithFleet("journal-alone");
    auto shared = storeWithFleet("journal-shared");
    const auto folder = test::freshFolder("journal-walk");
    test::writeWalkdown(folder);
    const auto a = importWalkdown(*alone, folder);
    ASSERT_TRUE(a.ok()) << a.error().message;
    EXPECT_TRUE(a.value().throughJournal);
    EXPECT_EQ(alone->database().journalMode(), "wal");

    const auto reader = storage::FleetStore::openReadOnly(shared->database().path());
    ASSERT_TRUE(reader->rounds().empty());
    const auto b = importWalkdown(*shared, folder);
    ASSERT_TRUE(b.ok()) << b.error().message;
    EXPECT_FALSE(b.value().throughJournal);
    EXPECT_EQ(shared->database().journalMode(), "wal");
    EXPECT_EQ(reader->rounds().size(), 1u);
    for (const char* t : {"rounds", "recordings", "source_files", "findings", "indicators", "spectra"})
        EXPECT_EQ(count(*alone, t), count(*shared, t)) << t;
}

TEST(WalkdownImport, DryRunMatchesButStoresNothing) {
    auto s = storeWithFleet("dry");
    const auto folder = test::freshFolder("dry");
    test::writeWalkdown(folder);
    ImportOptions o;
    o.dryRun = true;
    const auto r = importWalkdown(*s, folder, o);
    ASSERT_TRUE(r.ok()) << r.error().message;
    EXPECT_EQ(r.value().matched.size(), 12u);
    EXPECT_FALSE(r.value().roundId.has_value());
    expectNothingStored(*s);
}

struct BadCase {
    const char* name;
    std::function<void(const fs::path&)> damage;
    std::string file;
    std::string kind;
};

class BadWalkdown : public ::testing::TestWithParam<int> {};

std::vector<BadCase> badCases() {
    return {
        {"truncated", [](const fs::path& f) { fs::resize_file(f / "P-1/DE-V.wav", 1000); }, "P-1/DE-V.wav", "unreadable"},
        {"wrong_rate",
         [](const fs::path& f) { test::writeBytes(f / "P-2/DE-H.wav", test::makeFloatWav(test::sine(0.1, 25, 1000, 4000), 1000)); },
         "P-2/DE-H.wav", "wrong_rate"},
        {"unknown_point", [](const fs::path& f) { appendManifest(f, "P-1/DE-H.wav,1,P-1,XX-H"); }, "P-1/DE-H.wav", "unknown_point"},
        {"duplicate", [](const fs::path& f) { appendManifest(f, "P-1/DE-V.wav,1,P-1,DE-V"); }, "P-1/DE-V.wav", "duplicate"},
        {"outside", [](const fs::path& f) { appendManifest(f, "../../secret.wav,1,P-2,NDE-H"); }, "../../secret.wav", "outside_folder"},
        {"missing", [](const fs::path& f) { fs::remove(f / "P-2/NDE-H.wav"); }, "P-2/NDE-H.wav", "missing"},
        {"no_channel",
         [](const fs::path& f) {
             std::ifstream in(f / "manifest.csv");
             std::string text((std::istreambuf_iterator<char>(in)), std::istreambuf_iterator<char>());
             const auto at = text.find("P-2/DE-V.wav,1,");
             text.replace(at, 15, "P-2/DE-V.wav,4,");
             std::ofstream(f / "manifest.csv", std::ios::trunc) << text;
         },
         "P-2/DE-V.wav", "no_channel"},
    };
}

TEST_P(BadWalkdown, ReportsTheFileAndImportsNothingUnlessSkipBad) {
    const BadCase c = badCases()[static_cast<std::size_t>(GetParam())];
    auto s = storeWithFleet(std::string("bad-") + c.name);
    const auto folder = test::freshFolder(std::string("bad-") + c.name);
    test::writeWalkdown(folder);
    c.damage(folder);
    const auto r = importWalkdown(*s, folder);
    ASSERT_FALSE(r.ok());
    EXPECT_EQ(r.error().code, Code::BadFiles);
    EXPECT_NE(r.error().message.find(c.file), std::string::npos) << r.error().message;
    EXPECT_TRUE(hasProblem(r.error().report, c.file, c.kind)) << r.error().message;
    expectNothingStored(*s);

    ImportOptions skip;
    skip.skipBad = true;
    const auto rest = importWalkdown(*s, folder, skip);
    ASSERT_TRUE(rest.ok()) << rest.error().message;
    EXPECT_TRUE(hasProblem(rest.value(), c.file, c.kind));
    EXPECT_GE(rest.value().matched.size(), 10u);
    EXPECT_EQ(count(*s, "rounds"), 1u);
    EXPECT_TRUE(s->checkConsistency().empty());
}

INSTANTIATE_TEST_SUITE_P(Cases, BadWalkdown, ::testing::Range(0, 7), [](const ::testing::TestParamInfo<int>& i) {
    return std::string(badCases()[static_cast<std::size_t>(i.param)].name);
});

TEST(WalkdownImport, BrokenManifestsAreRefusedWithTheirReason) {
    auto s = storeWithFleet("manifest");
    const auto folder = test::freshFolder("manifest");
    test::writeWalkdown(folder);
    const std::vector<std::pair<std::string, std::string>> cases = {
        {"", "empty"},
        {"# round_start: 2026-03-02T08:00:00Z\nfilename,motor,point\nx.wav,P-1,DE-H\n", "unknown column 'filename'"},
        {"# round_start: 2026-03-02T08:00:00Z\nfile,motor\nx.wav,P-1\n", "needs a 'point' column"},
        {"file,motor,point\nP-1/DE-H.wav,P-1,DE-H\n", "round_start"},
        {"# round_start: 2026-03-02T08:00:00Z\nfile,motor,point\n", "lists no recording"},
    };
    for (const auto& [text, words] : cases) {
        std::ofstream(folder / "manifest.csv", std::ios::trunc) << text;
        const auto r = importWalkdown(*s, folder);
        ASSERT_FALSE(r.ok()) << words;
        EXPECT_EQ(r.error().code, Code::BadManifest) << words;
        EXPECT_NE(r.error().message.find(words), std::string::npos) << r.error().message;
        EXPECT_NE(r.error().message.find("manifest.csv"), std::string::npos);
    }
    fs::remove(folder / "manifest.csv");
    const auto none = importWalkdown(*s, folder);
    ASSERT_FALSE(none.ok());
    EXPECT_EQ(none.error().code, Code::NoManifest);
    expectNothingStored(*s);
}

TEST(WalkdownImport, UnlistedFilesAreMatchedByNameOrReported) {
    auto s = storeWithFleet("byname");
    const auto folder = test::freshFolder("byname");
    const std::string manifest = test::writeWalkdown(folder);
    // Drop P-2/NDE-H from the manifest: the file name still says which point it is.
    std::string trimmed;
    std::istringstream in(manifest);
    for (std::string line; std::getline(in, line);)
        if (line.find("P-2/NDE-H.wav") == std::string::npos) trimmed += line + "\n";
    std::ofstream(folder / "manifest.csv", std::ios::trunc) << trimmed;
    fs::copy_file(folder / "P-1/DE-H.wav", folder / "stray-recording.wav");
    const auto r = importWalkdown(*s, folder);
    ASSERT_TRUE(r.ok()) << r.error().message;
    const auto& m = r.value().matched;
    EXPECT_TRUE(std::any_of(m.begin(), m.end(), [](const MatchedRecording& x) { return x.file == "P-2/NDE-H.wav" && x.how == "file name"; }));
    ASSERT_EQ(r.value().unmatched.size(), 1u);
    EXPECT_EQ(r.value().unmatched[0], "stray-recording.wav");
}

TEST(WalkdownImport, ClippedRecordingIsFlaggedStoredAndLeftOut) {
    auto s = storeWithFleet("clipped");
    const auto folder = test::freshFolder("clipped");
    test::writeWalkdown(folder);
    // A PCM16 input driven three times past its full scale: integer codes stuck at the rails.
    auto x = test::sine(3.0 * 32767, 24.6, 12800, 25600);
    for (double& v : x) v = std::round(std::clamp(v, -32768.0, 32767.0));
    test::WavSpec w;
    w.encoding = test::WavEncoding::Pcm16;
    w.sampleRate = 12800;
    test::writeBytes(folder / "P-1/DE-V.wav", test::makeWav(w, x));
    const auto r = importWalkdown(*s, folder);
    ASSERT_TRUE(r.ok()) << r.error().message;
    ASSERT_FALSE(r.value().flagged.empty());
    EXPECT_EQ(r.value().flagged[0].file, "P-1/DE-V.wav");
    EXPECT_EQ(r.value().flagged[0].kind, "clipped");
    EXPECT_EQ(count(*s, "recordings"), 12u);
    const auto rm = s->roundMotors(*r.value().roundId);
    EXPECT_NE(rm[0].notes.find("DE-V left out"), std::string::npos) << rm[0].notes;
}

// A full disk (simulated with SQLite's page limit) fails with a clear error and an untouched store.
TEST(WalkdownImport, FullDiskLeavesTheStoreUntouched) {
    auto s = storeWithFleet("full");
    const auto folder = test::freshFolder("full");
    test::writeWalkdown(folder);
    auto pages = s->database().prepare("PRAGMA page_count");
    pages.step();
    s->database().execute("PRAGMA max_page_count = " + std::to_string(pages.integer(0) + 20));
    const auto r = importWalkdown(*s, folder);
    ASSERT_FALSE(r.ok());
    EXPECT_EQ(r.error().code, Code::Storage);
    EXPECT_NE(r.error().message.find("full"), std::string::npos) << r.error().message;
    EXPECT_NE(r.error().message.find("nothing was stored"), std::string::npos);
    expectNothingStored(*s);
    EXPECT_TRUE(s->checkConsistency().empty());
}

TEST(WalkdownImport, CancelRollsBack) {
    auto s = storeWithFleet("cancel");
    const auto folder = test::freshFolder("cancel");
    test::writeWalkdown(folder);
    ImportOptions o;
    o.progress = [](const ImportProgress& p) { return p.stage.rfind("analysing", 0) != 0; };
    const auto r = importWalkdown(*s, folder, o);
    ASSERT_FALSE(r.ok());
    EXPECT_EQ(r.error().code, Code::Cancelled);
    expectNothingStored(*s);
}

TEST(WalkdownImport, ReanalysisIsIdempotent) {
    auto s = storeWithFleet("reanalyse");
    for (int month = 3; month <= 4; ++month) {
        const auto folder = test::freshFolder("reanalyse-" + std::to_string(month));
        test::WalkdownSpec spec;
        spec.roundStart = "2026-0" + std::to_string(month) + "-02T08:00:00Z";
        spec.seed = static_cast<std::uint64_t>(month * 100);
        spec.oneXmmsP1 = month == 4 ? 3.5 : 0.6;
        test::writeWalkdown(folder, spec);
        ASSERT_TRUE(importWalkdown(*s, folder).ok());
    }
    const auto snapshot = [&] {
        std::vector<std::string> rows;
        auto q = s->database().prepare("SELECT round_id, name, IFNULL(point_id, 0), value FROM indicators ORDER BY 1, 2, 3");
        while (q.step()) rows.push_back(std::to_string(q.integer(0)) + q.text(1) + std::to_string(q.integer(2)) + std::to_string(q.real(3)));
        auto f = s->database().prepare("SELECT round_id, fault, severity, evidence FROM findings ORDER BY 1, 2, 3, 4");
        while (f.step()) rows.push_back(std::to_string(f.integer(0)) + f.text(1) + std::to_string(f.integer(2)) + f.text(3));
        return rows;
    };
    const auto before = snapshot();
    const auto unbalanced = s->findings(std::nullopt, "P-1");
    EXPECT_TRUE(std::any_of(unbalanced.begin(), unbalanced.end(), [](const storage::FindingRow& f) { return f.finding.fault == "unbalance"; }));
    ASSERT_TRUE(reanalyseAll(*s).ok());
    EXPECT_EQ(snapshot(), before);
    const auto again = reanalyseAll(*s);
    ASSERT_TRUE(again.ok());
    EXPECT_EQ(again.value().rounds, 2u);
    EXPECT_EQ(snapshot(), before);
}

} // namespace
} // namespace humwise::workflow
