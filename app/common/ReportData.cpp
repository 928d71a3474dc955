#include "app/common/ReportData.h"

#include "app/common/FleetStatus.h"
#include "app/common/LimitRules.h"
#include "app/common/StoredData.h"
#include "core/diagnosis/Thresholds.h"
#include "core/trend/AlarmLimits.h"
#include "core/util/Text.h"

#include <algorithm>
#include <cstdio>
#include <map>
#include <sstream>

namespace humwise::workflow {

const char* const kSafetyCaution =
    "Safety: measuring current and voltage on live motor circuits can kill. Use meters, leads, clamps and current transformers "
    "rated for the measurement category and voltage of the point (motor terminal boxes and MCC feeders are usually CAT III); "
    "fit clamps and voltage taps with the circuit de-energised and locked out where possible; never open a loaded "
    "current-transformer secondary; wear arc-flash protection as the risk assessment requires; keep clear of rotating parts. "
    "Only qualified persons should work on or inside electrical equipment. Local codes, site rules and the electrical safety "
    "programme take precedence over this sheet.";

namespace {

std::string fmt(const char* f, double a, double b = 0, double c = 0) {
    char buf[200];
    std::snprintf(buf, sizeof buf, f, a, b, c);
    return buf;
}

double daysOf(const std::string& iso) {
    const auto t = text::parseIsoTime(iso);
    return t ? std::chrono::duration<double>(t->time_since_epoch()).count() / 86400.0 : 0.0;
}

std::string csvField(const std::string& s) {
    if (s.find_first_of(",\"\n") == std::string::npos) return s;
    std::string out = "\"";
    for (char c : s) out += c == '"' ? std::string("\"\"") : std::string(1, c);
    return out + "\"";
}

// The indicator that follows a fault, and at which point.
std::pair<std::string, std::string> trendIndicatorFor(const diagnosis::Finding& f) {
    std::string point;
    for (const auto& e : f.evidence)
        if (!e.channel.empty()) {
            point = e.channel;
            break;
        }
    if (f.fault == "bearing_outer_race") return {point, "env_bpfo"};
    if (f.fault == "bearing_inner_race") return {point, "env_bpfi"};
    if (f.fault == "bearing_rolling_element") return {point, "env_2bsf"};
    if (f.fault == "broken_rotor_bar") return {"", "sideband_db"};
    if (f.fault == "stator_winding") return {"", "negative_sequence_ratio"};
    if (f.fault == "current_unbalance") return {"", "current_unbalance"};
    if (f.fault == "voltage_unbalance") return {"", "voltage_unbalance"};
    if (f.fault == "harmonic_distortion") return {"", "voltage_thd"};
    if (f.fault == "electrical_2lf") return {point, "2lf"};
    if (f.fault == "unbalance") return {point, "1x"};
    if (f.fault == "misalignment" || f.fault == "looseness" || f.fault == "iso_zone") return {point, "velocity_rms"};
    return {point, "velocity_rms"};
}

std::string kindOf(const diagnosis::Evidence& e) {
    if (e.unit.find("envelope") != std::string::npos) return "envelope";
    if (e.unit == "mm/s rms") return "velocity";
    if (e.unit == "dB re f") return e.label.find("(1 ") != std::string::npos || e.label.find("supply") != std::string::npos ? "zoom" : "current";
    return {};
}

std::optional<SpectrumPanel> spectrumFor(storage::FleetStore& store, std::int64_t roundId, const std::string& tag, const diagnosis::Finding& f) {
    std::string point, kind;
    std::vector<PlotMarker> markers;
    for (const auto& e : f.evidence) {
        const std::string k = kindOf(e);
        if (k.empty() || e.channel.empty()) continue;
        if (kind.empty()) {
            kind = k;
            point = e.channel;
        }
        if (k == kind && e.channel == point && (e.measuredHz || e.expectedHz)) markers.push_back({e.label, e.measuredHz.value_or(*e.expectedHz)});
    }
    if (kind.empty()) return std::nullopt;
    const auto rec = recordingOf(store, roundId, tag, point);
    if (!rec) return std::nullopt;
    const auto s = storedSpectrum(store, rec->id, kind);
    if (!s) return std::nullopt;
    SpectrumPanel p;
    p.title = f.fault + ": " + (kind == "velocity" ? "vibration" : kind) + " spectrum, " + point;
    double lo = s->startHz, hi = s->frequencyHz(s->lineCount() - 1);
    if (!markers.empty()) {
        double mlo = markers.front().x, mhi = markers.front().x;
        for (const auto& m : markers) {
            mlo = std::min(mlo, m.x);
            mhi = std::max(mhi, m.x);
        }
        const double margin = std::max(0.3 * (mhi - mlo), kind == "zoom" ? 1.0 : 0.2 * mhi);
        lo = std::max(lo, mlo - margin);
        hi = std::min(hi, mhi + margin);
    }
    const double k = kind == "velocity" ? 1000.0 : kind == "envelope" ? 1.0 / (kStandardGravity * kStandardGravity) : 1.0;
    p.unit = kind == "velocity" ? "mm/s rms" : kind == "envelope" ? "g^2 (squared envelope)" : "A rms";
    p.logarithmic = kind == "zoom" || kind == "current";
    for (std::size_t i = 0; i < s->lineCount(); ++i) {
        const double hz = s->frequencyHz(i);
        if (hz < lo || hz > hi) continue;
        p.hz.push_back(hz);
        p.values.push_back(s->values[i] * k);
    }
    p.markers = markers;
    return p;
}

} // namespace

MotorSheet buildMotorSheet(storage::FleetStore& store, const std::string& tag, std::int64_t roundId, const std::string& comment) {
    const auto fleet = store.loadFleet();
    const auto* def = fleet.motor(tag);
    if (!def) throw storage::StorageException{{storage::StorageError::Code::NotFound, "no motor '" + tag + "'", 0}};
    const auto round = store.round(roundId);
    if (!round) throw storage::StorageException{{storage::StorageError::Code::NotFound, "no round " + std::to_string(roundId), 0}};
    MotorSheet s;
    s.site = fleet.site;
    s.area = def->area;
    s.tag = tag;
    s.description = def->description;
    s.comment = comment;
    s.roundStart = round->startedAt;
    s.technician = round->technician;
    const auto& n = def->motor.nameplate;
    s.nameplate = {{"rated power", fmt("%.1f kW", n.ratedPowerKw)},
                   {"voltage / current", fmt("%.0f V / %.1f A", n.ratedVoltageV, n.ratedCurrentA)},
                   {"supply", fmt("%.0f Hz, ", n.supplyHz) + (n.drive == motor::DriveKind::DirectOnLine ? "direct on line" : "drive-fed")},
                   {"rated speed", fmt("%.0f r/min", n.ratedSpeedRpm) + (n.poles ? fmt(", %.0f poles", *n.poles) : std::string())}};
    if (n.rotorBars) s.nameplate.push_back({"rotor bars", fmt("%.0f", *n.rotorBars)});
    if (const auto op = operatingPoint(store, roundId, tag))
        s.operatingPoint = fmt("%.1f r/min (", op->speedRpm) + op->speedMethod + fmt("), supply %.3f Hz", op->lineHz) +
                           (op->loadPercent ? fmt(", load about %.0f %%", *op->loadPercent) : std::string());
    s.findings = store.findings(roundId, tag);
    std::stable_sort(s.findings.begin(), s.findings.end(), [](const auto& a, const auto& b) { return a.finding.severity > b.finding.severity; });
    for (const auto& f : s.findings) s.worstSeverity = std::max(s.worstSeverity, f.finding.severity);
    for (const auto& r : store.recordings(roundId))
        if (r.motorTag == tag && !r.quality.empty()) s.flaggedData.push_back(r.pointName + ": " + r.quality);

    // The previous round of this motor and how each fault moved.
    const auto rounds = store.rounds();
    std::optional<std::int64_t> previous;
    for (const auto& r : rounds) {
        if (r.id == roundId) break;
        if (operatingPoint(store, r.id, tag)) {
            previous = r.id;
            s.previousRoundStart = r.startedAt;
        }
    }
    std::map<std::string, int> before;
    if (previous)
        for (const auto& f : store.findings(*previous, tag)) before[f.finding.fault] = f.finding.severity;
    for (const auto& f : s.findings) {
        SeverityChange c{f.finding.fault, std::nullopt, f.finding.severity};
        if (before.count(f.finding.fault)) c.before = before[f.finding.fault];
        s.changes.push_back(c);
        if (f.finding.fault == "iso_zone" && !f.finding.evidence.empty()) {
            const auto& e = f.finding.evidence.front();
            const auto zone = diagnosis::zoneBoundaries(def->motor.severity);
            s.isoZone = std::string("zone ") + zone.zoneOf(e.amplitude) + fmt(": %.2f mm/s r.m.s. at ", e.amplitude) + e.channel + " (" + zone.source + ")";
        }
    }
    // Key spectra and trends of the findings that matter (severity >= 1), at most three of each.
    for (const auto& f : s.findings) {
        if (f.finding.severity < 1 || s.spectra.size() >= 3) continue;
        if (auto p = spectrumFor(store, roundId, tag, f.finding)) s.spectra.push_back(std::move(*p));
    }
    for (const auto& f : s.findings) {
        if (s.trends.size() >= 3 || (f.finding.severity < 1 && !s.trends.empty())) continue;
        const auto [point, indicator] = trendIndicatorFor(f.finding);
        std::vector<storage::TrendPoint> pts;
        try {
            pts = store.trend(tag, point, indicator);
        } catch (const storage::StorageException&) {
            continue;
        }
        if (pts.empty()) continue;
        if (std::any_of(s.trends.begin(), s.trends.end(), [&](const TrendPanel& t) { return t.title == indicator + " " + point; })) continue;
        TrendPanel t;
        t.title = indicator + " " + point;
        t.unit = pts.front().unit;
        for (const auto& p : pts) {
            if (p.startedAt > round->startedAt) break;
            t.days.push_back(daysOf(p.startedAt));
            t.values.push_back(p.value);
        }
        const auto limits = effectiveLimits(store, *def, point, indicator, t.values);
        t.alert = limits.alert;
        t.alarm = limits.alarm;
        t.limitSource = limits.method.empty() ? limits.source : limits.method + ": " + limits.source;
        if (t.alarm && t.days.size() >= 3) {
            const auto recent = static_cast<std::ptrdiff_t>(std::min<std::size_t>(4, t.days.size()));
            const std::vector<double> d(t.days.end() - recent, t.days.end()), v(t.values.end() - recent, t.values.end());
            if (const auto p = trend::project(d, v, *t.alarm, trend::Model::Linear)) t.crossingDay = p->crossingDay;
            t.model = "linear least-squares fit of the last 4 rounds";
        }
        s.trends.push_back(std::move(t));
    }
    return s;
}

RouteSummary buildRouteSummary(storage::FleetStore& store, std::int64_t roundId) {
    const auto round = store.round(roundId);
    if (!round) throw storage::StorageException{{storage::StorageError::Code::NotFound, "no round " + std::to_string(roundId), 0}};
    RouteSummary out;
    out.site = store.loadFleet().site;
    out.roundStart = round->startedAt;
    out.technician = round->technician;
    out.route = round->route.value_or("");
    for (const auto& st : fleetStatus(store, roundId)) {
        RouteRow r;
        r.tag = st.tag;
        r.area = st.area;
        r.description = st.description;
        r.measured = st.measuredInLatestRound;
        r.worstSeverity = r.measured ? st.worstSeverity : -1;
        r.change = r.measured ? st.changeSummary() : "not measured in this round";
        r.flagged = st.flaggedPoints;
        if (r.measured)
            for (const auto& f : st.findings)
                if (f.finding.severity >= 1 || f.finding.withheld)
                    r.faults.push_back(f.finding.fault + " (" + std::string(diagnosis::severityName(f.finding.severity)) + (f.finding.withheld ? ", withheld" : "") + ")");
        out.rows.push_back(std::move(r));
    }
    std::stable_sort(out.rows.begin(), out.rows.end(), [](const RouteRow& a, const RouteRow& b) { return a.worstSeverity > b.worstSeverity; });
    return out;
}

std::string findingsCsv(storage::FleetStore& store, std::int64_t roundId) {
    std::ostringstream out;
    out << "round_start,motor,fault,severity,severity_name,withheld,origin,confidence,rule,evidence,explanation,action\n";
    for (const auto& r : store.findings(roundId)) {
        const auto& f = r.finding;
        std::string evidence;
        for (const auto& e : f.evidence) {
            if (!evidence.empty()) evidence += "; ";
            evidence += e.label + (e.measuredHz ? fmt(" @ %.3f Hz", *e.measuredHz) : std::string()) + fmt(" = %.4g ", e.amplitude) + e.unit;
        }
        out << csvField(r.roundStartedAt) << ',' << csvField(r.motorTag) << ',' << f.fault << ',' << f.severity << ',' << csvField(std::string(diagnosis::severityName(f.severity)))
            << ',' << (f.withheld ? 1 : 0) << ',' << diagnosis::originName(f.origin) << ',' << fmt("%.2f", f.confidence) << ',' << csvField(f.rule) << ','
            << csvField(evidence) << ',' << csvField(f.explanation) << ',' << csvField(f.action) << '\n';
    }
    return out.str();
}

std::string indicatorsCsv(storage::FleetStore& store, std::int64_t roundId) {
    std::ostringstream out;
    out << "round_start,motor,point,indicator,value,unit\n";
    const auto round = store.round(roundId);
    for (const auto& m : store.loadFleet().motors)
        for (const auto& i : store.indicators(roundId, m.motor.tag))
            out << csvField(round ? round->startedAt : "") << ',' << csvField(m.motor.tag) << ',' << csvField(i.pointName) << ',' << csvField(i.name) << ','
                << fmt("%.9g", i.value) << ',' << csvField(i.unit) << '\n';
    return out.str();
}

std::string trendCsv(const std::vector<storage::TrendPoint>& points) {
    std::ostringstream out;
    out << "round_start,value,unit\n";
    for (const auto& p : points) out << csvField(p.startedAt) << ',' << fmt("%.9g", p.value) << ',' << csvField(p.unit) << '\n';
    return out.str();
}

} // namespace humwise::workflow
