#include "core/io/WavReader.h"

#include "core/io/FileBytes.h"

#include <array>
#include <compare>
#include <cmath>
#include <cstddef>
#include <cstdint>
#include <cstring>
#include <iterator>
#include <optional>
#include <vector>

namespace humwise::io {
namespace {

using Code = ReadError::Code;

constexpr std::uint16_t kFormatPcm = 1;
constexpr std::uint16_t kFormatFloat = 3;
constexpr std::uint16_t kFormatExtensible = 0xFFFE;
// The 14 bytes after the 2-byte format code in the KSDATAFORMAT_SUBTYPE_* GUIDs.
constexpr std::array<std::uint8_t, 14> kGuidTail{0x00, 0x00, 0x00, 0x00, 0x10, 0x00, 0x80,
                                                 0x00, 0x00, 0xAA, 0x00, 0x38, 0x9B, 0x71};

struct Cursor {
    std::span<const std::byte> bytes;
    std::uint16_t u16(std::size_t at) const {
        return static_cast<std::uint16_t>(std::to_integer<unsigned>(bytes[at]) | std::to_integer<unsigned>(bytes[at + 1]) << 8);
    }
    std::uint32_t u32(std::size_t at) const { return std::uint32_t{u16(at)} | std::uint32_t{u16(at + 2)} << 16; }
    bool tag(std::size_t at, const char* t) const { return std::memcmp(bytes.data() + at, t, 4) == 0; }
    std::string tagText(std::size_t at) const {
        std::string s;
        for (std::size_t i = 0; i < 4; ++i) {
            const auto c = std::to_integer<unsigned char>(bytes[at + i]);
            s += (c >= 32 && c < 127) ? static_cast<char>(c) : '?';
        }
        return s;
    }
};

struct Format {
    std::uint16_t code = 0; // PCM or float after resolving EXTENSIBLE
    unsigned channels = 0;
    std::uint32_t sampleRate = 0;
    unsigned blockAlign = 0;
    unsigned bits = 0;
};

ReadError error(Code code, const std::string& source, std::uint64_t offset, std::string detail) {
    return ReadError{code, source, offset, std::nullopt, std::move(detail)};
}

Result<Format, ReadError> parseFormat(const Cursor& c, std::size_t at, std::uint32_t size, const std::string& source) {
    if (size < 16) return fail(error(Code::BadChunk, source, at, "the fmt chunk has " + std::to_string(size) + " bytes, at least 16 are needed"));
    Format f;
    f.code = c.u16(at);
    f.channels = c.u16(at + 2);
    f.sampleRate = c.u32(at + 4);
    f.blockAlign = c.u16(at + 12);
    f.bits = c.u16(at + 14);
    if (f.code == kFormatExtensible) {
        if (size < 40) return fail(error(Code::BadChunk, source, at, "WAVE_FORMAT_EXTENSIBLE needs a 40-byte fmt chunk, this one has " + std::to_string(size)));
        const std::uint16_t validBits = c.u16(at + 18);
        const std::uint16_t sub = c.u16(at + 24);
        for (std::size_t i = 0; i < kGuidTail.size(); ++i)
            if (std::to_integer<std::uint8_t>(c.bytes[at + 26 + i]) != kGuidTail[i])
                return fail(error(Code::UnsupportedFormat, source, at + 24, "WAVE_FORMAT_EXTENSIBLE with an unknown sub-format GUID"));
        if (validBits != 0 && validBits != f.bits)
            return fail(error(Code::UnsupportedFormat, source, at + 18, std::to_string(validBits) + " valid bits in " + std::to_string(f.bits) + "-bit containers are not supported"));
        f.code = sub;
    }
    if (f.code != kFormatPcm && f.code != kFormatFloat)
        return fail(error(Code::UnsupportedFormat, source, at, "format code " + std::to_string(f.code) + " (only PCM and IEEE float are read)"));
    if (f.channels == 0 || f.channels > kMaxWavChannels)
        return fail(error(Code::BadField, source, at + 2, std::to_string(f.channels) + " channels (1 to " + std::to_string(kMaxWavChannels) + " are accepted)"));
    if (f.sampleRate == 0 || f.sampleRate > kMaxSampleRateHz)
        return fail(error(Code::BadField, source, at + 4, "sample rate " + std::to_string(f.sampleRate) + " Hz is not plausible"));
    const bool pcmBits = f.code == kFormatPcm && (f.bits == 8 || f.bits == 16 || f.bits == 24 || f.bits == 32);
    const bool floatBits = f.code == kFormatFloat && (f.bits == 32 || f.bits == 64);
    if (!pcmBits && !floatBits)
        return fail(error(Code::UnsupportedFormat, source, at + 14, std::to_string(f.bits) + "-bit " + (f.code == kFormatPcm ? "PCM" : "float") + " samples are not supported"));
    if (f.blockAlign != f.channels * f.bits / 8)
        return fail(error(Code::BadField, source, at + 12, "block align " + std::to_string(f.blockAlign) + " does not match " + std::to_string(f.channels) + " channels of " + std::to_string(f.bits) + " bits"));
    return f;
}

std::uint32_t byteAt(const std::byte* p, int i) { return std::to_integer<std::uint32_t>(p[i]); }

double decodePcm8(const std::byte* p) { return (static_cast<double>(byteAt(p, 0)) - 128.0) / 128.0; }
double decodePcm16(const std::byte* p) {
    return static_cast<double>(static_cast<std::int16_t>(byteAt(p, 0) | byteAt(p, 1) << 8)) / 32768.0;
}
double decodePcm24(const std::byte* p) {
    const auto v = static_cast<std::int32_t>(byteAt(p, 0) << 8 | byteAt(p, 1) << 16 | byteAt(p, 2) << 24) >> 8;
    return static_cast<double>(v) / 8388608.0;
}
double decodePcm32(const std::byte* p) {
    return static_cast<double>(static_cast<std::int32_t>(byteAt(p, 0) | byteAt(p, 1) << 8 | byteAt(p, 2) << 16 | byteAt(p, 3) << 24)) / 2147483648.0;
}
double decodeFloat32(const std::byte* p) {
    const std::uint32_t u = byteAt(p, 0) | byteAt(p, 1) << 8 | byteAt(p, 2) << 16 | byteAt(p, 3) << 24;
    float v;
    std::memcpy(&v, &u, 4);
    return v;
}
double decodeFloat64(const std::byte* p) {
    std::uint64_t u = 0;
    for (int i = 7; i >= 0; --i) u = (u << 8) | byteAt(p, i);
    double v;
    std::memcpy(&v, &u, 8);
    return v;
}

// Walks one channel's samples, every `stride` bytes, decoding and scaling each as it is read:
// a vector built from a range of these is filled in one pass, without being zeroed first as
// resize() would (zeroing and decoding were a twentieth of an import's CPU time, 2026-12-03).
template <double (*Decode)(const std::byte*)>
struct DecodingIterator {
    // Random access for vector::assign's one allocation; `reference` is the decoded value itself
    // (the samples exist only as bytes), as with other iterators that compute what they yield.
    using iterator_category = std::random_access_iterator_tag;
    using value_type = double;
    using difference_type = std::ptrdiff_t;
    using pointer = const double*;
    using reference = double;

    // Sample `index` is at base + index * stride: no pointer beyond the data is ever formed (the
    // end of the last channel would lie past the file's last byte).
    const std::byte* base = nullptr;
    difference_type index = 0;
    difference_type stride = 1;
    double factor = 1;

    double operator*() const { return Decode(base + index * stride) * factor; }
    double operator[](difference_type n) const { return *(*this + n); }
    DecodingIterator& operator++() {
        ++index;
        return *this;
    }
    DecodingIterator operator++(int) {
        auto before = *this;
        ++index;
        return before;
    }
    DecodingIterator& operator--() {
        --index;
        return *this;
    }
    DecodingIterator operator--(int) {
        auto before = *this;
        --index;
        return before;
    }
    DecodingIterator& operator+=(difference_type n) {
        index += n;
        return *this;
    }
    DecodingIterator& operator-=(difference_type n) {
        index -= n;
        return *this;
    }
    friend DecodingIterator operator+(DecodingIterator i, difference_type n) { return i += n; }
    friend DecodingIterator operator+(difference_type n, DecodingIterator i) { return i += n; }
    friend DecodingIterator operator-(DecodingIterator i, difference_type n) { return i -= n; }
    difference_type operator-(const DecodingIterator& o) const { return index - o.index; }
    bool operator==(const DecodingIterator& o) const { return index == o.index; }
    auto operator<=>(const DecodingIterator& o) const { return index <=> o.index; }
};

template <double (*Decode)(const std::byte*)>
void assignSamples(const std::byte* p, std::size_t frames, std::size_t stride, double factor, std::vector<double>& out) {
    const auto step = static_cast<std::ptrdiff_t>(stride);
    const DecodingIterator<Decode> first{p, 0, step, factor}, last{p, static_cast<std::ptrdiff_t>(frames), step, factor};
    out.assign(first, last);
}

void decodeChannel(const std::byte* p, std::size_t frames, const Format& f, double factor, std::vector<double>& out) {
    const std::size_t stride = f.blockAlign;
    if (f.code == kFormatFloat) {
        if (f.bits == 32) assignSamples<decodeFloat32>(p, frames, stride, factor, out);
        else assignSamples<decodeFloat64>(p, frames, stride, factor, out);
        return;
    }
    switch (f.bits) {
    case 8: assignSamples<decodePcm8>(p, frames, stride, factor, out); return;
    case 16: assignSamples<decodePcm16>(p, frames, stride, factor, out); return;
    case 24: assignSamples<decodePcm24>(p, frames, stride, factor, out); return;
    default: assignSamples<decodePcm32>(p, frames, stride, factor, out); return;
    }
}

} // namespace

Result<Recording, ReadError> parseWav(std::span<const std::byte> bytes, const std::string& source,
                                      const ChannelSettings& settings) {
    const Cursor c{bytes};
    const std::size_t size = bytes.size();
    if (size == 0) return fail(ReadError{Code::Empty, source, {}, {}, "the file is empty"});
    if (size < 12) return fail(error(Code::TruncatedHeader, source, 0, "only " + std::to_string(size) + " bytes, a WAV header needs 12"));
    if (c.tag(0, "RF64") || c.tag(0, "RIFX"))
        return fail(error(Code::UnsupportedFormat, source, 0, c.tagText(0) + " files are not supported (only little-endian RIFF)"));
    if (!c.tag(0, "RIFF") || !c.tag(8, "WAVE"))
        return fail(error(Code::NotRecognised, source, 0, "not a WAV file (no RIFF/WAVE signature)"));

    std::optional<Format> format;
    std::size_t at = 12;
    while (at < size) {
        if (size - at < 8) return fail(error(Code::TruncatedHeader, source, at, "the file ends inside a chunk header"));
        const std::string id = c.tagText(at);
        const std::uint32_t chunkSize = c.u32(at + 4);
        const std::size_t body = at + 8;
        const std::size_t available = size - body;
        if (id == "fmt ") {
            if (chunkSize > available) return fail(error(Code::TruncatedHeader, source, at, "the fmt chunk claims " + std::to_string(chunkSize) + " bytes, only " + std::to_string(available) + " remain"));
            auto parsed = parseFormat(c, body, chunkSize, source);
            if (!parsed) return fail(parsed.error());
            format = parsed.value();
        } else if (id == "data") {
            if (!format) return fail(error(Code::BadChunk, source, at, "the data chunk comes before the fmt chunk"));
            if (chunkSize == 0) return fail(error(Code::NoData, source, at, "the data chunk holds no samples"));
            if (chunkSize > available)
                return fail(error(Code::TruncatedData, source, at, "the data chunk claims " + std::to_string(chunkSize) + " bytes, only " + std::to_string(available) + " remain (truncated file?)"));
            if (chunkSize % format->blockAlign != 0)
                return fail(error(Code::TruncatedData, source, at, "the data chunk holds " + std::to_string(chunkSize) + " bytes, not a whole number of " + std::to_string(format->blockAlign) + "-byte frames"));
            const std::size_t frames = chunkSize / format->blockAlign;
            Recording rec;
            rec.sampleRateHz = format->sampleRate;
            rec.source = source;
            rec.channels.resize(format->channels);
            const unsigned bytesPerSample = format->bits / 8;
            for (unsigned ch = 0; ch < format->channels; ++ch) {
                const ChannelSetting& cs = settings.forChannel(ch);
                Channel& out = rec.channels[ch];
                out.name = cs.name.empty() ? "ch" + std::to_string(ch + 1) : cs.name;
                out.quantity = quantityOf(cs.unit);
                const double factor = cs.scale * toSiFactor(cs.unit);
                if (format->code == kFormatPcm) out.fullScale = std::abs(factor);
                decodeChannel(bytes.data() + body + ch * bytesPerSample, frames, *format, factor, out.samples);
            }
            return rec;
        }
        if (chunkSize > available) return fail(error(Code::BadChunk, source, at, "chunk '" + id + "' claims " + std::to_string(chunkSize) + " bytes, only " + std::to_string(available) + " remain"));
        at = body + chunkSize + (chunkSize & 1u);
    }
    if (!format) return fail(error(Code::TruncatedHeader, source, 12, "no fmt chunk"));
    return fail(error(Code::NoData, source, at, "no data chunk"));
}

Result<Recording, ReadError> readWav(std::istream& in, const std::string& source, const ChannelSettings& settings) {
    auto bytes = readAllBytes(in, source);
    if (!bytes) return fail(bytes.error());
    return parseWav(bytes.value(), source, settings);
}

Result<Recording, ReadError> readWavFile(const std::filesystem::path& path, const ChannelSettings& settings) {
    auto bytes = readFileBytes(path);
    if (!bytes) return fail(bytes.error());
    return parseWav(bytes.value(), path.string(), settings);
}

} // namespace humwise::io
