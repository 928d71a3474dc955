#include "DiagnosisTestSupport.h"

#include <sstream>

namespace humwise::diagnosis::test {

using humwise::test::Tone;

motor::Motor fourPoleMotor() {
    motor::Motor m;
    m.tag = "TEST-4P";
    m.nameplate.ratedPowerKw = 55;
    m.nameplate.ratedVoltageV = 400;
    m.nameplate.ratedCurrentA = 98;
    m.nameplate.supplyHz = 50;
    m.nameplate.ratedSpeedRpm = 1470;
    m.nameplate.poles = 4;
    m.nameplate.rotorBars = 28;
    m.driveEndBearing = motor::Bearing{"6309", motor::BearingGeometry{8, 17.5, 72.5, 0.0}};
    m.nonDriveEndBearing = m.driveEndBearing;
    m.severity.group = 2;
    m.severity.support = motor::SupportClass::Rigid;
    return m;
}

motor::Motor twoPoleMotor() {
    motor::Motor m = fourPoleMotor();
    m.tag = "TEST-2P";
    m.nameplate.ratedPowerKw = 90;
    m.nameplate.ratedSpeedRpm = 2970;
    m.nameplate.poles = 2;
    m.nameplate.rotorBars = 34;
    return m;
}

humwise::test::SyntheticVibration healthyVibration(const HealthyVibration& h, std::uint64_t seed) {
    humwise::test::SyntheticVibration s;
    s.velocityTones = {Tone{h.shaftHz, h.oneXmms * kMm, 0.3}, Tone{2 * h.shaftHz, h.twoXmms * kMm, 1.1},
                       Tone{2 * h.lineHz, h.twoLFmms * kMm, 2.0}};
    s.noiseG = h.noiseG;
    s.seed = seed;
    return s;
}

VibrationInput vibrationChannel(const humwise::test::SyntheticVibration& spec, Location where, Direction direction) {
    VibrationInput v;
    v.location = where;
    v.direction = direction;
    v.name = std::string(locationName(where)) + "-" + directionName(direction);
    v.quantity = Quantity::Acceleration;
    v.sampleRateHz = spec.sampleRateHz;
    v.samples = humwise::test::synthAcceleration(spec);
    return v;
}

humwise::test::SyntheticCurrent healthyCurrent(double lineHz, double shaftHz, int poles, std::uint64_t seed) {
    humwise::test::SyntheticCurrent c;
    c.lineHz = lineHz;
    c.seed = seed;
    const double slip = 1.0 - shaftHz * (poles / 2.0) / lineHz;
    c.components = {Tone{lineHz - shaftHz, humwise::test::relativeRms(58), 0.4}, Tone{lineHz + shaftHz, humwise::test::relativeRms(58), 1.3},
                    Tone{lineHz * (1 - 2 * slip), humwise::test::relativeRms(60), 0.7}, Tone{lineHz * (1 + 2 * slip), humwise::test::relativeRms(61), 2.2},
                    Tone{5 * lineHz, 0.02, 0.0}, Tone{7 * lineHz, 0.012, 0.0}};
    return c;
}

const Finding* findFault(const DiagnosisResult& r, const std::string& fault) {
    for (const auto& f : r.findings)
        if (f.fault == fault) return &f;
    return nullptr;
}

int worstSeverity(const DiagnosisResult& r) {
    int worst = 0;
    for (const auto& f : r.findings) worst = std::max(worst, f.severity);
    return worst;
}

std::string describe(const DiagnosisResult& r) {
    std::ostringstream o;
    o << "speed " << r.operatingPoint.point.speedRpm() << " r/min by " << r.operatingPoint.speedMethod << ", line " << r.operatingPoint.point.lineHz
      << " Hz\n";
    for (const auto& f : r.findings) {
        o << "  " << f.fault << " severity " << f.severity << (f.withheld ? " withheld" : "") << ": " << f.explanation << "\n";
        for (const auto& e : f.evidence)
            o << "      " << e.label << " exp " << (e.expectedHz ? *e.expectedHz : -1) << " meas " << (e.measuredHz ? *e.measuredHz : -1) << " amp "
              << e.amplitude << " " << e.unit << "\n";
    }
    for (const auto& n : r.notes) o << "  note: " << n << "\n";
    return o.str();
}

} // namespace humwise::diagnosis::test
