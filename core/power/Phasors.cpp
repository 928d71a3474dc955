#include "core/power/Phasors.h"

#include "core/util/DoubleLanes.h"
#include "core/util/Sums.h"
#include "core/util/VectorClones.h"

#include <algorithm>
#include <cmath>
#include <numbers>
#include <stdexcept>
#include <string>

namespace humwise::power {
namespace {

using Complex = std::complex<double>;

// Samples per block of the tone sums below: each block's sums start from zero and are rotated
// into place exactly (std::polar), so the rounding of the recursion cannot grow over the record.
// 4096 keeps it below 1e-13 of the fundamental over 200 000 samples (checked against long
// double sums while choosing it) and the per-block work (one std::polar per tone) negligible.
constexpr std::size_t kBlock = 4096;

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

// The Goertzel recursion s[m] = y[m] + 2 cos(w) s[m-1] - s[m-2] in Reinsch's form, with
// lambda = -4 sin^2(w/2) = 2 cos(w) - 2 and u[m] = s[m] - s[m-1]:
//     u[m] = u[m-1] + lambda s[m-1] + y[m],   s[m] = s[m-1] + u[m].
// (G. Goertzel, "An algorithm for the evaluation of finite trigonometric series", American
// Mathematical Monthly 65, 1958; the modification by C. Reinsch as given in J. Stoer and
// R. Bulirsch, "Introduction to Numerical Analysis", section on trigonometric sums; citations
// from memory (verify).) Reinsch's form keeps its accuracy at low w, where the plain recursion
// loses digits as 1/sin(w) (1e-11 at 1 Hz in 10 kHz against 1e-15 here).
//
// Each (tone, block) pair is one chain of dependent additions, a few processor cycles per sample
// whatever the vector width; speed comes from running enough chains side by side, their state in
// registers. Two layouts of four-double lanes (one AVX register in the x86-64-v3 clone, two SSE
// registers in the baseline one):
// - tones across the lanes (many tones): 8 tones in two vectors, kToneBlocks blocks side by side,
//   each block's sample broadcast to its lanes;
// - blocks across the lanes (few tones): one tone, kLaneBlocks blocks in kLaneBlocks / 4 vectors,
//   each lane reading its own block.
// The first keeps 12 vectors of state (15 of the 16 AVX registers with its two lambdas and the
// sample), the second 6.
using Lanes = util::DoubleLanes;
using util::loadLanes;
using util::storeLanes;
constexpr std::size_t kToneLanes = 8;
constexpr std::size_t kToneBlocks = 3;
constexpr std::size_t kLaneBlocks = 12;
constexpr std::size_t kFewTones = 4; // below this, blocks across the lanes

// Blocks b = 0 .. Blocks-1 of `len` samples at x + b len, tones in groups of 8 (lambda, s and u
// padded to `tones`, a multiple of 8; state of block b, tone t at [b tones + t]; from zero).
template <std::size_t Blocks>
HUMWISE_VECTOR_CLONES void reinschTonesAcrossLanes(const double* x, std::size_t len, double mean, const double* lambda,
                                                   std::size_t tones, double* s, double* u) {
    for (std::size_t t0 = 0; t0 < tones; t0 += kToneLanes) {
        Lanes lam[2];
        loadLanes(lam[0], lambda + t0);
        loadLanes(lam[1], lambda + t0 + 4);
        Lanes sv[Blocks][2] = {}, uv[Blocks][2] = {};
        for (std::size_t m = 0; m < len; ++m)
            for (std::size_t b = 0; b < Blocks; ++b) {
                const Lanes y = Lanes{} + (x[b * len + m] - mean);
                for (std::size_t v = 0; v < 2; ++v) {
                    uv[b][v] += lam[v] * sv[b][v] + y;
                    sv[b][v] += uv[b][v];
                }
            }
        for (std::size_t b = 0; b < Blocks; ++b)
            for (std::size_t v = 0; v < 2; ++v) {
                storeLanes(s + b * tones + t0 + 4 * v, sv[b][v]);
                storeLanes(u + b * tones + t0 + 4 * v, uv[b][v]);
            }
    }
}

// One tone over kLaneBlocks blocks of `len` samples at x + b len, block b in lane b % 4 of
// vector b / 4; its state written to s[b], u[b]; from zero.
HUMWISE_VECTOR_CLONES void reinschBlocksAcrossLanes(const double* x, std::size_t len, double mean, double lambda, double* s,
                                                    double* u) {
    constexpr std::size_t kVectors = kLaneBlocks / 4;
    const Lanes lam = Lanes{} + lambda;
    Lanes sv[kVectors] = {}, uv[kVectors] = {};
    for (std::size_t m = 0; m < len; ++m)
        for (std::size_t v = 0; v < kVectors; ++v) {
            const double* p = x + 4 * v * len + m;
            const Lanes y = Lanes{p[0], p[len], p[2 * len], p[3 * len]} - mean;
            uv[v] += lam * sv[v] + y;
            sv[v] += uv[v];
        }
    for (std::size_t v = 0; v < kVectors; ++v) {
        storeLanes(s + 4 * v, sv[v]);
        storeLanes(u + 4 * v, uv[v]);
    }
}

// sum_n (x[n] - mean) exp(j w_t n) for every tone t. After a block of L samples from `start`,
// s[L-1] - exp(-j w) s[L-2] = sum_m y[m] exp(j w (L-1-m)) (the Goertzel identity), i.e. with
// s[L-2] = s[L-1] - u[L-1]:  G = s (1 - cos w) + u cos w + j sin(w) (s - u); the block's share
// of the sum is then conj(G exp(-j w (L-1))) exp(j w start) (x is real).
std::vector<Complex> toneSums(std::span<const double> x, double mean, std::span<const double> w) {
    const std::size_t k = w.size();
    const std::size_t padded = (k + kToneLanes - 1) / kToneLanes * kToneLanes;
    std::vector<double> lambda(padded, 0.0), cosW(k), sinW(k);
    for (std::size_t t = 0; t < k; ++t) {
        const double half = std::sin(w[t] / 2.0);
        lambda[t] = -4.0 * half * half;
        cosW[t] = std::cos(w[t]);
        sinW[t] = std::sin(w[t]);
    }
    std::vector<Complex> sums(k);
    const std::size_t rows = std::max(kToneBlocks, kLaneBlocks);
    std::vector<double> s(rows * padded), u(rows * padded); // block b, tone t at [b * padded + t]
    std::size_t start = 0;
    while (start < x.size()) {
        const std::size_t fullBlocks = (x.size() - start) / kBlock;
        const double* at = x.data() + start;
        std::size_t blocks = 1, len = std::min(kBlock, x.size() - start);
        if (k < kFewTones && fullBlocks >= kLaneBlocks) {
            blocks = kLaneBlocks;
            double sb[kLaneBlocks], ub[kLaneBlocks];
            for (std::size_t t = 0; t < k; ++t) {
                reinschBlocksAcrossLanes(at, len, mean, lambda[t], sb, ub);
                for (std::size_t b = 0; b < blocks; ++b) {
                    s[b * padded + t] = sb[b];
                    u[b * padded + t] = ub[b];
                }
            }
        } else if (fullBlocks >= kToneBlocks) {
            blocks = kToneBlocks;
            reinschTonesAcrossLanes<kToneBlocks>(at, len, mean, lambda.data(), padded, s.data(), u.data());
        } else {
            reinschTonesAcrossLanes<1>(at, len, mean, lambda.data(), padded, s.data(), u.data());
        }
        for (std::size_t b = 0; b < blocks; ++b, start += len)
            for (std::size_t t = 0; t < k; ++t) {
                const double sv = s[b * padded + t], uv = u[b * padded + t];
                const Complex g(-0.5 * lambda[t] * sv + cosW[t] * uv, sinW[t] * (sv - uv));
                const double lastPhase = w[t] * static_cast<double>(len - 1);
                sums[t] += std::conj(g * std::polar(1.0, -lastPhase)) * std::polar(1.0, w[t] * static_cast<double>(start));
            }
    }
    return sums;
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
}

// The mean of x and the deviations' sums (util::meanAndDeviations: one pass); throws when a
// sample is not finite. The sums are finite exactly when every sample is (or the samples are so
// large that they overflow), so the samples are looked at one by one only then, for the right
// message.
util::MeanAndDeviations checkedMeanAndDeviations(std::span<const double> x) {
    const auto m = util::meanAndDeviations(x);
    if (!std::isfinite(m.about.squares) || !std::isfinite(m.mean)) {
        for (double v : x)
            if (!std::isfinite(v)) throw std::invalid_argument("fitTones: non-finite sample");
        throw std::invalid_argument("fitTones: samples too large to sum (the sum overflows)");
    }
    return m;
}

} // namespace

std::complex<double> toComplex(const Phasor& p) { return std::polar(p.magnitude, p.phaseRad); }

Phasor toPhasor(std::complex<double> z) { return {std::abs(z), std::arg(z)}; }

ToneFit fitTones(std::span<const double> x, double sampleRateHz, std::span<const double> frequenciesHz) {
    checkArguments(x, sampleRateHz, frequenciesHz);
    const std::size_t count = x.size(), k = frequenciesHz.size(), m = 2 * k + 1;

    // The sample mean is taken out of x first (the constant column absorbs the rest): keeps the
    // residual energy below free of cancellation when the offset is large. x is not copied; the
    // sums subtract the mean as they go.
    const auto [mean, deviations] = checkedMeanAndDeviations(x);
    const auto [sumY, energy] = deviations;

    std::vector<double> w(k);
    for (std::size_t i = 0; i < k; ++i) w[i] = 2.0 * std::numbers::pi * frequenciesHz[i] / sampleRateHz;
    const std::vector<Complex> sums = toneSums(x, mean, w);

    // Columns: 0 = constant, 1 + 2i = cos(w_i n), 2 + 2i = sin(w_i n). Gram entries from the
    // product-to-sum identities cos A cos B = (cos(A-B) + cos(A+B))/2,
    // sin A sin B = (cos(A-B) - cos(A+B))/2, cos A sin B = (sin(A+B) - sin(A-B))/2.
    std::vector<double> g(m * m, 0.0), b(m, 0.0);
    g[0] = static_cast<double>(count);
    b[0] = sumY;
    for (std::size_t i = 0; i < k; ++i) {
        const Complex d = dirichletSum(w[i], count);
        g[1 + 2 * i] = g[(1 + 2 * i) * m] = d.real();
        g[2 + 2 * i] = g[(2 + 2 * i) * m] = d.imag();
        b[1 + 2 * i] = sums[i].real();
        b[2 + 2 * i] = sums[i].imag();
        for (std::size_t j = 0; j <= i; ++j) { // G is symmetric: each pair once, written both ways
            const Complex dm = dirichletSum(w[i] - w[j], count), dp = dirichletSum(w[i] + w[j], count);
            const auto set = [&](std::size_t row, std::size_t col, double v) { g[row * m + col] = g[col * m + row] = v; };
            set(1 + 2 * i, 1 + 2 * j, 0.5 * (dm.real() + dp.real())); // cos_i cos_j
            set(2 + 2 * i, 2 + 2 * j, 0.5 * (dm.real() - dp.real())); // sin_i sin_j
            set(1 + 2 * i, 2 + 2 * j, 0.5 * (dp.imag() - dm.imag())); // cos_i sin_j
            set(2 + 2 * i, 1 + 2 * j, 0.5 * (dp.imag() + dm.imag())); // sin_i cos_j
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
