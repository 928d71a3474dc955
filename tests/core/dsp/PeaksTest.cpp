// Peak interpolation: off-bin sine amplitude within 0.1 % with the flat-top and within 0.5 %
// with Hann + interpolation; frequency within 0.01 line at 60 dB SNR (the foundation issue's
// targets). The Hann case is Grandke's closed form (IEEE Trans. Instrum. Meas. 32(2), 1983),
// d = (2r - 1)/(r + 1), which the window-matched solver must reproduce.
#include "core/dsp/Peaks.h"
#include "support/TestSupport.h"

#include <gtest/gtest.h>

#include <cmath>
#include <limits>
#include <random>
#include <utility>
#include <vector>

namespace humwise::dsp {
namespace {

Spectrum spectrumOf(const std::vector<double>& x, double fs, WindowKind kind, std::size_t n) {
    SpectrumRequest r;
    r.window = {kind};
    r.resolutionHz = fs / static_cast<double>(n);
    r.fmaxHz = fs / 2;
    r.scale = SpectrumScale::Peak;
    return averagedSpectrum(x, fs, r).value();
}

TEST(Peaks, HannKernelReproducesGrandke) {
    for (double d : {0.0, 0.1, 0.25, 0.4, 0.5}) {
        const double r = windowKernel({WindowKind::Hann}, 4096, 1.0 - d) / windowKernel({WindowKind::Hann}, 4096, d);
        EXPECT_NEAR((2 * r - 1) / (r + 1), d, 1e-6);
    }
}

// The tabulated solver against a plain 40-step bisection of the exact kernel ratio, on three
// lines built from the kernel itself (any window, zero-padded or not, any offset): the same
// offset to 1e-9 line and the same amplitude to 1e-9 (the flat-top: its amplitude within 0.1 %).
TEST(Peaks, TabulatedSolverMatchesABisectionOfTheExactKernel) {
    const auto bisect = [](const WindowSpec& w, std::size_t n, double scale, double r) {
        const auto ratio = [&](double d) { return windowKernel(w, n, (1.0 - d) * scale) / windowKernel(w, n, d * scale); };
        if (r <= ratio(0.0)) return 0.0;
        double lo = 0.0, hi = 0.5;
        for (int it = 0; it < 40; ++it) (ratio(0.5 * (lo + hi)) < r ? lo : hi) = 0.5 * (lo + hi);
        return 0.5 * (lo + hi);
    };
    for (const WindowSpec w : {WindowSpec{WindowKind::Hann}, WindowSpec{WindowKind::BlackmanHarris}, WindowSpec{WindowKind::FlatTop},
                               WindowSpec{WindowKind::Kaiser, 9.0}, WindowSpec{WindowKind::Hamming}})
        for (std::size_t pad : {1u, 2u})
            for (double d = 0.0; d <= 0.5; d += 0.0437) {
                Spectrum s;
                s.segmentLength = 4096;
                s.transformLength = 4096 * pad;
                s.window = w;
                s.scale = SpectrumScale::Peak;
                s.resolutionHz = 0.25;
                const double scale = 1.0 / static_cast<double>(pad), amplitude = 3.0;
                s.values = {0.0, amplitude * windowKernel(w, 4096, (1.0 + d) * scale), amplitude * windowKernel(w, 4096, d * scale),
                            amplitude * windowKernel(w, 4096, (1.0 - d) * scale), 0.0};
                const Peak p = interpolatePeak(s, 2);
                const double r = s.values[3] / s.values[2];
                if (w.kind == WindowKind::FlatTop) {
                    // Its kernel ripples over the flat main lobe: the offset is ambiguous, the amplitude flat anyway.
                    EXPECT_NEAR(p.amplitude, amplitude, amplitude * 1e-3) << "pad " << pad << " d " << d;
                    continue;
                }
                const double expected = bisect(w, 4096, scale, r);
                EXPECT_NEAR((p.frequencyHz - 0.5) / 0.25, expected, 1e-9) << static_cast<int>(w.kind) << " pad " << pad << " d " << d;
                EXPECT_NEAR(p.amplitude, amplitude * windowKernel(w, 4096, d * scale) / windowKernel(w, 4096, expected * scale), 1e-9);
                EXPECT_NEAR(p.amplitude, amplitude, 1e-6) << static_cast<int>(w.kind) << " pad " << pad << " d " << d;
            }
}

TEST(Peaks, OffBinAmplitudeAndFrequencyAt60dBSnr) {
    const double fs = 8192.0;
    const std::size_t n = 8192;
    std::mt19937_64 rng(2024);
    std::uniform_real_distribution<double> offset(0.0, 1.0);
    for (int trial = 0; trial < 20; ++trial) {
        const double f = 500.0 + trial * 37.0 + offset(rng);
        const double amp = 1.0;
        // 60 dB SNR: noise RMS = signal RMS / 1000.
        auto x = test::sine(amp, f, fs, n * 4, 0.3 * trial);
        test::add(x, test::gaussianNoise(amp / std::sqrt(2.0) / 1000.0, x.size(), 77 + trial));
        SCOPED_TRACE("f=" + std::to_string(f));
        const auto hann = spectrumOf(x, fs, WindowKind::Hann, n);
        const auto ph = findPeaks(hann, {.maxPeaks = 1});
        ASSERT_EQ(ph.size(), 1u);
        EXPECT_NEAR(ph[0].amplitude, amp, 0.005 * amp);
        EXPECT_NEAR(ph[0].frequencyHz, f, 0.01 * hann.resolutionHz);
        const auto flat = spectrumOf(x, fs, WindowKind::FlatTop, n);
        const auto pf = findPeaks(flat, {.maxPeaks = 1});
        ASSERT_EQ(pf.size(), 1u);
        EXPECT_NEAR(pf[0].amplitude, amp, 0.001 * amp);
        // Without interpolation the flat-top line alone is already within 0.05 % (flatness 0.0044 dB).
        EXPECT_NEAR(flat.values[pf[0].line], amp, 0.0006 * amp);
    }
}

TEST(Peaks, KaiserAndBlackmanHarrisInterpolate) {
    const double fs = 4096.0;
    const auto x = test::sine(2.0, 301.37, fs, 4096 * 2);
    for (auto spec : {WindowSpec{WindowKind::Kaiser, 9.42}, WindowSpec{WindowKind::BlackmanHarris}, WindowSpec{WindowKind::Hamming}}) {
        SpectrumRequest r;
        r.window = spec;
        r.resolutionHz = 1.0;
        r.fmaxHz = 2048;
        r.scale = SpectrumScale::Peak;
        const auto p = findPeaks(averagedSpectrum(x, fs, r).value(), {.maxPeaks = 1});
        ASSERT_EQ(p.size(), 1u);
        EXPECT_NEAR(p[0].frequencyHz, 301.37, 0.01) << windowName(spec);
        EXPECT_NEAR(p[0].amplitude, 2.0, 2.0 * 0.005) << windowName(spec);
    }
}

TEST(Peaks, StrongestFirstWithinTheRangeAndProminence) {
    const double fs = 4096.0;
    auto x = test::sine(1.0, 100.0, fs, 16384);
    test::add(x, test::sine(3.0, 250.0, fs, 16384));
    test::add(x, test::sine(0.5, 700.0, fs, 16384));
    test::add(x, test::gaussianNoise(0.001, 16384, 3));
    SpectrumRequest r;
    r.resolutionHz = 1.0;
    r.fmaxHz = 1600;
    const auto s = averagedSpectrum(x, fs, r).value();
    const auto all = findPeaks(s, {.maxPeaks = 3});
    ASSERT_EQ(all.size(), 3u);
    EXPECT_NEAR(all[0].frequencyHz, 250.0, 0.01);
    EXPECT_NEAR(all[1].frequencyHz, 100.0, 0.01);
    EXPECT_NEAR(all[2].frequencyHz, 700.0, 0.01);
    EXPECT_GT(all[2].prominence, 100.0);
    const auto band = findPeaks(s, {.maxPeaks = 5, .minFrequencyHz = 50, .maxFrequencyHz = 200});
    ASSERT_FALSE(band.empty());
    EXPECT_NEAR(band[0].frequencyHz, 100.0, 0.01);
    for (const auto& p : band) EXPECT_LE(p.frequencyHz, 200.0);
}

// A narrow range is searched only over its own lines (Peaks.cpp): it must find exactly the
// peaks a whole-spectrum search finds in that range, on a spectrum that does not start at 0 Hz,
// for ranges at its ends, past them, around a tone sitting just outside, and with no bounds.
TEST(Peaks, NarrowRangesFindWhatTheWholeSearchFindsThere) {
    std::mt19937 rng(5);
    std::uniform_real_distribution<double> u(0.0, 1.0);
    Spectrum s;
    s.startHz = 37.5;
    s.resolutionHz = 0.25;
    s.window = {WindowKind::Hann};
    s.scale = SpectrumScale::Rms;
    s.segmentLength = s.transformLength = 8192;
    for (int i = 0; i < 4000; ++i) s.values.push_back(0.01 + 0.01 * u(rng) + (i % 97 == 0 ? 1.0 : 0.0));
    const auto whole = findPeaks(s, {.maxPeaks = 100000});
    const auto inside = [&](double lo, double hi) {
        std::vector<Peak> v;
        for (const auto& p : whole)
            if (p.frequencyHz >= lo && p.frequencyHz <= hi) v.push_back(p);
        return v;
    };
    const double end = s.frequencyHz(s.lineCount() - 1);
    for (const auto& [lo, hi] : std::vector<std::pair<double, double>>{
             {0.0, 40.0}, {37.5, 38.0}, {s.frequencyHz(97) - 0.3, s.frequencyHz(97) + 0.3}, {s.frequencyHz(97) + 0.13, 80.0},
             {500.0, 520.25}, {end - 2.0, end}, {end + 1.0, end + 50.0}, {-100.0, 30.0}, {0.0, 1e9}}) {
        const auto got = findPeaks(s, {.maxPeaks = 100000, .minFrequencyHz = lo, .maxFrequencyHz = hi});
        const auto want = inside(lo, hi);
        ASSERT_EQ(got.size(), want.size()) << lo << " - " << hi << " Hz";
        for (std::size_t i = 0; i < got.size(); ++i) {
            EXPECT_EQ(got[i].frequencyHz, want[i].frequencyHz) << lo << " - " << hi << " Hz";
            EXPECT_EQ(got[i].amplitude, want[i].amplitude) << lo << " - " << hi << " Hz";
        }
        if (lo <= s.frequencyHz(97) && s.frequencyHz(97) <= hi) {
            EXPECT_FALSE(got.empty()) << "the tone at line 97";
        }
    }
    EXPECT_EQ(findPeaks(s, {.maxPeaks = 100000, .minFrequencyHz = 0, .maxFrequencyHz = std::numeric_limits<double>::infinity()}).size(), whole.size());
}

TEST(Peaks, PsdSpectraInterpolateInPower) {
    const double fs = 2048.0;
    const auto x = test::sine(2.0, 123.4, fs, 2048 * 4);
    SpectrumRequest r;
    r.resolutionHz = 1.0;
    r.fmaxHz = 1024;
    r.scale = SpectrumScale::Psd;
    const auto s = averagedSpectrum(x, fs, r).value();
    const auto p = findPeaks(s, {.maxPeaks = 1});
    ASSERT_EQ(p.size(), 1u);
    EXPECT_NEAR(p[0].frequencyHz, 123.4, 0.01);
    // A bin-centred tone's PSD line is A^2/2 / ENBW: the interpolated value equals that.
    EXPECT_NEAR(p[0].amplitude, 2.0 / s.enbwHz, 0.01 * 2.0 / s.enbwHz);
}

TEST(Peaks, FlatOrTinySpectraGiveNoPeaks) {
    Spectrum s;
    s.values = {0, 0, 0, 0};
    s.resolutionHz = 1;
    s.segmentLength = s.transformLength = 8;
    EXPECT_TRUE(findPeaks(s).empty());
    s.values = {1, 2};
    EXPECT_TRUE(findPeaks(s).empty());
}

} // namespace
} // namespace humwise::dsp
