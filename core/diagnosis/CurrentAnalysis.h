#pragma once
// The spectra and phasors the stator currents (and supply voltages) contribute to a diagnosis.
//
// - supply frequency: from phase A (SpeedEstimation.h, estimateSupplyFrequency);
// - zoom spectrum of phase A around f: Blackman-Harris, the whole record, r.m.s. scale, span
//   f +- (2 x max slip x f + 2 Hz) - for the broken-bar sidebands (Zoom.h);
// - wide spectrum of phase A: Hann, 0.1 Hz lines or the record length, 50 % overlap, up to
//   min(fs / 2.56, 2.5 kHz) - for eccentricity, slot harmonics, shorted turns and bearings;
// - fundamental phasors of every phase by a least-squares fit at f (Phasors.h), their
//   symmetrical components and the NEMA unbalance of the magnitudes;
// - harmonic analysis of phase A (PowerQuality.h).

#include "core/diagnosis/Inputs.h"
#include "core/dsp/Spectrum.h"
#include "core/motor/SpeedEstimation.h"
#include "core/power/PowerQuality.h"

#include <optional>
#include <vector>

namespace humwise::diagnosis {

struct PhaseSetProducts {
    std::string name;
    double sampleRateHz = 0;
    motor::LineFrequencyEstimate line;
    dsp::Spectrum zoom;
    dsp::Spectrum wide;
    std::vector<power::Phasor> fundamentals;           // one per phase, at line.hz
    std::optional<power::SequenceComponents> sequence; // with three phases
    std::optional<double> unbalancePercent;            // NEMA formula on the fundamental magnitudes
    std::optional<power::HarmonicAnalysis> harmonics;  // phase A
};

// Throws std::invalid_argument when the channels are unusable (no phase, too short, no line found).
PhaseSetProducts analysePhaseSet(const std::string& name, const std::vector<std::vector<double>>& phases, double sampleRateHz,
                                 double nominalHz, bool driveFed, double maxSlip, Quantity quantity);

} // namespace humwise::diagnosis
