#pragma once
// Physical signal models of the sample fleet's recordings: vibration acceleration built from
// velocity tones, bearing impacts that ring a structural resonance, once-per-revolution rocking
// pulses and sensor noise; three-phase sets (currents, voltages) built from symmetrical
// components. Everything is deterministic for a seed, with our own generator (the standard
// library's distributions differ between implementations).
//
// Units: vibration records come out in m/s^2; phase sets in the SI unit of their components.

#include <array>
#include <cstdint>
#include <vector>

namespace humwise::sample {

// xoshiro256** (Blackman & Vigna 2018) seeded through splitmix64; Gaussian by Box-Muller.
class Random {
public:
    explicit Random(std::uint64_t seed);
    std::uint64_t next();
    double uniform();  // [0, 1)
    double gaussian(); // zero mean, unit variance

private:
    std::array<std::uint64_t, 4> m_s{};
    bool m_haveSpare = false;
    double m_spare = 0;
};

// A seed for one recording from the parts that name it (round, motor, point, ...).
std::uint64_t mixSeed(std::uint64_t a, std::uint64_t b, std::uint64_t c = 0, std::uint64_t d = 0);

// A sinusoidal component. For vibration: velocity, m/s r.m.s. For phase sets: r.m.s. in the
// set's unit, phase of phase A.
struct Tone {
    double frequencyHz = 0;
    double rms = 0;
    double phaseRad = 0;
};

// Repetitive impacts of a rolling element on a local defect (Randall & Antoni 2011, MSSP 25;
// REFERENCE.md 8.1): each impact rings the housing's resonance with the SDOF
// response shape; the spacing varies randomly by `jitter` (rolling-element slip, 1-2 %); an
// inner-race defect is amplitude-modulated by the shaft rotation through the load zone. A grown
// defect (a spall wider than the element's contact) also deflects the race at each passage: a
// low-frequency velocity pulse of `pulseWidthS` that makes the defect rate visible in velocity.
struct ImpactSeries {
    double rateHz = 0;
    double jitter = 0.01;
    double resonanceHz = 3000;
    double dampingRatio = 0.05;
    double peakMs2 = 0;          // peak acceleration of one ring
    double modulationHz = 0;     // inner race: shaft frequency
    double modulationDepth = 0;  // 0..1
    double pulseVelocityMs = 0;  // peak velocity of the low-frequency pulse, m/s (0: none)
    double pulseWidthS = 0.0015;
};

// Structural looseness (REFERENCE.md 9: "many harmonics of 1x, sometimes 1/2x, clipped
// waveform"): a loose foot lifts and lands once per revolution, a short velocity pulse; on a
// cracked or loose base successive landings alternate in strength, which puts lines at half
// orders. Pulses are centred where the 1X velocity tone of phase `phaseRad` peaks.
struct RockingPulses {
    double shaftHz = 0;
    double velocityPeakMs = 0;
    double widthFraction = 0.08;  // pulse width / revolution
    double alternation = 0.5;     // amplitude (1 +- alternation) on even / odd revolutions
    double phaseRad = 0;
};

// The power-off (coast-down) record: from t = 0 the supply is off. Shaft-order tones slow down
// as n(t) = n0 / (1 + t / tau), the solution of J dn/dt = -k n^2 for a fluid load whose torque
// goes with speed^2 (tau = J / (k n0)), and their amplitude falls with speed^2 (a force ~ speed^2);
// tones of electrical origin (2 x line frequency) die with the rotor flux.
struct CoastDown {
    double speedTauS = 25;
    double fluxTauS = 0.05;
};

struct VibrationRecord {
    double sampleRateHz = 12800;
    double seconds = 4;
    std::vector<Tone> shaftTones;      // orders of running speed (coast down after a cut)
    std::vector<Tone> electricalTones; // 2 x line frequency (vanish after a cut)
    std::vector<ImpactSeries> impacts;
    std::vector<RockingPulses> rocking;
    double noiseMs2 = 0.1;            // broadband sensor and process noise, r.m.s.
    double biasStepMs2 = 0;           // a failing sensor's bias settling: step at t = 0 ...
    double biasTauS = 1;              // ... decaying with this time constant
    bool coastDown = false;
    CoastDown coast;
};

// Acceleration, m/s^2.
std::vector<double> synthesiseVibration(const VibrationRecord& record, Random& random);

// One component of a three-phase set: the phase-A tone and the sequence that rotates it to
// phases B and C (+1 positive a-b-c, -1 negative a-c-b).
struct PhaseComponent {
    Tone tone;
    int sequence = 1;
    std::array<double, 3> gain{1, 1, 1}; // per phase: a sagging phase of the supply
};

struct PhaseSetRecord {
    double sampleRateHz = 5000;
    double seconds = 20;
    std::vector<PhaseComponent> components;
    double noiseRms = 0;                            // per phase, independent
    bool lineToLine = false;                        // output a-b, b-c, c-a differences (voltages)
};

// Phases A, B, C (or AB, BC, CA).
std::array<std::vector<double>, 3> synthesisePhaseSet(const PhaseSetRecord& record, Random& random);

} // namespace humwise::sample
