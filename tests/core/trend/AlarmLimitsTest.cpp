// Alarm limits and trend projection against the worked values of REFERENCE.md 10 (computed
// there): statistical limits of the baseline 1.8, 2.0, 2.1, 1.9, 2.2, 2.0 mm/s; the ISO example
// (group 2 rigid, baseline 1.0 mm/s); the projections of 2.0, 2.2, 2.5, 2.7, 3.0 mm/s on days
// 0..28 to 4.5 mm/s - day 70.56 (linear) and day 55.77 (exponential).
#include "core/trend/AlarmLimits.h"

#include <gtest/gtest.h>

#include <vector>

namespace humwise::trend {
namespace {

TEST(AlarmLimits, Statistical) {
    const std::vector<double> b{1.8, 2.0, 2.1, 1.9, 2.2, 2.0};
    const auto l = statisticalLimits(b);
    EXPECT_NEAR(*l.alert, 2.2828, 1e-4);
    EXPECT_NEAR(*l.alarm, 2.4243, 1e-4);
    EXPECT_THROW(statisticalLimits(std::vector<double>{1.0}), std::invalid_argument);
    // The floor binds only when the baseline scatters less than it: here sd 0.1414 > 5 % of 2.0.
    EXPECT_NEAR(*statisticalLimits(b, 0.05).alert, 2.2828, 1e-4);
}

TEST(AlarmLimits, StatisticalSpreadFloorKeepsLimitsOffAnExactlyRepeatingBaseline) {
    const std::vector<double> flat{0.70, 0.70, 0.70, 0.70};
    const auto bare = statisticalLimits(flat);
    EXPECT_DOUBLE_EQ(*bare.alert, 0.70); // no spread: both limits on the mean
    const auto floored = statisticalLimits(flat, 0.10);
    EXPECT_NEAR(*floored.alert, 0.84, 1e-12); // 0.70 + 2 x 0.07
    EXPECT_NEAR(*floored.alarm, 0.91, 1e-12); // 0.70 + 3 x 0.07
    EXPECT_NE(floored.source.find("10 % of the mean"), std::string::npos) << floored.source;
}

TEST(AlarmLimits, IsoZoneGuidance) {
    motor::SeverityClass c; // group 2 rigid: B/C 2.8, C/D 4.5
    const auto l = isoZoneLimits(1.0, diagnosis::zoneBoundaries(c));
    EXPECT_NEAR(*l.alert, 1.7, 1e-12);
    EXPECT_NEAR(*l.alarm, 5.625, 1e-12);
    EXPECT_NEAR(*isoZoneLimits(3.0, diagnosis::zoneBoundaries(c)).alert, 3.5, 1e-12); // capped at 1.25 x B/C
}

TEST(AlarmLimits, Percent) {
    const auto l = percentLimits(2.0);
    EXPECT_DOUBLE_EQ(*l.alert, 2.5);
    EXPECT_DOUBLE_EQ(*l.alarm, 4.0);
}

TEST(Projection, LinearAndExponentialCrossingDays) {
    const std::vector<double> days{0, 7, 14, 21, 28}, v{2.0, 2.2, 2.5, 2.7, 3.0};
    const auto lin = project(days, v, 4.5, Model::Linear);
    ASSERT_TRUE(lin && lin->crossingDay);
    EXPECT_NEAR(lin->slope, 0.035714, 1e-6);
    EXPECT_NEAR(lin->intercept, 1.98, 1e-9);
    EXPECT_NEAR(*lin->crossingDay, 70.56, 0.01);
    const auto exp = project(days, v, 4.5, Model::Exponential);
    ASSERT_TRUE(exp && exp->crossingDay);
    EXPECT_NEAR(exp->slope, 0.014510, 1e-6);
    EXPECT_NEAR(exp->intercept, 2.0033, 1e-4);
    EXPECT_NEAR(*exp->crossingDay, 55.77, 0.01);
}

TEST(Projection, NoCrossingWhenFallingOrTooFewPoints) {
    const std::vector<double> days{0, 7, 14}, falling{3.0, 2.5, 2.0};
    EXPECT_FALSE(project(days, falling, 4.5, Model::Linear)->crossingDay.has_value());
    EXPECT_FALSE(project(std::vector<double>{0, 1}, std::vector<double>{1, 2}, 4.5, Model::Linear).has_value());
    EXPECT_FALSE(project(days, std::vector<double>{1, 0, 2}, 4.5, Model::Exponential).has_value());
}

} // namespace
} // namespace humwise::trend
