#pragma once
// Supply power quality at a motor: voltage and current unbalance, NEMA derating, harmonic
// distortion. Pure functions of plain values; thread-safe.
//
// Units and conventions:
// - Voltages and currents are RMS magnitudes in any one unit (the ratios do not depend on it);
//   unbalance and distortion are returned in PERCENT, ratios (negativeSequenceRatio) as plain
//   fractions, the derating factor as a fraction of rated power (1.0 = no derating).
// - NEMA unbalance is defined on the three LINE-TO-LINE voltages (REFERENCE.md 6.1); the same
//   formula on phase voltages or on line currents gives the "phase voltage unbalance" and the
//   current unbalance (REFERENCE.md 6.2 and 6.4). The IEC/IEEE VUF is |V2| / |V1| (6.2).
// - Bad parameters (non-finite, non-positive magnitudes, magnitudes that cannot close a
//   triangle, a zero positive sequence) throw std::invalid_argument.

#include "core/power/Phasors.h"

#include <span>
#include <vector>

namespace humwise::power {

// NEMA MG-1 line voltage unbalance rate, 100 * max_i |V_i - V_avg| / V_avg (REFERENCE.md 6.1,
// published). Works for currents too (current unbalance, REFERENCE.md 6.4).
double nemaUnbalancePercent(double v1, double v2, double v3);

// 100 * (V_max - V_min) / V_avg: a DIFFERENT quantity that overstates the NEMA value (about
// twice it); kept only to recognise it in others' reports (REFERENCE.md 6.1, pitfall, published).
double maxMinusMinPercent(double v1, double v2, double v3);

// IEC/IEEE voltage unbalance factor 100 |V2| / |V1| from the three line-voltage magnitudes
// alone (they close a triangle, so the angles follow), via the "beta" formula of REFERENCE.md
// 6.2 (formula from memory (verify the clause); checked there and in the tests against an exact
// phasor construction). Throws when the three magnitudes cannot close a triangle.
double iecUnbalanceFromLineVoltages(double vab, double vbc, double vca);

// |X2| / |X1| (fraction, not percent); 100 x this is the VUF of REFERENCE.md 6.2.
double negativeSequenceRatio(const SequenceComponents& s);

// Operation above this NEMA unbalance is not recommended (REFERENCE.md 6.3, published).
inline constexpr double kNemaMaxUnbalancePercent = 5.0;

// NEMA MG-1 derating factor for a NEMA voltage unbalance in percent: linear interpolation of
// the curve tabulated in REFERENCE.md 6.3 (published curve, numbers read from a secondary
// tabulation; where the reading is a range, 3 % -> 0.88-0.89 and 5 % -> 0.75-0.76, the LOWER,
// conservative value is used). Above 5 % it returns the 5 % value (0.75): the caller must then
// say "operation not recommended" (nemaOperationRecommended is false).
double nemaDeratingFactor(double nemaUnbalancePercent);
inline bool nemaOperationRecommended(double nemaUnbalancePercent) {
    return nemaUnbalancePercent <= kNemaMaxUnbalancePercent;
}

// IEEE 519-2014 evaluates harmonics up to h = 50 (REFERENCE.md 6.5, published, secondary).
inline constexpr int kIeee519MaxOrder = 50;
// Orders above (fs / 2) / kNyquistMargin are not evaluated: the anti-alias filter of a
// recorder attenuates the top of the band (the margin is common practice).
inline constexpr double kNyquistMargin = 1.1;

struct HarmonicAnalysis {
    double fundamentalHz = 0;
    double fundamentalRms = 0;        // X_1, unit of the samples
    std::vector<double> harmonicRms;  // X_h at index h - 2, for h = 2 .. highestOrder
    int highestOrder = 1;             // last order evaluated (maxOrder, or less near Nyquist)
    double rms = 0;                   // X_rms of the AC signal (see below)
    double thdFundamentalPercent = 0; // THD_F = 100 sqrt(sum_{h>=2} X_h^2) / X_1
    double thdRmsPercent = 0;         // THD_R = 100 sqrt(sum_{h>=2} X_h^2) / X_rms
};

// Harmonic analysis of one channel at a known fundamental (estimate it first, e.g. from a
// zoom spectrum): a joint least-squares fit (fitTones, Phasors.h) of the constant and the tones
// at h * fundamentalHz, h = 1 .. maxOrder, skipping orders above (fs / 2) / 1.1; exact for a
// periodic signal of those orders even when the record does not hold whole cycles.
// THD_F and THD_R as defined in REFERENCE.md 6.5 (IEEE 519 definitions, published).
// X_rms = sqrt(X_1^2 + sum X_h^2 + residual mean square): the AC RMS with the fitted DC removed
// and without the bias a partial last cycle gives a plain mean square (a Humwise estimator,
// common practice (no source); for whole cycles it equals the RMS of x minus its mean).
// THD_F is NaN when X_1 = 0 (THD_R too when the AC signal is all zero): no fundamental, no THD.
// Throws std::invalid_argument when maxOrder < 2, when even the 2nd harmonic lies above the
// margin, or for the preconditions of fitTones (record of at least one fundamental period).
HarmonicAnalysis harmonicAnalysis(std::span<const double> x, double sampleRateHz, double fundamentalHz,
                                  int maxOrder = kIeee519MaxOrder);

} // namespace humwise::power
