#pragma once
// inOrder: work on items in parallel, results consumed in order on the calling thread.
//
// work(i) runs for i = 0 .. count-1 on at most `workers` threads at a time, at most `window`
// items ahead of the one collected next (bounded memory: only the results in flight are held;
// a window above `workers` lets a finished item wait for collection while the workers go on
// with the next ones); collect(i, result) runs
// on the calling thread in index order - the place for SQLite (one writer) and progress. If
// collect throws, the items still running are waited for before the exception leaves.
// work must be safe to run concurrently with itself and with collect.

#include <algorithm>
#include <cstddef>
#include <deque>
#include <future>
#include <semaphore>
#include <thread>
#include <utility>

namespace humwise::workflow {

// The number of worker threads for `requested` (0 = the machine's cores).
inline unsigned workerThreads(unsigned requested) { return requested ? requested : std::max(1u, std::thread::hardware_concurrency()); }

template <class Work, class Collect>
void inOrder(std::size_t count, unsigned workers, std::size_t window, Work&& work, Collect&& collect) {
    using Item = decltype(work(std::size_t{0}));
    std::counting_semaphore<> slots(std::max(1u, workers));
    std::deque<std::future<Item>> inFlight; // destroyed (waited for) before work's captures go
    std::size_t next = 0;
    const auto launch = [&] {
        inFlight.push_back(std::async(std::launch::async, [&work, &slots, i = next] {
            slots.acquire();
            struct Release {
                std::counting_semaphore<>& s;
                ~Release() { s.release(); }
            } release{slots};
            return work(i);
        }));
        ++next;
    };
    window = std::max<std::size_t>(std::max(1u, workers), window);
    while (next < count && inFlight.size() < window) launch();
    for (std::size_t i = 0; i < count; ++i) {
        Item item = inFlight.front().get();
        inFlight.pop_front();
        if (next < count) launch();
        collect(i, std::move(item));
    }
}

} // namespace humwise::workflow
