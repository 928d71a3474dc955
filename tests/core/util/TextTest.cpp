// core/util/Text: the line reader both text readers (manifest, CSV) use for their line numbers,
// and the current time as stored in the fleet store.
#include "core/util/Text.h"

#include <gtest/gtest.h>

#include <string>
#include <utility>
#include <vector>

namespace humwise::text {
namespace {

std::vector<std::pair<std::size_t, std::string>> linesOf(std::string_view text) {
    std::vector<std::pair<std::size_t, std::string>> out;
    LineReader reader(text);
    std::string_view line;
    std::size_t number = 0;
    while (reader.next(line, number)) out.emplace_back(number, std::string(line));
    return out;
}

TEST(LineReader, SkipsBlankLinesKeepsTheirNumbersAndDropsCarriageReturns) {
    const auto lines = linesOf("a,b\r\n\r\n  \n c \nlast");
    const std::vector<std::pair<std::size_t, std::string>> expected = {{1, "a,b"}, {4, " c "}, {5, "last"}};
    EXPECT_EQ(lines, expected);
}

TEST(LineReader, EmptyAndBlankTextsHaveNoLines) {
    EXPECT_TRUE(linesOf("").empty());
    EXPECT_TRUE(linesOf("\n\r\n \t\n").empty());
    EXPECT_EQ(linesOf("x\n").size(), 1u);
}

TEST(IsoNow, ReadsBackAsTheCurrentTimeToTheMillisecond) {
    const auto before = std::chrono::floor<std::chrono::milliseconds>(std::chrono::system_clock::now());
    const std::string now = isoNow();
    const auto after = std::chrono::system_clock::now();
    const auto parsed = parseIsoTime(now);
    ASSERT_TRUE(parsed.has_value()) << now;
    EXPECT_GE(*parsed, before);
    EXPECT_LE(*parsed, after);
    EXPECT_EQ(now.size(), std::string("2026-03-04T10:15:00.000Z").size()) << now;
}

} // namespace
} // namespace humwise::text
