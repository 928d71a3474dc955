// Thresholds as data: ISO zone boundaries (REFERENCE.md 2.1/2.2, from memory (verify) there, the
// 10816-1 breakpoints every fourth step of the R20 series) and the severity mapping.
#include "core/diagnosis/Thresholds.h"

#include <gtest/gtest.h>

#include <cmath>

namespace humwise::diagnosis {
namespace {

TEST(Thresholds, Iso20816ZoneBoundaries) {
    motor::SeverityClass c;
    c.group = 2;
    c.support = motor::SupportClass::Rigid;
    auto z = zoneBoundaries(c);
    EXPECT_DOUBLE_EQ(z.ab, 1.4);
    EXPECT_DOUBLE_EQ(z.bc, 2.8);
    EXPECT_DOUBLE_EQ(z.cd, 4.5);
    c.group = 1;
    c.support = motor::SupportClass::Flexible;
    z = zoneBoundaries(c);
    EXPECT_DOUBLE_EQ(z.ab, 3.5);
    EXPECT_DOUBLE_EQ(z.cd, 11.0);
    EXPECT_EQ(z.zoneOf(3.5), 'A'); // a value on a boundary belongs to the lower zone
    EXPECT_EQ(z.zoneOf(3.51), 'B');
    EXPECT_EQ(z.zoneOf(20), 'D');
}

// ISO 10816-1 breakpoints 0.71, 1.12, 1.8, 2.8, 4.5, 7.1, 11.2, 18 mm/s: 4 dB apart (R20 series).
TEST(Thresholds, Iso10816ClassesFollowTheR20Series) {
    motor::SeverityClass c;
    c.standard = motor::SeverityClass::Standard::Iso10816_1;
    std::vector<double> all;
    for (int k = 1; k <= 4; ++k) {
        c.iso10816Class = k;
        const auto z = zoneBoundaries(c);
        all.insert(all.end(), {z.ab, z.bc, z.cd});
    }
    for (double v : all) {
        const double steps = std::log10(v / 0.71) * 5.0; // 10^(1/5) per step
        EXPECT_NEAR(steps, std::round(steps), 0.03) << v;
    }
}

TEST(Thresholds, SeverityLimitsRiseOrFall) {
    const auto& t = defaultThresholds();
    EXPECT_EQ(t.brokenBarDb.severityOf(55), 0);
    EXPECT_EQ(t.brokenBarDb.severityOf(45), 1);
    EXPECT_EQ(t.brokenBarDb.severityOf(39), 2);
    EXPECT_EQ(t.brokenBarDb.severityOf(30), 3);
    EXPECT_EQ(t.currentUnbalancePercent.severityOf(4), 0);
    EXPECT_EQ(t.currentUnbalancePercent.severityOf(12), 2);
    EXPECT_FALSE(t.brokenBarDb.source.empty());
}

} // namespace
} // namespace humwise::diagnosis
