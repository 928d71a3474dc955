#include "workflow/FixtureFleet.h"

#include "core/io/WavTestWriter.h"
#include "support/SyntheticMotor.h"
#include "support/TestSupport.h"

#include <fstream>

namespace humwise::test {

namespace fs = std::filesystem;

fleet::Fleet smallFleet() {
    fleet::Fleet f;
    f.site = "Test works";
    f.siteDescription = "fixture";
    f.areas = {"North hall", "South hall"};
    for (int i = 1; i <= 2; ++i) {
        fleet::MotorDefinition m;
        m.motor.tag = "P-" + std::to_string(i);
        m.area = i == 1 ? "North hall" : "South hall";
        m.description = "fixture motor";
        auto& n = m.motor.nameplate;
        n.ratedPowerKw = 30;
        n.ratedVoltageV = 400;
        n.ratedCurrentA = 55;
        n.supplyHz = 50;
        n.ratedSpeedRpm = 1470;
        n.poles = 4;
        n.rotorBars = 28;
        m.motor.driveEndBearing = motor::Bearing{"fixture", motor::BearingGeometry{8, 17.5, 72.5, 0.0}};
        m.motor.nonDriveEndBearing = motor::Bearing{"fixture", motor::BearingFactors{3.05, 4.95, 1.99, 0.38}};
        m.motor.driven.kind = motor::DrivenKind::CentrifugalPump;
        m.motor.driven.vanesOrBlades = 6;
        for (const char* name : {"DE-H", "DE-V", "NDE-H"}) {
            fleet::PointDefinition p;
            p.name = name;
            p.quantity = Quantity::Acceleration;
            p.location = std::string(name).rfind("NDE", 0) == 0 ? "NDE" : "DE";
            p.direction = std::string(1, name[std::string(name).size() - 1]);
            p.unit = Unit::G;
            p.sensitivity = 1.0;
            p.sensor = "accelerometer 100 mV/g";
            m.points.push_back(p);
        }
        for (const char* phase : {"A", "B", "C"}) {
            fleet::PointDefinition p;
            p.name = std::string("I-") + phase;
            p.quantity = Quantity::Current;
            p.phase = phase;
            p.unit = Unit::Ampere;
            m.points.push_back(p);
        }
        f.motors.push_back(m);
    }
    fleet::Route r;
    r.name = "Monthly";
    r.description = "all points";
    for (const auto& m : f.motors)
        for (const auto& p : m.points) r.points.push_back({m.motor.tag, p.name});
    f.routes.push_back(r);
    return f;
}

std::string writeWalkdown(const fs::path& folder, const WalkdownSpec& spec) {
    fs::create_directories(folder);
    std::string manifest = "# round_start: " + spec.roundStart + "\n# route: Monthly\n# technician: technician 1\nfile,channel,motor,point\n";
    const double fr = 1476.0 / 60;
    std::uint64_t seed = spec.seed;
    for (const auto& m : smallFleet().motors) {
        for (const char* name : {"DE-H", "DE-V", "NDE-H"}) {
            SyntheticVibration v;
            v.sampleRateHz = 12800;
            v.seconds = 2;
            const double oneX = (m.motor.tag == "P-1" && std::string(name) == "DE-H") ? spec.oneXmmsP1 : 0.5;
            v.velocityTones = {Tone{fr, oneX * 1e-3, 0.3}, Tone{2 * fr, 0.1e-3, 0.1}, Tone{100.0, 0.05e-3, 0.0}};
            v.noiseG = 0.01;
            v.seed = seed++;
            auto a = synthAcceleration(v);
            for (double& x : a) x /= 9.80665; // written in g
            const std::string file = m.motor.tag + "/" + name + ".wav";
            fs::create_directories(folder / m.motor.tag);
            writeBytes(folder / file, makeFloatWav(a, 12800));
            manifest += file + ",1," + m.motor.tag + "," + name + "\n";
        }
        SyntheticCurrent c;
        c.sampleRateHz = 2500;
        c.seconds = 10;
        c.rmsA = 40;
        c.components = {Tone{50 - fr, relativeRms(58), 0.2}, Tone{50 + fr, relativeRms(58), 0.9}};
        c.seed = seed++;
        const auto phases = synthCurrents(c);
        // One three-channel file for the phases: channels 1, 2, 3.
        std::vector<double> interleaved;
        for (std::size_t i = 0; i < phases[0].size(); ++i)
            for (int p = 0; p < 3; ++p) interleaved.push_back(phases[static_cast<std::size_t>(p)][i]);
        const std::string file = m.motor.tag + "/current.wav";
        writeBytes(folder / file, makeFloatWav(interleaved, 2500, 3));
        for (int p = 0; p < 3; ++p) manifest += file + "," + std::to_string(p + 1) + "," + m.motor.tag + ",I-" + static_cast<char>('A' + p) + "\n";
    }
    if (spec.writeManifest) {
        std::ofstream(folder / "manifest.csv") << manifest;
    }
    return manifest;
}

fs::path freshFolder(const std::string& name) {
    const fs::path p = outputDir() / "workflow" / name;
    std::error_code ec;
    fs::remove_all(p, ec);
    fs::create_directories(p);
    return p;
}

} // namespace humwise::test
