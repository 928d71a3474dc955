#include "core/motor/Motor.h"

#include <cmath>
#include <cstdio>
#include <numbers>

namespace humwise::motor {
namespace {

std::string num(double v) {
    char buf[32];
    std::snprintf(buf, sizeof buf, "%.6g", v);
    return buf;
}

constexpr DrivenKind kDrivenKinds[] = {DrivenKind::None,       DrivenKind::CentrifugalPump, DrivenKind::Fan,  DrivenKind::Blower,
                                       DrivenKind::Compressor, DrivenKind::Conveyor,        DrivenKind::Other};

} // namespace

const char* drivenKindName(DrivenKind kind) {
    switch (kind) {
    case DrivenKind::None: return "none";
    case DrivenKind::CentrifugalPump: return "centrifugal-pump";
    case DrivenKind::Fan: return "fan";
    case DrivenKind::Blower: return "blower";
    case DrivenKind::Compressor: return "compressor";
    case DrivenKind::Conveyor: return "conveyor";
    case DrivenKind::Other: return "other";
    }
    return "other";
}

std::optional<DrivenKind> drivenKindFromName(std::string_view name) {
    for (const DrivenKind k : kDrivenKinds)
        if (name == drivenKindName(k)) return k;
    return std::nullopt;
}

double synchronousSpeedRpm(double supplyHz, int poles) { return 120.0 * supplyHz / poles; }

std::optional<int> polesOf(const Nameplate& n) {
    if (n.poles && *n.poles >= 2 && *n.poles % 2 == 0) return n.poles;
    if (!(n.supplyHz > 0) || !(n.ratedSpeedRpm > 0)) return std::nullopt;
    const double pairs = std::floor(60.0 * n.supplyHz / n.ratedSpeedRpm);
    // Checked before the conversion: a pole count beyond any motor's would not fit an int either
    // (a supply of 1e100 Hz from a damaged fleet file).
    if (!(pairs >= 1) || pairs > kMaxPoles / 2) return std::nullopt;
    return 2 * static_cast<int>(pairs);
}

std::optional<double> ratedSlip(const Nameplate& n) {
    const auto p = polesOf(n);
    if (!p || !(n.ratedSpeedRpm > 0)) return std::nullopt;
    const double ns = synchronousSpeedRpm(n.supplyHz, *p);
    return (ns - n.ratedSpeedRpm) / ns;
}

BearingFactors factorsFromGeometry(const BearingGeometry& g) {
    const double c = g.elementDiameter / g.pitchDiameter * std::cos(g.contactAngleDeg * std::numbers::pi / 180.0);
    const double n = static_cast<double>(g.rollingElements);
    BearingFactors f;
    f.ftf = 0.5 * (1.0 - c);
    f.bpfo = 0.5 * n * (1.0 - c);
    f.bpfi = 0.5 * n * (1.0 + c);
    f.bsf = g.pitchDiameter / (2.0 * g.elementDiameter) * (1.0 - c * c);
    return f;
}

BearingFactors factorsOf(const Bearing& b) {
    if (const auto* g = std::get_if<BearingGeometry>(&b.data)) return factorsFromGeometry(*g);
    return std::get<BearingFactors>(b.data);
}

std::vector<ValidationIssue> validate(const Nameplate& n) {
    std::vector<ValidationIssue> out;
    const auto bad = [&](const char* field, std::string message) { out.push_back({std::string("nameplate.") + field, std::move(message)}); };
    if (!(n.supplyHz >= 1 && n.supplyHz <= 400)) bad("supply_hz", "supply frequency " + num(n.supplyHz) + " Hz is not between 1 and 400 Hz");
    if (!(n.ratedPowerKw >= 0 && n.ratedPowerKw < 1e5)) bad("rated_power_kw", "rated power " + num(n.ratedPowerKw) + " kW is not plausible");
    if (!(n.ratedVoltageV >= 0 && n.ratedVoltageV < 1e5)) bad("rated_voltage_v", "rated voltage " + num(n.ratedVoltageV) + " V is not plausible");
    if (!(n.ratedCurrentA >= 0 && n.ratedCurrentA < 1e5)) bad("rated_current_a", "rated current " + num(n.ratedCurrentA) + " A is not plausible");
    if (n.poles && (*n.poles < 2 || *n.poles % 2 != 0 || *n.poles > kMaxPoles))
        bad("poles", "a motor has an even number of poles from 2 to " + std::to_string(kMaxPoles) + ", not " + std::to_string(*n.poles));
    if (!(n.ratedSpeedRpm >= 0)) bad("rated_speed_rpm", "rated speed must not be negative");
    if (!n.poles && !(n.ratedSpeedRpm > 0)) bad("rated_speed_rpm", "give the rated speed or the number of poles");
    if (n.ratedSpeedRpm > 0 && n.supplyHz > 0) {
        if (const auto p = polesOf(n)) {
            const double ns = synchronousSpeedRpm(n.supplyHz, *p);
            if (n.ratedSpeedRpm >= ns)
                bad("rated_speed_rpm", "rated speed " + num(n.ratedSpeedRpm) + " r/min is not below the synchronous speed " + num(ns) +
                                           " r/min of a " + std::to_string(*p) + "-pole motor at " + num(n.supplyHz) + " Hz");
            else if ((ns - n.ratedSpeedRpm) / ns > 0.25)
                bad("rated_speed_rpm", "rated speed " + num(n.ratedSpeedRpm) + " r/min means a slip above 25 % for a " + std::to_string(*p) +
                                           "-pole motor at " + num(n.supplyHz) + " Hz (synchronous " + num(ns) + " r/min)");
        } else if (60.0 * n.supplyHz / n.ratedSpeedRpm < 1) {
            bad("rated_speed_rpm", "rated speed " + num(n.ratedSpeedRpm) + " r/min is above the 2-pole synchronous speed at " + num(n.supplyHz) + " Hz");
        } else {
            bad("rated_speed_rpm", "rated speed " + num(n.ratedSpeedRpm) + " r/min at " + num(n.supplyHz) + " Hz would need more than " +
                                       std::to_string(kMaxPoles) + " poles");
        }
    }
    if (n.rotorBars && (*n.rotorBars < 4 || *n.rotorBars > 500)) bad("rotor_bars", "rotor bar count " + std::to_string(*n.rotorBars) + " is not plausible");
    if (n.statorSlots && (*n.statorSlots < 6 || *n.statorSlots > 500)) bad("stator_slots", "stator slot count " + std::to_string(*n.statorSlots) + " is not plausible");
    return out;
}

std::vector<ValidationIssue> validate(const Bearing& b, const std::string& field) {
    std::vector<ValidationIssue> out;
    const auto bad = [&](const char* sub, std::string message) { out.push_back({field + "." + sub, std::move(message)}); };
    if (const auto* g = std::get_if<BearingGeometry>(&b.data)) {
        if (g->rollingElements < 3 || g->rollingElements > 200)
            bad("rolling_elements", "a bearing has 3 to 200 rolling elements, not " + std::to_string(g->rollingElements));
        if (!(g->elementDiameter > 0)) bad("element_diameter", "the rolling-element diameter must be > 0");
        if (!(g->pitchDiameter > 0)) bad("pitch_diameter", "the pitch diameter must be > 0");
        if (g->elementDiameter > 0 && g->pitchDiameter > 0 && g->elementDiameter >= g->pitchDiameter)
            bad("element_diameter", "the rolling-element diameter " + num(g->elementDiameter) + " must be smaller than the pitch diameter " +
                                        num(g->pitchDiameter) + " (same unit)");
        if (!(g->contactAngleDeg >= 0 && g->contactAngleDeg < 90))
            bad("contact_angle_deg", "the contact angle must be from 0 to below 90 degrees, not " + num(g->contactAngleDeg));
    } else {
        const auto& f = std::get<BearingFactors>(b.data);
        if (!(f.ftf > 0 && f.ftf < 0.5)) bad("ftf", "FTF " + num(f.ftf) + " x shaft is outside (0, 0.5): the cage turns slower than half the shaft");
        if (!(f.bpfo > 0) || !(f.bpfi > f.bpfo)) bad("bpfi", "BPFI must exceed BPFO and both be > 0 (got BPFO " + num(f.bpfo) + ", BPFI " + num(f.bpfi) + ")");
        if (!(f.bsf > 0)) bad("bsf", "BSF must be > 0");
    }
    return out;
}

std::vector<ValidationIssue> validate(const Motor& m) {
    std::vector<ValidationIssue> out = validate(m.nameplate);
    if (m.tag.empty()) out.push_back({"tag", "every motor needs a tag"});
    if (m.driveEndBearing) for (auto& i : validate(*m.driveEndBearing, "bearing_de")) out.push_back(std::move(i));
    if (m.nonDriveEndBearing) for (auto& i : validate(*m.nonDriveEndBearing, "bearing_nde")) out.push_back(std::move(i));
    if (m.driven.vanesOrBlades && (*m.driven.vanesOrBlades < 1 || *m.driven.vanesOrBlades > 100))
        out.push_back({"driven.vanes", "vane or blade count " + std::to_string(*m.driven.vanesOrBlades) + " is not plausible"});
    if (!(m.driven.speedRatio > 0 && m.driven.speedRatio < 100))
        out.push_back({"driven.speed_ratio", "the driven machine's speed ratio must be > 0"});
    if (m.severity.standard == SeverityClass::Standard::Iso20816_3 && m.severity.group != 1 && m.severity.group != 2)
        out.push_back({"severity.group", "ISO 20816-3 has machine groups 1 and 2, not " + std::to_string(m.severity.group)});
    if (m.severity.standard == SeverityClass::Standard::Iso10816_1 && (m.severity.iso10816Class < 1 || m.severity.iso10816Class > 4))
        out.push_back({"severity.class", "ISO 10816-1 has classes I to IV"});
    return out;
}

} // namespace humwise::motor
