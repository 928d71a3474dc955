// Motor model: bearing defect factors from geometry against published values, poles and slip,
// and validation messages.
#include "core/motor/Motor.h"

#include <gtest/gtest.h>

#include <algorithm>

namespace humwise::motor {
namespace {

bool mentions(const std::vector<ValidationIssue>& issues, const std::string& field, const std::string& words) {
    return std::any_of(issues.begin(), issues.end(), [&](const ValidationIssue& i) {
        return i.field == field && i.message.find(words) != std::string::npos;
    });
}

// CWRU Bearing Data Center, 6205-2RS JEM drive end, published multipliers: BPFI 5.4152,
// BPFO 3.5848, FTF 0.39828, rolling element 4.7135 (= 2 x BSF). Geometry (REFERENCE.md 3.2,
// from memory there but it reproduces every multiplier): 9 balls, 0.3126 in on 1.537 in.
TEST(Bearing, CwruDriveEndFactorsFromGeometry) {
    const auto f = factorsFromGeometry({9, 0.3126, 1.537, 0.0});
    EXPECT_NEAR(f.bpfi, 5.4152, 1e-4);
    EXPECT_NEAR(f.bpfo, 3.5848, 1e-4);
    EXPECT_NEAR(f.ftf, 0.39828, 1e-4);
    EXPECT_NEAR(2 * f.bsf, 4.7135, 1e-4);
}

// CWRU fan end, 6203-2RS JEM: BPFI 4.9469, BPFO 3.0530, FTF 0.3817, rolling element 3.9874
// (published); 8 balls, 0.2656 in on 1.122 in reproduces them within 5e-4.
TEST(Bearing, CwruFanEndFactorsFromGeometry) {
    const auto f = factorsFromGeometry({8, 0.2656, 1.122, 0.0});
    EXPECT_NEAR(f.bpfi, 4.9469, 5e-4);
    EXPECT_NEAR(f.bpfo, 3.0530, 5e-4);
    EXPECT_NEAR(f.ftf, 0.3817, 5e-4);
    EXPECT_NEAR(2 * f.bsf, 3.9874, 5e-4);
}

// MFPT bearing (published geometry: 8 rollers, 0.235 in on 1.245 in, contact angle 0) at 25 Hz:
// FTF 10.141, BPFO 81.124, BPFI 118.876, BSF 63.864 Hz (REFERENCE.md 3.3, computed there).
TEST(Bearing, MfptGeometryAt25Hz) {
    const auto f = factorsFromGeometry({8, 0.235, 1.245, 0.0});
    EXPECT_NEAR(25 * f.ftf, 10.141, 1e-3);
    EXPECT_NEAR(25 * f.bpfo, 81.124, 1e-3);
    EXPECT_NEAR(25 * f.bpfi, 118.876, 1e-3);
    EXPECT_NEAR(25 * f.bsf, 63.864, 1e-3);
}

// Curtin University bearing set readme (G. Forbes 2012, CC BY 4.0): 9 balls, 7.9375 mm on
// 38.50 mm; published FTF 0.3969, BPFO 3.572, BPFI 5.428, BSF 2.32 (single-spin convention).
TEST(Bearing, CurtinWorkedExample) {
    const auto f = factorsFromGeometry({9, 7.9375, 38.50, 0.0});
    EXPECT_NEAR(f.ftf, 0.3969, 1e-4);
    EXPECT_NEAR(f.bpfo, 3.572, 1e-3);
    EXPECT_NEAR(f.bpfi, 5.428, 1e-3);
    EXPECT_NEAR(f.bsf, 2.32, 5e-3);
}

// Non-zero contact angle (REFERENCE.md 3.4, computed there, no source): n 8, d 2, D 12, 15 deg,
// 25 Hz -> FTF 10.4877, BPFO 83.9012, BPFI 116.0988, BSF 73.0562 Hz; and the identities of 3.1.
TEST(Bearing, ContactAngleAndIdentities) {
    const auto f = factorsFromGeometry({8, 2.0, 12.0, 15.0});
    EXPECT_NEAR(25 * f.ftf, 10.4877, 1e-4);
    EXPECT_NEAR(25 * f.bpfo, 83.9012, 1e-4);
    EXPECT_NEAR(25 * f.bpfi, 116.0988, 1e-4);
    EXPECT_NEAR(25 * f.bsf, 73.0562, 1e-4);
    EXPECT_NEAR(f.bpfo + f.bpfi, 8.0, 1e-12);
    EXPECT_NEAR(f.bpfo, 8 * f.ftf, 1e-12);
    EXPECT_NEAR(f.bpfi, 8 * (1 - f.ftf), 1e-12);
}

// REFERENCE.md 5: synchronous speeds 3000/1500/1000/750 (50 Hz), 3600/1800/1200/900 (60 Hz);
// 4-pole 60 Hz at 1750 r/min -> s = 2.78 %.
TEST(Nameplate, PolesSynchronousSpeedAndSlip) {
    EXPECT_DOUBLE_EQ(synchronousSpeedRpm(50, 2), 3000);
    EXPECT_DOUBLE_EQ(synchronousSpeedRpm(50, 8), 750);
    EXPECT_DOUBLE_EQ(synchronousSpeedRpm(60, 6), 1200);
    Nameplate n;
    n.supplyHz = 60;
    n.ratedSpeedRpm = 1750;
    EXPECT_EQ(polesOf(n), 4);
    EXPECT_NEAR(*ratedSlip(n), 0.0278, 1e-4);
    n.supplyHz = 50;
    n.ratedSpeedRpm = 2950;
    EXPECT_EQ(polesOf(n), 2);
    n.ratedSpeedRpm = 975;
    EXPECT_EQ(polesOf(n), 6);
    n.poles = 6;
    EXPECT_EQ(polesOf(n), 6);
}

// Found by the fleet-file fuzzer: a supply frequency of 6e129 Hz made the derived pole count
// overflow its int conversion (undefined behaviour). Now no poles are derived beyond kMaxPoles,
// and validation names both problems.
TEST(Nameplate, AbsurdSupplyDerivesNoPolesAndIsRefused) {
    Nameplate n;
    n.supplyHz = 6.066e129;
    n.ratedSpeedRpm = 3520;
    EXPECT_EQ(polesOf(n), std::nullopt);
    EXPECT_EQ(ratedSlip(n), std::nullopt);
    n.supplyHz = 50;
    n.ratedSpeedRpm = 60.0 * 50 / 32.5; // 32 pole pairs: 64 poles, the most allowed
    EXPECT_EQ(polesOf(n), 64);
    n.ratedSpeedRpm = 60.0 * 50 / 33.5; // 66 poles: none derived
    EXPECT_EQ(polesOf(n), std::nullopt);
    n.supplyHz = 6.066e129;
    n.ratedSpeedRpm = 3520;
    const auto issues = validate(n);
    const auto has = [&](const std::string& field, const std::string& text) {
        for (const auto& i : issues)
            if (i.field == field && i.message.find(text) != std::string::npos) return true;
        return false;
    };
    EXPECT_TRUE(has("nameplate.supply_hz", "not between 1 and 400 Hz"));
    EXPECT_TRUE(has("nameplate.rated_speed_rpm", "would need more than 64 poles"));
}

TEST(Validation, ImpossibleBearingIsRefusedWithAClearMessage) {
    Motor m;
    m.tag = "P-101";
    m.nameplate.ratedSpeedRpm = 1470;
    m.driveEndBearing = Bearing{"6309", BearingGeometry{8, 40.0, 30.0, 0.0}};
    const auto issues = validate(m);
    EXPECT_TRUE(mentions(issues, "bearing_de.element_diameter", "must be smaller than the pitch diameter"));
    m.driveEndBearing = Bearing{"6309", BearingGeometry{2, 10.0, 60.0, 95.0}};
    const auto more = validate(m);
    EXPECT_TRUE(mentions(more, "bearing_de.rolling_elements", "3 to 200"));
    EXPECT_TRUE(mentions(more, "bearing_de.contact_angle_deg", "90 degrees"));
    m.driveEndBearing = Bearing{"x", BearingFactors{5.4, 3.5, 2.3, 0.4}};
    EXPECT_TRUE(mentions(validate(m), "bearing_de.bpfi", "BPFI must exceed BPFO"));
}

TEST(Validation, ImpossibleNameplatesAreRefused) {
    Nameplate n;
    n.supplyHz = 50;
    n.ratedSpeedRpm = 1500;
    n.poles = 4;
    EXPECT_TRUE(mentions(validate(n), "nameplate.rated_speed_rpm", "not below the synchronous speed 1500"));
    n.ratedSpeedRpm = 3100;
    n.poles.reset();
    EXPECT_TRUE(mentions(validate(n), "nameplate.rated_speed_rpm", "above the 2-pole synchronous speed"));
    n.ratedSpeedRpm = 1470;
    n.poles = 3;
    EXPECT_TRUE(mentions(validate(n), "nameplate.poles", "even number"));
    n.poles = 4;
    n.supplyHz = 0;
    EXPECT_TRUE(mentions(validate(n), "nameplate.supply_hz", "not between"));
    Nameplate ok;
    ok.ratedSpeedRpm = 1470;
    ok.ratedPowerKw = 55;
    EXPECT_TRUE(validate(ok).empty());
    Motor m;
    m.nameplate = ok;
    EXPECT_TRUE(mentions(validate(m), "tag", "needs a tag"));
}

} // namespace
} // namespace humwise::motor

namespace humwise::motor {
namespace {

// One naming of driven kinds serves the fleet file and the store: every kind round-trips, and
// a foreign name is refused rather than guessed.
TEST(DrivenKindNames, RoundTripAndRefuseUnknownNames) {
    for (const DrivenKind k : {DrivenKind::None, DrivenKind::CentrifugalPump, DrivenKind::Fan, DrivenKind::Blower, DrivenKind::Compressor,
                               DrivenKind::Conveyor, DrivenKind::Other})
        EXPECT_EQ(drivenKindFromName(drivenKindName(k)), k) << drivenKindName(k);
    EXPECT_STREQ(drivenKindName(DrivenKind::CentrifugalPump), "centrifugal-pump");
    EXPECT_EQ(drivenKindFromName("pump"), std::nullopt);
    EXPECT_EQ(drivenKindFromName(""), std::nullopt);
}

} // namespace
} // namespace humwise::motor
