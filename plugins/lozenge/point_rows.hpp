// Run-time choice among the lattice-point row kernels (point_rows.inl)
// compiled for each level, and the sweeper that drives them: uniform weights
// on any simply connected lozenge region, CFTP on the three-part split grid.
// Same classes, ids and bits as the generic lowering of LozengeRegion.
#pragma once
#include <algorithm>
#include <cstdint>
#include <memory>
#include <vector>

#include "frostline/errors.hpp"
#include "frostline/grid_run.hpp"
#include "frostline/grid_runs.hpp"
#include "frostline/random.hpp"
#include "frostline/simd.hpp"
#include "frostline/split_grid.hpp"
#include "frostline/thread_team.hpp"

namespace frostline::lozenge {

FROSTLINE_DECLARE_LEVELS(void, uniform_runs,
                         (const grid_run* runs, std::int64_t n_runs, std::int64_t w, std::int32_t shift,
                          std::int32_t* top, std::int32_t* bottom, std::uint64_t base, std::int32_t k))

using point_rows_function = void (*)(const grid_run*, std::int64_t, std::int64_t, std::int32_t, std::int32_t*,
                                     std::int32_t*, std::uint64_t, std::int32_t);

inline point_rows_function point_rows_for(simd_level level) { return FROSTLINE_PICK_LEVEL(level, uniform_runs); }

// The free points of a region as runs of a rows x columns grid, checked.
class point_layout {
public:
    point_layout(std::int32_t rows, std::int32_t columns, std::int32_t shift, std::vector<grid_run> runs)
        : grid_(rows, columns, 3), shift_(((shift % 3) + 3) % 3), runs_(std::move(runs)) {
        n_sites_ = number_runs(runs_, rows - 1, columns - 1, "lattice points");  // grid rows 0..rows - 1
    }

    const split_grid& grid() const { return grid_; }
    std::int32_t shift() const { return shift_; }
    const std::vector<grid_run>& runs() const { return runs_; }
    std::int64_t n_sites() const { return n_sites_; }

private:
    split_grid grid_;
    std::int32_t shift_;
    std::vector<grid_run> runs_;
    std::int64_t n_sites_ = 0;
};

class point_sweeper {
public:
    point_sweeper(const point_layout& layout, random_key key, stream s, std::shared_ptr<thread_team> team = nullptr,
                  simd_level level = simd_choice())
        : layout_(layout), key_(key), stream_(s), team_(std::move(team)), rows_(point_rows_for(level)) {
        cuts_ = balanced_cuts(layout_.runs(), layout_.n_sites(), team_ ? team_->size() : 1);
    }

    std::int64_t n_sites() const { return layout_.n_sites(); }
    void sweep(std::int32_t* h, std::int64_t time) const { run(h, nullptr, time); }
    void sweep_pair(std::int32_t* top, std::int32_t* bottom, std::int64_t time) const { run(top, bottom, time); }

private:
    void run(std::int32_t* top, std::int32_t* bottom, std::int64_t time) const {
        const std::uint64_t base = sweep_base(key_, stream_, time);
        const auto& runs = layout_.runs();
        const std::int64_t w = layout_.grid().half_width();
        for (std::int32_t k = 0; k < 3; ++k)
            for_cut_blocks(team_, cuts_, [&](std::int64_t first, std::int64_t last) {
                rows_(runs.data() + first, last - first, w, layout_.shift(), top, bottom, base, k);
            });
    }

    const point_layout& layout_;
    random_key key_;
    stream stream_;
    std::shared_ptr<thread_team> team_;
    std::vector<std::int64_t> cuts_;
    point_rows_function rows_;
};

}  // namespace frostline::lozenge
