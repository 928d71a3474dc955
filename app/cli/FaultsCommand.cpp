#include "app/cli/FaultsCommand.h"

#include "app/cli/CliError.h"
#include "app/cli/MotorOptions.h"
#include "core/motor/FaultFrequencies.h"
#include "core/util/JsonWriter.h"

#include <cstdio>

namespace humwise::cli {

int runFaults(const std::vector<std::string>& args, std::ostream& out) {
    auto specs = motorOptionSpecs();
    for (const char* name : {"speed-rpm", "slip"}) specs.push_back({name});
    specs.push_back({"json", false});
    const ParsedArgs a(args, specs);
    if (!a.positional().empty()) throw UsageError("faults takes no file, got '" + a.positional().front() + "'");
    const motor::Motor m = motorFromArgs(a);
    const int poles = *motor::polesOf(m.nameplate);
    if (a.has("speed-rpm") && a.has("slip")) throw UsageError("give either --speed-rpm or --slip, not both");
    motor::OperatingPoint op;
    try {
        if (const auto rpm = a.number("speed-rpm")) op = motor::operatingPointFromSpeed(m.nameplate.supplyHz, poles, *rpm);
        else if (const auto s = a.number("slip")) op = motor::operatingPointFromSlip(m.nameplate.supplyHz, poles, *s);
        else if (m.nameplate.ratedSpeedRpm > 0) op = motor::operatingPointFromSpeed(m.nameplate.supplyHz, poles, m.nameplate.ratedSpeedRpm);
        else throw UsageError("--speed-rpm or --slip is required");
    } catch (const std::invalid_argument& e) {
        throw UsageError(e.what());
    }
    if (op.slip() < -0.5 || op.slip() >= 1)
        throw UsageError("the speed is impossible for a " + std::to_string(poles) + "-pole motor on " + std::to_string(m.nameplate.supplyHz) + " Hz");
    const auto lines = motor::faultLines(m, op);
    if (a.has("json")) {
        json::Writer w(out);
        w.beginObject();
        w.key("operating_point").beginObject();
        w.field("line_hz", op.lineHz);
        w.field("poles", poles);
        w.field("speed_rpm", op.speedRpm());
        w.field("shaft_hz", op.shaftHz);
        w.field("slip", op.slip());
        w.field("pole_pass_hz", op.polePassHz());
        w.endObject();
        w.key("lines").beginArray();
        for (const auto& l : lines) {
            w.beginObject();
            w.field("id", l.id);
            w.field("label", l.label);
            w.field("family", motor::familyName(l.family));
            w.field("domain", motor::domainName(l.domain));
            w.field("frequency_hz", l.frequencyHz);
            w.field("order", l.frequencyHz / op.shaftHz);
            w.endObject();
        }
        w.endArray();
        w.endObject();
        return 0;
    }
    char buf[256];
    std::snprintf(buf, sizeof buf, "%d-pole motor on %.4g Hz at %.1f r/min: shaft %.4f Hz, slip %.3f %%, pole pass %.4f Hz\n\n", poles,
                  op.lineHz, op.speedRpm(), op.shaftHz, 100 * op.slip(), op.polePassHz());
    out << buf;
    std::snprintf(buf, sizeof buf, "%-10s %-22s %12s %9s  %s\n", "domain", "id", "Hz", "order", "meaning");
    out << buf;
    for (const auto& l : lines) {
        std::snprintf(buf, sizeof buf, "%-10s %-22s %12.4f %9.4f  %s\n", motor::domainName(l.domain), l.id.c_str(), l.frequencyHz,
                      l.frequencyHz / op.shaftHz, l.label.c_str());
        out << buf;
    }
    return 0;
}

} // namespace humwise::cli
