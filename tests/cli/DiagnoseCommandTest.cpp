// humwise-cli diagnose: the JSON contract the diagnosis issue names, on real recordings (CWRU
// Bearing Data Center record 130, outer race, BPFO 107.3 Hz at 1796 r/min; ITSC inter-turn short,
// Cardenas-Cornejo et al. 2023) and usage errors for impossible motors and arguments.
#include "cli/CliRunner.h"
#include "cli/MiniJson.h"
#include "support/TestSupport.h"

#include <gtest/gtest.h>

#include <cmath>

namespace humwise::cli {
namespace {

using test::runCli;

TEST(CliDiagnose, BearingRecordAsJson) {
    HUMWISE_REQUIRE_SHARED_RECORDING(path, "cwru_130_de_or007c6_0hp_12k.wav");
    const auto r = runCli({"diagnose", path.string(), "--channel", "1", "--direction", "H", "--line-hz", "60", "--poles", "4", "--rated-rpm",
                           "1730", "--bearing-factors", "BPFO=3.5848,BPFI=5.4152,BSF=2.357,FTF=0.39828", "--json"});
    ASSERT_EQ(r.exitCode, 0) << r.err;
    const auto j = test::json::parse(r.out);
    const auto& op = j["operating_point"];
    for (const char* key : {"line_hz", "speed_rpm", "speed_method", "slip", "load_percent"}) EXPECT_TRUE(op.has(key)) << key;
    EXPECT_EQ(op["speed_method"].string(), "vibration_1x");
    EXPECT_NEAR(op["speed_rpm"].number(), 1796, 0.005 * 1796);
    EXPECT_TRUE(j["indicators"].has("velocity_rms.DE-H (ch1)"));
    bool outer = false;
    for (std::size_t i = 0; i < j["findings"].size(); ++i) {
        const auto& f = j["findings"].at(i);
        for (const char* key : {"fault", "severity", "withheld", "origin", "confidence", "evidence", "explanation", "action", "rule"})
            EXPECT_TRUE(f.has(key)) << key;
        if (f["fault"].string() == "bearing_outer_race") {
            outer = true;
            EXPECT_GE(f["severity"].number(), 1);
            const auto& e = f["evidence"].at(0);
            EXPECT_NEAR(e["measured_hz"].number(), 107.3, 0.02 * 107.3);
            for (const char* key : {"label", "expected_hz", "measured_hz", "amplitude", "unit"}) EXPECT_TRUE(e.has(key)) << key;
        }
    }
    EXPECT_TRUE(outer) << r.out.substr(0, 3000);
}

TEST(CliDiagnose, ThreeCurrentChannelsArePhases) {
    HUMWISE_REQUIRE_SHARED_RECORDING(path, "itsc_current_phaseA_40pct_rep1.wav");
    const auto r = runCli({"diagnose", path.string(), "--quantity", "current", "--input-unit", "A", "--line-hz", "60", "--poles", "4", "--json"});
    ASSERT_EQ(r.exitCode, 0) << r.err;
    const auto j = test::json::parse(r.out);
    EXPECT_NEAR(j["operating_point"]["line_hz"].number(), 60.0, 0.1);
    bool stator = false;
    for (std::size_t i = 0; i < j["findings"].size(); ++i) stator |= j["findings"].at(i)["fault"].string() == "stator_winding";
    EXPECT_TRUE(stator) << r.out.substr(0, 3000);
    EXPECT_NEAR(j["indicators"]["negative_sequence_ratio"]["value"].number(), 0.139, 0.01);
}

TEST(CliDiagnose, HumanReadableShowsSeverityMarksAndNextSteps) {
    HUMWISE_REQUIRE_SHARED_RECORDING(path, "cwru_105_de_ir007_0hp_12k.wav");
    const auto r = runCli({"diagnose", path.string(), "--channel", "1", "--line-hz", "60", "--poles", "4", "--bearing-factors",
                           "BPFO=3.5848,BPFI=5.4152,BSF=2.357,FTF=0.39828"});
    ASSERT_EQ(r.exitCode, 0) << r.err;
    EXPECT_NE(r.out.find("bearing_inner_race"), std::string::npos) << r.out;
    EXPECT_NE(r.out.find("next:"), std::string::npos);
    EXPECT_NE(r.out.find("[!"), std::string::npos); // severity readable without colour
}

TEST(CliDiagnose, ImpossibleMotorsAndArgumentsAreUsageErrors) {
    HUMWISE_REQUIRE_SHARED_RECORDING(path, "cwru_105_de_ir007_0hp_12k.wav");
    const std::string p = path.string();
    const std::vector<std::vector<std::string>> cases = {
        {"diagnose", p, "--poles", "4"},                                                         // no line frequency
        {"diagnose", p, "--line-hz", "60", "--poles", "5"},                                      // odd poles
        {"diagnose", p, "--line-hz", "60", "--poles", "4", "--rated-rpm", "1900"},                // faster than synchronous
        {"diagnose", p, "--line-hz", "60", "--poles", "4", "--bearing", "n=9,d=2,D=1"},           // ball larger than pitch
        {"diagnose", p, "--line-hz", "60", "--poles", "4", "--direction", "X"},                   // bad direction
        {"diagnose", p, "--line-hz", "60", "--poles", "4", "--machine-group", "3"},               // no such ISO group
        {"diagnose", p, "--line-hz", "60", "--poles", "4", "--support", "soft"},
        {"diagnose", p, "--line-hz", "60", "--poles", "4", "--speed-rpm", "-5"},
    };
    for (const auto& args : cases) {
        const auto r = runCli(args);
        EXPECT_EQ(r.exitCode, 2) << args.back() << "\n" << r.err;
        EXPECT_NE(r.err.find("usage error"), std::string::npos) << r.err;
    }
    const auto missing = runCli({"diagnose", "/nonexistent/x.wav", "--line-hz", "60", "--poles", "4"});
    EXPECT_EQ(missing.exitCode, 1);
    EXPECT_NE(missing.err.find("/nonexistent/x.wav"), std::string::npos);
}

} // namespace
} // namespace humwise::cli
