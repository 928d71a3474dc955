#include "sample_fleet/Plant.h"

#include <stdexcept>

namespace humwise::sample {
namespace {

using motor::BearingGeometry;
using motor::DrivenKind;
using motor::SupportClass;

// Deep-groove ball bearings by geometry (our own numbers, no maker's data): rolling elements,
// element and pitch diameter in mm, zero contact angle.
motor::Bearing ball(const char* designation, int elements, double elementMm, double pitchMm) {
    return motor::Bearing{designation, BearingGeometry{elements, elementMm, pitchMm, 0.0}};
}

const motor::Bearing kBall40 = ball("deep-groove ball, 40 mm bore", 9, 15.875, 70.0);
const motor::Bearing kBall50 = ball("deep-groove ball, 50 mm bore", 10, 12.7, 70.0);
const motor::Bearing kBall55 = ball("deep-groove ball, 55 mm bore", 9, 17.462, 77.5);
const motor::Bearing kBall70 = ball("deep-groove ball, 70 mm bore", 9, 22.225, 100.5);
const motor::Bearing kBall75 = ball("deep-groove ball, 75 mm bore", 8, 25.4, 115.0);
const motor::Bearing kBall85 = ball("deep-groove ball, 85 mm bore", 8, 19.05, 103.0);
const motor::Bearing kBall100 = ball("deep-groove ball, 100 mm bore", 8, 22.225, 120.1);

struct MotorSpec {
    const char* tag;
    const char* area;
    const char* description;
    double kW, amps, rpm;
    int poles, bars, slots;
    bool driveFed;
    const motor::Bearing* de;
    const motor::Bearing* nde;
    DrivenKind driven;
    int vanes;
    int isoGroup;
    SupportClass support;
};

fleet::PointDefinition vibrationPoint(const char* location, const char* direction) {
    fleet::PointDefinition p;
    p.name = std::string(location) + "-" + direction;
    p.quantity = Quantity::Acceleration;
    p.location = location;
    p.direction = direction;
    p.unit = Unit::G;
    p.sensitivity = 1.0;
    p.sensor = "accelerometer, 100 mV/g, magnet mount; collector writes g";
    return p;
}

fleet::PointDefinition electricalPoint(const std::string& name, Quantity q, const std::string& phase) {
    fleet::PointDefinition p;
    p.name = name;
    p.quantity = q;
    p.phase = phase;
    p.unit = q == Quantity::Current ? Unit::Ampere : Unit::Volt;
    p.sensitivity = 1.0;
    p.sensor = q == Quantity::Current ? "clamp-on current probe; collector writes A" : "voltage probe set, line to line; collector writes V";
    return p;
}

fleet::MotorDefinition motorOf(const MotorSpec& s, bool voltages) {
    fleet::MotorDefinition d;
    auto& m = d.motor;
    m.tag = s.tag;
    m.nameplate.ratedPowerKw = s.kW;
    m.nameplate.ratedVoltageV = kPlantLineVoltageV;
    m.nameplate.ratedCurrentA = s.amps;
    m.nameplate.supplyHz = kPlantSupplyHz;
    m.nameplate.ratedSpeedRpm = s.rpm;
    m.nameplate.poles = s.poles;
    m.nameplate.drive = s.driveFed ? motor::DriveKind::VariableFrequency : motor::DriveKind::DirectOnLine;
    m.nameplate.rotorBars = s.bars;
    m.nameplate.statorSlots = s.slots;
    m.driveEndBearing = *s.de;
    m.nonDriveEndBearing = *s.nde;
    m.driven.kind = s.driven;
    m.driven.vanesOrBlades = s.vanes;
    m.driven.speedRatio = 1.0;
    m.severity.standard = motor::SeverityClass::Standard::Iso20816_3;
    m.severity.group = s.isoGroup;
    m.severity.support = s.support;
    d.area = s.area;
    d.description = s.description;
    for (const char* loc : {"DE", "NDE"})
        for (const char* dir : {"H", "V", "A"})
            if (!(std::string(loc) == "NDE" && std::string(dir) == "A")) d.points.push_back(vibrationPoint(loc, dir));
    for (const char* ph : {"A", "B", "C"}) d.points.push_back(electricalPoint(std::string("I-") + ph, Quantity::Current, ph));
    if (voltages)
        for (const char* ph : {"AB", "BC", "CA"}) d.points.push_back(electricalPoint(std::string("V-") + ph, Quantity::Voltage, ph));
    return d;
}

// Tag, area, description, kW, A, r/min, poles, bars, slots, drive-fed, DE, NDE, driven, vanes, group, support.
const MotorSpec kMotors[] = {
    {"P-101", "Raw water intake", "Raw water pump 1, end-suction centrifugal, 5-vane impeller", 75, 132, 1482, 4, 40, 48, false, &kBall55, &kBall50, DrivenKind::CentrifugalPump, 5, 2, SupportClass::Rigid},
    {"P-102", "Raw water intake", "Raw water pump 2, end-suction centrifugal, 5-vane impeller", 75, 132, 1482, 4, 40, 48, false, &kBall55, &kBall50, DrivenKind::CentrifugalPump, 5, 2, SupportClass::Rigid},
    {"P-103", "Raw water intake", "Raw water pump 3, end-suction centrifugal, 5-vane impeller", 75, 132, 1482, 4, 40, 48, false, &kBall55, &kBall50, DrivenKind::CentrifugalPump, 5, 2, SupportClass::Rigid},
    {"B-201", "Aeration", "Aeration blower 1, single-stage centrifugal, 16 blades", 160, 272, 2978, 2, 28, 36, false, &kBall75, &kBall70, DrivenKind::Blower, 16, 2, SupportClass::Rigid},
    {"B-202", "Aeration", "Aeration blower 2, single-stage centrifugal, 16 blades", 160, 272, 2978, 2, 28, 36, false, &kBall75, &kBall70, DrivenKind::Blower, 16, 2, SupportClass::Rigid},
    {"B-203", "Aeration", "Aeration blower 3, single-stage centrifugal, 16 blades, on a frequency converter (dissolved-oxygen control)", 160, 272, 2978, 2, 28, 36, true, &kBall75, &kBall70, DrivenKind::Blower, 16, 2, SupportClass::Rigid},
    {"F-301", "Filtration and chemicals", "Filter gallery exhaust fan, axial, 8 blades, on spring isolators", 37, 71, 986, 6, 44, 54, false, &kBall40, &kBall40, DrivenKind::Fan, 8, 2, SupportClass::Flexible},
    {"F-302", "Filtration and chemicals", "Chemical store supply fan, centrifugal, 10 blades (oversized for the duty)", 30, 56, 1472, 4, 32, 36, false, &kBall40, &kBall40, DrivenKind::Fan, 10, 2, SupportClass::Rigid},
    {"P-401", "Treated water pumping", "Treated water pump 1, split-case centrifugal, 6-vane impeller", 315, 540, 1490, 4, 46, 60, false, &kBall100, &kBall85, DrivenKind::CentrifugalPump, 6, 1, SupportClass::Rigid},
    {"P-402", "Treated water pumping", "Treated water pump 2, split-case centrifugal, 6-vane impeller", 315, 540, 1490, 4, 46, 60, false, &kBall100, &kBall85, DrivenKind::CentrifugalPump, 6, 1, SupportClass::Rigid},
    {"P-403", "Treated water pumping", "Treated water pump 3, split-case centrifugal, 6-vane impeller", 315, 540, 1490, 4, 46, 60, false, &kBall100, &kBall85, DrivenKind::CentrifugalPump, 6, 1, SupportClass::Rigid},
    {"P-404", "Treated water pumping", "Washwater recovery pump, end-suction centrifugal, 6-vane impeller", 45, 81, 1478, 4, 36, 48, false, &kBall40, &kBall40, DrivenKind::CentrifugalPump, 6, 2, SupportClass::Rigid},
};

std::vector<MotorProfile> profiles() {
    std::vector<MotorProfile> p(std::size(kMotors));
    const auto set = [&](std::size_t i, double load, double oneX, double twoLF, double vane, double noiseG, double resDe, double resNde) {
        p[i].tag = kMotors[i].tag;
        p[i].loadFraction = load;
        p[i].oneXmms = oneX;
        p[i].twoXmms = 0.2 * oneX;
        p[i].twoLFmms = twoLF;
        p[i].vanePassMms = vane;
        p[i].noiseG = noiseG;
        p[i].resonanceDeHz = resDe;
        p[i].resonanceNdeHz = resNde;
    };
    // Motor, load, 1X at DE-H, 2 x line, vane pass (mm/s r.m.s.), noise (g), DE and NDE housing resonance (Hz).
    set(0, 0.86, 0.70, 0.10, 0.12, 0.015, 3100, 3700);
    set(1, 0.82, 0.60, 0.08, 0.10, 0.015, 3200, 3800);
    set(2, 0.88, 0.65, 0.09, 0.11, 0.015, 3000, 3600);
    set(3, 0.80, 0.80, 0.12, 0.10, 0.020, 4200, 3400);
    set(4, 0.78, 0.75, 0.12, 0.10, 0.020, 4100, 3300);
    set(5, 0.95, 0.70, 0.10, 0.10, 0.020, 4000, 3500);
    set(6, 0.76, 0.90, 0.08, 0.15, 0.012, 2600, 2900);
    set(7, 0.30, 0.50, 0.06, 0.08, 0.012, 2800, 3000);
    set(8, 0.82, 1.00, 0.15, 0.18, 0.020, 2700, 3300);
    set(9, 0.84, 1.10, 0.20, 0.18, 0.020, 2900, 3400);
    set(10, 0.80, 0.90, 0.15, 0.16, 0.020, 2800, 3200);
    set(11, 0.74, 0.55, 0.08, 0.09, 0.015, 3500, 4000);
    p[5].driveHzLow = 40.0; // B-203: the oxygen controller moves the blower between 40 and 48 Hz
    p[5].driveHzHigh = 48.0;
    p[7].loadSpread = 0.02;
    for (std::size_t i = 8; i < 12; ++i) p[i].onFeeder = true; // MCC-2
    return p;
}

Plant build() {
    Plant plant;
    auto& f = plant.fleet;
    f.site = "Velmorrow Water Treatment Works";
    f.siteDescription = "Fictional plant of the Humwise sample fleet (not a real site): river intake, aeration, filtration and treated-water "
                        "pumping; 400 V, 50 Hz from two motor control centres, the treated-water pumps on MCC-2, whose line voltages "
                        "are recorded at the motor terminals.";
    f.areas = {"Raw water intake", "Aeration", "Filtration and chemicals", "Treated water pumping"};
    plant.profiles = profiles();
    fleet::Route route;
    route.name = kRouteName;
    route.description = "Every motor once a month, intake to treated-water pumping: DE-H, DE-V, DE-A, NDE-H, NDE-V, then the phase "
                        "currents (and on MCC-2 the line voltages) at the starter.";
    for (std::size_t i = 0; i < std::size(kMotors); ++i) {
        f.motors.push_back(motorOf(kMotors[i], plant.profiles[i].onFeeder));
        for (const auto& p : f.motors.back().points) route.points.push_back({kMotors[i].tag, p.name});
    }
    f.routes.push_back(route);
    const auto issues = fleet::validate(f);
    if (!issues.empty()) throw std::logic_error("sample fleet: " + issues.front().where + ": " + issues.front().message);
    return plant;
}

} // namespace

const MotorProfile& Plant::profile(const std::string& tag) const {
    for (const auto& p : profiles)
        if (p.tag == tag) return p;
    throw std::out_of_range("sample fleet: no motor " + tag);
}

const Plant& plant() {
    static const Plant p = build();
    return p;
}

} // namespace humwise::sample
