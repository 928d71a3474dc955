#include "sample_fleet/SignalModels.h"

#include <algorithm>
#include <cmath>
#include <numbers>

namespace humwise::sample {
namespace {

constexpr double kTwoPi = 2 * std::numbers::pi;

std::uint64_t splitmix(std::uint64_t& x) {
    std::uint64_t z = (x += 0x9E3779B97F4A7C15ull);
    z = (z ^ (z >> 30)) * 0xBF58476D1CE4E5B9ull;
    z = (z ^ (z >> 27)) * 0x94D049BB133111EBull;
    return z ^ (z >> 31);
}

std::uint64_t rotl(std::uint64_t x, int k) { return (x << k) | (x >> (64 - k)); }

// x[i] += amp cos(w i + phase), by a rotating phasor re-anchored every block so rounding
// cannot accumulate.
void addCosine(std::vector<double>& x, double sampleRateHz, double frequencyHz, double amp, double phase) {
    const double w = kTwoPi * frequencyHz / sampleRateHz;
    const double cw = std::cos(w), sw = std::sin(w);
    constexpr std::size_t kBlock = 4096;
    for (std::size_t start = 0; start < x.size(); start += kBlock) {
        double c = std::cos(w * static_cast<double>(start) + phase), s = std::sin(w * static_cast<double>(start) + phase);
        const std::size_t end = std::min(x.size(), start + kBlock);
        for (std::size_t i = start; i < end; ++i) {
            x[i] += amp * c;
            const double nc = c * cw - s * sw;
            s = s * cw + c * sw;
            c = nc;
        }
    }
}

// Velocity tone V sqrt2 sin(wt + phi) as acceleration V sqrt2 w cos(wt + phi).
void addVelocityTone(std::vector<double>& a, double fs, const Tone& t) {
    addCosine(a, fs, t.frequencyHz, t.rms * std::sqrt(2.0) * kTwoPi * t.frequencyHz, t.phaseRad);
}

// A shaft-order velocity tone during the coast-down: speed ratio q = 1 / (1 + t / tau), phase
// 2 pi f0 tau ln(1 + t / tau), amplitude V q^2; the acceleration is its time derivative.
void addCoastingTone(std::vector<double>& a, double fs, const Tone& t, double tau) {
    const double v = t.rms * std::sqrt(2.0);
    for (std::size_t i = 0; i < a.size(); ++i) {
        const double time = static_cast<double>(i) / fs;
        const double q = 1.0 / (1.0 + time / tau);
        const double phi = t.phaseRad + kTwoPi * t.frequencyHz * tau * std::log1p(time / tau);
        a[i] += v * (q * q * kTwoPi * t.frequencyHz * q * std::cos(phi) - 2.0 * q * q * q / tau * std::sin(phi));
    }
}

// A tone of electrical origin dying with the rotor flux, exp(-t / tau), after the cut.
void addDyingTone(std::vector<double>& a, double fs, const Tone& t, double tau) {
    const double v = t.rms * std::sqrt(2.0), w = kTwoPi * t.frequencyHz;
    for (std::size_t i = 0; i < a.size(); ++i) {
        const double time = static_cast<double>(i) / fs;
        const double e = std::exp(-time / tau);
        if (e < 1e-9) break;
        a[i] += v * e * (w * std::cos(w * time + t.phaseRad) - std::sin(w * time + t.phaseRad) / tau);
    }
}

// One ring of the resonance, zero-area SDOF shape A e^{-st} [cos(wd t) - (s / wd) sin(wd t)]
// (the derivative of e^{-st} sin(wd t) / wd), so the rings add no low-frequency line of their own.
void addRing(std::vector<double>& a, double fs, double t0, double amp, double resonanceHz, double damping) {
    const double wn = kTwoPi * resonanceHz, sigma = damping * wn, wd = wn * std::sqrt(1 - damping * damping);
    const auto first = static_cast<std::size_t>(std::ceil(t0 * fs));
    const auto length = static_cast<std::size_t>(9.2 / sigma * fs); // to e^-9.2 = 1e-4
    for (std::size_t i = first; i < std::min(a.size(), first + length); ++i) {
        const double t = static_cast<double>(i) / fs - t0;
        a[i] += amp * std::exp(-sigma * t) * (std::cos(wd * t) - sigma / wd * std::sin(wd * t));
    }
}

// Velocity pulse V sin^2(pi (t - t0) / w) over [t0, t0 + w], as acceleration (V pi / w) sin(2 pi (t - t0) / w).
void addVelocityPulse(std::vector<double>& a, double fs, double t0, double velocityPeak, double width) {
    const auto first = static_cast<std::size_t>(std::ceil(t0 * fs));
    const auto last = static_cast<std::size_t>(std::floor((t0 + width) * fs));
    const double amp = velocityPeak * std::numbers::pi / width;
    for (std::size_t i = first; i <= std::min(last, a.size() - 1); ++i)
        a[i] += amp * std::sin(kTwoPi * (static_cast<double>(i) / fs - t0) / width);
}

void addImpacts(std::vector<double>& a, double fs, double seconds, const ImpactSeries& b, Random& random) {
    if (!(b.rateHz > 0) || !(b.peakMs2 > 0 || b.pulseVelocityMs > 0)) return;
    const double period = 1.0 / b.rateHz;
    const double modulationPhase = kTwoPi * random.uniform();
    for (double t0 = period * random.uniform(); t0 < seconds; t0 += period * (1.0 + b.jitter * random.gaussian())) {
        double gain = 1.0;
        if (b.modulationDepth > 0) gain += b.modulationDepth * std::cos(kTwoPi * b.modulationHz * t0 + modulationPhase);
        addRing(a, fs, t0, gain * b.peakMs2, b.resonanceHz, b.dampingRatio);
        if (b.pulseVelocityMs > 0) addVelocityPulse(a, fs, t0, gain * b.pulseVelocityMs, b.pulseWidthS);
    }
}

void addRocking(std::vector<double>& a, double fs, double seconds, const RockingPulses& r) {
    if (!(r.shaftHz > 0) || !(r.velocityPeakMs > 0)) return;
    const double period = 1.0 / r.shaftHz, width = r.widthFraction * period;
    // The 1X velocity V sqrt2 sin(w t + phi) peaks at w t + phi = pi / 2.
    double centre = std::fmod((std::numbers::pi / 2 - r.phaseRad) / (kTwoPi * r.shaftHz), period);
    if (centre < 0) centre += period;
    int k = 0;
    for (double c = centre; c - width / 2 < seconds; c += period, ++k) {
        const double peak = r.velocityPeakMs * (k % 2 == 0 ? 1 + r.alternation : 1 - r.alternation);
        if (c - width / 2 >= 0) addVelocityPulse(a, fs, c - width / 2, peak, width);
    }
}

} // namespace

Random::Random(std::uint64_t seed) {
    for (auto& s : m_s) s = splitmix(seed);
}

std::uint64_t Random::next() {
    const std::uint64_t result = rotl(m_s[1] * 5, 7) * 9;
    const std::uint64_t t = m_s[1] << 17;
    m_s[2] ^= m_s[0];
    m_s[3] ^= m_s[1];
    m_s[1] ^= m_s[2];
    m_s[0] ^= m_s[3];
    m_s[2] ^= t;
    m_s[3] = rotl(m_s[3], 45);
    return result;
}

double Random::uniform() { return static_cast<double>(next() >> 11) * 0x1.0p-53; }

double Random::gaussian() {
    if (m_haveSpare) {
        m_haveSpare = false;
        return m_spare;
    }
    const double u1 = 1.0 - uniform(), u2 = uniform(); // u1 in (0, 1]
    const double r = std::sqrt(-2.0 * std::log(u1));
    m_spare = r * std::sin(kTwoPi * u2);
    m_haveSpare = true;
    return r * std::cos(kTwoPi * u2);
}

std::uint64_t mixSeed(std::uint64_t a, std::uint64_t b, std::uint64_t c, std::uint64_t d) {
    std::uint64_t x = 0x5EED5A3D1EF1EE7ull;
    for (std::uint64_t part : {a, b, c, d}) {
        x ^= part;
        x = splitmix(x);
    }
    return x;
}

std::vector<double> synthesiseVibration(const VibrationRecord& r, Random& random) {
    const double fs = r.sampleRateHz;
    std::vector<double> a(static_cast<std::size_t>(std::llround(fs * r.seconds)), 0.0);
    for (const auto& t : r.shaftTones) {
        if (r.coastDown) addCoastingTone(a, fs, t, r.coast.speedTauS);
        else addVelocityTone(a, fs, t);
    }
    for (const auto& t : r.electricalTones) {
        if (r.coastDown) addDyingTone(a, fs, t, r.coast.fluxTauS);
        else addVelocityTone(a, fs, t);
    }
    for (const auto& b : r.impacts) addImpacts(a, fs, r.seconds, b, random);
    for (const auto& p : r.rocking) addRocking(a, fs, r.seconds, p);
    for (std::size_t i = 0; i < a.size(); ++i) {
        a[i] += r.noiseMs2 * random.gaussian();
        if (r.biasStepMs2 != 0) a[i] += r.biasStepMs2 * std::exp(-static_cast<double>(i) / fs / r.biasTauS);
    }
    return a;
}

std::array<std::vector<double>, 3> synthesisePhaseSet(const PhaseSetRecord& r, Random& random) {
    const auto n = static_cast<std::size_t>(std::llround(r.sampleRateHz * r.seconds));
    std::array<std::vector<double>, 3> phases;
    for (int k = 0; k < 3; ++k) {
        auto& x = phases[static_cast<std::size_t>(k)];
        x.assign(n, 0.0);
        for (const auto& c : r.components) {
            // Phase b lags a by 120 degrees in a positive-sequence set and leads it in a negative one.
            const double shift = -c.sequence * k * kTwoPi / 3.0;
            addCosine(x, r.sampleRateHz, c.tone.frequencyHz, std::sqrt(2.0) * c.tone.rms * c.gain[static_cast<std::size_t>(k)],
                      c.tone.phaseRad + shift);
        }
    }
    if (r.lineToLine) {
        const auto a = phases[0];
        for (std::size_t i = 0; i < n; ++i) phases[0][i] -= phases[1][i];
        for (std::size_t i = 0; i < n; ++i) phases[1][i] -= phases[2][i];
        for (std::size_t i = 0; i < n; ++i) phases[2][i] -= a[i];
    }
    for (auto& x : phases)
        for (double& v : x) v += r.noiseRms * random.gaussian();
    return phases;
}

} // namespace humwise::sample
