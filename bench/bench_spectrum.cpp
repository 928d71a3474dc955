// Spectrum throughput for one 10 s channel at 25.6 kHz (the foundation issue's benchmark):
// averaged spectrum, envelope spectrum (given band and kurtogram band) and, as the floor, the
// bare FFTW r2c transforms of the same segments. Target: averaged spectrum within 1.5x the floor.
// Usage: bench_spectrum [repetitions]   (prints a table; figures go into bench/README.md)

#include "core/dsp/Envelope.h"
#include "core/dsp/Fft.h"
#include "core/dsp/Spectrum.h"

#include <algorithm>
#include <chrono>
#include <cmath>
#include <cstdio>
#include <cstdlib>
#include <functional>
#include <numbers>
#include <random>
#include <vector>

namespace {

using namespace humwise;
using Clock = std::chrono::steady_clock;

double medianSeconds(int repetitions, const std::function<void()>& work) {
    work(); // warm-up: plans, caches
    std::vector<double> t;
    for (int i = 0; i < repetitions; ++i) {
        const auto start = Clock::now();
        work();
        t.push_back(std::chrono::duration<double>(Clock::now() - start).count());
    }
    std::sort(t.begin(), t.end());
    return t[t.size() / 2];
}

std::vector<double> testSignal(double fs, std::size_t n) {
    std::mt19937_64 rng(1);
    std::normal_distribution<double> noise(0.0, 0.2);
    std::vector<double> x(n);
    for (std::size_t i = 0; i < n; ++i) {
        const double t = static_cast<double>(i) / fs;
        x[i] = std::sin(2 * std::numbers::pi * 29.6 * t) + 0.3 * std::sin(2 * std::numbers::pi * 3100 * t) + noise(rng);
    }
    return x;
}

volatile double g_sink = 0; // keeps the optimiser from dropping the work

} // namespace

int main(int argc, char** argv) {
    const int reps = argc > 1 ? std::max(3, std::atoi(argv[1])) : 30;
    const double fs = 25600;
    const std::size_t n = 256000; // 10 s
    const auto x = testSignal(fs, n);

    dsp::SpectrumRequest request; // defaults: Hann, 3200 lines over fs/2.56 -> 8192 points, 50 % overlap
    const auto probe = dsp::averagedSpectrum(x, fs, request).value();
    const std::size_t seg = probe.segmentLength, step = seg / 2, segments = probe.averages;

    const double floor = medianSeconds(reps, [&] {
        dsp::RealFft<double> fft(seg);
        double acc = 0;
        for (std::size_t a = 0; a < segments; ++a) {
            std::copy_n(x.begin() + static_cast<std::ptrdiff_t>(a * step), seg, fft.input().begin());
            fft.execute();
            acc += std::norm(fft.output()[1]);
        }
        g_sink = acc;
    });
    const double averaged = medianSeconds(reps, [&] { g_sink = dsp::averagedSpectrum(x, fs, request).value().values[10]; });

    dsp::EnvelopeRequest band;
    band.bandLowHz = 2000;
    band.bandHighHz = 5000;
    band.spectrum.fmaxHz = 500;
    const double envelope = medianSeconds(reps, [&] { g_sink = dsp::envelopeSpectrum(x, fs, band).value().spectrum.values[5]; });
    dsp::EnvelopeRequest automatic = band;
    automatic.autoBand = true;
    automatic.kurtogram.minBandwidthHz = 500;
    const double envelopeAuto = medianSeconds(std::max(3, reps / 5), [&] { g_sink = dsp::envelopeSpectrum(x, fs, automatic).value().spectrum.values[5]; });

    const double msps = static_cast<double>(n) / 1e6;
    std::printf("Spectrum benchmark: one channel, %.0f s at %.0f Hz (%zu samples); %zu-point segments, %zu averages, Hann, 50 %% overlap; median of %d runs\n\n",
                static_cast<double>(n) / fs, fs, n, seg, segments, reps);
    std::printf("%-42s %10s %14s %10s\n", "work", "ms", "Msamples/s", "x floor");
    const auto row = [&](const char* name, double s) { std::printf("%-42s %10.3f %14.1f %10.2f\n", name, s * 1e3, msps / s, s / floor); };
    row("floor: bare FFTW r2c of the same segments", floor);
    row("averaged spectrum (target <= 1.5x floor)", averaged);
    row("envelope spectrum, band 2-5 kHz", envelope);
    row("envelope spectrum, kurtogram band", envelopeAuto);
    std::printf("\naveraged/floor = %.2f (%s)\n", averaged / floor, averaged / floor <= 1.5 ? "target met" : "TARGET MISSED");
    return 0;
}
