// Run-time choice among the square-ice row kernels (ice_rows.inl) compiled for
// each level, and the sweeper that drives them: uniform weights on the split
// corner grid (frostline/split_grid.hpp). Same classes, ids and bits as
// ice_sweeper with no table, so the same sample.
#pragma once
#include <cstdint>
#include <memory>
#include <vector>

#include "frostline/random.hpp"
#include "frostline/simd.hpp"
#include "frostline/split_grid.hpp"
#include "frostline/thread_team.hpp"

namespace frostline::square_ice {

FROSTLINE_DECLARE_LEVELS(void, uniform_rows,
                         (std::int32_t n, std::int64_t w, std::int32_t* top, std::int32_t* bottom, std::uint64_t base,
                          std::int32_t parity, std::int32_t first_row, std::int32_t last_row))

using ice_rows_function = void (*)(std::int32_t, std::int64_t, std::int32_t*, std::int32_t*, std::uint64_t,
                                   std::int32_t, std::int32_t, std::int32_t);

inline ice_rows_function ice_rows_for(simd_level level) { return FROSTLINE_PICK_LEVEL(level, uniform_rows); }

class ice_split_sweeper {
public:
    // team: threads sharing each colour class, a block of rows each (null: one thread).
    ice_split_sweeper(std::int32_t n, random_key key, stream s, std::shared_ptr<thread_team> team = nullptr,
                      simd_level level = simd_choice())
        : n_(n), grid_(n + 1, n + 1), key_(key), stream_(s), team_(std::move(team)), rows_(ice_rows_for(level)) {}

    const split_grid& grid() const { return grid_; }
    std::int64_t n_sites() const { return static_cast<std::int64_t>(n_ - 1) * (n_ - 1); }
    void sweep(std::int32_t* h, std::int64_t time) const { run(h, nullptr, time); }
    void sweep_pair(std::int32_t* top, std::int32_t* bottom, std::int64_t time) const { run(top, bottom, time); }

private:
    void run(std::int32_t* top, std::int32_t* bottom, std::int64_t time) const {
        const std::uint64_t base = sweep_base(key_, stream_, time);
        for (std::int32_t parity = 0; parity < 2; ++parity)
            for_blocks(team_, n_ - 1, [&](std::int64_t first, std::int64_t last) {  // of the free rows 1..n - 1
                rows_(n_, grid_.half_width(), top, bottom, base, parity, static_cast<std::int32_t>(first + 1),
                      static_cast<std::int32_t>(last + 1));
            });
    }

private:
    std::int32_t n_;
    split_grid grid_;
    random_key key_;
    stream stream_;
    std::shared_ptr<thread_team> team_;
    ice_rows_function rows_;
};

}  // namespace frostline::square_ice
