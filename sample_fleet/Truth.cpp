#include "sample_fleet/Truth.h"

#include "core/util/JsonWriter.h"
#include "sample_fleet/MotorSignals.h"
#include "sample_fleet/Plant.h"
#include "sample_fleet/Scenario.h"
#include "sample_fleet/WalkdownWriter.h"

#include <chrono>
#include <cstdio>
#include <fstream>
#include <sstream>
#include <stdexcept>

namespace humwise::sample {
namespace {

std::string isoDate(std::chrono::sys_days d) {
    const std::chrono::year_month_day ymd{d};
    char buf[16];
    std::snprintf(buf, sizeof buf, "%04d-%02u-%02u", static_cast<int>(ymd.year()), static_cast<unsigned>(ymd.month()), static_cast<unsigned>(ymd.day()));
    return buf;
}

void writeRounds(json::Writer& w) {
    w.key("rounds").beginArray();
    for (const auto& r : rounds()) {
        w.beginObject().field("round", r.number).field("folder", r.folder()).field("date", isoDate(r.date));
        w.field("round_start", roundStartIso(r)).field("supply_hz", r.supplyHz).field("technician", r.technician);
        w.field("imported_by_tests", r.number <= kImportedRounds).endObject();
    }
    w.endArray();
}

void writeFaults(json::Writer& w) {
    w.key("faults").beginArray();
    for (const auto& f : seededFaults()) {
        w.beginObject().field("fault", f.faultId).field("motor", f.motorTag);
        w.key("points").beginArray();
        for (const auto& p : f.points) w.value(p);
        w.endArray();
        w.field("start_round", f.startRound).field("detectable_from", f.detectableFrom).field("strength_meaning", f.strengthMeaning);
        w.key("strength").numbers(f.strength);
        w.key("expected_severity").beginArray();
        for (int s : f.expectedSeverity) w.value(s);
        w.endArray();
        w.key("consequences").beginArray();
        for (const auto& c : f.consequences) w.value(c);
        w.endArray();
        if (f.velocityFrom > 0) w.field("velocity_visible_from", f.velocityFrom);
        w.field("story", f.story).endObject();
    }
    w.endArray();
}

void writeSpecials(json::Writer& w) {
    w.key("healthy_motors").beginArray();
    for (const auto& m : healthyMotors()) w.value(m);
    w.endArray();
    const auto& b = badRecording();
    const auto& bad = rounds().at(static_cast<std::size_t>(b.round - 1));
    w.key("bad_recording").beginObject().field("round", b.round).field("folder", bad.folder()).field("file", b.motorTag + "/" + b.pointName + ".wav");
    w.field("motor", b.motorTag).field("point", b.pointName).field("flag", b.flag).field("story", b.story).endObject();
    const auto& p = powerOffPair();
    const auto& po = rounds().at(static_cast<std::size_t>(p.round - 1));
    w.key("power_off").beginObject().field("round", p.round).field("folder", po.folder()).field("motor", p.motorTag).field("point", p.pointName);
    w.field("energised_file", p.energisedFile).field("after_file", p.afterFile).field("in_manifest", false);
    w.field("component", "2x line frequency").field("expected_origin", "electrical").field("story", p.story).endObject();
}

void writeOperatingPoints(json::Writer& w) {
    const auto& pl = plant();
    w.key("operating_points").beginArray();
    for (const auto& r : rounds())
        for (std::size_t i = 0; i < pl.fleet.motors.size(); ++i) {
            const auto op = operatingState(pl.fleet.motors[i], pl.profiles[i], r, i);
            w.beginObject().field("round", r.number).field("motor", pl.fleet.motors[i].motor.tag).field("line_hz", op.lineHz);
            w.field("speed_rpm", op.shaftHz * 60.0).field("load_percent", 100.0 * op.loadFraction).endObject();
        }
    w.endArray();
}

} // namespace

void writeTruth(const std::filesystem::path& path) {
    std::ostringstream text;
    json::Writer w(text);
    w.beginObject().field("format", "humwise-sample-truth").field("version", 1);
    w.field("site", plant().fleet.site).field("supply_hz", kPlantSupplyHz);
    w.field("note", "for tests only: the diagnosis never reads this file");
    writeRounds(w);
    writeFaults(w);
    writeSpecials(w);
    writeOperatingPoints(w);
    w.endObject();
    text << '\n';
    std::ofstream f(path, std::ios::binary | std::ios::trunc);
    if (!f) throw std::runtime_error(path.string() + ": cannot create the truth file");
    f << text.str();
    if (!f.flush()) throw std::runtime_error(path.string() + ": writing failed (disk full?)");
}

} // namespace humwise::sample
