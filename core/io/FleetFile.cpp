#include "core/io/FleetFile.h"

#include "core/io/FileBytes.h"
#include "core/util/JsonReader.h"
#include "core/util/JsonWriter.h"

#include <cmath>
#include <sstream>

namespace humwise::io {
namespace {

using fleet::Fleet;
using json::Value;

// Thrown inside the parser, turned into a ReadError at its boundary.
struct FieldError {
    std::size_t line;
    std::string message;
};

[[noreturn]] void bad(const Value& v, const std::string& message) { throw FieldError{v.line(), message}; }

const Value& member(const Value& obj, const char* key, const std::string& where) {
    if (!obj.isObject()) bad(obj, where + " must be an object");
    const Value* v = obj.find(key);
    if (!v) bad(obj, where + " needs \"" + key + "\"");
    return *v;
}

std::string text(const Value& obj, const char* key, const std::string& where, bool required = true) {
    const Value* v = obj.find(key);
    if (!v) {
        if (required) bad(obj, where + " needs \"" + key + "\"");
        return {};
    }
    if (!v->isString()) bad(*v, where + "." + key + " must be a string");
    return v->string();
}

std::optional<double> optNumber(const Value& obj, const char* key, const std::string& where) {
    const Value* v = obj.find(key);
    if (!v) return std::nullopt;
    if (!v->isNumber()) bad(*v, where + "." + key + " must be a number");
    return v->number();
}

double number(const Value& obj, const char* key, const std::string& where) {
    const auto v = optNumber(obj, key, where);
    if (!v) bad(obj, where + " needs \"" + key + "\"");
    return *v;
}

std::optional<int> optInteger(const Value& obj, const char* key, const std::string& where) {
    const auto v = optNumber(obj, key, where);
    if (!v) return std::nullopt;
    if (*v != std::floor(*v) || std::abs(*v) > 1e9) bad(*obj.find(key), where + "." + key + " must be a whole number");
    return static_cast<int>(*v);
}

int integer(const Value& obj, const char* key, const std::string& where) {
    const auto v = optInteger(obj, key, where);
    if (!v) bad(obj, where + " needs \"" + key + "\"");
    return *v;
}

void rejectUnknown(const Value& obj, std::initializer_list<const char*> known, const std::string& where) {
    for (const auto& [k, v] : obj.members()) {
        bool ok = false;
        for (const char* name : known) ok |= k == name;
        if (!ok) bad(v, where + ": unknown member \"" + k + "\"");
    }
}

motor::Bearing bearing(const Value& v, const std::string& where) {
    if (!v.isObject()) bad(v, where + " must be an object");
    rejectUnknown(v, {"designation", "rolling_elements", "element_diameter", "pitch_diameter", "contact_angle_deg", "bpfo", "bpfi", "bsf", "ftf"}, where);
    motor::Bearing b;
    b.designation = text(v, "designation", where, false);
    if (v.find("rolling_elements")) {
        motor::BearingGeometry g;
        g.rollingElements = integer(v, "rolling_elements", where);
        g.elementDiameter = number(v, "element_diameter", where);
        g.pitchDiameter = number(v, "pitch_diameter", where);
        g.contactAngleDeg = optNumber(v, "contact_angle_deg", where).value_or(0.0);
        b.data = g;
    } else {
        b.data = motor::BearingFactors{number(v, "bpfo", where), number(v, "bpfi", where), number(v, "bsf", where), number(v, "ftf", where)};
    }
    return b;
}

motor::DrivenKind drivenKind(const Value& v, const std::string& s) {
    if (const auto k = motor::drivenKindFromName(s)) return *k;
    bad(v, "driven.kind '" + s + "' is not none, centrifugal-pump, fan, blower, compressor, conveyor or other");
}

fleet::PointDefinition point(const Value& v, const std::string& where) {
    if (!v.isObject()) bad(v, where + " must be an object");
    rejectUnknown(v, {"name", "quantity", "location", "direction", "phase", "unit", "sensitivity", "sensor"}, where);
    fleet::PointDefinition p;
    p.name = text(v, "name", where);
    const auto q = parseQuantity(text(v, "quantity", where));
    if (!q || *q == Quantity::Dimensionless) bad(v, where + ".quantity must be acceleration, velocity, displacement, current or voltage");
    p.quantity = *q;
    p.location = text(v, "location", where, false);
    p.direction = text(v, "direction", where, false);
    p.phase = text(v, "phase", where, false);
    const std::string u = text(v, "unit", where);
    const auto unit = parseUnit(u);
    if (!unit) bad(v, where + ".unit '" + u + "' is not a unit Humwise knows");
    p.unit = *unit;
    p.sensitivity = optNumber(v, "sensitivity", where).value_or(1.0);
    p.sensor = text(v, "sensor", where, false);
    return p;
}

fleet::MotorDefinition motorEntry(const Value& v, const std::string& where) {
    if (!v.isObject()) bad(v, where + " must be an object");
    rejectUnknown(v, {"tag", "area", "description", "nameplate", "bearings", "driven", "severity", "points"}, where);
    fleet::MotorDefinition m;
    m.motor.tag = text(v, "tag", where);
    const std::string w = where + " (" + m.motor.tag + ")";
    m.area = text(v, "area", w);
    m.description = text(v, "description", w, false);
    const Value& np = member(v, "nameplate", w);
    const std::string nw = w + ".nameplate";
    rejectUnknown(np, {"rated_power_kw", "rated_voltage_v", "rated_current_a", "supply_hz", "rated_speed_rpm", "poles", "drive", "rotor_bars", "stator_slots"}, nw);
    auto& n = m.motor.nameplate;
    n.ratedPowerKw = number(np, "rated_power_kw", nw);
    n.ratedVoltageV = number(np, "rated_voltage_v", nw);
    n.ratedCurrentA = number(np, "rated_current_a", nw);
    n.supplyHz = number(np, "supply_hz", nw);
    n.ratedSpeedRpm = number(np, "rated_speed_rpm", nw);
    n.poles = optInteger(np, "poles", nw);
    const std::string drive = text(np, "drive", nw);
    if (drive == "direct-on-line") n.drive = motor::DriveKind::DirectOnLine;
    else if (drive == "drive-fed") n.drive = motor::DriveKind::VariableFrequency;
    else bad(np, nw + ".drive must be direct-on-line or drive-fed");
    n.rotorBars = optInteger(np, "rotor_bars", nw);
    n.statorSlots = optInteger(np, "stator_slots", nw);
    if (const Value* b = v.find("bearings")) {
        if (!b->isObject()) bad(*b, w + ".bearings must be an object");
        rejectUnknown(*b, {"de", "nde"}, w + ".bearings");
        if (const Value* de = b->find("de")) m.motor.driveEndBearing = bearing(*de, w + ".bearings.de");
        if (const Value* nde = b->find("nde")) m.motor.nonDriveEndBearing = bearing(*nde, w + ".bearings.nde");
    }
    if (const Value* d = v.find("driven")) {
        rejectUnknown(*d, {"kind", "vanes", "speed_ratio"}, w + ".driven");
        m.motor.driven.kind = drivenKind(*d, text(*d, "kind", w + ".driven"));
        m.motor.driven.vanesOrBlades = optInteger(*d, "vanes", w + ".driven");
        m.motor.driven.speedRatio = optNumber(*d, "speed_ratio", w + ".driven").value_or(1.0);
    }
    const Value& sev = member(v, "severity", w);
    rejectUnknown(sev, {"standard", "group", "support", "class"}, w + ".severity");
    const std::string standard = text(sev, "standard", w + ".severity");
    if (standard == "ISO 20816-3") {
        m.motor.severity.standard = motor::SeverityClass::Standard::Iso20816_3;
        m.motor.severity.group = integer(sev, "group", w + ".severity");
        const std::string support = text(sev, "support", w + ".severity");
        if (support != "rigid" && support != "flexible") bad(sev, w + ".severity.support must be rigid or flexible");
        m.motor.severity.support = support == "rigid" ? motor::SupportClass::Rigid : motor::SupportClass::Flexible;
    } else if (standard == "ISO 10816-1") {
        m.motor.severity.standard = motor::SeverityClass::Standard::Iso10816_1;
        m.motor.severity.iso10816Class = integer(sev, "class", w + ".severity");
    } else {
        bad(sev, w + ".severity.standard must be \"ISO 20816-3\" or \"ISO 10816-1\"");
    }
    const Value& pts = member(v, "points", w);
    if (!pts.isArray()) bad(pts, w + ".points must be an array");
    for (std::size_t i = 0; i < pts.items().size(); ++i) m.points.push_back(point(pts.items()[i], w + ".points[" + std::to_string(i) + "]"));
    return m;
}

Fleet fleetFrom(const Value& root) {
    if (!root.isObject()) bad(root, "the fleet file must hold one JSON object");
    rejectUnknown(root, {"format", "version", "site", "areas", "motors", "routes"}, "fleet");
    if (text(root, "format", "fleet") != "humwise-fleet") bad(root, "\"format\" must be \"humwise-fleet\"");
    const auto version = optInteger(root, "version", "fleet");
    if (!version) bad(root, "the fleet file needs \"version\"");
    if (*version != 1) bad(*root.find("version"), "fleet file version " + std::to_string(*version) + " is not supported (this Humwise reads version 1)");
    Fleet f;
    const Value& site = member(root, "site", "fleet");
    rejectUnknown(site, {"name", "description"}, "site");
    f.site = text(site, "name", "site");
    f.siteDescription = text(site, "description", "site", false);
    const Value& areas = member(root, "areas", "fleet");
    if (!areas.isArray()) bad(areas, "\"areas\" must be an array of names");
    for (const auto& a : areas.items()) {
        if (!a.isString()) bad(a, "an area name must be a string");
        f.areas.push_back(a.string());
    }
    const Value& motors = member(root, "motors", "fleet");
    if (!motors.isArray()) bad(motors, "\"motors\" must be an array");
    for (std::size_t i = 0; i < motors.items().size(); ++i) f.motors.push_back(motorEntry(motors.items()[i], "motors[" + std::to_string(i) + "]"));
    if (const Value* routes = root.find("routes")) {
        if (!routes->isArray()) bad(*routes, "\"routes\" must be an array");
        for (std::size_t i = 0; i < routes->items().size(); ++i) {
            const Value& r = routes->items()[i];
            const std::string w = "routes[" + std::to_string(i) + "]";
            rejectUnknown(r, {"name", "description", "points"}, w);
            fleet::Route route;
            route.name = text(r, "name", w);
            route.description = text(r, "description", w, false);
            const Value& pts = member(r, "points", w);
            if (!pts.isArray()) bad(pts, w + ".points must be an array of \"TAG/POINT\"");
            for (const auto& p : pts.items()) {
                if (!p.isString() || p.string().find('/') == std::string::npos) bad(p, w + ": a route point is written \"TAG/POINT\"");
                const auto slash = p.string().rfind('/');
                route.points.push_back({p.string().substr(0, slash), p.string().substr(slash + 1)});
            }
            f.routes.push_back(std::move(route));
        }
    }
    return f;
}

void writeBearing(json::Writer& w, const motor::Bearing& b) {
    w.beginObject();
    if (!b.designation.empty()) w.field("designation", b.designation);
    if (const auto* g = std::get_if<motor::BearingGeometry>(&b.data)) {
        w.field("rolling_elements", g->rollingElements);
        w.field("element_diameter", g->elementDiameter);
        w.field("pitch_diameter", g->pitchDiameter);
        w.field("contact_angle_deg", g->contactAngleDeg);
    } else {
        const auto& f = std::get<motor::BearingFactors>(b.data);
        w.field("bpfo", f.bpfo);
        w.field("bpfi", f.bpfi);
        w.field("bsf", f.bsf);
        w.field("ftf", f.ftf);
    }
    w.endObject();
}

} // namespace

Result<Fleet, ReadError> parseFleet(std::string_view textIn, const std::string& source) {
    if (textIn.empty()) return fail(ReadError{ReadError::Code::Empty, source, {}, {}, "the file is empty"});
    json::ParseError pe;
    const auto root = json::parse(textIn, pe);
    if (!root) return fail(ReadError{ReadError::Code::BadField, source, {}, pe.line, "not valid JSON (column " + std::to_string(pe.column) + "): " + pe.message});
    try {
        Fleet f = fleetFrom(*root);
        const auto issues = fleet::validate(f);
        if (!issues.empty()) return fail(ReadError{ReadError::Code::BadField, source, {}, {}, issues.front().where + ": " + issues.front().message});
        return f;
    } catch (const FieldError& e) {
        return fail(ReadError{ReadError::Code::BadField, source, {}, e.line, e.message});
    }
}

Result<Fleet, ReadError> readFleetFile(const std::filesystem::path& path) {
    auto bytes = readFileBytes(path, std::uint64_t{64} << 20);
    if (!bytes) return fail(bytes.error());
    const auto& b = bytes.value();
    return parseFleet(std::string_view(reinterpret_cast<const char*>(b.data()), b.size()), path.string());
}

std::string writeFleet(const Fleet& f) {
    std::ostringstream out;
    json::Writer w(out);
    w.beginObject();
    w.field("format", "humwise-fleet");
    w.field("version", 1);
    w.key("site").beginObject().field("name", f.site).field("description", f.siteDescription).endObject();
    w.key("areas").beginArray();
    for (const auto& a : f.areas) w.value(a);
    w.endArray();
    w.key("motors").beginArray();
    for (const auto& m : f.motors) {
        const auto& n = m.motor.nameplate;
        w.beginObject();
        w.field("tag", m.motor.tag);
        w.field("area", m.area);
        w.field("description", m.description);
        w.key("nameplate").beginObject();
        w.field("rated_power_kw", n.ratedPowerKw);
        w.field("rated_voltage_v", n.ratedVoltageV);
        w.field("rated_current_a", n.ratedCurrentA);
        w.field("supply_hz", n.supplyHz);
        w.field("rated_speed_rpm", n.ratedSpeedRpm);
        if (n.poles) w.field("poles", *n.poles);
        w.field("drive", n.drive == motor::DriveKind::DirectOnLine ? "direct-on-line" : "drive-fed");
        if (n.rotorBars) w.field("rotor_bars", *n.rotorBars);
        if (n.statorSlots) w.field("stator_slots", *n.statorSlots);
        w.endObject();
        if (m.motor.driveEndBearing || m.motor.nonDriveEndBearing) {
            w.key("bearings").beginObject();
            if (m.motor.driveEndBearing) {
                w.key("de");
                writeBearing(w, *m.motor.driveEndBearing);
            }
            if (m.motor.nonDriveEndBearing) {
                w.key("nde");
                writeBearing(w, *m.motor.nonDriveEndBearing);
            }
            w.endObject();
        }
        w.key("driven").beginObject();
        w.field("kind", motor::drivenKindName(m.motor.driven.kind));
        if (m.motor.driven.vanesOrBlades) w.field("vanes", *m.motor.driven.vanesOrBlades);
        w.field("speed_ratio", m.motor.driven.speedRatio);
        w.endObject();
        const auto& s = m.motor.severity;
        w.key("severity").beginObject();
        if (s.standard == motor::SeverityClass::Standard::Iso20816_3) {
            w.field("standard", "ISO 20816-3");
            w.field("group", s.group);
            w.field("support", s.support == motor::SupportClass::Rigid ? "rigid" : "flexible");
        } else {
            w.field("standard", "ISO 10816-1");
            w.field("class", s.iso10816Class);
        }
        w.endObject();
        w.key("points").beginArray();
        for (const auto& p : m.points) {
            w.beginObject();
            w.field("name", p.name);
            w.field("quantity", quantityName(p.quantity));
            if (!p.location.empty()) w.field("location", p.location);
            if (!p.direction.empty()) w.field("direction", p.direction);
            if (!p.phase.empty()) w.field("phase", p.phase);
            w.field("unit", unitSymbol(p.unit));
            w.field("sensitivity", p.sensitivity);
            if (!p.sensor.empty()) w.field("sensor", p.sensor);
            w.endObject();
        }
        w.endArray();
        w.endObject();
    }
    w.endArray();
    w.key("routes").beginArray();
    for (const auto& r : f.routes) {
        w.beginObject();
        w.field("name", r.name);
        w.field("description", r.description);
        w.key("points").beginArray();
        for (const auto& p : r.points) w.value(p.motorTag + "/" + p.pointName);
        w.endArray();
        w.endObject();
    }
    w.endArray();
    w.endObject();
    return out.str();
}

} // namespace humwise::io
