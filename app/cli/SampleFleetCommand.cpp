#include "app/cli/SampleFleetCommand.h"

#include "app/cli/ArgParser.h"
#include "app/cli/CliError.h"
#include "app/common/Walkdown.h"
#include "core/io/FleetFile.h"
#include "sample_fleet/SampleFleet.h"
#include "storage/FleetStore.h"

#include <chrono>
#include <cstdio>
#include <filesystem>

namespace humwise::cli {
namespace {

namespace fs = std::filesystem;

constexpr std::size_t kImportedWalkdowns = 12; // the thirteenth is left for the user

std::unique_ptr<storage::FleetStore> createStore(const std::string& path) {
    std::error_code ec;
    if (const auto parent = fs::path(path).parent_path(); !parent.empty()) fs::create_directories(parent, ec);
    try {
        auto store = storage::FleetStore::open(path, true);
        if (!store->rounds().empty())
            throw ProcessingError(path + ": the store already holds rounds; give a new database for the sample fleet");
        return store;
    } catch (const storage::StorageException& e) {
        throw ProcessingError(e.error.message);
    }
}

void importSample(storage::FleetStore& store, const std::string& dbPath, const sample::SampleFleetSummary& summary, std::ostream& out) {
    auto fleet = io::readFleetFile(summary.fleetFile);
    if (!fleet) throw ProcessingError(fleet.error().message());
    try {
        storage::Transaction tx(store.database());
        store.saveFleet(fleet.value());
        tx.commit();
    } catch (const storage::StorageException& e) {
        throw ProcessingError(e.error.message);
    }
    out << dbPath << ": fleet of " << fleet.value().motors.size() << " motor(s) stored\n";
    for (std::size_t i = 0; i < kImportedWalkdowns && i < summary.walkdowns.size(); ++i) {
        const auto r = workflow::importWalkdown(store, summary.walkdowns[i]);
        if (!r) throw ProcessingError(r.error().message);
        const auto& rep = r.value();
        out << "  " << summary.walkdowns[i].filename().string() << " (round of " << rep.roundStart << "): " << rep.matched.size()
            << " recording(s), " << rep.motorsAnalysed << " motor(s) analysed, " << rep.findings << " finding(s)\n";
        for (const auto& f : rep.flagged) out << "    flagged  " << f.file << ": " << f.reason << " (stored, left out of the diagnosis)\n";
        for (const auto& u : rep.unmatched) out << "    unmatched " << u << ": not in the manifest (kept for the power-off comparison)\n";
    }
}

} // namespace

int runSampleFleet(const std::vector<std::string>& args, std::ostream& out) {
    const ParsedArgs a(args, {{"out"}, {"db"}});
    if (!a.positional().empty()) throw UsageError("sample-fleet takes no argument '" + a.positional().front() + "'");
    const auto outDir = a.value("out");
    if (!outDir || outDir->empty()) throw UsageError("sample-fleet needs --out DIR, the folder to write the sample fleet into");
    if (a.has("db") && a.value("db")->empty()) throw UsageError("option '--db' needs a database path");
    // The store is checked first, so a wrong --db fails before anything is generated.
    std::unique_ptr<storage::FleetStore> store;
    if (a.has("db")) store = createStore(*a.value("db"));
    const auto t0 = std::chrono::steady_clock::now();
    sample::SampleFleetSummary summary;
    try {
        summary = sample::generateSampleFleet({*outDir, 0});
    } catch (const std::runtime_error& e) {
        throw ProcessingError(e.what());
    }
    char seconds[32];
    std::snprintf(seconds, sizeof seconds, "%.1f", std::chrono::duration<double>(std::chrono::steady_clock::now() - t0).count());
    out << *outDir << ": sample fleet written in " << seconds << " s\n";
    out << "  fleet file  " << summary.fleetFile.string() << "\n  truth file  " << summary.truthFile.string() << " (what was seeded; for tests)\n";
    out << "  walkdowns   " << summary.walkdowns.front().filename().string() << " ... " << summary.walkdowns.back().filename().string() << "\n";
    if (!store) {
        out << "next: humwise-cli fleet import " << summary.fleetFile.string() << " --db DB, then humwise-cli import FOLDER --db DB per walkdown\n";
        return 0;
    }
    importSample(*store, *a.value("db"), summary, out);
    out << "left for you: humwise-cli import " << summary.walkdowns.back().string() << " --db " << *a.value("db") << "\n";
    return 0;
}

} // namespace humwise::cli
