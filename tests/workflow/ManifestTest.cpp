// The walkdown manifest parser: columns, metadata, optional fields, and every refusal with its line.
#include "core/io/Manifest.h"

#include <gtest/gtest.h>

#include <random>

namespace humwise::io {
namespace {

TEST(Manifest, ParsesMetadataAndOptionalColumns) {
    const auto r = parseManifest("# round_start: 2026-03-02T08:00:00Z\n# route: Monthly\n# technician: technician 2\n"
                                 "file,channel,motor,point,unit,sensitivity,time,speed_rpm,load_percent\r\n"
                                 "a.wav,2,P-1,DE-H,g,0.1,2026-03-02T08:05:00Z,1478,80\r\n"
                                 "b.wav,,P-1,I-A,,,,,\n",
                                 "manifest.csv");
    ASSERT_TRUE(r.ok()) << r.error().message();
    const auto& m = r.value();
    EXPECT_EQ(m.route, "Monthly");
    EXPECT_EQ(m.technician, "technician 2");
    ASSERT_EQ(m.entries.size(), 2u);
    EXPECT_EQ(m.entries[0].channel, 2);
    EXPECT_EQ(m.entries[0].unit, Unit::G);
    EXPECT_DOUBLE_EQ(*m.entries[0].sensitivity, 0.1);
    EXPECT_DOUBLE_EQ(*m.entries[0].speedRpm, 1478);
    EXPECT_EQ(m.entries[0].line, 5u);
    EXPECT_EQ(m.entries[1].channel, 1);
    EXPECT_FALSE(m.entries[1].unit.has_value());
}

TEST(Manifest, RefusalsNameTheLine) {
    const std::string head = "# round_start: 2026-03-02T08:00:00Z\nfile,channel,motor,point,sensitivity\n";
    const std::vector<std::pair<std::string, std::string>> cases = {
        {head + "a.wav,0,P-1,DE-H,\n", "line 3"},
        {head + "a.wav,1,P-1,DE-H,-1\n", "sensitivity must be > 0"},
        {head + "a.wav,1,P-1\n", "3 fields"},
        {head + ",1,P-1,DE-H,\n", "must not be empty"},
        {head + "a.wav,x,P-1,DE-H,\n", "channel 'x'"},
        {"# round_start: yesterday\nfile,motor,point\na,b,c\n", "not an ISO 8601"},
    };
    for (const auto& [text, words] : cases) {
        const auto r = parseManifest(text, "m.csv");
        ASSERT_FALSE(r.ok()) << words;
        EXPECT_NE(r.error().message().find(words), std::string::npos) << r.error().message();
    }
}

TEST(Manifest, RandomTextNeverCrashes) {
    std::mt19937_64 rng(9);
    const std::string good = "# round_start: 2026-03-02T08:00:00Z\nfile,channel,motor,point\na.wav,1,P-1,DE-H\n";
    for (int i = 0; i < 2000; ++i) {
        std::string s = good;
        for (int e = 0; e < 3; ++e) s[rng() % s.size()] = static_cast<char>(rng() % 256);
        s.resize(rng() % (s.size() + 1));
        (void)parseManifest(s, "m.csv");
    }
    SUCCEED();
}

} // namespace
} // namespace humwise::io
