// Integration of vibration spectra and waveforms. Check values: REFERENCE.md section 7
// (v = a / (2 pi f), g = 9.80665 m/s^2): 1 g peak at 100 Hz -> 15.6078 mm/s peak, 24.8405 um peak;
// 1 g peak at 10 Hz -> 156.078 mm/s peak; 10 mm/s rms at 50 Hz -> 3.1416 m/s^2 rms.
#include "core/dsp/Integration.h"
#include "core/dsp/Peaks.h"
#include "core/dsp/Statistics.h"
#include "support/TestSupport.h"

#include <gtest/gtest.h>

#include <cmath>
#include <numbers>

namespace humwise::dsp {
namespace {

Spectrum peakSpectrum(const std::vector<double>& x, double fs, Quantity q) {
    SpectrumRequest r;
    r.window = {WindowKind::FlatTop};
    r.resolutionHz = 1.0;
    r.fmaxHz = 2000;
    r.scale = SpectrumScale::Peak;
    r.quantity = q;
    return averagedSpectrum(x, fs, r).value();
}

TEST(Integration, OneGPeakAt100HzIs15_61MillimetresPerSecond) {
    const double fs = 25600;
    const auto a = test::sine(kStandardGravity, 100.0, fs, 25600 * 4);
    auto s = peakSpectrum(a, fs, Quantity::Acceleration);
    convertSpectrum(s, Quantity::Velocity);
    EXPECT_EQ(s.quantity, Quantity::Velocity);
    EXPECT_NEAR(s.values[100] * 1e3, 15.6078, 15.6078 * 1e-3);
    auto d = peakSpectrum(a, fs, Quantity::Acceleration);
    convertSpectrum(d, Quantity::Displacement);
    EXPECT_NEAR(d.values[100] * 1e6, 24.8405, 24.8405 * 1e-3);
}

TEST(Integration, TenHzAndDifferentiation) {
    const double fs = 2560;
    const auto a = test::sine(kStandardGravity, 10.0, fs, 2560 * 8);
    auto s = peakSpectrum(a, fs, Quantity::Acceleration);
    convertSpectrum(s, Quantity::Velocity);
    EXPECT_NEAR(s.values[10] * 1e3, 156.078, 156.078 * 1e-3);
    // 10 mm/s rms at 50 Hz -> 3.1416 m/s^2 rms.
    const auto v = test::sine(10e-3 * std::sqrt(2.0), 50.0, fs, 2560 * 8);
    auto sv = peakSpectrum(v, fs, Quantity::Velocity);
    rescale(sv, SpectrumScale::Rms);
    convertSpectrum(sv, Quantity::Acceleration);
    EXPECT_NEAR(sv.values[50], 3.1416, 3.1416 * 1e-3);
}

TEST(Integration, LinesBelowTheCutoffAreZeroed) {
    const double fs = 2560;
    auto a = test::sine(1.0, 1.0, fs, 2560 * 8);
    test::add(a, test::sine(1.0, 100.0, fs, a.size()));
    auto s = peakSpectrum(a, fs, Quantity::Acceleration);
    convertSpectrum(s, Quantity::Velocity, 10.0);
    for (std::size_t k = 0; k < 10; ++k) EXPECT_EQ(s.values[k], 0.0);
    EXPECT_GT(s.values[100], 0.0);
}

// A PSD line converts with the square of the factor: acceleration to displacement divides by
// (2 pi f)^4, displacement to acceleration multiplies by it (REFERENCE.md section 7).
TEST(Integration, PsdLinesConvertWithTheSquareOfTheFactor) {
    Spectrum s;
    s.scale = SpectrumScale::Psd;
    s.quantity = Quantity::Acceleration;
    s.startHz = 0;
    s.resolutionHz = 5.0;
    s.values = {1.0, 2.0, 3.0, 4.0};
    const double w10 = 2.0 * std::numbers::pi * 10.0, w15 = 2.0 * std::numbers::pi * 15.0;
    auto d = s;
    convertSpectrum(d, Quantity::Displacement, 6.0); // the 0 and 5 Hz lines lie below the cut-off
    EXPECT_EQ(d.values[0], 0.0);
    EXPECT_EQ(d.values[1], 0.0);
    EXPECT_NEAR(d.values[2], 3.0 / std::pow(w10, 4), 1e-15 * 3.0 / std::pow(w10, 4));
    EXPECT_NEAR(d.values[3], 4.0 / std::pow(w15, 4), 1e-15 * 4.0 / std::pow(w15, 4));
    convertSpectrum(d, Quantity::Acceleration, 6.0);
    EXPECT_NEAR(d.values[3], 4.0, 4.0 * 1e-14);
    // One step (acceleration to velocity): a PSD line divides by (2 pi f)^2, a converted peak alike.
    auto v = s;
    convertSpectrum(v, Quantity::Velocity, 6.0);
    EXPECT_NEAR(v.values[2], 3.0 / (w10 * w10), 1e-15 * 3.0 / (w10 * w10));
    EXPECT_NEAR(convertLine(4.0, 15.0, Quantity::Acceleration, Quantity::Velocity, SpectrumScale::Psd), 4.0 / (w15 * w15),
                1e-15 * 4.0 / (w15 * w15));
}

TEST(Integration, WaveformIntegrationMatchesTheSpectralRule) {
    const double fs = 25600;
    const auto a = test::sine(kStandardGravity, 100.0, fs, 25600); // whole cycles: no leakage
    const auto v = convertWaveform(a, fs, Quantity::Acceleration, Quantity::Velocity);
    const auto st = waveformStatistics(v);
    EXPECT_NEAR(st.peak * 1e3, 15.6078, 15.6078 * 1e-3);
    EXPECT_NEAR(st.rms * 1e3, 11.0364, 11.0364 * 1e-3);
    const auto d = convertWaveform(a, fs, Quantity::Acceleration, Quantity::Displacement);
    EXPECT_NEAR(waveformStatistics(d).peakToPeak * 1e6, 49.6811, 49.6811 * 1e-3);
}

TEST(Integration, NonMotionQuantitiesAreRefused) {
    EXPECT_THROW(integrationSteps(Quantity::Current, Quantity::Velocity), std::invalid_argument);
    EXPECT_EQ(integrationSteps(Quantity::Acceleration, Quantity::Displacement), 2);
    EXPECT_EQ(integrationSteps(Quantity::Displacement, Quantity::Velocity), -1);
}

} // namespace
} // namespace humwise::dsp
