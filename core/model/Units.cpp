#include "core/model/Units.h"

#include <algorithm>
#include <array>
#include <cctype>
#include <cmath>
#include <limits>
#include <stdexcept>

namespace humwise {
namespace {

struct UnitInfo {
    Unit unit;
    Quantity quantity;
    double toSi;
    std::string_view symbol;
};

constexpr std::array<UnitInfo, 14> kUnits{{
    {Unit::MetrePerSecond2, Quantity::Acceleration, 1.0, "m/s^2"},
    {Unit::G, Quantity::Acceleration, kStandardGravity, "g"},
    {Unit::MetrePerSecond, Quantity::Velocity, 1.0, "m/s"},
    {Unit::MillimetrePerSecond, Quantity::Velocity, 1e-3, "mm/s"},
    {Unit::InchPerSecond, Quantity::Velocity, kInch, "in/s"},
    {Unit::Metre, Quantity::Displacement, 1.0, "m"},
    {Unit::Millimetre, Quantity::Displacement, 1e-3, "mm"},
    {Unit::Micrometre, Quantity::Displacement, 1e-6, "um"},
    {Unit::Mil, Quantity::Displacement, kInch * 1e-3, "mil"},
    {Unit::Ampere, Quantity::Current, 1.0, "A"},
    {Unit::Milliampere, Quantity::Current, 1e-3, "mA"},
    {Unit::Volt, Quantity::Voltage, 1.0, "V"},
    {Unit::Millivolt, Quantity::Voltage, 1e-3, "mV"},
    {Unit::One, Quantity::Dimensionless, 1.0, "1"},
}};

const UnitInfo& info(Unit unit) {
    for (const auto& u : kUnits)
        if (u.unit == unit) return u;
    throw std::invalid_argument("unknown unit");
}

std::string normalise(std::string_view text) {
    std::string s;
    for (std::size_t i = 0; i < text.size(); ++i) {
        const unsigned char c = static_cast<unsigned char>(text[i]);
        // UTF-8 micro sign (C2 B5) and Greek mu (CE BC) both mean "u".
        if ((c == 0xC2 && i + 1 < text.size() && static_cast<unsigned char>(text[i + 1]) == 0xB5) ||
            (c == 0xCE && i + 1 < text.size() && static_cast<unsigned char>(text[i + 1]) == 0xBC)) {
            s.push_back('u');
            ++i;
            continue;
        }
        if (!std::isspace(c)) s.push_back(static_cast<char>(c));
    }
    return s;
}

} // namespace

Quantity quantityOf(Unit unit) { return info(unit).quantity; }

Unit siUnitOf(Quantity quantity) {
    switch (quantity) {
    case Quantity::Acceleration: return Unit::MetrePerSecond2;
    case Quantity::Velocity: return Unit::MetrePerSecond;
    case Quantity::Displacement: return Unit::Metre;
    case Quantity::Current: return Unit::Ampere;
    case Quantity::Voltage: return Unit::Volt;
    case Quantity::Dimensionless: return Unit::One;
    }
    throw std::invalid_argument("unknown quantity");
}

double toSiFactor(Unit unit) { return info(unit).toSi; }

double convert(double value, Unit from, Unit to) {
    if (quantityOf(from) != quantityOf(to))
        throw std::invalid_argument("convert: cannot convert " + std::string(unitSymbol(from)) + " to " +
                                    std::string(unitSymbol(to)) + " (different quantities)");
    return value * toSiFactor(from) / toSiFactor(to);
}

std::string_view unitSymbol(Unit unit) { return info(unit).symbol; }

std::string_view quantityName(Quantity quantity) {
    switch (quantity) {
    case Quantity::Acceleration: return "acceleration";
    case Quantity::Velocity: return "velocity";
    case Quantity::Displacement: return "displacement";
    case Quantity::Current: return "current";
    case Quantity::Voltage: return "voltage";
    case Quantity::Dimensionless: return "dimensionless";
    }
    return "?";
}

std::optional<Unit> parseUnit(std::string_view text) {
    const std::string s = normalise(text);
    struct Alias { std::string_view text; Unit unit; };
    static constexpr std::array<Alias, 24> aliases{{
        {"m/s^2", Unit::MetrePerSecond2}, {"m/s2", Unit::MetrePerSecond2}, {"m/s²", Unit::MetrePerSecond2},
        {"g", Unit::G}, {"m/s", Unit::MetrePerSecond}, {"mm/s", Unit::MillimetrePerSecond},
        {"in/s", Unit::InchPerSecond}, {"ips", Unit::InchPerSecond}, {"m", Unit::Metre},
        {"mm", Unit::Millimetre}, {"um", Unit::Micrometre}, {"micron", Unit::Micrometre},
        {"mil", Unit::Mil}, {"mils", Unit::Mil}, {"A", Unit::Ampere}, {"a", Unit::Ampere},
        {"mA", Unit::Milliampere}, {"V", Unit::Volt}, {"v", Unit::Volt}, {"mV", Unit::Millivolt},
        {"1", Unit::One}, {"", Unit::One}, {"G", Unit::G}, {"M/S^2", Unit::MetrePerSecond2},
    }};
    for (const auto& a : aliases)
        if (a.text == s) return a.unit;
    return std::nullopt;
}

std::optional<Quantity> parseQuantity(std::string_view text) {
    std::string s = normalise(text);
    std::transform(s.begin(), s.end(), s.begin(), [](unsigned char c) { return static_cast<char>(std::tolower(c)); });
    for (Quantity q : {Quantity::Acceleration, Quantity::Velocity, Quantity::Displacement, Quantity::Current,
                       Quantity::Voltage, Quantity::Dimensionless})
        if (quantityName(q) == s) return q;
    return std::nullopt;
}

Unit defaultDisplayUnit(Quantity quantity) {
    switch (quantity) {
    case Quantity::Acceleration: return Unit::G;
    case Quantity::Velocity: return Unit::MillimetrePerSecond;
    case Quantity::Displacement: return Unit::Micrometre;
    case Quantity::Current: return Unit::Ampere;
    case Quantity::Voltage: return Unit::Volt;
    case Quantity::Dimensionless: return Unit::One;
    }
    return Unit::One;
}

double levelReference(Quantity quantity) {
    switch (quantity) {
    case Quantity::Acceleration: return 1e-6;  // 1 um/s^2, ISO 1683
    case Quantity::Velocity: return 1e-9;      // 1 nm/s, ISO 1683
    case Quantity::Displacement: return 1e-12; // 1 pm, ISO 1683 (from memory, see header)
    default: return 1.0;
    }
}

double levelDb(double rmsSi, Quantity quantity) {
    if (rmsSi <= 0.0) return -std::numeric_limits<double>::infinity();
    return 20.0 * std::log10(rmsSi / levelReference(quantity));
}

} // namespace humwise
