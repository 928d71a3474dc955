#pragma once
// Signals of an induction motor with known faults, for tests with a known truth. Physical
// models, not canned spectra: vibration tones at the running-speed orders and 2x line frequency,
// bearing impacts that ring a structural resonance at a rate with random slip (jitter), inner-race
// impacts amplitude-modulated by the shaft rotation, broadband sensor noise; stator currents with
// the supply line, broken-bar and eccentricity sidebands, harmonics, phase unbalance and noise.

#include <cstdint>
#include <vector>

namespace humwise::test {

struct Tone {
    double frequencyHz = 0;
    double rms = 0;    // SI units of the signal (for vibration tones: velocity, m/s r.m.s.)
    double phase = 0;  // radians
};

struct BearingImpacts {
    double rateHz = 0;          // defect repetition frequency (BPFO, BPFI, 2xBSF)
    double resonanceHz = 3000;  // structural resonance the impacts excite
    double peakG = 0;           // peak acceleration of one impact response
    double dampingRatio = 0.05;
    double jitter = 0.01;       // relative random spread of the spacing (rolling-element slip)
    double modulationHz = 0;    // inner race: load-zone modulation at the shaft frequency
    double modulationDepth = 0; // 0..1
};

struct SyntheticVibration {
    double sampleRateHz = 25600;
    double seconds = 4;
    std::vector<Tone> velocityTones;      // m/s r.m.s. each (converted to acceleration)
    std::vector<BearingImpacts> impacts;
    double noiseG = 0.01;                 // broadband acceleration noise, g r.m.s.
    std::uint64_t seed = 1;
};

// Acceleration in m/s^2.
std::vector<double> synthAcceleration(const SyntheticVibration& spec);

struct SyntheticCurrent {
    double sampleRateHz = 5000;
    double seconds = 20;
    double lineHz = 50;
    double rmsA = 20;                       // fundamental of phase A
    std::vector<Tone> components;           // extra lines in phase A's units (rms relative to 1 A of fundamental x rmsA)
    double phaseBScale = 1, phaseCScale = 1; // magnitude unbalance of phases B and C
    double phaseBShiftRad = 0;              // angle error of phase B (negative sequence)
    double noiseRms = 0.002;                // relative to rmsA
    std::uint64_t seed = 1;
};

// Three phase currents (A, B, C), phase order a-b-c; every component appears in all phases with
// the phase rotation of its own sequence ignored (fine for single-phase spectral analysis).
std::vector<std::vector<double>> synthCurrents(const SyntheticCurrent& spec);

// A line `db` below the fundamental, as a relative r.m.s. for SyntheticCurrent::components.
double relativeRms(double dbBelow);

} // namespace humwise::test
