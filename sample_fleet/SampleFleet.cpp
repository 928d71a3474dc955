#include "sample_fleet/SampleFleet.h"

#include "core/io/FleetFile.h"
#include "sample_fleet/Plant.h"
#include "sample_fleet/Scenario.h"
#include "sample_fleet/Truth.h"
#include "sample_fleet/WalkdownWriter.h"

#include <algorithm>
#include <atomic>
#include <exception>
#include <fstream>
#include <mutex>
#include <stdexcept>
#include <thread>

namespace humwise::sample {
namespace {

namespace fs = std::filesystem;

void writeText(const fs::path& path, const std::string& text) {
    std::ofstream f(path, std::ios::binary | std::ios::trunc);
    if (!f) throw std::runtime_error(path.string() + ": cannot create the file");
    f << text;
    if (!f.flush()) throw std::runtime_error(path.string() + ": writing failed (disk full?)");
}

// Every (round, motor) pair is one job; jobs are independent (own seeds, own files), so the
// output does not depend on the number of threads or their order.
struct Job {
    std::size_t round = 0, motor = 0;
};

std::vector<std::vector<std::vector<ManifestRow>>> runJobs(const std::vector<fs::path>& folders, unsigned threads) {
    const std::size_t motors = plant().fleet.motors.size();
    std::vector<std::vector<std::vector<ManifestRow>>> rows(folders.size(), std::vector<std::vector<ManifestRow>>(motors));
    std::atomic<std::size_t> next{0};
    std::exception_ptr failure;
    std::mutex failureMutex;
    const auto worker = [&] {
        for (std::size_t j = next++; j < folders.size() * motors; j = next++) {
            const Job job{j / motors, j % motors};
            try {
                const Round& round = rounds().at(job.round);
                rows[job.round][job.motor] = writeMotorRound(folders[job.round], round, job.motor);
                writePowerOffPair(folders[job.round], round, job.motor);
            } catch (...) {
                const std::lock_guard lock(failureMutex);
                if (!failure) failure = std::current_exception();
                next = folders.size() * motors; // stop the others early
            }
        }
    };
    if (threads == 0) threads = std::max(1u, std::thread::hardware_concurrency());
    std::vector<std::thread> pool;
    for (unsigned t = 1; t < threads; ++t) pool.emplace_back(worker);
    worker();
    for (auto& t : pool) t.join();
    if (failure) std::rethrow_exception(failure);
    return rows;
}

} // namespace

SampleFleetSummary generateSampleFleet(const SampleFleetOptions& options) {
    if (options.outDir.empty()) throw std::runtime_error("sample fleet: no output folder given");
    SampleFleetSummary summary;
    try {
        fs::create_directories(options.outDir);
        for (const auto& r : rounds()) {
            summary.walkdowns.push_back(options.outDir / r.folder());
            fs::create_directories(summary.walkdowns.back());
        }
    } catch (const fs::filesystem_error& e) {
        throw std::runtime_error(options.outDir.string() + ": cannot create the output folders (" + e.code().message() + ")");
    }
    summary.fleetFile = options.outDir / "fleet.json";
    writeText(summary.fleetFile, io::writeFleet(plant().fleet));
    const auto rows = runJobs(summary.walkdowns, options.threads);
    for (std::size_t r = 0; r < rows.size(); ++r) {
        std::vector<ManifestRow> all;
        for (const auto& motorRows : rows[r]) all.insert(all.end(), motorRows.begin(), motorRows.end());
        writeManifest(summary.walkdowns[r], rounds()[r], all);
    }
    summary.truthFile = options.outDir / "truth.json";
    writeTruth(summary.truthFile);
    return summary;
}

} // namespace humwise::sample
