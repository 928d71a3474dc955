#include "core/diagnosis/Diagnose.h"

#include "core/diagnosis/CurrentAnalysis.h"
#include "core/diagnosis/CurrentRules.h"
#include "core/diagnosis/SpectralLines.h"
#include "core/diagnosis/VibrationAnalysis.h"
#include "core/diagnosis/VibrationRules.h"
#include "core/motor/SpeedEstimation.h"

#include <algorithm>
#include <cmath>
#include <cstdio>
#include <stdexcept>

namespace humwise::diagnosis {
namespace {

constexpr double kGravity = kStandardGravity;

// The envelope must reach the third harmonic of the fastest bearing line (plus its sidebands).
double envelopeFmaxFor(const motor::Motor& m, double shaftHz) {
    double fastest = 0;
    for (const auto* b : {&m.driveEndBearing, &m.nonDriveEndBearing})
        if (*b) {
            const auto f = motor::factorsOf(**b);
            fastest = std::max({fastest, f.bpfi + 1.0, 2 * f.bsf + f.ftf});
        }
    if (fastest == 0) return 500.0;
    return std::clamp(std::ceil(3.3 * fastest * shaftHz / 50.0) * 50.0, 200.0, 1000.0);
}

motor::SpeedEstimate chooseSpeed(const DiagnosisInput& in, const std::vector<VibrationProducts>& vibration,
                                 const std::optional<PhaseSetProducts>& current, double lineHz, int poles, double maxSlip) {
    if (in.measuredSpeedRpm) return {*in.measuredSpeedRpm / 60.0, "tachometer", 1.0};
    const double syncHz = lineHz / (poles / 2.0);
    std::vector<motor::SpeedEstimate> candidates;
    for (const auto& ch : vibration)
        if (ch.input->direction != Direction::Axial)
            if (auto e = motor::speedFromVibration(ch.velocity, syncHz, maxSlip)) candidates.push_back(*e);
    if (current) {
        if (in.motor.nameplate.rotorBars)
            if (auto e = motor::speedFromSlotHarmonic(current->wide, lineHz, poles, *in.motor.nameplate.rotorBars, maxSlip)) candidates.push_back(*e);
        if (auto e = motor::speedFromEccentricity(current->wide, lineHz, syncHz, maxSlip)) candidates.push_back(*e);
        // The weakest method: search no further than 1.5 x the rated slip.
        const double sidebandSlip = std::min(maxSlip, 1.5 * motor::ratedSlip(in.motor.nameplate).value_or(maxSlip / 1.5));
        if (auto e = motor::speedFromSlipSidebands(current->zoom, lineHz, poles, sidebandSlip)) candidates.push_back(*e);
    }
    if (candidates.empty()) {
        const double rated = in.motor.nameplate.ratedSpeedRpm;
        const double hz = rated > 0 ? rated / 60.0 * (lineHz / in.motor.nameplate.supplyHz) : syncHz * 0.98;
        return {hz, "nameplate", 0.2};
    }
    auto best = *std::max_element(candidates.begin(), candidates.end(),
                                  [](const auto& a, const auto& b) { return a.confidence < b.confidence; });
    // Independent methods that agree within 0.2 % raise the confidence.
    for (const auto& c : candidates)
        if (c.method != best.method && std::abs(c.shaftHz - best.shaftHz) < 0.002 * best.shaftHz) {
            best.confidence = std::min(0.99, best.confidence + 0.5 * (1 - best.confidence));
            break;
        }
    return best;
}

void vibrationIndicators(IndicatorList& ind, const VibrationProducts& ch, const RuleContext& ctx) {
    const std::string l = ch.label();
    ind.set("velocity_rms." + l, ch.overallVelocityRms * 1000.0, "mm/s");
    for (int n = 1; n <= 3; ++n) {
        const double f = n * ctx.op.shaftHz;
        ind.set(std::to_string(n) + "x." + l, readLine(ch.velocity, f, lineTolerance(ch.velocity, f), 0.0).amplitude * 1000.0, "mm/s");
    }
    const double f2 = 2 * ctx.op.lineHz;
    ind.set("2lf." + l, readLine(ch.velocity, f2, std::min(lineTolerance(ch.velocity, f2), 0.45 * std::abs(f2 - 2 * ctx.op.shaftHz)), 0.0).amplitude * 1000.0, "mm/s");
    const double toG = ch.input->quantity == Quantity::Acceleration ? 1.0 / kGravity : 1.0;
    const std::string peakUnit = ch.input->quantity == Quantity::Acceleration ? "g" : "m/s";
    ind.set("peak." + l, ch.statistics.peak * toG, peakUnit);
    ind.set("crest_factor." + l, ch.statistics.crestFactor, "1");
    ind.set("kurtosis." + l, ch.statistics.kurtosis, "1");
    if (!ch.envelope) return;
    for (const auto& [bearing, where] : {std::pair{&ctx.motor.driveEndBearing, Location::DriveEnd}, std::pair{&ctx.motor.nonDriveEndBearing, Location::NonDriveEnd}}) {
        if (!*bearing || ch.input->location != where) continue;
        const auto bf = motor::factorsOf(**bearing);
        for (const auto& [name, factor] : {std::pair{"bpfo", bf.bpfo}, std::pair{"bpfi", bf.bpfi}, std::pair{"2bsf", 2 * bf.bsf}, std::pair{"ftf", bf.ftf}}) {
            const double f = factor * ctx.op.shaftHz;
            const auto r = readLine(ch.envelope->spectrum, f, ctx.thresholds.bearingTolerance * f, 0.0);
            ind.set(std::string("env_") + name + "." + l, r.amplitude / (kGravity * kGravity), "g^2");
        }
    }
}

void currentIndicators(IndicatorList& ind, const PhaseSetProducts& c, const RuleContext& ctx) {
    ind.set("line_hz", c.line.hz, "Hz");
    ind.set("current_rms_f", c.line.rms, "A");
    const double twoSf = ctx.op.polePassHz();
    const auto ref = readLine(c.zoom, c.line.hz, 2 * c.zoom.resolutionHz, 0.0).amplitude;
    const double tol = std::max(2 * c.zoom.resolutionHz, 0.15 * twoSf);
    if (twoSf > 2 * c.zoom.resolutionHz) {
        const double lo = readLine(c.zoom, c.line.hz - twoSf, tol, 0.0).amplitude, hi = readLine(c.zoom, c.line.hz + twoSf, tol, 0.0).amplitude;
        ind.set("sideband_db", 0.5 * (20 * std::log10(ref / std::max(lo, 1e-300)) + 20 * std::log10(ref / std::max(hi, 1e-300))), "dB");
    }
    if (c.sequence) ind.set("negative_sequence_ratio", sequenceRatio(*c.sequence), "1");
    if (c.unbalancePercent) ind.set("current_unbalance", *c.unbalancePercent, "%");
    if (c.harmonics && std::isfinite(c.harmonics->thdFundamentalPercent)) ind.set("current_thd", c.harmonics->thdFundamentalPercent, "%");
}

} // namespace

DiagnosisResult diagnose(const DiagnosisInput& in, const Thresholds& thresholds, bool keepSpectra) {
    const auto issues = motor::validate(in.motor);
    if (!issues.empty()) throw std::invalid_argument("motor '" + in.motor.tag + "': " + issues.front().message);
    const int poles = *motor::polesOf(in.motor.nameplate);
    const double maxSlip = motor::maxPlausibleSlip(in.motor.nameplate);
    const bool driveFed = in.motor.nameplate.drive == motor::DriveKind::VariableFrequency;
    DiagnosisResult result;

    std::optional<PhaseSetProducts> current, voltage;
    if (in.current) {
        try {
            current = analysePhaseSet(in.current->name, in.current->phases, in.current->sampleRateHz, in.motor.nameplate.supplyHz, driveFed, maxSlip, Quantity::Current);
        } catch (const std::invalid_argument& e) {
            result.notes.push_back(std::string("current not analysed: ") + e.what());
        }
    }
    if (in.voltage) {
        try {
            voltage = analysePhaseSet(in.voltage->name, in.voltage->phases, in.voltage->sampleRateHz, in.motor.nameplate.supplyHz, driveFed, maxSlip, Quantity::Voltage);
        } catch (const std::invalid_argument& e) {
            result.notes.push_back(std::string("voltage not analysed: ") + e.what());
        }
    }
    OperatingPointResult& op = result.operatingPoint;
    double lineHz = in.motor.nameplate.supplyHz;
    op.lineMethod = "nameplate";
    if (current) {
        lineHz = current->line.hz;
        op.lineMethod = "current";
    } else if (voltage) {
        lineHz = voltage->line.hz;
        op.lineMethod = "voltage";
    } else if (driveFed) {
        result.notes.push_back("drive-fed motor without current or voltage: the supply frequency is assumed to be the nameplate's");
    }

    const bool slowMachine = in.motor.nameplate.ratedSpeedRpm > 0 && in.motor.nameplate.ratedSpeedRpm <= 600;
    const double envelopeFmax = envelopeFmaxFor(in.motor, lineHz / (poles / 2.0));
    std::vector<VibrationProducts> vibration;
    for (const auto& v : in.vibration) {
        try {
            vibration.push_back(analyseVibration(v, envelopeFmax, slowMachine));
        } catch (const std::invalid_argument& e) {
            result.notes.push_back(std::string("vibration channel not analysed: ") + e.what());
        }
    }
    if (vibration.empty() && !current && !voltage) throw std::invalid_argument("motor '" + in.motor.tag + "': no usable recording");

    const auto speed = chooseSpeed(in, vibration, current, lineHz, poles, maxSlip);
    op.point = motor::OperatingPoint{lineHz, speed.shaftHz, poles};
    op.speedMethod = speed.method;
    op.speedConfidence = speed.confidence;
    op.loadPercent = motor::loadFromSlip(op.point.slip(), op.point.lineHz, in.motor.nameplate);

    const RuleContext ctx{in.motor, op.point, op.lineMethod == "current", op.loadPercent, thresholds, zoneBoundaries(in.motor.severity)};
    auto& ind = result.indicators;
    ind.set("speed_rpm", op.point.speedRpm(), "r/min");
    ind.set("slip", op.point.slip(), "1");
    if (op.loadPercent) ind.set("load", *op.loadPercent, "%");
    for (const auto& ch : vibration) vibrationIndicators(ind, ch, ctx);
    if (current) currentIndicators(ind, *current, ctx);
    if (voltage) {
        if (voltage->unbalancePercent) ind.set("voltage_unbalance", *voltage->unbalancePercent, "%");
        if (voltage->harmonics && std::isfinite(voltage->harmonics->thdFundamentalPercent))
            ind.set("voltage_thd", voltage->harmonics->thdFundamentalPercent, "%");
    }

    auto& findings = result.findings;
    const auto add = [&](std::vector<Finding> more) { findings.insert(findings.end(), more.begin(), more.end()); };
    if (!vibration.empty()) {
        add(isoZoneRule(vibration, ctx));
        add(unbalanceRule(vibration, ctx));
        add(misalignmentRule(vibration, ctx));
        add(loosenessRule(vibration, ctx));
        add(bearingRules(vibration, ctx));
        add(electricalTwiceLineRule(vibration, ctx));
    }
    if (current) {
        add(brokenRotorBarRule(*current, vibration, ctx));
        add(eccentricityRule(*current, ctx));
        add(statorWindingRule(*current, voltage, ctx));
        add(currentUnbalanceRule(*current, voltage, ctx));
        add(bearingInCurrentRule(*current, ctx));
    }
    if (voltage) {
        add(voltageUnbalanceRule(*voltage, in.voltage->lineToLine, ctx));
        add(harmonicDistortionRule(*voltage, ctx));
    }
    if (in.powerOff) {
        try {
            const auto on = analyseVibration(in.powerOff->energised, envelopeFmax, slowMachine);
            const auto off = analyseVibration(in.powerOff->afterCut, envelopeFmax, slowMachine);
            result.powerOff = comparePowerOff(on, off, ctx);
            applyPowerOff(findings, result.powerOff, ctx);
        } catch (const std::invalid_argument& e) {
            result.notes.push_back(std::string("power-off comparison not made: ") + e.what());
        }
    }
    if (keepSpectra) {
        for (const auto& ch : vibration) {
            result.spectra.push_back({ch.input->name, "velocity", ch.velocity, ""});
            if (ch.envelope) {
                char band[96];
                std::snprintf(band, sizeof band, "squared envelope of %.0f-%.0f Hz", ch.envelope->bandLowHz, ch.envelope->bandHighHz);
                result.spectra.push_back({ch.input->name, "envelope", ch.envelope->spectrum, band});
            }
        }
        if (current) {
            result.spectra.push_back({current->name, "zoom", current->zoom, ""});
            result.spectra.push_back({current->name, "current", current->wide, ""});
        }
        if (voltage) result.spectra.push_back({voltage->name, "voltage", voltage->wide, ""});
    }
    std::stable_sort(findings.begin(), findings.end(), [](const Finding& a, const Finding& b) {
        return a.severity != b.severity ? a.severity > b.severity : a.confidence > b.confidence;
    });
    return result;
}

} // namespace humwise::diagnosis
