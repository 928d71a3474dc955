// libFuzzer target: the command-line option parser (app/cli/ArgParser.h) with the option list
// of `humwise-cli spectrum` (app/cli/SpectrumCommand.cpp, runSpectrum). The input is split into
// arguments at line breaks. Bad arguments must give a UsageError; anything else escaping is a
// bug (libFuzzer reports an uncaught exception as a crash).
#include "app/cli/ArgParser.h"
#include "app/cli/CliError.h"
#include "app/cli/RecordingOptions.h"

#include <algorithm>
#include <cstddef>
#include <cstdint>
#include <string>
#include <string_view>
#include <vector>

namespace {

using namespace humwise::cli;

// The same list runSpectrum builds (keep in step with app/cli/SpectrumCommand.cpp).
std::vector<OptionSpec> spectrumSpecs() {
    auto specs = recordingOptionSpecs();
    for (const char* name : {"window", "lines", "resolution", "fmax", "averages", "overlap", "scale", "as", "unit", "zoom",
                             "envelope", "peaks", "band", "cutoff"})
        specs.push_back({name});
    for (const char* flag : {"full", "json", "csv", "envelope-squared", "db"}) specs.push_back({flag, false});
    return specs;
}

template <class F>
void usage(F&& f) {
    try {
        f();
    } catch (const UsageError&) {
        // the expected answer to bad input
    }
}

} // namespace

extern "C" int LLVMFuzzerTestOneInput(const std::uint8_t* data, std::size_t size) {
    static const std::vector<OptionSpec> specs = spectrumSpecs();
    const std::string_view text(reinterpret_cast<const char*>(data), size);
    std::vector<std::string> args;
    for (std::size_t pos = 0; pos <= text.size();) {
        const std::size_t end = std::min(text.find('\n', pos), text.size());
        args.emplace_back(text.substr(pos, end - pos));
        pos = end + 1;
    }
    usage([&] {
        const ParsedArgs a(args, specs);
        for (const auto& s : specs) {
            (void)a.has(s.name);
            (void)a.value(s.name);
            (void)a.values(s.name);
            usage([&] { (void)a.number(s.name); });
            usage([&] { (void)a.number(s.name, 1.0); });
            usage([&] { (void)a.integer(s.name); });
        }
        for (const char* range : {"band", "zoom", "envelope"})
            if (const auto v = a.value(range)) usage([&] { (void)parseRange(*v, range); });
        for (const auto& p : a.positional()) (void)p.size();
    });
    return 0;
}
