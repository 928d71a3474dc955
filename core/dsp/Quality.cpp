#include "core/dsp/Quality.h"

#include "core/dsp/SampleExtent.h"
#include "core/util/DoubleLanes.h"
#include "core/util/Sums.h"
#include "core/util/VectorClones.h"

#include <algorithm>
#include <cmath>
#include <cstdio>

namespace humwise::dsp {
namespace {

std::string format(const char* fmt, double a, double b = 0, double c = 0) {
    char buf[256];
    std::snprintf(buf, sizeof buf, fmt, a, b, c);
    return buf;
}

bool isMotion(Quantity q) {
    return q == Quantity::Acceleration || q == Quantity::Velocity || q == Quantity::Displacement;
}

// The record is read once, piece by piece: each piece's extent, its constant runs and (for the
// drift check) its residual about its own mean are taken while it is still in the processor's
// cache. Three passes over a record that no longer fits there cost about three times one.
// Pieces are the drift check's kDriftBlocks blocks of equal length and the few samples after
// them when the drift is checked, else pieces of kPiece samples (128 KiB).
constexpr std::size_t kDriftBlocks = 8;
constexpr std::size_t kDriftMinSamples = 800;
constexpr std::size_t kPiece = 16384;

// Runs are searched in chunks of kRunChunk samples: the first chunk from `begin` up to `end`
// holding a candidate sample is returned (`end` when none does; a last chunk shorter than
// kRunChunk is returned as it is, unexamined). Vectors of lanes (DoubleLanes.h) with plain
// masks, one call per piece rather than per chunk.
constexpr std::size_t kRunChunk = 64;
using MaskLanes = long long __attribute__((vector_size(32)));
constexpr long long kNoSign = 0x7fffffffffffffffLL;

// The chunk search itself; mark(p, mask) sets the mask's lanes for the candidates among the four
// samples at p. Inlined into each clone of its callers, so their vectors stay in registers.
template <class Mark>
[[gnu::always_inline]] inline std::size_t firstChunkWith(const double* x, std::size_t begin, std::size_t end, Mark mark) {
    std::size_t c = begin;
    for (; c + kRunChunk <= end; c += kRunChunk) {
        MaskLanes any[4] = {}; // four, so that the ORs do not wait on each other
        for (std::size_t i = c; i < c + kRunChunk; i += 16)
            for (std::size_t v = 0; v < 4; ++v) mark(x + i + 4 * v, any[v]);
        const MaskLanes all = (any[0] | any[1]) | (any[2] | any[3]);
        if ((all[0] | all[1] | all[2] | all[3]) != 0) return c;
    }
    return c;
}

// Candidates for a constant run: a sample equal to the one before it (begin >= 1).
HUMWISE_VECTOR_CLONES
std::size_t firstRepeatChunk(const double* x, std::size_t begin, std::size_t end) {
    return firstChunkWith(x, begin, end, [](const double* p, MaskLanes& any) __attribute__((always_inline)) {
        util::DoubleLanes y, before;
        util::loadLanes(y, p);
        util::loadLanes(before, p - 1);
        any |= y == before;
    });
}

// Candidates for a run at the level: |sample| within tol of target (never a NaN or infinity).
HUMWISE_VECTOR_CLONES
std::size_t firstLevelChunk(const double* x, std::size_t begin, std::size_t end, double target, double tol) {
    return firstChunkWith(x, begin, end, [target, tol](const double* p, MaskLanes& any) __attribute__((always_inline)) {
        util::DoubleLanes y;
        util::loadLanes(y, p);
        // |y| by clearing the sign bits (a NaN stays a NaN and compares false)
        const auto off = reinterpret_cast<util::DoubleLanes>(reinterpret_cast<MaskLanes>(y) & kNoSign) - target;
        any |= (off <= tol) & (off >= -tol);
    });
}

// The longest run of identical consecutive finite samples, read piece by piece in order.
class ConstantRuns {
public:
    explicit ConstantRuns(std::span<const double> x) : m_x(x), m_longest(x.empty() ? 0 : 1) {}

    // Samples [begin, end) of x, after every sample before begin.
    void take(std::size_t begin, std::size_t end) {
        for (std::size_t i = std::max<std::size_t>(begin, 1); i < end;) {
            const std::size_t found = firstRepeatChunk(m_x.data(), i, end);
            if (found > i) m_run = 1; // the chunks skipped hold no repeat: the run ends
            const std::size_t stop = std::min(end, found + kRunChunk);
            for (std::size_t k = found; k < stop; ++k) {
                const double v = m_x[k];
                m_run = (v == m_x[k - 1] && std::isfinite(v)) ? m_run + 1 : 1;
                m_longest = std::max(m_longest, m_run);
            }
            i = stop;
        }
    }
    std::size_t longest() const { return m_longest; }

private:
    std::span<const double> m_x;
    std::size_t m_longest;
    std::size_t m_run = 1;
};

struct Piece {
    std::size_t begin = 0, end = 0;
    SampleExtent extent;
    double residual = 0; // drift blocks: sum of squared deviations from the block's own mean
    bool driftBlock = false;
    std::span<const double> of(std::span<const double> x) const { return x.subspan(begin, end - begin); }
};

std::vector<Piece> piecesOf(std::size_t n, bool checksDrift) {
    std::vector<Piece> pieces;
    if (checksDrift) {
        const std::size_t len = n / kDriftBlocks;
        for (std::size_t b = 0; b < kDriftBlocks; ++b) pieces.push_back({b * len, (b + 1) * len, {}, 0, true});
        if (kDriftBlocks * len < n) pieces.push_back({kDriftBlocks * len, n, {}, 0, false});
    } else {
        for (std::size_t at = 0; at < n; at += kPiece) pieces.push_back({at, std::min(n, at + kPiece), {}, 0, false});
    }
    return pieces;
}

struct Scan {
    SampleExtent whole;
    std::vector<Piece> pieces;
    std::size_t longestConstant = 0;
};

// The one pass: every piece's extent and constant runs, and the drift blocks' residuals.
Scan scan(std::span<const double> x, bool checksDrift) {
    Scan out;
    out.pieces = piecesOf(x.size(), checksDrift);
    ConstantRuns constant(x);
    for (Piece& p : out.pieces) {
        const auto samples = p.of(x);
        p.extent = sampleExtent(samples);
        constant.take(p.begin, p.end);
        const std::size_t finite = samples.size() - p.extent.nonFinite;
        if (p.driftBlock && finite > 0) {
            const double mean = p.extent.sum / static_cast<double>(finite);
            // Only the squares are needed: the lanes of deviationSums when the block is all finite
            // (a third of the work of all three powers), the careful skipping loop otherwise.
            p.residual = p.extent.nonFinite == 0 ? util::deviationSums(samples, mean).squares : centralPowerSums(samples, mean, false).m2;
        }
        out.whole.lo = std::min(out.whole.lo, p.extent.lo);
        out.whole.hi = std::max(out.whole.hi, p.extent.hi);
        out.whole.sum += p.extent.sum;
        out.whole.nonFinite += p.extent.nonFinite;
    }
    out.longestConstant = constant.longest();
    return out;
}

// Runs of >= minRun consecutive samples whose |value| is at `level` (relative tolerance 1e-9).
// Only the pieces whose extent reaches the level can hold such a sample: usually the one or two
// that hold the record's extreme are read again, and none when a known full scale is not reached.
std::size_t runsAtLevel(std::span<const double> x, const std::vector<Piece>& pieces, double level, std::size_t minRun) {
    const double target = std::abs(level), tol = target * 1e-9;
    if (!std::isfinite(target)) return 0; // no finite sample sits at an infinite level
    std::size_t runs = 0, run = 0;
    const auto endRun = [&] {
        if (run >= minRun) ++runs;
        run = 0;
    };
    for (const Piece& p : pieces) {
        if (!(std::max(std::abs(p.extent.lo), std::abs(p.extent.hi)) >= target - tol)) { // none there (or no finite sample)
            endRun();
            continue;
        }
        for (std::size_t i = p.begin; i < p.end;) {
            const std::size_t found = firstLevelChunk(x.data(), i, p.end, target, tol);
            if (found > i) endRun(); // the chunks skipped hold no sample at the level
            const std::size_t stop = std::min(p.end, found + kRunChunk);
            for (std::size_t k = found; k < stop; ++k) {
                const double v = x[k];
                if (std::isfinite(v) && std::abs(std::abs(v) - target) <= tol) ++run;
                else endRun();
            }
            i = stop;
        }
    }
    endRun();
    return runs;
}

} // namespace

std::string_view qualityFlagName(QualityFlag flag) {
    switch (flag) {
    case QualityFlag::NonFinite: return "non_finite";
    case QualityFlag::FlatLine: return "flat_line";
    case QualityFlag::Clipped: return "clipped";
    case QualityFlag::BiasDrift: return "bias_drift";
    case QualityFlag::TooShort: return "too_short";
    }
    return "?";
}

std::vector<QualityIssue> assessQuality(std::span<const double> x, const QualityRequest& r) {
    std::vector<QualityIssue> issues;
    const bool checksDrift = isMotion(r.quantity) && x.size() >= kDriftMinSamples;
    const Scan pass = scan(x, checksDrift);
    const SampleExtent& e = pass.whole;
    const double lo = e.lo, hi = e.hi;
    if (e.nonFinite > 0)
        issues.push_back({QualityFlag::NonFinite, format("%.0f of %.0f samples are NaN or infinite", double(e.nonFinite), double(x.size()))});
    if (x.size() < r.minSamples) {
        const double fs = r.sampleRateHz > 0 ? r.sampleRateHz : 1.0;
        issues.push_back({QualityFlag::TooShort, format("%.4g s recorded, %.4g s needed", double(x.size()) / fs, double(r.minSamples) / fs)});
    }
    const std::size_t finite = x.size() - e.nonFinite;
    if (finite == 0) return issues;

    const double largest = std::max(std::abs(lo), std::abs(hi));
    if (hi - lo <= largest * 1e-12) {
        issues.push_back({QualityFlag::FlatLine, format("the signal is constant (%.6g)", lo)});
        return issues; // nothing else is meaningful on a constant signal
    }
    const double extreme = r.fullScale ? *r.fullScale : largest;
    if (finite >= 100 && pass.longestConstant * 10 > finite)
        issues.push_back({QualityFlag::FlatLine, format("%.0f identical consecutive samples (%.1f %% of the record)", double(pass.longestConstant), 100.0 * double(pass.longestConstant) / double(finite))});
    const std::size_t atLevel = runsAtLevel(x, pass.pieces, extreme, 3);
    if (atLevel >= 3)
        issues.push_back({QualityFlag::Clipped, format("%.0f runs of 3 or more samples sit at the limit %.6g", double(atLevel), extreme)});

    if (checksDrift && finite >= kDriftMinSamples) {
        const double mean = e.sum / static_cast<double>(finite);
        double bmin = INFINITY, bmax = -INFINITY, residual = 0;
        std::size_t residualCount = 0;
        for (const Piece& block : pass.pieces) {
            const std::size_t bc = block.end - block.begin - block.extent.nonFinite;
            if (!block.driftBlock || bc == 0) continue;
            const double bm = block.extent.sum / static_cast<double>(bc);
            bmin = std::min(bmin, bm);
            bmax = std::max(bmax, bm);
            residual += block.residual;
            residualCount += bc;
        }
        const double residualRms = residualCount ? std::sqrt(residual / static_cast<double>(residualCount)) : 0.0;
        if (residualRms > 0 && bmax - bmin > 0.5 * residualRms)
            issues.push_back({QualityFlag::BiasDrift, format("the mean wanders by %.3g across the record, %.2f x the AC RMS", bmax - bmin, (bmax - bmin) / residualRms)});
        else if (residualRms > 0 && std::abs(mean) > 3.0 * residualRms)
            issues.push_back({QualityFlag::BiasDrift, format("DC offset %.3g is %.1f x the AC RMS of an AC-coupled sensor", mean, std::abs(mean) / residualRms)});
    }
    return issues;
}

} // namespace humwise::dsp
