#include "core/dsp/Integration.h"

#include "core/dsp/Fft.h"

#include <cmath>
#include <complex>
#include <cstdlib>
#include <numbers>
#include <stdexcept>
#include <string>

namespace humwise::dsp {
namespace {

int motionOrder(Quantity q) {
    switch (q) {
    case Quantity::Displacement: return 0;
    case Quantity::Velocity: return 1;
    case Quantity::Acceleration: return 2;
    default:
        throw std::invalid_argument("integration: " + std::string(quantityName(q)) +
                                    " is not acceleration, velocity or displacement");
    }
}

} // namespace

int integrationSteps(Quantity from, Quantity to) { return motionOrder(from) - motionOrder(to); }

namespace {

// value / (2 pi f)^power for the small integer power of a conversion (|power| <= 4; negative
// differentiates), by multiplications: a std::pow per line of every vibration spectrum took a
// seventieth of a route's import.
double divideByRadianPower(double value, double f, int power) {
    const double w = 2.0 * std::numbers::pi * f;
    double factor = 1.0;
    for (int i = 0; i < std::abs(power); ++i) factor *= w;
    return power > 0 ? value / factor : value * factor;
}

int linePower(int steps, SpectrumScale scale) { return scale == SpectrumScale::Psd ? 2 * steps : steps; }

} // namespace

double convertLine(double value, double f, Quantity from, Quantity to, SpectrumScale scale, double cutoffHz) {
    const int steps = integrationSteps(from, to);
    if (steps == 0) return value;
    if (f < cutoffHz || f <= 0) return 0.0;
    return divideByRadianPower(value, f, linePower(steps, scale));
}

void convertSpectrum(Spectrum& s, Quantity to, double cutoffHz) {
    const int steps = integrationSteps(s.quantity, to);
    if (steps == 0) return;
    const int power = linePower(steps, s.scale);
    for (std::size_t k = 0; k < s.values.size(); ++k) {
        const double f = s.frequencyHz(k);
        s.values[k] = f < cutoffHz || f <= 0 ? 0.0 : divideByRadianPower(s.values[k], f, power);
    }
    s.quantity = to;
}

std::vector<double> convertWaveform(std::span<const double> x, double fs, Quantity from, Quantity to, double cutoffHz) {
    const int steps = integrationSteps(from, to);
    std::vector<double> out(x.begin(), x.end());
    if (steps == 0 || x.empty()) return out;
    const std::size_t n = x.size();
    ComplexFft<double> forward(n, FftDirection::Forward);
    ComplexFft<double> backward(n, FftDirection::Backward);
    const auto in = forward.input();
    for (std::size_t i = 0; i < n; ++i) in[i] = x[i];
    forward.execute();
    const auto data = forward.output();
    const auto spec = backward.input();
    const std::complex<double> j(0.0, 1.0);
    for (std::size_t k = 0; k < n; ++k) {
        // Signed frequency of bin k of a complex transform.
        const double kk = k <= n / 2 ? static_cast<double>(k) : static_cast<double>(k) - static_cast<double>(n);
        const double f = kk * fs / static_cast<double>(n);
        if (std::abs(f) < cutoffHz || f == 0) {
            spec[k] = 0.0;
            continue;
        }
        const std::complex<double> jw = j * (2.0 * std::numbers::pi * f);
        spec[k] = data[k] / std::pow(jw, steps);
    }
    backward.execute();
    const auto back = backward.output();
    for (std::size_t i = 0; i < n; ++i) out[i] = back[i].real() / static_cast<double>(n);
    return out;
}

} // namespace humwise::dsp
