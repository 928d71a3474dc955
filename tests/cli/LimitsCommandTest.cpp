// humwise-cli limits through the real binary: listing the limits in force, setting and clearing
// the analyst's own, suggestions from the first rounds (kept only with --store, all or none), and
// every wrong command line refused with the usual exit codes.
#include "cli/CliRunner.h"
#include "cli/MiniJson.h"
#include "core/io/FleetFile.h"
#include "support/TestSupport.h"
#include "workflow/FixtureFleet.h"

#include <gtest/gtest.h>

#include <filesystem>
#include <fstream>

namespace humwise::cli {
namespace {

namespace fs = std::filesystem;
using test::CliRun;
using test::runCli;

constexpr int kProcessingError = 1, kUsageError = 2;

// A store with the fixture fleet and three monthly rounds (P-1 DE-H 1X at 0.6, 0.625, 0.65 mm/s),
// one per test: ctest runs the tests as separate processes, possibly side by side.
class LimitsCommand : public ::testing::Test {
protected:
    void SetUp() override {
        dir = test::freshFolder(std::string("cli-limits-") + ::testing::UnitTest::GetInstance()->current_test_info()->name());
        db = (dir / "store.db").string();
        std::ofstream(dir / "fleet.json") << io::writeFleet(test::smallFleet());
        ASSERT_EQ(runCli({"fleet", "import", (dir / "fleet.json").string(), "--db", db}).exitCode, 0);
        const char* dates[] = {"2026-09-01T08:00:00Z", "2026-10-01T08:00:00Z", "2026-11-02T08:00:00Z"};
        for (int m = 0; m < 3; ++m) {
            test::WalkdownSpec spec;
            spec.roundStart = dates[m];
            spec.oneXmmsP1 = 0.6 + 0.025 * m;
            spec.seed = 10 + 20 * static_cast<std::uint64_t>(m);
            const auto walk = dir / ("w" + std::to_string(m));
            test::writeWalkdown(walk, spec);
            const CliRun r = runCli({"import", walk.string(), "--db", db});
            ASSERT_EQ(r.exitCode, 0) << r.err;
        }
    }
    // The limits --json entry of (motor, point, indicator); fails the test when absent.
    test::json::Value entry(const std::string& motor, const std::string& point, const std::string& indicator) {
        const CliRun r = runCli({"limits", "--db", db, "--motor", motor, "--json"});
        EXPECT_EQ(r.exitCode, 0) << r.err;
        const auto doc = test::json::parse(r.out);
        for (std::size_t i = 0; i < doc["limits"].size(); ++i) {
            const auto& e = doc["limits"].at(i);
            if (e["motor"].string() == motor && e["point"].string() == point && e["indicator"].string() == indicator) return e;
        }
        ADD_FAILURE() << "no entry " << motor << " " << point << " " << indicator << " in\n" << r.out;
        return {};
    }
    fs::path dir;
    std::string db;
};

TEST_F(LimitsCommand, ListsTheDefaultsInForceWithTheLatestValue) {
    const CliRun r = runCli({"limits", "--db", db});
    ASSERT_EQ(r.exitCode, 0) << r.err;
    EXPECT_NE(r.out.find("limits in force at round"), std::string::npos) << r.out;
    EXPECT_NE(r.out.find("velocity_rms"), std::string::npos) << r.out;
    const auto v = entry("P-1", "DE-H", "velocity_rms");
    EXPECT_EQ(v["method"].string(), "iso-zone");
    EXPECT_FALSE(v["stored"].boolean());
    EXPECT_EQ(v["unit"].string(), "mm/s");
    EXPECT_GT(v["value"].number(), 0.3);
    EXPECT_EQ(v["state"].string(), "within");
    EXPECT_EQ(entry("P-1", "DE-H", "1x")["method"].string(), "statistical");
}

TEST_F(LimitsCommand, SetStoresTheAnalystsLimitsAndClearRestoresTheDefaults) {
    const CliRun set = runCli({"limits", "set", "--db", db, "--motor", "P-1", "--point", "DE-H", "--indicator", "1x", "--alert", "0.2", "--alarm", "0.4"});
    ASSERT_EQ(set.exitCode, 0) << set.err;
    EXPECT_NE(set.out.find("stored"), std::string::npos) << set.out;
    auto e = entry("P-1", "DE-H", "1x");
    EXPECT_TRUE(e["stored"].boolean());
    EXPECT_EQ(e["method"].string(), "absolute");
    EXPECT_DOUBLE_EQ(e["alarm"].number(), 0.4);
    EXPECT_EQ(e["state"].string(), "over alarm"); // 1X is about 0.65 mm/s
    const CliRun clear = runCli({"limits", "clear", "--db", db, "--motor", "P-1", "--point", "DE-H", "--indicator", "1x"});
    ASSERT_EQ(clear.exitCode, 0) << clear.err;
    EXPECT_NE(clear.out.find("removed"), std::string::npos) << clear.out;
    e = entry("P-1", "DE-H", "1x");
    EXPECT_FALSE(e["stored"].boolean());
    EXPECT_EQ(e["method"].string(), "statistical");
}

TEST_F(LimitsCommand, SuggestShowsAndStoresOnlyWhenAsked) {
    const CliRun look = runCli({"limits", "suggest", "--db", db, "--method", "percent", "--motor", "P-2"});
    ASSERT_EQ(look.exitCode, 0) << look.err;
    EXPECT_NE(look.out.find("add --store to keep them"), std::string::npos) << look.out;
    EXPECT_FALSE(entry("P-2", "DE-V", "1x")["stored"].boolean());
    const CliRun keep = runCli({"limits", "suggest", "--db", db, "--method", "percent", "--motor", "P-2", "--baseline", "2", "--store"});
    ASSERT_EQ(keep.exitCode, 0) << keep.err;
    EXPECT_NE(keep.out.find("limit(s) stored"), std::string::npos) << keep.out;
    const auto e = entry("P-2", "DE-V", "1x");
    EXPECT_TRUE(e["stored"].boolean());
    EXPECT_EQ(e["method"].string(), "percent");
    // ISO zones only ever touch overall velocity.
    const CliRun iso = runCli({"limits", "suggest", "--db", db, "--method", "iso-zone", "--motor", "P-2"});
    ASSERT_EQ(iso.exitCode, 0) << iso.err;
    EXPECT_NE(iso.out.find("velocity_rms"), std::string::npos) << iso.out;
    EXPECT_EQ(iso.out.find(" 1x"), std::string::npos) << iso.out;
}

TEST_F(LimitsCommand, WrongCommandLinesAreRefusedAndNothingChanges) {
    const auto before = runCli({"limits", "--db", db, "--json"}).out;
    struct Case {
        std::vector<std::string> args;
        int exit;
        std::string says;
    };
    const std::vector<Case> cases = {
        {{"limits", "bogus"}, kUsageError, "unknown limits sub-command 'bogus'"},
        {{"limits", "set", "--motor", "P-1", "--indicator", "1x"}, kUsageError, "--alarm"},
        {{"limits", "set", "--motor", "P-1", "--indicator", "1x", "--alarm", "1", "--alert", "2"}, kUsageError, "--alert must not exceed --alarm"},
        {{"limits", "set", "--motor", "P-1", "--indicator", "slip", "--alarm", "1"}, kUsageError, "takes no alarm limit"},
        {{"limits", "set", "--motor", "X-9", "--indicator", "1x", "--alarm", "1"}, kProcessingError, "X-9"},
        {{"limits", "set", "--motor", "P-1", "--point", "Q-9", "--indicator", "1x", "--alarm", "1"}, kProcessingError, "Q-9"},
        {{"limits", "set", "--motor", "P-1", "--indicator", "1x", "--alarm", "lots"}, kUsageError, "--alarm"},
        {{"limits", "suggest", "--method", "guess"}, kUsageError, "--method"},
        {{"limits", "suggest", "--method", "percent", "--baseline", "0"}, kUsageError, "--baseline"},
        {{"limits", "--motor", "X-9"}, kUsageError, "X-9"},
        {{"limits", "clear", "--motor", "P-1"}, kUsageError, "--indicator"},
    };
    for (auto c : cases) {
        c.args.insert(c.args.end(), {"--db", db});
        const CliRun r = runCli(c.args);
        EXPECT_EQ(r.exitCode, c.exit) << c.args[1] << " " << r.err;
        EXPECT_NE(r.err.find(c.says), std::string::npos) << r.err;
    }
    EXPECT_EQ(runCli({"limits", "--db", db, "--json"}).out, before);
    const CliRun missing = runCli({"limits", "--db", (dir / "none.db").string()});
    EXPECT_EQ(missing.exitCode, kProcessingError);
    EXPECT_NE(missing.err.find("none.db: no such database"), std::string::npos) << missing.err;
}

} // namespace
} // namespace humwise::cli
