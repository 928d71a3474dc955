#include "app/common/FleetStatus.h"

#include <algorithm>
#include <map>
#include <set>

namespace humwise::workflow {

std::string MotorStatus::changeSummary() const {
    std::string s;
    if (!newFaults.empty()) {
        s += "new: ";
        for (std::size_t i = 0; i < newFaults.size(); ++i) s += (i ? ", " : "") + newFaults[i];
    }
    if (!worsenedFaults.empty()) {
        s += (s.empty() ? "" : "; ") + std::string("worse: ");
        for (std::size_t i = 0; i < worsenedFaults.size(); ++i) s += (i ? ", " : "") + worsenedFaults[i];
    }
    if (s.empty()) s = previousWorstSeverity ? "no change" : (roundId ? "first round" : "not measured");
    return s;
}

std::vector<MotorStatus> fleetStatus(storage::FleetStore& store, std::optional<std::int64_t> roundId) {
    const auto fleet = store.loadFleet();
    const auto rounds = store.rounds();
    std::vector<MotorStatus> out;
    // Rounds up to the asked one, newest first.
    std::vector<storage::RoundRow> upTo;
    for (const auto& r : rounds) {
        upTo.push_back(r);
        if (roundId && r.id == *roundId) break;
    }
    std::reverse(upTo.begin(), upTo.end());
    // Looked up per motor below: sets of tags per round and each round's flagged recordings by
    // motor, each read from the store once (per motor, a round of 1000 motors read its 7000
    // recordings 1000 times).
    std::map<std::int64_t, std::set<std::string>> analysed;
    for (const auto& r : upTo)
        for (const auto& row : store.roundMotors(r.id)) analysed[r.id].insert(row.motorTag);
    const auto hasMotor = [&](std::int64_t id, const std::string& tag) { return analysed[id].count(tag) > 0; };
    std::map<std::int64_t, std::map<std::string, std::vector<std::string>>> flagged; // round -> motor -> "point (flags)"
    const auto flaggedIn = [&](std::int64_t id) -> const std::map<std::string, std::vector<std::string>>& {
        auto [it, fresh] = flagged.try_emplace(id);
        if (fresh)
            for (const auto& rec : store.recordings(id))
                if (!rec.quality.empty()) it->second[rec.motorTag].push_back(rec.pointName + " (" + rec.quality + ")");
        return it->second;
    };
    const auto worstOf = [](const std::vector<storage::FindingRow>& f) {
        int w = 0;
        for (const auto& x : f) w = std::max(w, x.finding.severity);
        return w;
    };
    for (const auto& m : fleet.motors) {
        MotorStatus s;
        s.tag = m.motor.tag;
        s.area = m.area;
        s.description = m.description;
        std::optional<std::int64_t> latest, previous;
        for (const auto& r : upTo) {
            if (!hasMotor(r.id, m.motor.tag)) continue;
            if (!latest) {
                latest = r.id;
                s.roundStart = r.startedAt;
            } else {
                previous = r.id;
                break;
            }
        }
        s.measuredInLatestRound = latest && !upTo.empty() && *latest == upTo.front().id;
        if (latest) {
            s.roundId = latest;
            s.findings = store.findings(*latest, m.motor.tag);
            std::stable_sort(s.findings.begin(), s.findings.end(), [](const auto& a, const auto& b) { return a.finding.severity > b.finding.severity; });
            s.worstSeverity = worstOf(s.findings);
            const auto& byMotor = flaggedIn(*latest);
            if (const auto it = byMotor.find(m.motor.tag); it != byMotor.end()) s.flaggedPoints = it->second;
        }
        if (previous) {
            const auto before = store.findings(*previous, m.motor.tag);
            s.previousWorstSeverity = worstOf(before);
            for (const auto& f : s.findings) {
                if (f.finding.severity < 1) continue;
                const auto it = std::find_if(before.begin(), before.end(), [&](const auto& b) { return b.finding.fault == f.finding.fault; });
                if (it == before.end() || it->finding.severity < 1) s.newFaults.push_back(f.finding.fault);
                else if (it->finding.severity < f.finding.severity) s.worsenedFaults.push_back(f.finding.fault);
            }
        }
        out.push_back(std::move(s));
    }
    return out;
}

} // namespace humwise::workflow
