// libFuzzer target: io::parseUff (datasets 58 and 58b) and io::looksLikeUff58 on arbitrary
// bytes (core/io/UffReader.h: "garbage gives an error, never a crash, a hang or a huge
// allocation").
#include "FuzzCommon.h"

#include "core/io/UffReader.h"

#include <cstddef>
#include <cstdint>
#include <span>

extern "C" int LLVMFuzzerTestOneInput(const std::uint8_t* data, std::size_t size) {
    using namespace humwise;
    const std::span<const std::byte> bytes(reinterpret_cast<const std::byte*>(data), size);
    (void)io::looksLikeUff58(bytes);
    io::UffReadOptions options;
    options.channels.defaults.unit = Unit::Volt;
    const auto r = io::parseUff(bytes, "fuzz.uff", options);
    if (r) {
        fuzz::checkRecording(r.value().recording);
        fuzz::require(r.value().channels.size() == r.value().recording.channels.size(), "UffChannelInfo and channels differ in number");
        for (const auto& info : r.value().channels) (void)io::uffDirectionLabel(info.directionCode);
    } else {
        fuzz::checkError(r.error());
    }
    return 0;
}
