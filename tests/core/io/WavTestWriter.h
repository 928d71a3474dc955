#pragma once
// Test-only RIFF/WAVE writer: well-formed files of every variant the reader accepts, and the
// building blocks (chunks, fmt bodies) to assemble broken ones byte by byte.

#include <cstddef>
#include <cstdint>
#include <filesystem>
#include <optional>
#include <span>
#include <string>
#include <vector>

namespace humwise::test {

using Bytes = std::vector<std::byte>;

enum class WavEncoding { Pcm8, Pcm16, Pcm24, Pcm32, Float32, Float64 };

unsigned bitsOf(WavEncoding encoding);
bool isFloat(WavEncoding encoding);

inline constexpr std::uint16_t kWavPcm = 1;
inline constexpr std::uint16_t kWavFloat = 3;
inline constexpr std::uint16_t kWavExtensible = 0xFFFE;

// The fields of a fmt chunk; blockAlign and byteRate are derived unless overridden.
struct WavFormat {
    std::uint16_t formatCode = kWavPcm;
    std::uint16_t channels = 1;
    std::uint32_t sampleRate = 48000;
    std::uint16_t bits = 16;
    std::optional<std::uint16_t> blockAlign;
    // WAVE_FORMAT_EXTENSIBLE (formatCode must be kWavExtensible): the sub-format code placed
    // in the KSDATAFORMAT_SUBTYPE GUID, and the GUID tail (the standard one unless overridden).
    std::uint16_t subFormat = kWavPcm;
    std::optional<std::uint16_t> validBits;
    bool standardGuidTail = true;
};

struct WavChunk {
    std::string id; // four characters
    Bytes body;
    std::optional<std::uint32_t> sizeOverride; // a size field that lies about the body
};

void putU16(Bytes& out, std::uint16_t v);
void putU32(Bytes& out, std::uint32_t v);
void putTag(Bytes& out, const char* tag);

Bytes fmtBody(const WavFormat& format); // 16 bytes, 40 for EXTENSIBLE
// id + size + body, plus the pad byte after an odd-sized body.
Bytes chunkBytes(const WavChunk& chunk);
// "RIFF" size "WAVE" followed by the chunks as given (no checking: any order, any lie).
Bytes riffFile(const std::vector<WavChunk>& chunks);

// Sample bytes, interleaved as given. PCM values are the stored integer codes (8 bit: 0..255,
// unsigned; others two's complement); float values are written as they are.
Bytes sampleBytes(WavEncoding encoding, std::span<const double> interleaved);

struct WavSpec {
    WavEncoding encoding = WavEncoding::Pcm16;
    std::uint16_t channels = 1;
    std::uint32_t sampleRate = 48000;
    bool extensible = false;
    std::vector<WavChunk> chunksBeforeData; // after fmt
    std::vector<WavChunk> chunksAfterData;
};

WavFormat formatOf(const WavSpec& spec);
// A complete, valid file: fmt, the extra chunks, data.
Bytes makeWav(const WavSpec& spec, std::span<const double> interleaved);
// The plain case most tests want: 32-bit float samples, written as they are, no extra chunks.
Bytes makeFloatWav(std::span<const double> interleaved, std::uint32_t sampleRate, std::uint16_t channels = 1);

void writeBytes(const std::filesystem::path& path, std::span<const std::byte> bytes);
void writeText(const std::filesystem::path& path, const std::string& text);

} // namespace humwise::test
