#include "app/cli/RecordingOptions.h"

#include "app/cli/CliError.h"
#include "core/io/RecordingReader.h"

#include <string>

namespace humwise::cli {

std::vector<OptionSpec> recordingOptionSpecs() {
    return {{"quantity"}, {"input-unit"}, {"input-scale"}, {"rate"}, {"channel"}};
}

Recording loadRecording(const ParsedArgs& args) {
    if (args.positional().size() != 1)
        throw UsageError(args.positional().empty() ? "a recording file is needed" : "exactly one recording file is expected");
    Quantity quantity = Quantity::Acceleration;
    if (const auto q = args.value("quantity")) {
        const auto parsed = parseQuantity(*q);
        if (!parsed || *parsed == Quantity::Dimensionless)
            throw UsageError("--quantity must be acceleration, velocity, displacement, current or voltage, got '" + *q + "'");
        quantity = *parsed;
    }
    Unit unit = quantity == Quantity::Acceleration ? Unit::G : siUnitOf(quantity);
    if (quantity == Quantity::Velocity) unit = Unit::MillimetrePerSecond;
    if (quantity == Quantity::Displacement) unit = Unit::Micrometre;
    if (const auto u = args.value("input-unit")) {
        const auto parsed = parseUnit(*u);
        if (!parsed) throw UsageError("--input-unit: unknown unit '" + *u + "'");
        if (args.has("quantity") && quantityOf(*parsed) != quantity)
            throw UsageError("--input-unit " + *u + " is not a unit of " + std::string(quantityName(quantity)));
        unit = *parsed;
    }
    io::RecordingReadOptions options;
    options.channels.defaults.unit = unit;
    options.channels.defaults.scale = args.number("input-scale", 1.0);
    if (!(options.channels.defaults.scale != 0.0)) throw UsageError("--input-scale must not be 0");
    options.sampleRateHz = args.number("rate");
    if (options.sampleRateHz && !(*options.sampleRateHz > 0)) throw UsageError("--rate must be > 0 Hz");
    auto rec = io::readRecordingFile(args.positional().front(), options);
    if (!rec) throw ProcessingError(rec.error().message());
    return std::move(rec).value();
}

std::size_t selectedChannel(const ParsedArgs& args, const Recording& recording) {
    const long long n = args.integer("channel").value_or(1);
    if (n < 1 || static_cast<std::size_t>(n) > recording.channels.size())
        throw UsageError("--channel " + std::to_string(n) + " is out of range: the file has " +
                         std::to_string(recording.channels.size()) + " channel(s), numbered from 1");
    return static_cast<std::size_t>(n - 1);
}

Unit displayUnit(const ParsedArgs& args, Quantity quantity, const char* option) {
    const auto u = args.value(option);
    if (!u) return defaultDisplayUnit(quantity);
    const auto parsed = parseUnit(*u);
    if (!parsed) throw UsageError(std::string("--") + option + ": unknown unit '" + *u + "'");
    if (quantityOf(*parsed) != quantity)
        throw UsageError(std::string("--") + option + " " + *u + " is not a unit of " + std::string(quantityName(quantity)));
    return *parsed;
}

} // namespace humwise::cli
