// humwise-cli faults: the table's numbers (REFERENCE.md 4, worked 4-pole 50 Hz example, and the
// CWRU 6205 drive-end factors published by the CWRU Bearing Data Center) and its usage errors.
#include "cli/CliRunner.h"
#include "cli/MiniJson.h"

#include <gtest/gtest.h>

#include <map>

namespace humwise::cli {
namespace {

using test::runCli;

std::map<std::string, double> linesById(const test::CliRun& r) {
    const auto j = test::json::parse(r.out);
    std::map<std::string, double> m;
    for (std::size_t i = 0; i < j["lines"].size(); ++i) m[j["lines"].at(i)["id"].string()] = j["lines"].at(i)["frequency_hz"].number();
    return m;
}

TEST(CliFaults, FourPoleFiftyHertzTableAsJson) {
    const auto r = runCli({"faults", "--line-hz", "50", "--poles", "4", "--speed-rpm", "1470", "--rotor-bars", "28", "--json"});
    ASSERT_EQ(r.exitCode, 0) << r.err;
    const auto j = test::json::parse(r.out);
    EXPECT_NEAR(j["operating_point"]["slip"].number(), 0.02, 1e-12);
    const auto f = linesById(r);
    EXPECT_NEAR(f.at("BRB_LOWER_1"), 48.0, 1e-9);
    EXPECT_NEAR(f.at("ECC_UPPER_1"), 74.5, 1e-9);
    EXPECT_NEAR(f.at("PSH_NU+1"), 736.0, 1e-9);
    EXPECT_NEAR(f.at("2LF"), 100.0, 1e-9);
}

TEST(CliFaults, BearingGeometryAndFactorsGiveTheSameLines) {
    const auto geo = runCli({"faults", "--line-hz", "60", "--poles", "4", "--speed-rpm", "1772", "--bearing", "n=9,d=0.3126,D=1.537", "--json"});
    const auto fac = runCli({"faults", "--line-hz", "60", "--poles", "4", "--speed-rpm", "1772", "--bearing-factors",
                             "BPFO=3.5848,BPFI=5.4152,BSF=2.357,FTF=0.39828", "--json"});
    ASSERT_EQ(geo.exitCode, 0) << geo.err;
    ASSERT_EQ(fac.exitCode, 0) << fac.err;
    const auto g = linesById(geo), f = linesById(fac);
    EXPECT_NEAR(f.at("BPFO_DE_1"), 105.870, 2e-3); // REFERENCE.md 3.2: 105.870 Hz at 1772 r/min
    // The published factors are rounded to 4-5 digits (BSF 2.357 vs 2.35672 from geometry).
    for (const char* id : {"BPFO_DE_1", "BPFI_DE_1", "FTF_DE_1", "2xBSF_DE_1"}) EXPECT_NEAR(g.at(id), f.at(id), 2e-4 * f.at(id)) << id;
}

TEST(CliFaults, SlipInsteadOfSpeed) {
    const auto r = runCli({"faults", "--line-hz", "50", "--poles", "4", "--slip", "0.02", "--json"});
    ASSERT_EQ(r.exitCode, 0) << r.err;
    EXPECT_NEAR(test::json::parse(r.out)["operating_point"]["speed_rpm"].number(), 1470.0, 1e-9);
}

TEST(CliFaults, ImpossibleInputsAreUsageErrors) {
    const std::vector<std::vector<std::string>> cases = {
        {"faults", "--poles", "4", "--speed-rpm", "1470"},                                             // no line frequency
        {"faults", "--line-hz", "50", "--poles", "3", "--speed-rpm", "1470"},                          // odd poles
        {"faults", "--line-hz", "50", "--poles", "4", "--speed-rpm", "1470", "--bearing", "n=8,d=40,D=30"}, // ball >= pitch
        {"faults", "--line-hz", "50", "--poles", "4", "--speed-rpm", "1470", "--bearing", "n=8,d=4"},       // D missing
        {"faults", "--line-hz", "50", "--poles", "4", "--speed-rpm", "1470", "--slip", "0.02"},             // both
        {"faults", "--line-hz", "50", "--poles", "4", "--speed-rpm", "9000"},                               // faster than synchronous
        {"faults", "--line-hz", "50", "--poles", "4"},                                                      // no speed
    };
    for (const auto& args : cases) {
        const auto r = runCli(args);
        EXPECT_EQ(r.exitCode, 2) << args.back() << "\n" << r.err;
        EXPECT_FALSE(r.err.empty());
    }
    const auto ball = runCli(cases[2]);
    EXPECT_NE(ball.err.find("smaller than the pitch diameter"), std::string::npos) << ball.err;
}

// Counts beyond an int are refused by name: 4294967300 poles once wrapped around to 4 and gave a
// plausible table, and a rolling-element count of 1e300 did not convert at all (undefined).
TEST(CliFaults, HugeCountsAreRefusedNotWrappedAround) {
    const std::vector<std::pair<std::vector<std::string>, std::string>> cases = {
        {{"faults", "--line-hz", "50", "--poles", "4294967300", "--speed-rpm", "1470"}, "'--poles' is far too large"},
        {{"faults", "--line-hz", "50", "--poles", "4", "--speed-rpm", "1470", "--rotor-bars", "4294967324"},
         "'--rotor-bars' is far too large"},
        {{"faults", "--line-hz", "50", "--poles", "4", "--speed-rpm", "1470", "--vanes", "-4294967291"}, "'--vanes' is far too large"},
        {{"faults", "--line-hz", "50", "--poles", "4", "--speed-rpm", "1470", "--bearing", "n=1e300,d=10,D=50"},
         "n (number of rolling elements) must be a whole number"},
    };
    for (const auto& [args, message] : cases) {
        const auto r = runCli(args);
        EXPECT_EQ(r.exitCode, 2) << r.out;
        EXPECT_NE(r.err.find(message), std::string::npos) << r.err;
    }
}

} // namespace
} // namespace humwise::cli
