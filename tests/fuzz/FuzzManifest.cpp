// libFuzzer target: io::parseManifest on arbitrary text (core/io/Manifest.h). A manifest that
// parses lists at least one entry, each with a file, a motor, a point and a channel from 1.
#include "FuzzCommon.h"

#include "core/io/Manifest.h"

#include <cstddef>
#include <cstdint>
#include <string_view>

extern "C" int LLVMFuzzerTestOneInput(const std::uint8_t* data, std::size_t size) {
    using namespace humwise;
    const std::string_view text(reinterpret_cast<const char*>(data), size);
    const auto r = io::parseManifest(text, "manifest.csv");
    if (!r) {
        fuzz::checkError(r.error());
        return 0;
    }
    fuzz::require(!r.value().entries.empty(), "a manifest without entries");
    for (const auto& e : r.value().entries) {
        fuzz::require(!e.file.empty() && !e.motorTag.empty() && !e.pointName.empty(), "an entry with an empty file, motor or point");
        fuzz::require(e.channel >= 1 && e.channel <= 1024, "an entry with a channel out of 1..1024");
        fuzz::require(!e.sensitivity || *e.sensitivity > 0, "an entry with a sensitivity <= 0");
    }
    return 0;
}
