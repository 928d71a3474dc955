// Atomicity under a hard kill: the import runs in a separate process (humwise-cli import) that is
// killed with SIGKILL at random moments, 24 times; afterwards PRAGMA integrity_check and the
// store's own consistency check pass, and the round is either absent or complete.
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

#include <chrono>
#include <fstream>
#include <random>
#include <thread>

namespace humwise::workflow {
namespace {

namespace fs = std::filesystem;

// Starts humwise-cli with the arguments, kills it after `delay`; returns true if it was still running.
bool runAndKill(const std::vector<std::string>& args, std::chrono::microseconds delay) {
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
    std::this_thread::sleep_for(delay);
    const bool running = waitpid(pid, nullptr, WNOHANG) == 0;
    kill(pid, SIGKILL);
    waitpid(pid, nullptr, 0);
    return running;
}

TEST(KillDuringImport, StoreIsConsistentAndTheRoundAllOrNothing) {
    const fs::path dir = test::freshFolder("kill");
    const fs::path walk = dir / "walkdown";
    test::writeWalkdown(walk);
    const fs::path fleetFile = dir / "fleet.json";
    std::ofstream(fleetFile) << io::writeFleet(test::smallFleet());
    // How long one whole import takes here: the kills land at random moments within it.
    std::chrono::microseconds whole{0};
    {
        const fs::path db = dir / "timing.db";
        {
            auto s = storage::FleetStore::open(db);
            storage::Transaction tx(s->database());
            s->saveFleet(test::smallFleet());
            tx.commit();
        }
        const auto t0 = std::chrono::steady_clock::now();
        const auto r = test::runCli({"import", walk.string(), "--db", db.string()});
        whole = std::chrono::duration_cast<std::chrono::microseconds>(std::chrono::steady_clock::now() - t0);
        ASSERT_EQ(r.exitCode, 0) << r.err;
    }
    std::mt19937_64 rng(77);
    int killedWhileRunning = 0;
    for (int run = 0; run < 24; ++run) {
        const fs::path db = dir / ("kill-" + std::to_string(run) + ".db");
        {
            auto s = storage::FleetStore::open(db);
            const auto f = io::readFleetFile(fleetFile);
            ASSERT_TRUE(f.ok());
            storage::Transaction tx(s->database());
            s->saveFleet(f.value());
            tx.commit();
        }
        const auto delay = std::chrono::microseconds(rng() % static_cast<std::uint64_t>(whole.count() * 9 / 10 + 1));
        killedWhileRunning += runAndKill({"import", walk.string(), "--db", db.string()}, delay);
        auto s = storage::FleetStore::open(db, false);
        EXPECT_TRUE(s->checkConsistency().empty()) << "run " << run;
        const auto rounds = s->rounds();
        ASSERT_LE(rounds.size(), 1u);
        if (!rounds.empty()) {
            EXPECT_EQ(s->recordings(rounds[0].id).size(), 12u) << "run " << run;
            EXPECT_EQ(s->roundMotors(rounds[0].id).size(), 2u) << "run " << run;
        }
        s.reset();
        for (const char* suffix : {"", "-wal", "-shm"}) fs::remove(db.string() + suffix);
    }
    // The kills must really have hit imports in progress, not only finished ones.
    EXPECT_GE(killedWhileRunning, 12);
}

} // namespace
} // namespace humwise::workflow
