#pragma once
// inOrder: work on items in parallel, results consumed in order on the calling thread.
//
// work(i) runs for i = 0 .. count-1 on `workers` threads made for the call and kept until it
// returns, at most `window` items ahead of the one collected next (bounded memory: only the
// results in flight are held; a window above `workers` lets a finished item wait for collection
// while the workers go on with the next ones); collect(i, result) runs on the calling thread in
// index order - the place for SQLite (one writer) and progress. A work failure leaves inOrder at
// its item's turn, after the earlier items were collected. If collect throws (or work did), no
// item is started any more and the items still running are waited for before the exception
// leaves. work must be safe to run concurrently with itself and with collect.
//
// Why the same few threads and not one per item: what a thread keeps (its band transforms,
// BandSignal.cpp, and the memory of its malloc arena) then serves every item it works on. A
// 1000-motor import took 27-33 s so, 34-36 s with a thread per motor (same machine, interleaved
// runs), for 3-9 MiB more at its peak.

#include <algorithm>
#include <condition_variable>
#include <cstddef>
#include <exception>
#include <map>
#include <mutex>
#include <optional>
#include <thread>
#include <utility>
#include <vector>

namespace humwise::workflow {

// The number of worker threads for `requested` (0 = the machine's cores).
inline unsigned workerThreads(unsigned requested) { return requested ? requested : std::max(1u, std::thread::hardware_concurrency()); }

template <class Work, class Collect>
void inOrder(std::size_t count, unsigned workers, std::size_t window, Work&& work, Collect&& collect) {
    using Item = decltype(work(std::size_t{0}));
    struct Done {
        std::optional<Item> item;
        std::exception_ptr error;
    };
    workers = std::max(1u, workers);
    window = std::max<std::size_t>(workers, window);
    std::mutex mutex;
    std::condition_variable changed;
    std::map<std::size_t, Done> done; // finished, not yet collected
    std::size_t next = 0;             // the next item to start
    std::size_t collecting = 0;       // items below collecting + window may start
    bool stop = false;

    const auto worker = [&] {
        std::unique_lock lock(mutex);
        for (;;) {
            changed.wait(lock, [&] { return stop || next >= count || next < collecting + window; });
            if (stop || next >= count) return;
            const std::size_t i = next++;
            lock.unlock();
            Done d;
            try {
                d.item.emplace(work(i));
            } catch (...) {
                d.error = std::current_exception();
            }
            lock.lock();
            done.emplace(i, std::move(d));
            changed.notify_all();
        }
    };

    std::vector<std::jthread> pool; // joined when it goes: after `stopping` has told the workers
    struct Stopping {
        std::mutex& mutex;
        std::condition_variable& changed;
        bool& stop;
        ~Stopping() {
            {
                std::lock_guard lock(mutex);
                stop = true;
            }
            changed.notify_all();
        }
    } stopping{mutex, changed, stop};
    for (unsigned t = 0; t < workers && t < count; ++t) pool.emplace_back(worker);
    for (std::size_t i = 0; i < count; ++i) {
        Done d;
        {
            std::unique_lock lock(mutex);
            changed.wait(lock, [&] { return done.count(i) != 0; });
            auto node = done.extract(i);
            d = std::move(node.mapped());
            if (d.error)
                stop = true; // no item starts any more: the window stays where the failure is
            else
                collecting = i + 1;
        }
        changed.notify_all();
        if (d.error) std::rethrow_exception(d.error);
        collect(i, std::move(*d.item));
    }
}

} // namespace humwise::workflow
