// Writes the binary seed inputs of the fuzz targets: WAV files of every variant the reader
// accepts and UFF58 files (ASCII and binary), each a few hundred bytes, so the fuzzers start
// from valid files without binary files in git. Usage: humwise_fuzz_seeds OUTPUT_DIR
// (writes OUTPUT_DIR/wav/*.wav and OUTPUT_DIR/uff/*.uff).
#include "core/io/UffTestWriter.h"
#include "core/io/WavTestWriter.h"

#include <cmath>
#include <cstdio>
#include <filesystem>
#include <fstream>
#include <string>
#include <vector>

namespace {

namespace fs = std::filesystem;
using namespace humwise::test;

// A short tone as the integer codes (or float values) a file of the encoding stores.
std::vector<double> tone(WavEncoding e, std::size_t frames, unsigned channels) {
    std::vector<double> v;
    const double full = isFloat(e) ? 0.5 : std::ldexp(1.0, static_cast<int>(bitsOf(e)) - 2);
    for (std::size_t i = 0; i < frames; ++i)
        for (unsigned c = 0; c < channels; ++c) {
            double x = std::round(full * std::sin(0.3 * static_cast<double>(i) + c));
            if (isFloat(e)) x = 0.5 * std::sin(0.3 * static_cast<double>(i) + c);
            if (e == WavEncoding::Pcm8) x += 128;
            v.push_back(x);
        }
    return v;
}

void write(const fs::path& p, const std::string& text) { std::ofstream(p, std::ios::binary) << text; }

} // namespace

int main(int argc, char** argv) {
    if (argc != 2) {
        std::fprintf(stderr, "usage: humwise_fuzz_seeds OUTPUT_DIR\n");
        return 2;
    }
    const fs::path out = argv[1];
    fs::create_directories(out / "wav");
    fs::create_directories(out / "uff");

    const std::pair<const char*, WavEncoding> encodings[] = {{"pcm8", WavEncoding::Pcm8},       {"pcm16", WavEncoding::Pcm16},
                                                             {"pcm24", WavEncoding::Pcm24},     {"pcm32", WavEncoding::Pcm32},
                                                             {"float32", WavEncoding::Float32}, {"float64", WavEncoding::Float64}};
    for (const auto& [name, e] : encodings) {
        WavSpec s;
        s.encoding = e;
        s.sampleRate = 25600;
        s.channels = 2;
        writeBytes(out / "wav" / (std::string(name) + ".wav"), makeWav(s, tone(e, 24, 2)));
        s.extensible = true;
        s.channels = 3;
        writeBytes(out / "wav" / (std::string(name) + "-extensible.wav"), makeWav(s, tone(e, 16, 3)));
    }
    {   // extra chunks (odd size: padded) before and after the data
        WavSpec s;
        s.chunksBeforeData.push_back({"LIST", Bytes(5, std::byte{'a'}), {}});
        s.chunksAfterData.push_back({"cue ", Bytes(4, std::byte{0}), {}});
        writeBytes(out / "wav" / "chunks.wav", makeWav(s, tone(WavEncoding::Pcm16, 20, 1)));
    }

    Uff58Spec a;
    a.values = {0.125, -0.25, 0.5, 1.0, -1.5, 2.0, 0.0, 3.25};
    write(out / "uff" / "ascii-single.uff", uff58(a));
    Uff58Spec d = a;
    d.dataType = 4;
    d.ordinate.units = "m/s**2";
    write(out / "uff" / "ascii-double.uff", uff58(d));
    write(out / "uff" / "crlf.uff", withCrLf(uff58(a)));
    Uff58Spec second = a;
    second.ids[0] = "Point 2";
    second.responseDirection = 1;
    write(out / "uff" / "two-datasets.uff", uffOtherDataset(151, {"model", "humwise"}) + uff58(a) + uff58(second));
    Uff58Spec current = a;
    current.ordinate = {1, 0, 0, 0, "Current", "A"};
    write(out / "uff" / "current.uff", uff58(current));
    Uff58Spec bin = a;
    bin.binary = true;
    write(out / "uff" / "binary-le.uff", uff58(bin));
    bin.byteOrder = 2;
    bin.dataType = 4;
    write(out / "uff" / "binary-be-double.uff", uff58(bin));
    return 0;
}
