// humwise-cli contract: exit codes (0 ok, 1 processing error, 2 usage error), messages that
// name the culprit, and the numbers in --json / --csv output. Runs the real binary.
#include "cli/CliRunner.h"
#include "cli/MiniJson.h"
#include "core/io/WavTestWriter.h"
#include "support/TestSupport.h"

#include <gtest/gtest.h>

#include <algorithm>
#include <cmath>
#include <filesystem>
#include <fstream>
#include <iterator>
#include <random>
#include <sstream>
#include <string>
#include <vector>

namespace humwise::cli {
namespace {

namespace fs = std::filesystem;
using test::CliRun;
using test::runCli;

constexpr int kOk = 0, kProcessingError = 1, kUsageError = 2;

fs::path fixturePath(const std::string& name) { return test::outputDir() / "cli" / name; }

// A one-channel float WAV holding `x`.
fs::path writeFloatWav(const std::string& name, const std::vector<double>& x, std::uint32_t rate, std::uint16_t channels = 1) {
    const auto path = fixturePath(name);
    test::writeBytes(path, test::makeFloatWav(x, rate, channels));
    return path;
}

// 1 s of a 0.5 g peak 80 Hz sine at 4096 Hz, one channel.
fs::path oneSecondWav() {
    static const fs::path p = writeFloatWav("one-second.wav", test::sine(0.5, 80.0, 4096.0, 4096), 4096);
    return p;
}

test::json::Value parseJson(const CliRun& run) {
    try {
        return test::json::parse(run.out);
    } catch (const std::exception& e) {
        ADD_FAILURE() << e.what() << "\n--- stdout ---\n" << run.out.substr(0, 2000);
        throw;
    }
}

bool contains(const std::string& text, const std::string& part) { return text.find(part) != std::string::npos; }

std::string describe(const CliRun& r) { return "exit " + std::to_string(r.exitCode) + "\n--- stderr ---\n" + r.err; }

// ---------------------------------------------------------------------------------------
// Usage and processing errors

TEST(Cli, NoArgumentsIsAUsageError) {
    const CliRun r = runCli({});
    EXPECT_EQ(r.exitCode, kUsageError) << describe(r);
    EXPECT_TRUE(contains(r.err, "usage")) << r.err;
    EXPECT_TRUE(r.out.empty());
}

TEST(Cli, HelpExitsZeroAndStatesTheSafetyCaution) {
    for (const char* flag : {"--help", "-h", "help"}) {
        SCOPED_TRACE(flag);
        const CliRun r = runCli({flag});
        EXPECT_EQ(r.exitCode, kOk) << describe(r);
        EXPECT_TRUE(contains(r.out, "spectrum")) << r.out;
        EXPECT_TRUE(contains(r.out, "inspect")) << r.out;
        EXPECT_TRUE(contains(r.out, "qualified")) << r.out;
        EXPECT_TRUE(r.err.empty()) << r.err;
    }
}

TEST(Cli, UnknownCommandIsAUsageError) {
    const CliRun r = runCli({"frobnicate", oneSecondWav().string()});
    EXPECT_EQ(r.exitCode, kUsageError) << describe(r);
    EXPECT_TRUE(contains(r.err, "frobnicate")) << r.err;
}

TEST(Cli, UnknownOptionIsAUsageErrorNamingIt) {
    for (const char* command : {"inspect", "spectrum"}) {
        SCOPED_TRACE(command);
        const CliRun r = runCli({command, oneSecondWav().string(), "--bogus-option", "3"});
        EXPECT_EQ(r.exitCode, kUsageError) << describe(r);
        EXPECT_TRUE(contains(r.err, "--bogus-option")) << r.err;
    }
    const CliRun single = runCli({"inspect", oneSecondWav().string(), "-q"});
    EXPECT_EQ(single.exitCode, kUsageError) << describe(single);
    EXPECT_TRUE(contains(single.err, "-q")) << single.err;
}

TEST(Cli, OptionWithoutValueIsAUsageError) {
    const CliRun r = runCli({"spectrum", oneSecondWav().string(), "--window"});
    EXPECT_EQ(r.exitCode, kUsageError) << describe(r);
    EXPECT_TRUE(contains(r.err, "--window")) << r.err;
}

TEST(Cli, MissingFileIsAProcessingErrorNamingIt) {
    const auto path = fixturePath("there-is-no-such-recording.wav");
    fs::remove(path);
    for (const char* command : {"inspect", "spectrum"}) {
        SCOPED_TRACE(command);
        const CliRun r = runCli({command, path.string()});
        EXPECT_EQ(r.exitCode, kProcessingError) << describe(r);
        EXPECT_TRUE(contains(r.err, "there-is-no-such-recording.wav")) << r.err;
    }
}

TEST(Cli, GarbageFileIsAProcessingErrorNamingIt) {
    std::mt19937 rng(404);
    std::uniform_int_distribution<int> byte(0, 255);
    test::Bytes junk(3000);
    for (auto& b : junk) b = static_cast<std::byte>(byte(rng));
    const auto path = fixturePath("x.wav");
    test::writeBytes(path, junk);
    for (const char* command : {"inspect", "spectrum"}) {
        SCOPED_TRACE(command);
        const CliRun r = runCli({command, path.string()});
        EXPECT_EQ(r.exitCode, kProcessingError) << describe(r);
        EXPECT_TRUE(contains(r.err, "x.wav")) << r.err;
        EXPECT_TRUE(r.out.empty()) << r.out;
    }
}

TEST(Cli, ChannelOutOfRangeIsAUsageError) {
    const CliRun r = runCli({"spectrum", oneSecondWav().string(), "--channel", "9"});
    EXPECT_EQ(r.exitCode, kUsageError) << describe(r);
    EXPECT_TRUE(contains(r.err, "9")) << r.err;
    const CliRun zero = runCli({"spectrum", oneSecondWav().string(), "--channel", "0"});
    EXPECT_EQ(zero.exitCode, kUsageError) << describe(zero);
}

TEST(Cli, LinesAndResolutionTogetherIsAUsageError) {
    const CliRun r = runCli({"spectrum", oneSecondWav().string(), "--lines", "400", "--resolution", "1"});
    EXPECT_EQ(r.exitCode, kUsageError) << describe(r);
}

TEST(Cli, BogusWindowIsAUsageError) {
    const CliRun r = runCli({"spectrum", oneSecondWav().string(), "--window", "bogus"});
    EXPECT_EQ(r.exitCode, kUsageError) << describe(r);
    EXPECT_TRUE(contains(r.err, "bogus")) << r.err;
}

TEST(Cli, JsonAndCsvTogetherIsAUsageError) {
    const CliRun r = runCli({"spectrum", oneSecondWav().string(), "--json", "--csv"});
    EXPECT_EQ(r.exitCode, kUsageError) << describe(r);
}

TEST(Cli, ResolutionFinerThanTheRecordAllowsIsAProcessingError) {
    // 0.001 Hz lines need 1000 s of data; the file has 1 s.
    const CliRun r = runCli({"spectrum", oneSecondWav().string(), "--resolution", "0.001"});
    EXPECT_EQ(r.exitCode, kProcessingError) << describe(r);
    EXPECT_TRUE(contains(r.err, "too short")) << r.err;
}

// ---------------------------------------------------------------------------------------
// inspect

TEST(Cli, InspectJsonReportsShapeStatisticsAndQuality) {
    // ch1: 0.5 g peak 50 Hz sine; ch2: the same with one NaN sample.
    constexpr std::uint32_t kRate = 1000;
    const auto s = test::sine(0.5, 50.0, kRate, 2 * kRate);
    std::vector<double> interleaved;
    for (std::size_t i = 0; i < s.size(); ++i) {
        interleaved.push_back(s[i]);
        interleaved.push_back(i == 100 ? std::nan("") : s[i]);
    }
    const auto path = writeFloatWav("inspect.wav", interleaved, kRate, 2);
    const CliRun r = runCli({"inspect", path.string(), "--json"});
    ASSERT_EQ(r.exitCode, kOk) << describe(r);
    const auto j = parseJson(r);
    EXPECT_EQ(j["file"].string(), path.string());
    EXPECT_EQ(j["sample_rate_hz"].number(), 1000.0);
    EXPECT_EQ(j["frames"].number(), 2000.0);
    EXPECT_DOUBLE_EQ(j["duration_s"].number(), 2.0);
    ASSERT_EQ(j["channels"].size(), 2u);

    const auto& ch1 = j["channels"].at(0);
    EXPECT_EQ(ch1["name"].string(), "ch1");
    EXPECT_EQ(ch1["quantity"].string(), "acceleration");
    EXPECT_EQ(ch1["unit"].string(), "g");
    // Sinusoid: rms = peak / sqrt(2) (REFERENCE.md section 7).
    EXPECT_NEAR(ch1["statistics"]["rms"].number(), 0.5 / std::sqrt(2.0), 1e-6);
    EXPECT_NEAR(ch1["statistics"]["peak"].number(), 0.5, 1e-6);
    EXPECT_NEAR(ch1["statistics"]["crest_factor"].number(), std::sqrt(2.0), 1e-5);
    EXPECT_EQ(ch1["statistics"]["non_finite_samples"].number(), 0.0);
    EXPECT_EQ(ch1["quality"].size(), 0u);

    const auto& ch2 = j["channels"].at(1);
    EXPECT_EQ(ch2["statistics"]["non_finite_samples"].number(), 1.0);
    ASSERT_GE(ch2["quality"].size(), 1u);
    bool flagged = false;
    for (std::size_t i = 0; i < ch2["quality"].size(); ++i) flagged |= ch2["quality"].at(i)["flag"].string() == "non_finite";
    EXPECT_TRUE(flagged) << r.out;
}

TEST(Cli, InspectTextNamesTheFileAndChannels) {
    const CliRun r = runCli({"inspect", oneSecondWav().string()});
    ASSERT_EQ(r.exitCode, kOk) << describe(r);
    EXPECT_TRUE(contains(r.out, "one-second.wav")) << r.out;
    EXPECT_TRUE(contains(r.out, "1 channel(s) at 4096 Hz")) << r.out;
}

// ---------------------------------------------------------------------------------------
// spectrum

// REFERENCE.md section 7: v = a / (2 pi f); 1 g peak at 100 Hz -> 15.6078 mm/s pk, 11.0364 mm/s rms.
constexpr double kVelocityPeakMmS = 15.6078;

fs::path oneGAt100HzWav() {
    static const fs::path p = writeFloatWav("sine-1g-100hz.wav", test::sine(1.0, 100.0, 25600.0, 4 * 25600), 25600);
    return p;
}

CliRun velocitySpectrum(std::vector<std::string> extra = {}) {
    std::vector<std::string> args{"spectrum", oneGAt100HzWav().string(), "--as", "velocity", "--unit", "mm/s",
                                  "--scale", "peak", "--window", "flattop"};
    args.insert(args.end(), extra.begin(), extra.end());
    return runCli(args);
}

TEST(Cli, SpectrumOfOneGAt100HzAsVelocityMatchesReferenceLevels) {
    const CliRun r = velocitySpectrum({"--json"});
    ASSERT_EQ(r.exitCode, kOk) << describe(r);
    const auto j = parseJson(r);
    EXPECT_EQ(j["kind"].string(), "averaged");
    EXPECT_EQ(j["quantity"].string(), "velocity");
    EXPECT_EQ(j["unit"].string(), "mm/s");
    EXPECT_EQ(j["scale"].string(), "peak");
    EXPECT_EQ(j["window"].string(), "flattop");
    EXPECT_EQ(j["sample_rate_hz"].number(), 25600.0);
    ASSERT_GE(j["peaks"].size(), 1u);
    EXPECT_NEAR(j["peaks"].at(0)["amplitude"].number(), kVelocityPeakMmS, 0.001 * kVelocityPeakMmS);
    EXPECT_NEAR(j["overall"]["rms"].number(), kVelocityPeakMmS / std::sqrt(2.0), 0.01 * kVelocityPeakMmS / std::sqrt(2.0));
}

TEST(Cli, SpectrumOfOneGAt100HzAsVelocityPeakFrequency) {
    const CliRun r = velocitySpectrum({"--json"});
    ASSERT_EQ(r.exitCode, kOk) << describe(r);
    const auto j = parseJson(r);
    ASSERT_GE(j["peaks"].size(), 1u);
    EXPECT_NEAR(j["peaks"].at(0)["frequency_hz"].number(), 100.0, 0.05);
}

// The same tone without integration: the flat-top peak is exact (shows the estimator is fine).
TEST(Cli, SpectrumOfOneGAt100HzInAcceleration) {
    const CliRun r = runCli({"spectrum", oneGAt100HzWav().string(), "--scale", "peak", "--window", "flattop", "--json"});
    ASSERT_EQ(r.exitCode, kOk) << describe(r);
    const auto j = parseJson(r);
    EXPECT_EQ(j["unit"].string(), "g");
    ASSERT_GE(j["peaks"].size(), 1u);
    EXPECT_NEAR(j["peaks"].at(0)["frequency_hz"].number(), 100.0, 0.05);
    EXPECT_NEAR(j["peaks"].at(0)["amplitude"].number(), 1.0, 0.001);
}

TEST(Cli, SpectrumCsvHasAHeaderAndOneRowPerLine) {
    const CliRun json = velocitySpectrum({"--json"});
    ASSERT_EQ(json.exitCode, kOk) << describe(json);
    const auto j = parseJson(json);
    const auto lines = static_cast<std::size_t>(j["lines"].number());
    ASSERT_GT(lines, 100u);

    const CliRun r = velocitySpectrum({"--csv"});
    ASSERT_EQ(r.exitCode, kOk) << describe(r);
    std::istringstream in(r.out);
    std::string row;
    std::vector<std::string> rows;
    while (std::getline(in, row)) rows.push_back(row);
    ASSERT_FALSE(rows.empty());
    EXPECT_EQ(rows.front(), "frequency_hz,amplitude");
    EXPECT_EQ(rows.size(), lines + 1);
    EXPECT_EQ(std::count(r.out.begin(), r.out.end(), '\n'), static_cast<long>(lines + 1));
    // Every data row is "frequency,amplitude", one line apart.
    const double resolution = j["resolution_hz"].number();
    for (std::size_t k = 1; k < rows.size(); ++k) {
        const auto comma = rows[k].find(',');
        ASSERT_NE(comma, std::string::npos) << "row " << k << ": " << rows[k];
        ASSERT_NEAR(std::stod(rows[k].substr(0, comma)), (k - 1) * resolution, 1e-5) << "row " << k;
    }
}

TEST(Cli, SpectrumFullAddsFrequencyAndAmplitudeArrays) {
    const CliRun plain = velocitySpectrum({"--json"});
    ASSERT_EQ(plain.exitCode, kOk) << describe(plain);
    EXPECT_FALSE(parseJson(plain).has("amplitude"));

    const CliRun r = velocitySpectrum({"--json", "--full"});
    ASSERT_EQ(r.exitCode, kOk) << describe(r);
    const auto j = parseJson(r);
    const auto lines = static_cast<std::size_t>(j["lines"].number());
    const auto f = j["frequency_hz"].numbers();
    const auto a = j["amplitude"].numbers();
    ASSERT_EQ(f.size(), lines);
    ASSERT_EQ(a.size(), lines);
    EXPECT_DOUBLE_EQ(f[1] - f[0], j["resolution_hz"].number());
    const auto top = static_cast<std::size_t>(std::max_element(a.begin(), a.end()) - a.begin());
    EXPECT_NEAR(f[top], 100.0, j["resolution_hz"].number());
    // 100 Hz is bin-centred (3.125 Hz lines), so the highest line is the flat-top peak itself.
    EXPECT_NEAR(a[top], kVelocityPeakMmS, 0.001 * kVelocityPeakMmS);
}

TEST(Cli, SpectrumOfACsvRecording) {
    // 2 s at 2000 Hz (time column), 1 g peak at 125 Hz in column DE.
    std::string text = "# start_time: 2026-03-04T10:15:00Z\ntime [s],DE [g]\n";
    const auto x = test::sine(1.0, 125.0, 2000.0, 4000);
    char buf[64];
    for (std::size_t i = 0; i < x.size(); ++i) {
        std::snprintf(buf, sizeof buf, "%.6f,%.9f\n", static_cast<double>(i) / 2000.0, x[i]);
        text += buf;
    }
    const auto path = fixturePath("sine-125hz.csv");
    test::writeText(path, text);
    const CliRun r = runCli({"spectrum", path.string(), "--json", "--scale", "peak"});
    ASSERT_EQ(r.exitCode, kOk) << describe(r);
    const auto j = parseJson(r);
    EXPECT_EQ(j["channel_name"].string(), "DE");
    EXPECT_NEAR(j["sample_rate_hz"].number(), 2000.0, 1e-6);
    ASSERT_GE(j["peaks"].size(), 1u);
    EXPECT_NEAR(j["peaks"].at(0)["frequency_hz"].number(), 125.0, 0.05);
    EXPECT_NEAR(j["peaks"].at(0)["amplitude"].number(), 1.0, 0.01);

    const CliRun inspect = runCli({"inspect", path.string(), "--json"});
    ASSERT_EQ(inspect.exitCode, kOk) << describe(inspect);
    EXPECT_EQ(parseJson(inspect)["start_time"].string(), "2026-03-04T10:15:00.000Z");
}

TEST(Cli, CsvWithoutTimeColumnNeedsTheRate) {
    std::string text = "v [mm/s]\n";
    for (double v : test::sine(2.0, 40.0, 1000.0, 2000)) text += std::to_string(v) + "\n";
    const auto path = fixturePath("no-time.csv");
    test::writeText(path, text);
    const CliRun without = runCli({"spectrum", path.string()});
    EXPECT_EQ(without.exitCode, kProcessingError) << describe(without);
    EXPECT_TRUE(contains(without.err, "no-time.csv")) << without.err;

    const CliRun with = runCli({"spectrum", path.string(), "--rate", "1000", "--json"});
    ASSERT_EQ(with.exitCode, kOk) << describe(with);
    const auto j = parseJson(with);
    EXPECT_EQ(j["quantity"].string(), "velocity");
    EXPECT_EQ(j["unit"].string(), "mm/s");
    EXPECT_NEAR(j["peaks"].at(0)["frequency_hz"].number(), 40.0, 0.05);
}

TEST(Cli, ZoomOnACurrentRecording) {
    // 20 s of a 10 A peak 50 Hz supply line with a -40 dB sideband at 49.5 Hz, 1000 Hz, 16-bit.
    constexpr double kRate = 1000.0;
    auto x = test::sine(0.5, 50.0, kRate, 20000);
    test::add(x, test::sine(0.005, 49.5, kRate, 20000));
    std::vector<double> codes;
    for (double v : x) codes.push_back(std::round(v * 32767.0));
    test::WavSpec spec;
    spec.encoding = test::WavEncoding::Pcm16;
    spec.sampleRate = 1000;
    const auto path = fixturePath("current-50hz.wav");
    test::writeBytes(path, test::makeWav(spec, codes));

    // Full scale of the file = 20 A, so 0.5 full scale = 10 A peak.
    const CliRun r = runCli({"spectrum", path.string(), "--quantity", "current", "--input-scale", "20", "--zoom", "50:2",
                             "--scale", "peak", "--json"});
    ASSERT_EQ(r.exitCode, kOk) << describe(r);
    const auto j = parseJson(r);
    EXPECT_EQ(j["kind"].string(), "zoom");
    EXPECT_EQ(j["quantity"].string(), "current");
    EXPECT_EQ(j["unit"].string(), "A");
    const double start = j["start_hz"].number();
    const double end = start + (j["lines"].number() - 1) * j["resolution_hz"].number();
    EXPECT_GE(start, 49.0 - 1e-9);
    EXPECT_LE(end, 51.0 + 1e-9);
    ASSERT_GE(j["peaks"].size(), 2u);
    EXPECT_NEAR(j["peaks"].at(0)["frequency_hz"].number(), 50.0, 0.01);
    EXPECT_NEAR(j["peaks"].at(0)["amplitude"].number(), 10.0, 0.01 * 10.0);
    EXPECT_NEAR(j["peaks"].at(1)["frequency_hz"].number(), 49.5, 0.01);
    EXPECT_NEAR(j["peaks"].at(1)["amplitude"].number(), 0.1, 0.05 * 0.1);
}

// CWRU Bearing Data Center, record 130 (drive-end outer race at 6:00, 0 hp, 1796 r/min):
// BPFO = 3.5848 x 1796 / 60 = 107.3 Hz (SOURCES.md; lines land within about 0.6 %, allow 2 %).
TEST(Cli, EnvelopeAutoFindsTheOuterRaceLineInCwruRecord130) {
    HUMWISE_REQUIRE_SHARED_RECORDING(path, "cwru_130_de_or007c6_0hp_12k.wav");
    const CliRun r = runCli({"spectrum", path.string(), "--envelope", "auto", "--json"});
    ASSERT_EQ(r.exitCode, kOk) << describe(r);
    const auto j = parseJson(r);
    EXPECT_EQ(j["kind"].string(), "envelope");
    EXPECT_EQ(j["envelope"]["band_choice"].string(), "kurtogram");
    const auto& peaks = j["peaks"];
    ASSERT_GE(peaks.size(), 3u);
    bool found = false;
    for (std::size_t i = 0; i < 3; ++i) found |= std::abs(peaks.at(i)["frequency_hz"].number() - 107.3) <= 0.02 * 107.3;
    EXPECT_TRUE(found) << r.out;
}

} // namespace
} // namespace humwise::cli

namespace humwise::cli {
namespace {

// REFERENCE.md 7: 1 g rms = 139.83 dB re 1 um/s^2 (ISO 1683 reference).
TEST(Cli, SpectrumInDecibelsUsesTheIso1683Reference) {
    const auto path = writeFloatWav("one-g-rms.wav", test::sine(std::sqrt(2.0), 100.0, 25600.0, 25600 * 2), 25600);
    const CliRun r = runCli({"spectrum", path.string(), "--db", "--window", "flattop", "--json"});
    ASSERT_EQ(r.exitCode, kOk) << describe(r);
    const auto j = parseJson(r);
    EXPECT_NEAR(j["peaks"].at(0)["amplitude"].number(), 139.83, 0.01);
    EXPECT_TRUE(contains(j["unit"].string(), "dB re 1e-06 m/s^2")) << j["unit"].string();
    EXPECT_EQ(runCli({"spectrum", path.string(), "--db", "--unit", "g"}).exitCode, kUsageError);
}

} // namespace
} // namespace humwise::cli

namespace humwise::cli {
namespace {

std::string fileBytes(const std::filesystem::path& p) {
    std::ifstream in(p, std::ios::binary);
    return {std::istreambuf_iterator<char>(in), std::istreambuf_iterator<char>()};
}

// db backup / db restore through the real binary: a restored store backs up to the same bytes.
TEST(Cli, DbBackupAndRestoreRoundTripBitExact) {
    const auto dir = test::outputDir() / "cli" / "backup";
    std::filesystem::remove_all(dir);
    std::filesystem::create_directories(dir);
    const auto db = (dir / "store.db").string(), first = (dir / "first.backup").string();
    const auto restored = (dir / "restored.db").string(), second = (dir / "second.backup").string();
    ASSERT_EQ(runCli({"db", "init", "--db", db}).exitCode, 0);
    const CliRun b = runCli({"db", "backup", first, "--db", db});
    ASSERT_EQ(b.exitCode, 0) << b.err;
    EXPECT_NE(b.out.find("backed up to " + first), std::string::npos) << b.out;
    const CliRun r2 = runCli({"db", "--db", restored, "restore", first}); // --db may come first
    EXPECT_NE(r2.out.find("restore"), std::string::npos) << r2.out;
    ASSERT_EQ(r2.exitCode, 0) << r2.err;
    ASSERT_EQ(runCli({"db", "backup", second, "--db", restored}).exitCode, 0);
    EXPECT_EQ(fileBytes(first), fileBytes(second));
    // Restoring over a store that holds something keeps that store first, and says where.
    ASSERT_EQ(runCli({"db", "init", "--db", (dir / "other.db").string()}).exitCode, 0);
    const CliRun over = runCli({"db", "restore", (dir / "other.db").string(), "--db", restored});
    ASSERT_EQ(over.exitCode, 0) << over.err;
    EXPECT_NE(over.out.find("kept in " + restored + ".before-restore"), std::string::npos) << over.out;
    const auto third = (dir / "third.backup").string();
    ASSERT_EQ(runCli({"db", "backup", third, "--db", restored + ".before-restore"}).exitCode, 0);
    EXPECT_EQ(fileBytes(first), fileBytes(third)); // the safety copy is the store as it was
    const CliRun missing = runCli({"db", "restore", (dir / "nope.backup").string(), "--db", restored});
    EXPECT_EQ(missing.exitCode, kProcessingError);
    EXPECT_NE(missing.err.find("nope.backup"), std::string::npos) << missing.err;
    EXPECT_EQ(missing.out.find("kept in"), std::string::npos) << "no safety copy for a refused restore: " << missing.out;
    EXPECT_EQ(runCli({"db", "backup", "--db", db}).exitCode, kUsageError);
}

} // namespace
} // namespace humwise::cli
