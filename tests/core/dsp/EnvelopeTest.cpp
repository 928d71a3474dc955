// Envelope analysis and the fast kurtogram on signals with known answers.
// AM check values: REFERENCE.md 8.1 (computed there with scipy.signal.hilbert):
// x = (1 + 0.5 cos(2 pi 37 t)) cos(2 pi 3000 t), fs 20 kHz, 1 s -> squared-envelope spectrum
// 1.000 at 37 Hz (2m) and 0.125 at 74 Hz (m^2/2); plain envelope 0.500 at 37 Hz (m).
#include "core/dsp/Envelope.h"
#include "core/dsp/Peaks.h"
#include "support/TestSupport.h"

#include <gtest/gtest.h>

#include <cmath>
#include <tuple>
#include <limits>
#include <numbers>
#include <random>

namespace humwise::dsp {
namespace {

using std::numbers::pi;

std::vector<double> amSignal() {
    const double fs = 20000;
    std::vector<double> x(20000);
    for (std::size_t n = 0; n < x.size(); ++n) {
        const double t = static_cast<double>(n) / fs;
        x[n] = (1.0 + 0.5 * std::cos(2 * pi * 37 * t)) * std::cos(2 * pi * 3000 * t);
    }
    return x;
}

EnvelopeRequest bandRequest(bool squared) {
    EnvelopeRequest r;
    r.bandLowHz = 2000;
    r.bandHighHz = 4000;
    r.squared = squared;
    r.spectrum.resolutionHz = 1.0;
    r.spectrum.fmaxHz = 200;
    r.spectrum.scale = SpectrumScale::Peak;
    r.spectrum.window = {WindowKind::Rectangular};
    return r;
}

// The record's transform has its mean removed (BandSignal.h), after the transform: line 0 is the
// only one a constant touches. Checked against a direct DFT of the centred record, in long
// double, with a large offset under the signal.
TEST(RecordSpectrum, LinesAreThoseOfTheCentredRecord) {
    const double fs = 1000;
    auto x = test::sine(1.0, 37.0, fs, 1999);
    test::add(x, test::gaussianNoise(0.1, x.size(), 3));
    for (double& v : x) v += 250.0;
    const RecordSpectrum record(x, fs);
    long double mean = 0;
    for (double v : x) mean += v;
    mean /= static_cast<long double>(x.size());
    const long double n = static_cast<long double>(x.size());
    for (const std::size_t k : {std::size_t{0}, std::size_t{1}, std::size_t{74}, std::size_t{500}, std::size_t{999}}) {
        long double re = 0, im = 0;
        for (std::size_t i = 0; i < x.size(); ++i) {
            const long double phase = -2.0L * std::numbers::pi_v<long double> * static_cast<long double>(k * i) / n;
            re += (x[i] - mean) * std::cos(phase);
            im += (x[i] - mean) * std::sin(phase);
        }
        EXPECT_NEAR(record.bins()[k].real(), static_cast<double>(re), 1e-9) << k;
        EXPECT_NEAR(record.bins()[k].imag(), static_cast<double>(im), 1e-9) << k;
    }
}

TEST(Envelope, AmplitudeModulationGivesTheKnownLines) {
    const auto x = amSignal();
    const auto sq = envelopeSpectrum(x, 20000, bandRequest(true));
    ASSERT_TRUE(sq.ok()) << sq.error().message;
    EXPECT_NEAR(sq.value().spectrum.values[37], 1.000, 1e-3);
    EXPECT_NEAR(sq.value().spectrum.values[74], 0.125, 1e-3);
    const auto plain = envelopeSpectrum(x, 20000, bandRequest(false));
    ASSERT_TRUE(plain.ok());
    EXPECT_NEAR(plain.value().spectrum.values[37], 0.500, 1e-3);
    EXPECT_LT(plain.value().spectrum.values[74], 1e-3);
    EXPECT_GE(sq.value().envelopeRateHz, 2 * (4000 - 2000)); // |z|^2 spans the band width: no aliasing
}

TEST(Envelope, BandOutsideNyquistIsRefused) {
    const auto x = amSignal();
    auto r = bandRequest(true);
    r.bandHighHz = 15000;
    EXPECT_EQ(envelopeSpectrum(x, 20000, r).error().code, AnalysisError::Code::InvalidRequest);
    EXPECT_EQ(envelopeSpectrum(std::vector<double>(10, 0.0), 20000, bandRequest(true)).error().code,
              AnalysisError::Code::RecordTooShort);
}

TEST(Envelope, FmaxMustBeFiniteAndIsCappedAtNyquist) {
    const auto x = amSignal();
    for (const double bad : {0.0, -5.0, std::nan(""), std::numeric_limits<double>::infinity()}) {
        auto r = bandRequest(true);
        r.spectrum.fmaxHz = bad;
        const auto e = envelopeSpectrum(x, 20000, r);
        ASSERT_FALSE(e.ok()) << "fmax " << bad;
        EXPECT_EQ(e.error().code, AnalysisError::Code::InvalidRequest);
    }
    // 1e300 Hz once converted a line count beyond any integer (undefined behaviour); now it
    // means "up to Nyquist" and the lines found are those of the plain request.
    auto huge = bandRequest(true);
    huge.spectrum.fmaxHz = 1e300;
    const auto capped = envelopeSpectrum(x, 20000, huge);
    ASSERT_TRUE(capped.ok()) << capped.error().message;
    EXPECT_NEAR(capped.value().spectrum.values[37], 1.000, 1e-3);
    EXPECT_LE(capped.value().spectrum.frequencyHz(capped.value().spectrum.lineCount() - 1), 10000.0 + 1e-9);
}

// Bearing-like impacts (repetition 97 Hz with 1 % random jitter) ringing a 3.2 kHz resonance, in
// Gaussian noise, with a strong 1X tone: the kurtogram must pick a band around the resonance and
// the envelope spectrum must show 97 Hz as its strongest line.
TEST(Envelope, KurtogramFindsTheResonanceOfRepeatedImpacts) {
    const double fs = 25600, fFault = 97.0, fRes = 3200.0;
    const std::size_t n = 25600 * 4;
    std::vector<double> x = test::gaussianNoise(0.3, n, 21);
    test::add(x, test::sine(2.0, 24.6, fs, n));
    std::mt19937_64 rng(5);
    std::normal_distribution<double> jitter(0.0, 0.01 / fFault);
    for (double t0 = 0.005; t0 < static_cast<double>(n) / fs; t0 += 1.0 / fFault + jitter(rng)) {
        const auto start = static_cast<std::size_t>(t0 * fs);
        for (std::size_t i = 0; i < 400 && start + i < n; ++i) {
            const double t = static_cast<double>(i) / fs;
            x[start + i] += 1.5 * std::exp(-t * 800.0) * std::sin(2 * pi * fRes * t);
        }
    }
    EnvelopeRequest r;
    r.autoBand = true;
    r.kurtogram.minBandwidthHz = 500;
    r.spectrum.fmaxHz = 500;
    const auto e = envelopeSpectrum(x, fs, r);
    ASSERT_TRUE(e.ok()) << e.error().message;
    ASSERT_TRUE(e.value().kurtogram.has_value());
    EXPECT_LE(e.value().bandLowHz, fRes);
    EXPECT_GE(e.value().bandHighHz, fRes);
    EXPECT_GT(e.value().kurtogram->best.kurtosis, 1.0);
    const auto peaks = findPeaks(e.value().spectrum, {.maxPeaks = 1, .minFrequencyHz = 20});
    ASSERT_EQ(peaks.size(), 1u);
    EXPECT_NEAR(peaks[0].frequencyHz, fFault, 0.01 * fFault);
}

// The kurtogram's band search runs its inverse transforms in single precision: on impacts in
// noise, every band's kurtosis and mean square agree with the double-precision ones to 1e-5.
TEST(Kurtogram, SinglePrecisionBandMomentsAgreeWithDouble) {
    const double fs = 25600;
    const std::size_t n = 25600 * 2;
    std::vector<double> x = test::gaussianNoise(0.3, n, 4);
    for (std::size_t start = 100; start + 300 < n; start += 263)
        for (std::size_t i = 0; i < 300; ++i) x[start + i] += std::exp(-static_cast<double>(i) / 40.0) * std::sin(2 * pi * 4100.0 * static_cast<double>(i) / fs);
    const RecordSpectrum spectrum(x, fs);
    std::size_t bands = 0;
    for (double width : {12800.0, 4266.67, 1600.0, 800.0})
        for (double lo = 0; lo + width <= fs / 2 + 1e-6; lo += width, ++bands) {
            const auto d = bandMoments(spectrum, lo, lo + width, 0, 0.1, Precision::Double);
            const auto f = bandMoments(spectrum, lo, lo + width, 0, 0.1, Precision::Single);
            EXPECT_NEAR(f.kurtosis, d.kurtosis, 1e-5 * std::max(1.0, std::abs(d.kurtosis))) << lo << " - " << lo + width << " Hz";
            EXPECT_NEAR(f.meanSquare, d.meanSquare, 1e-5 * d.meanSquare) << lo << " - " << lo + width << " Hz";
        }
    EXPECT_GT(bands, 20u);
}

// The single-precision moments are summed in float lanes (BandSignal.cpp); a band whose |z|^4
// leaves the float range (|z| above ~4e9) is summed again in double and still agrees.
TEST(Kurtogram, SinglePrecisionMomentsOfHugeSamplesStayFinite) {
    const double fs = 25600;
    std::vector<double> x = test::gaussianNoise(3e10, 25600, 5);
    const RecordSpectrum spectrum(x, fs);
    const auto d = bandMoments(spectrum, 1000, 5000, 0, 0.1, Precision::Double);
    const auto f = bandMoments(spectrum, 1000, 5000, 0, 0.1, Precision::Single);
    ASSERT_TRUE(std::isfinite(f.kurtosis));
    EXPECT_GT(f.meanSquare, 1e19); // |z|^4 ~ 1e41: beyond float
    EXPECT_NEAR(f.kurtosis, d.kurtosis, 1e-5);
    EXPECT_NEAR(f.meanSquare, d.meanSquare, 1e-5 * d.meanSquare);
}

// ... and a band of tiny samples, whose |z|^4 (about 1e-48 here) lies below float's range: summed
// in float it would come out 0 and the kurtosis -2; it is summed again in double.
TEST(Kurtogram, SinglePrecisionMomentsOfTinySamplesKeepTheirDigits) {
    const double fs = 25600;
    std::vector<double> x = test::gaussianNoise(1e-12, 25600, 6);
    const RecordSpectrum spectrum(x, fs);
    const auto d = bandMoments(spectrum, 1000, 5000, 0, 0.1, Precision::Double);
    const auto f = bandMoments(spectrum, 1000, 5000, 0, 0.1, Precision::Single);
    EXPECT_LT(d.meanSquare, 1e-23);
    EXPECT_NEAR(f.kurtosis, d.kurtosis, 1e-5);
    EXPECT_NEAR(f.meanSquare, d.meanSquare, 1e-5 * d.meanSquare);
}

// extractBand's length is a multiple of the one asked for (the envelope asks for 8: Envelope.cpp)
// and holds at least the band's lines and the asked minimum.
TEST(Envelope, BandSignalLengthIsAMultipleOfTheAskedOne) {
    const double fs = 25600;
    const RecordSpectrum spectrum(test::gaussianNoise(0.3, 102400, 3), fs); // 0.25 Hz lines
    for (const auto& [lo, hi, minLength] : {std::tuple{3000.0, 3800.0, 0u}, {1066.7, 5333.3, 34134u}, {9000.0, 12800.0, 25725u}}) {
        const auto band = extractBand(spectrum, lo, hi, minLength, 0.1, 8);
        EXPECT_EQ(band.samples.size() % 8, 0u) << lo << " - " << hi << " Hz";
        EXPECT_GE(band.samples.size(), std::max<std::size_t>(minLength, static_cast<std::size_t>((hi - lo) / 0.25)));
        EXPECT_DOUBLE_EQ(band.sampleRateHz, 0.25 * static_cast<double>(band.samples.size()));
    }
    EXPECT_EQ(extractBand(spectrum, 9000.0, 12800.0, 25725, 0.1, 1).samples.size(), 25725u); // 3 5^2 7^3: fast, odd
}

// Band transforms are kept per thread and length and reused (BandSignal.cpp): a band cut after
// others of the same and other lengths - a wider one left the buffer full of its own lines -
// gives exactly what it gave the first time, and a band signal is what it was.
TEST(Kurtogram, ReusedBandTransformsLeaveNothingBehind) {
    const double fs = 25600;
    std::vector<double> x = test::gaussianNoise(0.3, 25600, 9);
    const RecordSpectrum spectrum(x, fs);
    const auto first = bandMoments(spectrum, 3000, 3800, 0, 0.1, Precision::Single);
    const auto firstSignal = extractBand(spectrum, 3000, 3800, 0, 0.1);
    for (double lo : {0.0, 6000.0, 100.0})
        (void)bandMoments(spectrum, lo, lo + (lo == 0.0 ? 12800.0 : 800.0), lo == 100.0 ? 4096 : 0, 0.0, Precision::Single);
    (void)extractBand(spectrum, 0, 12800, 0, 0.1);
    (void)extractBand(spectrum, 9000, 9800, 0, 0.0);
    const auto again = bandMoments(spectrum, 3000, 3800, 0, 0.1, Precision::Single);
    EXPECT_EQ(again.meanSquare, first.meanSquare);
    EXPECT_EQ(again.kurtosis, first.kurtosis);
    EXPECT_EQ(extractBand(spectrum, 3000, 3800, 0, 0.1).samples, firstSignal.samples);
}

// Antoni 2007: Gaussian noise has SK near 0 in every band, a pure tone -1.
TEST(Kurtogram, NoiseIsNearZeroAndATonesBandIsNegative) {
    const double fs = 16384;
    const auto noise = test::gaussianNoise(1.0, 65536, 8);
    const auto k = fastKurtogram(RecordSpectrum(noise, fs));
    // The estimate's spread is about 2 / sqrt(B T) for a band of width B over T seconds: judge the
    // wide bands (B T >= 2048) one by one and the whole grid on average.
    double sum = 0;
    for (const auto& c : k.cells) {
        sum += c.kurtosis;
        if (c.bandwidthHz() * 4.0 >= 2048) {
            EXPECT_LT(std::abs(c.kurtosis), 0.25) << c.loHz << "-" << c.hiHz << " level " << c.level;
        }
    }
    EXPECT_LT(std::abs(sum / static_cast<double>(k.cells.size())), 0.1);
    const auto tone = test::sine(1.0, 1500.0, fs, 65536);
    KurtogramRequest narrow;
    narrow.maxLevel = 3;
    const auto kt = fastKurtogram(RecordSpectrum(tone, fs), narrow);
    bool found = false;
    for (const auto& c : kt.cells)
        if (c.loHz < 1450 && c.hiHz > 1550 && c.level == 3) {
            EXPECT_NEAR(c.kurtosis, -1.0, 0.05);
            found = true;
        }
    EXPECT_TRUE(found);
}

TEST(Kurtogram, GridFollowsTheOneThirdBinaryTree) {
    const auto noise = test::gaussianNoise(1.0, 8192, 9);
    KurtogramRequest r;
    r.maxLevel = 2;
    r.minRelativeDensityDb = -1000;
    const auto k = fastKurtogram(RecordSpectrum(noise, 8192), r);
    // Levels 0 (1 band), 1 (2), 1.585 (3), 2 (4): 10 cells.
    EXPECT_EQ(k.cells.size(), 10u);
    EXPECT_NEAR(k.cells[3].level, std::log2(3.0) + 0.0, 1e-12);
    EXPECT_NEAR(k.cells[3].bandwidthHz(), 4096.0 / 3.0, 1e-9);
}

} // namespace
} // namespace humwise::dsp
