#pragma once
// A recording: one or more channels sampled together at one rate.
// Samples are stored in the SI base unit of the channel's quantity (see Units.h).

#include "core/model/Units.h"

#include <chrono>
#include <cstddef>
#include <optional>
#include <string>
#include <vector>

namespace humwise {

struct Channel {
    std::string name;
    Quantity quantity = Quantity::Acceleration;
    std::vector<double> samples; // SI base unit of `quantity`
    std::optional<double> fullScale; // |sample| at which the source saturates (SI), when known
};

struct Recording {
    double sampleRateHz = 0.0;
    std::optional<std::chrono::sys_time<std::chrono::milliseconds>> startTime;
    std::string source; // file name or other origin, for messages
    std::vector<Channel> channels;

    std::size_t frameCount() const { return channels.empty() ? 0 : channels.front().samples.size(); }
    double durationSeconds() const { return sampleRateHz > 0 ? static_cast<double>(frameCount()) / sampleRateHz : 0.0; }
};

} // namespace humwise
