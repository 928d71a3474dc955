// Time-axis ticks of the trend plots (app/common/DateTicks.h): no label twice, month starts at
// steps that keep the count in bounds, day ticks for short spans. Calendar facts checked against
// the proleptic Gregorian calendar (2024 is a leap year; 1970-01-05 was a Monday).
#include "app/common/DateTicks.h"

#include <gtest/gtest.h>

#include <chrono>
#include <cmath>
#include <set>
#include <string>

namespace humwise::workflow {
namespace {

double dayOf(int y, unsigned m, unsigned d) {
    using namespace std::chrono;
    return static_cast<double>(sys_days{year{y} / month{m} / day{d}}.time_since_epoch().count());
}

void expectDistinctAndInside(const std::vector<DateTick>& ticks, double from, double to, int maxTicks) {
    std::set<std::string> seen;
    for (const auto& t : ticks) {
        EXPECT_TRUE(seen.insert(t.label).second) << "label twice: " << t.label;
        EXPECT_GE(t.day, from);
        EXPECT_LE(t.day, to);
    }
    EXPECT_LE(static_cast<int>(ticks.size()), maxTicks);
}

TEST(DateTicks, ThreeMonthsOfRoundsGetEachMonthOnce) {
    // Weekly ticks labelled by month printed "2026-03" up to four times; now one tick per month.
    const double from = dayOf(2026, 2, 20), to = dayOf(2026, 5, 10);
    const auto ticks = dateTicks(from, to, 8);
    expectDistinctAndInside(ticks, from, to, 8);
    ASSERT_EQ(ticks.size(), 3u);
    EXPECT_EQ(ticks[0].label, "2026-03");
    EXPECT_EQ(ticks[0].day, dayOf(2026, 3, 1));
    EXPECT_EQ(ticks[2].label, "2026-05");
}

TEST(DateTicks, YearsOfHistoryStepByWholeQuartersOrYears) {
    const double from = dayOf(2016, 7, 14), to = dayOf(2026, 11, 30);
    const auto ticks = dateTicks(from, to, 8);
    expectDistinctAndInside(ticks, from, to, 8);
    ASSERT_GE(ticks.size(), 4u);
    for (const auto& t : ticks) EXPECT_EQ(t.label.substr(4), "-01") << t.label; // yearly steps start in January
    EXPECT_EQ(ticks.front().label, "2018-01"); // even years since 1970 for a 2-year step
    const auto quarters = dateTicks(dayOf(2025, 2, 1), dayOf(2026, 2, 1), 6);
    expectDistinctAndInside(quarters, dayOf(2025, 2, 1), dayOf(2026, 2, 1), 6);
    ASSERT_EQ(quarters.size(), 4u);
    EXPECT_EQ(quarters.front().label, "2025-04");
    EXPECT_EQ(quarters.back().label, "2026-01");
}

TEST(DateTicks, ShortSpansGetDaysOrMondays) {
    const auto days = dateTicks(dayOf(2024, 2, 27), dayOf(2024, 3, 2), 8); // over a leap day
    expectDistinctAndInside(days, dayOf(2024, 2, 27), dayOf(2024, 3, 2), 8);
    ASSERT_EQ(days.size(), 5u);
    EXPECT_EQ(days[2].label, "2024-02-29");
    const auto weeks = dateTicks(dayOf(1970, 1, 1), dayOf(1970, 1, 30), 6);
    ASSERT_FALSE(weeks.empty());
    EXPECT_EQ(weeks.front().label, "1970-01-05"); // a Monday
    EXPECT_EQ(weeks[1].day - weeks[0].day, 7.0);
}

TEST(DateTicks, EmptyInvertedAndAbsurdSpans) {
    EXPECT_TRUE(dateTicks(10, 5, 6).empty());
    EXPECT_TRUE(dateTicks(std::nan(""), 5, 6).empty());
    EXPECT_TRUE(dateTicks(10.2, 10.8, 6).empty()); // no midnight inside
    const auto far = dateTicks(-1e9, 1e9, 6);
    expectDistinctAndInside(far, -1e9, 1e9, 6);
}

} // namespace
} // namespace humwise::workflow
