#include "core/trend/AlarmLimits.h"

#include <algorithm>
#include <cmath>
#include <cstdio>
#include <stdexcept>
#include <vector>

namespace humwise::trend {

Limits isoZoneLimits(double baseline, const diagnosis::ZoneBoundaries& z) {
    Limits l;
    l.method = "iso-zone";
    l.alert = std::min(baseline + 0.25 * z.bc, 1.25 * z.bc);
    l.alarm = 1.25 * z.cd;
    l.source = "ISO 10816/20816 alarm guidance (REFERENCE.md 10, from memory, verify) on " + z.source;
    return l;
}

Limits statisticalLimits(std::span<const double> b, double minSpreadFraction) {
    if (b.size() < 2) throw std::invalid_argument("statisticalLimits: at least two baseline values are needed");
    double mean = 0;
    for (double v : b) mean += v;
    mean /= static_cast<double>(b.size());
    double ss = 0;
    for (double v : b) ss += (v - mean) * (v - mean);
    const double measured = std::sqrt(ss / static_cast<double>(b.size() - 1));
    const double floor = minSpreadFraction * std::abs(mean);
    const double sd = std::max(measured, floor);
    Limits l;
    l.method = "statistical";
    l.alert = mean + 2 * sd;
    l.alarm = mean + 3 * sd;
    l.source = "mean + 2 / 3 standard deviations of the baseline rounds (common practice, no source)";
    if (floor > measured) {
        char buf[96];
        std::snprintf(buf, sizeof buf, "; spread taken as %.0f %% of the mean, the baseline scattering less", 100 * minSpreadFraction);
        l.source += buf;
    }
    return l;
}

Limits percentLimits(double baseline, double alertPercent, double alarmFactor) {
    Limits l;
    l.method = "percent";
    l.alert = baseline * (1 + alertPercent / 100.0);
    l.alarm = baseline * alarmFactor;
    l.source = "percentage over the baseline (common practice, no source)";
    return l;
}

const char* modelName(Model m) { return m == Model::Linear ? "linear" : "exponential"; }

std::optional<Projection> project(std::span<const double> days, std::span<const double> values, double limit, Model model) {
    if (days.size() != values.size() || days.size() < 3) return std::nullopt;
    std::vector<double> y(values.begin(), values.end());
    if (model == Model::Exponential) {
        if (!(limit > 0)) return std::nullopt;
        for (double& v : y) {
            if (!(v > 0)) return std::nullopt;
            v = std::log(v);
        }
    }
    const double n = static_cast<double>(days.size());
    double sx = 0, sy = 0;
    for (std::size_t i = 0; i < days.size(); ++i) {
        sx += days[i];
        sy += y[i];
    }
    const double mx = sx / n, my = sy / n;
    double sxx = 0, sxy = 0, syy = 0;
    for (std::size_t i = 0; i < days.size(); ++i) {
        sxx += (days[i] - mx) * (days[i] - mx);
        sxy += (days[i] - mx) * (y[i] - my);
        syy += (y[i] - my) * (y[i] - my);
    }
    if (!(sxx > 0)) return std::nullopt;
    Projection p;
    p.model = model;
    p.slope = sxy / sxx;
    const double a = my - p.slope * mx;
    p.intercept = model == Model::Linear ? a : std::exp(a);
    p.r2 = syy > 0 ? (sxy * sxy) / (sxx * syy) : 1.0;
    const double target = model == Model::Linear ? limit : std::log(limit);
    if (p.slope > 0) {
        const double day = (target - a) / p.slope;
        if (day >= days.back()) p.crossingDay = day;
    }
    return p;
}

} // namespace humwise::trend
