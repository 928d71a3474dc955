#pragma once
// Options shared by the commands that read one recording file: what the samples are
// (--quantity, --input-unit, --input-scale), the rate of a CSV without a time column (--rate)
// and which channel to use (--channel, 1-based).

#include "app/cli/ArgParser.h"
#include "core/model/Recording.h"

#include <vector>

namespace humwise::cli {

std::vector<OptionSpec> recordingOptionSpecs();

// Reads the file named by the single positional argument; throws UsageError or ProcessingError.
Recording loadRecording(const ParsedArgs& args);

// The channel picked by --channel N (1-based, default 1); throws UsageError when out of range.
std::size_t selectedChannel(const ParsedArgs& args, const Recording& recording);

// The display unit asked by --unit (or the quantity's default), checked against the quantity.
Unit displayUnit(const ParsedArgs& args, Quantity quantity, const char* option = "unit");

} // namespace humwise::cli
