// Averaged spectra: the scaling conventions of Spectrum.h pinned by small cases whose answers
// are known (REFERENCE.md 1.5, computed there with scipy.signal from Heinzel et al. 2002
// section 9 formulas), Parseval, and the record-length contract.
#include "core/dsp/BandSignal.h"
#include "core/dsp/Spectrum.h"
#include "support/TestSupport.h"

#include <gtest/gtest.h>

#include <algorithm>
#include <cmath>

namespace humwise::dsp {
namespace {

SpectrumRequest oneSegment(WindowKind kind, SpectrumScale scale, std::size_t n, double fs) {
    SpectrumRequest r;
    r.window = {kind};
    r.resolutionHz = fs / static_cast<double>(n);
    r.fmaxHz = fs / 2;
    r.averages = 1;
    r.scale = scale;
    return r;
}

// REFERENCE.md 1.5: fs = 1024 Hz, N = 1024, x = 2 sin(2 pi 100 t): peak 2.0000 for rect, Hann
// and flat-top; PSD at 100 Hz 2.0000 (rect), 1.3333 (Hann), 2/3.8112 (HFT95, its NENBW).
TEST(Spectrum, BinCentredToneScalesToItsAmplitude) {
    const auto x = test::sine(2.0, 100.0, 1024.0, 1024);
    for (auto kind : {WindowKind::Rectangular, WindowKind::Hann, WindowKind::FlatTop, WindowKind::BlackmanHarris}) {
        auto pk = averagedSpectrum(x, 1024.0, oneSegment(kind, SpectrumScale::Peak, 1024, 1024.0));
        ASSERT_TRUE(pk.ok());
        EXPECT_NEAR(pk.value().values[100], 2.0, 1e-9);
        auto rms = averagedSpectrum(x, 1024.0, oneSegment(kind, SpectrumScale::Rms, 1024, 1024.0));
        EXPECT_NEAR(rms.value().values[100], std::sqrt(2.0), 1e-9);
        auto pp = averagedSpectrum(x, 1024.0, oneSegment(kind, SpectrumScale::PeakToPeak, 1024, 1024.0));
        EXPECT_NEAR(pp.value().values[100], 4.0, 1e-9);
    }
    EXPECT_NEAR(averagedSpectrum(x, 1024.0, oneSegment(WindowKind::Rectangular, SpectrumScale::Psd, 1024, 1024.0)).value().values[100], 2.0, 1e-9);
    EXPECT_NEAR(averagedSpectrum(x, 1024.0, oneSegment(WindowKind::Hann, SpectrumScale::Psd, 1024, 1024.0)).value().values[100], 2.0 / 1.5, 1e-9);
    EXPECT_NEAR(averagedSpectrum(x, 1024.0, oneSegment(WindowKind::FlatTop, SpectrumScale::Psd, 1024, 1024.0)).value().values[100], 2.0 / 3.8112, 1e-4);
}

// REFERENCE.md 1.5: off-bin tone at 100.5 Hz, peak-line estimate 1.2760 (rect), 1.6977 (Hann),
// 1.9978 (scipy's flat-top; HFT95 is flatter still: within 0.05 %); and the band power over
// +-5 lines with Hann recovers A^2/2 = 2.0000.
TEST(Spectrum, OffBinToneScallopingAndBandPower) {
    const auto x = test::sine(2.0, 100.5, 1024.0, 1024);
    const auto line = [&](WindowKind k) {
        return std::max(averagedSpectrum(x, 1024.0, oneSegment(k, SpectrumScale::Peak, 1024, 1024.0)).value().values[100],
                        averagedSpectrum(x, 1024.0, oneSegment(k, SpectrumScale::Peak, 1024, 1024.0)).value().values[101]);
    };
    EXPECT_NEAR(line(WindowKind::Rectangular), 1.2760, 5e-4);
    EXPECT_NEAR(line(WindowKind::Hann), 1.6977, 5e-4);
    EXPECT_NEAR(line(WindowKind::FlatTop), 2.0, 2.0 * 0.0005);
    const auto hann = averagedSpectrum(x, 1024.0, oneSegment(WindowKind::Hann, SpectrumScale::Psd, 1024, 1024.0)).value();
    double sum = 0;
    for (std::size_t k = 95; k <= 106; ++k) sum += hann.values[k] * hann.resolutionHz;
    EXPECT_NEAR(sum, 2.0, 2e-3);
    EXPECT_NEAR(bandRms(hann, 95, 106), std::sqrt(2.0), 1e-3);
}

// Parseval (Heinzel et al. 2002 section 9): sum PSD * df = mean square, within 0.5 % for a
// Welch estimate of noise, exactly for one rectangular segment without mean removal.
TEST(Spectrum, ParsevalHoldsForThePsd) {
    const auto noise = test::gaussianNoise(1.5, 65536, 42);
    double ms = 0;
    for (double v : noise) ms += v * v;
    ms /= static_cast<double>(noise.size());
    SpectrumRequest r;
    r.resolutionHz = 1.0;
    r.fmaxHz = 512.0;
    r.scale = SpectrumScale::Psd;
    const auto welch = averagedSpectrum(noise, 1024.0, r).value();
    double sum = 0;
    for (double v : welch.values) sum += v * welch.resolutionHz;
    EXPECT_NEAR(sum / ms, 1.0, 0.005);
    EXPECT_EQ(welch.averages, 127u); // 50 % overlap: 1 + (65536 - 1024) / 512
    EXPECT_NEAR(bandRms(welch, 0, 512) * bandRms(welch, 0, 512) / ms, 1.0, 0.005);

    auto exact = oneSegment(WindowKind::Rectangular, SpectrumScale::Psd, 1024, 1024.0);
    exact.removeMean = false;
    const std::vector<double> first(noise.begin(), noise.begin() + 1024);
    double ms1 = 0;
    for (double v : first) ms1 += v * v;
    const auto one = averagedSpectrum(first, 1024.0, exact).value();
    double sum1 = 0;
    for (double v : one.values) sum1 += v * one.resolutionHz;
    EXPECT_NEAR(sum1, ms1 / 1024.0, 1e-12);
}

TEST(Spectrum, RescaleBetweenScalesIsConsistent) {
    const auto x = test::sine(3.0, 40.0, 1000.0, 4000);
    SpectrumRequest r;
    r.resolutionHz = 1.0;
    r.fmaxHz = 500;
    r.scale = SpectrumScale::Psd;
    auto s = averagedSpectrum(x, 1000.0, r).value();
    rescale(s, SpectrumScale::Peak);
    EXPECT_NEAR(s.values[40], 3.0, 1e-9);
    rescale(s, SpectrumScale::Rms);
    EXPECT_NEAR(s.values[40], 3.0 / std::sqrt(2.0), 1e-9);
    rescale(s, SpectrumScale::Psd);
    r.scale = SpectrumScale::Psd;
    EXPECT_NEAR(s.values[40], averagedSpectrum(x, 1000.0, r).value().values[40], 1e-9);
}

TEST(Spectrum, LinesAndFmaxSetTheResolution) {
    const auto x = test::gaussianNoise(1.0, 25600 * 4, 5);
    SpectrumRequest r;
    r.lines = 800;
    r.fmaxHz = 1000;
    const auto s = averagedSpectrum(x, 25600.0, r).value();
    EXPECT_NEAR(s.resolutionHz, 1.25, 1e-12);
    EXPECT_EQ(s.lineCount(), 801u);
    EXPECT_NEAR(s.frequencyHz(800), 1000.0, 1e-9);
    // Default: 3200 lines over fs / 2.56.
    const auto d = averagedSpectrum(x, 25600.0, SpectrumRequest{}).value();
    EXPECT_EQ(d.segmentLength, 8192u);
    EXPECT_EQ(d.lineCount(), 3201u);
}

TEST(Spectrum, TooShortForTheResolutionIsATypedError) {
    const auto x = test::gaussianNoise(1.0, 1000, 5);
    SpectrumRequest r;
    r.resolutionHz = 0.1; // needs 10 s at 1 kHz
    const auto s = averagedSpectrum(x, 1000.0, r);
    ASSERT_FALSE(s.ok());
    EXPECT_EQ(s.error().code, AnalysisError::Code::RecordTooShort);
    EXPECT_NE(s.error().message.find("too short"), std::string::npos);
    r.resolutionHz = 1.0;
    r.averages = 5; // 5 segments of 1 s with 50 % overlap need 3 s
    EXPECT_EQ(averagedSpectrum(x, 1000.0, r).error().code, AnalysisError::Code::RecordTooShort);
}

TEST(Spectrum, BadRequestsAreRefused) {
    const auto x = test::gaussianNoise(1.0, 1000, 5);
    SpectrumRequest r;
    r.overlap = 1.0;
    EXPECT_EQ(averagedSpectrum(x, 1000.0, r).error().code, AnalysisError::Code::InvalidRequest);
    EXPECT_EQ(averagedSpectrum(x, 0.0, SpectrumRequest{}).error().code, AnalysisError::Code::InvalidRequest);
    r = {};
    r.resolutionHz = -1;
    EXPECT_EQ(averagedSpectrum(x, 1000.0, r).error().code, AnalysisError::Code::InvalidRequest);
}

TEST(Spectrum, DbUsesAmplitudeOrPowerRule) {
    EXPECT_NEAR(toDb(10.0, SpectrumScale::Rms, 1.0), 20.0, 1e-12);
    EXPECT_NEAR(toDb(10.0, SpectrumScale::Psd, 1.0), 10.0, 1e-12);
    EXPECT_TRUE(std::isinf(toDb(0.0, SpectrumScale::Rms, 1.0)));
}

// The lines of `derived` equal those of `direct` within 1e-12 of the largest line.
::testing::AssertionResult sameLines(const Result<Spectrum, AnalysisError>& direct, const Result<Spectrum, AnalysisError>& derived) {
    if (!direct.ok() || !derived.ok()) return ::testing::AssertionFailure() << "a spectrum failed";
    const auto& a = direct.value().values;
    const auto& b = derived.value().values;
    if (a.size() != b.size()) return ::testing::AssertionFailure() << a.size() << " lines against " << b.size();
    const double largest = *std::max_element(a.begin(), a.end());
    for (std::size_t k = 0; k < a.size(); ++k)
        if (!(std::abs(b[k] - a[k]) <= 1e-12 * largest))
            return ::testing::AssertionFailure() << "line " << k << ": " << b[k] << " against " << a[k] << " (largest " << largest << ")";
    return ::testing::AssertionSuccess();
}

// A whole-record spectrum derived from the record's transform (a short convolution with the
// window's DFT, the convolution theorem) equals the one transformed directly: even and odd
// lengths, tones on the first lines and next to Nyquist (where the convolution wraps), noise,
// an offset (removed either way), every cosine-sum window. The samples handed beside the record
// are zeros, so a result equal to the record's spectrum shows the record's transform was used.
TEST(Spectrum, FromTheRecordTransformEqualsTheDirectOne) {
    const double fs = 1000.0;
    for (const std::size_t n : {4096u, 4095u}) {
        auto x = test::sine(1.0, 1.3 * fs / static_cast<double>(n), fs, n, 0.4);
        test::add(x, test::sine(0.2, fs / 2 - 1.7 * fs / static_cast<double>(n), fs, n, 1.2));
        test::add(x, test::sine(0.05, 123.4, fs, n, 2.0));
        test::add(x, test::gaussianNoise(1e-3, n, 11));
        for (double& v : x) v += 0.7;
        const RecordSpectrum record(x, fs);
        const std::vector<double> zeros(n, 0.0);
        for (const auto kind : {WindowKind::Rectangular, WindowKind::Hann, WindowKind::Hamming, WindowKind::BlackmanHarris,
                                WindowKind::FlatTop}) {
            for (const auto scale : {SpectrumScale::Rms, SpectrumScale::Psd}) {
                SpectrumRequest r = oneSegment(kind, scale, n, fs);
                r.averages.reset(); // as an analysis asks: lines of the record length, as many segments as fit (one)
                const auto direct = averagedSpectrum(x, fs, r);
                const auto derived = averagedSpectrum(record, zeros, r);
                ASSERT_TRUE(sameLines(direct, derived)) << "n " << n << ", window " << windowName({kind});
                EXPECT_EQ(derived.value().enbwHz, direct.value().enbwHz);
                EXPECT_EQ(derived.value().averages, 1u);
            }
        }
    }
}

// Records as short as a window's DFT is wide: where the window's lines would fold onto each
// other (Blackman-Harris on 6 samples, a flat top on 8) the direct transform is taken; either way
// the numbers are the direct ones.
TEST(Spectrum, FromTheRecordTransformOnRecordsOfAFewSamples) {
    const double fs = 100.0;
    for (std::size_t n = 4; n <= 16; ++n) {
        auto x = test::gaussianNoise(1.0, n, 20 + n);
        x[1] += 3.0;
        const RecordSpectrum record(x, fs);
        for (const auto kind : {WindowKind::Rectangular, WindowKind::Hann, WindowKind::Hamming, WindowKind::BlackmanHarris,
                                WindowKind::FlatTop, WindowKind::Kaiser}) {
            SpectrumRequest r = oneSegment(kind, SpectrumScale::Rms, n, fs);
            r.averages.reset();
            EXPECT_TRUE(sameLines(averagedSpectrum(x, fs, r), averagedSpectrum(record, x, r))) << "n " << n << ", window " << windowName({kind});
        }
    }
}

// Where nothing can be derived (several segments, the mean kept, a Kaiser window whose DFT has
// no short head) the record's transform is not used: the samples beside it are transformed,
// giving the very same numbers as the direct path on them.
TEST(Spectrum, FromTheRecordTransformFallsBackWhereItCannotDerive) {
    const double fs = 1000.0;
    const std::size_t n = 4000;
    auto x = test::sine(1.0, 50.0, fs, n);
    test::add(x, test::gaussianNoise(0.01, n, 5));
    const RecordSpectrum otherRecord(test::gaussianNoise(1.0, n, 6), fs);
    SpectrumRequest segments; // 1 Hz lines: seven 1000-sample segments
    segments.resolutionHz = 1.0;
    SpectrumRequest meanKept = oneSegment(WindowKind::Hann, SpectrumScale::Rms, n, fs);
    meanKept.removeMean = false;
    SpectrumRequest kaiser = oneSegment(WindowKind::Kaiser, SpectrumScale::Rms, n, fs);
    for (const auto& r : {segments, meanKept, kaiser}) {
        const auto direct = averagedSpectrum(x, fs, r);
        const auto derived = averagedSpectrum(otherRecord, x, r);
        ASSERT_TRUE(direct.ok() && derived.ok());
        EXPECT_EQ(derived.value().values, direct.value().values);
        EXPECT_EQ(derived.value().averages, direct.value().averages);
    }
    const std::vector<double> shorter(x.begin(), x.end() - 1);
    EXPECT_EQ(averagedSpectrum(otherRecord, shorter, segments).error().code, AnalysisError::Code::InvalidRequest);
}

} // namespace
} // namespace humwise::dsp
