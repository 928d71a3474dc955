#include "app/common/LimitRules.h"

#include "core/diagnosis/Thresholds.h"

#include <algorithm>
#include <array>
#include <numeric>
#include <vector>

namespace humwise::workflow {
namespace {

double mean(std::span<const double> v) { return std::accumulate(v.begin(), v.end(), 0.0) / static_cast<double>(v.size()); }

std::span<const double> baselineOf(std::span<const double> history, std::size_t rounds) {
    return history.first(std::min(rounds, history.size()));
}

} // namespace

bool deservesLimit(std::string_view indicator) {
    static constexpr std::array<std::string_view, 7> worthy = {"velocity_rms", "env_bpfo", "env_bpfi", "1x", "2lf", "negative_sequence_ratio",
                                                               "current_unbalance"};
    return std::find(worthy.begin(), worthy.end(), indicator) != worthy.end();
}

double minSpreadFraction(std::string_view indicator) { return indicator.starts_with("env_") ? 1.0 : 1.0 / 3.0; }

bool isSuggestionMethod(std::string_view method) { return method == "iso-zone" || method == "statistical" || method == "percent"; }

Result<trend::Limits, std::string> suggestLimits(const fleet::MotorDefinition& motor, std::string_view indicator, std::string_view method,
                                                 std::span<const double> history, std::size_t baselineRounds) {
    if (!isSuggestionMethod(method))
        return fail("unknown limit method '" + std::string(method) + "' (give iso-zone, statistical or percent)");
    if (!deservesLimit(indicator)) return fail("indicator '" + std::string(indicator) + "' takes no alarm limit");
    if (method == "iso-zone" && indicator != "velocity_rms")
        return fail("ISO-zone limits apply to overall velocity (velocity_rms) only, not to '" + std::string(indicator) + "'");
    const auto baseline = baselineOf(history, baselineRounds);
    const std::size_t needed = method == "statistical" ? 2 : 1;
    if (baseline.size() < needed)
        return fail(std::string(method) + " limits need at least " + std::to_string(needed) + " round(s) of history; there are " +
                    std::to_string(baseline.size()));
    if (method == "iso-zone") return trend::isoZoneLimits(mean(baseline), diagnosis::zoneBoundaries(motor.motor.severity));
    if (method == "statistical") return trend::statisticalLimits(baseline, minSpreadFraction(indicator));
    return trend::percentLimits(mean(baseline));
}

trend::Limits defaultLimits(const fleet::MotorDefinition& motor, std::string_view indicator, std::span<const double> history) {
    if (!deservesLimit(indicator)) return {};
    auto r = suggestLimits(motor, indicator, indicator == "velocity_rms" ? "iso-zone" : "statistical", history);
    return r ? r.value() : trend::Limits{};
}

std::vector<double> valuesOf(const std::vector<storage::TrendPoint>& history) {
    std::vector<double> v;
    v.reserve(history.size());
    for (const auto& p : history) v.push_back(p.value);
    return v;
}

trend::Limits effectiveLimits(const std::vector<storage::AlarmLimitRow>& stored, const fleet::MotorDefinition& motor, const std::string& point,
                              const std::string& indicator, std::span<const double> history) {
    for (const auto& l : stored)
        if (l.pointName == point && l.indicator == indicator) return {l.alert, l.alarm, l.method, l.source};
    return defaultLimits(motor, indicator, history);
}

trend::Limits effectiveLimits(storage::FleetStore& store, const fleet::MotorDefinition& motor, const std::string& point,
                              const std::string& indicator, std::span<const double> history) {
    return effectiveLimits(store.alarmLimits(motor.motor.tag), motor, point, indicator, history);
}

} // namespace humwise::workflow
