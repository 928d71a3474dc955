#include "app/cli/StoreAccess.h"

#include <cstdlib>
#include <filesystem>
#include <fstream>
#include <vector>

namespace humwise::cli {

namespace fs = std::filesystem;

std::string defaultDatabasePath() {
    if (const char* xdg = std::getenv("XDG_DATA_HOME"); xdg && *xdg) return (fs::path(xdg) / "humwise" / "fleet.db").string();
    if (const char* home = std::getenv("HOME"); home && *home) return (fs::path(home) / ".local" / "share" / "humwise" / "fleet.db").string();
    return "humwise-fleet.db";
}

std::unique_ptr<storage::FleetStore> openStore(const ParsedArgs& a, bool create) {
    const std::string path = a.value("db").value_or(defaultDatabasePath());
    if (!a.has("db")) {
        std::error_code ec;
        fs::create_directories(fs::path(path).parent_path(), ec);
    }
    if (!create && !fs::exists(path)) throw ProcessingError(path + ": no such database (create it with 'humwise-cli db init --db " + path + "')");
    return guarded([&] { return storage::FleetStore::open(path, create); });
}

storage::RoundRow pickRound(storage::FleetStore& store, const std::string& which) {
    const auto rounds = guarded([&] { return store.rounds(); });
    if (rounds.empty()) throw ProcessingError("the store holds no round yet");
    if (which == "latest") return rounds.back();
    std::vector<storage::RoundRow> hits;
    for (const auto& r : rounds)
        if (r.startedAt.rfind(which, 0) == 0 || std::to_string(r.id) == which) hits.push_back(r);
    if (hits.empty()) throw UsageError("no round matches '" + which + "' (give latest, a round id or a date such as 2026-03-04)");
    if (hits.size() > 1) throw UsageError("'" + which + "' matches " + std::to_string(hits.size()) + " rounds; give the full date or the round id");
    return hits.front();
}

void writeFileWhole(const std::string& path, const std::string& content) {
    const std::string partial = path + ".part";
    {
        std::ofstream f(partial, std::ios::binary | std::ios::trunc);
        if (!f) throw ProcessingError(path + ": cannot write the file");
        f << content;
        if (!f.flush()) {
            f.close();
            std::error_code ec;
            fs::remove(partial, ec);
            throw ProcessingError(path + ": writing failed (disk full?)");
        }
    }
    std::error_code ec;
    fs::rename(partial, path, ec);
    if (ec) throw ProcessingError(path + ": " + ec.message());
}

} // namespace humwise::cli
