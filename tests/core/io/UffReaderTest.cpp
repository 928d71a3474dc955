// Universal file reader, dataset 58 and 58b (core/io/UffReader.h). The tests implement and
// name this field layout (I-DEAS Universal File Format, dataset 58, as documented by the
// format's public description and by open-source readers such as pyuff):
//
//   "    -1"                       opens the dataset (I6)
//   "    58"                       dataset number (I6); binary: "    58b" + byte order
//                                  (1 little, 2 big endian), floating-point format (2 IEEE),
//                                  number of text lines (11), number of data bytes, ...
//   record 1..5   80A1             id lines: 1 point id, 3 date "DD-MMM-YY HH:MM:SS"
//   record 6      2(I5,I10),2(1X,A10,I10,I4)
//                                  function type, function id, version, load case, response
//                                  entity, response node, response direction, reference
//                                  entity, reference node, reference direction
//   record 7      3I10,3E13.5      ordinate data type (2 real single, 4 real double,
//                                  5/6 complex), number of values, abscissa spacing (1 even,
//                                  0 uneven), abscissa minimum, increment, z-axis value
//   record 8..11  I10,3I5,2(1X,A20)
//                                  abscissa, ordinate, denominator, z axis: specific data
//                                  type (8 displacement, 11 velocity, 12 acceleration, 17 time,
//                                  ...), length/force/temperature exponents, label, units label
//   record 12     ASCII 6E13.5 (single) or 4E20.12 (double) per line; 58b raw IEEE values
//   "    -1"                       closes the dataset
//
// Files are written by UffTestWriter. Line numbers of the first dataset: 1 "-1", 2 "58",
// 3..7 records 1..5, 8 record 6, 9 record 7, 10..13 records 8..11, 14 on data.
#include "core/io/UffReader.h"

#include "core/io/RecordingReader.h"
#include "core/io/UffTestWriter.h"
#include "core/io/WavTestWriter.h"
#include "core/util/Text.h"
#include "support/TestSupport.h"

#include <gtest/gtest.h>

#include <algorithm>
#include <cmath>
#include <cstring>
#include <limits>
#include <random>
#include <sstream>
#include <string>
#include <vector>

namespace humwise::io {
namespace {

using test::Bytes;
using test::Uff58Spec;
using Code = ReadError::Code;

const std::string kSource = "broken-input.uff";
// Standard gravity, exact by definition (3rd CGPM 1901; REFERENCE.md section 7).
constexpr double kGn = 9.80665;
// E13.5 keeps 6 significant digits: rounding changes a value by at most 5e-6 of itself.
constexpr double kE13Relative = 5e-6;
// E20.12 keeps 13 significant digits (5e-13), plus double rounding.
constexpr double kE20Relative = 6e-13;

Bytes bytesOf(const std::string& s) {
    return Bytes(reinterpret_cast<const std::byte*>(s.data()), reinterpret_cast<const std::byte*>(s.data()) + s.size());
}

UffFile parsed(const std::string& text, const UffReadOptions& options = {}) {
    auto r = parseUff(bytesOf(text), "ok.uff", options);
    if (!r) throw std::runtime_error("unexpected error: " + r.error().message());
    return std::move(r).value();
}

// The first dataset's line of record N (1..11), or of its first data line (N = 12).
constexpr std::size_t recordLine(int n) { return static_cast<std::size_t>(n) + 2; }

// Byte offset of 1-based line `line` of the text (for the text part of binary datasets).
std::size_t offsetOfLine(const std::string& text, std::size_t line) {
    std::size_t at = 0;
    for (std::size_t l = 1; l < line; ++l) at = text.find('\n', at) + 1;
    return at;
}

std::size_t linesIn(const std::string& text) { return static_cast<std::size_t>(std::count(text.begin(), text.end(), '\n')); }

struct At {
    std::optional<std::size_t> line;
    std::optional<std::uint64_t> offset;
};
At atLine(std::size_t l) { return {l, std::nullopt}; }
At atByte(std::uint64_t o) { return {std::nullopt, o}; }

// The reader must refuse `text` with `code` at `where`, naming the source and the position in
// the message, and (when given) saying `words` in its detail.
::testing::AssertionResult failsWith(const std::string& text, Code code, At where, const std::string& words = "") {
    const auto r = parseUff(bytesOf(text), kSource);
    if (r) return ::testing::AssertionFailure() << "parsed as a valid file, expected " << codeName(code);
    const ReadError& e = r.error();
    const std::string m = e.message();
    if (e.code != code) return ::testing::AssertionFailure() << "code " << codeName(e.code) << ", expected " << codeName(code) << " (" << m << ")";
    if (m.find(kSource) == std::string::npos) return ::testing::AssertionFailure() << "message does not name the source: " << m;
    if (e.line != where.line || e.offset != where.offset)
        return ::testing::AssertionFailure() << "position line " << (e.line ? std::to_string(*e.line) : "none") << " byte "
                                             << (e.offset ? std::to_string(*e.offset) : "none") << ", expected line "
                                             << (where.line ? std::to_string(*where.line) : "none") << " byte "
                                             << (where.offset ? std::to_string(*where.offset) : "none") << " (" << m << ")";
    if (where.line && m.find("line " + std::to_string(*where.line)) == std::string::npos)
        return ::testing::AssertionFailure() << "message does not show the line: " << m;
    if (where.offset && m.find("byte " + std::to_string(*where.offset)) == std::string::npos)
        return ::testing::AssertionFailure() << "message does not show the byte offset: " << m;
    if (!words.empty() && e.detail.find(words) == std::string::npos)
        return ::testing::AssertionFailure() << "detail does not say '" << words << "': " << m;
    return ::testing::AssertionSuccess() << m;
}

std::vector<double> mixedValues(std::size_t n) {
    std::vector<double> v = test::sine(0.75, 120.0, 25600.0, n);
    v[1] = 123.456;
    v[2] = -1.0e-4;
    v[3] = 0.0;
    v[4] = -9.87654321;
    return v;
}

Uff58Spec spec(std::vector<double> values) {
    Uff58Spec s;
    s.values = std::move(values);
    return s;
}

// ---------------------------------------------------------------------------------------
// ASCII datasets

TEST(Uff58Ascii, Record12RealSingleEven6E13_5OneChannelRoundTripsToSixDigits) {
    const std::vector<double> values = mixedValues(100); // 16 full lines of 6 and one of 4
    const UffFile f = parsed(test::uff58(spec(values)));
    const Recording& rec = f.recording;
    EXPECT_EQ(rec.source, "ok.uff");
    // Record 7 increment 1/25600 s is 3.90625E-05 exactly in E13.5.
    EXPECT_EQ(rec.sampleRateHz, 25600.0);
    ASSERT_EQ(rec.channels.size(), 1u);
    const Channel& ch = rec.channels[0];
    EXPECT_EQ(ch.name, "Point 1"); // record 1
    EXPECT_EQ(ch.quantity, Quantity::Acceleration); // record 9: type 12, "g"
    EXPECT_FALSE(ch.fullScale.has_value());
    ASSERT_EQ(ch.samples.size(), values.size());
    for (std::size_t i = 0; i < values.size(); ++i)
        ASSERT_NEAR(ch.samples[i], values[i] * kGn, kE13Relative * std::abs(values[i] * kGn)) << "value " << i;
    EXPECT_DOUBLE_EQ(ch.samples[1], 123.456 * kGn); // 1.23456E+02 is exact to 6 digits

    ASSERT_EQ(f.channels.size(), 1u);
    const UffChannelInfo& info = f.channels[0];
    EXPECT_EQ(info.idText, "Point 1");
    EXPECT_EQ(info.responseEntity, "NONE");
    EXPECT_EQ(info.responseNode, 1);
    EXPECT_EQ(info.directionCode, 3);
    EXPECT_EQ(info.functionType, 1);
    EXPECT_EQ(info.dataType, 2);
    EXPECT_EQ(info.specificDataType, 12);
    EXPECT_EQ(info.unitsLabel, "g");
    EXPECT_EQ(info.abscissaMinimumS, 0.0);
    EXPECT_FALSE(info.binary);
    ASSERT_TRUE(info.timestamp.has_value()); // record 3 "04-MAR-26 10:15:00"
    EXPECT_EQ(*info.timestamp, "2026-03-04T10:15:00.000Z");
    ASSERT_TRUE(rec.startTime.has_value());
    EXPECT_EQ(*rec.startTime, text::parseIsoTime("2026-03-04T10:15:00Z"));
}

TEST(Uff58Ascii, Record12RealDoubleEven4E20_12RoundTripsToTwelveDigits) {
    Uff58Spec s = spec(mixedValues(37)); // 9 full lines of 4 and one of 1
    s.dataType = 4;
    s.ordinate = {12, 1, 0, 0, "Acceleration", "m/s^2"};
    s.abscissaMinimum = 0.25;
    const UffFile f = parsed(test::uff58(s));
    ASSERT_EQ(f.recording.channels.size(), 1u);
    const auto& samples = f.recording.channels[0].samples;
    ASSERT_EQ(samples.size(), s.values.size());
    for (std::size_t i = 0; i < s.values.size(); ++i)
        ASSERT_NEAR(samples[i], s.values[i], kE20Relative * std::abs(s.values[i])) << "value " << i;
    EXPECT_EQ(samples[4], -9.87654321);
    EXPECT_EQ(f.channels[0].dataType, 4);
    EXPECT_EQ(f.channels[0].abscissaMinimumS, 0.25);
}

TEST(Uff58Ascii, Record7IncrementE13_5GivesTheRateRoundedToWholeHertzOnlyWithinItsPrecision) {
    struct Case {
        double increment;
        double rate;
        bool whole;
    };
    // 1/12000 s is written 8.33333E-05 (1/that = 12000.0048 Hz, 4e-7 off): rounded to 12000.
    // 1/3000.5 s is written 3.33278E-04 (3000.498 Hz, 1.7e-4 off 3000): kept as it is.
    for (const Case c : {Case{1.0 / 12000, 12000.0, true}, Case{1.0 / 51200, 51200.0, true}, Case{1.0 / 3000.5, 3000.5, false},
                         Case{0.5, 2.0, true}, Case{1e-6, 1e6, true}}) {
        SCOPED_TRACE(c.rate);
        Uff58Spec s = spec({1, 2, 3});
        s.increment = c.increment;
        const double rate = parsed(test::uff58(s)).recording.sampleRateHz;
        if (c.whole) {
            EXPECT_EQ(rate, c.rate);
        } else {
            EXPECT_NEAR(rate, c.rate, kE13Relative * c.rate);
            EXPECT_NE(rate, std::round(rate));
        }
    }
}

TEST(Uff58Ascii, Record6ResponseNodeAndDirectionThreeDatasetsBecomeThreeChannels) {
    std::string text;
    for (int dir = 1; dir <= 3; ++dir) {
        Uff58Spec s = spec({1.0 * dir, 2.0 * dir, 3.0 * dir, 4.0 * dir, 5.0 * dir, 6.0 * dir, 7.0 * dir});
        s.ids[0] = "NONE";
        s.responseNode = 12;
        s.responseDirection = dir;
        text += test::uff58(s);
    }
    const UffFile f = parsed(text);
    const Recording& rec = f.recording;
    ASSERT_EQ(rec.channels.size(), 3u);
    EXPECT_EQ(rec.frameCount(), 7u);
    EXPECT_EQ(rec.sampleRateHz, 25600.0);
    const char* names[] = {"12+X", "12+Y", "12+Z"};
    for (int c = 0; c < 3; ++c) {
        EXPECT_EQ(rec.channels[c].name, names[c]);
        EXPECT_EQ(f.channels[c].directionCode, c + 1);
        EXPECT_EQ(f.channels[c].responseNode, 12);
        ASSERT_EQ(rec.channels[c].samples.size(), 7u);
        for (int i = 0; i < 7; ++i) EXPECT_DOUBLE_EQ(rec.channels[c].samples[i], (i + 1.0) * (c + 1) * kGn);
    }
}

TEST(Uff58Ascii, Record1SingleAndDoubleDatasetsMixAsChannels) {
    Uff58Spec a = spec({0.5, -0.25, 0.125});
    a.ids[0] = "DE-H";
    Uff58Spec b = a;
    b.ids[0] = "DE-V";
    b.dataType = 4;
    const UffFile f = parsed(test::uff58(a) + test::uff58(b));
    ASSERT_EQ(f.recording.channels.size(), 2u);
    EXPECT_EQ(f.recording.channels[0].name, "DE-H");
    EXPECT_EQ(f.recording.channels[1].name, "DE-V");
    EXPECT_EQ(f.channels[0].dataType, 2);
    EXPECT_EQ(f.channels[1].dataType, 4);
    EXPECT_EQ(f.recording.channels[0].samples, f.recording.channels[1].samples);
}

TEST(Uff58Ascii, Record1AndRecord6ChannelNamesAreMadeUnique) {
    struct Ds {
        const char* id;
        const char* entity;
        long long node;
        int dir;
    };
    const std::vector<Ds> sets{{"DE", "NONE", 3, 1},   {"DE", "NONE", 3, 2},   {"NONE", "MOTOR1", 7, -3}, {"", "NONE", 0, 0},
                               {"NDE", "NONE", 5, 1},  {"NDE", "NONE", 5, 1},  {"Fan", "NONE", 0, 0}};
    std::string text;
    for (const Ds& d : sets) {
        Uff58Spec s = spec({1, 2});
        s.ids[0] = d.id;
        s.responseEntity = d.entity;
        s.responseNode = d.node;
        s.responseDirection = d.dir;
        text += test::uff58(s);
    }
    const Recording rec = parsed(text).recording;
    ASSERT_EQ(rec.channels.size(), sets.size());
    EXPECT_EQ(rec.channels[0].name, "DE (3+X)");
    EXPECT_EQ(rec.channels[1].name, "DE (3+Y)");
    EXPECT_EQ(rec.channels[2].name, "MOTOR1 7-Z");
    EXPECT_EQ(rec.channels[3].name, "ch4");
    EXPECT_EQ(rec.channels[4].name, "NDE (5+X) #5");
    EXPECT_EQ(rec.channels[5].name, "NDE (5+X) #6");
    EXPECT_EQ(rec.channels[6].name, "Fan");
}

TEST(Uff58Ascii, Record9SpecificDataTypeAndUnitsLabelGiveQuantityAndUnit) {
    struct Case {
        int type;
        const char* units;
        Quantity quantity;
        double toSi; // Units.h: g_n exact, in = 25.4 mm
    };
    const Case cases[] = {{12, "g", Quantity::Acceleration, kGn},        {12, "m/s^2", Quantity::Acceleration, 1.0},
                          {12, "m/s**2", Quantity::Acceleration, 1.0},   {12, "m/s2", Quantity::Acceleration, 1.0},
                          {11, "mm/s", Quantity::Velocity, 1e-3},        {11, "m/s", Quantity::Velocity, 1.0},
                          {11, "in/s", Quantity::Velocity, 0.0254},      {8, "m", Quantity::Displacement, 1.0},
                          {8, "um", Quantity::Displacement, 1e-6},       {1, "A", Quantity::Current, 1.0},
                          {0, "V", Quantity::Voltage, 1.0},              {0, "mm/s", Quantity::Velocity, 1e-3}};
    for (const Case& c : cases) {
        SCOPED_TRACE(std::to_string(c.type) + " " + c.units);
        Uff58Spec s = spec({2.0, -0.5});
        s.ordinate = {c.type, 0, 0, 0, "Response", c.units};
        UffReadOptions options;
        options.channels.defaults = {"", Unit::Millivolt, 7.0}; // must not apply: the file has a unit
        const UffFile f = parsed(test::uff58(s), options);
        const Channel& ch = f.recording.channels[0];
        EXPECT_EQ(ch.quantity, c.quantity);
        EXPECT_DOUBLE_EQ(ch.samples[0], 2.0 * c.toSi);
        EXPECT_DOUBLE_EQ(ch.samples[1], -0.5 * c.toSi);
        EXPECT_EQ(f.channels[0].specificDataType, c.type);
        EXPECT_EQ(f.channels[0].unitsLabel, c.units);
    }
}

TEST(Uff58Ascii, Record9WithoutUnitsLabelFallsBackToTheCallerSettings) {
    struct Case {
        int type;
        const char* units;
        ChannelSetting setting;
        Quantity quantity;
        double factor; // sample = 2 x factor
    };
    const Case cases[] = {
        {0, "NONE", {"", Unit::MillimetrePerSecond, 2.0}, Quantity::Velocity, 2.0 * 1e-3}, // unknown: the caller's unit and scale
        {1, "", {"", Unit::Ampere, 0.5}, Quantity::Current, 0.5},                          // blank label is no label
        {12, "NONE", {"", Unit::G, 3.0}, Quantity::Acceleration, 3.0 * kGn},               // caller's unit of the same quantity
        {11, "none", {"", Unit::G, 3.0}, Quantity::Velocity, 1.0},                         // other quantity: SI m/s, no scale
        {8, "NONE", {"", Unit::Volt, 3.0}, Quantity::Displacement, 1.0},                   // SI m
    };
    for (const Case& c : cases) {
        SCOPED_TRACE(std::to_string(c.type) + " '" + c.units + "'");
        Uff58Spec s = spec({2.0});
        s.ordinate = {c.type, 0, 0, 0, "Response", c.units};
        UffReadOptions options;
        options.channels.perChannel = {{"", Unit::Volt, 100.0}, c.setting}; // the second dataset is channel index 1
        const UffFile f = parsed(test::uff58(spec({2.0})) + test::uff58(s), options);
        ASSERT_EQ(f.recording.channels.size(), 2u);
        EXPECT_EQ(f.recording.channels[1].quantity, c.quantity);
        EXPECT_DOUBLE_EQ(f.recording.channels[1].samples[0], 2.0 * c.factor);
        EXPECT_DOUBLE_EQ(f.recording.channels[0].samples[0], 2.0 * kGn); // "g" in the file wins over Volt x 100
    }
}

TEST(Uff58Ascii, Record3DateAndTimeDdMmmYyHhMmSs) {
    struct Case {
        const char* record3;
        const char* iso; // nullptr: no timestamp
    };
    const Case cases[] = {
        {"04-MAR-26 10:15:00", "2026-03-04T10:15:00.000Z"},
        {"15-dec-98 23:59:59", "1998-12-15T23:59:59.000Z"}, // 69-99: 19xx (POSIX %y)
        {" 4-Jul-68 12:00:00", "2068-07-04T12:00:00.000Z"}, // 00-68: 20xx
        {"01-JAN-2030 00:00:01", "2030-01-01T00:00:01.000Z"},
        {"29-FEB-24 06:07:08   measured on route 3", "2024-02-29T06:07:08.000Z"},
        {"31-FEB-26 10:00:00", nullptr},
        {"04-MAR-26 25:00:00", nullptr},
        {"04-MRZ-26 10:15:00", nullptr},
        {"10:15:00 04-MAR-26", nullptr},
        {"04-MAR-26", nullptr},
        {"NONE", nullptr},
        {"", nullptr},
    };
    for (const Case& c : cases) {
        SCOPED_TRACE(c.record3);
        Uff58Spec s = spec({1, 2});
        s.ids[2] = c.record3;
        const UffFile f = parsed(test::uff58(s));
        if (c.iso) {
            ASSERT_TRUE(f.channels[0].timestamp.has_value());
            EXPECT_EQ(*f.channels[0].timestamp, c.iso);
            EXPECT_EQ(f.recording.startTime, text::parseIsoTime(c.iso));
        } else {
            EXPECT_FALSE(f.channels[0].timestamp.has_value()) << *f.channels[0].timestamp;
            EXPECT_FALSE(f.recording.startTime.has_value());
        }
    }
}

TEST(Uff58Ascii, Record6And8To11FixedColumnsWithBlankIntegersReadAsZeroAndShortLines) {
    Uff58Spec s = spec({1.5, 2.5});
    s.responseNode = 4;
    s.responseDirection = 2;
    // Record 6: function type in columns 1-5, everything else blank up to the response node
    // (columns 42-51) and direction (52-55); nothing after column 55.
    s.recordText[6] = "    1" + std::string(36, ' ') + "         4   2";
    s.recordText[8] = "";                                                          // abscissa: all blank
    s.recordText[9] = "        11" + std::string(16, ' ') + "Velocity            " + " mm/s"; // exponents blank
    s.recordText[10] = "         0";
    const UffFile f = parsed(test::uff58(s));
    EXPECT_EQ(f.channels[0].responseNode, 4);
    EXPECT_EQ(f.channels[0].directionCode, 2);
    EXPECT_EQ(f.channels[0].responseEntity, "");
    EXPECT_EQ(f.recording.channels[0].quantity, Quantity::Velocity);
    EXPECT_DOUBLE_EQ(f.recording.channels[0].samples[1], 2.5e-3);
}

TEST(Uff58Ascii, Record7AndRecord12AreReadAsWhitespaceSeparatedNumbersWithFortranDExponents) {
    Uff58Spec s;
    s.recordText[7] = "2 5 1 0.0 1.0D-3 0.0"; // free width, D exponent
    s.closingDelimiter = false;
    const std::string text = test::uff58(s) + "1.5D+00 -2.0d-01\t3\n  +4.25E+00   \n-5\n    -1\n";
    const UffFile f = parsed(text);
    EXPECT_EQ(f.recording.sampleRateHz, 1000.0);
    const std::vector<double> expected{1.5, -0.2, 3.0, 4.25, -5.0};
    ASSERT_EQ(f.recording.channels[0].samples.size(), expected.size());
    for (std::size_t i = 0; i < expected.size(); ++i) EXPECT_DOUBLE_EQ(f.recording.channels[0].samples[i], expected[i] * kGn);
}

TEST(Uff58Ascii, NonFiniteValuesAreData) {
    Uff58Spec s;
    s.closingDelimiter = false;
    s.count = 3;
    const UffFile f = parsed(test::uff58(s) + "nan inf -inf\n    -1\n");
    const auto& v = f.recording.channels[0].samples;
    ASSERT_EQ(v.size(), 3u);
    EXPECT_TRUE(std::isnan(v[0]));
    EXPECT_EQ(v[1], std::numeric_limits<double>::infinity());
    EXPECT_EQ(v[2], -std::numeric_limits<double>::infinity());
}

TEST(Uff58Ascii, DatasetsOtherThan58AreSkippedAndBlankLinesBetweenDatasetsAllowed) {
    const std::string units = test::uffOtherDataset(164, {"         1SI - mks (Newton)       2", "  1.00000000000000000D+00  1.00000000000000000D+00  1.00000000000000000D+00",
                                                          "  2.73150000000000000D+02"});
    const std::string nodes = test::uffOtherDataset(2411, {"         1         0         0        11", "   0.0000000000000000E+00   1.0000000000000000E+00   0.0000000000000000E+00"});
    Uff58Spec s = spec({1, 2, 3});
    const UffFile f = parsed("\n" + units + "\n\n" + test::uff58(s) + nodes + "   \n");
    ASSERT_EQ(f.recording.channels.size(), 1u);
    EXPECT_DOUBLE_EQ(f.recording.channels[0].samples[2], 3 * kGn);
}

TEST(Uff58Ascii, CrLfLineEndsGiveTheSameFile) {
    Uff58Spec a = spec(mixedValues(20));
    Uff58Spec b = a;
    b.responseDirection = 1;
    b.dataType = 4;
    const std::string text = test::uff58(a) + test::uff58(b);
    const UffFile lf = parsed(text);
    const UffFile crlf = parsed(test::withCrLf(text));
    ASSERT_EQ(crlf.recording.channels.size(), 2u);
    for (std::size_t c = 0; c < 2; ++c) {
        EXPECT_EQ(crlf.recording.channels[c].samples, lf.recording.channels[c].samples);
        EXPECT_EQ(crlf.recording.channels[c].name, lf.recording.channels[c].name);
    }
    EXPECT_EQ(crlf.channels[0].timestamp, lf.channels[0].timestamp);
    EXPECT_EQ(crlf.channels[1].unitsLabel, "g");
}

TEST(ReadUff, StreamFileAndRecordingOnlyGiveTheSameSamples) {
    const std::string text = test::uff58(spec({0.5, -0.5, 0.25}));
    const auto path = test::outputDir() / "io" / "uff" / "stream-and-file.uff";
    test::writeText(path, text);
    std::istringstream in(text);
    const auto fromStream = readUff(in, "stream");
    const auto fromFile = readUffFile(path);
    const auto recording = parseUffRecording(bytesOf(text), "bytes");
    ASSERT_TRUE(fromStream) << fromStream.error().message();
    ASSERT_TRUE(fromFile) << fromFile.error().message();
    ASSERT_TRUE(recording) << recording.error().message();
    EXPECT_EQ(fromStream.value().recording.source, "stream");
    EXPECT_EQ(fromFile.value().recording.source, path.string());
    EXPECT_EQ(recording.value().source, "bytes");
    EXPECT_EQ(fromStream.value().recording.channels[0].samples, fromFile.value().recording.channels[0].samples);
    EXPECT_EQ(recording.value().channels[0].samples, fromFile.value().recording.channels[0].samples);
    EXPECT_DOUBLE_EQ(recording.value().channels[0].samples[2], 0.25 * kGn);
}

TEST(ReadUff, MissingFileIsCannotOpenNamingThePath) {
    const auto r = readUffFile(test::outputDir() / "io" / "uff" / "no-such-file.uff");
    ASSERT_FALSE(r);
    EXPECT_EQ(r.error().code, Code::CannotOpen);
    EXPECT_NE(r.error().message().find("no-such-file.uff"), std::string::npos);
}

TEST(LooksLikeUff58, OpeningMinusOneThenDataset58Or58b) {
    EXPECT_TRUE(looksLikeUff58(bytesOf("    -1\n    58\n")));
    EXPECT_TRUE(looksLikeUff58(bytesOf("\n  \r\n    -1\r\n    58b     1     2         11          16\n")));
    EXPECT_TRUE(looksLikeUff58(bytesOf(test::uff58(spec({1})))));
    EXPECT_FALSE(looksLikeUff58(bytesOf("    -1\n   151\n")));
    EXPECT_FALSE(looksLikeUff58(bytesOf("    -1\n    582\n")));
    EXPECT_FALSE(looksLikeUff58(bytesOf("    -1\n    58x\n")));
    EXPECT_FALSE(looksLikeUff58(bytesOf("    -1\n")));
    EXPECT_FALSE(looksLikeUff58(bytesOf("time [s],x [g]\n0,1\n")));
    EXPECT_FALSE(looksLikeUff58(bytesOf("")));
}

TEST(UffDirectionLabel, Record6DirectionCodes) {
    EXPECT_EQ(uffDirectionLabel(1), "+X");
    EXPECT_EQ(uffDirectionLabel(2), "+Y");
    EXPECT_EQ(uffDirectionLabel(3), "+Z");
    EXPECT_EQ(uffDirectionLabel(-1), "-X");
    EXPECT_EQ(uffDirectionLabel(4), "+RX");
    EXPECT_EQ(uffDirectionLabel(-6), "-RZ");
    EXPECT_EQ(uffDirectionLabel(0), "");
    EXPECT_EQ(uffDirectionLabel(7), "");
}

// ---------------------------------------------------------------------------------------
// Binary datasets (58b)

// Values exactly representable as float, so single precision round-trips exactly.
const std::vector<double> kFloatExact{0.5, -1.25, 3.0, 1024.0, -0.0078125, 0.0, 6.103515625e-05};

TEST(Uff58b, LittleEndianRealSingleRecord12IsRawFloat32) {
    Uff58Spec s = spec(kFloatExact);
    s.binary = true;
    const UffFile f = parsed(test::uff58(s));
    ASSERT_EQ(f.recording.channels.size(), 1u);
    const auto& v = f.recording.channels[0].samples;
    ASSERT_EQ(v.size(), kFloatExact.size());
    for (std::size_t i = 0; i < v.size(); ++i) EXPECT_EQ(v[i], static_cast<double>(static_cast<float>(kFloatExact[i])) * kGn) << i;
    EXPECT_TRUE(f.channels[0].binary);
    EXPECT_EQ(f.channels[0].dataType, 2);
    EXPECT_EQ(f.recording.sampleRateHz, 25600.0);
    EXPECT_EQ(f.channels[0].timestamp, "2026-03-04T10:15:00.000Z");
}

TEST(Uff58b, LittleEndianRealDoubleRecord12IsRawFloat64) {
    Uff58Spec s = spec(mixedValues(50));
    s.binary = true;
    s.dataType = 4;
    s.ordinate.units = "m/s^2";
    const UffFile f = parsed(test::uff58(s));
    EXPECT_EQ(f.recording.channels[0].samples, s.values); // bit for bit
}

TEST(Uff58b, BigEndianByteOrder2SingleAndDouble) {
    Uff58Spec single = spec(kFloatExact);
    single.binary = true;
    single.byteOrder = 2;
    single.ordinate.units = "m/s^2";
    Uff58Spec dbl = single;
    dbl.dataType = 4;
    dbl.values = mixedValues(kFloatExact.size());
    const UffFile f = parsed(test::uff58(single) + test::uff58(dbl));
    ASSERT_EQ(f.recording.channels.size(), 2u);
    EXPECT_EQ(f.recording.channels[0].samples, kFloatExact);
    EXPECT_EQ(f.recording.channels[1].samples, dbl.values);
}

TEST(Uff58b, ClosingMinusOneDirectlyAfterTheBlockOrAfterALineBreak) {
    for (const bool lineBreak : {false, true}) {
        SCOPED_TRACE(lineBreak);
        Uff58Spec s = spec(kFloatExact);
        s.binary = true;
        s.ordinate.units = "m/s^2";
        s.lineBreakAfterBinary = lineBreak;
        const std::string one = test::uff58(s);
        const UffFile f = parsed(one + one);
        ASSERT_EQ(f.recording.channels.size(), 2u);
        EXPECT_EQ(f.recording.channels[1].samples, kFloatExact);
    }
}

TEST(Uff58b, BlockBytesThatLookLikeLineBreaksAndDelimitersAreData) {
    // Doubles whose bytes are "\n", "    -1\n" pieces: the block is taken by its byte count.
    std::vector<double> values;
    for (const char* bytes : {"\n\n\n\n\n\n\n\n", "    -1\n ", "\n    58\n"}) {
        double d;
        std::memcpy(&d, bytes, 8);
        values.push_back(d);
    }
    Uff58Spec s = spec(values);
    s.binary = true;
    s.dataType = 4;
    s.ordinate.units = "m/s^2";
    const UffFile f = parsed(test::uff58(s));
    ASSERT_EQ(f.recording.channels[0].samples.size(), 3u);
    for (std::size_t i = 0; i < 3; ++i) EXPECT_EQ(std::memcmp(&f.recording.channels[0].samples[i], &values[i], 8), 0) << i;
}

TEST(Uff58b, BinaryAndAsciiDatasetsMixInOneFile) {
    Uff58Spec b = spec(kFloatExact);
    b.binary = true;
    b.ids[0] = "bin";
    Uff58Spec a = spec(kFloatExact);
    a.ids[0] = "text";
    a.dataType = 4;
    const UffFile f = parsed(test::uff58(a) + test::uff58(b) + test::uff58(a));
    ASSERT_EQ(f.recording.channels.size(), 3u);
    EXPECT_EQ(f.recording.channels[1].name, "bin");
    EXPECT_EQ(f.recording.channels[0].samples, f.recording.channels[1].samples);
    EXPECT_EQ(f.recording.channels[2].samples, f.recording.channels[1].samples);
    EXPECT_FALSE(f.channels[0].binary);
    EXPECT_TRUE(f.channels[1].binary);
}

// ---------------------------------------------------------------------------------------
// Broken files: one test per defect, with its code and position.

TEST(ParseUffError, EmptyInput) {
    const auto r = parseUff({}, kSource);
    ASSERT_FALSE(r);
    EXPECT_EQ(r.error().code, Code::Empty);
    EXPECT_NE(r.error().message().find(kSource), std::string::npos);
}

TEST(ParseUffError, OnlyBlankLines) { EXPECT_TRUE(failsWith("\n   \n\r\n", Code::NotRecognised, atLine(4))); }

TEST(ParseUffError, FirstLineIsNotMinusOne) {
    EXPECT_TRUE(failsWith("time [s],x [g]\n0,1\n", Code::NotRecognised, atLine(1)));
    EXPECT_TRUE(failsWith("\n\n    58\n", Code::NotRecognised, atLine(3)));
    EXPECT_TRUE(failsWith("    -2\n    58\n", Code::NotRecognised, atLine(1)));
}

TEST(ParseUffError, NoDataset58AtAllNamesWhatTheFileHolds) {
    const std::string text = "\n" + test::uffOtherDataset(151, {"model"}) + test::uffOtherDataset(2411, {"nodes"}) + test::uffOtherDataset(151, {"again"});
    EXPECT_TRUE(failsWith(text, Code::UnsupportedFormat, atLine(2), "datasets 151, 2411"));
}

TEST(ParseUffError, DatasetNumberLineIsNotANumber) {
    Uff58Spec s = spec({1});
    for (const char* header : {"    5x", "   abc", "", "    58 b", "    -1"}) {
        SCOPED_TRACE(header);
        s.headerText = header;
        EXPECT_TRUE(failsWith(test::uff58(s), Code::BadNumber, atLine(2), "dataset number"));
    }
}

TEST(ParseUffError, FileEndsAfterTheOpeningMinusOne) { EXPECT_TRUE(failsWith("    -1\n", Code::TruncatedHeader, atLine(2))); }

TEST(ParseUffError, FileEndsInsideRecords1To11) {
    const std::string full = test::uff58(spec({1, 2}));
    EXPECT_TRUE(failsWith(full.substr(0, offsetOfLine(full, 7)), Code::TruncatedHeader, atLine(7), "record 5"));
    EXPECT_TRUE(failsWith(full.substr(0, offsetOfLine(full, 13)), Code::TruncatedHeader, atLine(13), "record 11"));
}

TEST(ParseUffError, MinusOneInPlaceOfARecord) {
    Uff58Spec s = spec({1, 2});
    s.recordText[9] = "    -1";
    EXPECT_TRUE(failsWith(test::uff58(s), Code::TruncatedHeader, atLine(recordLine(9)), "record 9"));
}

TEST(ParseUffError, Record6FunctionTypesOtherThanTimeResponseAreUnsupported) {
    const std::pair<int, const char*> cases[] = {{4, "frequency response function"}, {2, "auto spectrum"}, {0, "general"}, {27, "unknown"}};
    for (const auto& [type, name] : cases) {
        SCOPED_TRACE(type);
        Uff58Spec s = spec({1, 2});
        s.functionType = type;
        EXPECT_TRUE(failsWith(test::uff58(s), Code::UnsupportedFormat, atLine(recordLine(6)), name));
    }
}

TEST(ParseUffError, Record6NonNumericFieldsNameTheirColumns) {
    Uff58Spec s = spec({1, 2});
    std::string r6 = test::uffRecord6(s);
    r6.replace(41, 10, "      abc "); // response node, columns 42-51
    s.recordText[6] = r6;
    EXPECT_TRUE(failsWith(test::uff58(s), Code::BadNumber, atLine(recordLine(6)), "response node (columns 42-51)"));
    s.recordText[6] = "    x" + test::uffRecord6(s).substr(5);
    EXPECT_TRUE(failsWith(test::uff58(s), Code::BadNumber, atLine(recordLine(6)), "function type"));
}

TEST(ParseUffError, Record6ResponseDirectionBeyondSix) {
    Uff58Spec s = spec({1, 2});
    s.responseDirection = 9;
    EXPECT_TRUE(failsWith(test::uff58(s), Code::BadField, atLine(recordLine(6)), "response direction 9"));
}

TEST(ParseUffError, Record7ComplexOrdinateDataTypes5And6AreUnsupported) {
    for (const int type : {5, 6}) {
        SCOPED_TRACE(type);
        Uff58Spec s = spec({1, 0, 2, 0}); // (real, imaginary) pairs
        s.dataType = type;
        s.count = 2;
        EXPECT_TRUE(failsWith(test::uff58(s), Code::UnsupportedFormat, atLine(recordLine(7)), "complex"));
    }
}

TEST(ParseUffError, Record7UnevenAbscissaSpacing0IsUnsupported) {
    Uff58Spec s = spec({0.0, 1.0, 0.1, 2.0}); // (abscissa, ordinate) pairs
    s.spacing = 0;
    s.count = 2;
    s.increment = 0;
    EXPECT_TRUE(failsWith(test::uff58(s), Code::UnsupportedFormat, atLine(recordLine(7)), "uneven"));
}

TEST(ParseUffError, Record7DataTypeAndSpacingCodesThatDoNotExist) {
    Uff58Spec s = spec({1, 2});
    s.dataType = 3;
    EXPECT_TRUE(failsWith(test::uff58(s), Code::BadField, atLine(recordLine(7)), "data type 3"));
    s.dataType = 2;
    s.spacing = 2;
    EXPECT_TRUE(failsWith(test::uff58(s), Code::BadField, atLine(recordLine(7)), "spacing 2"));
}

TEST(ParseUffError, Record7ValueCounts) {
    Uff58Spec s = spec({1, 2});
    s.count = 0;
    EXPECT_TRUE(failsWith(test::uff58(s), Code::NoData, atLine(recordLine(7))));
    s.count = -5;
    EXPECT_TRUE(failsWith(test::uff58(s), Code::BadField, atLine(recordLine(7)), "-5 values"));
    s.count = 2'000'000'000;
    EXPECT_TRUE(failsWith(test::uff58(s), Code::BadField, atLine(recordLine(7)), "2000000000 values"));
    s.count = 100'000'000; // plausible, but far more than the bytes present: refused before any allocation
    EXPECT_TRUE(failsWith(test::uff58(s), Code::TruncatedData, atLine(recordLine(7)), "100000000 values"));
}

TEST(ParseUffError, Record7IncrementNotAPositiveTimeStepOrAboveTenMegahertz) {
    Uff58Spec s = spec({1, 2});
    for (const double inc : {0.0, -1e-4, std::nan(""), std::numeric_limits<double>::infinity()}) {
        SCOPED_TRACE(inc);
        s.increment = inc;
        EXPECT_TRUE(failsWith(test::uff58(s), Code::BadField, atLine(recordLine(7)), "not a positive time step"));
    }
    s.increment = 1e-8; // 100 MHz
    EXPECT_TRUE(failsWith(test::uff58(s), Code::BadField, atLine(recordLine(7)), "10 MHz"));
}

TEST(ParseUffError, Record7NonNumericOrMissingFieldsNameTheirColumns) {
    Uff58Spec s = spec({1, 2});
    s.recordText[7] = "         2         2         1  0.00000E+00          abc  0.00000E+00";
    EXPECT_TRUE(failsWith(test::uff58(s), Code::BadNumber, atLine(recordLine(7)), "abscissa increment (columns 44-56): 'abc'"));
    s.recordText[7] = "       2.5         2         1  0.00000E+00  3.90625E-05  0.00000E+00";
    EXPECT_TRUE(failsWith(test::uff58(s), Code::BadNumber, atLine(recordLine(7)), "ordinate data type (columns 1-10)"));
    s.recordText[7] = "         2         2         1  0.00000E+00";
    EXPECT_TRUE(failsWith(test::uff58(s), Code::BadField, atLine(recordLine(7)), "abscissa increment (columns 44-56): is blank"));
    s.recordText[7] = "2 2 1 0.0 3.9e-5"; // free width needs all six fields
    EXPECT_TRUE(failsWith(test::uff58(s), Code::BadNumber, atLine(recordLine(7)), "nor does the line hold six numbers"));
}

TEST(Uff58Ascii, Record7BlankZAxisValueReadsAsZero) {
    Uff58Spec s = spec({1, 2});
    s.recordText[7] = "         2         2         1  0.00000E+00  3.90625E-05";
    EXPECT_EQ(parsed(test::uff58(s)).recording.sampleRateHz, 25600.0);
}

TEST(ParseUffError, Records8To11NonNumericIntegerFields) {
    for (const int record : {8, 9, 10, 11}) {
        SCOPED_TRACE(record);
        Uff58Spec s = spec({1, 2});
        s.recordText[record] = "        1x    0    0    0 Label                NONE";
        EXPECT_TRUE(failsWith(test::uff58(s), Code::BadNumber, atLine(recordLine(record)), "record " + std::to_string(record) + ", specific data type"));
        s.recordText[record] = "        12    0  one    0 Label                NONE";
        EXPECT_TRUE(failsWith(test::uff58(s), Code::BadNumber, atLine(recordLine(record)), "force unit exponent"));
    }
}

TEST(ParseUffError, Record9UnitsLabelHumwiseDoesNotKnow) {
    Uff58Spec s = spec({1, 2});
    s.ordinate = {12, 0, 0, 0, "Acceleration", "mm/s^2"};
    EXPECT_TRUE(failsWith(test::uff58(s), Code::BadField, atLine(recordLine(9)), "'mm/s^2'"));
}

TEST(ParseUffError, Record9UnitsLabelOfAnotherQuantityThanTheSpecificDataType) {
    Uff58Spec s = spec({1, 2});
    s.ordinate = {12, 0, 0, 0, "Acceleration", "mm/s"};
    EXPECT_TRUE(failsWith(test::uff58(s), Code::BadField, atLine(recordLine(9)), "(velocity)"));
}

TEST(ParseUffError, Record9SpecificDataTypesWithoutAHumwiseQuantity) {
    for (const int type : {13, 15, 5, 19, 99}) {
        SCOPED_TRACE(type);
        Uff58Spec s = spec({1, 2});
        s.ordinate = {type, 0, 1, 0, "Response", "N"};
        EXPECT_TRUE(failsWith(test::uff58(s), Code::UnsupportedFormat, atLine(recordLine(9)), "specific data type " + std::to_string(type)));
    }
}

TEST(ParseUffError, Record12NonNumericValueNamesItsLine) {
    Uff58Spec s = spec({1, 2, 3, 4, 5, 6, 7, 8});
    std::string text = test::uff58(s);
    const std::size_t at = text.find("7.00000E+00");
    text.replace(at, 11, "7.0000OE+00"); // letter O on the second data line
    EXPECT_TRUE(failsWith(text, Code::BadNumber, atLine(recordLine(12) + 1), "data value 7"));
}

TEST(ParseUffError, Record12FewerValuesThanRecord7Announces) {
    Uff58Spec s = spec(mixedValues(12)); // two full lines
    s.count = 20;
    EXPECT_TRUE(failsWith(test::uff58(s), Code::TruncatedData, atLine(recordLine(12) + 2), "12 of the 20"));
}

TEST(ParseUffError, Record12MoreValuesThanRecord7Announces) {
    Uff58Spec s = spec(mixedValues(12));
    s.count = 10;
    EXPECT_TRUE(failsWith(test::uff58(s), Code::BadChunk, atLine(recordLine(12) + 1), "more values than the 10"));
}

TEST(ParseUffError, MissingClosingMinusOneAtTheEndOfTheFile) {
    Uff58Spec s = spec({1, 2, 3});
    s.closingDelimiter = false;
    EXPECT_TRUE(failsWith(test::uff58(s), Code::BadChunk, atLine(recordLine(12) + 1), "without the -1"));
}

TEST(ParseUffError, MissingClosingMinusOneBeforeTheNextDataset) {
    Uff58Spec s = spec({1, 2, 3});
    s.closingDelimiter = false;
    const std::string first = test::uff58(s);
    // The next dataset's opening -1 closes the first; its "58" line then stands where a -1 belongs.
    EXPECT_TRUE(failsWith(first + test::uff58(spec({1, 2, 3})), Code::BadChunk, atLine(linesIn(first) + 2), "expected -1"));
}

TEST(ParseUffError, TextAfterTheLastDataset) {
    const std::string one = test::uff58(spec({1, 2, 3}));
    EXPECT_TRUE(failsWith(one + "\nend of file\n", Code::BadChunk, atLine(linesIn(one) + 2), "'end of file'"));
}

TEST(ParseUffError, OtherDatasetWithoutClosingMinusOne) {
    const std::string text = test::uff58(spec({1})) + "    -1\n   151\nmodel name\n";
    EXPECT_TRUE(failsWith(text, Code::BadChunk, atLine(linesIn(test::uff58(spec({1}))) + 2), "dataset 151"));
}

TEST(ParseUffError, DatasetsOfDifferentLengthsOrIncrementsCannotBeOneRecording) {
    const std::string first = test::uff58(spec({1, 2, 3}));
    const std::size_t secondRecord7 = linesIn(first) + recordLine(7);
    EXPECT_TRUE(failsWith(first + test::uff58(spec({1, 2, 3, 4})), Code::UnsupportedFormat, atLine(secondRecord7), "different lengths"));
    Uff58Spec other = spec({1, 2, 3});
    other.increment = 1.0 / 12800;
    EXPECT_TRUE(failsWith(first + test::uff58(other), Code::UnsupportedFormat, atLine(secondRecord7), "different rates"));
}

TEST(ParseUffError, MoreThan1024Datasets58) {
    std::string text;
    const std::string one = test::uff58(spec({1}));
    for (std::size_t i = 0; i <= kMaxUffChannels; ++i) text += one;
    EXPECT_TRUE(failsWith(text, Code::UnsupportedFormat, atLine(kMaxUffChannels * linesIn(one) + 2), "more than 1024"));
    const auto ok = parseUff(bytesOf(text.substr(0, kMaxUffChannels * one.size())), kSource);
    ASSERT_TRUE(ok) << ok.error().message();
    EXPECT_EQ(ok.value().recording.channels.size(), kMaxUffChannels);
}

// Binary header line and block: positions are byte offsets. The header line of the first
// dataset starts at byte 7, after "    -1\n".
constexpr std::uint64_t kHeaderByte = 7;

Uff58Spec binarySpec() {
    Uff58Spec s = spec(kFloatExact);
    s.binary = true;
    return s;
}

TEST(ParseUffError, Binary58bByteOrderOtherThan1Or2) {
    Uff58Spec s = binarySpec();
    s.byteOrder = 3;
    EXPECT_TRUE(failsWith(test::uff58(s), Code::BadField, atByte(kHeaderByte), "byte order 3"));
}

TEST(ParseUffError, Binary58bFloatingPointFormatOtherThanIeee) {
    Uff58Spec s = binarySpec();
    s.floatFormat = 1;
    EXPECT_TRUE(failsWith(test::uff58(s), Code::UnsupportedFormat, atByte(kHeaderByte), "floating-point format 1"));
}

TEST(ParseUffError, Binary58bTextLineCountOtherThan11) {
    Uff58Spec s = binarySpec();
    s.textLines = 12;
    EXPECT_TRUE(failsWith(test::uff58(s), Code::BadField, atByte(kHeaderByte), "12 text lines"));
}

TEST(ParseUffError, Binary58bHeaderFieldsNonNumericOrMissing) {
    Uff58Spec s = binarySpec();
    s.headerText = "    58b     1    x2         11          28";
    EXPECT_TRUE(failsWith(test::uff58(s), Code::BadNumber, atByte(kHeaderByte), "floating-point format"));
    s.headerText = "    58b     1     2";
    EXPECT_TRUE(failsWith(test::uff58(s), Code::BadField, atByte(kHeaderByte), "number of bytes"));
    s.headerText = "    58b     1     2         11         -28";
    EXPECT_TRUE(failsWith(test::uff58(s), Code::BadField, atByte(kHeaderByte), "negative"));
}

TEST(ParseUffError, Binary58bByteCountThatDoesNotMatchRecord7) {
    Uff58Spec s = binarySpec();
    s.byteCount = static_cast<long long>(kFloatExact.size() * 4 + 4);
    EXPECT_TRUE(failsWith(test::uff58(s), Code::BadField, atByte(kHeaderByte), "record 7 needs 28"));
}

TEST(ParseUffError, Binary58bBlockCutShort) {
    const std::string full = test::uff58(binarySpec());
    const std::size_t dataStart = offsetOfLine(full, recordLine(12));
    EXPECT_TRUE(failsWith(full.substr(0, dataStart + 10), Code::TruncatedData, atByte(dataStart), "needs 28 bytes, only 10 remain"));
}

TEST(ParseUffError, Binary58bNoClosingMinusOneAfterTheBlock) {
    Uff58Spec s = binarySpec();
    s.closingDelimiter = false;
    const std::string text = test::uff58(s);
    const std::size_t blockEnd = offsetOfLine(text, recordLine(12)) + kFloatExact.size() * 4;
    EXPECT_TRUE(failsWith(text, Code::BadChunk, atByte(blockEnd), "no -1 closes"));
    EXPECT_TRUE(failsWith(text + "garbage\n    -1\n", Code::BadChunk, atByte(blockEnd), "no -1 closes"));
}

TEST(ParseUffError, Binary58bRecordErrorsAndLaterAsciiDatasetsReportByteOffsets) {
    Uff58Spec s = binarySpec();
    s.functionType = 4;
    const std::string text = test::uff58(s);
    EXPECT_TRUE(failsWith(text, Code::UnsupportedFormat, atByte(offsetOfLine(text, recordLine(6))), "function type 4"));

    const std::string binaryFirst = test::uff58(binarySpec());
    Uff58Spec ascii = spec(kFloatExact);
    ascii.ordinate.units = "furlong";
    const std::string second = test::uff58(ascii);
    EXPECT_TRUE(failsWith(binaryFirst + second, Code::BadField, atByte(binaryFirst.size() + offsetOfLine(second, recordLine(9))), "'furlong'"));

    // A skipped binary dataset of another number switches to byte offsets as well.
    const std::string other = "    -1\n  2414b     1     2          11           4\n\x01\n\x02\x03\n    -1\n";
    EXPECT_TRUE(failsWith(other + second, Code::BadField, atByte(other.size() + offsetOfLine(second, recordLine(9))), "'furlong'"));
}

// ---------------------------------------------------------------------------------------
// Robustness loops

// Every outcome is a recording of consistent shape or an error naming the source and a
// position (line or byte; only an empty input has none).
::testing::AssertionResult wellBehaved(const std::string& text) {
    const auto r = parseUff(bytesOf(text), kSource);
    if (!r) {
        const ReadError& e = r.error();
        if (e.message().find(kSource) == std::string::npos) return ::testing::AssertionFailure() << "error without source: " << e.message();
        if (e.code != Code::Empty && !e.line && !e.offset) return ::testing::AssertionFailure() << "error without position: " << e.message();
        if (e.detail.empty()) return ::testing::AssertionFailure() << "error without detail";
        return ::testing::AssertionSuccess();
    }
    const Recording& rec = r.value().recording;
    if (rec.channels.empty() || rec.channels.size() > kMaxUffChannels || r.value().channels.size() != rec.channels.size())
        return ::testing::AssertionFailure() << "implausible channel count accepted";
    if (!(rec.sampleRateHz > 0) || !(rec.sampleRateHz <= kMaxUffSampleRateHz)) return ::testing::AssertionFailure() << "rate " << rec.sampleRateHz;
    for (const auto& ch : rec.channels)
        if (ch.samples.empty() || ch.samples.size() != rec.frameCount()) return ::testing::AssertionFailure() << "channels of different lengths";
    if (rec.frameCount() * rec.channels.size() > text.size()) return ::testing::AssertionFailure() << "more values than bytes";
    return ::testing::AssertionSuccess();
}

TEST(ParseUffFuzz, RandomAndMutatedBuffersNeverCrash) {
    std::mt19937 rng(20260305);
    const std::string alphabet = " 0123456789.-+EeDd\n\r\tabgmsNOE/*^58b";
    std::uniform_int_distribution<int> byte(0, 255), length(0, 600), mode(0, 4), edits(1, 4);
    std::uniform_int_distribution<std::size_t> pick(0, alphabet.size() - 1);
    Uff58Spec bin = binarySpec();
    Uff58Spec dbl = spec(mixedValues(9));
    dbl.dataType = 4;
    const std::string validAscii = test::uff58(spec(mixedValues(9))) + test::uff58(dbl);
    const std::string validBinary = test::uff58(bin) + test::uff58(bin);
    int values = 0;
    for (int iteration = 0; iteration < 5000; ++iteration) {
        std::string text;
        const int m = mode(rng);
        switch (m) {
        case 0: // random bytes
            for (int i = length(rng); i > 0; --i) text += static_cast<char>(byte(rng));
            break;
        case 1: // an opening -1 and 58, then UFF-ish characters
            text = iteration % 2 ? "    -1\n    58\n" : "    -1\n    58b     1     2         11          28\n";
            for (int i = length(rng); i > 0; --i) text += alphabet[pick(rng)];
            break;
        case 2: // a valid ASCII file with a few characters replaced
        case 3: { // a valid binary file with a few bytes replaced
            text = m == 2 ? validAscii : validBinary;
            std::uniform_int_distribution<std::size_t> where(0, text.size() - 1);
            for (int e = edits(rng); e > 0; --e) text[where(rng)] = iteration % 3 ? alphabet[pick(rng)] : static_cast<char>(byte(rng));
            break;
        }
        default: { // a valid file cut anywhere, with random text after the cut
            const std::string& base = iteration % 2 ? validAscii : validBinary;
            text = base.substr(0, std::uniform_int_distribution<std::size_t>(0, base.size())(rng));
            for (int i = length(rng) / 8; i > 0; --i) text += alphabet[pick(rng)];
        }
        }
        ASSERT_TRUE(wellBehaved(text)) << "iteration " << iteration << ", " << text.size() << " bytes";
        if (parseUff(bytesOf(text), kSource)) ++values;
    }
    EXPECT_GT(values, 100) << "too few mutated files reached the data decoder";
}

// Every prefix of `full` must be refused with one of `allowed` codes and a position, except
// those in [validFrom, validTo]: a complete first dataset followed by part of the next
// one's blank-padded "    -1" (a file of fewer complete datasets), and the file without its
// final line break ("    -1" without it still closes the dataset).
void expectTruncations(const std::string& full, std::initializer_list<Code> allowed, std::size_t validFrom, std::size_t validTo) {
    ASSERT_EQ(full.back(), '\n');
    const auto whole = parseUff(bytesOf(full), kSource);
    ASSERT_TRUE(whole) << whole.error().message();
    for (std::size_t n = 0; n + 1 < full.size(); ++n) {
        const auto r = parseUff(bytesOf(full.substr(0, n)), kSource);
        if (n >= validFrom && n <= validTo) {
            ASSERT_TRUE(r) << n << " bytes: " << r.error().message();
            ASSERT_LT(r.value().recording.channels.size(), whole.value().recording.channels.size()) << n << " bytes";
            EXPECT_EQ(r.value().recording.channels[0].samples, whole.value().recording.channels[0].samples);
            continue;
        }
        ASSERT_FALSE(r) << "a file cut to " << n << " of " << full.size() << " bytes was accepted";
        const Code c = r.error().code;
        EXPECT_TRUE(n == 0 ? c == Code::Empty : std::find(allowed.begin(), allowed.end(), c) != allowed.end())
            << n << " bytes: " << r.error().message();
        EXPECT_TRUE(n == 0 || r.error().line || r.error().offset) << n << " bytes: " << r.error().message();
    }
    const auto lastBreak = parseUff(bytesOf(full.substr(0, full.size() - 1)), kSource);
    ASSERT_TRUE(lastBreak) << lastBreak.error().message();
    ASSERT_EQ(lastBreak.value().recording.channels.size(), whole.value().recording.channels.size());
    for (std::size_t c = 0; c < whole.value().recording.channels.size(); ++c)
        EXPECT_EQ(lastBreak.value().recording.channels[c].samples, whole.value().recording.channels[c].samples);
}

const std::initializer_list<Code> kAsciiCutCodes{Code::NotRecognised, Code::TruncatedHeader, Code::TruncatedData, Code::BadChunk, Code::BadNumber};
// A cut inside the 58b header line can also leave too few or different fields (BadField).
const std::initializer_list<Code> kBinaryCutCodes{Code::NotRecognised, Code::TruncatedHeader, Code::TruncatedData, Code::BadChunk,
                                                  Code::BadNumber, Code::BadField};

TEST(ParseUffFuzz, EveryTruncationOfAOneDatasetFileIsAnErrorAsciiAndBinary) {
    Uff58Spec asciiSingle = spec(mixedValues(7));
    Uff58Spec asciiDouble = asciiSingle;
    asciiDouble.dataType = 4;
    Uff58Spec binSingle = binarySpec();
    Uff58Spec binDouble = binarySpec();
    binDouble.dataType = 4;
    binDouble.byteOrder = 2;
    for (const Uff58Spec* s : {&asciiSingle, &asciiDouble, &binSingle, &binDouble}) {
        SCOPED_TRACE(std::string(s->binary ? "58b" : "58") + " type " + std::to_string(s->dataType));
        const std::string full = test::uff58(*s);
        expectTruncations(full, s->binary ? kBinaryCutCodes : kAsciiCutCodes, full.size(), full.size()); // nothing valid before the end
    }
}

TEST(ParseUffFuzz, EveryTruncationOfATwoDatasetFileIsAnErrorOrTheFirstDatasetAlone) {
    for (const bool binary : {false, true}) {
        SCOPED_TRACE(binary);
        Uff58Spec first = binary ? binarySpec() : spec(mixedValues(7));
        Uff58Spec second = first;
        second.dataType = 4;
        const std::string one = test::uff58(first);
        // Valid: "...    -1" (one - 1 bytes) up to "...    -1\n    " (one + 4 bytes, a blank line).
        expectTruncations(one + test::uff58(second), binary ? kBinaryCutCodes : kAsciiCutCodes, one.size() - 1, one.size() + 4);
    }
}

// ---------------------------------------------------------------------------------------
// RecordingReader routes universal files here.

std::filesystem::path fixture(const std::string& name) { return test::outputDir() / "io" / "uff-routing" / name; }

TEST(ReadRecordingFileUff, ByExtensionUffOrUnv) {
    // Dataset 151 first: the content test does not see a 58, only the name routes the file.
    const std::string text = test::uffOtherDataset(151, {"model"}) + test::uff58(spec({1, 2, 3}));
    for (const char* name : {"point.uff", "POINT.UFF", "route.unv"}) {
        SCOPED_TRACE(name);
        const auto path = fixture(name);
        test::writeText(path, text);
        const auto r = readRecordingFile(path);
        ASSERT_TRUE(r) << r.error().message();
        EXPECT_EQ(r.value().sampleRateHz, 25600.0);
        EXPECT_EQ(r.value().frameCount(), 3u);
        EXPECT_EQ(r.value().source, path.string());
    }
}

TEST(ReadRecordingFileUff, Dataset58ByContentWhateverTheName) {
    for (const char* name : {"export.dat", "walk.csv", "logger.txt", "no-extension"}) {
        SCOPED_TRACE(name);
        const auto path = fixture(name);
        test::writeText(path, test::uff58(spec({1, 2})));
        const auto r = readRecordingFile(path);
        ASSERT_TRUE(r) << r.error().message();
        EXPECT_EQ(r.value().channels[0].name, "Point 1");
    }
}

TEST(ReadRecordingFileUff, UffNameWithOtherContentIsAUffError) {
    const auto path = fixture("text.uff");
    test::writeText(path, "time [s],x [g]\n0,1\n");
    const auto r = readRecordingFile(path);
    ASSERT_FALSE(r);
    EXPECT_EQ(r.error().code, Code::NotRecognised);
    EXPECT_EQ(r.error().line, std::optional<std::size_t>(1)); // the UFF reader's error, with a line
    EXPECT_NE(r.error().message().find("text.uff"), std::string::npos);
}

TEST(ReadRecordingFileUff, EmptyUffIsEmpty) {
    const auto path = fixture("empty.unv");
    test::writeBytes(path, {});
    const auto r = readRecordingFile(path);
    ASSERT_FALSE(r);
    EXPECT_EQ(r.error().code, Code::Empty);
}

TEST(ReadRecordingFileUff, ChannelOptionsReachTheUffReader) {
    Uff58Spec s = spec({2.0});
    s.ordinate = {0, 0, 0, 0, "NONE", "NONE"}; // no unit in the file
    const auto path = fixture("options.uff");
    test::writeText(path, test::uff58(s));
    RecordingReadOptions options;
    options.channels.defaults = {"", Unit::Ampere, 0.5};
    const auto r = readRecordingFile(path, options);
    ASSERT_TRUE(r) << r.error().message();
    EXPECT_EQ(r.value().channels[0].quantity, Quantity::Current);
    EXPECT_DOUBLE_EQ(r.value().channels[0].samples[0], 1.0);
}

} // namespace
} // namespace humwise::io
