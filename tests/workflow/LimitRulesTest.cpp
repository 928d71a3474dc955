// The limit rules shared by the workbench, the finding sheet and humwise-cli: which indicators
// take limits, the suggestions by method, the defaults and the analyst's stored limits first.
// Limit values are checked against core/trend/AlarmLimits (itself pinned to REFERENCE.md 10).
#include "app/common/LimitRules.h"

#include "core/diagnosis/Thresholds.h"
#include "support/TestSupport.h"
#include "workflow/FixtureFleet.h"

#include <gtest/gtest.h>

#include <vector>

namespace humwise::workflow {
namespace {

TEST(LimitRules, OnlyIndicatorsWorthALimitTakeOne) {
    for (const char* yes : {"velocity_rms", "env_bpfo", "env_bpfi", "1x", "2lf", "negative_sequence_ratio", "current_unbalance"})
        EXPECT_TRUE(deservesLimit(yes)) << yes;
    // sideband_db falls as a rotor fault grows: an upper limit would point the wrong way.
    for (const char* no : {"sideband_db", "slip", "line_hz", "", "velocity_rms.DE-H"}) EXPECT_FALSE(deservesLimit(no)) << no;
}

TEST(LimitRules, SuggestionsByMethodUseTheFirstRoundsOnly) {
    const auto motor = test::smallFleet().motors.front();
    const std::vector<double> history{1.8, 2.0, 2.1, 1.9, 2.2, 2.0, 9.0, 9.5}; // the last two are after the baseline
    const auto stat = suggestLimits(motor, "1x", "statistical", history);
    ASSERT_TRUE(stat.ok()) << stat.error();
    // sd of the first six is 0.1414 < 1/3 of 2.0: the floor applies, the alarm lands at +6 dB (x2).
    EXPECT_NEAR(*stat.value().alert, 2.0 + 2 * 2.0 / 3, 1e-12);
    EXPECT_NEAR(*stat.value().alarm, 4.0, 1e-12);
    const auto pct = suggestLimits(motor, "1x", "percent", history, 2);
    ASSERT_TRUE(pct.ok());
    EXPECT_NEAR(*pct.value().alert, 1.9 * 1.25, 1e-12);
    EXPECT_NEAR(*pct.value().alarm, 3.8, 1e-12);
    const auto iso = suggestLimits(motor, "velocity_rms", "iso-zone", history);
    ASSERT_TRUE(iso.ok());
    const auto expected = trend::isoZoneLimits(2.0, diagnosis::zoneBoundaries(motor.motor.severity));
    EXPECT_NEAR(*iso.value().alarm, *expected.alarm, 1e-12);
    EXPECT_NEAR(*iso.value().alert, *expected.alert, 1e-12);
}

TEST(LimitRules, SuggestionsRefuseWhatCannotBeAnswered) {
    const auto motor = test::smallFleet().motors.front();
    const std::vector<double> one{2.0};
    EXPECT_NE(suggestLimits(motor, "1x", "statistical", one).error().find("at least 2"), std::string::npos);
    EXPECT_NE(suggestLimits(motor, "1x", "iso-zone", one).error().find("velocity_rms"), std::string::npos);
    EXPECT_NE(suggestLimits(motor, "1x", "guess", one).error().find("unknown limit method 'guess'"), std::string::npos);
    EXPECT_NE(suggestLimits(motor, "slip", "percent", one).error().find("takes no alarm limit"), std::string::npos);
    EXPECT_FALSE(suggestLimits(motor, "1x", "percent", std::vector<double>{}).ok());
}

TEST(LimitRules, DefaultsAreIsoZonesForVelocityAndStatisticsForTheRest) {
    const auto motor = test::smallFleet().motors.front();
    const std::vector<double> h{1.0, 1.2, 0.8, 1.1};
    EXPECT_EQ(defaultLimits(motor, "velocity_rms", h).method, "iso-zone");
    const auto env = defaultLimits(motor, "env_bpfo", h);
    EXPECT_EQ(env.method, "statistical");
    EXPECT_NEAR(*env.alert, 3 * 1.025, 1e-12); // band power (g^2): spread floor = the mean, alarm x4 (+6 dB)
    EXPECT_NEAR(*env.alarm, 4 * 1.025, 1e-12);
    EXPECT_FALSE(defaultLimits(motor, "slip", h).alarm.has_value());
    EXPECT_FALSE(defaultLimits(motor, "1x", std::vector<double>{1.0}).alarm.has_value()); // one round: no statistics yet
}

TEST(LimitRules, StoredLimitsComeFirstAndClearingRestoresTheDefaults) {
    const auto dir = test::freshFolder("limit-rules");
    auto store = storage::FleetStore::open(dir / "s.db");
    {
        storage::Transaction tx(store->database());
        store->saveFleet(test::smallFleet());
        tx.commit();
    }
    const auto motor = test::smallFleet().motors.front();
    const std::vector<double> h{1.0, 1.2, 0.8, 1.1};
    storage::AlarmLimitRow row{"P-1", "DE-H", "1x", "absolute", 4.0, 6.0, std::nullopt, "set by the analyst", "2026-12-02T00:00:00.000Z"};
    store->setAlarmLimit(row);
    const auto stored = effectiveLimits(*store, motor, "DE-H", "1x", h);
    EXPECT_EQ(stored.method, "absolute");
    EXPECT_DOUBLE_EQ(*stored.alarm, 6.0);
    EXPECT_EQ(effectiveLimits(*store, motor, "DE-V", "1x", h).method, "statistical"); // another point: defaults
    EXPECT_TRUE(store->clearAlarmLimit("P-1", "DE-H", "1x"));
    EXPECT_FALSE(store->clearAlarmLimit("P-1", "DE-H", "1x"));
    EXPECT_EQ(effectiveLimits(*store, motor, "DE-H", "1x", h).method, "statistical");
}

} // namespace
} // namespace humwise::workflow
