#pragma once
// Envelope analysis for rolling-element bearings (Randall & Antoni 2011; REFERENCE.md 8.1):
// band-pass around a structural resonance, analytic signal, (squared) envelope, spectrum.
// The band comes from the caller or, with autoBand, from the fast kurtogram (Kurtogram.h).
// Squared envelope (Randall's preference) has units of the input squared; the plain
// envelope |z| has the input's unit. The envelope's mean is removed before its spectrum.
// Check (REFERENCE.md 8.1): x = (1 + m cos(2 pi fm t)) cos(2 pi fc t) gives an envelope line
// m at fm (plain) and 2m at fm (squared), amplitude (peak) scale.

#include "core/dsp/AnalysisError.h"
#include "core/dsp/Kurtogram.h"
#include "core/dsp/Spectrum.h"
#include "core/model/Result.h"

#include <optional>
#include <span>

namespace humwise::dsp {

struct EnvelopeRequest {
    double bandLowHz = 0;
    double bandHighHz = 0;
    bool autoBand = false;           // choose the band by the fast kurtogram
    KurtogramRequest kurtogram;      // limits for the automatic choice
    bool squared = true;
    SpectrumRequest spectrum;        // of the envelope: fmax defaults to 1000 Hz, resolution to ~0.5 Hz
};

struct EnvelopeResult {
    double bandLowHz = 0;
    double bandHighHz = 0;
    double envelopeRateHz = 0;
    Spectrum spectrum;
    std::optional<Kurtogram> kurtogram;
};

inline constexpr double kDefaultEnvelopeFmaxHz = 1000.0;

[[nodiscard]] Result<EnvelopeResult, AnalysisError> envelopeSpectrum(std::span<const double> x, double sampleRateHz,
                                                                      const EnvelopeRequest& request);
// The same from the record's transform, when the caller has it already.
[[nodiscard]] Result<EnvelopeResult, AnalysisError> envelopeSpectrum(const RecordSpectrum& record, const EnvelopeRequest& request);

} // namespace humwise::dsp
