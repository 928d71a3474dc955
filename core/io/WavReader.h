#pragma once
// RIFF/WAVE reader.
//
// Reads: PCM integer 8 (unsigned), 16, 24 and 32 bit; IEEE float 32 and 64 bit; the same inside
// WAVE_FORMAT_EXTENSIBLE (sub-format GUID PCM or IEEE float); any channel count from 1 to 1024;
// interleaved frames; chunks in any order after "fmt " (unknown chunks skipped, odd sizes padded).
//
// Scaling: integer samples are read as fractions of full scale, v / 2^(bits-1) (8 bit:
// (v - 128) / 128), float samples as they are; then multiplied by the channel's `scale` and
// converted from the channel's unit to SI (Units.h). The integer full scale is kept per channel
// so clipping can be recognised.
//
// Never trusts a size field: every chunk is checked against the bytes actually present, so a
// truncated, garbled or hostile file gives a ReadError naming the byte offset, never a crash,
// a hang or a huge allocation.

#include "core/io/ChannelSetting.h"
#include "core/io/ReadError.h"
#include "core/model/Recording.h"
#include "core/model/Result.h"

#include <cstddef>
#include <filesystem>
#include <istream>
#include <span>
#include <string>

namespace humwise::io {

inline constexpr unsigned kMaxWavChannels = 1024;
inline constexpr double kMaxSampleRateHz = 10e6;

[[nodiscard]] Result<Recording, ReadError> parseWav(std::span<const std::byte> bytes, const std::string& source,
                                                    const ChannelSettings& settings = {});
[[nodiscard]] Result<Recording, ReadError> readWav(std::istream& in, const std::string& source,
                                                   const ChannelSettings& settings = {});
[[nodiscard]] Result<Recording, ReadError> readWavFile(const std::filesystem::path& path,
                                                       const ChannelSettings& settings = {});

} // namespace humwise::io
