#pragma once
// Named numbers computed from one motor's recordings (per point and round), kept for trends.

#include <optional>
#include <string>
#include <vector>

namespace humwise::diagnosis {

struct Indicator {
    std::string name;  // stable: "velocity_rms.DE-H", "1x.DE-H", "sideband_db", "slip", ...
    double value = 0;
    std::string unit;  // "mm/s", "g", "dB", "%", "1", "Hz", "r/min"
};

class IndicatorList {
public:
    void set(const std::string& name, double value, const std::string& unit);
    std::optional<double> get(const std::string& name) const;
    const std::vector<Indicator>& all() const { return m_items; }

private:
    std::vector<Indicator> m_items;
};

} // namespace humwise::diagnosis
