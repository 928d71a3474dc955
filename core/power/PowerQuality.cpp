#include "core/power/PowerQuality.h"

#include <algorithm>
#include <array>
#include <cmath>
#include <limits>
#include <stdexcept>
#include <string>

namespace humwise::power {
namespace {

void checkMagnitudes(const char* what, double v1, double v2, double v3) {
    for (double v : {v1, v2, v3})
        if (!(v > 0) || !std::isfinite(v))
            throw std::invalid_argument(std::string(what) + ": magnitudes must be positive and finite");
}

// NEMA MG-1 derating curve (REFERENCE.md 6.3, published curve read from a secondary
// tabulation; lower value where the reading is a range: 3 % -> 0.88, 5 % -> 0.75).
struct CurvePoint {
    double unbalancePercent;
    double factor;
};
constexpr std::array<CurvePoint, 11> kNemaDerating{{
    {0.0, 1.00}, {0.5, 1.00}, {1.0, 1.00}, {1.5, 0.97}, {2.0, 0.95}, {2.5, 0.93},
    {3.0, 0.88}, {3.5, 0.85}, {4.0, 0.82}, {4.5, 0.78}, {5.0, 0.75},
}};

} // namespace

double nemaUnbalancePercent(double v1, double v2, double v3) {
    checkMagnitudes("nemaUnbalancePercent", v1, v2, v3);
    // NEMA MG-1: 100 * max |V_i - V_avg| / V_avg (REFERENCE.md 6.1, published).
    const double avg = (v1 + v2 + v3) / 3.0;
    const double dev = std::max({std::abs(v1 - avg), std::abs(v2 - avg), std::abs(v3 - avg)});
    return 100.0 * dev / avg;
}

double maxMinusMinPercent(double v1, double v2, double v3) {
    checkMagnitudes("maxMinusMinPercent", v1, v2, v3);
    // (V_max - V_min) / V_avg (REFERENCE.md 6.1, pitfall, published technical note).
    const double avg = (v1 + v2 + v3) / 3.0;
    return 100.0 * (std::max({v1, v2, v3}) - std::min({v1, v2, v3})) / avg;
}

double iecUnbalanceFromLineVoltages(double vab, double vbc, double vca) {
    checkMagnitudes("iecUnbalanceFromLineVoltages", vab, vbc, vca);
    // REFERENCE.md 6.2, formula from memory (verify the clause):
    // beta = sum V^4 / (sum V^2)^2, VUF = sqrt((1 - sqrt(3 - 6 beta)) / (1 + sqrt(3 - 6 beta))).
    const double a2 = vab * vab, b2 = vbc * vbc, c2 = vca * vca;
    const double sum2 = a2 + b2 + c2;
    const double beta = (a2 * a2 + b2 * b2 + c2 * c2) / (sum2 * sum2);
    double root = 3.0 - 6.0 * beta; // 0 for a degenerate (flat) triangle, < 0 for none
    if (root < -1e-12)
        throw std::invalid_argument("iecUnbalanceFromLineVoltages: the three magnitudes cannot close a triangle");
    root = std::sqrt(std::max(0.0, root));
    return 100.0 * std::sqrt((1.0 - root) / (1.0 + root));
}

double negativeSequenceRatio(const SequenceComponents& s) {
    const double p = std::abs(s.positive);
    if (!(p > 0) || !std::isfinite(p))
        throw std::invalid_argument("negativeSequenceRatio: positive-sequence component is zero or not finite");
    // VUF (or current unbalance factor) = |X2| / |X1| (REFERENCE.md 6.2, published definition).
    return std::abs(s.negative) / p;
}

double nemaDeratingFactor(double unbalancePercent) {
    if (!(unbalancePercent >= 0) || !std::isfinite(unbalancePercent))
        throw std::invalid_argument("nemaDeratingFactor: unbalance must be a finite percentage >= 0");
    if (unbalancePercent >= kNemaDerating.back().unbalancePercent) return kNemaDerating.back().factor;
    // Linear interpolation between tabulated points (a reading of a smooth curve).
    const auto hi = std::upper_bound(kNemaDerating.begin(), kNemaDerating.end(), unbalancePercent,
                                     [](double u, const CurvePoint& p) { return u < p.unbalancePercent; });
    const auto lo = hi - 1;
    const double t = (unbalancePercent - lo->unbalancePercent) / (hi->unbalancePercent - lo->unbalancePercent);
    return lo->factor + t * (hi->factor - lo->factor);
}

HarmonicAnalysis harmonicAnalysis(std::span<const double> x, double sampleRateHz, double fundamentalHz,
                                  int maxOrder) {
    if (maxOrder < 2) throw std::invalid_argument("harmonicAnalysis: maxOrder must be at least 2");
    if (!(sampleRateHz > 0) || !(fundamentalHz > 0))
        throw std::invalid_argument("harmonicAnalysis: sample rate and fundamental must be positive");
    const double limitHz = sampleRateHz / 2.0 / kNyquistMargin; // common practice margin
    std::vector<double> freqs;
    for (int h = 1; h <= maxOrder && h * fundamentalHz <= limitHz; ++h) freqs.push_back(h * fundamentalHz);
    if (freqs.size() < 2)
        throw std::invalid_argument("harmonicAnalysis: the 2nd harmonic of " + std::to_string(fundamentalHz) +
                                    " Hz lies above (fs/2)/1.1");

    const ToneFit fit = fitTones(x, sampleRateHz, freqs);
    HarmonicAnalysis r;
    r.fundamentalHz = fundamentalHz;
    r.fundamentalRms = fit.phasors.front().magnitude;
    r.highestOrder = static_cast<int>(freqs.size());
    double harmonicSquares = 0;
    for (std::size_t i = 1; i < fit.phasors.size(); ++i) {
        r.harmonicRms.push_back(fit.phasors[i].magnitude);
        harmonicSquares += fit.phasors[i].magnitude * fit.phasors[i].magnitude;
    }
    r.rms = std::sqrt(r.fundamentalRms * r.fundamentalRms + harmonicSquares + fit.residualRms * fit.residualRms);
    // IEEE 519 definitions (REFERENCE.md 6.5, published): THD_F relative to the fundamental,
    // THD_R relative to the RMS.
    const double distortion = std::sqrt(harmonicSquares);
    const double nan = std::numeric_limits<double>::quiet_NaN(); // no fundamental: no THD
    r.thdFundamentalPercent = r.fundamentalRms > 0 ? 100.0 * distortion / r.fundamentalRms : nan;
    r.thdRmsPercent = r.rms > 0 ? 100.0 * distortion / r.rms : nan;
    return r;
}

} // namespace humwise::power
