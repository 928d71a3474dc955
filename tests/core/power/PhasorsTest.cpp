// Phasors by least-squares fit and symmetrical components: known tones off-bin (the fit must be
// exact to rounding whatever the record length), the Fortescue worked examples of REFERENCE.md
// 6.6, and a three-phase set built from known sequence components.
#include "core/power/Phasors.h"
#include "core/power/PowerQuality.h"
#include "support/TestSupport.h"

#include <gtest/gtest.h>

#include <cmath>
#include <complex>
#include <limits>
#include <numbers>
#include <stdexcept>
#include <string>
#include <vector>

namespace humwise::power {
namespace {

using Complex = std::complex<double>;
constexpr double kPi = std::numbers::pi;

double deg(double d) { return d * kPi / 180.0; }
Complex polarDeg(double magnitude, double degrees) { return std::polar(magnitude, deg(degrees)); }

// sqrt(2) |p| cos(2 pi f n / fs + arg p) + offset: the waveform whose phasor is p (Phasors.h).
std::vector<double> waveform(Complex p, double f, double fs, std::size_t count, double offset = 0.0) {
    std::vector<double> x(count);
    for (std::size_t n = 0; n < count; ++n)
        x[n] = offset + std::numbers::sqrt2 * std::abs(p) * std::cos(2 * kPi * f * static_cast<double>(n) / fs + std::arg(p));
    return x;
}

// Phase difference wrapped to (-pi, pi].
double phaseError(double a, double b) { return std::remainder(a - b, 2 * kPi); }

// Known tone, 50.37 Hz in 1234 samples at 1 kHz: 62.16 cycles, i.e. off-bin and not whole
// cycles, with a DC offset. The least-squares fit is exact (the generator is the reference).
TEST(Phasor, OffBinToneWithOffsetIsExact) {
    const double fs = 1000, f = 50.37;
    const auto x = waveform(polarDeg(3.7, 41.0), f, fs, 1234, 2.5);
    const Phasor p = phasorAt(x, fs, f);
    EXPECT_NEAR(p.magnitude, 3.7, 1e-10);
    EXPECT_NEAR(phaseError(p.phaseRad, deg(41.0)), 0.0, 1e-10);

    const double f2[] = {f};
    const ToneFit fit = fitTones(x, fs, f2);
    EXPECT_NEAR(fit.offset, 2.5, 1e-10);
    EXPECT_NEAR(fit.residualRms, 0.0, 1e-6);
}

// test::sine is A sin(wn + p) = A cos(wn + p - pi/2): the phase convention is the cosine's.
TEST(Phasor, SineConventionIsCosineMinusQuarterTurn) {
    const double fs = 2000, f = 123.456;
    const auto x = test::sine(2.0, f, fs, 3001, 0.3);
    const Phasor p = phasorAt(x, fs, f);
    EXPECT_NEAR(p.magnitude, 2.0 / std::numbers::sqrt2, 1e-10);
    EXPECT_NEAR(phaseError(p.phaseRad, 0.3 - kPi / 2), 0.0, 1e-10);
}

// Why the fit is joint: two tones 3 Hz apart in a 0.83 s record (2.5 cycles of their
// difference). One FFT-like correlation per frequency leaks one tone into the other; the joint
// fit separates them exactly, and the single-frequency fit of the same data does not.
TEST(Phasor, JointFitSeparatesTonesThatSingleFitsMix) {
    const double fs = 1000, f1 = 50.0, f2 = 53.0;
    const std::size_t n = 830;
    auto x = waveform(polarDeg(1.0, 10.0), f1, fs, n);
    test::add(x, waveform(polarDeg(0.5, -70.0), f2, fs, n));
    const double freqs[] = {f1, f2};
    const ToneFit fit = fitTones(x, fs, freqs);
    EXPECT_NEAR(fit.phasors[0].magnitude, 1.0, 1e-10);
    EXPECT_NEAR(fit.phasors[1].magnitude, 0.5, 1e-10);
    EXPECT_NEAR(phaseError(fit.phasors[0].phaseRad, deg(10.0)), 0.0, 1e-10);
    EXPECT_NEAR(phaseError(fit.phasors[1].phaseRad, deg(-70.0)), 0.0, 1e-10);
    EXPECT_GT(std::abs(phasorAt(x, fs, f2).magnitude - 0.5), 1e-3); // the leakage the joint fit removes
}

TEST(Phasor, NoiseOnlyMovesTheEstimateByItsExpectedSpread) {
    // White noise sigma over N samples spreads each fitted coefficient by about sigma sqrt(2/N)
    // (least-squares variance, orthogonal regressors): 0.1 sqrt(2/20000) = 1e-3; allow 5 sigma.
    const double fs = 2000, f = 60.2;
    auto x = waveform(polarDeg(1.0, -20.0), f, fs, 20000);
    test::add(x, test::gaussianNoise(0.1, x.size(), 7));
    const Phasor p = phasorAt(x, fs, f);
    EXPECT_NEAR(p.magnitude, 1.0, 5e-3);
    EXPECT_NEAR(phaseError(p.phaseRad, deg(-20.0)), 0.0, 5e-3);
    const double freqs[] = {f};
    EXPECT_NEAR(fitTones(x, fs, freqs).residualRms, 0.1, 0.005);
}

TEST(Phasor, BadParametersThrow) {
    const auto x = waveform(1.0, 50, 1000, 1000);
    EXPECT_THROW(phasorAt(x, 1000, 0.0), std::invalid_argument);
    EXPECT_THROW(phasorAt(x, 1000, 500.0), std::invalid_argument);  // Nyquist
    EXPECT_THROW(phasorAt(x, 1000, 700.0), std::invalid_argument);
    EXPECT_THROW(phasorAt(x, 0.0, 50.0), std::invalid_argument);
    EXPECT_THROW(phasorAt(std::span<const double>(x).first(10), 1000, 50.0), std::invalid_argument); // < 1 period
    EXPECT_THROW(fitTones(x, 1000, std::span<const double>{}), std::invalid_argument);
    const double same[] = {50.0, 50.0};
    EXPECT_THROW(fitTones(x, 1000, same), std::invalid_argument);
    auto bad = x;
    bad[17] = std::numeric_limits<double>::quiet_NaN();
    EXPECT_THROW(phasorAt(bad, 1000, 50.0), std::invalid_argument);
}

TEST(Phasor, NonFiniteAndOverflowingSamplesAreNamed) {
    auto x = waveform(1.0, 50, 1000, 1000);
    x[999] = std::numeric_limits<double>::infinity();
    try {
        (void)phasorAt(x, 1000, 50.0);
        ADD_FAILURE() << "an infinite sample was accepted";
    } catch (const std::invalid_argument& e) {
        EXPECT_NE(std::string(e.what()).find("non-finite sample"), std::string::npos) << e.what();
    }
    // Finite samples whose sum overflows: refused too, with their own reason.
    std::vector<double> huge(1000, std::numeric_limits<double>::max());
    try {
        (void)phasorAt(huge, 1000, 50.0);
        ADD_FAILURE() << "an overflowing sum was accepted";
    } catch (const std::invalid_argument& e) {
        EXPECT_NE(std::string(e.what()).find("overflows"), std::string::npos) << e.what();
    }
}

// The sums of x against each tone run block by block (Phasors.cpp): with fewer than 4 tones, 12
// blocks of 4096 samples side by side in vector lanes; with more, 8 tones to the lanes and 3
// blocks side by side; then single blocks, the last one short. Records of 200 003 samples (48 full
// blocks and a part of 3 samples, whose omission would move the fit by about 1e-5), 28 677 (7
// full blocks: fewer than 12 side by side) and 8 292 (2 full blocks: fewer than 3), and tone
// counts on both sides of each switch and of the 8-tone groups: every path must be exact to
// rounding, at low frequency too (0.5 Hz at 10 kHz, where the plain Goertzel recursion loses
// digits; Reinsch's form must not).
TEST(Phasor, LongRecordsAreExactWithFewAndManyTonesAndAtLowFrequency) {
    const double fs = 10000;
    for (const std::size_t n : {200003u, 28677u, 8292u})
        for (const std::size_t tones : {1u, 2u, 3u, 4u, 7u, 8u, 9u, 20u, 40u}) {
            std::vector<double> freqs, x(n, 0.0);
            std::vector<Complex> truth;
            const double lowest = n >= 20000 ? 0.5 : 3.1; // at least one period in the record
            for (std::size_t i = 0; i < tones; ++i) {
                freqs.push_back(i == 0 ? lowest : 49.93 * static_cast<double>(i) + 0.37);
                truth.push_back(polarDeg(1.0 / static_cast<double>(i + 1), 17.0 * static_cast<double>(i) - 40.0));
                test::add(x, waveform(truth.back(), freqs.back(), fs, n));
            }
            const ToneFit fit = fitTones(x, fs, freqs);
            for (std::size_t i = 0; i < tones; ++i)
                EXPECT_NEAR(std::abs(toComplex(fit.phasors[i]) - truth[i]), 0.0, 1e-10)
                    << n << " samples, " << tones << " tones, tone " << i << " at " << freqs[i] << " Hz";
            EXPECT_NEAR(fit.residualRms, 0.0, 1e-6) << n << " samples, " << tones << " tones";
        }
}

void expectPhasor(Complex z, double magnitude, double degrees, double tol, const char* what) {
    EXPECT_NEAR(std::abs(z), magnitude, tol) << what;
    if (magnitude > 0) {
        EXPECT_NEAR(phaseError(std::arg(z), deg(degrees)), 0.0, 1e-3) << what;
    }
}

// REFERENCE.md 6.6 worked example 1 (open conductor; textbook example attributed from memory to
// Grainger & Stevenson 1994, values computed there): Ia = 10/_0, Ib = 10/_180, Ic = 0 ->
// I0 = 0, I1 = 5.7735/_-30, I2 = 5.7735/_+30.
TEST(Fortescue, OpenConductorExample) {
    const auto s = symmetricalComponents(polarDeg(10, 0), polarDeg(10, 180), 0.0);
    expectPhasor(s.zero, 0.0, 0.0, 1e-12, "I0");
    expectPhasor(s.positive, 5.7735, -30.0, 1e-4, "I1");
    expectPhasor(s.negative, 5.7735, 30.0, 1e-4, "I2");
    EXPECT_NEAR(std::abs(s.positive), 10.0 / std::sqrt(3.0), 1e-12); // exact value of 5.7735
}

// REFERENCE.md 6.6 worked example 2 (computed there): Va = 1/_0, Vb = 1/_-120, Vc = 0.9/_120
// -> V0 = 0.0333/_-60, V1 = 0.9667/_0, V2 = 0.0333/_60, VUF 3.448 %.
TEST(Fortescue, WeakPhaseCExample) {
    const auto s = symmetricalComponents(polarDeg(1, 0), polarDeg(1, -120), polarDeg(0.9, 120));
    expectPhasor(s.zero, 0.0333, -60.0, 5e-5, "V0");
    expectPhasor(s.positive, 0.9667, 0.0, 5e-5, "V1");
    expectPhasor(s.negative, 0.0333, 60.0, 5e-5, "V2");
    EXPECT_NEAR(100 * negativeSequenceRatio(s), 3.448, 5e-4);
    EXPECT_NEAR(negativeSequenceRatio(s), (0.1 / 3) / (2.9 / 3), 1e-12); // exact: 0.1/2.9
}

// REFERENCE.md 6.6 worked example 3: a balanced a-b-c set (b lagging a) is pure positive
// sequence; exchanging b and c makes it pure negative sequence, and in general swaps V1 and V2.
TEST(Fortescue, BalancedSetAndSwappedPhases) {
    const Complex v = polarDeg(230, 17);
    const Complex b = v * polarDeg(1, -120), c = v * polarDeg(1, 120);
    const auto s = symmetricalComponents(v, b, c);
    EXPECT_NEAR(std::abs(s.positive - v), 0.0, 1e-12);
    EXPECT_NEAR(std::abs(s.zero), 0.0, 1e-12);
    EXPECT_NEAR(std::abs(s.negative), 0.0, 1e-12);
    const auto swapped = symmetricalComponents(v, c, b);
    EXPECT_NEAR(std::abs(swapped.negative - v), 0.0, 1e-12);
    EXPECT_NEAR(std::abs(swapped.positive), 0.0, 1e-12);

    const auto u = symmetricalComponents(polarDeg(1, 0), polarDeg(1, -120), polarDeg(0.9, 120));
    const auto us = symmetricalComponents(polarDeg(1, 0), polarDeg(0.9, 120), polarDeg(1, -120));
    EXPECT_NEAR(std::abs(us.positive - u.negative), 0.0, 1e-12);
    EXPECT_NEAR(std::abs(us.negative - u.positive), 0.0, 1e-12);
    EXPECT_NEAR(std::abs(us.zero - u.zero), 0.0, 1e-12);
}

// Three-phase waveforms built from known sequence components (inverse Fortescue, REFERENCE.md
// 6.6: Xa = X0 + X1 + X2, Xb = X0 + a^2 X1 + a X2, Xc = X0 + a X1 + a^2 X2), off-bin at 59.93 Hz
// for 1.2345 s at 1 kHz: the phasors then the components give back |I2| / |I1| = 0.05.
TEST(Fortescue, ThreePhaseWaveformsWithKnownUnbalance) {
    const Complex a = polarDeg(1, 120), i0 = polarDeg(0.3, 75), i1 = polarDeg(10, -25), i2 = polarDeg(0.5, 140);
    const double fs = 1000, f = 59.93;
    const std::size_t n = 1234;
    const Phasor pa = phasorAt(waveform(i0 + i1 + i2, f, fs, n), fs, f);
    const Phasor pb = phasorAt(waveform(i0 + a * a * i1 + a * i2, f, fs, n), fs, f);
    const Phasor pc = phasorAt(waveform(i0 + a * i1 + a * a * i2, f, fs, n), fs, f);
    const auto s = symmetricalComponents(toComplex(pa), toComplex(pb), toComplex(pc));
    EXPECT_NEAR(negativeSequenceRatio(s), 0.05, 1e-10);
    EXPECT_NEAR(std::abs(s.zero - i0), 0.0, 1e-9);
    EXPECT_NEAR(std::abs(s.positive - i1), 0.0, 1e-9);
    EXPECT_NEAR(std::abs(s.negative - i2), 0.0, 1e-9);
}

TEST(Phasor, ComplexRoundTrip) {
    const Phasor p{2.5, -2.0};
    const Complex z = toComplex(p);
    EXPECT_NEAR(z.real(), 2.5 * std::cos(-2.0), 1e-15);
    EXPECT_NEAR(z.imag(), 2.5 * std::sin(-2.0), 1e-15);
    const Phasor q = toPhasor(z);
    EXPECT_NEAR(q.magnitude, 2.5, 1e-15);
    EXPECT_NEAR(q.phaseRad, -2.0, 1e-15);
}

} // namespace
} // namespace humwise::power
