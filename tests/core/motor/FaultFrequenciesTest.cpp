// Fault-frequency calculator against the worked 4-pole 50 Hz table of REFERENCE.md 4 (computed
// there from the formulas of Thomson & Fenger 2001, Nandi, Toliyat & Li 2005 and others) and the
// CWRU bearing-in-current example.
#include "core/motor/FaultFrequencies.h"

#include <gtest/gtest.h>

#include <map>

namespace humwise::motor {
namespace {

std::map<std::string, double> byId(const std::vector<FaultLine>& lines) {
    std::map<std::string, double> m;
    for (const auto& l : lines) m[l.id] = l.frequencyHz;
    return m;
}

Motor fourPole28Bars() {
    Motor m;
    m.tag = "M";
    m.nameplate.supplyHz = 50;
    m.nameplate.poles = 4;
    m.nameplate.ratedSpeedRpm = 1470;
    m.nameplate.rotorBars = 28;
    return m;
}

// REFERENCE.md 4: 4-pole, 50 Hz, 1470 r/min -> s = 0.02, fr = 24.5 Hz, 2sf = 2.0 Hz.
TEST(FaultFrequencies, FourPoleFiftyHertzWorkedTable) {
    const auto op = operatingPointFromSpeed(50, 4, 1470);
    EXPECT_NEAR(op.slip(), 0.02, 1e-12);
    EXPECT_NEAR(op.shaftHz, 24.5, 1e-12);
    EXPECT_NEAR(op.polePassHz(), 2.0, 1e-12);
    const auto f = byId(faultLines(fourPole28Bars(), op));
    const std::vector<std::pair<const char*, double>> expected = {
        {"BRB_LOWER_1", 48.0}, {"BRB_UPPER_1", 52.0}, {"BRB_LOWER_2", 46.0}, {"BRB_UPPER_2", 54.0},
        {"ECC_LOWER_1", 25.5}, {"ECC_UPPER_1", 74.5}, {"ECC_LOWER_2", 1.0}, {"ECC_UPPER_2", 99.0},
        {"PSH_NU-1", 636.0}, {"PSH_NU+1", 736.0}, {"PSH_NU-3", 536.0}, {"PSH_NU+3", 836.0},
        {"DECC_ND-1_NU+1", 711.5}, {"DECC_ND+1_NU+1", 760.5}, {"DECC_ND-1_NU-1", 611.5}, {"DECC_ND+1_NU-1", 660.5},
        {"ST_N1_K-1", 25.5}, {"ST_N1_K+1", 74.5}, {"ST_N1_K-3", 125.5}, {"ST_N1_K+3", 174.5},
        {"ST_N2_K-1", 1.0}, {"ST_N2_K+1", 99.0},
        {"1X", 24.5}, {"2X", 49.0}, {"2LF", 100.0}, {"PP", 2.0}, {"1X-PP", 22.5}, {"RBP", 686.0}, {"RBP+2LF", 786.0},
    };
    for (const auto& [id, hz] : expected) {
        ASSERT_TRUE(f.count(id)) << id;
        EXPECT_NEAR(f.at(id), hz, 1e-9) << id;
    }
}

// REFERENCE.md 4: 60 Hz supply, CWRU 6205 BPFO at 1772 r/min (105.870 Hz): m = 1 -> 45.870 and
// 165.870 Hz; m = 2 -> 151.741 and 271.741 Hz.
TEST(FaultFrequencies, BearingComponentsInCurrent) {
    Motor m;
    m.tag = "CWRU";
    m.nameplate.supplyHz = 60;
    m.nameplate.poles = 4;
    m.driveEndBearing = Bearing{"6205", BearingFactors{3.5848, 5.4152, 2.357, 0.39828}};
    const auto f = byId(faultLines(m, operatingPointFromSpeed(60, 4, 1772)));
    EXPECT_NEAR(f.at("BPFO_DE_1"), 105.870, 2e-3);
    EXPECT_NEAR(f.at("I_BPFO_DE_M1-"), 45.870, 2e-3);
    EXPECT_NEAR(f.at("I_BPFO_DE_M1+"), 165.870, 2e-3);
    EXPECT_NEAR(f.at("I_BPFO_DE_M2-"), 151.741, 4e-3);
    EXPECT_NEAR(f.at("I_BPFO_DE_M2+"), 271.741, 4e-3);
    // 2 x BSF with FTF sidebands and BPFI with 1X sidebands are listed for the envelope.
    EXPECT_NEAR(f.at("2xBSF_DE_1"), 2 * 2.357 * 1772 / 60.0, 1e-9);
    EXPECT_NEAR(f.at("BPFI_DE+1X") - f.at("BPFI_DE_1"), 1772 / 60.0, 1e-9);
}

// REFERENCE.md 5: CWRU motor, 4-pole 60 Hz at 1797/1772/1750/1730 r/min -> slip 0.167/1.556/
// 2.778/3.889 % and 2sf 0.20/1.87/3.33/4.67 Hz.
TEST(FaultFrequencies, CwruSlipsAndPolePass) {
    const std::vector<std::tuple<double, double, double>> rows = {
        {1797, 0.167, 0.20}, {1772, 1.556, 1.87}, {1750, 2.778, 3.33}, {1730, 3.889, 4.67}};
    for (const auto& [rpm, slipPct, pp] : rows) {
        const auto op = operatingPointFromSpeed(60, 4, rpm);
        EXPECT_NEAR(op.slip() * 100, slipPct, 1e-3) << rpm;
        EXPECT_NEAR(op.polePassHz(), pp, 5e-3) << rpm;
    }
    EXPECT_NEAR(operatingPointFromSlip(60, 4, 0.02778).speedRpm(), 1750, 0.1);
}

TEST(FaultFrequencies, VanePassUsesTheDrivenShaft) {
    Motor m = fourPole28Bars();
    m.driven.vanesOrBlades = 7;
    m.driven.speedRatio = 0.5; // belt drive halving the speed
    const auto f = byId(faultLines(m, operatingPointFromSpeed(50, 4, 1470)));
    EXPECT_NEAR(f.at("VP"), 7 * 24.5 * 0.5, 1e-9);
}

TEST(FaultFrequencies, ImpossibleOperatingPointsAreRefused) {
    EXPECT_THROW(operatingPointFromSpeed(50, 3, 1470), std::invalid_argument);
    EXPECT_THROW(operatingPointFromSlip(50, 4, 1.5), std::invalid_argument);
    EXPECT_THROW(operatingPointFromSpeed(0, 4, 1470), std::invalid_argument);
}

} // namespace
} // namespace humwise::motor
