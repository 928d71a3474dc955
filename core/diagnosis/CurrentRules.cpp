#include "core/diagnosis/CurrentRules.h"

#include "core/diagnosis/SpectralLines.h"

#include <algorithm>
#include <cmath>
#include <cstdio>

namespace humwise::diagnosis {
namespace {

std::string fmt(const char* f, double a, double b = 0, double c = 0) {
    char buf[256];
    std::snprintf(buf, sizeof buf, f, a, b, c);
    return buf;
}

double dbBelow(double reference, double value) { return 20.0 * std::log10(reference / std::max(value, 1e-300)); }

Evidence currentLine(const std::string& label, const LineReading& r, double referenceRms, const std::string& channel) {
    Evidence e;
    e.label = label;
    e.expectedHz = r.expectedHz;
    if (r.found) e.measuredHz = r.measuredHz;
    e.amplitude = -dbBelow(referenceRms, r.amplitude);
    e.unit = "dB re f";
    e.channel = channel;
    return e;
}

Evidence valueEvidence(const std::string& label, double value, const std::string& unit, const std::string& channel,
                       std::optional<double> threshold, const std::string& source) {
    Evidence e;
    e.label = label;
    e.amplitude = value;
    e.unit = unit;
    e.channel = channel;
    e.threshold = threshold;
    e.thresholdSource = source;
    return e;
}

double limitFor(int severity, const SeverityLimits& l) { return severity >= 3 ? l.act : severity == 2 ? l.plan : l.watch; }

} // namespace

double sequenceRatio(const power::SequenceComponents& s) {
    const double p = std::abs(s.positive), n = std::abs(s.negative);
    return std::max(p, n) > 0 ? std::min(p, n) / std::max(p, n) : 0.0;
}

std::vector<Finding> brokenRotorBarRule(const PhaseSetProducts& c, const std::vector<VibrationProducts>& vibration, const RuleContext& ctx) {
    const auto& t = ctx.thresholds;
    const double f = c.line.hz, s = ctx.op.slip(), twoSf = 2 * s * f;
    Finding finding;
    finding.fault = "broken_rotor_bar";
    finding.origin = Origin::Electrical;
    finding.rule = "mcsa.broken_rotor_bar/1";
    const double resolution = c.zoom.enbwHz;
    if (!(twoSf > 4 * resolution)) {
        finding.withheld = true;
        finding.withheldReason = fmt("the sidebands would sit %.3f Hz from f, too close to separate with %.3f Hz of resolution "
                                     "(a longer current record or a higher load is needed)", twoSf, resolution);
    }
    // Sidebands at the slip the operating point gives (+-15 % of 2sf, at least 2 lines).
    const double tol = std::max(2 * c.zoom.resolutionHz, 0.15 * twoSf);
    const auto fundamental = readLine(c.zoom, f, 2 * c.zoom.resolutionHz, 1.0);
    const double ref = fundamental.amplitude;
    const auto lower = readLine(c.zoom, f - twoSf, tol);
    const auto upper = readLine(c.zoom, f + twoSf, tol);
    const double meanDb = 0.5 * (dbBelow(ref, lower.amplitude) + dbBelow(ref, upper.amplitude));
    const int severity = (lower.found || upper.found) ? t.brokenBarDb.severityOf(meanDb) : 0;
    if (!finding.withheld && ctx.loadPercent && *ctx.loadPercent < t.brokenBarMinLoadPercent) {
        finding.withheld = true;
        finding.withheldReason = fmt("the motor ran at about %.0f %% load (slip %.2f %%); below ", *ctx.loadPercent, 100 * s) +
                                 fmt("%.0f %% load the sideband levels do not grade the rotor reliably (", t.brokenBarMinLoadPercent) +
                                 t.brokenBarLoadSource + ")";
    }
    if (!finding.withheld && severity == 0) return {};
    // A withheld verdict is worth saying only where there is something to withhold: sidebands.
    if (finding.withheld && !lower.found && !upper.found) return {};
    finding.severity = finding.withheld ? 0 : severity;
    finding.confidence = finding.withheld ? 0.2 : std::min(0.95, 0.5 + 0.1 * (lower.found + upper.found) + 0.02 * std::max(0.0, 48 - meanDb));
    finding.evidence.push_back(currentLine("supply line f", fundamental, ref, c.name));
    Evidence lo = currentLine("(1 - 2s) f sideband", lower, ref, c.name);
    Evidence up = currentLine("(1 + 2s) f sideband", upper, ref, c.name);
    finding.evidence.push_back(lo);
    finding.evidence.push_back(up);
    finding.evidence.push_back(valueEvidence("mean sideband level below f", meanDb, "dB", c.name,
                                             limitFor(std::max(1, severity), t.brokenBarDb), t.brokenBarDb.source));
    // Fusion: pole-pass sidebands around 1X in vibration.
    for (const auto& ch : vibration) {
        if (ch.input->direction == Direction::Axial) continue;
        const double fr = ctx.op.shaftHz, pp = ctx.op.polePassHz();
        const auto x1 = readLine(ch.velocity, fr, lineTolerance(ch.velocity, fr));
        const auto sbl = readLine(ch.velocity, fr - pp, lineTolerance(ch.velocity, fr));
        const auto sbu = readLine(ch.velocity, fr + pp, lineTolerance(ch.velocity, fr));
        if (x1.found && (sbl.found || sbu.found)) {
            for (const auto* r : {&sbl, &sbu}) {
                if (!r->found) continue;
                Evidence e;
                e.label = r == &sbl ? "1X - pole pass (vibration)" : "1X + pole pass (vibration)";
                e.expectedHz = r->expectedHz;
                e.measuredHz = r->measuredHz;
                e.amplitude = r->amplitude * 1000.0;
                e.unit = "mm/s rms";
                e.channel = ch.label();
                finding.evidence.push_back(e);
            }
            finding.confidence = std::min(0.97, finding.confidence + 0.1);
            break;
        }
    }
    const double bars = ctx.motor.nameplate.rotorBars ? *ctx.motor.nameplate.rotorBars : 0.0;
    // Thomson & Fenger 2001 estimate of the number of broken bars (REFERENCE.md 4.1, from memory (verify)).
    const std::string count = bars > 0 ? fmt(" (about %.1f broken bars by Thomson & Fenger's estimate 2R / (10^(dB/20) + 2p))",
                                             2 * bars / (std::pow(10.0, meanDb / 20.0) + ctx.op.poles)) : std::string();
    finding.explanation = fmt("Sidebands at (1 -+ 2s) f stand on average %.1f dB below the supply line (slip %.2f %%)", meanDb, 100 * s) + count +
                          (finding.withheld ? "; the verdict is withheld." : ": rotor cage damage - cracked or broken bars or end-ring joints.");
    finding.action = finding.withheld ? "Repeat the current measurement at a higher load (at least half load) before judging the rotor."
                     : severity >= 3 ? "Plan a rotor inspection or replacement; confirm with vibration (pole-pass sidebands around 1X)."
                     : severity == 2 ? "Confirm with vibration and shorten the interval; plan an inspection."
                                     : "Trend the sideband level at the same load every round.";
    return {finding};
}

std::vector<Finding> eccentricityRule(const PhaseSetProducts& c, const RuleContext& ctx) {
    const auto& t = ctx.thresholds;
    const double f = c.line.hz, fr = ctx.op.shaftHz;
    const double ref = c.line.rms;
    const auto upper = readLine(c.wide, f + fr, lineTolerance(c.wide, f + fr) + 0.2);
    const bool lowerUsable = f - fr > 2.0;
    const LineReading lower = lowerUsable ? readLine(c.wide, f - fr, lineTolerance(c.wide, f - fr) + 0.2) : LineReading{};
    if (!upper.found && !(lowerUsable && lower.found)) return {};
    const double db = lowerUsable ? 0.5 * (dbBelow(ref, lower.amplitude) + dbBelow(ref, upper.amplitude)) : dbBelow(ref, upper.amplitude);
    const int severity = t.eccentricityDb.severityOf(db);
    if (severity == 0) return {};
    Finding finding;
    finding.fault = "eccentricity";
    finding.severity = severity;
    finding.origin = Origin::Mechanical;
    finding.confidence = (upper.found && lower.found) ? 0.8 : 0.6;
    finding.rule = "mcsa.eccentricity/1";
    if (lowerUsable) finding.evidence.push_back(currentLine("f - fr", lower, ref, c.name));
    finding.evidence.push_back(currentLine("f + fr", upper, ref, c.name));
    finding.evidence.push_back(valueEvidence("mean level of f -+ fr below f", db, "dB", c.name, limitFor(severity, t.eccentricityDb), t.eccentricityDb.source));
    // With the bar count known, the principal slot harmonic's n_d = +-1 neighbours (Nandi, Toliyat
    // & Li 2005; REFERENCE.md 4) point to the dynamic part of the eccentricity.
    int neighbours = 0;
    if (ctx.motor.nameplate.rotorBars) {
        const double r = *ctx.motor.nameplate.rotorBars, p = ctx.op.polePairs(), s = ctx.op.slip();
        for (int nd : {-1, 1}) {
            const double hz = f * ((r + nd) * (1 - s) / p + 1);
            const auto line = readLine(c.wide, hz, lineTolerance(c.wide, hz) + 0.3, 4.0);
            if (!line.found) continue;
            ++neighbours;
            finding.evidence.push_back(currentLine(fmt("slot-harmonic neighbour n_d = %+.0f (dynamic eccentricity)", nd), line, ref, c.name));
        }
    }
    finding.explanation = fmt("Current lines at f -+ fr stand %.1f dB below the supply line: an uneven air gap that turns with the rotor (", db) +
                          (neighbours > 0 ? std::string("dynamic eccentricity, confirmed by the slot-harmonic neighbours")
                                          : std::string("dynamic or mixed eccentricity")) +
                          " - worn bearings, a bent shaft, a rotor off centre). A purely static gap shows instead as 2x line frequency in vibration.";
    finding.action = "Check bearing wear and housing fits, shaft run-out and the air gap; compare with the vibration 1X and 2x line frequency.";
    return {finding};
}

std::vector<Finding> statorWindingRule(const PhaseSetProducts& c, const std::optional<PhaseSetProducts>& voltage, const RuleContext& ctx) {
    if (!c.sequence) return {};
    const auto& t = ctx.thresholds;
    const double ratio = sequenceRatio(*c.sequence);
    int severity = t.negativeSequenceRatio.severityOf(ratio);
    if (severity == 0) return {};
    std::optional<double> vuf;
    if (voltage && voltage->sequence) vuf = sequenceRatio(*voltage->sequence);
    // Supply unbalance explains up to ~10 x its own ratio in the current (REFERENCE.md 6.4, published trade article).
    if (vuf && ratio <= 10.0 * *vuf) return {};
    Finding finding;
    finding.fault = "stator_winding";
    finding.severity = severity;
    finding.origin = Origin::Electrical;
    finding.confidence = vuf ? 0.85 : 0.65;
    finding.rule = "mcsa.stator_winding/1";
    finding.evidence.push_back(valueEvidence("negative / positive sequence current", ratio, "1", c.name, limitFor(severity, t.negativeSequenceRatio),
                                             t.negativeSequenceRatio.source));
    if (vuf) finding.evidence.push_back(valueEvidence("negative / positive sequence voltage", *vuf, "1", voltage->name, std::nullopt, "for contrast"));
    // Shorted-turn components f[(n/p)(1 - s) +- k] (Thomson; Penman et al. 1994) where they stand out.
    const double f = c.line.hz, p = ctx.op.polePairs(), s = ctx.op.slip();
    for (int k : {1, 3}) {
        const double hz = f * ((1.0 / p) * (1 - s) + k);
        const auto r = readLine(c.wide, hz, lineTolerance(c.wide, hz) + 0.2, 4.0);
        if (r.found) finding.evidence.push_back(currentLine(fmt("shorted-turn component f[(1/p)(1-s) + %.0f]", k), r, c.line.rms, c.name));
    }
    finding.explanation = fmt("The phase currents carry %.1f %% negative sequence", 100 * ratio) +
                          (vuf ? fmt(" while the supply voltages carry only %.1f %%", 100 * *vuf) : std::string(" (no voltage recorded to rule out the supply)")) +
                          ": an asymmetry inside the motor, most often shorted turns or a high-resistance connection in one phase.";
    finding.action = "Check the terminal connections for heat and tightness; test the winding (insulation, resistance per phase, surge test) "
                     "at the next stop. Shorted turns can fail fast.";
    return {finding};
}

std::vector<Finding> currentUnbalanceRule(const PhaseSetProducts& c, const std::optional<PhaseSetProducts>& voltage, const RuleContext& ctx) {
    if (!c.unbalancePercent) return {};
    const auto& t = ctx.thresholds;
    const double u = *c.unbalancePercent;
    int severity = t.currentUnbalancePercent.severityOf(u);
    if (severity == 0) return {};
    // A motor's three line currents sum to zero (no neutral): a zero-sequence part means the
    // clamps disagree (different ranges or gains, one on the wrong conductor), and magnitudes
    // from such a set cannot grade the motor beyond watch (common practice (no source)).
    const double zeroRatio = c.sequence && std::abs(c.sequence->positive) > 0 ? std::abs(c.sequence->zero) / std::abs(c.sequence->positive) : 0.0;
    const bool clampsDisagree = zeroRatio > 0.05;
    if (clampsDisagree) severity = 1;
    Finding finding;
    finding.fault = "current_unbalance";
    finding.severity = severity;
    finding.origin = Origin::Electrical;
    finding.confidence = 0.8;
    finding.rule = "mcsa.current_unbalance/1";
    finding.evidence.push_back(valueEvidence("current unbalance (NEMA formula)", u, "%", c.name, limitFor(severity, t.currentUnbalancePercent),
                                             t.currentUnbalancePercent.source));
    for (std::size_t i = 0; i < c.fundamentals.size(); ++i)
        finding.evidence.push_back(valueEvidence(std::string("phase ") + static_cast<char>('A' + i) + " current at f", c.fundamentals[i].magnitude, "A rms", c.name, std::nullopt, ""));
    if (clampsDisagree) {
        finding.evidence.push_back(valueEvidence("zero / positive sequence current (should be ~0 on a motor)", zeroRatio, "1", c.name, 0.05,
                                                 "common practice (no source): consistency of the three clamps"));
        finding.confidence = 0.4;
        finding.explanation = fmt("The phase currents differ by up to %.1f %% from their mean, but they do not sum to zero ", u) +
                              fmt("(zero sequence %.1f %% of positive), which a motor's line currents must: the clamps disagree, so the "
                                  "unbalance may be in the measurement rather than the motor.", 100 * zeroRatio);
        finding.action = "Check that the three clamps share one range and calibration and each encloses one phase conductor; measure again.";
        return {finding};
    }
    const bool supply = voltage && voltage->unbalancePercent && u <= 10.0 * *voltage->unbalancePercent;
    finding.explanation = fmt("The phase currents differ by up to %.1f %% from their mean", u) +
                          (supply ? fmt(", which the %.2f %% supply voltage unbalance explains (current unbalance runs 6-10 x the voltage's).", *voltage->unbalancePercent)
                                  : std::string(": the motor or its connections load the phases unevenly."));
    finding.action = supply ? "Find the cause of the supply unbalance (single-phase loads on the feeder, a failing capacitor bank or tap)."
                            : "Check connections, contactors and fuses phase by phase; test the winding if the supply is balanced.";
    return {finding};
}

std::vector<Finding> bearingInCurrentRule(const PhaseSetProducts& c, const RuleContext& ctx) {
    std::vector<Finding> out;
    const double f = c.line.hz, fr = ctx.op.shaftHz;
    for (const auto& [bearing, where] : {std::pair{&ctx.motor.driveEndBearing, "DE"}, std::pair{&ctx.motor.nonDriveEndBearing, "NDE"}}) {
        if (!*bearing) continue;
        const auto bf = motor::factorsOf(**bearing);
        for (const auto& [name, factor, fault] : {std::tuple{"BPFO", bf.bpfo, "bearing_outer_race"}, std::tuple{"BPFI", bf.bpfi, "bearing_inner_race"}}) {
            const double fv = factor * fr;
            const auto lo = readLine(c.wide, std::abs(f - fv), 0.01 * fv + lineTolerance(c.wide, fv), 6.0);
            const auto hi = readLine(c.wide, f + fv, 0.01 * fv + lineTolerance(c.wide, fv), 6.0);
            if (!(lo.found && hi.found)) continue;
            Finding finding;
            finding.fault = fault;
            finding.severity = 1;
            finding.origin = Origin::Mechanical;
            finding.confidence = 0.4;
            finding.rule = "mcsa.bearing/1";
            finding.evidence.push_back(currentLine(std::string("|f - ") + name + "| (" + where + ")", lo, c.line.rms, c.name));
            finding.evidence.push_back(currentLine(std::string("f + ") + name + " (" + where + ")", hi, c.line.rms, c.name));
            finding.explanation = std::string("Both current lines |f -+ ") + name + "| of the " + where +
                                  " bearing stand out (Schoen et al. 1995): a bearing defect seen through the air gap; weak evidence on its own.";
            finding.action = "Confirm with the envelope spectrum of the bearing's vibration.";
            out.push_back(finding);
        }
    }
    return out;
}

std::vector<Finding> voltageUnbalanceRule(const PhaseSetProducts& v, bool lineToLine, const RuleContext& ctx) {
    if (!v.unbalancePercent || !v.sequence) return {};
    const auto& t = ctx.thresholds;
    const double nema = *v.unbalancePercent;
    const double vuf = 100.0 * sequenceRatio(*v.sequence);
    const int severity = t.voltageUnbalancePercent.severityOf(nema);
    if (severity == 0) return {};
    const double derating = power::nemaDeratingFactor(nema);
    Finding finding;
    finding.fault = "voltage_unbalance";
    finding.severity = severity;
    finding.origin = Origin::Electrical;
    finding.confidence = lineToLine ? 0.9 : 0.75;
    finding.rule = "supply.voltage_unbalance/1";
    finding.evidence.push_back(valueEvidence(lineToLine ? "voltage unbalance, NEMA (line-to-line)" : "phase voltage unbalance, NEMA formula", nema, "%",
                                             v.name, limitFor(severity, t.voltageUnbalancePercent), t.voltageUnbalancePercent.source));
    finding.evidence.push_back(valueEvidence("voltage unbalance factor |V2|/|V1| (IEC)", vuf, "%", v.name, std::nullopt, "IEC/IEEE definition (REFERENCE.md 6.2)"));
    finding.evidence.push_back(valueEvidence("NEMA derating factor", derating, "1", v.name, std::nullopt, "NEMA MG-1 derating curve (REFERENCE.md 6.3)"));
    finding.explanation = fmt("The supply is %.2f %% unbalanced (NEMA; IEC factor %.2f %%): the motor should be derated to %.2f of its rating", nema, vuf, derating) +
                          (power::nemaOperationRecommended(nema) ? std::string(".") : std::string("; above 5 % operation is not recommended."));
    finding.action = "Measure the feeder's three voltages at the supply; spread single-phase loads, check capacitor banks, taps and connections.";
    return {finding};
}

std::vector<Finding> harmonicDistortionRule(const PhaseSetProducts& v, const RuleContext& ctx) {
    if (!v.harmonics) return {};
    const auto& t = ctx.thresholds;
    const double thd = v.harmonics->thdFundamentalPercent;
    if (!std::isfinite(thd)) return {};
    const int severity = t.voltageThdPercent.severityOf(thd);
    if (severity == 0) return {};
    Finding finding;
    finding.fault = "harmonic_distortion";
    finding.severity = severity;
    finding.origin = Origin::Electrical;
    finding.confidence = 0.85;
    finding.rule = "supply.harmonic_distortion/1";
    finding.evidence.push_back(valueEvidence("voltage THD (to the fundamental)", thd, "%", v.name, limitFor(severity, t.voltageThdPercent), t.voltageThdPercent.source));
    for (int h : {5, 7, 11, 13}) {
        if (h - 2 >= static_cast<int>(v.harmonics->harmonicRms.size())) break;
        finding.evidence.push_back(valueEvidence(fmt("harmonic %.0f", h), 100.0 * v.harmonics->harmonicRms[static_cast<std::size_t>(h - 2)] / v.harmonics->fundamentalRms,
                                                 "% of fundamental", v.name, std::nullopt, ""));
    }
    finding.explanation = fmt("The supply voltage carries %.1f %% harmonic distortion: extra heating and torque pulsation in the motor.", thd);
    finding.action = "Find the harmonic sources on the feeder (drives, rectifiers); consider filters; check the motor's temperature.";
    return {finding};
}

} // namespace humwise::diagnosis
