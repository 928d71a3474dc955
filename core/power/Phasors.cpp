#include "core/power/Phasors.h"

#include <algorithm>
#include <cmath>
#include <numbers>
#include <stdexcept>
#include <string>

namespace humwise::power {
namespace {

using Complex = std::complex<double>;

// Samples between exact re-evaluations of exp(j w n) in the rotating-phasor loop: the rounding
// of the complex multiplication grows by about one ulp per step, so this keeps it below 1e-13.
constexpr std::size_t kAnchorEvery = 1024;

// D(alpha) = sum_{n=0}^{N-1} exp(j alpha n) in closed form (geometric series / Dirichlet
// kernel, standard identity): exp(j alpha (N-1)/2) sin(N alpha / 2) / sin(alpha / 2).
// alpha is first reduced to (-pi, pi] (n is an integer), so the only removable singularity is 0.
Complex dirichletSum(double alpha, std::size_t count) {
    const double n = static_cast<double>(count);
    const double r = std::remainder(alpha, 2.0 * std::numbers::pi);
    if (r == 0.0) return {n, 0.0};
    const double ratio = std::sin(n * r / 2.0) / std::sin(r / 2.0);
    return std::polar(ratio, r * (n - 1.0) / 2.0);
}

// sum_n y[n] exp(j w n), with exp(j w n) rotated sample by sample and re-anchored exactly every
// kAnchorEvery samples; block sums are added to the total (two-level summation). Four
// interleaved rotators (phases n, n+1, n+2, n+3, each stepped by 4w) break the loop-carried
// dependency of a single rotator, and the complex products are written out in real arithmetic
// (std::complex multiplication keeps a NaN/infinity fix-up path in every step): this sum is the
// hot spot of the harmonic analysis, 50 tones over every sample.
Complex weightedSum(std::span<const double> y, double w) {
    constexpr std::size_t kLanes = 4;
    static_assert(kAnchorEvery % kLanes == 0);
    const double stepRe = std::cos(kLanes * w), stepIm = std::sin(kLanes * w);
    double totalRe = 0, totalIm = 0;
    for (std::size_t start = 0; start < y.size(); start += kAnchorEvery) {
        const std::size_t end = std::min(y.size(), start + kAnchorEvery);
        double zr[kLanes], zi[kLanes], ar[kLanes] = {}, ai[kLanes] = {};
        for (std::size_t l = 0; l < kLanes; ++l) {
            zr[l] = std::cos(w * static_cast<double>(start + l));
            zi[l] = std::sin(w * static_cast<double>(start + l));
        }
        std::size_t n = start;
        for (; n + kLanes <= end; n += kLanes)
            for (std::size_t l = 0; l < kLanes; ++l) {
                ar[l] += y[n + l] * zr[l];
                ai[l] += y[n + l] * zi[l];
                const double r = zr[l] * stepRe - zi[l] * stepIm;
                zi[l] = zr[l] * stepIm + zi[l] * stepRe;
                zr[l] = r;
            }
        for (std::size_t l = 0; n < end; ++n, ++l) { // the last block's tail: lane l holds phase n
            ar[l] += y[n] * zr[l];
            ai[l] += y[n] * zi[l];
        }
        totalRe += (ar[0] + ar[1]) + (ar[2] + ar[3]);
        totalIm += (ai[0] + ai[1]) + (ai[2] + ai[3]);
    }
    return {totalRe, totalIm};
}

// Solves G theta = b in place for a symmetric positive-definite G (row-major, m x m) by
// Cholesky; throws when a pivot collapses (columns not separable in this record).
std::vector<double> choleskySolve(std::vector<double> g, std::vector<double> b, std::size_t m) {
    for (std::size_t j = 0; j < m; ++j) {
        double d = g[j * m + j];
        for (std::size_t k = 0; k < j; ++k) d -= g[j * m + k] * g[j * m + k];
        // The relative pivot bound is a Humwise choice: below it the fit amplifies rounding
        // by more than ~1e5 and the frequencies cannot be told apart in this record.
        if (!(d > 1e-10 * g[j * m + j]))
            throw std::invalid_argument("fitTones: the frequencies cannot be separated in this record "
                                        "(too short, or a frequency at 0 or fs/2, or two equal)");
        const double l = std::sqrt(d);
        g[j * m + j] = l;
        for (std::size_t i = j + 1; i < m; ++i) {
            double s = g[i * m + j];
            for (std::size_t k = 0; k < j; ++k) s -= g[i * m + k] * g[j * m + k];
            g[i * m + j] = s / l;
        }
    }
    for (std::size_t i = 0; i < m; ++i) { // L y = b
        for (std::size_t k = 0; k < i; ++k) b[i] -= g[i * m + k] * b[k];
        b[i] /= g[i * m + i];
    }
    for (std::size_t i = m; i-- > 0;) { // L^T theta = y
        for (std::size_t k = i + 1; k < m; ++k) b[i] -= g[k * m + i] * b[k];
        b[i] /= g[i * m + i];
    }
    return b;
}

void checkArguments(std::span<const double> x, double fs, std::span<const double> freqs) {
    if (!(fs > 0) || !std::isfinite(fs)) throw std::invalid_argument("fitTones: sample rate must be positive");
    if (freqs.empty()) throw std::invalid_argument("fitTones: no frequency to fit");
    if (x.size() < 2 * freqs.size() + 2)
        throw std::invalid_argument("fitTones: record too short (" + std::to_string(x.size()) + " samples for " +
                                    std::to_string(freqs.size()) + " frequencies)");
    double lowest = fs;
    for (double f : freqs) {
        if (!(f > 0) || !(f < fs / 2.0))
            throw std::invalid_argument("fitTones: frequency " + std::to_string(f) + " Hz outside (0, fs/2)");
        lowest = std::min(lowest, f);
    }
    if (static_cast<double>(x.size()) / fs < 1.0 / lowest)
        throw std::invalid_argument("fitTones: record shorter than one period of " + std::to_string(lowest) + " Hz");
    for (double v : x)
        if (!std::isfinite(v)) throw std::invalid_argument("fitTones: non-finite sample");
}

} // namespace

std::complex<double> toComplex(const Phasor& p) { return std::polar(p.magnitude, p.phaseRad); }

Phasor toPhasor(std::complex<double> z) { return {std::abs(z), std::arg(z)}; }

ToneFit fitTones(std::span<const double> x, double sampleRateHz, std::span<const double> frequenciesHz) {
    checkArguments(x, sampleRateHz, frequenciesHz);
    const std::size_t count = x.size(), k = frequenciesHz.size(), m = 2 * k + 1;

    // Remove the sample mean first (the constant column absorbs the rest): keeps the residual
    // energy below free of cancellation when the offset is large.
    double mean = 0;
    for (double v : x) mean += v;
    mean /= static_cast<double>(count);
    std::vector<double> y(x.begin(), x.end());
    double energy = 0;
    for (double& v : y) { v -= mean; energy += v * v; }

    std::vector<double> w(k);
    for (std::size_t i = 0; i < k; ++i) w[i] = 2.0 * std::numbers::pi * frequenciesHz[i] / sampleRateHz;

    // Columns: 0 = constant, 1 + 2i = cos(w_i n), 2 + 2i = sin(w_i n). Gram entries from the
    // product-to-sum identities cos A cos B = (cos(A-B) + cos(A+B))/2,
    // sin A sin B = (cos(A-B) - cos(A+B))/2, cos A sin B = (sin(A+B) - sin(A-B))/2.
    std::vector<double> g(m * m, 0.0), b(m, 0.0);
    g[0] = static_cast<double>(count);
    for (double v : y) b[0] += v;
    for (std::size_t i = 0; i < k; ++i) {
        const Complex d = dirichletSum(w[i], count);
        g[1 + 2 * i] = g[(1 + 2 * i) * m] = d.real();
        g[2 + 2 * i] = g[(2 + 2 * i) * m] = d.imag();
        const Complex s = weightedSum(y, w[i]);
        b[1 + 2 * i] = s.real();
        b[2 + 2 * i] = s.imag();
        for (std::size_t j = 0; j < k; ++j) {
            const Complex dm = dirichletSum(w[i] - w[j], count), dp = dirichletSum(w[i] + w[j], count);
            g[(1 + 2 * i) * m + 1 + 2 * j] = 0.5 * (dm.real() + dp.real());
            g[(2 + 2 * i) * m + 2 + 2 * j] = 0.5 * (dm.real() - dp.real());
            g[(1 + 2 * i) * m + 2 + 2 * j] = 0.5 * (dp.imag() - dm.imag());
            g[(2 + 2 * j) * m + 1 + 2 * i] = g[(1 + 2 * i) * m + 2 + 2 * j];
        }
    }
    const auto theta = choleskySolve(g, b, m);

    ToneFit fit;
    fit.offset = mean + theta[0];
    double explained = 0; // theta . b = energy of the fitted model (least-squares identity)
    for (std::size_t i = 0; i < m; ++i) explained += theta[i] * b[i];
    fit.residualRms = std::sqrt(std::max(0.0, energy - explained) / static_cast<double>(count));
    fit.phasors.reserve(k);
    for (std::size_t i = 0; i < k; ++i) {
        const double a = theta[1 + 2 * i], s = theta[2 + 2 * i];
        fit.phasors.push_back({std::hypot(a, s) / std::numbers::sqrt2, std::atan2(-s, a)});
    }
    return fit;
}

Phasor phasorAt(std::span<const double> x, double sampleRateHz, double frequencyHz) {
    const double f[] = {frequencyHz};
    return fitTones(x, sampleRateHz, f).phasors.front();
}

SequenceComponents symmetricalComponents(std::complex<double> a, std::complex<double> b, std::complex<double> c) {
    // Fortescue 1918 (REFERENCE.md 6.6, published textbook form): operator a = 1 /_120 deg.
    const Complex op = std::polar(1.0, 2.0 * std::numbers::pi / 3.0);
    const Complex op2 = op * op;
    return {(a + b + c) / 3.0, (a + op * b + op2 * c) / 3.0, (a + op2 * b + op * c) / 3.0};
}

} // namespace humwise::power
