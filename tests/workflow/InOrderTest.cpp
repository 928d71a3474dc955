// inOrder (app/common/InOrder.h): parallel work, in-order collection, bounded look-ahead, errors.
// (It had no test of its own; the import and re-analysis rest on it.)
#include "app/common/InOrder.h"

#include <gtest/gtest.h>

#include <atomic>
#include <chrono>
#include <mutex>
#include <set>
#include <stdexcept>
#include <thread>
#include <vector>

namespace humwise::workflow {
namespace {

using namespace std::chrono_literals;

TEST(InOrder, CollectsEveryResultInIndexOrder) {
    std::vector<std::size_t> seen;
    inOrder(
        200, 3, 4,
        [](std::size_t i) {
            if (i % 7 == 0) std::this_thread::sleep_for(1ms); // finish out of order
            return i * i;
        },
        [&](std::size_t i, std::size_t square) {
            EXPECT_EQ(square, i * i);
            seen.push_back(i);
        });
    ASSERT_EQ(seen.size(), 200u);
    for (std::size_t i = 0; i < seen.size(); ++i) EXPECT_EQ(seen[i], i);
}

TEST(InOrder, NeverRunsMoreThanTheWorkersOrFurtherAheadThanTheWindow) {
    std::atomic<int> running{0}, mostRunning{0};
    std::atomic<std::size_t> collected{0}, mostAhead{0};
    std::mutex threadsMutex;
    std::set<std::thread::id> threads;
    inOrder(
        120, 2, 3,
        [&](std::size_t i) {
            const int now = ++running;
            for (int seen = mostRunning; now > seen && !mostRunning.compare_exchange_weak(seen, now);) {}
            const std::size_t ahead = i - collected.load();
            for (std::size_t seen = mostAhead; ahead > seen && !mostAhead.compare_exchange_weak(seen, ahead);) {}
            {
                std::lock_guard lock(threadsMutex);
                threads.insert(std::this_thread::get_id());
            }
            std::this_thread::sleep_for(200us);
            --running;
            return i;
        },
        [&](std::size_t, std::size_t) {
            std::this_thread::sleep_for(300us); // a slow writer: the workers must wait for it
            ++collected;
        });
    EXPECT_LE(mostRunning.load(), 2);
    // Item i starts only once item i - 3 has been taken for collection; `collected` counts the
    // collects that have finished, so the one in progress may lag by one: at most 3 ahead (with no
    // window, a slow writer would let the workers run dozens ahead).
    EXPECT_LE(mostAhead.load(), 3u);
    EXPECT_FALSE(threads.count(std::this_thread::get_id())); // the calling thread only collects
}

TEST(InOrder, AWorkFailureLeavesAtItsTurnAfterTheEarlierItems) {
    std::vector<std::size_t> seen;
    std::atomic<std::size_t> furthestStarted{0};
    EXPECT_THROW(inOrder(
                     100, 2, 3,
                     [&](std::size_t i) {
                         for (std::size_t was = furthestStarted; i > was && !furthestStarted.compare_exchange_weak(was, i);) {}
                         if (i == 10) throw std::runtime_error("item 10");
                         // The later items are quick: the workers then wait at the window's edge
                         // while item 10's turn comes, ready to take whatever it lets through.
                         if (i < 10) std::this_thread::sleep_for(200us);
                         return i;
                     },
                     [&](std::size_t i, std::size_t) { seen.push_back(i); }),
                 std::runtime_error);
    ASSERT_EQ(seen.size(), 10u);
    EXPECT_EQ(seen.back(), 9u);
    // Only what the window allowed while item 10 was the next to collect: items below 10 + 3.
    // (Counting starts "after the failure" by a flag raced with the items' own reading of it.)
    EXPECT_LE(furthestStarted.load(), 12u);
}

TEST(InOrder, ACollectFailureWaitsForTheRunningItems) {
    std::atomic<int> running{0};
    int runningWhenLeft = -1;
    try {
        inOrder(
            50, 2, 4,
            [&](std::size_t i) {
                ++running;
                std::this_thread::sleep_for(2ms);
                --running;
                return i;
            },
            [&](std::size_t i, std::size_t) {
                if (i == 5) throw std::logic_error("writer failed");
            });
        ADD_FAILURE() << "the collect failure did not leave inOrder";
    } catch (const std::logic_error&) {
        runningWhenLeft = running.load();
    }
    EXPECT_EQ(runningWhenLeft, 0);
}

TEST(InOrder, NothingToDo) {
    int calls = 0;
    inOrder(0, 4, 5, [&](std::size_t) { return ++calls; }, [&](std::size_t, int) { ++calls; });
    EXPECT_EQ(calls, 0);
}

} // namespace
} // namespace humwise::workflow
