// libFuzzer target: io::parseWav on arbitrary bytes (core/io/WavReader.h promises a ReadError,
// never a crash, a hang or a huge allocation).
#include "FuzzCommon.h"

#include "core/io/WavReader.h"

#include <cstddef>
#include <cstdint>
#include <span>

extern "C" int LLVMFuzzerTestOneInput(const std::uint8_t* data, std::size_t size) {
    using namespace humwise;
    const std::span<const std::byte> bytes(reinterpret_cast<const std::byte*>(data), size);
    io::ChannelSettings settings; // channel 1 in g, the rest in A: both scaling paths
    settings.perChannel.push_back({"", Unit::G, 0.5});
    settings.defaults.unit = Unit::Ampere;
    const auto r = io::parseWav(bytes, "fuzz.wav", settings);
    if (r) fuzz::checkRecording(r.value());
    else fuzz::checkError(r.error());
    return 0;
}
