#include "core/diagnosis/Indicators.h"

#include "core/diagnosis/Inputs.h"

namespace humwise::diagnosis {

void IndicatorList::set(const std::string& name, double value, const std::string& unit) {
    for (auto& i : m_items)
        if (i.name == name) {
            i.value = value;
            i.unit = unit;
            return;
        }
    m_items.push_back({name, value, unit});
}

std::optional<double> IndicatorList::get(const std::string& name) const {
    for (const auto& i : m_items)
        if (i.name == name) return i.value;
    return std::nullopt;
}

const char* locationName(Location l) { return l == Location::DriveEnd ? "DE" : "NDE"; }

const char* directionName(Direction d) {
    switch (d) {
    case Direction::Horizontal: return "H";
    case Direction::Vertical: return "V";
    case Direction::Axial: return "A";
    }
    return "?";
}

} // namespace humwise::diagnosis
