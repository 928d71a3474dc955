#pragma once
// Physical quantities and units of a channel.
//
// Conventions:
// - Every sample array inside Humwise is in the SI base unit of its quantity:
//   acceleration m/s^2, velocity m/s, displacement m, current A, voltage V.
//   Units other than SI exist only at the edges (readers, display, CLI options).
// - Standard gravity g_n = 9.80665 m/s^2 exactly (3rd CGPM 1901); 1 in = 25.4 mm exactly,
//   so 1 in/s = 25.4 mm/s and 1 mil = 25.4 um (REFERENCE.md section 7).
// - dB levels use the ISO 1683 reference values: acceleration 1 um/s^2, velocity 1 nm/s,
//   displacement 1 pm (REFERENCE.md section 7; the displacement value is marked there
//   "from memory (verify)"). Current and voltage levels are relative to 1 A and 1 V
//   (common practice, no source).

#include <optional>
#include <string>
#include <string_view>

namespace humwise {

enum class Quantity { Acceleration, Velocity, Displacement, Current, Voltage, Dimensionless };

enum class Unit {
    MetrePerSecond2, G,                                      // acceleration
    MetrePerSecond, MillimetrePerSecond, InchPerSecond,       // velocity
    Metre, Millimetre, Micrometre, Mil,                       // displacement
    Ampere, Milliampere,                                      // current
    Volt, Millivolt,                                          // voltage
    One,                                                      // dimensionless
};

inline constexpr double kStandardGravity = 9.80665; // m/s^2, exact by definition
inline constexpr double kInch = 0.0254;             // m, exact by definition

Quantity quantityOf(Unit unit);
Unit siUnitOf(Quantity quantity);
// Multiply a value in `unit` by this to get the SI base unit of its quantity.
double toSiFactor(Unit unit);
// Convert a value between two units of the same quantity; throws std::invalid_argument otherwise.
double convert(double value, Unit from, Unit to);

std::string_view unitSymbol(Unit unit);          // "mm/s", "g", "um", ...
std::string_view quantityName(Quantity quantity); // "acceleration", ...
std::optional<Unit> parseUnit(std::string_view text);         // accepts "mm/s", "m/s^2", "m/s2", "µm", "um", "in/s", "ips", "mil", ...
std::optional<Quantity> parseQuantity(std::string_view text); // "acceleration", "velocity", ...

// The default unit in which a quantity is shown (g, mm/s, um, A, V).
Unit defaultDisplayUnit(Quantity quantity);

// ISO 1683 reference value in SI units (see the header comment), for dB levels.
double levelReference(Quantity quantity);
// 20 log10(rms / reference); rms in SI units. Returns -inf for 0.
double levelDb(double rmsSi, Quantity quantity);

} // namespace humwise
