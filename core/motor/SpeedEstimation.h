#pragma once
// The operating point from the recordings themselves: supply frequency from the stator current,
// running speed without a tachometer, load from slip.
//
// Methods (each returns its answer with a confidence 0..1; confidence is the peak's prominence
// over the local floor mapped as 1 - 1/prominence, capped at 0.95 - a project convention):
//   supply     strongest line of a zoom spectrum of one phase current (Blackman-Harris window,
//              window-matched interpolation, Peaks.h); drive-fed motors: strongest line 3-150 Hz
//   vibration  1X: strongest line between the synchronous frequency and (1 - max slip) times it
//   eccentricity  current sidebands f -+ fr (REFERENCE.md 5: fr = |f_ecc - f|)
//   slot harmonic principal slot harmonic f_sh, s = 1 - (p / R)(f_sh / f -+ nu) with nu = +-1
//              (Hurst & Habetler 1996, from memory (verify); REFERENCE.md 5)
//   sidebands  broken-bar / torque-oscillation sidebands (1 -+ 2s) f: s = delta_f / (2 f)
// Load is estimated from the slip frequency s f against the rated one s_rated f_rated: at
// constant volts per hertz (direct-on-line, or a drive below base speed) the slip frequency, not
// the slip, grows in proportion to torque (common practice (no source), REFERENCE.md 5 gives
// the direct-on-line form slip / rated slip).

#include "core/dsp/Spectrum.h"
#include "core/dsp/Zoom.h"
#include "core/motor/FaultFrequencies.h"
#include "core/motor/Motor.h"

#include <optional>
#include <span>
#include <string>
#include <vector>

namespace humwise::motor {

struct LineFrequencyEstimate {
    double hz = 0;
    double rms = 0; // amplitude of the supply line, SI units of the channel, r.m.s.
    double confidence = 0;
};

struct SpeedEstimate {
    double shaftHz = 0;
    std::string method; // "tachometer", "vibration_1x", "current_eccentricity", "slot_harmonic", "slip_sidebands", "nameplate"
    double confidence = 0;
};

// Largest plausible slip for a search window: 2.5 x the rated slip, at least 4 %, at most 25 %
// (NEMA design D full-load slip reaches 13 %, REFERENCE.md 5).
double maxPlausibleSlip(const Nameplate& nameplate);

std::optional<LineFrequencyEstimate> estimateSupplyFrequency(std::span<const double> current, double sampleRateHz,
                                                             double nominalHz, bool driveFed);
// The same from the record's zoom transform (its default resolution and window, or any other
// fine enough), when the caller zooms on the same record afterwards: one transform, not two.
std::optional<LineFrequencyEstimate> estimateSupplyFrequency(std::span<const double> current, const dsp::ZoomTransform& zoom,
                                                             double nominalHz, bool driveFed);

// `spectrum`: a vibration spectrum (any scale) fine enough to place 1X (a few lines per slip Hz).
std::optional<SpeedEstimate> speedFromVibration(const dsp::Spectrum& spectrum, double synchronousHz, double maxSlip);
// `spectrum`: a current spectrum covering f -+ synchronous frequency.
std::optional<SpeedEstimate> speedFromEccentricity(const dsp::Spectrum& spectrum, double lineHz, double synchronousHz, double maxSlip);
std::optional<SpeedEstimate> speedFromSlotHarmonic(const dsp::Spectrum& spectrum, double lineHz, int poles, int rotorBars, double maxSlip);
// `zoom`: a zoom spectrum of the current around f.
std::optional<SpeedEstimate> speedFromSlipSidebands(const dsp::Spectrum& zoom, double lineHz, int poles, double maxSlip);

// Load in percent from slip at supply frequency `lineHz` and the nameplate's rated slip; nullopt
// when the nameplate has no speed.
std::optional<double> loadFromSlip(double slip, double lineHz, const Nameplate& nameplate);

} // namespace humwise::motor
