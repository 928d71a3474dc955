#include "app/cli/MotorOptions.h"

#include "app/cli/CliError.h"
#include "core/util/Text.h"

#include <cmath>
#include <map>

namespace humwise::cli {
namespace {

std::map<std::string, double> keyValues(const std::string& textValue, const std::string& option) {
    std::map<std::string, double> out;
    for (auto part : text::split(textValue, ',')) {
        part = text::trim(part);
        const auto eq = part.find('=');
        if (eq == std::string_view::npos) throw UsageError("--" + option + " needs KEY=VALUE pairs separated by commas, got '" + std::string(part) + "'");
        const std::string key(text::trim(part.substr(0, eq)));
        const auto v = text::parseDouble(part.substr(eq + 1));
        if (!v || !std::isfinite(*v)) throw UsageError("--" + option + ": '" + key + "' needs a number");
        if (out.count(key)) throw UsageError("--" + option + ": '" + key + "' is given twice");
        out[key] = *v;
    }
    return out;
}

double take(std::map<std::string, double>& kv, const std::string& key, const std::string& option) {
    const auto it = kv.find(key);
    if (it == kv.end()) throw UsageError("--" + option + " needs " + key + "=...");
    const double v = it->second;
    kv.erase(it);
    return v;
}

void rejectLeftovers(const std::map<std::string, double>& kv, const std::string& option, const std::string& allowed) {
    if (!kv.empty()) throw UsageError("--" + option + ": unknown key '" + kv.begin()->first + "' (allowed: " + allowed + ")");
}

} // namespace

std::vector<OptionSpec> motorOptionSpecs() {
    return {{"line-hz"}, {"poles"}, {"rated-rpm"}, {"rotor-bars"}, {"vanes"}, {"bearing"}, {"bearing-factors"}};
}

motor::Motor motorFromArgs(const ParsedArgs& a) {
    motor::Motor m;
    m.tag = "command-line";
    const auto line = a.number("line-hz");
    if (!line) throw UsageError("--line-hz is required (the supply frequency, e.g. 50 or 60)");
    m.nameplate.supplyHz = *line;
    if (const auto p = a.count("poles")) m.nameplate.poles = *p;
    if (const auto r = a.number("rated-rpm")) m.nameplate.ratedSpeedRpm = *r;
    if (!m.nameplate.poles && !a.has("rated-rpm")) throw UsageError("--poles is required (or --rated-rpm to derive it)");
    if (const auto bars = a.count("rotor-bars")) m.nameplate.rotorBars = *bars;
    if (const auto v = a.count("vanes")) {
        m.driven.kind = motor::DrivenKind::Other;
        m.driven.vanesOrBlades = *v;
    }
    if (a.has("bearing") && a.has("bearing-factors")) throw UsageError("give either --bearing or --bearing-factors, not both");
    if (const auto b = a.value("bearing")) {
        auto kv = keyValues(*b, "bearing");
        motor::BearingGeometry g;
        const double n = take(kv, "n", "bearing");
        // The size check comes before the conversion: a double beyond int's range would not convert.
        if (n != std::floor(n) || std::abs(n) > 1e6)
            throw UsageError("--bearing: n (number of rolling elements) must be a whole number (3 to 200)");
        g.rollingElements = static_cast<int>(n);
        g.elementDiameter = take(kv, "d", "bearing");
        g.pitchDiameter = take(kv, "D", "bearing");
        if (kv.count("angle")) g.contactAngleDeg = take(kv, "angle", "bearing");
        rejectLeftovers(kv, "bearing", "n, d, D, angle");
        m.driveEndBearing = motor::Bearing{"command-line", g};
    }
    if (const auto b = a.value("bearing-factors")) {
        auto kv = keyValues(*b, "bearing-factors");
        motor::BearingFactors f;
        f.bpfo = take(kv, "BPFO", "bearing-factors");
        f.bpfi = take(kv, "BPFI", "bearing-factors");
        f.bsf = take(kv, "BSF", "bearing-factors");
        f.ftf = take(kv, "FTF", "bearing-factors");
        rejectLeftovers(kv, "bearing-factors", "BPFO, BPFI, BSF, FTF");
        m.driveEndBearing = motor::Bearing{"command-line", f};
    }
    const auto issues = motor::validate(m);
    if (!issues.empty()) {
        std::string msg = "the motor is not possible: " + issues.front().message;
        for (std::size_t i = 1; i < issues.size(); ++i) msg += "; " + issues[i].message;
        throw UsageError(msg);
    }
    return m;
}

} // namespace humwise::cli
