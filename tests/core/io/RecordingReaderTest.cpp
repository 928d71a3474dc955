// readRecordingFile: the reader is chosen by content (RIFF signature means WAV), then by the
// name (*.csv, *.txt); anything else is refused naming the file (RecordingReader.h).
#include "core/io/RecordingReader.h"

#include "core/io/WavTestWriter.h"
#include "support/TestSupport.h"

#include <gtest/gtest.h>

#include <filesystem>
#include <string>

namespace humwise::io {
namespace {

using Code = ReadError::Code;
namespace fs = std::filesystem;

fs::path fixture(const std::string& name) { return test::outputDir() / "io" / "recording-reader" / name; }

test::Bytes smallWav() {
    test::WavSpec spec;
    spec.encoding = test::WavEncoding::Pcm16;
    spec.channels = 2;
    spec.sampleRate = 8000;
    return test::makeWav(spec, std::vector<double>{16384, -16384, 0, 32767});
}

const std::string kCsv = "time [s],x [g]\n0,1\n0.5,2\n1.0,3\n";

TEST(ReadRecordingFile, WavByContentWhateverTheName) {
    for (const char* name : {"plain.wav", "logger.dat", "no-extension", "misnamed.csv", "UPPER.WAV"}) {
        SCOPED_TRACE(name);
        const auto path = fixture(name);
        test::writeBytes(path, smallWav());
        const auto r = readRecordingFile(path);
        ASSERT_TRUE(r) << r.error().message();
        EXPECT_EQ(r.value().sampleRateHz, 8000.0);
        EXPECT_EQ(r.value().channels.size(), 2u);
        EXPECT_EQ(r.value().source, path.string());
    }
}

TEST(ReadRecordingFile, CsvByName) {
    for (const char* name : {"run.csv", "run.txt", "RUN.CSV"}) {
        SCOPED_TRACE(name);
        const auto path = fixture(name);
        test::writeText(path, kCsv);
        const auto r = readRecordingFile(path);
        ASSERT_TRUE(r) << r.error().message();
        EXPECT_DOUBLE_EQ(r.value().sampleRateHz, 2.0);
        EXPECT_EQ(r.value().frameCount(), 3u);
    }
}

TEST(ReadRecordingFile, OptionsReachTheReaders) {
    RecordingReadOptions options;
    options.channels.defaults = {"", Unit::Ampere, 0.5};
    options.sampleRateHz = 250.0;

    const auto wavPath = fixture("options.wav");
    test::writeBytes(wavPath, smallWav());
    const auto wav = readRecordingFile(wavPath, options);
    ASSERT_TRUE(wav) << wav.error().message();
    EXPECT_EQ(wav.value().channels[0].quantity, Quantity::Current);
    EXPECT_DOUBLE_EQ(wav.value().channels[0].samples[0], 0.25);

    const auto csvPath = fixture("options.csv");
    test::writeText(csvPath, "i\n1\n2\n");
    const auto csv = readRecordingFile(csvPath, options);
    ASSERT_TRUE(csv) << csv.error().message();
    EXPECT_EQ(csv.value().sampleRateHz, 250.0);
    EXPECT_DOUBLE_EQ(csv.value().channels[0].samples[1], 1.0);
}

TEST(ReadRecordingFile, UnknownExtensionIsNotRecognised) {
    for (const char* name : {"notes.dat", "image.png", "no-extension"}) {
        SCOPED_TRACE(name);
        const auto path = fixture(name);
        test::writeText(path, kCsv); // CSV text, but not named as CSV
        const auto r = readRecordingFile(path);
        ASSERT_FALSE(r);
        EXPECT_EQ(r.error().code, Code::NotRecognised);
        EXPECT_NE(r.error().message().find(path.string()), std::string::npos) << r.error().message();
    }
}

TEST(ReadRecordingFile, WavNameWithoutRiffContentIsAWavError) {
    const auto path = fixture("text.wav");
    test::writeText(path, kCsv);
    const auto r = readRecordingFile(path);
    ASSERT_FALSE(r);
    EXPECT_EQ(r.error().code, Code::NotRecognised);
    EXPECT_TRUE(r.error().offset.has_value()); // the WAV reader's error, with a byte offset
    EXPECT_NE(r.error().message().find("text.wav"), std::string::npos);
}

TEST(ReadRecordingFile, RiffSignatureWithBrokenBodyIsAWavErrorEvenAsCsv) {
    auto bytes = smallWav();
    bytes.resize(30);
    const auto path = fixture("cut.csv");
    test::writeBytes(path, bytes);
    const auto r = readRecordingFile(path);
    ASSERT_FALSE(r);
    EXPECT_EQ(r.error().code, Code::TruncatedHeader);
}

TEST(ReadRecordingFile, EmptyFileIsEmptyForEveryName) {
    for (const char* name : {"empty.wav", "empty.csv", "empty.dat"}) {
        SCOPED_TRACE(name);
        const auto path = fixture(name);
        test::writeBytes(path, {});
        const auto r = readRecordingFile(path);
        ASSERT_FALSE(r);
        EXPECT_EQ(r.error().code, Code::Empty);
        EXPECT_NE(r.error().message().find(name), std::string::npos);
    }
}

TEST(ReadRecordingFile, DirectoryIsCannotOpen) {
    const auto dir = fixture("a-folder.wav");
    fs::create_directories(dir);
    const auto r = readRecordingFile(dir);
    ASSERT_FALSE(r);
    EXPECT_EQ(r.error().code, Code::CannotOpen);
    EXPECT_NE(r.error().message().find("a-folder.wav"), std::string::npos);
}

TEST(ReadRecordingFile, MissingFileIsCannotOpen) {
    const auto path = fixture("does-not-exist.csv");
    fs::remove(path);
    const auto r = readRecordingFile(path);
    ASSERT_FALSE(r);
    EXPECT_EQ(r.error().code, Code::CannotOpen);
    EXPECT_NE(r.error().message().find("does-not-exist.csv"), std::string::npos);
}

// CWRU Bearing Data Center, record 130: the shared recordings are float WAV (SOURCES.md).
TEST(ReadRecordingFile, SharedCwruRecording) {
    HUMWISE_REQUIRE_SHARED_RECORDING(path, "cwru_130_de_or007c6_0hp_12k.wav");
    const auto r = readRecordingFile(path);
    ASSERT_TRUE(r) << r.error().message();
    EXPECT_EQ(r.value().channels.size(), 3u);
    EXPECT_EQ(r.value().sampleRateHz, 12000.0);
    EXPECT_EQ(r.value().frameCount(), 121991u);
}

} // namespace
} // namespace humwise::io
