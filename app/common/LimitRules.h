#pragma once
// Which indicators carry alarm limits, and the limits they get when the analyst has set none.
// One place for the workbench, the finding sheet and humwise-cli, so the three always agree.
//
// Baseline: the first kBaselineRounds rounds of the indicator's history (common practice: the
// machine's own early readings, taken in its healthy state, are its reference).
// Defaults: velocity_rms gets ISO-zone guidance from the motor's machine class; every other
// limit-worthy indicator gets mean + 2/3 sigma statistics once two rounds exist
// (core/trend/AlarmLimits.h states each method and its source).

#include "core/fleet/Fleet.h"
#include "core/trend/AlarmLimits.h"
#include "core/model/Result.h"
#include "storage/FleetStore.h"

#include <cstddef>
#include <optional>
#include <span>
#include <string>
#include <string_view>
#include <vector>

namespace humwise::workflow {

inline constexpr std::size_t kBaselineRounds = 6;
// Statistical limits take the baseline's spread as at least this fraction of its mean, so that
// the alarm is never closer to the baseline than +6 dB (x2 in amplitude, as the percent method;
// x4 for band powers such as the envelope indicators in g^2) and the alert than 2/3 of that:
// 1/3 for amplitudes, 1 for powers. Month-to-month scatter of route readings (sensor placement,
// load, a noise-floor line) would otherwise raise alarms on healthy machines (common practice,
// no source). The sample fleet's healthy motors stay within these defaults in every round (tested).
double minSpreadFraction(std::string_view indicator);

// True for the indicators worth a limit: overall velocity, bearing envelope lines, 1X, 2xLF and
// the supply balance. sideband_db is left out on purpose: it falls (fewer dB below the line) as a
// rotor fault grows, so an upper limit would point the wrong way; the broken-bar rule grades it.
bool deservesLimit(std::string_view indicator);

// The limit methods an analyst can ask for by name ("iso-zone", "statistical", "percent").
bool isSuggestionMethod(std::string_view method);

// Limits of `indicator` by `method` from the first `baselineRounds` values of `history` (oldest
// first). Errors name what is wrong: an unknown method, ISO zones asked for anything but overall
// velocity, an indicator not worth a limit, or too few rounds for that method.
Result<trend::Limits, std::string> suggestLimits(const fleet::MotorDefinition& motor, std::string_view indicator, std::string_view method,
                                                 std::span<const double> history, std::size_t baselineRounds = kBaselineRounds);

// The limits that apply when the analyst has stored none (see the header comment); empty
// limits (no alarm) when the history is too short or the indicator is not limit-worthy.
trend::Limits defaultLimits(const fleet::MotorDefinition& motor, std::string_view indicator, std::span<const double> history);

// The values of a stored trend, oldest first (the form the functions above take).
std::vector<double> valuesOf(const std::vector<storage::TrendPoint>& history);

// The analyst's stored limits for (point, indicator) when `stored` (the motor's) holds them, else
// defaultLimits. The second form reads the motor's stored limits itself.
trend::Limits effectiveLimits(const std::vector<storage::AlarmLimitRow>& stored, const fleet::MotorDefinition& motor, const std::string& point,
                              const std::string& indicator, std::span<const double> history);
trend::Limits effectiveLimits(storage::FleetStore& store, const fleet::MotorDefinition& motor, const std::string& point,
                              const std::string& indicator, std::span<const double> history);

} // namespace humwise::workflow
