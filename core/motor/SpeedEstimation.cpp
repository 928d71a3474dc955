#include "core/motor/SpeedEstimation.h"

#include "core/dsp/Peaks.h"
#include "core/dsp/Zoom.h"
#include "core/util/Sums.h"

#include <algorithm>
#include <cmath>

namespace humwise::motor {
namespace {

double confidenceOf(double prominence) {
    if (!(prominence > 1)) return 0.0;
    return std::min(0.95, 1.0 - 1.0 / prominence);
}

// The strongest peak in [lo, hi] that stands at least `minProminence` above its floor.
std::optional<dsp::Peak> strongestIn(const dsp::Spectrum& s, double lo, double hi, double minProminence = 3.0) {
    dsp::PeakRequest r;
    r.maxPeaks = 1;
    r.minFrequencyHz = lo;
    r.maxFrequencyHz = hi;
    r.minProminence = minProminence;
    const auto p = dsp::findPeaks(s, r);
    if (p.empty()) return std::nullopt;
    return p.front();
}

std::vector<dsp::Peak> peaksIn(const dsp::Spectrum& s, double lo, double hi, double minProminence, std::size_t count) {
    dsp::PeakRequest r;
    r.maxPeaks = count;
    r.minFrequencyHz = lo;
    r.maxFrequencyHz = hi;
    r.minProminence = minProminence;
    return dsp::findPeaks(s, r);
}

} // namespace

double maxPlausibleSlip(const Nameplate& n) {
    const double rated = ratedSlip(n).value_or(0.03);
    return std::clamp(2.5 * rated, 0.04, 0.25);
}

std::optional<LineFrequencyEstimate> estimateSupplyFrequency(std::span<const double> current, double fs, double nominalHz,
                                                             bool driveFed) {
    const auto zoom = dsp::ZoomTransform::of(current, fs);
    if (!zoom.ok()) return std::nullopt;
    return estimateSupplyFrequency(current, zoom.value(), nominalHz, driveFed);
}

std::optional<LineFrequencyEstimate> estimateSupplyFrequency(std::span<const double> current, const dsp::ZoomTransform& zoom,
                                                             double nominalHz, bool driveFed) {
    if (current.size() != zoom.recordLength()) return std::nullopt; // not this record's transform
    const double fs = zoom.sampleRateHz();
    double centre = nominalHz;
    double span = std::min(10.0, nominalHz);
    if (driveFed) {
        // A drive may run anywhere: find the strongest line first on a coarse spectrum.
        dsp::SpectrumRequest coarse;
        coarse.resolutionHz = std::max(0.25, fs / static_cast<double>(current.size()));
        coarse.fmaxHz = std::min(fs / 2.56, 160.0);
        auto s = dsp::averagedSpectrum(current, fs, coarse);
        if (!s.ok()) return std::nullopt;
        const auto p = strongestIn(s.value(), 3.0, 150.0, 1.0);
        if (!p) return std::nullopt;
        centre = p->frequencyHz;
        span = 4.0 * s.value().resolutionHz + 1.0;
    }
    auto zs = zoom.band(centre, span, dsp::SpectrumScale::Rms);
    if (!zs.ok()) return std::nullopt;
    // The supply line must dominate a stator current (or voltage): at least 20 dB above the floor
    // and a quarter of the signal's power; otherwise there is no supply line to speak of.
    const auto p = strongestIn(zs.value(), centre - span / 2, centre + span / 2, 10.0);
    if (!p) return std::nullopt;
    const double meanSquare = util::meanAndDeviations(current).about.squares / static_cast<double>(current.size());
    if (p->amplitude * p->amplitude < 0.25 * meanSquare) return std::nullopt;
    return LineFrequencyEstimate{p->frequencyHz, p->amplitude, confidenceOf(p->prominence)};
}

std::optional<SpeedEstimate> speedFromVibration(const dsp::Spectrum& s, double syncHz, double maxSlip) {
    const double lo = syncHz * (1.0 - maxSlip), hi = syncHz * (1.0 - 2e-4);
    const auto p = strongestIn(s, lo, hi);
    if (!p) return std::nullopt;
    double confidence = confidenceOf(p->prominence);
    // A 2X where it should be confirms the choice.
    if (strongestIn(s, 2 * p->frequencyHz - 2 * s.resolutionHz, 2 * p->frequencyHz + 2 * s.resolutionHz)) confidence = std::min(0.97, confidence + 0.05);
    return SpeedEstimate{p->frequencyHz, "vibration_1x", confidence};
}

std::optional<SpeedEstimate> speedFromEccentricity(const dsp::Spectrum& s, double lineHz, double syncHz, double maxSlip) {
    const double frLo = syncHz * (1.0 - maxSlip), frHi = syncHz * (1.0 - 2e-4);
    const double tol = 2.0 * s.resolutionHz;
    const auto upper = peaksIn(s, lineHz + frLo, lineHz + frHi, 3.0, 5);
    const bool lowerUsable = lineHz - frHi > 2.0; // on 2-pole motors f - fr sits near DC
    std::optional<SpeedEstimate> best;
    double bestScore = 0;
    for (const auto& u : upper) {
        const double fr = u.frequencyHz - lineHz;
        double score = u.prominence, frEstimate = fr;
        double confidence = 0.8 * confidenceOf(u.prominence);
        if (lowerUsable) {
            const auto l = strongestIn(s, lineHz - fr - tol, lineHz - fr + tol);
            if (!l) continue; // eccentricity puts a line on both sides
            frEstimate = 0.5 * (fr + (lineHz - l->frequencyHz));
            score = std::min(u.prominence, l->prominence);
            confidence = confidenceOf(score);
        }
        if (score > bestScore) {
            bestScore = score;
            best = SpeedEstimate{frEstimate, "current_eccentricity", confidence};
        }
    }
    return best;
}

std::optional<SpeedEstimate> speedFromSlotHarmonic(const dsp::Spectrum& s, double lineHz, int poles, int bars, double maxSlip) {
    const double p = poles / 2.0, r = bars;
    std::optional<SpeedEstimate> best;
    for (int nu : {+1, -1}) {
        const double fAtSync = lineHz * (r / p + nu), fAtMax = lineHz * (r * (1 - maxSlip) / p + nu);
        const double lo = std::min(fAtSync, fAtMax), hi = std::max(fAtSync, fAtMax) - 1e-3;
        if (lo <= 0 || hi > s.frequencyHz(s.lineCount() - 1)) continue;
        const auto peak = strongestIn(s, lo, hi, 4.0);
        if (!peak) continue;
        const double slip = 1.0 - (p / r) * (peak->frequencyHz / lineHz - nu);
        const double confidence = 0.9 * confidenceOf(peak->prominence);
        if (!best || confidence > best->confidence)
            best = SpeedEstimate{lineHz / p * (1.0 - slip), "slot_harmonic", confidence};
    }
    return best;
}

std::optional<SpeedEstimate> speedFromSlipSidebands(const dsp::Spectrum& zoom, double lineHz, int poles, double maxSlip) {
    const double tol = 2.0 * zoom.resolutionHz;
    // Symmetric pairs around f also come from load or supply oscillations: ask for clear lines
    // and keep the confidence low, below that of any direct method.
    const auto lower = peaksIn(zoom, lineHz * (1 - 2 * maxSlip), lineHz - std::max(4 * zoom.resolutionHz, lineHz * 4e-4), 5.0, 5);
    std::optional<SpeedEstimate> best;
    double bestScore = 0;
    for (const auto& l : lower) {
        const double delta = lineHz - l.frequencyHz;
        const auto u = strongestIn(zoom, lineHz + delta - tol, lineHz + delta + tol, 5.0);
        if (!u) continue;
        const double score = std::min(l.prominence, u->prominence);
        // Rotor-asymmetry sidebands are of similar size (within 10 dB); a lone pair far apart in
        // level is more likely two unrelated lines.
        if (std::max(l.amplitude, u->amplitude) > 3.16 * std::min(l.amplitude, u->amplitude)) continue;
        if (score > bestScore) {
            bestScore = score;
            const double slip = 0.5 * (delta + (u->frequencyHz - lineHz)) / (2 * lineHz);
            best = SpeedEstimate{lineHz / (poles / 2.0) * (1 - slip), "slip_sidebands", 0.5 * confidenceOf(score)};
        }
    }
    return best;
}

std::optional<double> loadFromSlip(double slip, double lineHz, const Nameplate& n) {
    const auto rated = ratedSlip(n);
    if (!rated || !(*rated > 0) || !(n.supplyHz > 0)) return std::nullopt;
    return std::max(0.0, 100.0 * (slip * lineHz) / (*rated * n.supplyHz));
}

} // namespace humwise::motor
