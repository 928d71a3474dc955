#include "core/dsp/BandSignal.h"

#include "core/dsp/Fft.h"
#include "core/dsp/KeptByLength.h"
#include "core/util/Sums.h"
#include "core/util/VectorClones.h"

#include <algorithm>
#include <cassert>
#include <cmath>
#include <cstring>
#include <map>
#include <memory>
#include <numbers>
#include <optional>
#include <stdexcept>
#include <type_traits>
#include <utility>
#include <vector>

namespace humwise::dsp {

RecordSpectrum::RecordSpectrum(std::span<const double> x, double fs) : m_n(x.size()), m_fs(fs) {
    if (x.size() < 4) throw std::invalid_argument("RecordSpectrum: the record needs at least 4 samples");
    if (!(fs > 0)) throw std::invalid_argument("RecordSpectrum: sample rate must be > 0");
    std::optional<RealFft<double>> own;
    RealFft<double>& fft = keptRealFft<double>(m_n, own);
    // The mean is removed after the transform: a constant lies in line 0 alone (the DFT is
    // linear; the transform of a constant c is N c at k = 0), so X[0] -= sum x is exact and saves
    // a pass over the record.
    const double sum = util::copyAndSum(x, fft.input().data());
    fft.execute();
    const auto out = fft.output();
    // resize and memcpy: assign() copies std::complex element by element (it is not trivially
    // default-constructible, so the library does not take the memmove path).
    m_bins.resize(out.size());
    std::memcpy(m_bins.data(), out.data(), out.size_bytes());
    m_bins[0] -= sum;
}

namespace {

// An inverse transform of length m, kept per thread and length (bandTransform), and how many
// leading entries of its input the last cut may have left non-zero: the transform keeps its input
// (Fft.h), so a cut clears only what the cut before it wrote beyond its own lines.
template <class Real>
struct KeptTransform {
    explicit KeptTransform(std::size_t m) : fft(m, FftDirection::Backward), written(m) {}
    ComplexFft<Real> fft;
    std::size_t written; // the fresh buffer holds anything
};

// The band's analytic signal, inverse-transformed into the output of `inverse` (valid until the
// next cut on this thread), and the band limits actually used (rounded to lines).
template <class Real>
struct BandCut {
    const ComplexFft<Real>* inverse = nullptr;
    double sampleRateHz = 0, loHz = 0, hiHz = 0;
};

// The kurtogram cuts hundreds of bands per record in a few lengths, and making each transform
// anew (its buffers mapped and zeroed by the system, then unmapped) cost a fifth of the band
// search. Bounded by bytes, so that a long record's large bands do not stay behind in a
// long-lived thread: at most 16 MiB, or the one transform last asked for when that alone is larger.
template <class Real>
KeptTransform<Real>& bandTransform(std::size_t m) {
    thread_local KeptByLength<KeptTransform<Real>> kept(std::size_t{16} << 20);
    if (auto* transform = kept.find(m)) return *transform;
    return kept.keep(m, std::make_unique<KeptTransform<Real>>(m), 2 * m * sizeof(std::complex<Real>)); // input and output
}

// The raised-cosine weights 0.5 - 0.5 cos(pi (e + 0.5) / taper) of the lines e = 0, 1, ... below
// `taper` at each edge of a band, cached per thread and taper: the kurtogram cuts many bands of
// each width, and the cosines were a tenth of its time. Per thread, so that the two analysis
// threads do not take a lock for every band.
const std::vector<double>* edgeTaper(double taper) {
    thread_local std::map<double, std::vector<double>> cache;
    if (auto it = cache.find(taper); it != cache.end()) return &it->second;
    if (cache.size() >= 512) cache.clear(); // bounded: a route uses a few hundred band widths
    std::vector<double> w(static_cast<std::size_t>(std::ceil(taper)));
    for (std::size_t e = 0; e < w.size(); ++e) w[e] = 0.5 - 0.5 * std::cos(std::numbers::pi * (static_cast<double>(e) + 0.5) / taper);
    return &cache.emplace(taper, std::move(w)).first->second;
}

// out[i] = in[i] * scale, narrowed to Real: the band cut's copy of its lines (vectorises).
template <class Real>
HUMWISE_VECTOR_CLONES void scaledLines(const std::complex<double>* in, std::size_t n, double scale, std::complex<Real>* out) {
    for (std::size_t i = 0; i < n; ++i) out[i] = std::complex<Real>(in[i] * scale);
}

// nextFastFftSize(n, multiple), remembering the last answer on this thread: the bands of a
// kurtogram level all ask for the same length, and the search was a fiftieth of the band search.
std::size_t bandLength(std::size_t n, std::size_t multiple) {
    thread_local std::size_t lastN = 0, lastMultiple = 0, lastLength = 0;
    if (n != lastN || multiple != lastMultiple) {
        lastLength = nextFastFftSize(n, multiple);
        lastN = n;
        lastMultiple = multiple;
    }
    return lastLength;
}

// The one-sided lines a band is cut from: `scale` times bins[k] is line k with the analytic
// signal's middle weight 2/N (the DC and Nyquist lines get half of it below). Single-precision
// lines (SingleLines) come scaled: their scale is 1.
template <class Source>
struct LineSource {
    std::span<const std::complex<Source>> bins;
    double scale = 1;
    std::size_t recordLength = 0;
    double lineSpacingHz = 0;
};

LineSource<double> linesOf(const RecordSpectrum& spectrum) {
    return {spectrum.bins(), 2.0 / static_cast<double>(spectrum.length()), spectrum.length(), spectrum.lineSpacingHz()};
}

// sizeMultiple: the transform length is nextFastFftSize(max(lines, minLength), sizeMultiple).
template <class Real, class Source>
BandCut<Real> cutBand(const LineSource<Source>& source, double loHz, double hiHz, std::size_t minLength, double taperFraction,
                      std::size_t sizeMultiple) {
    const double df = source.lineSpacingHz;
    const std::size_t last = source.bins.size() - 1;
    if (!(hiHz > loHz) || loHz < 0)
        throw std::invalid_argument("extractBand: the band must satisfy 0 <= lo < hi");
    // Clamped while still floating point: converting a line number beyond any integer (hiHz far
    // above Nyquist) would be undefined behaviour.
    const auto lineAtOrBelow = [&](double k) { return static_cast<std::size_t>(std::min(k, static_cast<double>(last))); };
    const auto kl = lineAtOrBelow(std::ceil(loHz / df));
    const auto kh = lineAtOrBelow(std::floor(hiHz / df));
    if (kh <= kl) throw std::invalid_argument("extractBand: the band is narrower than one line or above Nyquist");
    const std::size_t width = kh - kl + 1;
    const std::size_t m = bandLength(std::max(width, minLength), sizeMultiple);
    auto& kept = bandTransform<Real>(m);
    const auto data = kept.fft.input();
    if (kept.written > width)
        std::fill(data.begin() + static_cast<std::ptrdiff_t>(width), data.begin() + static_cast<std::ptrdiff_t>(kept.written),
                  std::complex<Real>(0, 0));
    kept.written = width;
    // Every line as a middle one (2/N), then the tapered edges, then the DC and (even N) Nyquist
    // lines, which the analytic signal weights by 1/N (Marple 1999, "Computing the discrete-time
    // analytic signal via FFT") and which can only be the band's first and last. Plain loops
    // that vectorise: a per-line weight lookup here was a twentieth of the band search.
    if constexpr (std::is_same_v<Source, double>) {
        scaledLines(source.bins.data() + kl, width, source.scale, data.data());
    } else {
        assert(source.scale == 1.0); // SingleLines: scaled when narrowed
        std::copy_n(source.bins.data() + kl, width, data.data());
    }
    const double taper = std::clamp(taperFraction, 0.0, 0.5) * static_cast<double>(width);
    if (taper > 0) {
        const auto edgeWeights = edgeTaper(taper);
        // Edges meet in the middle at most (taper <= width / 2); the middle line of an odd width
        // is weighted once.
        const std::size_t edges = std::min(edgeWeights->size(), (width + 1) / 2);
        for (std::size_t e = 0; e < edges; ++e) {
            const auto t = static_cast<Real>((*edgeWeights)[e]);
            data[e] *= t;
            if (width - 1 - e != e) data[width - 1 - e] *= t;
        }
    }
    if (kl == 0) data[0] *= Real(0.5);
    if (source.recordLength % 2 == 0 && kh == source.recordLength / 2) data[width - 1] *= Real(0.5);
    kept.fft.execute();
    BandCut<Real> cut;
    cut.inverse = &kept.fft;
    cut.sampleRateHz = static_cast<double>(m) * df;
    cut.loHz = static_cast<double>(kl) * df;
    cut.hiHz = static_cast<double>(kh) * df;
    return cut;
}

} // namespace

BandSignal extractBand(const RecordSpectrum& spectrum, double loHz, double hiHz, std::size_t minLength, double taperFraction,
                       std::size_t lengthMultiple) {
    const auto cut = cutBand<double>(linesOf(spectrum), loHz, hiHz, minLength, taperFraction, lengthMultiple);
    BandSignal out;
    const auto data = cut.inverse->output();
    out.samples.assign(data.begin(), data.end());
    out.sampleRateHz = cut.sampleRateHz;
    out.loHz = cut.loHz;
    out.hiHz = cut.hiHz;
    return out;
}

namespace {

// sum |z|^2 and sum |z|^4, accumulated in double, in eight partial sums so that the additions do
// not wait on each other (vectorises).
template <class Real>
HUMWISE_VECTOR_CLONES std::pair<double, double> powerSumsInDouble(const std::complex<Real>* z, std::size_t n) {
    double s2[8] = {0, 0, 0, 0, 0, 0, 0, 0}, s4[8] = {0, 0, 0, 0, 0, 0, 0, 0};
    std::size_t i = 0;
    for (; i + 8 <= n; i += 8)
        for (std::size_t j = 0; j < 8; ++j) {
            const double re = z[i + j].real(), im = z[i + j].imag();
            const double p = re * re + im * im;
            s2[j] += p;
            s4[j] += p * p;
        }
    for (; i < n; ++i) {
        const double p = std::norm(std::complex<double>(z[i]));
        s2[0] += p;
        s4[0] += p * p;
    }
    double m2 = 0, m4 = 0;
    for (std::size_t j = 0; j < 8; ++j) {
        m2 += s2[j];
        m4 += s4[j];
    }
    return {m2, m4};
}

// The same for a single-precision transform, in float vectors of 8 lanes over the interleaved
// real and imaginary parts: q = f^2 of every float sums to sum |z|^2 as it stands; q plus q with
// the two floats of each sample swapped holds |z|^2 twice per sample, so the sum of its squares is
// twice sum |z|^4. Runs of 64 terms per lane (good to about 4e-6 of their size) are added in
// double; the kurtogram compares kurtoses to 3 digits (BandSignal.h). A third of the time of the
// double version, which widens every float first. A run's sum of |z|^4 leaves the float range
// from |z| ~ 1e9, and |z|^4 falls below it (losing digits, then to zero) under |z| ~ 1e-9: such
// bands are summed again in double (powerSums below).
using FloatLanes = float __attribute__((vector_size(32)));

HUMWISE_VECTOR_CLONES std::pair<double, double> floatLanePowerSums(const std::complex<float>* z, std::size_t n) {
    const auto* f = reinterpret_cast<const float*>(z); // std::complex<float> is two floats (C++ [complex.numbers])
    constexpr std::size_t kStep = 16, kRun = 64 * kStep; // floats per step (two vectors) and per run
    const std::size_t floats = 2 * n;
    double m2 = 0, m4 = 0;
    std::size_t i = 0;
    while (i + kStep <= floats) {
        FloatLanes a2 = {}, b2 = {}, a4 = {}, b4 = {};
        const std::size_t runEnd = i + std::min(kRun, (floats - i) / kStep * kStep);
        for (; i < runEnd; i += kStep) {
            FloatLanes a, b;
            std::memcpy(&a, f + i, sizeof a);
            std::memcpy(&b, f + i + 8, sizeof b);
            const FloatLanes qa = a * a, qb = b * b;
            const FloatLanes pa = qa + __builtin_shufflevector(qa, qa, 1, 0, 3, 2, 5, 4, 7, 6);
            const FloatLanes pb = qb + __builtin_shufflevector(qb, qb, 1, 0, 3, 2, 5, 4, 7, 6);
            a2 += qa;
            b2 += qb;
            a4 += pa * pa;
            b4 += pb * pb;
        }
        for (int j = 0; j < 8; ++j) {
            m2 += static_cast<double>(a2[j]) + static_cast<double>(b2[j]);
            m4 += 0.5 * (static_cast<double>(a4[j]) + static_cast<double>(b4[j]));
        }
    }
    for (; i < floats; i += 2) {
        const double p = std::norm(std::complex<double>(f[i], f[i + 1]));
        m2 += p;
        m4 += p * p;
    }
    return {m2, m4};
}

std::pair<double, double> powerSums(const std::complex<double>* z, std::size_t n) { return powerSumsInDouble(z, n); }

// Float lanes unless their sums left the float range: above it |z|^4 overflows; a mean |z|^2
// below 1e-15 means samples under ~1e-8 whose |z|^4 (below 1e-30) nears float's smallest normal
// numbers (1.2e-38) and loses digits.
std::pair<double, double> powerSums(const std::complex<float>* z, std::size_t n) {
    const auto sums = floatLanePowerSums(z, n);
    const bool inFloatRange = std::isfinite(sums.second) && sums.first >= 1e-15 * static_cast<double>(n);
    return inFloatRange ? sums : powerSumsInDouble(z, n);
}

template <class Real, class Source>
BandMoments momentsOf(const LineSource<Source>& source, double loHz, double hiHz, std::size_t minLength, double taperFraction) {
    // Only the moments are wanted, not samples at given instants: the length may be rounded up
    // to a multiple of 8, which FFTW transforms faster (Fft.h).
    const auto cut = cutBand<Real>(source, loHz, hiHz, minLength, taperFraction, 8);
    const auto data = cut.inverse->output();
    auto [m2, m4] = powerSums(data.data(), data.size());
    const double n = static_cast<double>(data.size());
    m2 /= n;
    m4 /= n;
    return {m2, m2 > 0 ? m4 / (m2 * m2) - 2.0 : 0.0};
}

} // namespace

SingleLines::SingleLines(const RecordSpectrum& spectrum)
    : m_lines(spectrum.bins().size()), m_recordLength(spectrum.length()), m_lineSpacingHz(spectrum.lineSpacingHz()) {
    scaledLines(spectrum.bins().data(), m_lines.size(), 2.0 / static_cast<double>(spectrum.length()), m_lines.data());
}

BandMoments bandMoments(const RecordSpectrum& spectrum, double loHz, double hiHz, std::size_t minLength, double taperFraction, Precision precision) {
    return precision == Precision::Single ? bandMoments(SingleLines(spectrum), loHz, hiHz, minLength, taperFraction)
                                          : momentsOf<double>(linesOf(spectrum), loHz, hiHz, minLength, taperFraction);
}

BandMoments bandMoments(const SingleLines& lines, double loHz, double hiHz, std::size_t minLength, double taperFraction) {
    const LineSource<float> source{lines.m_lines, 1.0, lines.m_recordLength, lines.m_lineSpacingHz};
    return momentsOf<float>(source, loHz, hiHz, minLength, taperFraction);
}

} // namespace humwise::dsp
