#include "core/diagnosis/VibrationRules.h"

#include "core/diagnosis/SpectralLines.h"

#include <algorithm>
#include <cmath>
#include <cstdio>
#include <map>

namespace humwise::diagnosis {
namespace {

constexpr double kMmPerM = 1000.0;

std::string fmt(const char* f, double a, double b = 0, double c = 0) {
    char buf[256];
    std::snprintf(buf, sizeof buf, f, a, b, c);
    return buf;
}

bool isRadial(const VibrationProducts& p) { return p.input->direction != Direction::Axial; }

Evidence lineEvidence(const std::string& label, const LineReading& r, const VibrationProducts& ch, double scale, const std::string& unit) {
    Evidence e;
    e.label = label;
    e.expectedHz = r.expectedHz;
    if (r.found) e.measuredHz = r.measuredHz;
    e.amplitude = r.amplitude * scale;
    e.unit = unit;
    e.channel = ch.label();
    return e;
}

LineReading velocityLine(const VibrationProducts& ch, double f) { return readLine(ch.velocity, f, lineTolerance(ch.velocity, f)); }

// The radial channel with the largest 1X velocity.
const VibrationProducts* strongestRadial1X(const Channels& channels, const RuleContext& ctx, LineReading& oneX) {
    const VibrationProducts* best = nullptr;
    for (const auto& ch : channels) {
        if (!isRadial(ch)) continue;
        const auto r = velocityLine(ch, ctx.op.shaftHz);
        if (!best || r.amplitude > oneX.amplitude) {
            best = &ch;
            oneX = r;
        }
    }
    return best;
}

const VibrationProducts* axialAt(const Channels& channels, Location where) {
    for (const auto& ch : channels)
        if (ch.input->direction == Direction::Axial && ch.input->location == where) return &ch;
    return nullptr;
}

Evidence zoneEvidence(const std::string& label, double mmps, const RuleContext& ctx, double threshold, const std::string& channel) {
    Evidence e;
    e.label = label;
    e.amplitude = mmps;
    e.unit = "mm/s rms";
    e.channel = channel;
    e.threshold = threshold;
    e.thresholdSource = ctx.zones.source;
    return e;
}

double gradeThreshold(int severity, const RuleContext& ctx) {
    return severity >= 3 ? ctx.zones.cd : severity == 2 ? ctx.zones.bc : ctx.zones.ab;
}

} // namespace

std::vector<Finding> isoZoneRule(const Channels& channels, const RuleContext& ctx) {
    const VibrationProducts* worst = nullptr;
    for (const auto& ch : channels)
        if (isRadial(ch) && (!worst || ch.overallVelocityRms > worst->overallVelocityRms)) worst = &ch;
    if (!worst) return {};
    const double v = worst->overallVelocityRms * kMmPerM;
    const char zone = ctx.zones.zoneOf(v);
    Finding f;
    f.fault = "iso_zone";
    f.severity = zone == 'D' ? 3 : zone == 'C' ? 2 : 0;
    f.origin = Origin::Unknown;
    f.confidence = 0.9;
    f.rule = "vib.iso_zone/1";
    Evidence e = zoneEvidence(fmt("overall velocity %.0f-%.0f Hz", worst->isoBandLowHz, worst->isoBandHighHz), v, ctx,
                              zone == 'A' ? ctx.zones.ab : zone == 'B' ? ctx.zones.bc : ctx.zones.cd, worst->label());
    f.evidence.push_back(e);
    f.explanation = fmt("Overall vibration %.2f mm/s r.m.s. on the worst radial point lies in zone ", v) + zone + " (boundaries " +
                    fmt("%.2g / %.2g / %.2g mm/s, ", ctx.zones.ab, ctx.zones.bc, ctx.zones.cd) + ctx.zones.source + ").";
    f.action = zone == 'D'   ? "Vibration at this level may damage the machine: reduce load or stop, and find the cause now."
               : zone == 'C' ? "Not acceptable for long-term operation: plan corrective work at the next opportunity."
                             : "Acceptable for continued operation; keep the route interval.";
    return {f};
}

std::vector<Finding> unbalanceRule(const Channels& channels, const RuleContext& ctx) {
    LineReading oneX;
    const VibrationProducts* ch = strongestRadial1X(channels, ctx, oneX);
    if (!ch || !oneX.found) return {};
    const double a1 = oneX.amplitude * kMmPerM;
    const double share = (oneX.amplitude * oneX.amplitude) / std::max(1e-30, ch->overallVelocityRms * ch->overallVelocityRms);
    const auto twoX = velocityLine(*ch, 2 * ctx.op.shaftHz);
    const double ratio2 = twoX.amplitude / oneX.amplitude;
    const auto* axial = axialAt(channels, ch->input->location);
    const double axialRatio = axial ? velocityLine(*axial, ctx.op.shaftHz).amplitude / oneX.amplitude : 0.0;
    const auto& t = ctx.thresholds;
    if (share < t.unbalanceMinShareOf1X || ratio2 > t.unbalanceMax2XTo1X || axialRatio >= t.misalignmentMinAxialToRadial) return {};
    const int severity = ctx.componentSeverity(a1);
    if (severity == 0) return {};
    Finding f;
    f.fault = "unbalance";
    f.severity = severity;
    f.origin = Origin::Mechanical;
    f.confidence = std::clamp(0.5 + 0.5 * (share - t.unbalanceMinShareOf1X) / (1 - t.unbalanceMinShareOf1X), 0.5, 0.95);
    f.rule = "vib.unbalance/1";
    Evidence e = lineEvidence("1X running speed", oneX, *ch, kMmPerM, "mm/s rms");
    e.threshold = gradeThreshold(severity, ctx);
    e.thresholdSource = ctx.zones.source + " boundary applied to the 1X component (common practice)";
    f.evidence.push_back(e);
    f.evidence.push_back(lineEvidence("2X running speed", twoX, *ch, kMmPerM, "mm/s rms"));
    f.explanation = fmt("1X carries %.0f %% of the vibration energy at ", 100 * share) + ch->label() +
                    fmt(" (%.2f mm/s), 2X is %.0f %% of 1X", a1, 100 * ratio2) +
                    (axial ? fmt(" and axial 1X only %.0f %% of radial", 100 * axialRatio) : std::string()) +
                    ": the pattern of a heavy spot on the rotor.";
    f.action = "Check for build-up, wear or a lost balance weight on the rotor or impeller; balance in place.";
    return {f};
}

std::vector<Finding> misalignmentRule(const Channels& channels, const RuleContext& ctx) {
    LineReading oneX;
    const VibrationProducts* ch = strongestRadial1X(channels, ctx, oneX);
    if (!ch || oneX.amplitude <= 0) return {};
    const auto& t = ctx.thresholds;
    const auto twoX = velocityLine(*ch, 2 * ctx.op.shaftHz);
    const double ratio2 = twoX.found ? twoX.amplitude / oneX.amplitude : 0.0;
    const auto* axial = axialAt(channels, ch->input->location);
    LineReading axial1X;
    double axialRatio = 0;
    if (axial) {
        axial1X = velocityLine(*axial, ctx.op.shaftHz);
        axialRatio = axial1X.found ? axial1X.amplitude / oneX.amplitude : 0.0;
    }
    const bool parallel = ratio2 >= t.misalignmentMin2XTo1X;
    const bool angular = axialRatio >= t.misalignmentMinAxialToRadial;
    if (!parallel && !angular) return {};
    const double worst = std::max(parallel ? twoX.amplitude : 0.0, angular ? axial1X.amplitude : 0.0) * kMmPerM;
    const int severity = ctx.componentSeverity(worst);
    if (severity == 0) return {};
    Finding f;
    f.fault = "misalignment";
    f.severity = severity;
    f.origin = Origin::Mechanical;
    f.confidence = (parallel && angular) ? 0.85 : 0.7;
    f.rule = "vib.misalignment/1";
    f.evidence.push_back(lineEvidence("1X running speed (radial)", oneX, *ch, kMmPerM, "mm/s rms"));
    Evidence e2 = lineEvidence("2X running speed (radial)", twoX, *ch, kMmPerM, "mm/s rms");
    if (parallel) {
        e2.threshold = t.misalignmentMin2XTo1X * oneX.amplitude * kMmPerM;
        e2.thresholdSource = t.patternSource;
    }
    f.evidence.push_back(e2);
    if (axial) {
        Evidence ea = lineEvidence("1X running speed (axial)", axial1X, *axial, kMmPerM, "mm/s rms");
        if (angular) {
            ea.threshold = t.misalignmentMinAxialToRadial * oneX.amplitude * kMmPerM;
            ea.thresholdSource = t.patternSource;
        }
        f.evidence.push_back(ea);
    }
    const std::string kind = parallel && angular ? "angular and parallel (offset)" : angular ? "angular" : "parallel (offset)";
    f.explanation = "Likely " + kind + " misalignment: " +
                    (parallel ? fmt("radial 2X is %.0f %% of 1X", 100 * ratio2) : std::string()) + (parallel && angular ? "; " : "") +
                    (angular ? fmt("axial 1X is %.0f %% of radial 1X", 100 * axialRatio) : std::string()) + fmt(" (%.2f mm/s).", worst);
    f.action = "Check shaft alignment across the coupling (and soft foot, pipe strain); realign to the coupling tolerances.";
    return {f};
}

std::vector<Finding> loosenessRule(const Channels& channels, const RuleContext& ctx) {
    const auto& t = ctx.thresholds;
    std::vector<Finding> out;
    const VibrationProducts* bestCh = nullptr;
    int bestCount = 0, bestHalf = 0;
    double bestFamilyMs = 0;
    std::vector<LineReading> bestLines;
    for (const auto& ch : channels) {
        if (!isRadial(ch)) continue;
        const auto oneX = velocityLine(ch, ctx.op.shaftHz);
        if (!oneX.found) continue;
        int harmonics = 0, halves = 0;
        double familyMs = 0;
        std::vector<LineReading> lines;
        for (int n = 2; n <= 10; ++n) {
            const auto r = velocityLine(ch, n * ctx.op.shaftHz);
            if (r.found && r.amplitude >= t.loosenessMinHarmonicTo1X * oneX.amplitude) {
                ++harmonics;
                familyMs += r.amplitude * r.amplitude;
                lines.push_back(r);
            }
        }
        for (double h : {0.5, 1.5, 2.5, 3.5}) {
            const auto r = velocityLine(ch, h * ctx.op.shaftHz);
            if (r.found && r.amplitude >= t.loosenessMinHalfOrderTo1X * oneX.amplitude) {
                ++halves;
                familyMs += r.amplitude * r.amplitude;
                lines.push_back(r);
            }
        }
        if ((harmonics >= t.loosenessMinHarmonics || halves >= 2) && familyMs > bestFamilyMs) {
            bestCh = &ch;
            bestCount = harmonics;
            bestHalf = halves;
            bestFamilyMs = familyMs;
            bestLines = lines;
        }
    }
    if (!bestCh) return out;
    const double family = std::sqrt(bestFamilyMs) * kMmPerM;
    const int severity = ctx.componentSeverity(family);
    if (severity == 0) return out;
    Finding f;
    f.fault = "looseness";
    f.severity = severity;
    f.origin = Origin::Mechanical;
    f.confidence = std::min(0.9, 0.5 + 0.05 * (bestCount + 2 * bestHalf));
    f.rule = "vib.looseness/1";
    for (const auto& r : bestLines) {
        const double order = r.expectedHz / ctx.op.shaftHz;
        f.evidence.push_back(lineEvidence(fmt(std::fabs(order - std::round(order)) > 0.1 ? "%.1fX" : "%.0fX", order), r, *bestCh, kMmPerM, "mm/s rms"));
    }
    Evidence e = zoneEvidence("r.m.s. of the harmonic family", family, ctx, gradeThreshold(severity, ctx), bestCh->label());
    e.thresholdSource += " boundary applied to the family (common practice)";
    f.evidence.push_back(e);
    f.explanation = fmt("%.0f harmonics of running speed above 20 %% of 1X and %.0f half-order lines at ", bestCount, bestHalf) +
                    bestCh->label() + ": the pattern of mechanical looseness (a loose fit, base or bolt).";
    f.action = "Inspect hold-down bolts, the base and grout, bearing fits in the housing and the coupling; tighten and re-measure.";
    out.push_back(f);
    return out;
}

// A bearing finding with the line it rests on, so that the two ends can be compared.
struct BearingCandidate {
    Finding finding;
    double amplitude = 0;     // fundamental, squared-envelope units
    double fundamentalHz = 0;
    const char* name = "";
    Location where = Location::DriveEnd;
    const VibrationProducts* channel = nullptr; // where the fundamental was read
};

bool sameLine(const BearingCandidate& a, const BearingCandidate& b) {
    return a.where != b.where && a.finding.fault == b.finding.fault && std::abs(a.fundamentalHz - b.fundamentalHz) <= 0.005 * a.fundamentalHz;
}

// The two channels' envelope line amplitudes at a's line, both demodulated in the wider of the
// two bands their kurtograms chose: amplitudes from different bands do not compare (a narrow
// band passes less of the impacts' energy).
std::pair<double, double> amplitudesInOneBand(const BearingCandidate& a, const BearingCandidate& b) {
    const auto& ea = *a.channel->envelope;
    const auto& eb = *b.channel->envelope;
    const auto& band = (ea.bandHighHz - ea.bandLowHz) >= (eb.bandHighHz - eb.bandLowHz) ? ea : eb;
    const double fmax = ea.spectrum.frequencyHz(ea.spectrum.lineCount() - 1);
    const auto read = [&](const BearingCandidate& c) {
        const auto env = envelopeInBand(*c.channel->input, fmax, band.bandLowHz, band.bandHighHz);
        return env ? readLine(env->spectrum, a.fundamentalHz, 2 * lineTolerance(env->spectrum, a.fundamentalHz), 0.0).amplitude : 0.0;
    };
    return {read(a), read(b)};
}

// Twin bearings (or any two whose defect lines coincide) put one defect on both ends' lines: it
// reaches the far sensor through the frame, weaker. The same family on the same line at both
// ends is one defect, placed at the end whose sensor reads it louder in a common band; the far
// end is named in the explanation (common practice (no source): the sensor nearest the defect
// reads it loudest).
std::vector<Finding> placeDefectsAtTheirEnd(std::vector<BearingCandidate> candidates) {
    std::vector<bool> farEnd(candidates.size(), false);
    std::vector<std::string> notes(candidates.size());
    for (std::size_t i = 0; i < candidates.size(); ++i)
        for (std::size_t j = i + 1; j < candidates.size(); ++j) {
            if (!sameLine(candidates[i], candidates[j])) continue;
            const auto [ai, aj] = amplitudesInOneBand(candidates[i], candidates[j]);
            const std::size_t near = aj > ai ? j : i, far = near == i ? j : i;
            const double ratio = std::max(ai, aj) > 0 ? std::min(ai, aj) / std::max(ai, aj) : 1.0;
            farEnd[far] = true;
            notes[near] += std::string(" The line is also at the ") + (candidates[far].where == Location::DriveEnd ? "DE" : "NDE") +
                           fmt(" sensor, at %.0f %% of this amplitude in the same band: heard through the frame.", 100 * ratio);
        }
    std::vector<Finding> out;
    for (std::size_t i = 0; i < candidates.size(); ++i) {
        if (farEnd[i]) continue;
        out.push_back(std::move(candidates[i].finding));
        out.back().explanation += notes[i];
    }
    return out;
}

std::vector<Finding> bearingRules(const Channels& channels, const RuleContext& ctx) {
    std::vector<BearingCandidate> placed;
    const auto& t = ctx.thresholds;
    const double fr = ctx.op.shaftHz;
    struct Defect { const char* fault; const char* name; double factor; const char* sidebandName; double sidebandHz; const char* component; };
    for (const auto& [bearing, where] : {std::pair{&ctx.motor.driveEndBearing, Location::DriveEnd},
                                         std::pair{&ctx.motor.nonDriveEndBearing, Location::NonDriveEnd}}) {
        if (!*bearing) continue;
        const motor::BearingFactors bf = motor::factorsOf(**bearing);
        const Defect defects[] = {
            {"bearing_outer_race", "BPFO", bf.bpfo, nullptr, 0, "outer race"},
            {"bearing_inner_race", "BPFI", bf.bpfi, "1X", fr, "inner race"},
            {"bearing_rolling_element", "2xBSF", 2 * bf.bsf, "FTF", bf.ftf * fr, "rolling element"},
            {"bearing_cage", "FTF", bf.ftf, nullptr, 0, "cage"},
        };
        using Candidate = BearingCandidate;
        std::vector<Candidate> candidates;
        for (const Defect& d : defects) {
            const double f0 = d.factor * fr;
            Finding best;
            double bestProminence = 0, bestAmplitude = 0, bestHz = 0;
            const VibrationProducts* bestChannel = nullptr;
            for (const auto& ch : channels) {
                if (ch.input->location != where || !ch.envelope) continue;
                const auto& env = ch.envelope->spectrum;
                // A line on a running-speed harmonic belongs to the shaft, unless it sits closer to
                // the defect line it was sought for (BPFI of 8-ball bearings falls near 5X).
                // Half orders count too: looseness puts lines at every 0.5X.
                const auto isShaftHarmonic = [&](double hz, double expected) {
                    const double n = std::round(2.0 * hz / fr) / 2.0;
                    return n >= 0.5 && std::abs(hz - n * fr) < 0.003 * hz + env.resolutionHz && std::abs(hz - n * fr) < std::abs(hz - expected);
                };
                const auto fundamental = readLine(env, f0, t.bearingTolerance * f0, 2.0);
                if (!fundamental.found || isShaftHarmonic(fundamental.measuredHz, f0)) continue;
                if (fundamental.prominence < t.bearingProminence.watch || fundamental.prominence <= bestProminence) continue;
                // Harmonics, at the measured spacing (real lines sit a little off the kinematic ones).
                std::vector<LineReading> harmonics;
                for (int h = 2; h <= 3; ++h) {
                    const auto r = readLine(env, h * fundamental.measuredHz, t.bearingTolerance * f0, 3.0);
                    if (r.found && !isShaftHarmonic(r.measuredHz, h * f0)) harmonics.push_back(r);
                }
                std::vector<LineReading> sidebands;
                if (d.sidebandName)
                    for (double sign : {-1.0, 1.0}) {
                        const auto r = readLine(env, fundamental.measuredHz + sign * d.sidebandHz, 2 * lineTolerance(env, d.sidebandHz), 3.0);
                        if (r.found) sidebands.push_back(r);
                    }
                // In velocity too? Then the defect has grown past the earliest stage.
                auto inVelocity = readLine(ch.velocity, fundamental.measuredHz, 2 * lineTolerance(ch.velocity, f0), 4.0);
                // A line too small to matter in velocity does not count as the advanced stage.
                if (inVelocity.amplitude * kMmPerM < 0.05 * ctx.zones.ab) inVelocity.found = false;
                // Stages (common practice): a defect seen in the envelope only is at most "plan
                // repair" - watch when it just stands out, plan when it is strong or has grown
                // harmonics; "act now" needs it visible in the velocity spectrum as well.
                int severity = std::min(2, t.bearingProminence.severityOf(fundamental.prominence));
                if (static_cast<int>(harmonics.size()) >= t.bearingPlanHarmonics && fundamental.prominence >= t.bearingProminence.plan)
                    severity = 2;
                if (inVelocity.found) severity = severity >= 2 ? 3 : 2;
                const int stage = inVelocity.found ? 3 : (harmonics.empty() ? 1 : 2);

                Finding f;
                f.fault = d.fault;
                f.severity = severity;
                f.origin = Origin::Mechanical;
                f.confidence = std::min(0.95, 0.4 + 0.1 * static_cast<double>(harmonics.size() + sidebands.size()) +
                                                  0.3 * (1 - 1 / fundamental.prominence));
                f.rule = "vib.bearing/1";
                const std::string w = where == Location::DriveEnd ? "DE" : "NDE";
                const double gscale = 1.0 / (kStandardGravity * kStandardGravity); // squared envelope, (m/s^2)^2 -> g^2
                Evidence e = lineEvidence(std::string(d.name) + " (" + w + ") x1", fundamental, ch, gscale, "g^2 (squared envelope)");
                e.threshold = t.bearingProminence.watch;
                e.thresholdSource = "prominence over the local floor: " + t.bearingProminence.source;
                f.evidence.push_back(e);
                for (std::size_t i = 0; i < harmonics.size(); ++i)
                    f.evidence.push_back(lineEvidence(std::string(d.name) + " (" + w + ") x" + std::to_string(i + 2), harmonics[i], ch, gscale, "g^2 (squared envelope)"));
                for (const auto& sb : sidebands)
                    f.evidence.push_back(lineEvidence(std::string(d.name) + (sb.expectedHz < fundamental.measuredHz ? " - " : " + ") + d.sidebandName + " sideband",
                                                      sb, ch, gscale, "g^2 (squared envelope)"));
                if (inVelocity.found) f.evidence.push_back(lineEvidence(std::string(d.name) + " in the velocity spectrum", inVelocity, ch, kMmPerM, "mm/s rms"));
                f.explanation = std::string(d.name) + " of the " + w + " bearing (" + d.component + fmt(") stands %.1f times above the envelope floor", fundamental.prominence) +
                                fmt(" with %.0f harmonic(s)", static_cast<double>(harmonics.size())) +
                                (sidebands.empty() ? std::string() : fmt(" and %.0f sideband(s) of ", static_cast<double>(sidebands.size())) + d.sidebandName) +
                                fmt("; stage %.0f of 4 (", stage) +
                                (stage == 1 ? "envelope only, early" : stage == 2 ? "envelope with harmonics" : "visible in velocity too, advanced") + ").";
                f.action = stage >= 3 ? "Plan the bearing change soon; check lubrication and shorten the interval until then."
                                      : "Check lubrication; shorten the measurement interval and watch the envelope lines grow.";
                best = f;
                bestProminence = fundamental.prominence;
                bestAmplitude = fundamental.amplitude;
                bestHz = fundamental.measuredHz;
                bestChannel = &ch;
            }
            if (bestProminence > 0 && best.severity >= 1) candidates.push_back({best, bestAmplitude, bestHz, d.name, where, bestChannel});
        }
        // One bearing rarely has two defects at once: a family whose fundamental sits on a
        // harmonic of the dominant family's line or on a shaft-rate sideband of one is a
        // combination line of it and is dropped; a family much weaker than the dominant one is
        // kept at watch (common practice (no source)).
        if (candidates.empty()) continue;
        const auto dominant = std::max_element(candidates.begin(), candidates.end(),
                                               [](const Candidate& a, const Candidate& b) { return a.amplitude < b.amplitude; });
        for (auto& c : candidates) {
            if (&c == &*dominant) {
                placed.push_back(c);
                continue;
            }
            // Harmonics of the dominant line and their shaft-rate sidebands (h x f_d + m x fr).
            bool combination = false;
            for (int h = 1; h <= 5; ++h)
                for (int m = -2; m <= 2; ++m)
                    if (h > 1 || m != 0)
                        combination |= std::abs(c.fundamentalHz - (h * dominant->fundamentalHz + m * fr)) < 0.005 * c.fundamentalHz;
            if (combination) continue;
            if (c.amplitude < 0.33 * dominant->amplitude) {
                c.finding.severity = std::min(c.finding.severity, 1);
                c.finding.confidence *= 0.6;
                c.finding.explanation += fmt(" Its lines are %.0f %% of the ", 100 * c.amplitude / dominant->amplitude) + dominant->name +
                                         " family's on the same bearing: possibly combination lines of that defect.";
            }
            placed.push_back(c);
        }
    }
    return placeDefectsAtTheirEnd(std::move(placed));
}

std::vector<Finding> electricalTwiceLineRule(const Channels& channels, const RuleContext& ctx) {
    const double f2 = 2 * ctx.op.lineHz, x2 = 2 * ctx.op.shaftHz;
    const VibrationProducts* worst = nullptr;
    LineReading worstLine;
    for (const auto& ch : channels) {
        if (!isRadial(ch)) continue;
        // The line must sit on 2f, not on 2X: on a 2-pole motor they are only 2 s f apart.
        const double tol = std::min(lineTolerance(ch.velocity, f2) + (ctx.lineFromCurrent ? 0.0 : 0.2), 0.45 * std::abs(f2 - x2));
        const auto r = readLine(ch.velocity, f2, tol);
        if (!r.found || std::abs(r.measuredHz - f2) >= std::abs(r.measuredHz - x2)) continue;
        if (!worst || r.amplitude > worstLine.amplitude) {
            worst = &ch;
            worstLine = r;
        }
    }
    if (!worst) return {};
    const double a = worstLine.amplitude * kMmPerM;
    const int severity = ctx.componentSeverity(a);
    if (severity == 0) return {};
    Finding f;
    f.fault = "electrical_2lf";
    f.severity = severity;
    f.origin = Origin::Electrical;
    f.confidence = ctx.lineFromCurrent ? 0.85 : 0.65;
    f.rule = "vib.electrical_2lf/1";
    Evidence e = lineEvidence("2x line frequency", worstLine, *worst, kMmPerM, "mm/s rms");
    e.threshold = gradeThreshold(severity, ctx);
    e.thresholdSource = ctx.zones.source + " boundary applied to the component (common practice)";
    f.evidence.push_back(e);
    f.evidence.push_back(lineEvidence("2X running speed (for contrast)", velocityLine(*worst, x2), *worst, kMmPerM, "mm/s rms"));
    f.explanation = fmt("A %.2f mm/s line at exactly twice the supply frequency (%.3f Hz), ", a, f2) +
                    fmt("resolved from 2X at %.3f Hz: magnetic forces in the stator - uneven air gap (static eccentricity), soft foot, "
                        "loose stator iron or a winding problem.", x2);
    f.action = "Check soft foot and the motor's feet; if it persists, test the stator (winding, air gap) and confirm by cutting "
               "the supply while recording: an electrical line vanishes at once.";
    return {f};
}

} // namespace humwise::diagnosis
