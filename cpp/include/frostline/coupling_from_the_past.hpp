// Monotone coupling from the past (Propp and Wilson, "Exact sampling with
// coupled Markov chains and applications to statistical mechanics", Random
// Structures Algorithms 9, 1996), with doubling of the start time.
//
// Any `Sweeper` works: it provides n_sites() and sweep(height*, time), a pure
// function of the state and the time. Sweeps are keyed by absolute time
// t in {-T, ..., -1}, so the run from -2T reuses exactly the random numbers
// of the sweeps it shares with the run from -T (fresh randomness on restart
// would bias the sample). The returned sample is therefore the same for every
// doubling schedule that reaches coalescence, which is why different kernels
// and coalescence checks agree bit for bit.
#pragma once
#include <algorithm>
#include <atomic>
#include <chrono>
#include <cstdint>
#include <functional>
#include <string>
#include <type_traits>
#include <vector>

#include "errors.hpp"

namespace frostline {

struct run_progress {
    std::int64_t start_time = 0;    // T of the current epoch (sweeps back from 0)
    std::int64_t site_updates = 0;  // so far, both chains counted
    double seconds = 0.0;
};

struct run_control {
    // Called about every `poll_interval` site updates and at each new epoch;
    // returning false cancels the run (throws `cancelled`).
    std::function<bool(const run_progress&)> keep_going;
    std::int64_t poll_interval = 100000000;
    std::int64_t first_start_time = 1;
    std::int64_t max_start_time = std::int64_t(1) << 40;
    bool check_order = false;  // debug path: verify top >= bottom after every sweep
};

struct run_report {
    std::int64_t start_time = 0;         // T of the epoch that coalesced (0: nothing to sample)
    std::int64_t coalescence_time = 0;   // sweeps from -T until the two chains met
    std::int64_t site_updates = 0;
    std::int32_t epochs = 0;
    double seconds = 0.0;
};

namespace detail {

class stopwatch {
public:
    double seconds() const {
        return std::chrono::duration<double>(std::chrono::steady_clock::now() - start_).count();
    }

private:
    std::chrono::steady_clock::time_point start_ = std::chrono::steady_clock::now();
};

// Polls the caller's keep_going hook every `poll_interval` updates.
class poller {
public:
    poller(const run_control& control, const stopwatch& clock) : control_(control), clock_(clock) {}

    void add(std::int64_t updates, std::int64_t start_time) {
        progress_.site_updates += updates;
        since_poll_ += std::max<std::int64_t>(updates, 1);  // a sweep of no sites still counts, so Ctrl-C works
        if (since_poll_ >= control_.poll_interval) poll(start_time);
    }

    void poll(std::int64_t start_time) {
        since_poll_ = 0;
        progress_.start_time = start_time;
        progress_.seconds = clock_.seconds();
        if (control_.keep_going && !control_.keep_going(progress_)) throw cancelled();
    }

    std::int64_t updates() const { return progress_.site_updates; }

private:
    const run_control& control_;
    const stopwatch& clock_;
    run_progress progress_;
    std::int64_t since_poll_ = 0;
};

// The sweeper interface, stated for the compiler (C++17 detection idiom):
//   std::int64_t n_sites() const;                       sites updated per sweep
//   void sweep(std::int32_t* h, std::int64_t t) const;  one sweep at absolute time t,
//                                                       random bits keyed by (key, stream, t, site)
// and optionally sweep_pair(top, bottom, t), both chains in one pass with the
// same bits. monotone_cftp and the binding templates refuse anything else.
template <class Sweeper, class = void>
struct is_sweeper : std::false_type {};
template <class Sweeper>
struct is_sweeper<Sweeper, std::void_t<decltype(static_cast<std::int64_t>(std::declval<const Sweeper&>().n_sites())),
                                       decltype(std::declval<const Sweeper&>().sweep(std::declval<std::int32_t*>(),
                                                                                    std::int64_t{}))>>
    : std::true_type {};

// Sweeps both chains at time t: in one pass when the sweeper offers
// sweep_pair (shared random bits, half the hashing), else one after the other.
template <class Sweeper, class = void>
struct has_sweep_pair : std::false_type {};
template <class Sweeper>
struct has_sweep_pair<Sweeper, std::void_t<decltype(std::declval<const Sweeper&>().sweep_pair(
                                   std::declval<std::int32_t*>(), std::declval<std::int32_t*>(), std::int64_t{}))>>
    : std::true_type {};

template <class Sweeper>
void sweep_both(const Sweeper& sweeper, std::int32_t* top, std::int32_t* bottom, std::int64_t t) {
    if constexpr (has_sweep_pair<Sweeper>::value) {
        sweeper.sweep_pair(top, bottom, t);
    } else {
        sweeper.sweep(top, t);
        sweeper.sweep(bottom, t);
    }
}

inline void check_order(const std::vector<std::int32_t>& top, const std::vector<std::int32_t>& bottom,
                        std::int64_t time) {
    for (std::size_t v = 0; v < top.size(); ++v)
        if (top[v] < bottom[v])
            throw std::logic_error("monotone coupling broken: top below bottom at index " + std::to_string(v) +
                                   " after the sweep at time " + std::to_string(time));
}

}  // namespace detail

// Returns the exact sample (the common state at time 0) and fills `report`.
// `top` and `bottom` are the greatest and least states (same layout as the
// sweeper's height arrays).
template <class Sweeper>
std::vector<std::int32_t> monotone_cftp(const Sweeper& sweeper, const std::vector<std::int32_t>& greatest,
                                        const std::vector<std::int32_t>& least, const run_control& control,
                                        run_report& report) {
    static_assert(detail::is_sweeper<Sweeper>::value,
                  "a sweeper needs n_sites() const and sweep(std::int32_t*, std::int64_t) const");
    detail::stopwatch clock;
    detail::poller poll(control, clock);
    report = run_report{};
    if (greatest == least) {  // one configuration: nothing to simulate
        report.seconds = clock.seconds();
        return greatest;
    }
    const std::int64_t n = sweeper.n_sites();
    std::int64_t T = std::max<std::int64_t>(1, control.first_start_time);
    std::vector<std::int32_t> top, bottom;
    for (;;) {
        if (T > control.max_start_time)
            throw budget_exceeded("coupling from the past did not coalesce from start time " +
                                  std::to_string(T / 2) + " and the limit is " +
                                  std::to_string(control.max_start_time) + " sweeps");
        ++report.epochs;
        poll.poll(T);
        top = greatest;
        bottom = least;
        bool met = false;
        // Sweeps between coalescence checks: a check compares whole states on one thread,
        // about as long as a sweep of a fast kernel, so long epochs check rarely (at most
        // 256 times); checking late costs at most T / 256 extra sweeps and never changes
        // the sample (see the top of this file).
        const std::int64_t compare_every = std::max<std::int64_t>(4, T / 256);
        for (std::int64_t t = -T; t < 0; ++t) {
            if (met) {
                sweeper.sweep(top.data(), t);
                poll.add(n, T);
                continue;
            }
            detail::sweep_both(sweeper, top.data(), bottom.data(), t);
            poll.add(2 * n, T);
            if (control.check_order) detail::check_order(top, bottom, t);
            if ((t + T + 1) % compare_every == 0 || t == -1) {
                met = (top == bottom);
                if (met) report.coalescence_time = t + T + 1;
            }
        }
        if (met) break;
        T *= 2;
    }
    report.start_time = T;
    report.site_updates = poll.updates();
    report.seconds = clock.seconds();
    return top;
}

// A forward heat-bath chain. The sweep is type-erased (one indirect call
// per sweep, never per site). `time` advances after every sweep, so an
// interrupted run leaves a consistent state that can be resumed.
class forward_chain {
public:
    using sweep_function = std::function<void(std::int32_t*, std::int64_t)>;

    forward_chain(sweep_function sweep, std::int64_t n_sites, std::vector<std::int32_t> height,
                  std::int64_t time)
        : sweep_(std::move(sweep)), n_sites_(n_sites), height_(std::move(height)), time_(time) {}

    // Returns the site updates done. One run at a time: a second thread
    // calling run() on the same chain gets an error instead of a data race.
    std::int64_t run(std::int64_t sweeps, const run_control& control) {
        if (busy_.exchange(true)) throw std::runtime_error("this chain is already running in another thread");
        struct release {
            std::atomic<bool>& flag;
            ~release() { flag = false; }
        } guard{busy_};
        detail::stopwatch clock;
        detail::poller poll(control, clock);
        for (std::int64_t s = 0; s < sweeps; ++s) {
            sweep_(height_.data(), time_);
            ++time_;
            poll.add(n_sites_, 0);
        }
        return poll.updates();
    }

    const std::vector<std::int32_t>& height() const { return height_; }
    std::int64_t time() const { return time_; }

private:
    sweep_function sweep_;
    std::int64_t n_sites_;
    std::vector<std::int32_t> height_;
    std::int64_t time_;
    std::atomic<bool> busy_{false};
};

}  // namespace frostline
