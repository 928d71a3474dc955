#include "app/cli/DiagnoseCommand.h"

#include "app/cli/CliError.h"
#include "app/cli/MotorOptions.h"
#include "app/cli/RecordingOptions.h"
#include "core/diagnosis/Diagnose.h"
#include "core/io/RecordingReader.h"
#include "core/util/JsonWriter.h"
#include "core/util/Text.h"

#include <cstdio>

namespace humwise::cli {
namespace {

using namespace diagnosis;

template <class T>
std::vector<T> listOption(const ParsedArgs& a, const std::string& name, T (*parse)(std::string_view, const std::string&)) {
    std::vector<T> out;
    if (const auto v = a.value(name))
        for (auto part : text::split(*v, ',')) out.push_back(parse(text::trim(part), name));
    return out;
}

Direction parseDirection(std::string_view s, const std::string& option) {
    if (s == "H" || s == "h") return Direction::Horizontal;
    if (s == "V" || s == "v") return Direction::Vertical;
    if (s == "A" || s == "a") return Direction::Axial;
    throw UsageError("--" + option + " takes H, V or A (comma-separated, one per channel), got '" + std::string(s) + "'");
}

Location parseLocation(std::string_view s, const std::string& option) {
    if (s == "DE" || s == "de") return Location::DriveEnd;
    if (s == "NDE" || s == "nde") return Location::NonDriveEnd;
    throw UsageError("--" + option + " takes DE or NDE (comma-separated, one per channel), got '" + std::string(s) + "'");
}

motor::SeverityClass severityClass(const ParsedArgs& a) {
    motor::SeverityClass c;
    if (const auto g = a.integer("machine-group")) {
        if (*g != 1 && *g != 2) throw UsageError("--machine-group is 1 (above 300 kW) or 2 (15-300 kW) per ISO 20816-3");
        c.group = static_cast<int>(*g);
    }
    if (const auto s = a.value("support")) {
        if (*s == "rigid") c.support = motor::SupportClass::Rigid;
        else if (*s == "flexible") c.support = motor::SupportClass::Flexible;
        else throw UsageError("--support is rigid or flexible, got '" + *s + "'");
    }
    return c;
}

template <class T>
T pick(const std::vector<T>& list, std::size_t i, T fallback) {
    if (list.empty()) return fallback;
    return i < list.size() ? list[i] : list.back();
}

std::vector<VibrationInput> vibrationInputs(const Recording& rec, const std::vector<std::size_t>& channels, const std::vector<Direction>& directions,
                                            const std::vector<Location>& locations) {
    std::vector<VibrationInput> out;
    for (std::size_t i = 0; i < channels.size(); ++i) {
        const Channel& ch = rec.channels[channels[i]];
        VibrationInput v;
        v.direction = pick(directions, i, Direction::Horizontal);
        v.location = pick(locations, i, Location::DriveEnd);
        v.name = std::string(locationName(v.location)) + "-" + directionName(v.direction) + " (" + ch.name + ")";
        v.quantity = ch.quantity;
        v.sampleRateHz = rec.sampleRateHz;
        v.samples = ch.samples;
        out.push_back(std::move(v));
    }
    return out;
}

void writeFinding(json::Writer& w, const Finding& f) {
    w.beginObject();
    w.field("fault", f.fault);
    w.field("severity", f.severity);
    w.field("severity_name", severityName(f.severity));
    w.field("withheld", f.withheld);
    if (f.withheld) w.field("withheld_reason", f.withheldReason);
    w.field("origin", originName(f.origin));
    w.field("confidence", f.confidence);
    w.key("evidence").beginArray();
    for (const auto& e : f.evidence) {
        w.beginObject();
        w.field("label", e.label);
        w.key("expected_hz");
        if (e.expectedHz) w.value(*e.expectedHz); else w.null();
        w.key("measured_hz");
        if (e.measuredHz) w.value(*e.measuredHz); else w.null();
        w.field("amplitude", e.amplitude);
        w.field("unit", e.unit);
        w.field("channel", e.channel);
        if (e.threshold) {
            w.field("threshold", *e.threshold);
            w.field("threshold_source", e.thresholdSource);
        }
        w.endObject();
    }
    w.endArray();
    w.field("explanation", f.explanation);
    w.field("action", f.action);
    w.field("rule", f.rule);
    w.endObject();
}

void writeJson(std::ostream& out, const std::string& file, const DiagnosisResult& r) {
    json::Writer w(out);
    w.beginObject();
    w.field("file", file);
    const auto& op = r.operatingPoint;
    w.key("operating_point").beginObject();
    w.field("line_hz", op.point.lineHz);
    w.field("line_method", op.lineMethod);
    w.field("speed_rpm", op.point.speedRpm());
    w.field("speed_method", op.speedMethod);
    w.field("speed_confidence", op.speedConfidence);
    w.field("slip", op.point.slip());
    w.key("load_percent");
    if (op.loadPercent) w.value(*op.loadPercent); else w.null();
    w.endObject();
    w.key("indicators").beginObject();
    for (const auto& i : r.indicators.all()) {
        w.key(i.name).beginObject();
        w.field("value", i.value);
        w.field("unit", i.unit);
        w.endObject();
    }
    w.endObject();
    w.key("findings").beginArray();
    for (const auto& f : r.findings) writeFinding(w, f);
    w.endArray();
    w.key("power_off").beginArray();
    for (const auto& p : r.powerOff) {
        w.beginObject();
        w.field("label", p.label);
        w.field("frequency_hz", p.energisedHz);
        w.field("energised", p.energisedMmPerSecond);
        w.field("after_cut", p.afterMmPerSecond);
        w.field("drop_db", p.dropDb);
        w.field("origin", originName(p.verdict));
        w.endObject();
    }
    w.endArray();
    w.key("notes").beginArray();
    for (const auto& n : r.notes) w.value(n);
    w.endArray();
    w.endObject();
}

void writeText(std::ostream& out, const std::string& file, const DiagnosisResult& r) {
    char buf[512];
    const auto& op = r.operatingPoint;
    out << "diagnosis of " << file << '\n';
    std::snprintf(buf, sizeof buf, "supply %.4f Hz (%s), speed %.1f r/min (%s, confidence %.2f), slip %.2f %%", op.point.lineHz, op.lineMethod.c_str(),
                  op.point.speedRpm(), op.speedMethod.c_str(), op.speedConfidence, 100 * op.point.slip());
    out << buf;
    if (op.loadPercent) {
        std::snprintf(buf, sizeof buf, ", load about %.0f %%", *op.loadPercent);
        out << buf;
    }
    out << "\n\n";
    if (r.findings.empty()) out << "no findings\n";
    for (const auto& f : r.findings) {
        std::snprintf(buf, sizeof buf, "%-4s %-24s %-12s %s, confidence %.2f%s\n", std::string(severityMark(f.severity)).c_str(), f.fault.c_str(),
                      std::string(severityName(f.severity)).c_str(), std::string(originName(f.origin)).c_str(), f.confidence,
                      f.withheld ? ", WITHHELD" : "");
        out << buf;
        out << "     " << f.explanation << '\n';
        if (f.withheld) out << "     withheld: " << f.withheldReason << '\n';
        for (const auto& e : f.evidence) {
            out << "       - " << e.label << ": ";
            if (e.expectedHz) {
                std::snprintf(buf, sizeof buf, "expected %.3f Hz, ", *e.expectedHz);
                out << buf;
            }
            if (e.measuredHz) {
                std::snprintf(buf, sizeof buf, "measured %.3f Hz, ", *e.measuredHz);
                out << buf;
            }
            std::snprintf(buf, sizeof buf, "%.4g %s", e.amplitude, e.unit.c_str());
            out << buf;
            if (e.threshold) {
                std::snprintf(buf, sizeof buf, " (limit %.4g; %s)", *e.threshold, e.thresholdSource.c_str());
                out << buf;
            }
            out << " [" << e.channel << "]\n";
        }
        out << "     next: " << f.action << "  (" << f.rule << ")\n\n";
    }
    for (const auto& n : r.notes) out << "note: " << n << '\n';
}

} // namespace

int runDiagnose(const std::vector<std::string>& args, std::ostream& out) {
    auto specs = recordingOptionSpecs();
    for (const auto& s : motorOptionSpecs()) specs.push_back(s);
    for (const char* name : {"direction", "location", "speed-rpm", "machine-group", "support", "power-off"}) specs.push_back({name});
    specs.push_back({"json", false});
    const ParsedArgs a(args, specs);
    motor::Motor m = motorFromArgs(a);
    m.tag = "command-line";
    m.nonDriveEndBearing = m.driveEndBearing; // the bearing given applies to both ends
    m.severity = severityClass(a);
    const Recording rec = loadRecording(a);

    std::vector<std::size_t> channels;
    if (a.has("channel")) channels.push_back(selectedChannel(a, rec));
    else for (std::size_t i = 0; i < rec.channels.size(); ++i) channels.push_back(i);

    DiagnosisInput in;
    in.motor = m;
    if (const auto s = a.number("speed-rpm")) {
        if (!(*s > 0)) throw UsageError("--speed-rpm must be > 0");
        in.measuredSpeedRpm = s;
    }
    const Quantity q = rec.channels[channels.front()].quantity;
    for (std::size_t c : channels)
        if (rec.channels[c].quantity != q) throw UsageError("all analysed channels must be of one quantity; use --channel");
    if (q == Quantity::Current || q == Quantity::Voltage) {
        if (channels.size() > 3) throw UsageError("at most three current or voltage channels (phases A, B, C); use --channel");
        std::vector<std::vector<double>> phases;
        for (std::size_t c : channels) phases.push_back(rec.channels[c].samples);
        if (q == Quantity::Current) in.current = CurrentInput{"current", rec.sampleRateHz, phases};
        else in.voltage = VoltageInput{"voltage", rec.sampleRateHz, true, phases};
    } else if (q == Quantity::Acceleration || q == Quantity::Velocity) {
        const auto directions = listOption<Direction>(a, "direction", parseDirection);
        const auto locations = listOption<Location>(a, "location", parseLocation);
        in.vibration = vibrationInputs(rec, channels, directions, locations);
        if (const auto off = a.value("power-off")) {
            io::RecordingReadOptions options;
            options.channels.defaults.unit = siUnitOf(q);
            options.channels.defaults.unit = q == Quantity::Acceleration ? Unit::G : Unit::MillimetrePerSecond;
            if (const auto u = a.value("input-unit")) options.channels.defaults.unit = *parseUnit(*u);
            options.channels.defaults.scale = a.number("input-scale", 1.0);
            auto after = io::readRecordingFile(*off, options);
            if (!after) throw ProcessingError(after.error().message());
            if (after.value().channels.size() <= channels.front())
                throw ProcessingError(*off + ": the power-off recording has no channel " + std::to_string(channels.front() + 1));
            const auto afterInputs = vibrationInputs(after.value(), {channels.front()}, listOption<Direction>(a, "direction", parseDirection),
                                                     listOption<Location>(a, "location", parseLocation));
            in.powerOff = PowerOffInput{in.vibration.front(), afterInputs.front()};
        }
    } else {
        throw UsageError("diagnose reads acceleration, velocity, current or voltage channels");
    }
    if (a.has("power-off") && !in.powerOff) throw UsageError("--power-off compares vibration recordings");

    DiagnosisResult result;
    try {
        result = diagnose(in);
    } catch (const std::invalid_argument& e) {
        throw ProcessingError(rec.source + ": " + e.what());
    }
    if (a.has("json")) writeJson(out, rec.source, result);
    else writeText(out, rec.source, result);
    return 0;
}

} // namespace humwise::cli
