#include "sample_fleet/WalkdownWriter.h"

#include "core/model/Units.h"
#include "core/util/Text.h"
#include "sample_fleet/MotorSignals.h"
#include "sample_fleet/Plant.h"
#include "sample_fleet/WavWriter.h"

#include <chrono>
#include <fstream>
#include <stdexcept>

namespace humwise::sample {
namespace {

namespace fs = std::filesystem;
using namespace std::chrono;

sys_time<milliseconds> roundStart(const Round& r) { return sys_time<milliseconds>(r.date) + minutes(r.startMinuteOfDay); }

// Where the technician is on the route: about six minutes per motor, 45 s per vibration point,
// then the clamps go on at the starter.
sys_time<milliseconds> recordedAt(const Round& r, std::size_t motorIndex, std::size_t pointIndex, bool electrical) {
    Random walk(mixSeed(0x7A1C, static_cast<std::uint64_t>(r.number), motorIndex));
    const auto motorStart = roundStart(r) + seconds(static_cast<long long>(motorIndex * 360 + 90 * walk.uniform()));
    return electrical ? motorStart + seconds(270) : motorStart + seconds(static_cast<long long>(45 * pointIndex));
}

ManifestRow rowFor(const fleet::MotorDefinition& m, const fleet::PointDefinition& p, sys_time<milliseconds> t) {
    return {m.motor.tag + "/" + p.name + ".wav", m.motor.tag, p.name, std::string(quantityName(p.quantity)), std::string(unitSymbol(p.unit)),
            text::formatIsoTime(t)};
}

bool isVibration(const fleet::PointDefinition& p) { return p.quantity == Quantity::Acceleration; }

} // namespace

std::string roundStartIso(const Round& round) { return text::formatIsoTime(roundStart(round)); }

std::vector<ManifestRow> writeMotorRound(const fs::path& folder, const Round& round, std::size_t motorIndex) {
    const auto& def = plant().fleet.motors.at(motorIndex);
    const auto& profile = plant().profiles.at(motorIndex);
    const MotorContext c{def, profile, round, motorIndex, operatingState(def, profile, round, motorIndex)};
    const auto rnd = static_cast<std::uint64_t>(round.number);
    fs::create_directories(folder / def.motor.tag);
    std::vector<ManifestRow> rows;
    std::array<std::vector<double>, 3> currents, voltages;
    bool haveVoltages = false;
    for (std::size_t k = 0; k < def.points.size(); ++k) {
        const auto& p = def.points[k];
        const fs::path file = folder / def.motor.tag / (p.name + ".wav");
        if (isVibration(p)) {
            Random random(mixSeed(rnd, motorIndex, k + 1, 1));
            const auto samples = synthesiseVibration(vibrationRecord(c, p, mixSeed(rnd, motorIndex, k + 1, 2)), random);
            writeFloatWav(file, kVibrationRateHz, samples, 1.0 / kStandardGravity);
            rows.push_back(rowFor(def, p, recordedAt(round, motorIndex, k, false)));
            continue;
        }
        const bool current = p.quantity == Quantity::Current;
        auto& set = current ? currents : voltages;
        if (set[0].empty()) {
            Random random(mixSeed(rnd, motorIndex, current ? 100 : 200, 1));
            const auto rec = current ? currentRecord(c, mixSeed(rnd, motorIndex, 100, 2)) : voltageRecord(c, mixSeed(rnd, motorIndex, 200, 2));
            set = synthesisePhaseSet(rec, random);
            haveVoltages |= !current;
        }
        static const std::string kOrder[] = {"A", "B", "C", "AB", "BC", "CA"};
        std::size_t phase = 0;
        for (std::size_t i = 0; i < 6; ++i)
            if (kOrder[i] == p.phase) phase = i % 3;
        writeFloatWav(file, kElectricalRateHz, set[phase]);
        rows.push_back(rowFor(def, p, recordedAt(round, motorIndex, k, true)));
    }
    return rows;
}

void writePowerOffPair(const fs::path& folder, const Round& round, std::size_t motorIndex) {
    const auto& po = powerOffPair();
    const auto& def = plant().fleet.motors.at(motorIndex);
    if (round.number != po.round || def.motor.tag != po.motorTag) return;
    const auto& profile = plant().profiles.at(motorIndex);
    const MotorContext c{def, profile, round, motorIndex, operatingState(def, profile, round, motorIndex)};
    const auto* point = def.point(po.pointName);
    if (!point) throw std::logic_error("sample fleet: the power-off point is not in the fleet");
    const auto rnd = static_cast<std::uint64_t>(round.number);
    auto on = vibrationRecord(c, *point, mixSeed(rnd, motorIndex, 300, 2));
    on.seconds = po.energisedSeconds;
    auto off = vibrationRecord(c, *point, mixSeed(rnd, motorIndex, 301, 2));
    off.seconds = po.afterSeconds;
    off.coastDown = true;
    off.coast = {po.speedTauS, po.fluxTauS};
    off.impacts.clear();
    Random r1(mixSeed(rnd, motorIndex, 300, 1)), r2(mixSeed(rnd, motorIndex, 301, 1));
    writeFloatWav(folder / po.energisedFile, kVibrationRateHz, synthesiseVibration(on, r1), 1.0 / kStandardGravity);
    writeFloatWav(folder / po.afterFile, kVibrationRateHz, synthesiseVibration(off, r2), 1.0 / kStandardGravity);
}

void writeManifest(const fs::path& folder, const Round& round, const std::vector<ManifestRow>& rows) {
    const fs::path path = folder / "manifest.csv";
    std::ofstream f(path, std::ios::binary | std::ios::trunc);
    if (!f) throw std::runtime_error(path.string() + ": cannot create the manifest");
    f << "# round_start: " << roundStartIso(round) << "\n";
    f << "# route: " << kRouteName << "\n";
    f << "# technician: " << round.technician << "\n";
    if (!round.notes.empty()) f << "# notes: " << round.notes << "\n";
    f << "file,channel,motor,point,quantity,unit,sensitivity,time\n";
    for (const auto& r : rows) f << r.file << ",1," << r.motorTag << "," << r.pointName << "," << r.quantity << "," << r.unit << ",1," << r.time << "\n";
    if (!f.flush()) throw std::runtime_error(path.string() + ": writing failed (disk full?)");
}

} // namespace humwise::sample
