// The corpus of bad input: every kind of broken file, manifest and fleet file a data collector
// or a hurried technician can produce, each with its expected error. Built at test time from
// the tables below (no binary files in git): each walkdown case is a valid walkdown of the
// fixture fleet (tests/workflow/FixtureFleet.h) with ONE defect. For each case:
//   bad file      importWalkdown fails naming the file, the kind and the reason; nothing is
//                 stored; `humwise-cli import` exits 1 with that message on stderr; the reader
//                 itself returns the expected ReadError code (unreadable files); with skipBad
//                 the rest of the walkdown imports and the store stays consistent.
//   flagged       the import succeeds; the recording is stored with its quality flag and
//                 listed as flagged (CLI: exit 0, "flagged FILE: KIND").
//   bad manifest  the whole walkdown is refused (skipBad cannot help) naming manifest.csv and
//                 the problem; the CLI exits 1; nothing is stored.
// Fleet files: `humwise-cli fleet import` exits 1 naming the file and the problem, and stores
// nothing.
#include "app/common/Walkdown.h"
#include "cli/CliRunner.h"
#include "core/io/FleetFile.h"
#include "core/io/RecordingReader.h"
#include "core/io/UffTestWriter.h"
#include "core/io/WavTestWriter.h"
#include "support/TestSupport.h"
#include "workflow/FixtureFleet.h"

#include <gtest/gtest.h>

#include <algorithm>
#include <cmath>
#include <cstring>
#include <fstream>
#include <functional>
#include <iterator>
#include <limits>
#include <numbers>
#include <optional>
#include <random>
#include <sstream>
#include <stdexcept>

namespace humwise::corpus {
namespace {

namespace fs = std::filesystem;
using test::Bytes;
using test::WavEncoding;
using RC = io::ReadError::Code;

enum class Expect { BadFile, Flagged, BadManifest };

struct Case {
    const char* name;
    const char* wrong;        // what is wrong, in words
    Expect expect;
    std::string file;         // the file the problem names, relative to the walkdown folder
    std::string kind;         // ImportProblem::kind; for BadManifest "bad_manifest" or "no_manifest"
    std::string words;        // a fragment the message must hold
    std::optional<RC> readCode; // unreadable files: the reader's own error code
    int lost = 0;             // recordings of the walkdown that cannot be imported
    std::function<void(const fs::path&)> damage;
};

// --- building blocks

fs::path corpusDir() { return test::outputDir() / "corpus"; }

std::string slurp(const fs::path& p) {
    std::ifstream in(p, std::ios::binary);
    return {std::istreambuf_iterator<char>(in), std::istreambuf_iterator<char>()};
}

void writeText(const fs::path& p, const std::string& text) { std::ofstream(p, std::ios::binary | std::ios::trunc) << text; }

void appendManifest(const fs::path& folder, const std::string& row) { std::ofstream(folder / "manifest.csv", std::ios::app) << row << "\n"; }

void editManifest(const fs::path& folder, const std::string& from, const std::string& to) {
    std::string text = slurp(folder / "manifest.csv");
    const auto at = text.find(from);
    ASSERT_NE(at, std::string::npos) << from;
    text.replace(at, from.size(), to);
    writeText(folder / "manifest.csv", text);
}

// Replaces P-1/DE-V.wav by a file of another name (and format) in the folder and the manifest.
void relistDeV(const fs::path& folder, const std::string& name, const std::string& content) {
    fs::remove(folder / "P-1/DE-V.wav");
    writeText(folder / name, content);
    editManifest(folder, "P-1/DE-V.wav,", name + ",");
}

void writeDeV(const fs::path& folder, const Bytes& bytes) { test::writeBytes(folder / "P-1/DE-V.wav", bytes); }

// A valid 2 s vibration WAV at 12.8 kHz (float, in g), as the fixture writes them.
std::vector<double> vibration(double seconds = 2.0, double rate = 12800) {
    auto x = test::sine(0.05, 24.6, rate, static_cast<std::size_t>(seconds * rate));
    test::add(x, test::gaussianNoise(0.01, x.size(), 5));
    return x;
}

Bytes floatWav(const std::vector<double>& x, std::uint32_t rate = 12800, std::uint16_t channels = 1) {
    return test::makeFloatWav(x, rate, channels);
}

Bytes pcm16Samples(std::size_t n) {
    std::vector<double> codes(n);
    for (std::size_t i = 0; i < n; ++i) codes[i] = std::round(3000 * std::sin(0.0121 * static_cast<double>(i)));
    return test::sampleBytes(WavEncoding::Pcm16, codes);
}

// A RIFF file with this fmt chunk and 2 s of PCM16 data (12800 Hz) after it.
Bytes withFormat(const test::WavFormat& f, std::size_t dataBytes = 51200) {
    return test::riffFile({{"fmt ", test::fmtBody(f), {}}, {"data", pcm16Samples(dataBytes / 2), {}}});
}

test::WavFormat pcm16Format() {
    test::WavFormat f;
    f.sampleRate = 12800;
    return f;
}

std::string csv(const std::string& header, std::size_t rows, const std::function<std::string(std::size_t)>& row) {
    std::string s = header + "\n";
    for (std::size_t i = 0; i < rows; ++i) s += row(i) + "\n";
    return s;
}

std::string timeRow(std::size_t i) {
    char buf[64];
    std::snprintf(buf, sizeof buf, "%.9f,%.6f", static_cast<double>(i) / 12800, 0.05 * std::sin(0.0121 * static_cast<double>(i)));
    return buf;
}

test::Uff58Spec uffSpec(std::size_t n = 64) {
    test::Uff58Spec s;
    s.increment = 1.0 / 12800;
    for (std::size_t i = 0; i < n; ++i) s.values.push_back(0.05 * std::sin(0.0121 * static_cast<double>(i)));
    return s;
}

// --- the walkdown cases

std::vector<Case> walkdownCases() {
    const std::string deV = "P-1/DE-V.wav";
    std::vector<Case> c;
    // WAV: broken files (the reader's errors, WavReader.h)
    c.push_back({"wav_empty", "a WAV file of zero bytes", Expect::BadFile, deV, "unreadable", "the file is empty", RC::Empty, 1,
                 [](const fs::path& f) { writeDeV(f, {}); }});
    c.push_back({"wav_truncated_header", "a WAV cut inside its fmt chunk", Expect::BadFile, deV, "unreadable", "the fmt chunk claims 16 bytes",
                 RC::TruncatedHeader, 1, [](const fs::path& f) { fs::resize_file(f / "P-1/DE-V.wav", 30); }});
    c.push_back({"wav_truncated_data", "a WAV cut inside its samples", Expect::BadFile, deV, "unreadable", "(truncated file?)", RC::TruncatedData, 1,
                 [](const fs::path& f) { fs::resize_file(f / "P-1/DE-V.wav", 1000); }});
    c.push_back({"wav_chunk_size_lies", "a chunk whose size field claims 2 GB", Expect::BadFile, deV, "unreadable", "chunk 'LIST' claims", RC::BadChunk, 1,
                 [](const fs::path& f) {
                     writeDeV(f, test::riffFile({{"fmt ", test::fmtBody(pcm16Format()), {}}, {"LIST", Bytes(8), 0x7ffffff0u}, {"data", pcm16Samples(25600), {}}}));
                 }});
    c.push_back({"wav_fmt_too_small", "an fmt chunk of 12 bytes", Expect::BadFile, deV, "unreadable", "the fmt chunk has 12 bytes", RC::BadChunk, 1,
                 [](const fs::path& f) {
                     Bytes fmt = test::fmtBody(pcm16Format());
                     fmt.resize(12);
                     writeDeV(f, test::riffFile({{"fmt ", fmt, {}}, {"data", pcm16Samples(25600), {}}}));
                 }});
    c.push_back({"wav_data_before_fmt", "the data chunk before the fmt chunk", Expect::BadFile, deV, "unreadable", "data chunk comes before the fmt chunk",
                 RC::BadChunk, 1,
                 [](const fs::path& f) { writeDeV(f, test::riffFile({{"data", pcm16Samples(25600), {}}, {"fmt ", test::fmtBody(pcm16Format()), {}}})); }});
    c.push_back({"wav_no_data_chunk", "a header and no data chunk", Expect::BadFile, deV, "unreadable", "no data chunk", RC::NoData, 1,
                 [](const fs::path& f) { writeDeV(f, test::riffFile({{"fmt ", test::fmtBody(pcm16Format()), {}}})); }});
    c.push_back({"wav_absurd_channels", "5000 channels", Expect::BadFile, deV, "unreadable", "5000 channels (1 to 1024 are accepted)", RC::BadField, 1,
                 [](const fs::path& f) {
                     auto fmt = pcm16Format();
                     fmt.channels = 5000;
                     writeDeV(f, withFormat(fmt, 100000));
                 }});
    c.push_back({"wav_absurd_rate", "a sample rate of 4294967295 Hz", Expect::BadFile, deV,
                 "unreadable", "sample rate 4294967295 Hz is not plausible", RC::BadField, 1, [](const fs::path& f) {
                     auto fmt = pcm16Format();
                     fmt.sampleRate = 0xffffffffu;
                     writeDeV(f, withFormat(fmt));
                 }});
    c.push_back({"wav_pcm_12_bit", "12-bit PCM samples", Expect::BadFile, deV, "unreadable", "12-bit PCM samples are not supported", RC::UnsupportedFormat, 1,
                 [](const fs::path& f) {
                     auto fmt = pcm16Format();
                     fmt.bits = 12;
                     fmt.blockAlign = 2;
                     writeDeV(f, withFormat(fmt));
                 }});
    c.push_back({"wav_adpcm", "IMA ADPCM (format code 0x11)", Expect::BadFile, deV, "unreadable", "format code 17 (only PCM and IEEE float are read)",
                 RC::UnsupportedFormat, 1, [](const fs::path& f) {
                     auto fmt = pcm16Format();
                     fmt.formatCode = 0x11;
                     fmt.bits = 4;
                     fmt.blockAlign = 256;
                     writeDeV(f, withFormat(fmt));
                 }});
    c.push_back({"wav_rf64", "an RF64 (64-bit RIFF) file", Expect::BadFile, deV, "unreadable", "RF64 files are not supported", RC::UnsupportedFormat, 1,
                 [](const fs::path& f) {
                     Bytes b = floatWav(vibration());
                     std::memcpy(b.data(), "RF64", 4);
                     writeDeV(f, b);
                 }});
    c.push_back({"wav_extensible_unknown_guid", "WAVE_FORMAT_EXTENSIBLE with a sub-format GUID that is not PCM or float", Expect::BadFile, deV,
                 "unreadable", "unknown sub-format GUID", RC::UnsupportedFormat, 1, [](const fs::path& f) {
                     auto fmt = pcm16Format();
                     fmt.formatCode = test::kWavExtensible;
                     fmt.standardGuidTail = false;
                     writeDeV(f, withFormat(fmt));
                 }});
    c.push_back({"wav_block_align_lies", "a block align that does not match channels and bits", Expect::BadFile, deV, "unreadable",
                 "block align 6 does not match 1 channels of 16 bits", RC::BadField, 1, [](const fs::path& f) {
                     auto fmt = pcm16Format();
                     fmt.blockAlign = 6;
                     writeDeV(f, withFormat(fmt));
                 }});
    c.push_back({"wav_partial_frame", "a data chunk that ends inside a frame", Expect::BadFile, deV, "unreadable", "not a whole number of 2-byte frames",
                 RC::TruncatedData, 1, [](const fs::path& f) {
                     Bytes data = pcm16Samples(25600);
                     data.push_back(std::byte{1});
                     writeDeV(f, test::riffFile({{"fmt ", test::fmtBody(pcm16Format()), {}}, {"data", data, {}}}));
                 }});
    c.push_back({"wav_random_bytes", "random bytes named .wav", Expect::BadFile, deV, "unreadable", "not a WAV file (no RIFF/WAVE signature)",
                 RC::NotRecognised, 1, [](const fs::path& f) {
                     Bytes b(40000);
                     std::mt19937 rng(9);
                     for (auto& x : b) x = static_cast<std::byte>(rng() & 0xff);
                     writeDeV(f, b);
                 }});
    // Readable files the import refuses (Walkdown.cpp, check())
    c.push_back({"wrong_rate_vibration", "vibration sampled at 1000 Hz", Expect::BadFile, deV, "wrong_rate", "at least 2560 Hz are needed", {}, 1,
                 [](const fs::path& f) { writeDeV(f, floatWav(vibration(4.0, 1000), 1000)); }});
    c.push_back({"wrong_rate_current", "phase currents sampled at 400 Hz", Expect::BadFile, "P-2/current.wav", "wrong_rate", "at least 500 Hz are needed",
                 {}, 3, [](const fs::path& f) {
                     std::vector<double> x;
                     for (std::size_t i = 0; i < 4000; ++i)
                         for (int p = 0; p < 3; ++p) x.push_back(56 * std::sin(2 * std::numbers::pi * 50 * static_cast<double>(i) / 400 + p * 2.094));
                     test::writeBytes(f / "P-2/current.wav", floatWav(x, 400, 3));
                 }});
    c.push_back({"too_short", "half a second of vibration", Expect::BadFile, deV, "too_short", "at least 1 s are needed", {}, 1,
                 [](const fs::path& f) { writeDeV(f, floatWav(vibration(0.5))); }});
    c.push_back({"channel_out_of_range", "channel 4 of a one-channel file", Expect::BadFile, "P-2/DE-V.wav", "no_channel", "channel 4 asked, the file has 1",
                 {}, 1, [](const fs::path& f) { editManifest(f, "P-2/DE-V.wav,1,", "P-2/DE-V.wav,4,"); }});
    c.push_back({"wrong_quantity_manifest", "the manifest says current for an acceleration point", Expect::BadFile, deV, "wrong_quantity",
                 "point DE-V measures acceleration", {}, 1, [](const fs::path& f) {
                     std::string text = slurp(f / "manifest.csv"), out;
                     std::istringstream in(text);
                     for (std::string line; std::getline(in, line);) {
                         if (line.rfind('#', 0) == 0) out += line + "\n";
                         else if (line.rfind("file,", 0) == 0) out += line + ",quantity\n";
                         else out += line + (line.rfind("P-1/DE-V.wav,", 0) == 0 ? ",current\n" : ",\n");
                     }
                     writeText(f / "manifest.csv", out);
                 }});
    c.push_back({"wrong_quantity_file", "a CSV whose column holds current, listed for a vibration point", Expect::BadFile, "P-1/DE-V.csv", "wrong_quantity",
                 "the file holds current, point DE-V measures acceleration", {}, 1,
                 [](const fs::path& f) { relistDeV(f, "P-1/DE-V.csv", csv("time [s],I-A [A]", 100, timeRow)); }});
    // CSV (CsvReader.h)
    c.push_back({"csv_no_header", "a CSV without its header line", Expect::BadFile, "P-1/DE-V.csv", "unreadable", "the first line is data, not a header",
                 RC::BadHeader, 1, [](const fs::path& f) { relistDeV(f, "P-1/DE-V.csv", csv("0.0,0.01", 100, timeRow)); }});
    c.push_back({"csv_wrong_column_count", "a CSV row with three fields under a two-column header", Expect::BadFile, "P-1/DE-V.csv", "unreadable",
                 "line 52", RC::WrongColumnCount, 1, [](const fs::path& f) {
                     relistDeV(f, "P-1/DE-V.csv", csv("time [s],DE-V [g]", 100, [](std::size_t i) { return timeRow(i) + (i == 50 ? ",7" : ""); }));
                 }});
    c.push_back({"csv_bad_number", "a CSV value that is not a number", Expect::BadFile, "P-1/DE-V.csv", "unreadable", "'0.0l2' is not a number",
                 RC::BadNumber, 1, [](const fs::path& f) {
                     relistDeV(f, "P-1/DE-V.csv", csv("time [s],DE-V [g]", 100, [](std::size_t i) { return i == 20 ? std::string("0.0015625,0.0l2") : timeRow(i); }));
                 }});
    c.push_back({"csv_non_uniform_time", "a CSV time column with a gap", Expect::BadFile, "P-1/DE-V.csv", "unreadable", "(gap, jump or not increasing)",
                 RC::NonUniformTime, 1, [](const fs::path& f) {
                     relistDeV(f, "P-1/DE-V.csv", csv("time [s],DE-V [g]", 100, [](std::size_t i) { return timeRow(i < 60 ? i : i + 40); }));
                 }});
    c.push_back({"csv_unknown_unit", "a CSV column in furlongs", Expect::BadFile, "P-1/DE-V.csv", "unreadable", "unknown unit in column 'DE-V [furlong]'",
                 RC::BadHeader, 1, [](const fs::path& f) { relistDeV(f, "P-1/DE-V.csv", csv("time [s],DE-V [furlong]", 100, timeRow)); }});
    c.push_back({"csv_no_rate", "a CSV with neither a time column nor a sample rate", Expect::BadFile, "P-1/DE-V.csv", "unreadable",
                 "no time column and no sample rate", RC::BadHeader, 1, [](const fs::path& f) {
                     relistDeV(f, "P-1/DE-V.csv", csv("DE-V [g]", 100, [](std::size_t i) { return std::to_string(0.01 * static_cast<double>(i % 7)); }));
                 }});
    c.push_back({"csv_binary", "binary data named .csv", Expect::BadFile, "P-1/DE-V.csv", "unreadable", "binary data (NUL bytes)", RC::NotRecognised, 1,
                 [](const fs::path& f) { relistDeV(f, "P-1/DE-V.csv", std::string("time [s],DE-V [g]\n0,\0\0\0\n", 24)); }});
    // UFF58 (UffReader.h)
    c.push_back({"uff_no_dataset_58", "a universal file with dataset 151 only", Expect::BadFile, "P-1/DE-V.uff", "unreadable", "no dataset 58",
                 RC::UnsupportedFormat, 1, [](const fs::path& f) { relistDeV(f, "P-1/DE-V.uff", test::uffOtherDataset(151, {"model", "humwise corpus"})); }});
    c.push_back({"uff_complex", "a dataset 58 of complex values", Expect::BadFile, "P-1/DE-V.uff", "unreadable", "(complex single): only real data",
                 RC::UnsupportedFormat, 1, [](const fs::path& f) {
                     auto s = uffSpec();
                     s.dataType = 5;
                     s.values.resize(128);
                     relistDeV(f, "P-1/DE-V.uff", test::uff58(s));
                 }});
    c.push_back({"uff_truncated", "a dataset 58 cut inside its values", Expect::BadFile, "P-1/DE-V.uff", "unreadable", "the file ends after", RC::TruncatedData,
                 1, [](const fs::path& f) {
                     const std::string full = test::uff58(uffSpec(600));
                     relistDeV(f, "P-1/DE-V.uff", full.substr(0, full.size() / 2));
                 }});
    c.push_back({"uff_spectrum", "a dataset 58 holding an auto spectrum, not a time response", Expect::BadFile, "P-1/DE-V.uff", "unreadable",
                 "function type 2 (auto spectrum): only 1 (time response) is read", RC::UnsupportedFormat, 1, [](const fs::path& f) {
                     auto s = uffSpec();
                     s.functionType = 2;
                     relistDeV(f, "P-1/DE-V.uff", test::uff58(s));
                 }});
    c.push_back({"uff_unknown_units", "a dataset 58 in units Humwise does not know", Expect::BadFile, "P-1/DE-V.uff", "unreadable",
                 "is not a unit Humwise knows", RC::BadField, 1, [](const fs::path& f) {
                     auto s = uffSpec();
                     s.ordinate.units = "furlong/s^2";
                     relistDeV(f, "P-1/DE-V.uff", test::uff58(s));
                 }});
    // Manifest rows (Walkdown.cpp, the plan)
    c.push_back({"unknown_motor", "a row for motor P-9, which the fleet does not have", Expect::BadFile, "P-1/DE-H.wav", "unknown_point",
                 "motor 'P-9' has no point 'DE-H'", {}, 0, [](const fs::path& f) { appendManifest(f, "P-1/DE-H.wav,1,P-9,DE-H"); }});
    c.push_back({"unknown_point", "a row for point XX-H, which motor P-1 does not have", Expect::BadFile, "P-1/DE-H.wav", "unknown_point",
                 "motor 'P-1' has no point 'XX-H'", {}, 0, [](const fs::path& f) { appendManifest(f, "P-1/DE-H.wav,1,P-1,XX-H"); }});
    c.push_back({"duplicate_row", "the same row twice", Expect::BadFile, deV, "duplicate", "listed twice", {}, 0,
                 [](const fs::path& f) { appendManifest(f, "P-1/DE-V.wav,1,P-1,DE-V"); }});
    c.push_back({"path_outside_folder", "a relative path that leaves the folder", Expect::BadFile, "../../outside.wav", "outside_folder",
                 "the path leaves the walkdown folder", {}, 0, [](const fs::path& f) { appendManifest(f, "../../outside.wav,1,P-2,NDE-H"); }});
    c.push_back({"absolute_path", "an absolute path", Expect::BadFile, "/etc/hostname", "outside_folder", "the path leaves the walkdown folder", {}, 0,
                 [](const fs::path& f) { appendManifest(f, "/etc/hostname,1,P-2,NDE-H"); }});
    c.push_back({"link_out_of_folder", "a listed symbolic link to a recording outside the folder", Expect::BadFile, "P-1/link.wav", "outside_folder",
                 "the file is a link out of the walkdown folder", {}, 1, [](const fs::path& f) {
                     const fs::path outside = f.parent_path() / (f.filename().string() + "-outside.wav");
                     fs::copy_file(f / "P-1/DE-V.wav", outside, fs::copy_options::overwrite_existing);
                     fs::remove(f / "P-1/DE-V.wav");
                     fs::create_symlink(outside, f / "P-1/link.wav");
                     editManifest(f, "P-1/DE-V.wav,", "P-1/link.wav,");
                 }});
    // The same link, not listed: its name says P-1/DE-V, so the import would match it by name.
    c.push_back({"unlisted_link_out_of_folder", "an unlisted symbolic link named like a point, to a recording outside the folder", Expect::BadFile,
                 deV, "outside_folder", "the file is a link out of the walkdown folder", {}, 1, [](const fs::path& f) {
                     const fs::path outside = f.parent_path() / (f.filename().string() + "-outside.wav");
                     fs::copy_file(f / "P-1/DE-V.wav", outside, fs::copy_options::overwrite_existing);
                     fs::remove(f / "P-1/DE-V.wav");
                     fs::create_symlink(outside, f / "P-1/DE-V.wav");
                     editManifest(f, "P-1/DE-V.wav,1,P-1,DE-V\n", "");
                 }});
    c.push_back({"missing_file", "a listed file that is not in the folder", Expect::BadFile, "P-2/NDE-H.wav", "missing", "no such file in the walkdown folder",
                 {}, 1, [](const fs::path& f) { fs::remove(f / "P-2/NDE-H.wav"); }});
    c.push_back({"directory_named_like_a_file", "a folder named P-2/NDE-H.wav where the file should be", Expect::BadFile, "P-2/NDE-H.wav", "missing",
                 "no such file in the walkdown folder", {}, 1, [](const fs::path& f) {
                     fs::remove(f / "P-2/NDE-H.wav");
                     fs::create_directories(f / "P-2/NDE-H.wav");
                 }});
    // Readable recordings with bad data: stored, flagged, left out of the diagnosis (Quality.h)
    c.push_back({"flag_nan", "NaN samples in a float WAV", Expect::Flagged, deV, "non_finite", "non_finite", {}, 0, [](const fs::path& f) {
                     auto x = vibration();
                     for (std::size_t i = 1000; i < 1010; ++i) x[i] = std::numeric_limits<double>::quiet_NaN();
                     writeDeV(f, floatWav(x));
                 }});
    c.push_back({"flag_clipped", "a PCM16 input driven three times past full scale", Expect::Flagged, deV, "clipped", "clipped", {}, 0, [](const fs::path& f) {
                     auto x = test::sine(3.0 * 32767, 24.6, 12800, 25600);
                     for (double& v : x) v = std::round(std::clamp(v, -32768.0, 32767.0));
                     test::WavSpec w;
                     w.encoding = WavEncoding::Pcm16;
                     w.sampleRate = 12800;
                     writeDeV(f, test::makeWav(w, x));
                 }});
    c.push_back({"flag_flat_line", "a sensor that recorded nothing (all samples 0)", Expect::Flagged, deV, "flat_line", "flat_line", {}, 0,
                 [](const fs::path& f) { writeDeV(f, floatWav(std::vector<double>(25600, 0.0))); }});
    c.push_back({"flag_bias_drift", "an accelerometer whose bias drifts by 1 g over the record", Expect::Flagged, deV, "bias_drift", "bias_drift", {}, 0,
                 [](const fs::path& f) {
                     auto x = vibration();
                     for (std::size_t i = 0; i < x.size(); ++i) x[i] += static_cast<double>(i) / static_cast<double>(x.size());
                     writeDeV(f, floatWav(x));
                 }});
    // The manifest itself (Manifest.h): the whole walkdown is refused
    const auto manifest = [](const char* name, const char* wrong, const char* words, std::function<void(const fs::path&)> damage,
                             const char* kind = "bad_manifest") {
        return Case{name, wrong, Expect::BadManifest, "manifest.csv", kind, words, {}, 12, std::move(damage)};
    };
    c.push_back(manifest("manifest_empty", "an empty manifest", "the manifest is empty", [](const fs::path& f) { writeText(f / "manifest.csv", ""); }));
    c.push_back(manifest("manifest_missing", "no manifest.csv in the folder", "no walkdown manifest",
                         [](const fs::path& f) { fs::remove(f / "manifest.csv"); }, "no_manifest"));
    c.push_back(manifest("manifest_unknown_column", "a manifest with a column it does not know", "unknown column 'filename'",
                         [](const fs::path& f) { editManifest(f, "file,channel,motor,point", "filename,channel,motor,point"); }));
    c.push_back(manifest("manifest_missing_point_column", "a manifest without the point column", "needs a 'point' column", [](const fs::path& f) {
        writeText(f / "manifest.csv", "# round_start: 2026-03-02T08:00:00Z\nfile,channel,motor\nP-1/DE-H.wav,1,P-1\n");
    }));
    c.push_back(manifest("manifest_missing_round_start", "a manifest without # round_start", "round_start",
                         [](const fs::path& f) { editManifest(f, "# round_start: 2026-03-02T08:00:00Z\n", ""); }));
    c.push_back(manifest("manifest_bad_round_start", "a round_start that is not a date", "round_start 'last Tuesday' is not an ISO 8601 date-time",
                         [](const fs::path& f) { editManifest(f, "2026-03-02T08:00:00Z", "last Tuesday"); }));
    c.push_back(manifest("manifest_wrong_field_count", "a manifest row with five fields under a four-column header", "5 fields, the header has 4",
                         [](const fs::path& f) { appendManifest(f, "P-1/DE-H.wav,1,P-1,DE-H,extra"); }));
    c.push_back(manifest("manifest_bad_channel", "a channel that is not a number", "channel 'two' is not a channel number",
                         [](const fs::path& f) { editManifest(f, "P-1/current.wav,2,", "P-1/current.wav,two,"); }));
    c.push_back(manifest("manifest_binary", "a manifest that is binary data", "binary data in the manifest",
                         [](const fs::path& f) { writeText(f / "manifest.csv", std::string("file,motor,point\n\0\0\0", 20)); }));
    return c;
}

// --- fleet files

struct FleetCase {
    const char* name;
    const char* wrong;
    std::string words;
    std::function<std::string(std::string)> damage; // from the valid fleet file's text
};

std::string replaceOnce(std::string text, const std::string& from, const std::string& to) {
    const auto at = text.find(from);
    if (at == std::string::npos) throw std::invalid_argument("corpus: '" + from + "' not in the fleet file");
    return text.replace(at, from.size(), to);
}

// Removes `"key": {...},` (the first one) from JSON text.
std::string removeObjectMember(std::string text, const std::string& keyAndBrace) {
    const auto at = text.find(keyAndBrace);
    if (at == std::string::npos) throw std::invalid_argument("corpus: '" + keyAndBrace + "' not in the fleet file");
    std::size_t i = at + keyAndBrace.size();
    for (int depth = 1; depth > 0 && i < text.size(); ++i) depth += text[i] == '{' ? 1 : text[i] == '}' ? -1 : 0;
    if (i < text.size() && text[i] == ',') ++i;
    return text.erase(at, i - at);
}

std::vector<FleetCase> fleetCases() {
    return {
        {"fleet_empty", "an empty fleet file", "the file is empty", [](std::string) { return std::string(); }},
        {"fleet_not_json", "a fleet file cut in the middle", "not valid JSON", [](std::string t) { return t.substr(0, t.size() / 2); }},
        {"fleet_wrong_format", "a JSON file of another program", "\"format\" must be \"humwise-fleet\"",
         [](std::string t) { return replaceOnce(t, "\"humwise-fleet\"", "\"geojson\""); }},
        {"fleet_newer_version", "a fleet file of version 2", "fleet file version 2 is not supported",
         [](std::string t) { return replaceOnce(t, "\"version\": 1", "\"version\": 2"); }},
        {"fleet_unknown_member", "a motor with a member Humwise does not know", "unknown member \"colour\"",
         [](std::string t) { return replaceOnce(t, "\"tag\": \"P-1\"", "\"tag\": \"P-1\", \"colour\": \"blue\""); }},
        {"fleet_bad_unit", "a point in a unit Humwise does not know", ".unit 'furlong' is not a unit Humwise knows",
         [](std::string t) { return replaceOnce(t, "\"unit\": \"g\"", "\"unit\": \"furlong\""); }},
        {"fleet_missing_nameplate", "a motor without its nameplate", "needs \"nameplate\"",
         [](std::string t) { return removeObjectMember(t, "\"nameplate\": {"); }},
    };
}

// --- the tests

// A fresh valid walkdown per case (ctest runs the cases in parallel processes: nothing shared).
fs::path caseFolder(const std::string& name) {
    const fs::path folder = corpusDir() / "cases" / name;
    std::error_code ec;
    fs::remove_all(folder, ec);
    test::writeWalkdown(folder);
    return folder;
}

std::unique_ptr<storage::FleetStore> storeWithFleet(const fs::path& db) {
    storage::removeDatabaseFiles(db);
    auto s = storage::FleetStore::open(db);
    storage::Transaction tx(s->database());
    s->saveFleet(test::smallFleet());
    tx.commit();
    return s;
}

std::size_t count(storage::FleetStore& s, const char* table) {
    auto q = s.database().prepare(std::string("SELECT COUNT(*) FROM ") + table); // table names are literals of this test
    q.step();
    return static_cast<std::size_t>(q.integer(0));
}

void expectNothingStored(storage::FleetStore& s) {
    for (const char* t : {"rounds", "recordings", "source_files", "findings", "indicators", "spectra", "round_motors"}) EXPECT_EQ(count(s, t), 0u) << t;
}

bool listed(const std::vector<workflow::ImportProblem>& problems, const Case& c) {
    return std::any_of(problems.begin(), problems.end(), [&](const workflow::ImportProblem& p) {
        return p.file == c.file && p.kind == c.kind && p.reason.find(c.words) != std::string::npos;
    });
}

bool contains(const std::string& text, const std::string& part) { return text.find(part) != std::string::npos; }

std::string describe(const test::CliRun& r) { return "exit " + std::to_string(r.exitCode) + "\nstdout:\n" + r.out + "\nstderr:\n" + r.err; }

class BadWalkdown : public ::testing::TestWithParam<std::size_t> {};

TEST_P(BadWalkdown, IsReportedClearlyAndTheRestImports) {
    const Case c = walkdownCases()[GetParam()];
    SCOPED_TRACE(std::string(c.name) + ": " + c.wrong);
    const fs::path folder = caseFolder(c.name);
    c.damage(folder);
    const fs::path db = corpusDir() / "cases" / (std::string(c.name) + ".db");
    auto store = storeWithFleet(db);

    if (c.readCode) { // the reader's own verdict on the file
        const auto r = io::readRecordingFile(folder / c.file);
        ASSERT_FALSE(r.ok());
        EXPECT_EQ(io::codeName(r.error().code), std::string(io::codeName(*c.readCode))) << r.error().message();
        EXPECT_TRUE(contains(r.error().message(), c.words)) << r.error().message();
    }

    // The command line: exit 1 and the message on stderr for bad files and manifests; a flagged
    // recording is listed (dry run: the check alone).
    const std::vector<std::string> args = {"import", folder.string(), "--db", db.string()};
    auto withDryRun = args;
    withDryRun.push_back("--dry-run");
    const auto cli = test::runCli(c.expect == Expect::Flagged ? withDryRun : args);
    if (c.expect == Expect::Flagged) {
        EXPECT_EQ(cli.exitCode, 0) << describe(cli);
        EXPECT_TRUE(contains(cli.out, "flagged  " + c.file + ": " + c.kind)) << describe(cli);
    } else {
        EXPECT_EQ(cli.exitCode, 1) << describe(cli);
        EXPECT_TRUE(contains(cli.err, "humwise-cli: error: ")) << describe(cli);
        EXPECT_TRUE(contains(cli.err, c.file)) << describe(cli);
        EXPECT_TRUE(contains(cli.err, c.words)) << describe(cli);
        if (c.expect == Expect::BadFile) {
            EXPECT_TRUE(contains(cli.err, c.file + ": " + c.kind + " - ")) << describe(cli);
        }
    }
    expectNothingStored(*store);

    const auto first = workflow::importWalkdown(*store, folder);
    switch (c.expect) {
    case Expect::BadFile: {
        ASSERT_FALSE(first.ok());
        EXPECT_EQ(first.error().code, workflow::ImportError::Code::BadFiles);
        EXPECT_TRUE(contains(first.error().message, c.file)) << first.error().message;
        EXPECT_TRUE(contains(first.error().message, "--skip-bad")) << first.error().message;
        EXPECT_TRUE(listed(first.error().report.bad, c)) << first.error().message;
        EXPECT_EQ(first.error().report.bad.size(), c.kind == "wrong_rate" && c.file == "P-2/current.wav" ? 3u : 1u) << first.error().message;
        expectNothingStored(*store);

        workflow::ImportOptions skip;
        skip.skipBad = true;
        const auto rest = workflow::importWalkdown(*store, folder, skip);
        ASSERT_TRUE(rest.ok()) << rest.error().message;
        EXPECT_TRUE(listed(rest.value().bad, c));
        EXPECT_EQ(rest.value().matched.size(), static_cast<std::size_t>(12 - c.lost));
        EXPECT_EQ(count(*store, "rounds"), 1u);
        EXPECT_EQ(count(*store, "recordings"), static_cast<std::size_t>(12 - c.lost));
        EXPECT_EQ(rest.value().motorsAnalysed, 2u);
        EXPECT_TRUE(store->checkConsistency().empty());
        break;
    }
    case Expect::Flagged: {
        ASSERT_TRUE(first.ok()) << first.error().message;
        EXPECT_TRUE(listed(first.value().flagged, c));
        EXPECT_TRUE(first.value().bad.empty());
        EXPECT_EQ(count(*store, "recordings"), 12u);
        const auto recs = store->recordings(*first.value().roundId);
        const auto rec = std::find_if(recs.begin(), recs.end(), [](const storage::RecordingRow& r) { return r.pointName == "DE-V" && r.motorTag == "P-1"; });
        ASSERT_NE(rec, recs.end());
        EXPECT_TRUE(contains(rec->quality, c.kind)) << rec->quality;
        const auto motors = store->roundMotors(*first.value().roundId);
        ASSERT_FALSE(motors.empty());
        EXPECT_TRUE(contains(motors[0].notes, "DE-V left out")) << motors[0].notes;
        EXPECT_TRUE(store->checkConsistency().empty());
        break;
    }
    case Expect::BadManifest: {
        const auto code = c.kind == "no_manifest" ? workflow::ImportError::Code::NoManifest : workflow::ImportError::Code::BadManifest;
        ASSERT_FALSE(first.ok());
        EXPECT_EQ(first.error().code, code);
        EXPECT_TRUE(contains(first.error().message, "manifest.csv")) << first.error().message;
        EXPECT_TRUE(contains(first.error().message, c.words)) << first.error().message;
        workflow::ImportOptions skip;
        skip.skipBad = true; // a manifest that cannot be read leaves nothing to skip to
        const auto again = workflow::importWalkdown(*store, folder, skip);
        ASSERT_FALSE(again.ok());
        EXPECT_EQ(again.error().code, code);
        expectNothingStored(*store);
        break;
    }
    }
}

INSTANTIATE_TEST_SUITE_P(Corpus, BadWalkdown, ::testing::Range(std::size_t{0}, walkdownCases().size()),
                         [](const ::testing::TestParamInfo<std::size_t>& i) { return std::string(walkdownCases()[i.param].name); });

class BadFleetFile : public ::testing::TestWithParam<std::size_t> {};

TEST_P(BadFleetFile, IsRefusedWithItsReasonAndStoresNothing) {
    const FleetCase c = fleetCases()[GetParam()];
    SCOPED_TRACE(std::string(c.name) + ": " + c.wrong);
    const std::string valid = io::writeFleet(test::smallFleet());
    ASSERT_TRUE(io::parseFleet(valid, "valid.json").ok()); // the defect is the only one
    const fs::path dir = corpusDir() / "fleet";
    fs::create_directories(dir);
    const fs::path file = dir / (std::string(c.name) + ".json");
    writeText(file, c.damage(valid));
    const auto parsed = io::readFleetFile(file);
    ASSERT_FALSE(parsed.ok());
    EXPECT_TRUE(contains(parsed.error().message(), file.string())) << parsed.error().message();
    EXPECT_TRUE(contains(parsed.error().message(), c.words)) << parsed.error().message();

    const fs::path db = dir / (std::string(c.name) + ".db");
    auto store = storeWithFleet(db);
    const auto before = store->loadFleet().motors.size();
    store.reset();
    const auto cli = test::runCli({"fleet", "import", file.string(), "--db", db.string()});
    EXPECT_EQ(cli.exitCode, 1) << describe(cli);
    EXPECT_TRUE(contains(cli.err, file.string())) << describe(cli);
    EXPECT_TRUE(contains(cli.err, c.words)) << describe(cli);
    EXPECT_EQ(storage::FleetStore::open(db, false)->loadFleet().motors.size(), before);
}

INSTANTIATE_TEST_SUITE_P(Corpus, BadFleetFile, ::testing::Range(std::size_t{0}, fleetCases().size()),
                         [](const ::testing::TestParamInfo<std::size_t>& i) { return std::string(fleetCases()[i.param].name); });

// The corpus is as large as the issue asks: at least 30 kinds of bad input, none named twice.
TEST(Corpus, HoldsAtLeastThirtyDistinctKinds) {
    std::vector<std::string> names;
    for (const auto& c : walkdownCases()) names.push_back(c.name);
    for (const auto& c : fleetCases()) names.push_back(c.name);
    std::sort(names.begin(), names.end());
    EXPECT_EQ(std::adjacent_find(names.begin(), names.end()), names.end());
    EXPECT_GE(names.size(), 30u);
}

} // namespace
} // namespace humwise::corpus
