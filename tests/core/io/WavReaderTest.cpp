// WAV reader: decoding and scaling of every sample format, and a clean typed error for every
// broken file (never a crash). Files are built byte by byte with WavTestWriter.
#include "core/io/WavReader.h"

#include "core/io/WavTestWriter.h"
#include "support/TestSupport.h"

#include <gtest/gtest.h>

#include <cmath>
#include <limits>
#include <random>
#include <sstream>
#include <string>
#include <vector>

namespace humwise::io {
namespace {

using test::Bytes;
using test::WavChunk;
using test::WavEncoding;
using test::WavFormat;
using test::WavSpec;
using Code = ReadError::Code;

const std::string kSource = "broken-input.wav";
// Standard gravity, exact by definition (3rd CGPM 1901; REFERENCE.md section 7).
constexpr double kGn = 9.80665;

Bytes bytesOf(const std::string& s) { return Bytes(reinterpret_cast<const std::byte*>(s.data()), reinterpret_cast<const std::byte*>(s.data()) + s.size()); }

// The reader must refuse `bytes` with `code`, and name the source and (except for an empty
// input) the byte offset in the message.
::testing::AssertionResult failsWith(const Bytes& bytes, Code code) {
    const auto r = parseWav(bytes, kSource);
    if (r) return ::testing::AssertionFailure() << "parsed as a valid recording, expected " << codeName(code);
    const ReadError& e = r.error();
    const std::string m = e.message();
    if (e.code != code) return ::testing::AssertionFailure() << "code " << codeName(e.code) << ", expected " << codeName(code) << " (" << m << ")";
    if (m.find(kSource) == std::string::npos) return ::testing::AssertionFailure() << "message does not name the source: " << m;
    if (code != Code::Empty && !e.offset) return ::testing::AssertionFailure() << "no byte offset: " << m;
    if (e.detail.empty()) return ::testing::AssertionFailure() << "no detail: " << m;
    return ::testing::AssertionSuccess() << m;
}

WavFormat pcm16Mono() {
    WavFormat f;
    f.formatCode = test::kWavPcm;
    f.channels = 1;
    f.sampleRate = 8000;
    f.bits = 16;
    return f;
}

const Bytes kFourSamples = test::sampleBytes(WavEncoding::Pcm16, std::vector<double>{1, 2, 3, 4});

// ---------------------------------------------------------------------------------------
// Round trips

struct FormatCase {
    WavEncoding encoding;
    bool extensible;
    std::vector<double> stored;   // what the file holds (integer codes or float values)
    std::vector<double> fraction; // documented decoding, before scale and unit
};

std::string nameOf(const FormatCase& c) {
    static const char* names[] = {"Pcm8", "Pcm16", "Pcm24", "Pcm32", "Float32", "Float64"};
    return std::string(names[static_cast<int>(c.encoding)]) + (c.extensible ? "Extensible" : "");
}

void PrintTo(const FormatCase& c, std::ostream* os) { *os << nameOf(c); }

std::string caseName(const ::testing::TestParamInfo<FormatCase>& info) { return nameOf(info.param); }

class WavFormats : public ::testing::TestWithParam<FormatCase> {};

// WavReader.h: integer v / 2^(bits-1), 8 bit (v - 128) / 128, float as is; then x scale x SI factor.
std::vector<FormatCase> formatCases() {
    std::vector<FormatCase> cases;
    for (bool ext : {false, true}) {
        cases.push_back({WavEncoding::Pcm8, ext, {255, 0, 128, 192, 64}, {127.0 / 128, -1.0, 0.0, 0.5, -0.5}});
        cases.push_back({WavEncoding::Pcm16, ext, {32767, -32768, 0, 16384, -1}, {32767.0 / 32768, -1.0, 0.0, 0.5, -1.0 / 32768}});
        cases.push_back({WavEncoding::Pcm24, ext, {8388607, -8388608, 0, 4194304, -1}, {8388607.0 / 8388608, -1.0, 0.0, 0.5, -1.0 / 8388608}});
        cases.push_back({WavEncoding::Pcm32, ext, {2147483647, -2147483648.0, 0, 1073741824, -1},
                         {2147483647.0 / 2147483648.0, -1.0, 0.0, 0.5, -1.0 / 2147483648.0}});
        cases.push_back({WavEncoding::Float32, ext, {1.0, -1.0, 0.0, 0.25, 3.5}, {1.0, -1.0, 0.0, 0.25, 3.5}});
        cases.push_back({WavEncoding::Float64, ext, {1.0, -1.0, 0.0, 0.1, -123.456}, {1.0, -1.0, 0.0, 0.1, -123.456}});
    }
    return cases;
}

TEST_P(WavFormats, DecodesToTheDocumentedScaleInSiUnits) {
    const FormatCase& c = GetParam();
    WavSpec spec;
    spec.encoding = c.encoding;
    spec.extensible = c.extensible;
    spec.sampleRate = 44100;
    const auto r = parseWav(test::makeWav(spec, c.stored), "fmt.wav");
    ASSERT_TRUE(r) << r.error().message();
    const Recording& rec = r.value();
    EXPECT_EQ(rec.sampleRateHz, 44100.0);
    EXPECT_EQ(rec.source, "fmt.wav");
    ASSERT_EQ(rec.channels.size(), 1u);
    const Channel& ch = rec.channels[0];
    EXPECT_EQ(ch.name, "ch1");
    EXPECT_EQ(ch.quantity, Quantity::Acceleration); // default unit g
    ASSERT_EQ(ch.samples.size(), c.fraction.size());
    for (std::size_t i = 0; i < c.fraction.size(); ++i)
        EXPECT_DOUBLE_EQ(ch.samples[i], c.fraction[i] * kGn) << "sample " << i;
    // Full scale is known for integer data only (1 in file units = g_n here).
    if (test::isFloat(c.encoding)) {
        EXPECT_FALSE(ch.fullScale.has_value());
    } else {
        ASSERT_TRUE(ch.fullScale.has_value());
        EXPECT_DOUBLE_EQ(*ch.fullScale, kGn);
    }
}

INSTANTIATE_TEST_SUITE_P(AllEncodings, WavFormats, ::testing::ValuesIn(formatCases()), caseName);

TEST(ParseWav, ChannelScaleAndUnitApplyPerChannel) {
    WavSpec spec;
    spec.encoding = WavEncoding::Pcm16;
    spec.channels = 3;
    const std::vector<double> codes{16384, 16384, 16384, -32768, -32768, -32768};
    ChannelSettings settings;
    settings.perChannel.push_back({"DE", Unit::MillimetrePerSecond, 2.0});
    settings.perChannel.push_back({"", Unit::Ampere, -0.5});
    settings.defaults = {"", Unit::G, 10.0};
    const auto r = parseWav(test::makeWav(spec, codes), "scaled.wav", settings);
    ASSERT_TRUE(r) << r.error().message();
    const auto& ch = r.value().channels;
    ASSERT_EQ(ch.size(), 3u);

    EXPECT_EQ(ch[0].name, "DE");
    EXPECT_EQ(ch[0].quantity, Quantity::Velocity);
    EXPECT_DOUBLE_EQ(ch[0].samples[0], 0.5 * 2.0 * 1e-3); // mm/s -> m/s
    EXPECT_DOUBLE_EQ(ch[0].samples[1], -1.0 * 2.0 * 1e-3);
    EXPECT_DOUBLE_EQ(*ch[0].fullScale, 2e-3);

    EXPECT_EQ(ch[1].name, "ch2");
    EXPECT_EQ(ch[1].quantity, Quantity::Current);
    EXPECT_DOUBLE_EQ(ch[1].samples[0], -0.25);
    EXPECT_DOUBLE_EQ(ch[1].samples[1], 0.5);
    EXPECT_DOUBLE_EQ(*ch[1].fullScale, 0.5); // magnitude of a negative scale

    EXPECT_EQ(ch[2].name, "ch3");
    EXPECT_EQ(ch[2].quantity, Quantity::Acceleration);
    EXPECT_DOUBLE_EQ(ch[2].samples[0], 0.5 * 10.0 * kGn);
    EXPECT_DOUBLE_EQ(*ch[2].fullScale, 10.0 * kGn);
}

TEST(ParseWav, EightChannelsDeinterleaveInOrder) {
    for (const WavEncoding enc : {WavEncoding::Pcm24, WavEncoding::Float32}) {
        SCOPED_TRACE(test::bitsOf(enc));
        constexpr int kChannels = 8, kFrames = 50;
        std::vector<double> interleaved;
        for (int i = 0; i < kFrames; ++i)
            for (int c = 0; c < kChannels; ++c) interleaved.push_back(1000.0 * (c + 1) + i);
        WavSpec spec;
        spec.encoding = enc;
        spec.channels = kChannels;
        spec.sampleRate = 20000;
        ChannelSettings ms2;
        ms2.defaults.unit = Unit::MetrePerSecond2; // SI factor 1: samples stay fractions
        const auto r = parseWav(test::makeWav(spec, interleaved), "eight.wav", ms2);
        ASSERT_TRUE(r) << r.error().message();
        const Recording& rec = r.value();
        ASSERT_EQ(rec.channels.size(), 8u);
        EXPECT_EQ(rec.frameCount(), static_cast<std::size_t>(kFrames));
        EXPECT_DOUBLE_EQ(rec.durationSeconds(), kFrames / 20000.0);
        const double unit = test::isFloat(enc) ? 1.0 : 1.0 / 8388608.0;
        for (int c = 0; c < kChannels; ++c) {
            EXPECT_EQ(rec.channels[c].name, "ch" + std::to_string(c + 1));
            ASSERT_EQ(rec.channels[c].samples.size(), static_cast<std::size_t>(kFrames));
            for (int i = 0; i < kFrames; ++i)
                ASSERT_DOUBLE_EQ(rec.channels[c].samples[i], (1000.0 * (c + 1) + i) * unit) << "channel " << c << " frame " << i;
        }
    }
}

TEST(ParseWav, SkipsUnknownChunksIncludingOddSizedOnesWithPadByte) {
    WavSpec spec;
    spec.encoding = WavEncoding::Pcm16;
    spec.channels = 2;
    Bytes list;
    test::putTag(list, "INFO");
    test::putTag(list, "ISFT");
    test::putU32(list, 5);
    for (char ch : std::string("hum\0", 4)) list.push_back(static_cast<std::byte>(ch));
    list.push_back(std::byte{0}); // odd sub-chunk pad
    spec.chunksBeforeData.push_back({"LIST", list, {}});
    spec.chunksBeforeData.push_back({"odd ", Bytes{std::byte{1}, std::byte{2}, std::byte{3}}, {}}); // + pad byte
    spec.chunksAfterData.push_back({"cue ", Bytes(7, std::byte{0xEE}), {}});
    const auto bytes = test::makeWav(spec, std::vector<double>{100, -100, 200, -200});
    const auto r = parseWav(bytes, "chunks.wav");
    ASSERT_TRUE(r) << r.error().message();
    ASSERT_EQ(r.value().channels.size(), 2u);
    ASSERT_EQ(r.value().frameCount(), 2u);
    EXPECT_DOUBLE_EQ(r.value().channels[1].samples[1], -200.0 / 32768 * kGn);
}

TEST(ParseWav, FmtChunkWithExtensionBytesIsRead) {
    // A WAVE_FORMAT_PCM fmt chunk of 18 bytes (cbSize = 0), as some writers produce.
    Bytes fmt = test::fmtBody(pcm16Mono());
    test::putU16(fmt, 0);
    const auto r = parseWav(test::riffFile({{"fmt ", fmt, {}}, {"data", kFourSamples, {}}}), kSource);
    ASSERT_TRUE(r) << r.error().message();
    EXPECT_EQ(r.value().frameCount(), 4u);
}

TEST(ReadWav, StreamAndFileGiveTheSameRecording) {
    WavSpec spec;
    spec.encoding = WavEncoding::Float32;
    spec.channels = 2;
    const std::vector<double> values{0.5, -0.5, 0.25, -0.25};
    const Bytes bytes = test::makeWav(spec, values);
    const auto path = test::outputDir() / "io" / "stream-and-file.wav";
    test::writeBytes(path, bytes);

    std::istringstream in(std::string(reinterpret_cast<const char*>(bytes.data()), bytes.size()));
    const auto fromStream = readWav(in, "stream");
    const auto fromFile = readWavFile(path);
    ASSERT_TRUE(fromStream) << fromStream.error().message();
    ASSERT_TRUE(fromFile) << fromFile.error().message();
    EXPECT_EQ(fromStream.value().source, "stream");
    EXPECT_EQ(fromFile.value().source, path.string());
    EXPECT_EQ(fromStream.value().channels[1].samples, fromFile.value().channels[1].samples);
    EXPECT_DOUBLE_EQ(fromFile.value().channels[1].samples[1], -0.25 * kGn);
}

TEST(ReadWav, MissingFileIsCannotOpenNamingThePath) {
    const auto path = test::outputDir() / "io" / "no-such-file.wav";
    const auto r = readWavFile(path);
    ASSERT_FALSE(r);
    EXPECT_EQ(r.error().code, Code::CannotOpen);
    EXPECT_NE(r.error().message().find("no-such-file.wav"), std::string::npos);
}

// Non-finite samples are data, not a format error: the quality checks flag them later.
TEST(ParseWav, NanAndInfinityFloatSamplesAreRead) {
    for (const WavEncoding enc : {WavEncoding::Float32, WavEncoding::Float64}) {
        SCOPED_TRACE(test::bitsOf(enc));
        WavSpec spec;
        spec.encoding = enc;
        const double inf = std::numeric_limits<double>::infinity();
        const auto r = parseWav(test::makeWav(spec, std::vector<double>{std::nan(""), inf, -inf, 0.5}), kSource);
        ASSERT_TRUE(r) << r.error().message();
        const auto& s = r.value().channels[0].samples;
        ASSERT_EQ(s.size(), 4u);
        EXPECT_TRUE(std::isnan(s[0]));
        EXPECT_EQ(s[1], inf);
        EXPECT_EQ(s[2], -inf);
        EXPECT_DOUBLE_EQ(s[3], 0.5 * kGn);
    }
}

// ---------------------------------------------------------------------------------------
// Broken files: one test per defect, each with its specific code.

TEST(ParseWavError, EmptyInput) { EXPECT_TRUE(failsWith({}, Code::Empty)); }

TEST(ParseWavError, FewerThanTwelveBytes) {
    EXPECT_TRUE(failsWith(bytesOf("RIFF\x04\0\0\0WAV"), Code::TruncatedHeader));
    EXPECT_TRUE(failsWith(bytesOf("R"), Code::TruncatedHeader));
}

TEST(ParseWavError, NotRiff) {
    EXPECT_TRUE(failsWith(bytesOf(std::string("FORM\0\0\0\x20" "AIFFCOMM", 16)), Code::NotRecognised));
    EXPECT_TRUE(failsWith(bytesOf(std::string("RIFF\0\0\0\x20" "AVI LIST", 16)), Code::NotRecognised));
    EXPECT_TRUE(failsWith(bytesOf("time [s],DE [g]\n0,1\n"), Code::NotRecognised));
}

Bytes withSignature(Bytes b, const std::string& tag) {
    for (int i = 0; i < 4; ++i) b[i] = static_cast<std::byte>(tag[i]);
    return b;
}

TEST(ParseWavError, Rf64IsUnsupported) {
    const Bytes valid = test::riffFile({{"fmt ", test::fmtBody(pcm16Mono()), {}}, {"data", kFourSamples, {}}});
    EXPECT_TRUE(failsWith(withSignature(valid, "RF64"), Code::UnsupportedFormat));
}

TEST(ParseWavError, RifxIsUnsupported) {
    const Bytes valid = test::riffFile({{"fmt ", test::fmtBody(pcm16Mono()), {}}, {"data", kFourSamples, {}}});
    EXPECT_TRUE(failsWith(withSignature(valid, "RIFX"), Code::UnsupportedFormat));
}

TEST(ParseWavError, TruncatedFmtChunk) {
    Bytes b = test::riffFile({{"fmt ", test::fmtBody(pcm16Mono()), {}}});
    b.resize(12 + 8 + 10); // the file ends 6 bytes into the 16-byte fmt body
    EXPECT_TRUE(failsWith(b, Code::TruncatedHeader));
}

TEST(ParseWavError, FmtChunkShorterThan16Bytes) {
    Bytes fmt = test::fmtBody(pcm16Mono());
    fmt.resize(14);
    EXPECT_TRUE(failsWith(test::riffFile({{"fmt ", fmt, {}}, {"data", kFourSamples, {}}}), Code::BadChunk));
}

TEST(ParseWavError, ExtensibleFmtChunkShorterThan40Bytes) {
    WavFormat f = pcm16Mono();
    f.formatCode = test::kWavExtensible;
    Bytes fmt = test::fmtBody(f);
    fmt.resize(24);
    EXPECT_TRUE(failsWith(test::riffFile({{"fmt ", fmt, {}}, {"data", kFourSamples, {}}}), Code::BadChunk));
}

TEST(ParseWavError, DataBeforeFmt) {
    EXPECT_TRUE(failsWith(test::riffFile({{"data", kFourSamples, {}}, {"fmt ", test::fmtBody(pcm16Mono()), {}}}), Code::BadChunk));
}

TEST(ParseWavError, DataSizeLargerThanTheFile) {
    EXPECT_TRUE(failsWith(test::riffFile({{"fmt ", test::fmtBody(pcm16Mono()), {}}, {"data", kFourSamples, 1000}}), Code::TruncatedData));
}

TEST(ParseWavError, DataSizeNotAWholeNumberOfFrames) {
    WavFormat stereo = pcm16Mono();
    stereo.channels = 2; // 4-byte frames; the data chunk holds 6 bytes
    Bytes data = kFourSamples;
    data.resize(6);
    EXPECT_TRUE(failsWith(test::riffFile({{"fmt ", test::fmtBody(stereo), {}}, {"data", data, {}}}), Code::TruncatedData));
}

TEST(ParseWavError, DataChunkWithZeroBytes) {
    EXPECT_TRUE(failsWith(test::riffFile({{"fmt ", test::fmtBody(pcm16Mono()), {}}, {"data", {}, {}}}), Code::NoData));
}

TEST(ParseWavError, ZeroChannels) {
    WavFormat f = pcm16Mono();
    f.channels = 0;
    f.blockAlign = 2;
    EXPECT_TRUE(failsWith(test::riffFile({{"fmt ", test::fmtBody(f), {}}, {"data", kFourSamples, {}}}), Code::BadField));
}

TEST(ParseWavError, FiveThousandChannels) {
    WavFormat f = pcm16Mono();
    f.channels = 5000; // block align 10000 is consistent: only the count is implausible
    EXPECT_TRUE(failsWith(test::riffFile({{"fmt ", test::fmtBody(f), {}}, {"data", Bytes(10000), {}}}), Code::BadField));
}

TEST(ParseWavError, SampleRateZero) {
    WavFormat f = pcm16Mono();
    f.sampleRate = 0;
    EXPECT_TRUE(failsWith(test::riffFile({{"fmt ", test::fmtBody(f), {}}, {"data", kFourSamples, {}}}), Code::BadField));
}

TEST(ParseWavError, SampleRateFourGigahertz) {
    WavFormat f = pcm16Mono();
    f.sampleRate = 4'000'000'000u;
    EXPECT_TRUE(failsWith(test::riffFile({{"fmt ", test::fmtBody(f), {}}, {"data", kFourSamples, {}}}), Code::BadField));
}

TEST(ParseWavError, BlockAlignMismatch) {
    WavFormat f = pcm16Mono();
    f.blockAlign = 4; // mono 16 bit needs 2
    EXPECT_TRUE(failsWith(test::riffFile({{"fmt ", test::fmtBody(f), {}}, {"data", kFourSamples, {}}}), Code::BadField));
}

TEST(ParseWavError, TwelveBitPcm) {
    WavFormat f = pcm16Mono();
    f.bits = 12;
    f.blockAlign = 2;
    EXPECT_TRUE(failsWith(test::riffFile({{"fmt ", test::fmtBody(f), {}}, {"data", kFourSamples, {}}}), Code::UnsupportedFormat));
}

TEST(ParseWavError, SixteenBitFloat) {
    WavFormat f = pcm16Mono();
    f.formatCode = test::kWavFloat;
    EXPECT_TRUE(failsWith(test::riffFile({{"fmt ", test::fmtBody(f), {}}, {"data", kFourSamples, {}}}), Code::UnsupportedFormat));
}

TEST(ParseWavError, AdpcmFormatCode) {
    WavFormat f = pcm16Mono();
    f.formatCode = 2; // Microsoft ADPCM
    f.bits = 4;
    f.blockAlign = 256;
    EXPECT_TRUE(failsWith(test::riffFile({{"fmt ", test::fmtBody(f), {}}, {"data", Bytes(256), {}}}), Code::UnsupportedFormat));
}

TEST(ParseWavError, ExtensibleWithUnknownGuid) {
    WavFormat f = pcm16Mono();
    f.formatCode = test::kWavExtensible;
    f.standardGuidTail = false;
    EXPECT_TRUE(failsWith(test::riffFile({{"fmt ", test::fmtBody(f), {}}, {"data", kFourSamples, {}}}), Code::UnsupportedFormat));
}

TEST(ParseWavError, ExtensibleWithUnknownSubFormatCode) {
    WavFormat f = pcm16Mono();
    f.formatCode = test::kWavExtensible;
    f.subFormat = 2; // ADPCM inside EXTENSIBLE
    EXPECT_TRUE(failsWith(test::riffFile({{"fmt ", test::fmtBody(f), {}}, {"data", kFourSamples, {}}}), Code::UnsupportedFormat));
}

TEST(ParseWavError, ExtensibleWithFewerValidBitsThanContainer) {
    WavFormat f = pcm16Mono();
    f.formatCode = test::kWavExtensible;
    f.bits = 24;
    f.validBits = 20;
    EXPECT_TRUE(failsWith(test::riffFile({{"fmt ", test::fmtBody(f), {}}, {"data", Bytes(12), {}}}), Code::UnsupportedFormat));
}

TEST(ParseWavError, UnknownChunkClaimingFourGigabytes) {
    EXPECT_TRUE(failsWith(test::riffFile({{"fmt ", test::fmtBody(pcm16Mono()), {}},
                                          {"JUNK", Bytes(8), 0xFFFFFFFFu},
                                          {"data", kFourSamples, {}}}),
                          Code::BadChunk));
}

TEST(ParseWavError, NoDataChunk) {
    EXPECT_TRUE(failsWith(test::riffFile({{"fmt ", test::fmtBody(pcm16Mono()), {}}, {"LIST", Bytes(10), {}}}), Code::NoData));
}

TEST(ParseWavError, NoFmtChunk) {
    EXPECT_TRUE(failsWith(test::riffFile({{"LIST", Bytes(10), {}}}), Code::TruncatedHeader));
}

TEST(ParseWavError, FileEndsInsideAChunkHeader) {
    Bytes b = test::riffFile({{"fmt ", test::fmtBody(pcm16Mono()), {}}});
    test::putTag(b, "data"); // 4 of the 8 header bytes
    EXPECT_TRUE(failsWith(b, Code::TruncatedHeader));
}

// ---------------------------------------------------------------------------------------
// Robustness loops

// Every outcome must be a recording with consistent shape or an error naming the source.
::testing::AssertionResult wellBehaved(const Bytes& bytes) {
    const auto r = parseWav(bytes, kSource);
    if (!r) {
        if (r.error().message().find(kSource) == std::string::npos)
            return ::testing::AssertionFailure() << "error without source: " << r.error().message();
        return ::testing::AssertionSuccess();
    }
    const Recording& rec = r.value();
    if (rec.channels.empty() || rec.channels.size() > kMaxWavChannels || !(rec.sampleRateHz > 0))
        return ::testing::AssertionFailure() << "implausible recording accepted";
    for (const auto& ch : rec.channels)
        if (ch.samples.size() != rec.frameCount() || ch.samples.empty())
            return ::testing::AssertionFailure() << "channels of different lengths";
    if (rec.frameCount() * rec.channels.size() > bytes.size())
        return ::testing::AssertionFailure() << "more samples than bytes";
    return ::testing::AssertionSuccess();
}

TEST(ParseWavFuzz, RandomBuffersNeverCrash) {
    std::mt19937 rng(20260304);
    std::uniform_int_distribution<int> byte(0, 255), length(0, 512), mode(0, 3);
    const Bytes fmt = test::chunkBytes({"fmt ", test::fmtBody(pcm16Mono()), {}});
    int values = 0;
    for (int iteration = 0; iteration < 2000; ++iteration) {
        Bytes b(static_cast<std::size_t>(length(rng)));
        for (auto& x : b) x = static_cast<std::byte>(byte(rng));
        const int m = mode(rng);
        if (m >= 1 && b.size() >= 12) { // a valid RIFF/WAVE header in front of random chunks
            const Bytes head = bytesOf(std::string("RIFF\0\0\0\0WAVE", 12));
            std::copy(head.begin(), head.end(), b.begin());
        }
        if (m >= 2 && b.size() >= 12 + fmt.size()) std::copy(fmt.begin(), fmt.end(), b.begin() + 12);
        const std::size_t dataAt = 12 + fmt.size();
        if (m == 3 && b.size() >= dataAt + 8) { // a data chunk whose size is near the bytes left
            Bytes head = bytesOf("data");
            const std::size_t left = b.size() - dataAt - 8;
            test::putU32(head, std::uniform_int_distribution<std::uint32_t>(0, static_cast<std::uint32_t>(left + 8))(rng));
            std::copy(head.begin(), head.end(), b.begin() + static_cast<std::ptrdiff_t>(dataAt));
        }
        ASSERT_TRUE(wellBehaved(b)) << "iteration " << iteration << ", " << b.size() << " bytes";
        if (parseWav(b, kSource)) ++values;
    }
    EXPECT_GT(values, 0) << "no random buffer reached the sample decoder";
}

TEST(ParseWavFuzz, MutatedValidFilesNeverCrash) {
    std::mt19937 rng(7);
    WavSpec spec;
    spec.encoding = WavEncoding::Pcm24;
    spec.channels = 3;
    spec.extensible = true;
    spec.chunksBeforeData.push_back({"LIST", Bytes(9, std::byte{0x41}), {}});
    const Bytes valid = test::makeWav(spec, test::sine(1e6, 50, 1000, 60));
    std::uniform_int_distribution<std::size_t> where(0, valid.size() - 1);
    std::uniform_int_distribution<int> byte(0, 255), count(1, 4);
    for (int iteration = 0; iteration < 2000; ++iteration) {
        Bytes b = valid;
        for (int k = count(rng); k > 0; --k) b[where(rng)] = static_cast<std::byte>(byte(rng));
        ASSERT_TRUE(wellBehaved(b)) << "iteration " << iteration;
    }
}

TEST(ParseWavFuzz, EveryTruncationIsAnError) {
    WavSpec spec;
    spec.encoding = WavEncoding::Pcm16;
    spec.channels = 2;
    spec.chunksBeforeData.push_back({"LIST", Bytes(5, std::byte{0x20}), {}});
    const Bytes full = test::makeWav(spec, std::vector<double>{1, 2, 3, 4, 5, 6, 7, 8});
    for (std::size_t n = 0; n < full.size(); ++n) {
        const Bytes cut(full.begin(), full.begin() + static_cast<std::ptrdiff_t>(n));
        const auto r = parseWav(cut, kSource);
        ASSERT_FALSE(r) << "a file cut to " << n << " of " << full.size() << " bytes was accepted";
        const Code c = r.error().code;
        EXPECT_TRUE(n == 0 ? c == Code::Empty
                           : c == Code::TruncatedHeader || c == Code::TruncatedData || c == Code::NoData || c == Code::BadChunk)
            << n << " bytes: " << r.error().message();
    }
    const auto r = parseWav(full, kSource);
    ASSERT_TRUE(r) << r.error().message();
    EXPECT_EQ(r.value().frameCount(), 4u);
}

// ---------------------------------------------------------------------------------------
// Real recordings (../shared, see SOURCES.md)

// CWRU Bearing Data Center, record 130 (drive-end outer race 0.007 in at 6:00, 0 hp):
// 3 channels (DE, FE, BA), 12000 Hz, 121991 frames per its JSON sidecar.
TEST(ReadWavFile, CwruRecord130) {
    HUMWISE_REQUIRE_SHARED_RECORDING(path, "cwru_130_de_or007c6_0hp_12k.wav");
    const auto r = readWavFile(path);
    ASSERT_TRUE(r) << r.error().message();
    const Recording& rec = r.value();
    EXPECT_EQ(rec.channels.size(), 3u);
    EXPECT_EQ(rec.sampleRateHz, 12000.0);
    EXPECT_EQ(rec.frameCount(), 121991u);
    for (const auto& ch : rec.channels) {
        EXPECT_EQ(ch.samples.size(), 121991u);
        EXPECT_FALSE(ch.fullScale.has_value()); // 32-bit float file
    }
    EXPECT_EQ(rec.channels[2].name, "ch3");
}

// IMS bearing data (NASA Ames Prognostics Data Repository), set No. 1, 2003-10-22 12:06:24:
// 8 channels, 20000 Hz, 20480 frames per its JSON sidecar.
TEST(ReadWavFile, ImsEightChannels) {
    HUMWISE_REQUIRE_SHARED_RECORDING(path, "ims_test1_2003-10-22_120624_healthy.wav");
    const auto r = readWavFile(path);
    ASSERT_TRUE(r) << r.error().message();
    EXPECT_EQ(r.value().channels.size(), 8u);
    EXPECT_EQ(r.value().sampleRateHz, 20000.0);
    EXPECT_EQ(r.value().frameCount(), 20480u);
}

} // namespace
} // namespace humwise::io
