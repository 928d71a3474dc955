#pragma once
// What the numbers in a file mean, for formats that do not say it themselves (WAV) or as
// defaults for columns that carry no unit (CSV).

#include "core/model/Units.h"

#include <string>
#include <vector>

namespace humwise::io {

struct ChannelSetting {
    std::string name;                  // empty: "ch1", "ch2", ...
    Unit unit = Unit::G;               // unit of (file value x scale); the quantity follows from it
    double scale = 1.0;                // multiplier: e.g. 1 / sensitivity (V per unit) for voltage data
};

struct ChannelSettings {
    std::vector<ChannelSetting> perChannel; // index i applies to channel i
    ChannelSetting defaults;                // for channels beyond perChannel

    const ChannelSetting& forChannel(std::size_t i) const {
        return i < perChannel.size() ? perChannel[i] : defaults;
    }
};

} // namespace humwise::io
