#include "app/cli/LimitsCommand.h"

#include "app/cli/StoreAccess.h"
#include "app/common/LimitRules.h"
#include "core/util/JsonWriter.h"
#include "core/util/Text.h"

#include <algorithm>
#include <chrono>
#include <cstdio>
#include <set>

namespace humwise::cli {
namespace {

// The motors the command works on: one (--motor) or the whole fleet.
std::vector<const fleet::MotorDefinition*> motorsOf(const fleet::Fleet& fleet, const ParsedArgs& a) {
    std::vector<const fleet::MotorDefinition*> out;
    if (const auto tag = a.value("motor")) {
        const auto* m = fleet.motor(*tag);
        if (!m) throw UsageError("no motor '" + *tag + "' in the store");
        out.push_back(m);
        return out;
    }
    for (const auto& m : fleet.motors) out.push_back(&m);
    return out;
}

// (point, indicator) pairs worth a limit among the motor's indicators of a round.
std::set<std::pair<std::string, std::string>> limitKeys(storage::FleetStore& store, std::int64_t roundId, const std::string& tag) {
    std::set<std::pair<std::string, std::string>> keys;
    for (const auto& i : store.indicators(roundId, tag))
        if (workflow::deservesLimit(i.name)) keys.insert({i.pointName, i.name});
    return keys;
}

std::string formatLevel(const std::optional<double>& v) {
    if (!v) return "-";
    char buf[32];
    std::snprintf(buf, sizeof buf, "%.4g", *v);
    return buf;
}

const char* stateOf(double value, const trend::Limits& l) {
    if (l.alarm && value >= *l.alarm) return "over alarm";
    if (l.alert && value >= *l.alert) return "over alert";
    return l.alarm || l.alert ? "within" : "no limit";
}

int listLimits(const ParsedArgs& a, std::ostream& out) {
    auto store = openStore(a, false);
    const auto fleet = guarded([&] { return store->loadFleet(); });
    const auto motors = motorsOf(fleet, a);
    const auto round = pickRound(*store, "latest");
    json::Writer w(out);
    const bool json = a.has("json");
    if (json) w.beginObject().field("round_id", static_cast<long long>(round.id)).field("round_start", round.startedAt).key("limits").beginArray();
    else out << "limits in force at round " << round.id << " of " << round.startedAt << '\n';
    for (const auto* m : motors) {
        const auto stored = guarded([&] { return store->alarmLimits(m->motor.tag); });
        for (const auto& [point, indicator] : guarded([&] { return limitKeys(*store, round.id, m->motor.tag); })) {
            const auto history = guarded([&] { return store->trend(m->motor.tag, point, indicator); });
            if (history.empty()) continue;
            const auto values = workflow::valuesOf(history);
            const auto l = workflow::effectiveLimits(stored, *m, point, indicator, values);
            const bool isStored = std::any_of(stored.begin(), stored.end(), [&](const auto& s) { return s.pointName == point && s.indicator == indicator; });
            const double latest = history.back().value;
            if (json) {
                w.beginObject().field("motor", m->motor.tag).field("point", point).field("indicator", indicator).field("value", latest).field("unit", history.back().unit);
                w.key("alert");
                if (l.alert) w.value(*l.alert); else w.null();
                w.key("alarm");
                if (l.alarm) w.value(*l.alarm); else w.null();
                w.field("method", l.method).field("source", l.source).field("stored", isStored).field("state", stateOf(latest, l)).endObject();
                continue;
            }
            char buf[256];
            std::snprintf(buf, sizeof buf, "  %-10s %-8s %-24s %10.4g %-6s alert %-9s alarm %-9s %-11s %-8s %s\n", m->motor.tag.c_str(),
                          point.empty() ? "(motor)" : point.c_str(), indicator.c_str(), latest, history.back().unit.c_str(), formatLevel(l.alert).c_str(),
                          formatLevel(l.alarm).c_str(), l.method.empty() ? "-" : l.method.c_str(), isStored ? "stored" : "default", stateOf(latest, l));
            out << buf;
        }
    }
    if (json) w.endArray().endObject();
    return 0;
}

void requireKey(const ParsedArgs& a, const char* command) {
    for (const char* o : {"motor", "indicator"})
        if (!a.has(o)) throw UsageError(std::string("limits ") + command + " needs --" + o);
}

int setLimit(const ParsedArgs& a, std::ostream& out) {
    requireKey(a, "set");
    const auto alarm = a.number("alarm");
    if (!alarm) throw UsageError("limits set needs --alarm LEVEL");
    const auto alert = a.number("alert");
    if (alert && *alert > *alarm) throw UsageError("--alert must not exceed --alarm");
    if (!workflow::deservesLimit(*a.value("indicator"))) throw UsageError("indicator '" + *a.value("indicator") + "' takes no alarm limit");
    auto store = openStore(a, false);
    storage::AlarmLimitRow row;
    row.motorTag = *a.value("motor");
    row.pointName = a.value("point").value_or("");
    row.indicator = *a.value("indicator");
    row.method = "absolute";
    row.alert = alert;
    row.alarm = alarm;
    row.source = "set by the analyst";
    row.updatedAt = text::isoNow();
    guarded([&] {
        storage::Transaction tx(store->database());
        store->setAlarmLimit(row);
        tx.commit();
        return 0;
    });
    out << row.motorTag << ' ' << (row.pointName.empty() ? "(motor)" : row.pointName) << ' ' << row.indicator << ": alert " << formatLevel(alert)
        << ", alarm " << formatLevel(alarm) << " stored\n";
    return 0;
}

int clearLimit(const ParsedArgs& a, std::ostream& out) {
    requireKey(a, "clear");
    auto store = openStore(a, false);
    const bool had = guarded([&] {
        storage::Transaction tx(store->database());
        const bool r = store->clearAlarmLimit(*a.value("motor"), a.value("point").value_or(""), *a.value("indicator"));
        tx.commit();
        return r;
    });
    out << *a.value("motor") << ' ' << a.value("point").value_or("(motor)") << ' ' << *a.value("indicator")
        << (had ? ": stored limits removed; the defaults apply\n" : ": no stored limits; the defaults apply\n");
    return 0;
}

int suggestLimits(const ParsedArgs& a, std::ostream& out) {
    const std::string method = a.value("method").value_or("");
    if (!workflow::isSuggestionMethod(method)) throw UsageError("limits suggest needs --method iso-zone, statistical or percent");
    const long long baseline = a.integer("baseline").value_or(static_cast<long long>(workflow::kBaselineRounds));
    if (baseline < 1 || baseline > 1000) throw UsageError("--baseline is a number of rounds from 1 to 1000");
    auto store = openStore(a, false);
    const auto fleet = guarded([&] { return store->loadFleet(); });
    const auto motors = motorsOf(fleet, a);
    const auto round = pickRound(*store, "latest");
    std::vector<storage::AlarmLimitRow> rows;
    for (const auto* m : motors)
        for (const auto& [point, indicator] : guarded([&] { return limitKeys(*store, round.id, m->motor.tag); })) {
            if (a.has("indicator") && indicator != *a.value("indicator")) continue;
            if (method == "iso-zone" && indicator != "velocity_rms") continue;
            const auto values = workflow::valuesOf(guarded([&] { return store->trend(m->motor.tag, point, indicator); }));
            const auto l = workflow::suggestLimits(*m, indicator, method, values, static_cast<std::size_t>(baseline));
            const std::string where = m->motor.tag + ' ' + (point.empty() ? "(motor)" : point) + ' ' + indicator;
            if (!l) {
                out << "  " << where << ": " << l.error() << '\n';
                continue;
            }
            storage::AlarmLimitRow row{m->motor.tag, point, indicator, l.value().method, l.value().alert, l.value().alarm,
                                       static_cast<int>(std::min<long long>(baseline, static_cast<long long>(values.size()))), l.value().source, text::isoNow()};
            out << "  " << where << ": alert " << formatLevel(row.alert) << ", alarm " << formatLevel(row.alarm) << " (" << row.method << ")\n";
            rows.push_back(std::move(row));
        }
    if (!a.has("store")) {
        out << rows.size() << " limit(s) suggested; add --store to keep them\n";
        return 0;
    }
    guarded([&] {
        storage::Transaction tx(store->database()); // all or none
        for (const auto& r : rows) store->setAlarmLimit(r);
        tx.commit();
        return 0;
    });
    out << rows.size() << " limit(s) stored\n";
    return 0;
}

} // namespace

int runLimits(const std::vector<std::string>& args, std::ostream& out) {
    const ParsedArgs a(args, {{"db"}, {"motor"}, {"point"}, {"indicator"}, {"alarm"}, {"alert"}, {"method"}, {"baseline"}, {"store", false}, {"json", false}});
    const auto& words = a.positional();
    if (words.size() > 1) throw UsageError("limits takes one sub-command: set, clear or suggest (none lists the limits)");
    const std::string sub = words.empty() ? "" : words.front();
    if (sub.empty()) return listLimits(a, out);
    if (sub == "set") return setLimit(a, out);
    if (sub == "clear") return clearLimit(a, out);
    if (sub == "suggest") return suggestLimits(a, out);
    throw UsageError("unknown limits sub-command '" + sub + "' (set, clear or suggest)");
}

} // namespace humwise::cli
