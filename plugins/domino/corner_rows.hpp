// Run-time choice among the domino row kernels (corner_rows.inl) compiled for
// each level, and the sweeper that drives them: uniform weights, CFTP on the
// split corner grid (frostline/split_grid.hpp). Same classes, ids and bits as
// corner_sweeper, so the same sample.
#pragma once
#include <algorithm>
#include <cstdint>
#include <memory>
#include <vector>

#include "corner_kernel.hpp"
#include "frostline/random.hpp"
#include "frostline/simd.hpp"
#include "frostline/split_grid.hpp"
#include "frostline/thread_team.hpp"

namespace frostline::domino {

FROSTLINE_DECLARE_LEVELS(void, uniform_runs,
                         (const corner_run* runs, std::int64_t n_runs, std::int64_t w, std::int32_t* top,
                          std::int32_t* bottom, std::uint64_t base, std::int32_t parity))

using corner_rows_function = void (*)(const corner_run*, std::int64_t, std::int64_t, std::int32_t*, std::int32_t*,
                                      std::uint64_t, std::int32_t);

inline corner_rows_function corner_rows_for(simd_level level) { return FROSTLINE_PICK_LEVEL(level, uniform_runs); }

// Uniform domino sweeps on the split grid of `layout`'s corner array.
class corner_split_sweeper {
public:
    // team: threads sharing each colour class, each a block of runs of about equal site count (null: one thread).
    corner_split_sweeper(const corner_layout& layout, random_key key, stream s,
                         std::shared_ptr<thread_team> team = nullptr, simd_level level = simd_choice())
        : layout_(layout), grid_(layout.rows() + 1, layout.columns() + 1), key_(key), stream_(s),
          team_(std::move(team)), rows_(corner_rows_for(level)) {
        cuts_ = balanced_cuts(layout_.runs(), layout_.n_sites(), team_ ? team_->size() : 1);
    }

    const split_grid& grid() const { return grid_; }
    std::int64_t n_sites() const { return layout_.n_sites(); }
    void sweep(std::int32_t* h, std::int64_t time) const { run(h, nullptr, time); }
    void sweep_pair(std::int32_t* top, std::int32_t* bottom, std::int64_t time) const { run(top, bottom, time); }

private:
    void run(std::int32_t* top, std::int32_t* bottom, std::int64_t time) const {
        const std::uint64_t base = sweep_base(key_, stream_, time);
        const auto& runs = layout_.runs();
        for (std::int32_t parity = 0; parity < 2; ++parity)
            for_cut_blocks(team_, cuts_, [&](std::int64_t first, std::int64_t last) {
                rows_(runs.data() + first, last - first, grid_.half_width(), top, bottom, base, parity);
            });
    }

    const corner_layout& layout_;
    split_grid grid_;
    random_key key_;
    stream stream_;
    std::shared_ptr<thread_team> team_;
    std::vector<std::int64_t> cuts_;  // runs cuts_[p]..cuts_[p + 1] - 1 belong to part p
    corner_rows_function rows_;
};

}  // namespace frostline::domino
