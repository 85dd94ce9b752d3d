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

#define FROSTLINE_CORNER_ROWS_DECLARE(level)                                                                  \
    namespace simd_##level {                                                                                  \
    void uniform_runs(const corner_run* runs, std::int64_t n_runs, std::int64_t w, std::int32_t* top,       \
                      std::int32_t* bottom, std::uint64_t base, std::int32_t parity);                         \
    }
FROSTLINE_CORNER_ROWS_DECLARE(scalar)
FROSTLINE_CORNER_ROWS_DECLARE(avx2)
FROSTLINE_CORNER_ROWS_DECLARE(avx512)
#undef FROSTLINE_CORNER_ROWS_DECLARE

using corner_rows_function = void (*)(const corner_run*, std::int64_t, std::int64_t, std::int32_t*, std::int32_t*,
                                      std::uint64_t, std::int32_t);

inline corner_rows_function corner_rows_for(simd_level level) {
#if defined(FROSTLINE_X86_LEVELS)
    if (level == simd_level::avx512) return &simd_avx512::uniform_runs;
    if (level == simd_level::avx2) return &simd_avx2::uniform_runs;
#endif
    (void)level;
    return &simd_scalar::uniform_runs;
}

// Uniform domino sweeps on the split grid of `layout`'s corner array.
class corner_split_sweeper {
public:
    // team: threads sharing each colour class, each a block of runs of about equal site count (null: one thread).
    corner_split_sweeper(const corner_layout& layout, random_key key, stream s,
                         std::shared_ptr<thread_team> team = nullptr, simd_level level = simd_choice())
        : layout_(layout), grid_(layout.rows() + 1, layout.columns() + 1), key_(key), stream_(s),
          team_(std::move(team)), rows_(corner_rows_for(level)) {
        const auto& runs = layout_.runs();
        const int parts = team_ ? team_->size() : 1;
        cuts_.push_back(0);
        for (int part = 1; part < parts; ++part) {  // first run whose first site reaches the part's share
            const std::int64_t share = layout_.n_sites() * part / parts;
            auto at = std::lower_bound(runs.begin(), runs.end(), share,
                                       [](const corner_run& r, std::int64_t v) { return r.first_site < v; });
            cuts_.push_back(static_cast<std::int64_t>(at - runs.begin()));
        }
        cuts_.push_back(static_cast<std::int64_t>(runs.size()));
    }

    const split_grid& grid() const { return grid_; }
    std::int64_t n_sites() const { return layout_.n_sites(); }
    void sweep(std::int32_t* h, std::int64_t time) const { run(h, nullptr, time); }
    void sweep_pair(std::int32_t* top, std::int32_t* bottom, std::int64_t time) const { run(top, bottom, time); }

private:
    void run(std::int32_t* top, std::int32_t* bottom, std::int64_t time) const {
        const std::uint64_t base = sweep_base(key_, stream_, time);
        const auto& runs = layout_.runs();
        for (std::int32_t parity = 0; parity < 2; ++parity) {
            if (!team_) {
                rows_(runs.data(), static_cast<std::int64_t>(runs.size()), grid_.half_width(), top, bottom, base,
                      parity);
                continue;
            }
            team_->run([&](int part) {
                const std::int64_t first = cuts_[part], last = cuts_[part + 1];
                rows_(runs.data() + first, last - first, grid_.half_width(), top, bottom, base, parity);
            });
        }
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
