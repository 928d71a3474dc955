// A store locked by another process, through the real humwise-cli: while this test process holds
// a write transaction, commands that write wait for the busy timeout and then fail with exit
// code 1 and a message naming the database and the lock; commands that only read still work
// (WAL); once the lock is gone the same write succeeds. Nothing is lost either way.
#include "cli/CliRunner.h"
#include "core/io/FleetFile.h"
#include "storage/FleetStore.h"
#include "support/TestSupport.h"
#include "workflow/FixtureFleet.h"

#include <gtest/gtest.h>

#include <fstream>

namespace humwise::cli {
namespace {

using test::CliRun;
using test::runCli;

TEST(LockedStore, WritersGetAClearMessageReadersCarryOnAndNothingIsLost) {
    const auto dir = test::freshFolder("cli-locked");
    const std::string db = (dir / "store.db").string();
    std::ofstream(dir / "fleet.json") << io::writeFleet(test::smallFleet());
    ASSERT_EQ(runCli({"fleet", "import", (dir / "fleet.json").string(), "--db", db}).exitCode, 0);
    const auto walk = dir / "walkdown";
    test::writeWalkdown(walk);
    ASSERT_EQ(runCli({"import", walk.string(), "--db", db}).exitCode, 0);
    const std::vector<std::string> setLimit = {"limits", "set", "--motor", "P-1", "--point", "DE-H", "--indicator", "1x", "--alarm", "2", "--db", db};
    {
        auto other = storage::FleetStore::open(db, false); // "another process": its own connection
        storage::Transaction holding(other->database());
        other->database().execute("UPDATE rounds SET notes = 'being edited elsewhere'");

        const CliRun write = runCli(setLimit);
        EXPECT_EQ(write.exitCode, 1) << write.out;
        EXPECT_NE(write.err.find(db), std::string::npos) << write.err;
        EXPECT_NE(write.err.find("locked by another process"), std::string::npos) << write.err;

        const CliRun again = runCli({"import", walk.string(), "--db", db, "--replace"});
        EXPECT_EQ(again.exitCode, 1) << again.out;
        EXPECT_NE(again.err.find("locked by another process"), std::string::npos) << again.err;

        const CliRun read = runCli({"rounds", "--db", db});
        EXPECT_EQ(read.exitCode, 0) << read.err;
        EXPECT_NE(read.out.find("12 recording(s)"), std::string::npos) << read.out;
        holding.commit();
    }
    const CliRun write = runCli(setLimit);
    EXPECT_EQ(write.exitCode, 0) << write.err;
    auto s = storage::FleetStore::open(db, false);
    EXPECT_TRUE(s->checkConsistency().empty());
    ASSERT_EQ(s->rounds().size(), 1u);
    EXPECT_EQ(s->rounds().front().notes, "being edited elsewhere"); // the other process's change kept
    EXPECT_EQ(s->recordings(s->rounds().front().id).size(), 12u);
    EXPECT_EQ(s->alarmLimits("P-1").size(), 1u);
}

} // namespace
} // namespace humwise::cli
