// Trend query at the scale of a large plant's decade: one indicator of one point across 120
// monthly rounds, in a store holding 1000 motors x 120 rounds (target < 20 ms). Builds the store
// through the repository API (the same calls an import makes), then times the query.
// Also times the fleet file of those motors, written and read back (io/FleetFile.h).
// Usage: bench_store [motors] [rounds] [db-path]

#include "core/io/FleetFile.h"
#include "storage/FleetStore.h"

#include <algorithm>
#include <chrono>
#include <cstdio>
#include <cstdlib>
#include <filesystem>
#include <random>

namespace {

using namespace humwise;
using Clock = std::chrono::steady_clock;

fleet::Fleet syntheticFleet(int motors) {
    fleet::Fleet f;
    f.site = "Benchmark works";
    f.areas = {"Hall"};
    for (int i = 0; i < motors; ++i) {
        fleet::MotorDefinition m;
        m.motor.tag = "M-" + std::to_string(i);
        m.area = "Hall";
        m.motor.nameplate.ratedPowerKw = 55;
        m.motor.nameplate.ratedVoltageV = 400;
        m.motor.nameplate.ratedCurrentA = 98;
        m.motor.nameplate.ratedSpeedRpm = 1475;
        for (const char* name : {"DE-H", "DE-V", "DE-A", "NDE-H", "NDE-V"}) {
            fleet::PointDefinition p;
            p.name = name;
            p.location = name[0] == 'N' ? "NDE" : "DE";
            p.direction = std::string(1, name[std::char_traits<char>::length(name) - 1]);
            m.points.push_back(p);
        }
        f.motors.push_back(m);
    }
    return f;
}

} // namespace

int main(int argc, char** argv) {
    const int motors = argc > 1 ? std::atoi(argv[1]) : 1000;
    const int rounds = argc > 2 ? std::atoi(argv[2]) : 120;
    const std::filesystem::path path = argc > 3 ? argv[3] : std::filesystem::temp_directory_path() / "humwise-bench-store.db";
    storage::removeDatabaseFiles(path);
    const char* perPoint[] = {"velocity_rms", "1x", "2x", "env_bpfo"};
    const char* perMotor[] = {"slip", "speed_rpm", "sideband_db", "current_unbalance"};

    const auto fleet = syntheticFleet(motors);
    const auto tf = Clock::now();
    const std::string fleetText = io::writeFleet(fleet);
    const auto readBack = io::parseFleet(fleetText, "bench fleet file");
    const double fleetFileMs = std::chrono::duration<double, std::milli>(Clock::now() - tf).count();
    if (!readBack || readBack.value().motors.size() != fleet.motors.size()) {
        std::fprintf(stderr, "bench_store: the fleet file did not read back: %s\n", readBack ? "motor count differs" : readBack.error().message().c_str());
        return 1;
    }

    const auto t0 = Clock::now();
    auto store = storage::FleetStore::open(path);
    {
        storage::Transaction tx(store->database());
        store->saveFleet(fleet);
        tx.commit();
    }
    std::mt19937_64 rng(1);
    std::normal_distribution<double> noise(0.0, 0.1);
    std::size_t rows = 0;
    for (int r = 0; r < rounds; ++r) {
        storage::Transaction tx(store->database());
        storage::RoundRow round;
        char date[32];
        std::snprintf(date, sizeof date, "%04d-%02d-01T08:00:00.000Z", 2017 + r / 12, 1 + r % 12);
        round.startedAt = date;
        round.manifestHash = "bench-" + std::to_string(r);
        round.importedAt = date;
        const auto id = store->insertRound(round);
        for (const auto& m : fleet.motors) {
            for (const auto& p : m.points)
                for (const char* name : perPoint) {
                    store->insertIndicator(id, {m.motor.tag, p.name, name, 1.0 + noise(rng), "mm/s"});
                    ++rows;
                }
            for (const char* name : perMotor) {
                store->insertIndicator(id, {m.motor.tag, "", name, 1.0 + noise(rng), "1"});
                ++rows;
            }
        }
        tx.commit();
    }
    store->checkpoint();
    const double buildS = std::chrono::duration<double>(Clock::now() - t0).count();

    std::vector<double> ms;
    std::uniform_int_distribution<int> motorPick(0, motors - 1), pointPick(0, 4), namePick(0, 3);
    std::size_t returned = 0;
    for (int q = 0; q < 300; ++q) {
        const auto& m = fleet.motors[static_cast<std::size_t>(motorPick(rng))];
        const auto& p = m.points[static_cast<std::size_t>(pointPick(rng))];
        const auto t = Clock::now();
        const auto trend = store->trend(m.motor.tag, p.name, perPoint[namePick(rng)]);
        ms.push_back(std::chrono::duration<double, std::milli>(Clock::now() - t).count());
        returned += trend.size();
    }
    std::sort(ms.begin(), ms.end());
    const double sizeMb = static_cast<double>(std::filesystem::file_size(path)) / (1024.0 * 1024.0);
    std::printf("Store benchmark: %d motors x %d rounds, %zu indicator rows; built in %.1f s; database %.1f MiB\n", motors, rounds, rows, buildS, sizeMb);
    std::printf("trend query (one indicator, one point, %d rounds): median %.3f ms, 95th percentile %.3f ms, max %.3f ms (target < 20 ms)\n",
                rounds, ms[ms.size() / 2], ms[ms.size() * 95 / 100], ms.back());
    std::printf("rows per query: %.1f\n", static_cast<double>(returned) / 300.0);
    std::printf("fleet file of %d motors (%.0f KiB): written and read back in %.1f ms\n", motors,
                static_cast<double>(fleetText.size()) / 1024.0, fleetFileMs);
    return returned == static_cast<std::size_t>(300 * rounds) ? 0 : 1;
}
