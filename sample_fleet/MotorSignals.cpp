#include "sample_fleet/MotorSignals.h"

#include "core/model/Units.h"
#include "core/motor/Motor.h"

#include <algorithm>
#include <cmath>
#include <complex>
#include <numbers>
#include <stdexcept>

namespace humwise::sample {
namespace {

constexpr double kTwoPi = 2 * std::numbers::pi;
constexpr double kMm = 1e-3; // mm/s -> m/s

double belowDb(double db) { return std::pow(10.0, -db / 20.0); }

// A deterministic value in [-1, 1] for one motor, round and purpose.
double spread(std::size_t motorIndex, int round, int purpose) {
    Random r(mixSeed(0xA11CE, motorIndex, static_cast<std::uint64_t>(round), static_cast<std::uint64_t>(purpose)));
    return 2.0 * r.uniform() - 1.0;
}

// Per-point factors in the order DE-H, DE-V, DE-A, NDE-H, NDE-V (how strongly each sensor
// position sees a force: vertical stiffer than horizontal on a foot-mounted motor, little axial).
struct PointScale {
    double deH, deV, deA, ndeH, ndeV;
    double at(const std::string& point) const {
        if (point == "DE-H") return deH;
        if (point == "DE-V") return deV;
        if (point == "DE-A") return deA;
        if (point == "NDE-H") return ndeH;
        if (point == "NDE-V") return ndeV;
        throw std::invalid_argument("sample fleet: no vibration point " + point);
    }
};

constexpr PointScale kResidual1X{1.0, 0.75, 0.4, 0.85, 0.65};
constexpr PointScale kUnbalance{1.0, 0.7, 0.12, 0.9, 0.6};
constexpr PointScale kMisalignment2X{1.0, 0.85, 0.4, 0.7, 0.6};
constexpr PointScale kRocking{0.35, 0.85, 0.15, 0.4, 1.0};
constexpr PointScale kTwiceLine{1.0, 0.8, 0.3, 0.85, 0.7};
constexpr PointScale kVanePass{1.0, 0.8, 0.7, 0.6, 0.5};
// Bearing impacts ring the housing they happen in; the other end hears little of them.
constexpr PointScale kDeBearing{1.0, 0.8, 0.5, 0.05, 0.04};
constexpr PointScale kNdeBearing{0.05, 0.04, 0.03, 1.0, 0.8};

constexpr double kRockingWidth = 0.12; // pulse width / revolution

// r.m.s. of the 1X line of a train of Hann velocity pulses of peak P and width w T:
// P w |sinc(w) / (1 - w^2)| / sqrt2 (the Hann window's transform).
double rockingOneXRms(double peak) {
    const double x = kRockingWidth;
    const double sinc = std::sin(std::numbers::pi * x) / (std::numbers::pi * x);
    return peak * x * sinc / (1 - x * x) / std::sqrt(2.0);
}

// Velocity tone magnitudes that add as phasors at 60 degrees (a new heavy spot is not in line
// with the residual one).
double addAt60(double a, double b) { return std::sqrt(a * a + b * b + a * b); }

struct Faults {
    double outerRaceG, innerRaceG, unbalanceMms, misalignmentMms, rockingMms, twiceLineMms, negativeSequence, sidebandDb;
    bool statorFault, rotorFault;
};

Faults faultsAt(const std::string& tag, const MotorProfile& p, int round) {
    Faults f{};
    f.outerRaceG = strengthOf(tag, FaultKind::OuterRace, round, 0);
    f.innerRaceG = strengthOf(tag, FaultKind::InnerRace, round, 0);
    f.unbalanceMms = strengthOf(tag, FaultKind::Unbalance, round, 0);
    f.misalignmentMms = strengthOf(tag, FaultKind::Misalignment, round, 0);
    f.rockingMms = strengthOf(tag, FaultKind::Looseness, round, 0);
    f.twiceLineMms = strengthOf(tag, FaultKind::StaticEccentricity, round, p.twoLFmms);
    f.negativeSequence = strengthOf(tag, FaultKind::StatorWinding, round, p.negativeSequence);
    f.statorFault = faultOn(tag, FaultKind::StatorWinding) != nullptr;
    f.sidebandDb = p.rotorSidebandDb;
    for (auto kind : {FaultKind::BrokenBars, FaultKind::LightLoadBrokenBars})
        if (faultOn(tag, kind)) {
            f.sidebandDb = strengthOf(tag, kind, round, p.rotorSidebandDb);
            f.rotorFault = true;
        }
    return f;
}

// A grown spall deflects the race at each passage once it is wider than the element's contact
// (from about 0.09 g of impact here): the low-frequency pulse that makes the defect rate show in
// velocity - stage 3 of the usual four stages of bearing wear (common practice (no source)).
double spallPulseVelocity(double impactG) { return 0.1 * std::max(0.0, impactG - 0.09); }

ImpactSeries bearingImpacts(const MotorContext& c, const std::string& point, double impactG, double factor, bool inner) {
    ImpactSeries b;
    const double fr = c.op.shaftHz;
    const bool de = point.rfind("DE", 0) == 0;
    const double scale = (inner ? kNdeBearing : kDeBearing).at(point);
    b.rateHz = factor * fr;
    b.jitter = 0.01;
    b.resonanceHz = de ? c.profile.resonanceDeHz : c.profile.resonanceNdeHz;
    b.dampingRatio = 0.05;
    b.peakMs2 = impactG * scale * kStandardGravity;
    b.pulseVelocityMs = spallPulseVelocity(impactG) * scale;
    b.pulseWidthS = 0.0015;
    if (inner) {
        b.modulationHz = fr;
        b.modulationDepth = 0.7;
    }
    return b;
}

void addBearingFaults(VibrationRecord& r, const MotorContext& c, const std::string& point, const Faults& f) {
    const auto& m = c.definition.motor;
    if (f.outerRaceG > 0) r.impacts.push_back(bearingImpacts(c, point, f.outerRaceG, motor::factorsOf(*m.driveEndBearing).bpfo, false));
    if (f.innerRaceG > 0) r.impacts.push_back(bearingImpacts(c, point, f.innerRaceG, motor::factorsOf(*m.nonDriveEndBearing).bpfi, true));
}

// Running-speed orders: residual 1X and 2X, unbalance, misalignment, looseness, vane pass and
// the pole-pass sidebands of a damaged cage (REFERENCE.md 9 signatures).
void addShaftOrders(VibrationRecord& r, const MotorContext& c, const std::string& point, const Faults& f, Random& rnd) {
    const auto& p = c.profile;
    const double fr = c.op.shaftHz;
    const bool axial = point == "DE-A";
    const auto phase = [&] { return kTwoPi * rnd.uniform(); };
    double oneX = addAt60(p.oneXmms * kResidual1X.at(point), f.unbalanceMms * kUnbalance.at(point));
    double twoX = p.twoXmms * kResidual1X.at(point);
    const double mis = f.misalignmentMms * kMisalignment2X.at(point);
    if (mis > 0) {
        oneX = std::hypot(oneX, axial ? 0.85 * f.misalignmentMms : 0.25 * mis);
        twoX = std::hypot(twoX, mis);
        r.shaftTones.push_back({3 * fr, 0.3 * mis * kMm, phase()});
    }
    const double rocking = f.rockingMms * kRocking.at(point);
    const double phase1X = phase();
    if (rocking > 0) {
        oneX += rockingOneXRms(rocking); // the softer support lets 1X grow too (directional 1X)
        r.rocking.push_back({fr, rocking * kMm, kRockingWidth, 0.6, phase1X});
    }
    r.shaftTones.push_back({fr, oneX * kMm, phase1X});
    r.shaftTones.push_back({2 * fr, twoX * kMm, phase()});
    if (const auto vanes = c.definition.motor.driven.vanesOrBlades)
        r.shaftTones.push_back({*vanes * fr * c.definition.motor.driven.speedRatio, p.vanePassMms * kVanePass.at(point) * kMm, phase()});
    if (f.rotorFault && !axial) {
        // Speed ripple at 2 s f: pole-pass sidebands of 1X, 0.25 mm/s at a 35 dB current sideband.
        const double sb = 0.25 * belowDb(f.sidebandDb - 35.0) * kMm * kResidual1X.at(point);
        const double pp = 2 * c.op.slip * c.op.lineHz;
        r.shaftTones.push_back({fr - pp, sb, phase()});
        r.shaftTones.push_back({fr + pp, 0.9 * sb, phase()});
    }
}

std::complex<double> unitPhasor(double rad) { return std::polar(1.0, rad); }

// The feeder's unbalance as this motor's terminals see it (the bus value, a little cable spread).
double feederNemaPercent(const MotorContext& c) {
    const double bus = strengthOf(c.definition.motor.tag, FaultKind::VoltageUnbalance, c.round.number, 0.35);
    return std::max(0.0, bus + 0.03 * spread(c.motorIndex, c.round.number, 6));
}

} // namespace

OperatingState operatingState(const fleet::MotorDefinition& d, const MotorProfile& p, const Round& round, std::size_t motorIndex) {
    const auto& n = d.motor.nameplate;
    OperatingState s;
    s.poles = *motor::polesOf(n);
    double load = p.loadFraction + p.loadSpread * spread(motorIndex, round.number, 1);
    if (p.driveHzHigh > 0) {
        const double u = 0.5 + 0.5 * spread(motorIndex, round.number, 2);
        s.lineHz = std::round((p.driveHzLow + (p.driveHzHigh - p.driveHzLow) * u) * 100.0) / 100.0;
        load *= std::pow(s.lineHz / n.supplyHz, 2); // fan law: torque ~ speed^2
    } else {
        s.lineHz = round.supplyHz + 0.004 * spread(motorIndex, round.number, 3); // the grid drifts during the round
    }
    s.loadFraction = load;
    s.slip = *motor::ratedSlip(n) * load;
    s.shaftHz = s.lineHz * (1 - s.slip) / (s.poles / 2.0);
    const double m = p.magnetisingFraction;
    s.currentA = n.ratedCurrentA * std::sqrt(m * m + load * load * (1 - m * m));
    return s;
}

VibrationRecord vibrationRecord(const MotorContext& c, const fleet::PointDefinition& point, std::uint64_t seed) {
    Random rnd(seed);
    const Faults f = faultsAt(c.definition.motor.tag, c.profile, c.round.number);
    VibrationRecord r;
    r.sampleRateHz = kVibrationRateHz;
    r.seconds = kVibrationSeconds;
    r.noiseMs2 = c.profile.noiseG * kStandardGravity;
    addShaftOrders(r, c, point.name, f, rnd);
    // Twice line frequency: magnetic pull of an uneven air gap; a winding asymmetry adds a little.
    double twoLF = f.twiceLineMms + (f.statorFault ? 2.0 * std::max(0.0, f.negativeSequence - c.profile.negativeSequence) : 0.0);
    r.electricalTones.push_back({2 * c.op.lineHz, twoLF * kTwiceLine.at(point.name) * kMm, kTwoPi * rnd.uniform()});
    addBearingFaults(r, c, point.name, f);
    const auto& bad = badRecording();
    if (c.round.number == bad.round && c.definition.motor.tag == bad.motorTag && point.name == bad.pointName) {
        r.biasStepMs2 = bad.biasStepG * kStandardGravity;
        r.biasTauS = bad.biasTauS;
    }
    return r;
}

PhaseSetRecord currentRecord(const MotorContext& c, std::uint64_t seed) {
    Random rnd(seed);
    const auto phase = [&] { return kTwoPi * rnd.uniform(); };
    const Faults fault = faultsAt(c.definition.motor.tag, c.profile, c.round.number);
    const double i = c.op.currentA, f = c.op.lineHz, fr = c.op.shaftHz, s = c.op.slip;
    PhaseSetRecord r;
    r.sampleRateHz = kElectricalRateHz;
    r.seconds = kElectricalSeconds;
    r.noiseRms = 5e-4 * i;
    const double angle = phase();
    r.components.push_back({{f, i, angle}, 1});
    // Negative sequence (Fortescue; REFERENCE.md 6.6): the winding's own asymmetry, and on the
    // recorded feeder the supply's, I2 / I1 = (V2 / V1)(Z1 / Z2) with Z2 the locked-rotor
    // impedance (|Z1 / Z2| = I_locked / I, I_locked = 6 I_rated, 50 degrees apart; common practice
    // (no source), consistent with REFERENCE.md 6.4's 6-10 x current unbalance).
    std::complex<double> i2 = fault.negativeSequence * unitPhasor(1.3 + 0.9 * static_cast<double>(c.motorIndex));
    if (c.profile.onFeeder) {
        const double d = phaseSagForNema(feederNemaPercent(c));
        const std::complex<double> a2 = unitPhasor(-kTwoPi / 3);
        const std::complex<double> v2v1 = -d * a2 / (3.0 - d);
        i2 += v2v1 * (6.0 * c.definition.motor.nameplate.ratedCurrentA / i) * unitPhasor(-50.0 * std::numbers::pi / 180.0);
    }
    r.components.push_back({{f, std::abs(i2) * i, angle + std::arg(i2)}, -1});
    // Air-gap eccentricity f -+ fr (Dorrell, Thomson & Roach 1997; REFERENCE.md 4).
    r.components.push_back({{f - fr, i * belowDb(c.profile.eccentricityDb), phase()}, 1});
    r.components.push_back({{f + fr, i * belowDb(c.profile.eccentricityDb + 1.5), phase()}, 1});
    // Rotor asymmetry (1 -+ 2ks) f (Thomson & Fenger 2001; REFERENCE.md 4): the mean of the first
    // pair is the fault's level; speed ripple makes the upper one a little weaker.
    r.components.push_back({{f * (1 - 2 * s), i * belowDb(fault.sidebandDb - 0.75), phase()}, 1});
    r.components.push_back({{f * (1 + 2 * s), i * belowDb(fault.sidebandDb + 0.75), phase()}, 1});
    r.components.push_back({{f * (1 - 4 * s), i * belowDb(fault.sidebandDb + 12), phase()}, 1});
    r.components.push_back({{f * (1 + 4 * s), i * belowDb(fault.sidebandDb + 13), phase()}, 1});
    if (fault.statorFault) {
        // Shorted turns f [(1/p)(1 - s) + 3] (Thomson; Penman et al. 1994; REFERENCE.md 4).
        const double level = 75.0 - 120.0 * std::max(0.0, fault.negativeSequence - c.profile.negativeSequence);
        r.components.push_back({{fr + 3 * f, i * belowDb(level), phase()}, 1});
    }
    // Harmonics from the supply's distortion (a drive's output carries more); 5th and 11th rotate backwards.
    const bool drive = c.profile.driveHzHigh > 0;
    const double h[4][3] = {{5, 0.022, -1}, {7, 0.014, 1}, {11, 0.005, -1}, {13, 0.0035, 1}};
    for (const auto& row : h)
        r.components.push_back({{row[0] * f, i * row[1] * (drive ? 1.6 : 1.0), phase()}, static_cast<int>(row[2])});
    return r;
}

PhaseSetRecord voltageRecord(const MotorContext& c, std::uint64_t seed) {
    Random rnd(seed);
    const auto phase = [&] { return kTwoPi * rnd.uniform(); };
    const double f = c.op.lineHz;
    const double d = phaseSagForNema(feederNemaPercent(c));
    // The bus voltage of the round, less this motor's cable drop.
    const double vph = kPlantLineVoltageV / std::sqrt(3.0) * (1.0 + 0.01 * spread(0, c.round.number, 5)) * (1.0 - 0.004 * spread(c.motorIndex, 0, 7) - 0.006);
    PhaseSetRecord r;
    r.sampleRateHz = kElectricalRateHz;
    r.seconds = kElectricalSeconds;
    r.lineToLine = true;
    r.noiseRms = 0.05;
    PhaseComponent fundamental{{f, vph, phase()}, 1};
    fundamental.gain = {1.0, 1.0, 1.0 - d};
    r.components.push_back(fundamental);
    const double h[4][3] = {{5, 0.018, -1}, {7, 0.011, 1}, {11, 0.0045, -1}, {13, 0.003, 1}};
    for (const auto& row : h) r.components.push_back({{row[0] * f, vph * row[1], phase()}, static_cast<int>(row[2])});
    return r;
}

double phaseSagForNema(double nemaPercent) {
    // Phase voltages 1, a^2, (1 - d) a; line voltages ab, bc, ca; NEMA = max deviation / mean.
    const auto nema = [](double d) {
        const std::complex<double> a = std::polar(1.0, kTwoPi / 3), va = 1.0, vb = a * a, vc = (1.0 - d) * a;
        const double l[3] = {std::abs(va - vb), std::abs(vb - vc), std::abs(vc - va)};
        const double mean = (l[0] + l[1] + l[2]) / 3.0;
        double dev = 0;
        for (double x : l) dev = std::max(dev, std::abs(x - mean));
        return 100.0 * dev / mean;
    };
    double lo = 0, hi = 0.5;
    for (int i = 0; i < 60; ++i) {
        const double mid = 0.5 * (lo + hi);
        (nema(mid) < nemaPercent ? lo : hi) = mid;
    }
    return 0.5 * (lo + hi);
}

} // namespace humwise::sample
