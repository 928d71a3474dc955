#pragma once
// Phasors of sampled channels and symmetrical components of three-phase sets.
//
// Conventions (all functions):
// - A phasor is the RMS value of one sinusoidal component and its phase in radians, the phase
//   of the cosine at the FIRST sample of the record: the component is
//       sqrt(2) * magnitude * cos(2 pi f n / fs + phaseRad),  n = 0, 1, ...
//   As a complex number it is magnitude * exp(j phaseRad) (toComplex). Magnitudes are in the
//   unit of the samples (SI inside Humwise: V, A).
// - Frequencies in Hz; sampleRateHz > 0; a frequency must lie strictly between 0 and the
//   Nyquist frequency fs / 2.
// - Pure functions of their arguments: thread-safe, no shared state.
//
// Method (fitTones, phasorAt). Linear least-squares fit, over the whole record, of
//     x[n] ~ c + sum_k ( a_k cos(w_k n) + b_k sin(w_k n) ),   w_k = 2 pi f_k / fs,
// with the constant c fitted jointly (which is the same as removing the mean of x AND of each
// regressor, so a tone that does not complete whole cycles in the record is not biased by the
// mean removal). This is the "three-parameter (known frequency) sine fit" of IEEE Std 1057 /
// IEEE Std 1241 (ADC and digitizer test standards; clause numbers from memory (verify)),
// extended to several known frequencies at once (the multi-harmonic form is common practice
// in waveform metrology). With several frequencies the fit is joint, so the components do not
// leak into each other even when the record does not hold whole cycles - unlike one FFT bin or
// separate single-frequency fits. For a signal made only of tones at the fitted frequencies
// (plus a constant) the result is exact to rounding, whatever the record length.
// Then RMS = sqrt(a_k^2 + b_k^2) / sqrt(2) and phase = atan2(-b_k, a_k), since
// a cos(wn) + b sin(wn) = sqrt(a^2 + b^2) cos(wn + atan2(-b, a)).
// Numerics: the normal equations are built in O(N K) (the Gram sums sum_n cos, sin of sums
// and differences of the w_k in closed form, the Dirichlet kernel; the sums of x against each
// tone by Reinsch's form of the Goertzel recursion, all tones in one pass over x, in blocks
// rotated into place exactly) and solved by Cholesky.
//
// Preconditions (std::invalid_argument otherwise): finite samples, at least 2K + 2 of them;
// the record lasts at least one period of the lowest frequency (shorter records make the fit
// ill-conditioned); the frequencies are separable in the record (no two equal, none at 0 or
// fs / 2 - the Cholesky pivots are checked).

#include <complex>
#include <span>
#include <vector>

namespace humwise::power {

struct Phasor {
    double magnitude = 0; // RMS of the component, unit of the samples
    double phaseRad = 0;  // phase of the cosine at the first sample, radians in (-pi, pi]
};

std::complex<double> toComplex(const Phasor& p);  // magnitude * exp(j phaseRad)
Phasor toPhasor(std::complex<double> z);          // |z|, arg z

// Least-squares phasor of x at frequencyHz (method above, K = 1).
Phasor phasorAt(std::span<const double> x, double sampleRateHz, double frequencyHz);

struct ToneFit {
    double offset = 0;            // fitted constant c (unit of the samples)
    std::vector<Phasor> phasors;  // one per requested frequency, same order
    double residualRms = 0;       // RMS of x minus the fitted model (noise, other components)
};

// Joint least-squares fit of a constant and one tone per frequency (method above).
ToneFit fitTones(std::span<const double> x, double sampleRateHz, std::span<const double> frequenciesHz);

// Symmetrical components (C. L. Fortescue, "Method of symmetrical co-ordinates applied to the
// solution of polyphase networks", Trans. AIEE 37, 1918 - citation details from memory
// (verify); the formulas are the standard textbook form, published, REFERENCE.md 6.6):
//   a = 1 /_120 deg,  X0 = (Xa + Xb + Xc) / 3,  X1 = (Xa + a Xb + a^2 Xc) / 3,
//   X2 = (Xa + a^2 Xb + a Xc) / 3.
// Positive sequence is a-b-c with b LAGGING a by 120 deg: a balanced set Xa = X, Xb = X /_-120,
// Xc = X /_+120 gives X1 = X, X0 = X2 = 0. Works for phase or line quantities, voltages or
// currents, in any consistent unit (RMS phasors in, RMS phasors out).
struct SequenceComponents {
    std::complex<double> zero, positive, negative;
};

SequenceComponents symmetricalComponents(std::complex<double> a, std::complex<double> b, std::complex<double> c);

} // namespace humwise::power
