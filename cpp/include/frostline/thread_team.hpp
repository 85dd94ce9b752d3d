// A small team of threads for splitting one sweep's colour class among cores.
//
// Sites of one colour class never neighbour each other, so a class can be cut
// into blocks of rows updated at the same time: the sample does not depend on
// the number of threads (each site still reads its own counter-based bits).
// A class takes microseconds, so the team spins on an atomic generation
// counter rather than sleeping on a condition variable (waking costs more
// than the work); after a few thousand spins a waiting thread yields, so an
// idle team costs little while the caller is busy elsewhere (a progress poll).
// The team lives for one call (one exact sample) and joins its threads on
// destruction.
#pragma once
#include <algorithm>
#include <atomic>
#include <cstdint>
#include <exception>
#include <functional>
#include <memory>
#include <mutex>
#include <thread>
#include <vector>

#if defined(__x86_64__) || defined(_M_X64)
#include <immintrin.h>
#define FROSTLINE_PAUSE() _mm_pause()
#else
#define FROSTLINE_PAUSE() std::this_thread::yield()
#endif

namespace frostline {

class thread_team {
public:
    explicit thread_team(int size) : size_(size < 1 ? 1 : size) {
        try {
            for (int part = 1; part < size_; ++part) workers_.emplace_back([this, part] { work(part); });
        } catch (...) {  // a thread that could not start: stop and join those that did, then report
            stop_workers();
            throw;
        }
    }
    thread_team(const thread_team&) = delete;
    thread_team& operator=(const thread_team&) = delete;
    ~thread_team() { stop_workers(); }

    int size() const { return size_; }

    // Calls job(part) for every part in 0..size()-1 (part 0 on the calling
    // thread) and returns when all have finished; an exception in any part is
    // rethrown here. One run at a time (the caller's thread drives the team).
    void run(const std::function<void(int)>& job) {
        if (size_ == 1) {
            job(0);
            return;
        }
        job_ = &job;
        remaining_.store(size_ - 1, std::memory_order_relaxed);
        generation_.fetch_add(1, std::memory_order_release);
        try {
            job(0);
        } catch (...) {
            record(std::current_exception());
        }
        for (int spins = 0; remaining_.load(std::memory_order_acquire) != 0;) {
            if (++spins < 4096)
                FROSTLINE_PAUSE();
            else
                std::this_thread::yield();
        }
        if (error_) {
            auto e = error_;
            error_ = nullptr;
            std::rethrow_exception(e);
        }
    }

    // The half-open range [first, last) of part `part` when `n` items are cut evenly.
    std::pair<std::int64_t, std::int64_t> block(std::int64_t n, int part) const {
        return {n * part / size_, n * (part + 1) / size_};
    }

private:
    void stop_workers() {
        stop_.store(true, std::memory_order_relaxed);
        generation_.fetch_add(1, std::memory_order_release);
        for (auto& t : workers_) t.join();
        workers_.clear();
    }

    void work(int part) {
        std::uint64_t seen = 0;
        for (;;) {
            std::uint64_t now;
            int spins = 0;
            while ((now = generation_.load(std::memory_order_acquire)) == seen) {
                if (++spins < 4096)
                    FROSTLINE_PAUSE();
                else
                    std::this_thread::yield();
            }
            seen = now;
            if (stop_.load(std::memory_order_relaxed)) return;
            try {
                (*job_)(part);
            } catch (...) {
                record(std::current_exception());
            }
            remaining_.fetch_sub(1, std::memory_order_release);
        }
    }

    void record(std::exception_ptr e) {
        std::lock_guard<std::mutex> hold(error_lock_);
        if (!error_) error_ = e;
    }

    int size_;
    std::vector<std::thread> workers_;
    std::atomic<std::uint64_t> generation_{0};
    std::atomic<int> remaining_{0};
    std::atomic<bool> stop_{false};
    const std::function<void(int)>* job_ = nullptr;
    std::mutex error_lock_;
    std::exception_ptr error_;
};

// Calls body(first, last) on blocks of the items 0..n-1: one block per member
// of the team at the same time, or the whole range when there is no team.
template <class Body>
void for_blocks(const std::shared_ptr<thread_team>& team, std::int64_t n, Body&& body) {
    if (!team) {
        body(std::int64_t(0), n);
        return;
    }
    team->run([&](int part) {
        const auto range = team->block(n, part);
        body(range.first, range.second);
    });
}

// Cuts of a list of runs (each with first_site, in increasing order) into
// `parts` blocks of about equal site count: block p is runs cuts[p]..cuts[p+1]-1.
template <class Run>
std::vector<std::int64_t> balanced_cuts(const std::vector<Run>& runs, std::int64_t n_sites, int parts) {
    std::vector<std::int64_t> cuts{0};
    for (int part = 1; part < parts; ++part) {
        const std::int64_t share = n_sites * part / parts;
        auto at = std::lower_bound(runs.begin(), runs.end(), share,
                                   [](const Run& r, std::int64_t v) { return r.first_site < v; });
        cuts.push_back(static_cast<std::int64_t>(at - runs.begin()));
    }
    cuts.push_back(static_cast<std::int64_t>(runs.size()));
    return cuts;
}

// Calls body(first, last) on the blocks given by `cuts` (balanced_cuts), in parallel on the team.
template <class Body>
void for_cut_blocks(const std::shared_ptr<thread_team>& team, const std::vector<std::int64_t>& cuts, Body&& body) {
    if (!team) {
        body(cuts.front(), cuts.back());
        return;
    }
    team->run([&](int part) { body(cuts[static_cast<std::size_t>(part)], cuts[static_cast<std::size_t>(part) + 1]); });
}

}  // namespace frostline
