#include "support/SyntheticMotor.h"

#include <cmath>
#include <numbers>
#include <random>

namespace humwise::test {
namespace {
constexpr double kPi = std::numbers::pi;
constexpr double kG = 9.80665;
} // namespace

std::vector<double> synthAcceleration(const SyntheticVibration& s) {
    const auto n = static_cast<std::size_t>(s.sampleRateHz * s.seconds);
    std::vector<double> x(n, 0.0);
    for (const auto& t : s.velocityTones) {
        // v = V sqrt2 sin(wt + phi)  ->  a = V sqrt2 w cos(wt + phi)
        const double w = 2 * kPi * t.frequencyHz, amp = t.rms * std::sqrt(2.0) * w;
        for (std::size_t i = 0; i < n; ++i) x[i] += amp * std::cos(w * static_cast<double>(i) / s.sampleRateHz + t.phase);
    }
    std::mt19937_64 rng(s.seed);
    for (const auto& b : s.impacts) {
        if (!(b.rateHz > 0) || !(b.peakG > 0)) continue;
        std::normal_distribution<double> jitter(0.0, b.jitter / b.rateHz);
        const double wn = 2 * kPi * b.resonanceHz, decay = b.dampingRatio * wn;
        const auto ring = static_cast<std::size_t>(std::min(s.sampleRateHz * 8.0 / decay, s.sampleRateHz / b.rateHz * 4));
        for (double t0 = 0.5 / b.rateHz; t0 < s.seconds; t0 += 1.0 / b.rateHz + jitter(rng)) {
            double amp = b.peakG * kG;
            if (b.modulationDepth > 0) amp *= 1.0 + b.modulationDepth * std::cos(2 * kPi * b.modulationHz * t0);
            const auto start = static_cast<std::size_t>(t0 * s.sampleRateHz);
            for (std::size_t i = 0; i < ring && start + i < n; ++i) {
                const double t = static_cast<double>(i) / s.sampleRateHz;
                x[start + i] += amp * std::exp(-decay * t) * std::sin(wn * t);
            }
        }
    }
    std::normal_distribution<double> noise(0.0, s.noiseG * kG);
    for (double& v : x) v += noise(rng);
    return x;
}

std::vector<std::vector<double>> synthCurrents(const SyntheticCurrent& s) {
    const auto n = static_cast<std::size_t>(s.sampleRateHz * s.seconds);
    std::vector<std::vector<double>> phases(3, std::vector<double>(n, 0.0));
    const double scales[3] = {1.0, s.phaseBScale, s.phaseCScale};
    const double shifts[3] = {0.0, -2 * kPi / 3 + s.phaseBShiftRad, 2 * kPi / 3};
    std::mt19937_64 rng(s.seed);
    std::normal_distribution<double> noise(0.0, s.noiseRms * s.rmsA);
    for (int p = 0; p < 3; ++p) {
        auto& x = phases[static_cast<std::size_t>(p)];
        const double a = s.rmsA * std::sqrt(2.0) * scales[p];
        for (std::size_t i = 0; i < n; ++i) {
            const double t = static_cast<double>(i) / s.sampleRateHz;
            double v = a * std::cos(2 * kPi * s.lineHz * t + shifts[p]);
            for (const auto& c : s.components) v += a * c.rms * std::cos(2 * kPi * c.frequencyHz * t + c.phase + shifts[p]);
            x[i] = v + noise(rng);
        }
    }
    return phases;
}

double relativeRms(double dbBelow) { return std::pow(10.0, -dbBelow / 20.0); }

} // namespace humwise::test
