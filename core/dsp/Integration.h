#pragma once
// Conversion between acceleration, velocity and displacement in the frequency domain.
//
// For a sinusoid at f: v = a / (2 pi f), d = v / (2 pi f) (REFERENCE.md section 7; same
// amplitude type in and out). Each line of a spectrum is divided (integration) or multiplied
// (differentiation) by (2 pi f)^k; PSD lines by (2 pi f)^(2k). Lines below the low-frequency
// cut-off are set to zero so that integration does not blow up near DC: the usual cut-offs
// are 2 Hz or 10 Hz, matching the lower ends of the ISO 20816-3 bands (common practice).

#include "core/dsp/Spectrum.h"
#include "core/model/Units.h"

#include <span>
#include <vector>

namespace humwise::dsp {

inline constexpr double kDefaultIntegrationCutoffHz = 2.0;

// Number of integrations from one quantity to another: acceleration->velocity = 1,
// acceleration->displacement = 2, displacement->velocity = -1 (differentiation). Throws
// std::invalid_argument for quantities that are not motion (current, voltage).
int integrationSteps(Quantity from, Quantity to);

// Converts one spectrum value (or an interpolated peak) at `frequencyHz` from one motion
// quantity to another; 0 below the cut-off. PSD values convert with the square of the factor.
double convertLine(double value, double frequencyHz, Quantity from, Quantity to, SpectrumScale scale,
                   double cutoffHz = kDefaultIntegrationCutoffHz);

// Converts a spectrum in place to `to` (values stay in SI units of the new quantity).
// Interpolate peaks before converting: dividing by 2 pi f skews a peak's shape, so the
// window-matched interpolation of Peaks.h would place it off its true frequency.
void convertSpectrum(Spectrum& s, Quantity to, double cutoffHz = kDefaultIntegrationCutoffHz);

// Converts a waveform by the same rule through one FFT of the whole record (mean removed,
// lines below the cut-off zeroed). The result has the same length.
std::vector<double> convertWaveform(std::span<const double> x, double sampleRateHz, Quantity from, Quantity to,
                                    double cutoffHz = kDefaultIntegrationCutoffHz);

} // namespace humwise::dsp
