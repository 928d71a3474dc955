#pragma once
// The spectra and levels each vibration channel contributes to a diagnosis.
//
// - velocity spectrum: Hann, about 0.25 Hz lines (the whole record when shorter than 4 s),
//   50 % overlap, r.m.s. scale, up to min(fs / 2.56, 2 kHz), integrated from acceleration
//   with a 2 Hz cut-off (Integration.h);
// - overall velocity r.m.s. in the ISO 20816-3 band: 10-1000 Hz, or 2-1000 Hz for machines
//   running at 600 r/min or slower (REFERENCE.md 2.1);
// - envelope spectrum (acceleration channels): squared envelope (Randall & Antoni 2011) of the
//   band of greatest spectral kurtosis at least as wide as the envelope's fmax (Kurtogram.h);
// - waveform statistics of the channel as recorded.

#include "core/diagnosis/Inputs.h"
#include "core/dsp/Envelope.h"
#include "core/dsp/Spectrum.h"
#include "core/dsp/Statistics.h"

#include <optional>

namespace humwise::diagnosis {

struct VibrationProducts {
    const VibrationInput* input = nullptr;
    dsp::Spectrum velocity;               // m/s r.m.s.
    double overallVelocityRms = 0;        // m/s in [isoBandLowHz, isoBandHighHz]
    double isoBandLowHz = 10;
    double isoBandHighHz = 1000;
    std::optional<dsp::EnvelopeResult> envelope;
    dsp::WaveformStatistics statistics;
    std::string label() const; // "DE-H" or the input's name
};

// Throws std::invalid_argument when the channel is unusable (too short, wrong quantity).
VibrationProducts analyseVibration(const VibrationInput& input, double envelopeFmaxHz, bool slowMachine);

// The channel's envelope spectrum in a band given by the caller (same settings otherwise), so
// that two channels can be compared in one band. Empty when the band does not fit the channel.
std::optional<dsp::EnvelopeResult> envelopeInBand(const VibrationInput& input, double envelopeFmaxHz, double bandLowHz, double bandHighHz);

} // namespace humwise::diagnosis
