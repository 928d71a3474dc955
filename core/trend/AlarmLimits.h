#pragma once
// Alarm limits for an indicator and the projection of its trend toward them.
//
// Limit methods (REFERENCE.md 10):
//   absolute     given by the analyst
//   iso-zone     ISO 10816/20816 guidance (from memory (verify)): alert at the baseline plus 25 % of
//                the zone B/C boundary, but not above 1.25 x B/C; alarm (trip) at 1.25 x C/D
//   statistical  alert at mean + 2 sigma, alarm at mean + 3 sigma of the baseline rounds (sample
//                standard deviation, n - 1) - common practice (no source)
//   percent      alert at +25 % over the baseline, alarm at x2 (+6 dB) - common practice (no source)
// Projection (REFERENCE.md 10, common practice; the model is stated because it changes the answer):
//   linear       least-squares line through (day, value)
//   exponential  least-squares line through (day, ln value), i.e. value = A0 exp(rate x day)

#include "core/diagnosis/Thresholds.h"

#include <optional>
#include <span>
#include <string>

namespace humwise::trend {

struct Limits {
    std::optional<double> alert;
    std::optional<double> alarm;
    std::string method;
    std::string source;
};

Limits isoZoneLimits(double baseline, const diagnosis::ZoneBoundaries& zones);
// Needs at least 2 values. The standard deviation is taken as at least minSpreadFraction x |mean|:
// a baseline that happens to repeat almost exactly would otherwise put both limits on top of the
// mean, and ordinary route-to-route scatter would raise alarms (the floor is common practice).
Limits statisticalLimits(std::span<const double> baseline, double minSpreadFraction = 0.0);
Limits percentLimits(double baseline, double alertPercent = 25.0, double alarmFactor = 2.0);

enum class Model { Linear, Exponential };
const char* modelName(Model m);

struct Projection {
    Model model = Model::Linear;
    double intercept = 0; // linear: value at day 0; exponential: A0
    double slope = 0;     // linear: per day; exponential: rate per day
    double r2 = 0;        // of the fit (in ln for the exponential model)
    std::optional<double> crossingDay; // day at which the fit reaches the limit (after the last point)
};

// Fits `values` at `days` (days since any fixed origin, increasing) and projects to `limit`.
// nullopt when fewer than 3 points, or the exponential model meets a value <= 0.
std::optional<Projection> project(std::span<const double> days, std::span<const double> values, double limit, Model model);

} // namespace humwise::trend
