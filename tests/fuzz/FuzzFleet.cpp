// libFuzzer target: io::parseFleet on arbitrary text (core/io/FleetFile.h). A fleet that parses
// must survive the canonical round trip the header promises: write, read, write gives the same
// bytes.
#include "FuzzCommon.h"

#include "core/io/FleetFile.h"

#include <cstddef>
#include <cstdint>
#include <string>
#include <string_view>

extern "C" int LLVMFuzzerTestOneInput(const std::uint8_t* data, std::size_t size) {
    using namespace humwise;
    const std::string_view text(reinterpret_cast<const char*>(data), size);
    const auto r = io::parseFleet(text, "fleet.json");
    if (!r) {
        fuzz::checkError(r.error());
        return 0;
    }
    const std::string once = io::writeFleet(r.value());
    const auto again = io::parseFleet(once, "fleet.json (written)");
    if (!again) {
        std::fprintf(stderr, "%s\n", again.error().message().c_str());
        fuzz::broken("a fleet that parsed is written as a file that does not parse");
    }
    fuzz::require(io::writeFleet(again.value()) == once, "writing a fleet is not canonical (write, read, write differs)");
    return 0;
}
