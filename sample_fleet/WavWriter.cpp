#include "sample_fleet/WavWriter.h"

#include <bit>
#include <cmath>
#include <cstdint>
#include <fstream>
#include <stdexcept>
#include <string>
#include <vector>

namespace humwise::sample {
namespace {

void put16(std::vector<char>& out, std::uint16_t v) {
    for (int i = 0; i < 2; ++i) out.push_back(static_cast<char>((v >> (8 * i)) & 0xFF));
}

void put32(std::vector<char>& out, std::uint32_t v) {
    for (int i = 0; i < 4; ++i) out.push_back(static_cast<char>((v >> (8 * i)) & 0xFF));
}

void tag(std::vector<char>& out, const char (&id)[5]) { out.insert(out.end(), id, id + 4); }

} // namespace

void writeFloatWav(const std::filesystem::path& path, double sampleRateHz, std::span<const double> samples, double scale) {
    constexpr std::uint16_t kIeeeFloat = 3;
    const auto rate = static_cast<std::uint32_t>(std::lround(sampleRateHz));
    if (rate == 0 || std::abs(sampleRateHz - rate) > 1e-9) throw std::runtime_error(path.string() + ": the WAV writer needs a whole sample rate");
    const std::uint64_t dataBytes = 4ull * samples.size();
    if (dataBytes > 0xFFFFFF00ull) throw std::runtime_error(path.string() + ": too many samples for a WAV file");
    std::vector<char> out;
    out.reserve(58 + dataBytes);
    tag(out, "RIFF");
    put32(out, static_cast<std::uint32_t>(4 + (8 + 18) + (8 + 4) + (8 + dataBytes)));
    tag(out, "WAVE");
    tag(out, "fmt ");
    put32(out, 18);
    put16(out, kIeeeFloat);
    put16(out, 1);        // channels
    put32(out, rate);
    put32(out, rate * 4); // bytes per second
    put16(out, 4);        // block align
    put16(out, 32);       // bits per sample
    put16(out, 0);        // no extension
    tag(out, "fact");
    put32(out, 4);
    put32(out, static_cast<std::uint32_t>(samples.size()));
    tag(out, "data");
    put32(out, static_cast<std::uint32_t>(dataBytes));
    for (double v : samples) put32(out, std::bit_cast<std::uint32_t>(static_cast<float>(v * scale)));
    std::ofstream f(path, std::ios::binary | std::ios::trunc);
    if (!f) throw std::runtime_error(path.string() + ": cannot create the file");
    f.write(out.data(), static_cast<std::streamsize>(out.size()));
    if (!f.flush()) throw std::runtime_error(path.string() + ": writing failed (disk full?)");
}

} // namespace humwise::sample
