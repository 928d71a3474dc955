// The fleet file's JSON parser: the lines it gives values and errors (counted once through the
// document, on from the previous value, since a recount from the start for every value made a
// 1000-motor fleet file take 15 s to read).
#include "core/util/JsonReader.h"

#include <gtest/gtest.h>

#include <string>

namespace humwise::json {
namespace {

// {"a": [v0, v1, ...]} with value i on line i + 2, nested objects every tenth.
std::string document(int values) {
    std::string t = "{\n\"a\": [";
    for (int i = 0; i < values; ++i) {
        t += i ? ",\n" : "\n";
        t += i % 10 == 3 ? "{\"n\": " + std::to_string(i) + "}" : std::to_string(i);
    }
    return t + "\n]\n}\n";
}

TEST(JsonReader, EveryValueKnowsItsLine) {
    ParseError error;
    const auto v = parse(document(500), error);
    ASSERT_TRUE(v) << error.message;
    EXPECT_EQ(v->line(), 1u);
    const auto& items = v->find("a")->items();
    ASSERT_EQ(items.size(), 500u);
    for (std::size_t i = 0; i < items.size(); ++i) {
        EXPECT_EQ(items[i].line(), i + 3) << "value " << i;
        if (i % 10 == 3) {
            EXPECT_EQ(items[i].find("n")->line(), i + 3) << "member of value " << i;
        }
    }
}

TEST(JsonReader, ErrorsNameTheirLineAndColumn) {
    ParseError error;
    EXPECT_FALSE(parse(document(40) + "x", error));
    EXPECT_EQ(error.line, 45u);
    EXPECT_EQ(error.column, 1u);
    std::string badNumber = document(40);
    badNumber.replace(badNumber.find("\n17,"), 4, "\n1-7,"); // value 17 on line 20, malformed
    EXPECT_FALSE(parse(badNumber, error));
    EXPECT_EQ(error.line, 20u) << error.message;
    EXPECT_EQ(error.column, 1u) << error.message;
    EXPECT_NE(error.message.find("malformed number"), std::string::npos) << error.message;
}

} // namespace
} // namespace humwise::json
