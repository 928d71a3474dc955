// Units and levels. Check values: REFERENCE.md section 7 (standard gravity, 3rd CGPM 1901;
// 1 in = 25.4 mm exactly; ISO 1683 reference values as quoted there).
#include "core/model/Units.h"

#include <gtest/gtest.h>

#include <cmath>

namespace humwise {
namespace {

TEST(Units, StandardGravityAndInchAreExact) {
    EXPECT_DOUBLE_EQ(convert(1.0, Unit::G, Unit::MetrePerSecond2), 9.80665);
    EXPECT_DOUBLE_EQ(convert(1.0, Unit::InchPerSecond, Unit::MillimetrePerSecond), 25.4);
    EXPECT_DOUBLE_EQ(convert(1.0, Unit::Mil, Unit::Micrometre), 25.4);
}

TEST(Units, ConvertingBetweenQuantitiesIsRefused) {
    EXPECT_THROW(convert(1.0, Unit::G, Unit::MillimetrePerSecond), std::invalid_argument);
}

TEST(Units, ParsesCommonSpellings) {
    EXPECT_EQ(parseUnit("mm/s"), Unit::MillimetrePerSecond);
    EXPECT_EQ(parseUnit("m/s^2"), Unit::MetrePerSecond2);
    EXPECT_EQ(parseUnit("\xC2\xB5m"), Unit::Micrometre); // micro sign
    EXPECT_EQ(parseUnit("ips"), Unit::InchPerSecond);
    EXPECT_EQ(parseUnit("furlong"), std::nullopt);
    EXPECT_EQ(parseQuantity("Velocity"), Quantity::Velocity);
}

// REFERENCE.md 7: 1 g rms = 139.83 dB re 1 um/s^2; 1 mm/s = 120.0 dB re 1 nm/s; 1 um = 120.0 dB re 1 pm.
TEST(Units, Iso1683Levels) {
    EXPECT_NEAR(levelDb(9.80665, Quantity::Acceleration), 139.83, 0.005);
    EXPECT_NEAR(levelDb(1e-3, Quantity::Velocity), 120.0, 1e-9);
    EXPECT_NEAR(levelDb(1e-6, Quantity::Displacement), 120.0, 1e-9);
    EXPECT_TRUE(std::isinf(levelDb(0.0, Quantity::Velocity)));
}

} // namespace
} // namespace humwise
