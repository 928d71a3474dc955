#include "app/cli/StoreCommands.h"

#include "app/cli/ArgParser.h"
#include "app/cli/BackupCommand.h"
#include "app/cli/CliError.h"
#include "app/cli/StoreAccess.h"
#include "app/common/Walkdown.h"
#include "core/diagnosis/Finding.h"
#include "core/dsp/SpectrumCompare.h"
#include "core/io/FleetFile.h"
#include "core/util/JsonWriter.h"
#include "storage/FleetStore.h"

#include <unistd.h>

#include <cstdio>
#include <cstdlib>
#include <filesystem>
#include <fstream>
#include <iostream>

namespace humwise::cli {
namespace {

namespace fs = std::filesystem;

std::vector<OptionSpec> withDb(std::vector<OptionSpec> specs) {
    specs.push_back({"db"});
    return specs;
}

void noPositional(const ParsedArgs& a, const char* command) {
    if (!a.positional().empty()) throw UsageError(std::string(command) + " takes no argument '" + a.positional().front() + "'");
}

class ProgressLine {
public:
    ProgressLine() : m_tty(isatty(STDERR_FILENO) != 0) {}
    ~ProgressLine() {
        if (m_tty && m_used) std::cerr << "\r" << std::string(78, ' ') << "\r";
    }
    bool operator()(const workflow::ImportProgress& p) {
        if (m_tty) {
            char buf[96];
            std::snprintf(buf, sizeof buf, "\r[%zu/%zu] %-60.60s", p.done, p.total, p.stage.c_str());
            std::cerr << buf << std::flush;
            m_used = true;
        }
        return true;
    }

private:
    bool m_tty;
    bool m_used = false;
};

void writeReport(std::ostream& out, const workflow::ImportReport& r, bool json) {
    if (json) {
        json::Writer w(out);
        w.beginObject();
        w.field("folder", r.folder);
        w.field("round_start", r.roundStart);
        w.key("round_id");
        if (r.roundId) w.value(static_cast<long long>(*r.roundId)); else w.null();
        w.field("replaced", r.replaced);
        w.field("motors_analysed", r.motorsAnalysed);
        w.field("findings", r.findings);
        w.key("matched").beginArray();
        for (const auto& m : r.matched) {
            w.beginObject().field("file", m.file).field("channel", m.channel).field("motor", m.motorTag).field("point", m.pointName).field("matched_by", m.how);
            w.endObject();
        }
        w.endArray();
        for (const auto& [key, list] : {std::pair{"bad", &r.bad}, std::pair{"flagged", &r.flagged}}) {
            w.key(key).beginArray();
            for (const auto& p : *list) w.beginObject().field("file", p.file).field("kind", p.kind).field("reason", p.reason).endObject();
            w.endArray();
        }
        w.key("unmatched").beginArray();
        for (const auto& u : r.unmatched) w.value(u);
        w.endArray();
        w.key("notes").beginArray();
        for (const auto& n : r.notes) w.value(n);
        w.endArray();
        w.endObject();
        return;
    }
    out << "walkdown " << r.folder << " (round of " << r.roundStart << ")\n";
    out << "  " << r.matched.size() << " recording(s) matched";
    std::size_t byName = 0;
    for (const auto& m : r.matched) byName += m.how == "file name";
    if (byName) out << " (" << byName << " by file name)";
    out << '\n';
    for (const auto& b : r.bad) out << "  skipped  " << b.file << ": " << b.kind << " - " << b.reason << '\n';
    for (const auto& f : r.flagged) out << "  flagged  " << f.file << ": " << f.reason << " (stored, left out of the diagnosis)\n";
    for (const auto& u : r.unmatched) out << "  unmatched " << u << ": not in the manifest and no motor/point of that name\n";
    for (const auto& n : r.notes) out << "  note: " << n << '\n';
    if (r.roundId)
        out << "  stored as round " << *r.roundId << (r.replaced ? " (replacing the earlier import)" : "") << ": " << r.motorsAnalysed
            << " motor(s) analysed, " << r.findings << " finding(s)\n";
    else
        out << "  dry run: nothing stored\n";
}

} // namespace

int runDb(const std::vector<std::string>& args, std::ostream& out) {
    // The sub-command is the first word that is neither an option nor --db's value.
    for (std::size_t i = 0; i < args.size(); ++i) {
        if (args[i] == "--db") { ++i; continue; }
        if (args[i] == "backup") return runDbBackup(args, out);
        if (args[i] == "restore") return runDbRestore(args, out);
        break;
    }
    const ParsedArgs a(args, withDb({}));
    if (a.positional().size() != 1 || a.positional().front() != "init")
        throw UsageError("db takes a sub-command: db init | db backup FILE | db restore FILE [--db PATH]");
    auto store = openStore(a, true);
    out << store->database().path().string() << ": fleet store ready (schema version " << store->schemaVersion() << ")\n";
    return 0;
}

int runFleet(const std::vector<std::string>& args, std::ostream& out) {
    const ParsedArgs a(args, withDb({}));
    if (a.positional().size() != 2 || (a.positional()[0] != "import" && a.positional()[0] != "export"))
        throw UsageError("fleet takes 'import FILE' or 'export FILE'");
    const std::string file = a.positional()[1];
    if (a.positional()[0] == "import") {
        auto fleet = io::readFleetFile(file);
        if (!fleet) throw ProcessingError(fleet.error().message());
        auto store = openStore(a, true);
        guarded([&] {
            storage::Transaction tx(store->database());
            store->saveFleet(fleet.value());
            tx.commit();
            return 0;
        });
        out << file << ": " << fleet.value().motors.size() << " motor(s), " << fleet.value().routes.size() << " route(s) stored in "
            << store->database().path().string() << '\n';
        return 0;
    }
    auto store = openStore(a, false);
    const auto fleet = guarded([&] { return store->loadFleet(); });
    const std::string text = io::writeFleet(fleet);
    writeFileWhole(file, text);
    out << file << ": " << fleet.motors.size() << " motor(s) written\n";
    return 0;
}

int runImport(const std::vector<std::string>& args, std::ostream& out) {
    const ParsedArgs a(args, withDb({{"skip-bad", false}, {"dry-run", false}, {"replace", false}, {"json", false}}));
    if (a.positional().size() != 1) throw UsageError("import takes one walkdown folder");
    auto store = openStore(a, false);
    workflow::ImportOptions o;
    o.skipBad = a.has("skip-bad");
    o.dryRun = a.has("dry-run");
    o.replace = a.has("replace");
    ProgressLine progress;
    o.progress = [&](const workflow::ImportProgress& p) { return progress(p); };
    auto r = workflow::importWalkdown(*store, a.positional().front(), o);
    if (!r) {
        if (a.has("json")) writeReport(out, r.error().report, true);
        throw ProcessingError(r.error().message);
    }
    writeReport(out, r.value(), a.has("json"));
    return 0;
}

int runReanalyse(const std::vector<std::string>& args, std::ostream& out) {
    const ParsedArgs a(args, withDb({}));
    noPositional(a, "reanalyse");
    auto store = openStore(a, false);
    ProgressLine progress;
    auto r = workflow::reanalyseAll(*store, [&](const workflow::ImportProgress& p) { return progress(p); });
    if (!r) throw ProcessingError(r.error().message);
    out << "re-analysed " << r.value().rounds << " round(s), " << r.value().motors << " motor analyses, " << r.value().findings << " finding(s)\n";
    return 0;
}

int runMotors(const std::vector<std::string>& args, std::ostream& out) {
    const ParsedArgs a(args, withDb({{"json", false}}));
    noPositional(a, "motors");
    auto store = openStore(a, false);
    const auto fleet = guarded([&] { return store->loadFleet(); });
    if (a.has("json")) {
        json::Writer w(out);
        w.beginObject().field("site", fleet.site).key("motors").beginArray();
        for (const auto& m : fleet.motors) {
            w.beginObject().field("tag", m.motor.tag).field("area", m.area).field("description", m.description);
            w.field("rated_power_kw", m.motor.nameplate.ratedPowerKw).field("rated_speed_rpm", m.motor.nameplate.ratedSpeedRpm);
            w.key("points").beginArray();
            for (const auto& p : m.points) w.value(p.name);
            w.endArray().endObject();
        }
        w.endArray().endObject();
        return 0;
    }
    out << fleet.site << '\n';
    for (const auto& m : fleet.motors) {
        char buf[256];
        std::snprintf(buf, sizeof buf, "  %-12s %-18s %7.1f kW %6.0f r/min  %zu point(s)  %s\n", m.motor.tag.c_str(), m.area.c_str(),
                      m.motor.nameplate.ratedPowerKw, m.motor.nameplate.ratedSpeedRpm, m.points.size(), m.description.c_str());
        out << buf;
    }
    return 0;
}

int runRounds(const std::vector<std::string>& args, std::ostream& out) {
    const ParsedArgs a(args, withDb({{"json", false}}));
    noPositional(a, "rounds");
    auto store = openStore(a, false);
    const auto rounds = guarded([&] { return store->rounds(); });
    if (a.has("json")) {
        json::Writer w(out);
        w.beginObject().key("rounds").beginArray();
        for (const auto& r : rounds) {
            w.beginObject().field("id", static_cast<long long>(r.id)).field("started_at", r.startedAt).field("technician", r.technician);
            w.key("route");
            if (r.route) w.value(*r.route); else w.null();
            w.field("recordings", guarded([&] { return store->recordings(r.id).size(); }));
            w.field("imported_at", r.importedAt).endObject();
        }
        w.endArray().endObject();
        return 0;
    }
    for (const auto& r : rounds)
        out << "  " << r.id << "  " << r.startedAt << "  " << r.route.value_or("(no route)") << "  " << store->recordings(r.id).size() << " recording(s)\n";
    return 0;
}

int runFindings(const std::vector<std::string>& args, std::ostream& out) {
    const ParsedArgs a(args, withDb({{"round"}, {"motor"}, {"json", false}}));
    noPositional(a, "findings");
    auto store = openStore(a, false);
    const auto round = pickRound(*store, a.value("round").value_or("latest"));
    const auto rows = guarded([&] { return store->findings(round.id, a.value("motor").value_or("")); });
    if (a.has("motor") && guarded([&] { return store->loadFleet(); }).motor(*a.value("motor")) == nullptr)
        throw UsageError("no motor '" + *a.value("motor") + "' in the store");
    if (a.has("json")) {
        json::Writer w(out);
        w.beginObject().field("round_id", static_cast<long long>(round.id)).field("round_start", round.startedAt).key("findings").beginArray();
        for (const auto& r : rows) {
            const auto& f = r.finding;
            w.beginObject().field("motor", r.motorTag).field("fault", f.fault).field("severity", f.severity).field("severity_name", diagnosis::severityName(f.severity));
            w.field("withheld", f.withheld).field("origin", diagnosis::originName(f.origin)).field("confidence", f.confidence);
            w.field("explanation", f.explanation).field("action", f.action).field("rule", f.rule);
            w.key("evidence").beginArray();
            for (const auto& e : f.evidence) {
                w.beginObject().field("label", e.label);
                w.key("expected_hz");
                if (e.expectedHz) w.value(*e.expectedHz); else w.null();
                w.key("measured_hz");
                if (e.measuredHz) w.value(*e.measuredHz); else w.null();
                w.field("amplitude", e.amplitude).field("unit", e.unit).endObject();
            }
            w.endArray().endObject();
        }
        w.endArray().endObject();
        return 0;
    }
    out << "round " << round.id << " of " << round.startedAt << '\n';
    for (const auto& r : rows) {
        if (r.finding.severity == 0 && !r.finding.withheld && r.finding.fault == "iso_zone") continue;
        char buf[256];
        std::snprintf(buf, sizeof buf, "  %-4s %-10s %-24s %-12s %s%s\n", std::string(diagnosis::severityMark(r.finding.severity)).c_str(), r.motorTag.c_str(),
                      r.finding.fault.c_str(), std::string(diagnosis::severityName(r.finding.severity)).c_str(),
                      std::string(diagnosis::originName(r.finding.origin)).c_str(), r.finding.withheld ? ", withheld" : "");
        out << buf;
    }
    return 0;
}

int runTrend(const std::vector<std::string>& args, std::ostream& out) {
    const ParsedArgs a(args, withDb({{"motor"}, {"point"}, {"indicator"}, {"json", false}}));
    noPositional(a, "trend");
    for (const char* required : {"motor", "indicator"})
        if (!a.has(required)) throw UsageError(std::string("trend needs --") + required);
    auto store = openStore(a, false);
    const auto pts = guarded([&] { return store->trend(*a.value("motor"), a.value("point").value_or(""), *a.value("indicator")); });
    if (a.has("json")) {
        json::Writer w(out);
        w.beginObject().field("motor", *a.value("motor")).field("point", a.value("point").value_or("")).field("indicator", *a.value("indicator"));
        w.key("points").beginArray();
        for (const auto& p : pts) w.beginObject().field("round_id", static_cast<long long>(p.roundId)).field("started_at", p.startedAt).field("value", p.value).field("unit", p.unit).endObject();
        w.endArray().endObject();
        return 0;
    }
    for (const auto& p : pts) {
        char buf[128];
        std::snprintf(buf, sizeof buf, "  %s  %12.5g %s\n", p.startedAt.c_str(), p.value, p.unit.c_str());
        out << buf;
    }
    return 0;
}

int runCompare(const std::vector<std::string>& args, std::ostream& out) {
    const ParsedArgs a(args, withDb({{"motor"}, {"point"}, {"round", true, true}, {"kind"}, {"grow-db"}, {"json", false}}));
    noPositional(a, "compare");
    if (!a.has("motor") || !a.has("point")) throw UsageError("compare needs --motor and --point");
    const auto which = a.values("round");
    if (which.size() != 2) throw UsageError("compare needs --round A --round B (two rounds)");
    auto store = openStore(a, false);
    const std::string motor = *a.value("motor"), point = *a.value("point");
    const auto fleet = guarded([&] { return store->loadFleet(); });
    const auto* def = fleet.motor(motor);
    if (!def || !def->point(point)) throw UsageError("no point '" + point + "' on motor '" + motor + "'");
    const auto* pdef = def->point(point);
    const std::string kind = a.value("kind").value_or(pdef->quantity == Quantity::Current ? "current" : pdef->quantity == Quantity::Voltage ? "voltage" : "velocity");
    struct Side {
        storage::RoundRow round;
        dsp::Spectrum spectrum;
        double shaftHz = 0;
    };
    const auto load = [&](const std::string& w) {
        Side s;
        s.round = pickRound(*store, w);
        const auto recs = guarded([&] { return store->recordings(s.round.id); });
        std::optional<std::int64_t> recId;
        for (const auto& r : recs)
            if (r.motorTag == motor && r.pointName == point) recId = r.id;
        if (!recId) throw ProcessingError("round " + s.round.startedAt + " has no recording of " + motor + "/" + point);
        const auto row = guarded([&] { return store->spectrum(*recId, kind); });
        if (!row) throw ProcessingError("round " + s.round.startedAt + " has no '" + kind + "' spectrum of " + motor + "/" + point);
        s.spectrum.startHz = row->startHz;
        s.spectrum.resolutionHz = row->resolutionHz;
        s.spectrum.enbwHz = row->enbwHz;
        s.spectrum.scale = dsp::parseSpectrumScale(row->scale).value_or(dsp::SpectrumScale::Rms);
        s.spectrum.quantity = parseQuantity(row->quantity).value_or(Quantity::Velocity);
        s.spectrum.values.assign(row->values.begin(), row->values.end());
        for (const auto& rm : guarded([&] { return store->roundMotors(s.round.id); }))
            if (rm.motorTag == motor) s.shaftHz = rm.speedRpm / 60.0;
        if (!(s.shaftHz > 0)) throw ProcessingError("round " + s.round.startedAt + ": no running speed stored for " + motor);
        return s;
    };
    const Side A = load(which[0]), B = load(which[1]);
    dsp::CompareOptions o;
    o.growDb = a.number("grow-db", 6.0);
    const auto cmp = dsp::compareSpectra(A.spectrum, A.shaftHz, B.spectrum, B.shaftHz, o);
    if (a.has("json")) {
        json::Writer w(out);
        w.beginObject().field("motor", motor).field("point", point).field("kind", kind);
        w.key("rounds").beginArray();
        for (const auto* s : {&A, &B}) w.beginObject().field("started_at", s->round.startedAt).field("speed_rpm", s->shaftHz * 60).endObject();
        w.endArray();
        w.key("changes").beginArray();
        for (const auto& c : cmp.changes)
            w.beginObject().field("order", c.order).field("frequency_hz_a", c.frequencyHzA).field("frequency_hz_b", c.frequencyHzB)
                .field("amplitude_a", c.amplitudeA).field("amplitude_b", c.amplitudeB).field("change_db", c.changeDb).field("appeared", c.appeared).endObject();
        w.endArray();
        w.key("orders").numbers(cmp.orders);
        w.key("a").numbers(cmp.a);
        w.key("b").numbers(cmp.b);
        w.endObject();
        return 0;
    }
    char buf[200];
    std::snprintf(buf, sizeof buf, "%s/%s %s: %s (%.1f r/min) -> %s (%.1f r/min), lines that appeared or grew by %.0f dB or more:\n", motor.c_str(),
                  point.c_str(), kind.c_str(), A.round.startedAt.c_str(), A.shaftHz * 60, B.round.startedAt.c_str(), B.shaftHz * 60, o.growDb);
    out << buf;
    if (cmp.changes.empty()) out << "  none\n";
    for (const auto& c : cmp.changes) {
        std::snprintf(buf, sizeof buf, "  order %7.3f  %9.3f Hz  %+6.1f dB%s\n", c.order, c.frequencyHzB, c.changeDb, c.appeared ? "  (new)" : "");
        out << buf;
    }
    return 0;
}

} // namespace humwise::cli
