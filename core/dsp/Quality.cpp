#include "core/dsp/Quality.h"

#include "core/dsp/SampleExtent.h"
#include "core/util/DoubleLanes.h"
#include "core/util/Sums.h"
#include "core/util/VectorClones.h"

#include <algorithm>
#include <array>
#include <cfloat>
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

// The first of the chunks of kRunChunk samples from `begin` (begin >= 1) up to `end` that holds a
// sample equal to the one before it, at the level or not finite: the rare samples the run
// counting below must look at; `end` when none does (a last chunk shorter than kRunChunk is
// returned as it is, unexamined). Vectors of lanes (DoubleLanes.h), one call per record rather
// than per chunk.
constexpr std::size_t kRunChunk = 64;
using MaskLanes = long long __attribute__((vector_size(32)));
constexpr long long kNoSign = 0x7fffffffffffffffLL;

HUMWISE_VECTOR_CLONES
std::size_t firstRunCandidate(const double* x, std::size_t begin, std::size_t end, double target, double tol) {
    std::size_t c = begin;
    for (; c + kRunChunk <= end; c += kRunChunk) {
        MaskLanes any[4] = {}; // four, so that the ORs do not wait on each other
        for (std::size_t i = c; i < c + kRunChunk; i += 16)
            for (std::size_t v = 0; v < 4; ++v) {
                util::DoubleLanes y, before;
                util::loadLanes(y, x + i + 4 * v);
                util::loadLanes(before, x + i + 4 * v - 1);
                // |y| by clearing the sign bits (a NaN stays a NaN)
                const auto a = reinterpret_cast<util::DoubleLanes>(reinterpret_cast<MaskLanes>(y) & kNoSign);
                const util::DoubleLanes off = a - target;
                any[v] |= (y == before) | ((off <= tol) & (off >= -tol)) | (a > DBL_MAX) | (a != a);
            }
        const MaskLanes all = (any[0] | any[1]) | (any[2] | any[3]);
        if ((all[0] | all[1] | all[2] | all[3]) != 0) return c;
    }
    return c;
}

// In one pass: the longest run of identical consecutive finite samples, and the runs of
// >= minRun consecutive samples whose |value| is at `level` (relative tolerance 1e-9).
struct Runs {
    std::size_t longestConstant = 0;
    std::size_t atLevel = 0;
};

Runs runsOf(std::span<const double> x, double level, std::size_t minRun) {
    const double target = std::abs(level), tol = target * 1e-9;
    Runs r;
    r.longestConstant = x.empty() ? 0 : 1;
    std::size_t constantRun = 1, levelRun = 0;
    const auto endLevelRun = [&] {
        if (levelRun >= minRun) ++r.atLevel;
        levelRun = 0;
    };
    const auto look = [&](std::size_t i) {
        const double v = x[i];
        const bool finite = std::isfinite(v);
        if (i > 0) {
            constantRun = (v == x[i - 1] && finite) ? constantRun + 1 : 1;
            r.longestConstant = std::max(r.longestConstant, constantRun);
        }
        if (finite && std::abs(std::abs(v) - target) <= tol) ++levelRun;
        else endLevelRun();
    };
    if (!x.empty()) look(0);
    // Chunks with no candidate sample only end the runs in progress: no sample in them extends
    // a constant run or sits at the level.
    for (std::size_t begin = 1; begin < x.size();) {
        const std::size_t found = firstRunCandidate(x.data(), begin, x.size(), target, tol);
        if (found > begin) {
            constantRun = 1;
            endLevelRun();
        }
        if (found == x.size()) break;
        const std::size_t end = std::min(x.size(), found + kRunChunk);
        for (std::size_t i = found; i < end; ++i) look(i);
        begin = end;
    }
    if (levelRun >= minRun) ++r.atLevel;
    return r;
}

// The drift check's blocks: the record in kDriftBlocks blocks of equal length (the last few
// samples, fewer than kDriftBlocks, belong to none).
constexpr std::size_t kDriftBlocks = 8;
constexpr std::size_t kDriftMinSamples = 800;

std::span<const double> driftBlock(std::span<const double> x, std::size_t b) {
    const std::size_t len = x.size() / kDriftBlocks;
    return x.subspan(b * len, len);
}

struct Extents {
    SampleExtent whole;
    std::array<SampleExtent, kDriftBlocks> blocks{};
    bool hasBlocks = false;
};

// The record's extent and, when the drift check will want them, its blocks' - the record's then
// combined from the blocks' and the tail's, so that the samples are read once for both.
Extents extentsOf(std::span<const double> x, bool wantBlocks) {
    Extents out;
    if (!wantBlocks) {
        out.whole = sampleExtent(x);
        return out;
    }
    out.hasBlocks = true;
    const std::size_t covered = x.size() / kDriftBlocks * kDriftBlocks;
    out.whole = sampleExtent(x.subspan(covered));
    for (std::size_t b = 0; b < kDriftBlocks; ++b) {
        const SampleExtent be = out.blocks[b] = sampleExtent(driftBlock(x, b));
        out.whole.lo = std::min(out.whole.lo, be.lo);
        out.whole.hi = std::max(out.whole.hi, be.hi);
        out.whole.sum += be.sum;
        out.whole.nonFinite += be.nonFinite;
    }
    return out;
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
    const Extents extents = extentsOf(x, checksDrift);
    const SampleExtent& e = extents.whole;
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
    const Runs runs = runsOf(x, extreme, 3);
    if (finite >= 100 && runs.longestConstant * 10 > finite)
        issues.push_back({QualityFlag::FlatLine, format("%.0f identical consecutive samples (%.1f %% of the record)", double(runs.longestConstant), 100.0 * double(runs.longestConstant) / double(finite))});
    if (runs.atLevel >= 3)
        issues.push_back({QualityFlag::Clipped, format("%.0f runs of 3 or more samples sit at the limit %.6g", double(runs.atLevel), extreme)});

    if (extents.hasBlocks && finite >= kDriftMinSamples) {
        const double mean = e.sum / static_cast<double>(finite);
        double bmin = INFINITY, bmax = -INFINITY, residual = 0;
        std::size_t residualCount = 0;
        for (std::size_t b = 0; b < kDriftBlocks; ++b) {
            const auto block = driftBlock(x, b);
            const SampleExtent& be = extents.blocks[b];
            const std::size_t bc = block.size() - be.nonFinite;
            if (bc == 0) continue;
            const double bm = be.sum / static_cast<double>(bc);
            bmin = std::min(bmin, bm);
            bmax = std::max(bmax, bm);
            // Only the squares are needed: the lanes of deviationSums when the block is all finite
            // (a third of the work of all three powers), the careful skipping loop otherwise.
            residual += be.nonFinite == 0 ? util::deviationSums(block, bm).squares : centralPowerSums(block, bm, false).m2;
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
