#include "core/io/WavTestWriter.h"

#include <array>
#include <cmath>
#include <cstring>
#include <fstream>
#include <stdexcept>

#include <unistd.h>

namespace humwise::test {
namespace {

// KSDATAFORMAT_SUBTYPE_PCM / _IEEE_FLOAT after the leading 16-bit format code (mmreg.h).
constexpr std::array<std::uint8_t, 14> kGuidTail{0x00, 0x00, 0x00, 0x00, 0x10, 0x00, 0x80,
                                                 0x00, 0x00, 0xAA, 0x00, 0x38, 0x9B, 0x71};

void putByte(Bytes& out, unsigned v) { out.push_back(static_cast<std::byte>(v & 0xFFu)); }

} // namespace

unsigned bitsOf(WavEncoding e) {
    switch (e) {
    case WavEncoding::Pcm8: return 8;
    case WavEncoding::Pcm16: return 16;
    case WavEncoding::Pcm24: return 24;
    case WavEncoding::Pcm32: return 32;
    case WavEncoding::Float32: return 32;
    case WavEncoding::Float64: return 64;
    }
    throw std::invalid_argument("bitsOf: unknown encoding");
}

bool isFloat(WavEncoding e) { return e == WavEncoding::Float32 || e == WavEncoding::Float64; }

void putU16(Bytes& out, std::uint16_t v) {
    putByte(out, v);
    putByte(out, v >> 8);
}

void putU32(Bytes& out, std::uint32_t v) {
    putU16(out, static_cast<std::uint16_t>(v));
    putU16(out, static_cast<std::uint16_t>(v >> 16));
}

void putTag(Bytes& out, const char* tag) {
    if (std::strlen(tag) != 4) throw std::invalid_argument("putTag: a tag has four characters");
    for (int i = 0; i < 4; ++i) out.push_back(static_cast<std::byte>(tag[i]));
}

Bytes fmtBody(const WavFormat& f) {
    Bytes b;
    const std::uint16_t align = f.blockAlign.value_or(static_cast<std::uint16_t>(f.channels * f.bits / 8));
    putU16(b, f.formatCode);
    putU16(b, f.channels);
    putU32(b, f.sampleRate);
    putU32(b, f.sampleRate * align);
    putU16(b, align);
    putU16(b, f.bits);
    if (f.formatCode == kWavExtensible) {
        putU16(b, 22); // cbSize
        putU16(b, f.validBits.value_or(f.bits));
        putU32(b, 0); // channel mask: unspecified
        putU16(b, f.subFormat);
        for (std::size_t i = 0; i < kGuidTail.size(); ++i) putByte(b, f.standardGuidTail ? kGuidTail[i] : kGuidTail[i] ^ 0x5Au);
    }
    return b;
}

Bytes chunkBytes(const WavChunk& c) {
    Bytes b;
    putTag(b, c.id.c_str());
    putU32(b, c.sizeOverride.value_or(static_cast<std::uint32_t>(c.body.size())));
    b.insert(b.end(), c.body.begin(), c.body.end());
    if (c.body.size() % 2 == 1) putByte(b, 0);
    return b;
}

Bytes riffFile(const std::vector<WavChunk>& chunks) {
    Bytes body;
    putTag(body, "WAVE");
    for (const auto& c : chunks) {
        const Bytes cb = chunkBytes(c);
        body.insert(body.end(), cb.begin(), cb.end());
    }
    Bytes out;
    putTag(out, "RIFF");
    putU32(out, static_cast<std::uint32_t>(body.size()));
    out.insert(out.end(), body.begin(), body.end());
    return out;
}

Bytes sampleBytes(WavEncoding e, std::span<const double> values) {
    Bytes b;
    for (const double v : values) {
        switch (e) {
        case WavEncoding::Pcm8: putByte(b, static_cast<unsigned>(std::lround(v))); break;
        case WavEncoding::Pcm16: putU16(b, static_cast<std::uint16_t>(static_cast<std::int16_t>(std::lround(v)))); break;
        case WavEncoding::Pcm24: {
            const auto u = static_cast<std::uint32_t>(static_cast<std::int32_t>(std::lround(v)));
            putByte(b, u);
            putByte(b, u >> 8);
            putByte(b, u >> 16);
            break;
        }
        case WavEncoding::Pcm32: putU32(b, static_cast<std::uint32_t>(static_cast<std::int32_t>(std::llround(v)))); break;
        case WavEncoding::Float32: {
            const float f = static_cast<float>(v);
            std::uint32_t u;
            std::memcpy(&u, &f, 4);
            putU32(b, u);
            break;
        }
        case WavEncoding::Float64: {
            std::uint64_t u;
            std::memcpy(&u, &v, 8);
            putU32(b, static_cast<std::uint32_t>(u));
            putU32(b, static_cast<std::uint32_t>(u >> 32));
            break;
        }
        }
    }
    return b;
}

WavFormat formatOf(const WavSpec& spec) {
    WavFormat f;
    const std::uint16_t code = isFloat(spec.encoding) ? kWavFloat : kWavPcm;
    f.formatCode = spec.extensible ? kWavExtensible : code;
    f.subFormat = code;
    f.channels = spec.channels;
    f.sampleRate = spec.sampleRate;
    f.bits = static_cast<std::uint16_t>(bitsOf(spec.encoding));
    return f;
}

Bytes makeWav(const WavSpec& spec, std::span<const double> interleaved) {
    if (spec.channels == 0 || interleaved.size() % spec.channels != 0)
        throw std::invalid_argument("makeWav: sample count is not a whole number of frames");
    std::vector<WavChunk> chunks{{"fmt ", fmtBody(formatOf(spec)), {}}};
    chunks.insert(chunks.end(), spec.chunksBeforeData.begin(), spec.chunksBeforeData.end());
    chunks.push_back({"data", sampleBytes(spec.encoding, interleaved), {}});
    chunks.insert(chunks.end(), spec.chunksAfterData.begin(), spec.chunksAfterData.end());
    return riffFile(chunks);
}

Bytes makeFloatWav(std::span<const double> interleaved, std::uint32_t sampleRate, std::uint16_t channels) {
    WavSpec spec;
    spec.encoding = WavEncoding::Float32;
    spec.sampleRate = sampleRate;
    spec.channels = channels;
    return makeWav(spec, interleaved);
}

// Written beside the target and renamed into place, so that tests running in parallel
// processes (ctest -j) never read a half-written fixture.
void writeBytes(const std::filesystem::path& path, std::span<const std::byte> bytes) {
    std::filesystem::create_directories(path.parent_path());
    auto temp = path;
    temp += ".tmp" + std::to_string(::getpid());
    {
        std::ofstream out(temp, std::ios::binary | std::ios::trunc);
        out.write(reinterpret_cast<const char*>(bytes.data()), static_cast<std::streamsize>(bytes.size()));
        if (!out) throw std::runtime_error("cannot write " + temp.string());
    }
    std::filesystem::rename(temp, path);
}

void writeText(const std::filesystem::path& path, const std::string& text) {
    writeBytes(path, std::as_bytes(std::span(text.data(), text.size())));
}

} // namespace humwise::test
