// CSV reader: the layout documented in CsvReader.h, and a typed error with the line number
// for every malformed file.
#include "core/io/CsvReader.h"

#include "core/io/WavTestWriter.h"
#include "support/TestSupport.h"

#include <gtest/gtest.h>

#include <chrono>
#include <cmath>
#include <limits>
#include <random>
#include <sstream>
#include <string>

namespace humwise::io {
namespace {

using Code = ReadError::Code;
using namespace std::string_literals;

const std::string kSource = "broken-input.csv";
// Standard gravity, exact by definition (3rd CGPM 1901; REFERENCE.md section 7).
constexpr double kGn = 9.80665;

Recording parsed(std::string_view text, const CsvReadOptions& options = {}) {
    auto r = parseCsv(text, "ok.csv", options);
    if (!r) throw std::runtime_error("unexpected error: " + r.error().message());
    return std::move(r).value();
}

// The reader must refuse `text` with `code`, reporting `line` (nullopt: no line) and naming
// the source in the message.
::testing::AssertionResult failsWith(std::string_view text, Code code, std::optional<std::size_t> line,
                                     const CsvReadOptions& options = {}) {
    const auto r = parseCsv(text, kSource, options);
    if (r) return ::testing::AssertionFailure() << "parsed as a valid recording, expected " << codeName(code);
    const ReadError& e = r.error();
    const std::string m = e.message();
    if (e.code != code) return ::testing::AssertionFailure() << "code " << codeName(e.code) << ", expected " << codeName(code) << " (" << m << ")";
    if (m.find(kSource) == std::string::npos) return ::testing::AssertionFailure() << "message does not name the source: " << m;
    if (e.line != line)
        return ::testing::AssertionFailure() << "line " << (e.line ? std::to_string(*e.line) : "none") << ", expected "
                                             << (line ? std::to_string(*line) : "none") << " (" << m << ")";
    if (line && m.find("line " + std::to_string(*line)) == std::string::npos)
        return ::testing::AssertionFailure() << "message does not show the line: " << m;
    return ::testing::AssertionSuccess() << m;
}

// ---------------------------------------------------------------------------------------
// Layout

TEST(ParseCsv, UnitsInBracketsAndParenthesesAndTimeInSeconds) {
    const Recording rec = parsed("time [s],DE-H [g],DE-V (mm/s),I (A)\n"
                                 "0.000,0.5,2,1\n"
                                 "0.001,-1,4,2\n"
                                 "0.002,0,6,3\n");
    EXPECT_DOUBLE_EQ(rec.sampleRateHz, 1000.0);
    EXPECT_EQ(rec.source, "ok.csv");
    EXPECT_FALSE(rec.startTime.has_value());
    ASSERT_EQ(rec.channels.size(), 3u); // the time column is not a channel
    EXPECT_EQ(rec.channels[0].name, "DE-H");
    EXPECT_EQ(rec.channels[0].quantity, Quantity::Acceleration);
    EXPECT_DOUBLE_EQ(rec.channels[0].samples[0], 0.5 * kGn);
    EXPECT_DOUBLE_EQ(rec.channels[0].samples[1], -kGn);
    EXPECT_EQ(rec.channels[1].name, "DE-V");
    EXPECT_EQ(rec.channels[1].quantity, Quantity::Velocity);
    EXPECT_DOUBLE_EQ(rec.channels[1].samples[2], 6e-3);
    EXPECT_EQ(rec.channels[2].quantity, Quantity::Current);
    EXPECT_EQ(rec.frameCount(), 3u);
    EXPECT_FALSE(rec.channels[0].fullScale.has_value());
}

TEST(ParseCsv, TimeInMilliseconds) {
    const Recording rec = parsed("t [ms],x [m/s^2]\n0,1\n0.5,2\n1.0,3\n1.5,4\n");
    EXPECT_DOUBLE_EQ(rec.sampleRateHz, 2000.0);
    ASSERT_EQ(rec.channels.size(), 1u);
    EXPECT_EQ(rec.channels[0].samples, (std::vector<double>{1, 2, 3, 4}));
}

TEST(ParseCsv, TimeColumnNamedWithoutUnitAndNotFirst) {
    const Recording rec = parsed("x [g],timestamp\n1,10.00\n2,10.25\n3,10.50\n");
    EXPECT_DOUBLE_EQ(rec.sampleRateHz, 4.0);
    ASSERT_EQ(rec.channels.size(), 1u);
    EXPECT_EQ(rec.channels[0].name, "x");
}

TEST(ParseCsv, MetadataSampleRateAndStartTime) {
    const Recording rec = parsed("# sample_rate_hz: 25600\n"
                                 "# start_time: 2026-03-04T10:15:00Z\n"
                                 "# a plain comment\n"
                                 "DE [g]\n0.1\n0.2\n0.3\n");
    EXPECT_EQ(rec.sampleRateHz, 25600.0);
    using namespace std::chrono;
    ASSERT_TRUE(rec.startTime.has_value());
    const sys_time<milliseconds> expected = sys_days{year{2026} / March / 4} + hours{10} + minutes{15};
    EXPECT_EQ(*rec.startTime, expected);
    EXPECT_EQ(rec.startTime->time_since_epoch().count(), 1772619300000LL); // date -u -d 2026-03-04T10:15:00Z +%s
    ASSERT_EQ(rec.channels.size(), 1u);
    EXPECT_DOUBLE_EQ(rec.channels[0].samples[2], 0.3 * kGn);
}

TEST(ParseCsv, MetadataWithEqualsSignAndTimeZoneOffset) {
    const Recording rec = parsed("# Sample_Rate_Hz = 100\n# start_time = 2026-03-04T12:15:00+02:00\nv [mm/s]\n1\n2\n");
    EXPECT_EQ(rec.sampleRateHz, 100.0);
    using namespace std::chrono;
    ASSERT_TRUE(rec.startTime.has_value());
    EXPECT_EQ(*rec.startTime, sys_time<milliseconds>(sys_days{year{2026} / March / 4} + hours{10} + minutes{15}));
}

TEST(ParseCsv, MetadataRateAgreeingWithTimeColumnWithinOnePercent) {
    const Recording rec = parsed("# sample_rate_hz: 1005\ntime [s],x [g]\n0,1\n0.001,2\n0.002,3\n");
    EXPECT_DOUBLE_EQ(rec.sampleRateHz, 1000.0); // the time column wins
}

TEST(ParseCsv, SemicolonDelimiter) {
    const Recording rec = parsed("time [s];a [g];b [g]\n0;1;2\n0.5;3;4\n");
    EXPECT_DOUBLE_EQ(rec.sampleRateHz, 2.0);
    ASSERT_EQ(rec.channels.size(), 2u);
    EXPECT_DOUBLE_EQ(rec.channels[1].samples[1], 4 * kGn);
}

TEST(ParseCsv, TabDelimiter) {
    const Recording rec = parsed("time (s)\ta (g)\tb (mm/s)\n0\t1\t2\n0.5\t3\t4\n1.0\t5\t6\n");
    EXPECT_DOUBLE_EQ(rec.sampleRateHz, 2.0);
    ASSERT_EQ(rec.channels.size(), 2u);
    EXPECT_EQ(rec.channels[1].name, "b");
    EXPECT_DOUBLE_EQ(rec.channels[1].samples[2], 6e-3);
}

TEST(ParseCsv, CrlfLineEndings) {
    const Recording rec = parsed("# sample_rate_hz: 10\r\nx [g]\r\n1\r\n2\r\n3\r\n");
    EXPECT_EQ(rec.sampleRateHz, 10.0);
    ASSERT_EQ(rec.channels.size(), 1u);
    EXPECT_EQ(rec.channels[0].name, "x");
    EXPECT_EQ(rec.frameCount(), 3u);
}

TEST(ParseCsv, Utf8ByteOrderMark) {
    const Recording rec = parsed("\xEF\xBB\xBFtime [s],x [g]\n0,1\n1,2\n");
    EXPECT_DOUBLE_EQ(rec.sampleRateHz, 1.0);
    ASSERT_EQ(rec.channels.size(), 1u);
    EXPECT_EQ(rec.channels[0].name, "x");
}

TEST(ParseCsv, QuotedFields) {
    const Recording rec = parsed("\"time [s]\",\"DE [g]\"\n\"0\",\"1.5\"\n\"0.25\", \"-2\"\n");
    EXPECT_DOUBLE_EQ(rec.sampleRateHz, 4.0);
    ASSERT_EQ(rec.channels.size(), 1u);
    EXPECT_EQ(rec.channels[0].name, "DE");
    EXPECT_DOUBLE_EQ(rec.channels[0].samples[1], -2 * kGn);
}

// CsvReader.h: "nan" and "inf" are read; the quality checks flag them later.
TEST(ParseCsv, NanAndInfinityValuesAreRead) {
    const Recording rec = parsed("# sample_rate_hz: 100\nx [m/s^2]\nnan\ninf\n-inf\nNaN\n1\n");
    const auto& s = rec.channels.at(0).samples;
    ASSERT_EQ(s.size(), 5u);
    EXPECT_TRUE(std::isnan(s[0]));
    EXPECT_EQ(s[1], std::numeric_limits<double>::infinity());
    EXPECT_EQ(s[2], -std::numeric_limits<double>::infinity());
    EXPECT_TRUE(std::isnan(s[3]));
    EXPECT_EQ(s[4], 1.0);
}

TEST(ParseCsv, UnitlessColumnsTakeTheDefaultsWithScale) {
    CsvReadOptions options;
    options.channels.perChannel.push_back({"", Unit::MillimetrePerSecond, 2.0}); // first data column
    options.channels.defaults = {"", Unit::Ampere, 0.1};
    const Recording rec = parsed("time [s],v,i,a [g]\n0,1,10,1\n0.5,2,20,2\n", options);
    ASSERT_EQ(rec.channels.size(), 3u);
    EXPECT_EQ(rec.channels[0].quantity, Quantity::Velocity);
    EXPECT_DOUBLE_EQ(rec.channels[0].samples[1], 2 * 2.0 * 1e-3);
    EXPECT_EQ(rec.channels[1].quantity, Quantity::Current);
    EXPECT_DOUBLE_EQ(rec.channels[1].samples[1], 20 * 0.1);
    // A column with its own unit ignores the default scale.
    EXPECT_EQ(rec.channels[2].quantity, Quantity::Acceleration);
    EXPECT_DOUBLE_EQ(rec.channels[2].samples[1], 2 * kGn);
}

TEST(ParseCsv, CallerRateWhenTheFileHasNone) {
    CsvReadOptions options;
    options.sampleRateHz = 512.0;
    const Recording rec = parsed("x [g],y [g]\n1,2\n3,4\n", options);
    EXPECT_EQ(rec.sampleRateHz, 512.0);
    EXPECT_EQ(rec.channels.size(), 2u);
}

TEST(ParseCsv, BlankLinesAndCommentsBetweenRowsAreSkipped) {
    const Recording rec = parsed("# sample_rate_hz: 50\nx [g]\n1\n\n   \n# note\n2\n3\n");
    EXPECT_EQ(rec.frameCount(), 3u);
}

TEST(ReadCsv, StreamAndFile) {
    const std::string text = "time [s],x [g]\n0,1\n0.01,2\n0.02,3\n";
    std::istringstream in(text);
    const auto fromStream = readCsv(in, "stream");
    ASSERT_TRUE(fromStream) << fromStream.error().message();
    EXPECT_EQ(fromStream.value().source, "stream");
    const auto path = test::outputDir() / "io" / "stream-and-file.csv";
    test::writeText(path, text);
    const auto fromFile = readCsvFile(path);
    ASSERT_TRUE(fromFile) << fromFile.error().message();
    EXPECT_EQ(fromFile.value().source, path.string());
    EXPECT_NEAR(fromFile.value().sampleRateHz, 100.0, 1e-9);
    EXPECT_EQ(fromStream.value().channels[0].samples, fromFile.value().channels[0].samples);
}

// ---------------------------------------------------------------------------------------
// Malformed files: one test per defect.

TEST(ParseCsvError, Empty) { EXPECT_TRUE(failsWith("", Code::Empty, std::nullopt)); }

TEST(ParseCsvError, HeaderOnly) {
    EXPECT_TRUE(failsWith("# sample_rate_hz: 100\ntime [s],x [g]\n", Code::NoData, 2));
    EXPECT_TRUE(failsWith("x [g]\n\n\n", Code::NoData, 1));
}

TEST(ParseCsvError, OnlyCommentsIsNoHeader) {
    EXPECT_TRUE(failsWith("# just a comment\n\n", Code::BadHeader, std::nullopt));
}

TEST(ParseCsvError, NoHeaderFirstLineNumeric) {
    EXPECT_TRUE(failsWith("0.0,1.5\n0.1,2.5\n", Code::BadHeader, 1));
    EXPECT_TRUE(failsWith("# sample_rate_hz: 10\n-3e-2;7\n", Code::BadHeader, 2));
}

TEST(ParseCsvError, WrongColumnCountNamesTheLine) {
    EXPECT_TRUE(failsWith("time [s],x [g],y [g]\n0,1,2\n0.1,1,2\n0.2,1\n0.3,1,2\n", Code::WrongColumnCount, 4));
    EXPECT_TRUE(failsWith("# c\nx [g]\n1\n2,3\n", Code::WrongColumnCount, 4));
}

TEST(ParseCsvError, BadNumberNamesLineAndColumn) {
    const std::string text = "time [s],DE [g],FE [g]\n0,1,2\n0.1,1,2\n0.2,1,12abc\n";
    EXPECT_TRUE(failsWith(text, Code::BadNumber, 4));
    const std::string m = parseCsv(text, kSource).error().message();
    EXPECT_NE(m.find("column 3"), std::string::npos) << m;
    EXPECT_NE(m.find("'FE'"), std::string::npos) << m;
    EXPECT_NE(m.find("12abc"), std::string::npos) << m;
}

TEST(ParseCsvError, EmptyFieldIsABadNumber) {
    EXPECT_TRUE(failsWith("time [s],x [g]\n0,1\n0.1,\n", Code::BadNumber, 3));
}

TEST(ParseCsvError, DecimalCommaIsABadNumber) {
    EXPECT_TRUE(failsWith("time [s];x [g]\n0;1,5\n", Code::BadNumber, 2));
}

TEST(ParseCsvError, NonUniformTimeGap) {
    // The row at line 10 comes 5 ms after the previous one where the step is 1 ms.
    EXPECT_TRUE(failsWith("time [ms],x [g]\n0,1\n1,1\n2,1\n3,1\n4,1\n5,1\n6,1\n7,1\n12,1\n13,1\n", Code::NonUniformTime, 10));
}

TEST(ParseCsvError, TimeDecreasingInOneRow) {
    EXPECT_TRUE(failsWith("time [s],x [g]\n0,1\n1,1\n2,1\n1.5,1\n4,1\n5,1\n6,1\n", Code::NonUniformTime, 5));
}

TEST(ParseCsvError, TimeDecreasingThroughout) {
    // The first row at which time fails to increase is named.
    EXPECT_TRUE(failsWith("time [s],x [g]\n3,1\n2,1\n1,1\n", Code::NonUniformTime, 3));
}

TEST(ParseCsvError, ConstantTime) {
    EXPECT_TRUE(failsWith("time [s],x [g]\n1,1\n1,1\n", Code::NonUniformTime, 3));
}

TEST(ParseCsvError, DeclaredRateDisagreesWithTimeColumn) {
    EXPECT_TRUE(failsWith("# sample_rate_hz: 1000\ntime [s],x [g]\n0,1\n0.002,1\n0.004,1\n", Code::NonUniformTime, 2));
    CsvReadOptions options;
    options.sampleRateHz = 1000.0;
    EXPECT_TRUE(failsWith("time [s],x [g]\n0,1\n0.002,1\n0.004,1\n", Code::NonUniformTime, 1, options));
}

TEST(ParseCsvError, NoTimeColumnAndNoRate) {
    EXPECT_TRUE(failsWith("# no rate here\nx [g],y [g]\n1,2\n3,4\n", Code::BadHeader, 2));
}

TEST(ParseCsvError, ImplausibleMetadataRate) {
    EXPECT_TRUE(failsWith("# sample_rate_hz: -5\nx [g]\n1\n", Code::BadField, 1));
    EXPECT_TRUE(failsWith("# sample_rate_hz: fast\nx [g]\n1\n", Code::BadField, 1));
}

TEST(ParseCsvError, BadStartTime) {
    EXPECT_TRUE(failsWith("# sample_rate_hz: 10\n# start_time: yesterday\nx [g]\n1\n", Code::BadField, 2));
}

TEST(ParseCsvError, UnknownUnitInHeader) {
    const std::string text = "time [s],speed [furlong/fortnight]\n0,1\n1,1\n";
    EXPECT_TRUE(failsWith(text, Code::BadHeader, 1));
    EXPECT_NE(parseCsv(text, kSource).error().message().find("furlong"), std::string::npos);
    EXPECT_TRUE(failsWith("time [s],x (bananas)\n0,1\n1,1\n", Code::BadHeader, 1));
}

TEST(ParseCsvError, TwoTimeColumns) {
    EXPECT_TRUE(failsWith("time [s],t [ms],x [g]\n0,0,1\n1,1000,1\n", Code::BadHeader, 1));
}

TEST(ParseCsvError, OnlyATimeColumn) {
    EXPECT_TRUE(failsWith("time [s]\n0\n1\n", Code::BadHeader, 1));
}

TEST(ParseCsvError, ColumnWithoutName) {
    EXPECT_TRUE(failsWith("time [s],x [g],\n0,1,2\n", Code::BadHeader, 1));
}

TEST(ParseCsvError, BinaryNulBytes) {
    const std::string text = "time [s],x [g]\n0,1\n0.1,1\0\0\x01\n"s;
    EXPECT_TRUE(failsWith(text, Code::NotRecognised, std::nullopt));
}

TEST(ParseCsvError, OneRowCannotGiveARate) {
    EXPECT_TRUE(failsWith("time [s],x [g]\n0,1\n", Code::NoData, 1));
}

// The line reported for a time defect must be the row's own line, also when blank or
// comment lines (which the reader skips) sit between data rows.
TEST(ParseCsvError, NonUniformTimeLineCountsSkippedLines) {
    // Lines 6 and 7 are skipped; the 5 ms gap is at line 11.
    EXPECT_TRUE(failsWith("time [ms],x [g]\n0,1\n1,1\n2,1\n3,1\n\n# pause\n4,1\n5,1\n6,1\n11,1\n12,1\n", Code::NonUniformTime, 11));
}

TEST(ParseCsvError, NonFiniteTimeNamesItsRow) {
    EXPECT_TRUE(failsWith("time [s],x [g]\n0,1\n0.1,1\nnan,1\n0.3,1\n", Code::BadNumber, 4));
}

// ---------------------------------------------------------------------------------------
// Robustness

TEST(ParseCsvFuzz, RandomTextNeverCrashes) {
    std::mt19937 rng(1110);
    const std::string alphabet = "0123456789.,;\t\n\r-+eE #[]()\"abcgmstinf:=_/";
    std::uniform_int_distribution<int> length(0, 512), byte(0, 255), mode(0, 3), rows(1, 40), edits(1, 3);
    std::uniform_int_distribution<std::size_t> pick(0, alphabet.size() - 1);
    const std::string headers[] = {"time [s],x [g]\n", "# sample_rate_hz: 100\nx [g];y (mm/s)\n", "t [ms]\ta\tb\n"};
    int values = 0;
    for (int iteration = 0; iteration < 2000; ++iteration) {
        std::string text;
        switch (mode(rng)) {
        case 0: // random CSV-ish characters
            for (int i = length(rng); i > 0; --i) text += alphabet[pick(rng)];
            break;
        case 1: // a valid header, then random characters
            text = headers[iteration % 3];
            for (int i = length(rng); i > 0; --i) text += alphabet[pick(rng)];
            break;
        case 2: // random bytes
            for (int i = length(rng); i > 0; --i) text += static_cast<char>(byte(rng));
            break;
        default: { // a valid file with a few characters replaced
            text = "# sample_rate_hz: 1000\ntime [ms],x [g],y [mm/s]\n";
            for (int r = 0, n = rows(rng); r < n; ++r) text += std::to_string(r) + "," + std::to_string(r % 7) + ",-" + std::to_string(r % 3) + ".5\n";
            std::uniform_int_distribution<std::size_t> where(0, text.size() - 1);
            for (int e = edits(rng); e > 0; --e) text[where(rng)] = alphabet[pick(rng)];
        }
        }
        const auto r = parseCsv(text, kSource);
        if (r) {
            ++values;
            const Recording& rec = r.value();
            ASSERT_FALSE(rec.channels.empty()) << "iteration " << iteration;
            ASSERT_TRUE(rec.sampleRateHz > 0 && std::isfinite(rec.sampleRateHz)) << "iteration " << iteration;
            for (const auto& ch : rec.channels) ASSERT_EQ(ch.samples.size(), rec.frameCount()) << "iteration " << iteration;
        } else {
            ASSERT_NE(r.error().message().find(kSource), std::string::npos) << "iteration " << iteration;
        }
    }
    EXPECT_GT(values, 0) << "no random text got past the header";
}

} // namespace
} // namespace humwise::io
