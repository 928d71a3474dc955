#pragma once
// A minimal RIFF/WAVE writer: one channel of 32-bit IEEE float samples (WAVE_FORMAT_IEEE_FLOAT,
// "fmt " of 18 bytes and a "fact" chunk as the format asks for non-PCM data), little-endian
// whatever the host. The WAV carries no unit: the manifest and the fleet say what the numbers are.

#include <filesystem>
#include <span>

namespace humwise::sample {

// Writes samples x scale as float32. Throws std::runtime_error naming the file when it cannot.
void writeFloatWav(const std::filesystem::path& path, double sampleRateHz, std::span<const double> samples, double scale = 1.0);

} // namespace humwise::sample
