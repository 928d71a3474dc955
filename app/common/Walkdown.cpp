#include "app/common/Walkdown.h"

#include "app/common/InOrder.h"
#include "app/common/MemoryRelease.h"
#include "app/common/MotorAnalysis.h"
#include "core/dsp/Quality.h"
#include "core/io/FileBytes.h"
#include "core/io/Manifest.h"
#include "core/io/RecordingReader.h"
#include "core/util/Sha256.h"
#include "core/util/Text.h"

#include <algorithm>
#include <atomic>
#include <map>
#include <set>

namespace humwise::workflow {
namespace {

namespace fs = std::filesystem;
using Code = ImportError::Code;

struct Cancelled {};

// One recording the import will store: where it comes from and how to read it.
struct Planned {
    MatchedRecording match;
    fs::path path;
    const fleet::MotorDefinition* motor = nullptr;
    const fleet::PointDefinition* point = nullptr;
    Unit unit = Unit::G;
    double sensitivity = 1.0;
    std::string time;
    std::optional<double> speedRpm, loadPercent;
    // Filled by the check:
    std::string hash, format;
    double sampleRateHz = 0;
    std::size_t samples = 0;
    std::vector<std::string> quality;
};

bool inside(const fs::path& folder, const fs::path& candidate) {
    const auto rel = candidate.lexically_relative(folder);
    return !rel.empty() && *rel.begin() != ".." && !rel.is_absolute();
}

// How to read channel `channel` (1-based) of a file whose samples are `unit` x sensitivity.
io::RecordingReadOptions readOptionsFor(int channel, Unit unit, double sensitivity) {
    io::RecordingReadOptions o;
    o.channels.perChannel.resize(static_cast<std::size_t>(channel));
    for (auto& c : o.channels.perChannel) c.unit = unit;
    o.channels.perChannel.back().scale = 1.0 / sensitivity;
    o.channels.defaults.unit = unit;
    return o;
}

io::RecordingReadOptions readOptions(const Planned& p) { return readOptionsFor(p.match.channel, p.unit, p.sensitivity); }

double minimumRate(Quantity q) { return (q == Quantity::Current || q == Quantity::Voltage) ? 500.0 : 2560.0; }
double minimumSeconds(Quantity q) { return (q == Quantity::Current || q == Quantity::Voltage) ? 2.0 : 1.0; }

// Checks one planned recording in its file's bytes (whose SHA-256 is `hash`); returns the
// problem, or nothing when it is good - and then, when `keep` is given, the recording in it.
std::optional<ImportProblem> check(Planned& p, std::span<const std::byte> bytes, const std::string& hash, PointRecording* keep = nullptr) {
    const auto bad = [&](const char* kind, std::string reason) { return ImportProblem{p.match.file, kind, std::move(reason)}; };
    p.hash = hash;
    auto rec = io::parseRecordingBytes(bytes, p.path.string(), readOptions(p));
    if (!rec) return bad("unreadable", rec.error().message());
    const auto& r = rec.value().recording;
    p.format = rec.value().format;
    if (static_cast<std::size_t>(p.match.channel) > r.channels.size())
        return bad("no_channel", "channel " + std::to_string(p.match.channel) + " asked, the file has " + std::to_string(r.channels.size()));
    const auto& ch = r.channels[static_cast<std::size_t>(p.match.channel - 1)];
    if (ch.quantity != p.point->quantity)
        return bad("wrong_quantity", "the file holds " + std::string(quantityName(ch.quantity)) + ", point " + p.point->name + " measures " +
                                         std::string(quantityName(p.point->quantity)));
    p.sampleRateHz = r.sampleRateHz;
    p.samples = ch.samples.size();
    if (r.sampleRateHz < minimumRate(ch.quantity))
        return bad("wrong_rate", text::lower(std::string(quantityName(ch.quantity))) + " sampled at " + std::to_string(static_cast<long long>(r.sampleRateHz)) +
                                     " Hz; at least " + std::to_string(static_cast<long long>(minimumRate(ch.quantity))) + " Hz are needed");
    if (r.durationSeconds() < minimumSeconds(ch.quantity))
        return bad("too_short", "the recording lasts " + std::to_string(r.durationSeconds()) + " s; at least " +
                                    std::to_string(static_cast<int>(minimumSeconds(ch.quantity))) + " s are needed");
    dsp::QualityRequest q;
    q.quantity = ch.quantity;
    q.fullScale = ch.fullScale;
    q.sampleRateHz = r.sampleRateHz;
    for (const auto& issue : dsp::assessQuality(ch.samples, q)) p.quality.push_back(std::string(dsp::qualityFlagName(issue.flag)) + ": " + issue.detail);
    if (keep) {
        keep->pointName = p.point->name;
        keep->speedRpm = p.speedRpm;
        keep->usable = p.quality.empty();
        keep->sampleRateHz = r.sampleRateHz;
        keep->quantity = ch.quantity;
        keep->samples = std::move(rec.value().recording.channels[static_cast<std::size_t>(p.match.channel - 1)].samples);
    }
    return std::nullopt;
}

// Files the manifest does not list: "TAG/POINT.ext" or "TAG_POINT.ext" naming one motor point.
std::optional<std::pair<const fleet::MotorDefinition*, const fleet::PointDefinition*>> matchByName(const fleet::Fleet& f, const fs::path& rel) {
    std::vector<std::pair<const fleet::MotorDefinition*, const fleet::PointDefinition*>> hits;
    const std::string stem = rel.stem().string();
    const std::string parent = rel.parent_path().filename().string();
    for (const auto& m : f.motors)
        for (const auto& p : m.points) {
            const bool folderForm = parent == m.motor.tag && stem == p.name;
            const bool flatForm = stem == m.motor.tag + "_" + p.name;
            if (folderForm || flatForm) hits.push_back({&m, &p});
        }
    if (hits.size() != 1) return std::nullopt;
    return hits.front();
}

bool isRecordingFile(const fs::path& p) {
    const std::string ext = text::lower(p.extension().string());
    return ext == ".wav" || ext == ".csv" || ext == ".txt" || ext == ".uff" || ext == ".unv";
}

bool report(const ProgressCallback& cb, std::size_t done, std::size_t total, const std::string& stage) {
    return !cb || cb({done, total, stage});
}

// Re-analyses the motors of one round in parallel (loading their recordings in the workers) and
// stores the products from this thread, in fleet order.
template <class Loader>
std::size_t analyseMotors(storage::FleetStore& store, std::int64_t roundId, const fleet::Fleet& fleet, const std::vector<std::string>& motorTags,
                          Loader&& load, const ProgressCallback& progress, unsigned threads, std::size_t& findingsOut, std::vector<std::string>& notes) {
    struct Done {
        std::vector<PointRecording> recordings;
        std::optional<MotorAnalysis> analysis;
    };
    const auto work = [&](std::size_t i) {
        Done d;
        d.recordings = load(*fleet.motor(motorTags[i]));
        try {
            d.analysis = analyseMotor(*fleet.motor(motorTags[i]), d.recordings);
        } catch (const std::invalid_argument&) {
            // Nothing usable: reported below.
        }
        for (auto& r : d.recordings) r.samples = {}; // the products are all that is kept
        return d;
    };
    std::size_t analysed = 0;
    MemoryRelease memory;
    // One more motor in flight than workers: they keep analysing while this thread (SQLite's one
    // writer) stores.
    inOrder(motorTags.size(), workerThreads(threads), workerThreads(threads) + 1, work, [&](std::size_t i, Done d) {
        if (d.analysis) {
            storeAnalysis(store, roundId, *d.analysis, d.recordings);
            findingsOut += d.analysis->result.findings.size();
            ++analysed;
        } else {
            notes.push_back(motorTags[i] + ": no usable recording, not analysed");
        }
        if (!report(progress, i + 1, motorTags.size(), "analysing " + motorTags[i])) throw Cancelled{};
        d = {}; // this motor's buffers go before the release, not after it
        memory.afterMotor();
    });
    return analysed;
}

// What the import will read: the manifest's entries, then the files it does not list that name
// one motor point. Entries that cannot be planned (outside the folder, unknown point, duplicate,
// missing file, wrong quantity) go to rep.bad; unlisted files naming nothing to rep.unmatched.
std::vector<Planned> planRecordings(const fs::path& folder, const fs::path& manifestPath, const io::Manifest& man, const fleet::Fleet& fleet,
                                    ImportReport& rep) {
    std::error_code ec;
    std::vector<Planned> plan;
    std::set<fs::path> listed;
    std::set<std::pair<std::string, std::string>> points;
    std::set<std::pair<fs::path, int>> channels;
    for (const auto& e : man.entries) {
        Planned p;
        p.match = {e.file, e.channel, e.motorTag, e.pointName, "manifest"};
        const fs::path rel(e.file);
        if (rel.is_absolute() || !inside(folder, (folder / rel).lexically_normal())) {
            rep.bad.push_back({e.file, "outside_folder", "manifest line " + std::to_string(e.line) + ": the path leaves the walkdown folder"});
            continue;
        }
        p.path = (folder / rel).lexically_normal();
        listed.insert(p.path); // named by the manifest: never matched again by its file name
        if (fs::exists(p.path, ec) && !inside(folder, fs::canonical(p.path, ec))) {
            rep.bad.push_back({e.file, "outside_folder", "manifest line " + std::to_string(e.line) + ": the file is a link out of the walkdown folder"});
            continue;
        }
        p.motor = fleet.motor(e.motorTag);
        p.point = p.motor ? p.motor->point(e.pointName) : nullptr;
        if (!p.point) {
            rep.bad.push_back({e.file, "unknown_point", "manifest line " + std::to_string(e.line) + ": motor '" + e.motorTag + "' has no point '" + e.pointName + "' in the fleet"});
            continue;
        }
        if (!points.insert({e.motorTag, e.pointName}).second || !channels.insert({p.path, e.channel}).second) {
            rep.bad.push_back({e.file, "duplicate", "manifest line " + std::to_string(e.line) + ": " + e.motorTag + "/" + e.pointName + " or this file and channel is listed twice"});
            continue;
        }
        if (!fs::is_regular_file(p.path, ec)) {
            rep.bad.push_back({e.file, "missing", "manifest line " + std::to_string(e.line) + ": no such file in the walkdown folder"});
            continue;
        }
        p.unit = e.unit.value_or(p.point->unit);
        if (e.quantity && *e.quantity != p.point->quantity) {
            rep.bad.push_back({e.file, "wrong_quantity", "manifest line " + std::to_string(e.line) + ": point " + e.pointName + " measures " + std::string(quantityName(p.point->quantity))});
            continue;
        }
        p.sensitivity = e.sensitivity.value_or(p.point->sensitivity);
        p.time = text::formatIsoTime(e.time.value_or(man.roundStart));
        p.speedRpm = e.speedRpm;
        p.loadPercent = e.loadPercent;
        plan.push_back(std::move(p));
    }
    for (auto it = fs::recursive_directory_iterator(folder, ec); !ec && it != fs::recursive_directory_iterator(); it.increment(ec)) {
        if (!it->is_regular_file() || it->path() == manifestPath || !isRecordingFile(it->path()) || listed.count(it->path())) continue;
        const auto rel = it->path().lexically_relative(folder);
        std::error_code linkEc; // its own: the scan's ec must only end the scan on a scan error
        if (!inside(folder, fs::canonical(it->path(), linkEc))) {
            rep.bad.push_back({rel.string(), "outside_folder", "the file is a link out of the walkdown folder"});
            continue;
        }
        const auto hit = matchByName(fleet, rel);
        if (!hit || points.count({hit->first->motor.tag, hit->second->name})) {
            rep.unmatched.push_back(rel.string());
            continue;
        }
        points.insert({hit->first->motor.tag, hit->second->name});
        Planned p;
        p.match = {rel.string(), 1, hit->first->motor.tag, hit->second->name, "file name"};
        p.path = it->path();
        p.motor = hit->first;
        p.point = hit->second;
        p.unit = p.point->unit;
        p.sensitivity = p.point->sensitivity;
        p.time = rep.roundStart;
        plan.push_back(std::move(p));
    }
    std::sort(rep.unmatched.begin(), rep.unmatched.end());
    return plan;
}

// The work on one motor (its plan entries): read each of its files once, hash it, check every
// recording in it and, when `analyse` and nothing is lost yet, analyse the motor. Sets `lost`
// when a recording is bad and bad ones are not skipped. Runs on a worker thread and writes nothing
// shared: the entries it checked come back in `checked`, and the writer copies them into the plan.
// The copy is deliberate: a string made here (a file's 64-character hash) lives in this worker's
// malloc arena, and thousands of them kept for the whole import pinned pages all over the
// workers' arenas - the resident size crept up through a 1000-motor route.
struct MotorWork {
    std::vector<Planned> checked;                       // the motor's entries, hash, format, rate and quality filled in
    std::vector<std::optional<ImportProblem>> problems; // per entry of the motor
    std::vector<std::size_t> good;                      // the good entries' plan indices,
    std::vector<PointRecording> recordings;             // their recordings
    std::vector<std::shared_ptr<const std::vector<std::byte>>> files; // and their files' bytes (shared by a file's channels)
    std::optional<MotorAnalysis> analysis;
};

MotorWork checkAndAnalyse(const std::vector<Planned>& plan, const std::vector<std::size_t>& entries, const fleet::MotorDefinition& motor, bool analyse,
                          bool skipBad, std::atomic<bool>& lost) {
    MotorWork w;
    struct File {
        std::shared_ptr<const std::vector<std::byte>> bytes;
        std::string hash;
    };
    std::map<fs::path, File> files; // each file read and hashed once, whatever its channels
    for (std::size_t i : entries) {
        Planned p = plan[i];
        auto& file = files[p.path];
        std::optional<ImportProblem> problem;
        if (!file.bytes) {
            auto bytes = io::readFileBytes(p.path);
            if (bytes) {
                file.bytes = std::make_shared<const std::vector<std::byte>>(std::move(bytes).value());
                file.hash = util::sha256Hex(*file.bytes);
            } else {
                problem = ImportProblem{p.match.file, "unreadable", bytes.error().message()};
            }
        }
        PointRecording recording;
        if (!problem) problem = check(p, *file.bytes, file.hash, analyse ? &recording : nullptr);
        if (!problem) {
            w.good.push_back(i);
            w.recordings.push_back(std::move(recording));
            w.files.push_back(file.bytes);
        } else if (!skipBad) {
            lost = true;
        }
        w.problems.push_back(std::move(problem));
        w.checked.push_back(std::move(p));
    }
    if (analyse && !lost && !w.good.empty()) {
        try {
            w.analysis = analyseMotor(motor, w.recordings);
        } catch (const std::invalid_argument&) {
            // Nothing usable: reported when stored.
        }
    }
    for (auto& r : w.recordings) r.samples = {}; // the products are all that is kept
    if (!analyse) w.files.clear();
    return w;
}

// The round's row, its identity hash a placeholder until the import knows every file's
// (setRoundManifestHash at the end). A route the fleet does not know is noted and left out.
std::int64_t insertRoundRow(storage::FleetStore& store, const io::Manifest& man, const fleet::Fleet& fleet, const fs::path& folder,
                            ImportReport& rep) {
    storage::RoundRow round;
    round.route = man.route && !man.route->empty() ? man.route : std::nullopt;
    if (round.route) {
        bool known = false;
        for (const auto& r : fleet.routes) known |= r.name == *round.route;
        if (!known) {
            rep.notes.push_back("route '" + *round.route + "' is not in the fleet; the round is stored without a route");
            round.route.reset();
        }
    }
    round.startedAt = rep.roundStart;
    round.technician = man.technician;
    round.notes = man.notes;
    round.manifestHash = "importing " + rep.roundStart + " " + folder.string();
    round.sourceFolder = folder.string();
    round.importedAt = text::isoNow();
    return store.insertRound(round);
}

// Stores one motor's work in the round: each raw file once, a recording row per good entry (the
// ids go into the recordings for the products), then the analysis. The writer thread only.
void storeMotorWork(storage::FleetStore& store, std::int64_t roundId, const std::vector<Planned>& plan, MotorWork& w,
                    std::set<std::string>& storedHashes, ImportReport& rep) {
    for (std::size_t k = 0; k < w.good.size(); ++k) {
        const Planned& p = plan[w.good[k]];
        if (storedHashes.insert(p.hash).second) store.storeSourceFile(p.hash, *w.files[k]);
        storage::RecordingRow row;
        row.roundId = roundId;
        row.motorTag = p.motor->motor.tag;
        row.pointName = p.point->name;
        row.recordedAt = p.time;
        row.sampleRateHz = p.sampleRateHz;
        row.sampleCount = static_cast<std::int64_t>(p.samples);
        row.fileName = p.match.file;
        row.fileHash = p.hash;
        row.fileFormat = p.format;
        row.channelIndex = p.match.channel - 1;
        row.unit = std::string(unitSymbol(p.unit));
        row.sensitivity = p.sensitivity;
        for (const auto& q : p.quality) {
            if (!row.quality.empty()) row.quality += ',';
            row.quality.append(q, 0, q.find(':'));
        }
        row.speedRpm = p.speedRpm;
        row.loadPercent = p.loadPercent;
        w.recordings[k].recordingId = store.insertRecording(row);
        w.files[k].reset(); // stored: let the bytes go
    }
    if (w.analysis) {
        storeAnalysis(store, roundId, *w.analysis, w.recordings);
        rep.findings += w.analysis->result.findings.size();
        ++rep.motorsAnalysed;
    }
}

} // namespace

Result<ImportReport, ImportError> importWalkdown(storage::FleetStore& store, const fs::path& folderIn, const ImportOptions& options) {
    ImportReport rep;
    rep.folder = folderIn.string();
    std::error_code ec;
    if (!fs::is_directory(folderIn, ec)) return fail(ImportError{Code::NoFolder, folderIn.string() + ": not a folder", rep});
    const fs::path folder = fs::canonical(folderIn, ec);
    const fs::path manifestPath = folder / "manifest.csv";
    auto manifestBytes = io::readFileBytes(manifestPath, std::uint64_t{16} << 20);
    if (!manifestBytes)
        return fail(ImportError{Code::NoManifest, manifestPath.string() + ": no walkdown manifest (manifest.csv) in the folder", rep});
    const std::string manifestText(reinterpret_cast<const char*>(manifestBytes.value().data()), manifestBytes.value().size());
    auto manifest = io::parseManifest(manifestText, manifestPath.string());
    if (!manifest) return fail(ImportError{Code::BadManifest, manifest.error().message(), rep});
    const auto& man = manifest.value();
    rep.roundStart = text::formatIsoTime(man.roundStart);

    try {
        const fleet::Fleet fleet = store.loadFleet();
        if (fleet.motors.empty()) return fail(ImportError{Code::NoFleet, store.database().path().string() + ": the store holds no fleet; import a fleet file first", rep});

        std::vector<Planned> plan = planRecordings(folder, manifestPath, man, fleet, rep);

        // One pass, one task per motor on the worker threads: read each of its files once, hash
        // it, check every recording in it (rate, length, quantity, quality flags) and, unless this
        // is a dry run or the import is already lost to a bad file, analyse the motor. This thread
        // (SQLite's one writer) collects the motors in fleet order: it reports the problems and
        // stores the raw files, recordings and products of the good ones, all in one transaction.
        std::vector<const fleet::MotorDefinition*> motors;       // fleet order
        std::vector<std::vector<std::size_t>> entriesOf;          // plan indices per motor, plan order
        for (const auto& m : fleet.motors) {
            std::vector<std::size_t> mine;
            for (std::size_t i = 0; i < plan.size(); ++i)
                if (plan[i].motor == &m) mine.push_back(i);
            if (mine.empty()) continue;
            motors.push_back(&m);
            entriesOf.push_back(std::move(mine));
        }
        std::atomic<bool> lost{false}; // a bad file and no --skip-bad: check the rest, analyse nothing more
        const bool analyse = !options.dryRun;
        const auto work = [&](std::size_t m) { return checkAndAnalyse(plan, entriesOf[m], *motors[m], analyse, options.skipBad, lost); };

        // A store nobody else has open gets the round through a rollback journal: its raw files
        // are then written once, not into the log and again at the checkpoint (Database.h).
        std::optional<storage::SoleWriterJournal> journal; // declared first: outlives the transaction
        std::optional<storage::Transaction> tx;
        std::int64_t roundId = 0;
        const auto beginRound = [&] {
            journal.emplace(store.database());
            rep.throughJournal = journal->taken();
            tx.emplace(store.database());
            roundId = insertRoundRow(store, man, fleet, folder, rep);
        };
        std::set<std::string> storedHashes;
        const auto storeMotor = [&](std::size_t m, MotorWork& w) {
            storeMotorWork(store, roundId, plan, w, storedHashes, rep);
            if (!w.analysis && !w.good.empty() && !lost) rep.notes.push_back(motors[m]->motor.tag + ": no usable recording, not analysed");
        };

        std::vector<bool> isGood(plan.size(), false);
        std::size_t done = 0;
        MemoryRelease memory;
        inOrder(motors.size(), workerThreads(options.threads), workerThreads(options.threads) + 1, work, [&](std::size_t m, MotorWork w) {
            for (std::size_t k = 0; k < entriesOf[m].size(); ++k) {
                Planned& p = plan[entriesOf[m][k]];
                p = w.checked[k]; // copied, not moved: allocated on this thread (MotorWork)
                if (!report(options.progress, done++, plan.size(), "checking " + p.match.file)) throw Cancelled{};
                if (w.problems[k]) {
                    rep.bad.push_back(*w.problems[k]);
                    continue;
                }
                for (const auto& q : p.quality) rep.flagged.push_back({p.match.file, q.substr(0, q.find(':')), q});
                isGood[entriesOf[m][k]] = true;
            }
            if (analyse && (rep.bad.empty() || options.skipBad)) {
                if (!tx) beginRound();
                storeMotor(m, w);
                journal->startWriteBack(); // the disk writes this motor while the next are analysed
                if (!report(options.progress, done, plan.size(), "analysing " + motors[m]->motor.tag)) throw Cancelled{};
            }
            w = {}; // this motor's buffers go before the release, not after it
            memory.afterMotor();
        });
        std::vector<const Planned*> good;
        for (std::size_t i = 0; i < plan.size(); ++i)
            if (isGood[i]) {
                rep.matched.push_back(plan[i].match);
                good.push_back(&plan[i]);
            }
        if (!rep.bad.empty() && !options.skipBad) {
            std::string msg = folder.string() + ": " + std::to_string(rep.bad.size()) + " bad file(s), nothing imported (use --skip-bad to import the rest):";
            for (const auto& b : rep.bad) msg += "\n  " + b.file + ": " + b.kind + " - " + b.reason;
            return fail(ImportError{Code::BadFiles, msg, rep});
        }
        if (good.empty()) return fail(ImportError{Code::BadFiles, folder.string() + ": no recording could be imported", rep});

        // The walkdown's identity: the manifest and every imported file, in manifest order.
        util::Sha256 identity;
        identity.update(manifestText);
        for (const auto* p : good) identity.update(p->hash);
        const std::string roundHash = identity.finishHex();
        const auto existing = store.roundByManifestHash(roundHash);
        if (existing && !options.replace)
            return fail(ImportError{Code::AlreadyImported, folder.string() + ": this walkdown was imported already (round of " + existing->startedAt +
                                                               "); use --replace to import it again in its place", rep});
        if (options.dryRun) {
            rep.motorsAnalysed = 0;
            return rep;
        }
        if (existing) {
            store.deleteRound(existing->id);
            rep.replaced = true;
        }
        store.setRoundManifestHash(roundId, roundHash);
        tx->commit();
        rep.roundId = roundId;
        return rep;
    } catch (const Cancelled&) {
        return fail(ImportError{Code::Cancelled, "import cancelled; nothing was stored", rep});
    } catch (const storage::StorageException& e) {
        return fail(ImportError{Code::Storage, e.error.message + " - nothing was stored", rep});
    }
}

Result<ReanalysisReport, ImportError> reanalyseAll(storage::FleetStore& store, const ProgressCallback& progress, unsigned threads) {
    ReanalysisReport out;
    try {
        const fleet::Fleet fleet = store.loadFleet();
        for (const auto& round : store.rounds()) {
            const auto recordings = store.recordings(round.id);
            storage::Transaction tx(store.database());
            store.deleteAnalysis(round.id);
            std::vector<std::string> motorTags;
            for (const auto& m : fleet.motors)
                for (const auto& r : recordings)
                    if (r.motorTag == m.motor.tag) {
                        motorTags.push_back(m.motor.tag);
                        break;
                    }
            // Each worker reads one motor's raw files through its own read-only connection (the
            // writer's stays on this thread): memory holds the motors in flight, not the round.
            const auto loader = [&, path = store.database().path()](const fleet::MotorDefinition& m) {
                std::vector<PointRecording> recs;
                const auto reader = storage::FleetStore::openReadOnly(path);
                std::map<std::string, std::vector<std::byte>> files;
                for (const auto& r : recordings) {
                    if (r.motorTag != m.motor.tag) continue;
                    if (!files.count(r.fileHash)) files[r.fileHash] = reader->sourceFile(r.fileHash);
                    PointRecording pr;
                    pr.recordingId = r.id;
                    pr.pointName = r.pointName;
                    pr.speedRpm = r.speedRpm;
                    pr.usable = r.quality.empty();
                    const auto o = readOptionsFor(r.channelIndex + 1, parseUnit(r.unit).value_or(Unit::G), r.sensitivity);
                    auto rec = io::parseRecordingBytes(files.at(r.fileHash), r.fileName, o);
                    if (rec && static_cast<std::size_t>(r.channelIndex) < rec.value().recording.channels.size()) {
                        auto& ch = rec.value().recording.channels[static_cast<std::size_t>(r.channelIndex)];
                        pr.sampleRateHz = rec.value().recording.sampleRateHz;
                        pr.quantity = ch.quantity;
                        pr.samples = std::move(ch.samples);
                    } else {
                        pr.usable = false;
                    }
                    recs.push_back(std::move(pr));
                }
                return recs;
            };
            std::vector<std::string> notes;
            out.motors += analyseMotors(store, round.id, fleet, motorTags, loader, progress, threads, out.findings, notes);
            tx.commit();
            ++out.rounds;
        }
        return out;
    } catch (const Cancelled&) {
        return fail(ImportError{Code::Cancelled, "reanalysis cancelled; the rounds done so far keep their new analysis", {}});
    } catch (const storage::StorageException& e) {
        return fail(ImportError{Code::Storage, e.error.message, {}});
    }
}

} // namespace humwise::workflow
