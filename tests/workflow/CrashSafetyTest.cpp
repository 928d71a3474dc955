// Atomicity under a hard kill: humwise-cli runs in a separate process that is killed with SIGKILL
// at a random moment of an import (24 runs), a re-analysis (40 runs) or an alarm-limit edit
// (40 runs: a bulk suggestion stored in one transaction, or one limit set). After every kill,
// PRAGMA integrity_check and the store's own consistency check pass, every round committed
// before the kill is still there with all its recordings and analysis, and the interrupted
// change is either absent or complete.
#include "storage/FleetStore.h"
#include "support/TestSupport.h"
#include "workflow/FixtureFleet.h"
#include "core/io/FleetFile.h"
#include "cli/CliRunner.h"

#include <gtest/gtest.h>

#include <signal.h>
#include <fcntl.h>
#include <sys/wait.h>
#include <unistd.h>

#include <algorithm>
#include <chrono>
#include <fstream>
#include <functional>
#include <iostream>
#include <map>
#include <random>
#include <set>
#include <thread>

namespace humwise::workflow {
namespace {

namespace fs = std::filesystem;
using Micros = std::chrono::microseconds;

// Starts humwise-cli with the arguments and returns its process id.
pid_t startCli(const std::vector<std::string>& args) {
    const pid_t pid = fork();
    if (pid == 0) {
        std::vector<char*> argv;
        std::string exe = HUMWISE_CLI;
        argv.push_back(exe.data());
        std::vector<std::string> copy = args;
        for (auto& a : copy) argv.push_back(a.data());
        argv.push_back(nullptr);
        const int devnull = ::open("/dev/null", O_WRONLY);
        dup2(devnull, 1);
        dup2(devnull, 2);
        execv(exe.c_str(), argv.data());
        _exit(127);
    }
    return pid;
}

// Kills the process with SIGKILL and reaps it; returns true if it was still running.
bool killNow(pid_t pid) {
    const bool running = waitpid(pid, nullptr, WNOHANG) == 0;
    kill(pid, SIGKILL);
    waitpid(pid, nullptr, 0);
    return running;
}

// Starts humwise-cli with the arguments, kills it after `delay`; returns true if it was still running.
bool runAndKill(const std::vector<std::string>& args, Micros delay) {
    const pid_t pid = startCli(args);
    std::this_thread::sleep_for(delay);
    return killNow(pid);
}

// Starts humwise-cli with the arguments and kills it once `file` exists, plus `after`; returns
// true if it was killed while running with the file there (false: it ended first).
bool runAndKillOnceExists(const std::vector<std::string>& args, const fs::path& file, Micros after) {
    const pid_t pid = startCli(args);
    while (!fs::exists(file)) {
        if (waitpid(pid, nullptr, WNOHANG) == pid) return false; // ended without it
        std::this_thread::sleep_for(Micros(100));
    }
    std::this_thread::sleep_for(after);
    const bool there = fs::exists(file);
    return killNow(pid) && there;
}

// Wall time of uninterrupted runs of the command (the kills land at random moments within it):
// the fastest of three, each on the arguments `args` gives afresh (a new store copy). One timing
// taken while the machine was busy (a parallel test run) made later kills land after the end.
Micros timeOf(const std::function<std::vector<std::string>()>& args) {
    Micros fastest = Micros::max();
    for (int i = 0; i < 3; ++i) {
        const auto t0 = std::chrono::steady_clock::now();
        const auto r = test::runCli(args());
        EXPECT_EQ(r.exitCode, 0) << r.err;
        fastest = std::min(fastest, std::chrono::duration_cast<Micros>(std::chrono::steady_clock::now() - t0));
    }
    return fastest;
}

void removeStore(const fs::path& db) { storage::removeDatabaseFiles(db); }

// A store file holding the fixture fleet and `rounds` imported walkdowns, checkpointed into one
// file so that copies of it are complete stores.
fs::path storeWithRounds(const fs::path& dir, int rounds) {
    const fs::path db = dir / ("template-" + std::to_string(rounds) + ".db");
    removeStore(db);
    {
        auto s = storage::FleetStore::open(db);
        storage::Transaction tx(s->database());
        s->saveFleet(test::smallFleet());
        tx.commit();
    }
    for (int r = 0; r < rounds; ++r) {
        test::WalkdownSpec spec;
        spec.roundStart = "2026-0" + std::to_string(r + 1) + "-02T08:00:00Z";
        spec.seed = 100 + 20 * static_cast<std::uint64_t>(r);
        spec.oneXmmsP1 = 0.6 + 0.1 * r;
        const fs::path walk = dir / ("round-" + std::to_string(r));
        if (!fs::exists(walk / "manifest.csv")) test::writeWalkdown(walk, spec);
        const auto res = test::runCli({"import", walk.string(), "--db", db.string()});
        EXPECT_EQ(res.exitCode, 0) << res.err;
    }
    storage::FleetStore::open(db, false)->checkpoint();
    return db;
}

// What a committed round holds; compared before and after a kill.
struct RoundContent {
    std::string startedAt;
    std::size_t recordings = 0, motors = 0, findings = 0;
    bool operator==(const RoundContent&) const = default;
};

std::vector<RoundContent> contentOf(storage::FleetStore& s) {
    std::vector<RoundContent> out;
    for (const auto& r : s.rounds()) out.push_back({r.startedAt, s.recordings(r.id).size(), s.roundMotors(r.id).size(), s.findings(r.id).size()});
    return out;
}

// A journal that SQLite would roll back: beside the store, its first byte not zero (a journal
// killed before its header was written is empty, and SQLite ignores it and leaves it there;
// sqlite3 source, pager.c, hasHotJournal).
bool hotJournalBeside(const fs::path& db) {
    std::ifstream in(db.string() + "-journal", std::ios::binary);
    char first = 0;
    return in && in.get(first) && first != 0;
}

// Opens the store after a kill and checks what holds whatever the interrupted command was.
std::unique_ptr<storage::FleetStore> reopenChecked(const fs::path& db, const std::string& run) {
    auto s = storage::FleetStore::open(db, false);
    // A write killed inside a rollback journal (an import on a store nobody else had open) is
    // rolled back by this open, which also gives the store its write-ahead log back.
    EXPECT_EQ(s->database().journalMode(), "wal") << run;
    EXPECT_FALSE(hotJournalBeside(db)) << run;
    const auto problems = s->checkConsistency();
    EXPECT_TRUE(problems.empty()) << run << ": " << (problems.empty() ? "" : problems.front());
    return s;
}

std::size_t limitCount(storage::FleetStore& s) {
    std::size_t n = 0;
    for (const auto& m : s.loadFleet().motors) n += s.alarmLimits(m.motor.tag).size();
    return n;
}

class KillDuring : public ::testing::Test {
protected:
    void SetUp() override { dir = test::freshFolder(std::string("kill-") + ::testing::UnitTest::GetInstance()->current_test_info()->name()); }
    // A fresh copy of the template for one run.
    fs::path copyOf(const fs::path& templ, int run) {
        const fs::path db = dir / ("run-" + std::to_string(run) + ".db");
        removeStore(db);
        fs::copy_file(templ, db);
        return db;
    }
    Micros randomDelay(Micros whole) { return Micros(rng() % static_cast<std::uint64_t>(whole.count() * 9 / 10 + 1)); }
    fs::path dir;
    std::mt19937_64 rng{77};
};

// Import of a second round into a store that already holds one: the first round is never
// touched; the new one is absent or complete.
TEST_F(KillDuring, ImportLeavesTheNewRoundAllOrNothingAndTheOldOneIntact) {
    const fs::path templ = storeWithRounds(dir, 1);
    const auto before = contentOf(*storage::FleetStore::open(templ, false));
    ASSERT_EQ(before.size(), 1u);
    ASSERT_EQ(before[0].recordings, 12u);
    test::WalkdownSpec spec;
    spec.roundStart = "2026-05-04T08:00:00Z";
    spec.seed = 900;
    const fs::path walk = dir / "new-round";
    test::writeWalkdown(walk, spec);
    const Micros whole = timeOf([&] { return std::vector<std::string>{"import", walk.string(), "--db", copyOf(templ, -1).string()}; });
    int killedWhileRunning = 0, killedInsideJournal = 0;
    for (int run = 0; run < 24; ++run) {
        const fs::path db = copyOf(templ, run);
        killedWhileRunning += runAndKill({"import", walk.string(), "--db", db.string()}, randomDelay(whole));
        // Nobody else has the store open: the import writes through a rollback journal, and a
        // kill inside its transaction leaves that journal (hot) beside the store.
        killedInsideJournal += fs::exists(db.string() + "-journal");
        auto s = reopenChecked(db, "import run " + std::to_string(run));
        const auto after = contentOf(*s);
        ASSERT_GE(after.size(), 1u) << "run " << run;
        ASSERT_LE(after.size(), 2u) << "run " << run;
        EXPECT_EQ(after[0], before[0]) << "run " << run << ": the committed round changed";
        if (after.size() == 2) {
            EXPECT_EQ(after[1].recordings, 12u) << "run " << run;
            EXPECT_EQ(after[1].motors, 2u) << "run " << run;
        }
        s.reset();
        removeStore(db);
    }
    // The kills must really have hit imports in progress, not only finished ones.
    EXPECT_GE(killedWhileRunning, 12);
    std::cout << "[ kill ] " << killedInsideJournal << " of 24 import run(s) killed at random inside the journal's transaction\n";

    // And, whatever the random delays gave, runs killed inside it for certain: the moment the
    // journal appears (the round's first write; the file is polled every 0.1 ms), or a little
    // later while it is still there. A small walkdown's round takes a few milliseconds.
    int killedInside = 0;
    for (int run = 0; run < 6; ++run) {
        const fs::path db = copyOf(templ, 100 + run);
        if (runAndKillOnceExists({"import", walk.string(), "--db", db.string()}, db.string() + "-journal", Micros(400 * run))) {
            ++killedInside;
            std::cout << "[ kill ] journal run " << run << ": " << (hotJournalBeside(db) ? "hot" : "empty") << " journal left\n";
        }
        auto s = reopenChecked(db, "journal run " + std::to_string(run));
        const auto after = contentOf(*s);
        ASSERT_GE(after.size(), 1u) << "journal run " << run;
        EXPECT_EQ(after[0], before[0]) << "journal run " << run;
        if (after.size() == 2) {
            EXPECT_EQ(after[1].recordings, 12u) << "journal run " << run;
        }
        s.reset();
        removeStore(db);
    }
    std::cout << "[ kill ] " << killedInside << " of 6 import run(s) killed once the journal was there\n";
    EXPECT_GE(killedInside, 3);
}

// Re-analysis replaces each round's analysis in its own transaction: after a kill every round
// still has its recordings and a complete analysis (old or new), none is lost. The template's
// analysis is marked with version -1 so that each round shows whether it was redone.
TEST_F(KillDuring, ReanalysisLosesNoRoundAndLeavesNoneHalfAnalysed) {
    const fs::path templ = storeWithRounds(dir, 3);
    std::vector<RoundContent> before;
    {
        auto s = storage::FleetStore::open(templ, false);
        s->database().execute("UPDATE round_motors SET analysis_version = -1");
        s->checkpoint();
        before = contentOf(*s);
    }
    ASSERT_EQ(before.size(), 3u);
    const Micros whole = timeOf([&] { return std::vector<std::string>{"reanalyse", "--db", copyOf(templ, -1).string()}; });
    int killedWhileRunning = 0;
    std::map<int, int> runsByRedoneRounds;
    for (int run = 0; run < 40; ++run) {
        const fs::path db = copyOf(templ, run);
        killedWhileRunning += runAndKill({"reanalyse", "--db", db.string()}, randomDelay(whole));
        auto s = reopenChecked(db, "re-analysis run " + std::to_string(run));
        // The rules are deterministic, so a round analysed again holds the same rows as before.
        EXPECT_EQ(contentOf(*s), before) << "run " << run;
        int redone = 0;
        for (const auto& r : s->rounds()) {
            std::set<int> versions;
            for (const auto& m : s->roundMotors(r.id)) versions.insert(m.analysisVersion);
            EXPECT_EQ(versions.size(), 1u) << "run " << run << ": round " << r.startedAt << " half old, half new";
            redone += versions.count(-1) == 0;
        }
        ++runsByRedoneRounds[redone];
        s.reset();
        removeStore(db);
    }
    EXPECT_GE(killedWhileRunning, 20);
    // Some kills must have landed between rounds (one or two of three redone), not only before or after.
    EXPECT_GT(runsByRedoneRounds[1] + runsByRedoneRounds[2], 0);
    for (const auto& [redone, runs] : runsByRedoneRounds) std::cout << "[ kill ] " << runs << " run(s) ended with " << redone << " of 3 rounds re-analysed\n";
}

// Alarm-limit edits: a bulk suggestion stored in one transaction is all or nothing; a single
// limit is there or not; the rounds are never touched.
TEST_F(KillDuring, LimitEditsAreAllOrNothingAndTouchNoRound) {
    const fs::path templ = storeWithRounds(dir, 3);
    const auto before = contentOf(*storage::FleetStore::open(templ, false));
    const std::vector<std::string> bulk = {"limits", "suggest", "--method", "percent", "--store"};
    const std::vector<std::string> single = {"limits", "set", "--motor", "P-2", "--point", "NDE-H", "--indicator", "1x", "--alert", "1", "--alarm", "2"};
    const auto withDb = [](std::vector<std::string> args, const fs::path& db) {
        args.insert(args.end(), {"--db", db.string()});
        return args;
    };
    std::size_t bulkCount = 0;
    Micros wholeBulk{0}, wholeSingle{0};
    {
        fs::path timed;
        wholeBulk = timeOf([&] { return withDb(bulk, timed = copyOf(templ, -1)); });
        bulkCount = limitCount(*storage::FleetStore::open(timed, false)); // the last timing run's store
        ASSERT_GE(bulkCount, 20u); // every limit-worthy indicator of both motors
        wholeSingle = timeOf([&] { return withDb(single, copyOf(templ, -1)); });
    }
    int killedWhileRunning = 0;
    for (int run = 0; run < 40; ++run) {
        const bool isBulk = run % 2 == 0;
        const fs::path db = copyOf(templ, run);
        killedWhileRunning += runAndKill(withDb(isBulk ? bulk : single, db), randomDelay(isBulk ? wholeBulk : wholeSingle));
        auto s = reopenChecked(db, "limit edit run " + std::to_string(run));
        EXPECT_EQ(contentOf(*s), before) << "run " << run;
        const std::size_t n = limitCount(*s);
        if (isBulk) EXPECT_TRUE(n == 0 || n == bulkCount) << "run " << run << ": " << n << " of " << bulkCount << " limits stored";
        else EXPECT_LE(n, 1u) << "run " << run;
        s.reset();
        removeStore(db);
    }
    EXPECT_GE(killedWhileRunning, 20);
}

} // namespace
} // namespace humwise::workflow
