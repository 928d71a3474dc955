#include "core/diagnosis/PowerOff.h"

#include "core/diagnosis/SpectralLines.h"

#include <algorithm>
#include <cmath>
#include <cstdio>

namespace humwise::diagnosis {
namespace {

double strongestBetween(const dsp::Spectrum& s, double lo, double hi) {
    double best = 0;
    for (std::size_t k = 0; k < s.lineCount(); ++k) {
        const double f = s.frequencyHz(k);
        if (f >= lo && f <= hi) best = std::max(best, s.values[k]);
    }
    return best;
}

} // namespace

std::vector<PowerOffLine> comparePowerOff(const VibrationProducts& on, const VibrationProducts& off, const RuleContext& ctx) {
    std::vector<PowerOffLine> out;
    const auto& t = ctx.thresholds;
    struct Candidate { const char* label; double hz; bool electricalCandidate; };
    const Candidate candidates[] = {{"2x line frequency", 2 * ctx.op.lineHz, true},
                                    {"1X running speed", ctx.op.shaftHz, false},
                                    {"2X running speed", 2 * ctx.op.shaftHz, false}};
    for (const auto& c : candidates) {
        const double tol = std::min(lineTolerance(on.velocity, c.hz), 0.45 * std::abs(2 * ctx.op.lineHz - 2 * ctx.op.shaftHz));
        const auto r = readLine(on.velocity, c.hz, tol, 4.0);
        if (!r.found) continue;
        PowerOffLine line;
        line.label = c.label;
        line.energisedHz = r.measuredHz;
        line.energisedMmPerSecond = r.amplitude * 1000.0;
        // Electricity stops at once: look at the same frequency. A rotor slows down: look from the
        // energised frequency down to 80 % of it, and take the strongest line there.
        const double after = c.electricalCandidate ? readLine(off.velocity, r.measuredHz, 2 * off.velocity.resolutionHz, 0.0).amplitude
                                                   : strongestBetween(off.velocity, 0.8 * r.measuredHz, r.measuredHz + off.velocity.resolutionHz);
        line.afterMmPerSecond = after * 1000.0;
        line.dropDb = 20.0 * std::log10(r.amplitude / std::max(after, 1e-30));
        line.verdict = line.dropDb >= t.powerOffElectricalDropDb ? Origin::Electrical
                       : line.dropDb <= t.powerOffMechanicalMaxDropDb ? Origin::Mechanical
                                                                      : Origin::Unknown;
        out.push_back(line);
    }
    return out;
}

void applyPowerOff(std::vector<Finding>& findings, const std::vector<PowerOffLine>& lines, const RuleContext& ctx) {
    for (const auto& l : lines) {
        if (l.label != "2x line frequency") continue;
        for (auto& f : findings) {
            if (f.fault != "electrical_2lf") continue;
            Evidence e;
            e.label = "2x line frequency after the supply was cut";
            e.expectedHz = l.energisedHz;
            e.amplitude = l.afterMmPerSecond;
            e.unit = "mm/s rms";
            e.threshold = ctx.thresholds.powerOffElectricalDropDb;
            char buf[160];
            std::snprintf(buf, sizeof buf, "dropped %.1f dB at the cut; electrical if >= %.0f dB (REFERENCE.md 9, common practice)", l.dropDb,
                          ctx.thresholds.powerOffElectricalDropDb);
            e.thresholdSource = buf;
            f.evidence.push_back(e);
            if (l.verdict == Origin::Electrical) {
                f.confidence = std::max(f.confidence, 0.95);
                f.explanation += " Confirmed: the line vanished the moment the supply was cut.";
            } else if (l.verdict == Origin::Mechanical) {
                f.origin = Origin::Mechanical;
                f.confidence = 0.3;
                f.explanation += " But the line did not vanish when the supply was cut: its origin is mechanical, not electrical.";
            }
        }
    }
}

} // namespace humwise::diagnosis
