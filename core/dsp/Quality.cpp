#include "core/dsp/Quality.h"

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

// Longest run of identical consecutive finite samples.
std::size_t longestConstantRun(std::span<const double> x) {
    std::size_t best = x.empty() ? 0 : 1, run = 1;
    for (std::size_t i = 1; i < x.size(); ++i) {
        run = (x[i] == x[i - 1] && std::isfinite(x[i])) ? run + 1 : 1;
        best = std::max(best, run);
    }
    return best;
}

// Runs of >= minRun consecutive samples whose |value| is at `level` (relative tolerance 1e-9).
std::size_t runsAtLevel(std::span<const double> x, double level, std::size_t minRun) {
    const double tol = std::abs(level) * 1e-9;
    std::size_t runs = 0, run = 0;
    for (double v : x) {
        if (std::isfinite(v) && std::abs(std::abs(v) - std::abs(level)) <= tol) {
            ++run;
        } else {
            if (run >= minRun) ++runs;
            run = 0;
        }
    }
    if (run >= minRun) ++runs;
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
    std::size_t nonFinite = 0;
    double lo = INFINITY, hi = -INFINITY, sum = 0;
    for (double v : x) {
        if (!std::isfinite(v)) {
            ++nonFinite;
            continue;
        }
        lo = std::min(lo, v);
        hi = std::max(hi, v);
        sum += v;
    }
    if (nonFinite > 0)
        issues.push_back({QualityFlag::NonFinite, format("%.0f of %.0f samples are NaN or infinite", double(nonFinite), double(x.size()))});
    if (x.size() < r.minSamples) {
        const double fs = r.sampleRateHz > 0 ? r.sampleRateHz : 1.0;
        issues.push_back({QualityFlag::TooShort, format("%.4g s recorded, %.4g s needed", double(x.size()) / fs, double(r.minSamples) / fs)});
    }
    const std::size_t finite = x.size() - nonFinite;
    if (finite == 0) return issues;

    const double largest = std::max(std::abs(lo), std::abs(hi));
    const std::size_t longest = longestConstantRun(x);
    if (hi - lo <= largest * 1e-12) {
        issues.push_back({QualityFlag::FlatLine, format("the signal is constant (%.6g)", lo)});
        return issues; // nothing else is meaningful on a constant signal
    }
    if (finite >= 100 && longest * 10 > finite)
        issues.push_back({QualityFlag::FlatLine, format("%.0f identical consecutive samples (%.1f %% of the record)", double(longest), 100.0 * double(longest) / double(finite))});

    const double extreme = r.fullScale ? *r.fullScale : largest;
    const std::size_t clippedRuns = runsAtLevel(x, extreme, 3);
    if (clippedRuns >= 3)
        issues.push_back({QualityFlag::Clipped, format("%.0f runs of 3 or more samples sit at the limit %.6g", double(clippedRuns), extreme)});

    if (isMotion(r.quantity) && finite >= 800) {
        const double mean = sum / static_cast<double>(finite);
        constexpr std::size_t kBlocks = 8;
        const std::size_t len = x.size() / kBlocks;
        double bmin = INFINITY, bmax = -INFINITY, residual = 0;
        std::size_t residualCount = 0;
        for (std::size_t b = 0; b < kBlocks; ++b) {
            double bs = 0;
            std::size_t bc = 0;
            for (std::size_t i = b * len; i < (b + 1) * len; ++i)
                if (std::isfinite(x[i])) {
                    bs += x[i];
                    ++bc;
                }
            if (bc == 0) continue;
            const double bm = bs / static_cast<double>(bc);
            bmin = std::min(bmin, bm);
            bmax = std::max(bmax, bm);
            for (std::size_t i = b * len; i < (b + 1) * len; ++i)
                if (std::isfinite(x[i])) {
                    residual += (x[i] - bm) * (x[i] - bm);
                    ++residualCount;
                }
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
