// libFuzzer target: io::parseCsv on arbitrary text, once as the file stands and once with a
// declared rate (the two paths a CSV without a time column takes; core/io/CsvReader.h).
#include "FuzzCommon.h"

#include "core/io/CsvReader.h"

#include <cstddef>
#include <cstdint>
#include <string_view>

extern "C" int LLVMFuzzerTestOneInput(const std::uint8_t* data, std::size_t size) {
    using namespace humwise;
    const std::string_view text(reinterpret_cast<const char*>(data), size);
    io::CsvReadOptions plain;
    io::CsvReadOptions declared;
    declared.sampleRateHz = 25600;
    declared.channels.defaults.unit = Unit::MillimetrePerSecond;
    declared.channels.defaults.scale = 2.0;
    for (const auto* options : {&plain, &declared}) {
        const auto r = io::parseCsv(text, "fuzz.csv", *options);
        if (r) fuzz::checkRecording(r.value());
        else fuzz::checkError(r.error());
    }
    return 0;
}
