// The fleet file: export -> import into a new store -> export again is byte-identical; broken
// files are refused with the line and the field.
#include "core/io/FleetFile.h"
#include "storage/FleetStore.h"
#include "support/TestSupport.h"
#include "workflow/FixtureFleet.h"

#include <gtest/gtest.h>

#include <random>

namespace humwise::io {
namespace {

namespace fs = std::filesystem;

TEST(FleetFile, ExportImportExportIsByteIdentical) {
    const std::string first = writeFleet(test::smallFleet());
    std::string second;
    {
        const auto dir = test::freshFolder("fleet-roundtrip");
        auto store = storage::FleetStore::open(dir / "a.db");
        const auto parsed = parseFleet(first, "fleet.json");
        ASSERT_TRUE(parsed.ok()) << parsed.error().message();
        storage::Transaction tx(store->database());
        store->saveFleet(parsed.value());
        tx.commit();
        second = writeFleet(store->loadFleet());
    }
    EXPECT_EQ(first, second);
    const auto again = parseFleet(second, "fleet.json");
    ASSERT_TRUE(again.ok());
    EXPECT_EQ(writeFleet(again.value()), first);
}

TEST(FleetFile, BrokenFilesNameTheLineAndTheField) {
    const std::string good = writeFleet(test::smallFleet());
    const auto expectError = [](const std::string& text, const std::string& words) {
        const auto r = parseFleet(text, "plant.json");
        ASSERT_FALSE(r.ok()) << words;
        EXPECT_NE(r.error().message().find(words), std::string::npos) << r.error().message();
        EXPECT_NE(r.error().message().find("plant.json"), std::string::npos);
    };
    expectError("", "empty");
    expectError("{\"format\": \"humwise-fleet\", ", "not valid JSON");
    expectError("[1, 2]", "one JSON object");
    std::string s = good;
    s.replace(s.find("\"version\": 1"), 12, "\"version\": 7");
    expectError(s, "version 7 is not supported");
    s = good;
    s.replace(s.find("\"rolling_elements\": 8"), 21, "\"rolling_elements\": 8.5");
    expectError(s, "whole number");
    s = good;
    s.replace(s.find("\"element_diameter\": 17.5"), 24, "\"element_diameter\": 95");
    expectError(s, "smaller than the pitch diameter");
    s = good;
    s.replace(s.find("\"P-1/DE-H\""), 10, "\"P-7/DE-H\"");
    expectError(s, "motor 'P-7' is not in the fleet");
    s = good;
    s.replace(s.find("\"P-1/DE-H\""), 10, "\"P-1/XX-H\"");
    expectError(s, "motor 'P-1' has no point 'XX-H'");
    s = good;
    s.replace(s.find("\"unit\": \"g\""), 11, "\"unit\": \"A\"");
    expectError(s, "is not a unit of acceleration");
    s = good;
    s.replace(s.find("\"tag\": \"P-2\""), 12, "\"tag\": \"P-1\"");
    expectError(s, "appears twice");
    s = good;
    s.replace(s.find("\"drive\""), 7, "\"drives\"");
    expectError(s, "unknown member \"drives\"");
}

TEST(FleetFile, RandomBytesNeverCrash) {
    std::mt19937_64 rng(4);
    const std::string good = writeFleet(test::smallFleet());
    for (int i = 0; i < 500; ++i) {
        std::string s = good;
        const int edits = 1 + static_cast<int>(rng() % 5);
        for (int e = 0; e < edits; ++e) s[rng() % s.size()] = static_cast<char>(rng() % 256);
        (void)parseFleet(s, "mutated.json"); // a value or a typed error; never a crash
        s.resize(rng() % s.size());
        (void)parseFleet(s, "truncated.json");
    }
    SUCCEED();
}

} // namespace
} // namespace humwise::io
