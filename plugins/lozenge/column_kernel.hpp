// Cube-column kernel of general lozenge regions: every tiling of a region
// whose boundary heights extend to the whole plane is a stepped surface, the
// boundary of an order ideal of Z^3, so it is a grid of cube-column heights
// that do not increase along rows or columns and lie between the columns of
// Thurston's least and greatest tilings (docs/column_form.md; the Python side
// builds the grid in lozenge/columns.py).
//
// Layout: the rows x columns grid on the two-part split layout
// (frostline/split_grid.hpp); free cells (floor < cap) as runs strictly
// inside the grid; every other cell keeps its value, which never binds a free
// neighbour. The least and greatest grids are the CFTP start states and also
// the per-cell floor and cap. Colour class (r + s) % 2, class 0 first; site id
// = rank of the cell among free cells in row-major order (the generic
// lowering uses the same, so every path gives the identical sample).
#pragma once
#include <algorithm>
#include <cstdint>
#include <limits>
#include <memory>
#include <type_traits>
#include <vector>

#include "frostline/errors.hpp"
#include "frostline/geometric_table.hpp"
#include "frostline/grid_run.hpp"
#include "frostline/grid_runs.hpp"
#include "frostline/local_rule.hpp"
#include "frostline/random.hpp"
#include "frostline/simd.hpp"
#include "frostline/split_grid.hpp"
#include "frostline/thread_team.hpp"

namespace frostline::lozenge {

FROSTLINE_DECLARE_LEVELS(void, column_uniform_runs,
                         (const grid_run* runs, std::int64_t n_runs, std::int64_t w, std::int32_t* top,
                          std::int32_t* bottom, const std::int32_t* floor, const std::int32_t* cap,
                          std::uint64_t base, std::int32_t parity))

using column_rows_function = void (*)(const grid_run*, std::int64_t, std::int64_t, std::int32_t*, std::int32_t*,
                                      const std::int32_t*, const std::int32_t*, std::uint64_t, std::int32_t);

inline column_rows_function column_rows_for(simd_level level) {
    return FROSTLINE_PICK_LEVEL(level, column_uniform_runs);
}

FROSTLINE_DECLARE_LEVELS(void, column_geometric_runs,
                         (const grid_run* runs, std::int64_t n_runs, std::int64_t w, std::int32_t* h,
                          const std::int32_t* floor, const std::int32_t* cap, std::uint64_t base,
                          std::int32_t parity, const geometric_table& table))

using column_geometric_function = void (*)(const grid_run*, std::int64_t, std::int64_t, std::int32_t*,
                                           const std::int32_t*, const std::int32_t*, std::uint64_t, std::int32_t,
                                           const geometric_table&);

inline column_geometric_function column_geometric_for(simd_level level) {
    return FROSTLINE_PICK_LEVEL(level, column_geometric_runs);
}

// The grid, its runs and the per-cell bounds (split layout), checked.
class column_layout {
public:
    column_layout(std::int32_t rows, std::int32_t columns, std::vector<grid_run> runs, const std::int32_t* least,
                  const std::int32_t* greatest)
        : grid_(rows, columns, 2), runs_(std::move(runs)) {
        n_sites_ = number_runs(runs_, rows - 1, columns - 1, "cube columns");
        floor_ = grid_.split(least);
        cap_ = grid_.split(greatest);
        const std::int64_t size = static_cast<std::int64_t>(rows) * columns;
        std::vector<char> in_run(static_cast<std::size_t>(size), 0);
        for (const auto& run : runs_)
            std::fill_n(in_run.begin() + static_cast<std::int64_t>(run.row) * columns + run.first,
                        run.last - run.first + 1, 1);
        for (std::int64_t i = 0; i < size; ++i) {
            if (least[i] > greatest[i]) throw invalid_model("the least column grid lies above the greatest somewhere");
            // a cell no sweep visits must be fixed, or the two chains could never meet
            if (!in_run[static_cast<std::size_t>(i)] && least[i] != greatest[i])
                throw invalid_model("a cell outside the runs has least < greatest: it would never move");
            lowest_ = std::min(lowest_, least[i]);
            highest_ = std::max(highest_, greatest[i]);
        }
    }

    const split_grid& grid() const { return grid_; }
    const std::vector<grid_run>& runs() const { return runs_; }
    std::int64_t n_sites() const { return n_sites_; }
    const std::vector<std::int32_t>& floor() const { return floor_; }
    const std::vector<std::int32_t>& cap() const { return cap_; }
    // The range of the least and greatest grids: every height the chains can visit.
    std::int32_t lowest() const { return lowest_; }
    std::int32_t highest() const { return highest_; }

private:
    split_grid grid_;
    std::vector<grid_run> runs_;
    std::int64_t n_sites_ = 0;
    std::vector<std::int32_t> floor_, cap_;
    std::int32_t lowest_ = std::numeric_limits<std::int32_t>::max();
    std::int32_t highest_ = std::numeric_limits<std::int32_t>::min();
};

template <class Rule>
class column_sweeper {
public:
    // team: threads that share each colour class, each a block of runs of about equal site count.
    column_sweeper(const column_layout& layout, Rule rule, random_key key, stream s,
                   std::shared_ptr<thread_team> team = nullptr, simd_level level = simd_choice())
        : layout_(layout), rule_(std::move(rule)), key_(key), stream_(s), team_(std::move(team)),
          rows_(column_rows_for(level)), geometric_rows_(column_geometric_for(level)) {
        cuts_ = balanced_cuts(layout_.runs(), layout_.n_sites(), team_ ? team_->size() : 1);
    }

    std::int64_t n_sites() const { return layout_.n_sites(); }
    void sweep(std::int32_t* h, std::int64_t time) const { run(h, nullptr, time); }
    // Both CFTP chains in one pass, each site's bits computed once.
    void sweep_pair(std::int32_t* top, std::int32_t* bottom, std::int64_t time) const { run(top, bottom, time); }

private:
    void run(std::int32_t* top, std::int32_t* bottom, std::int64_t time) const {
        const std::uint64_t base = sweep_base(key_, stream_, time);
        const auto& runs = layout_.runs();
        const std::int64_t w = layout_.grid().half_width();
        for (std::int32_t parity = 0; parity < 2; ++parity)
            for_cut_blocks(team_, cuts_, [&](std::int64_t first, std::int64_t last) {
                if constexpr (std::is_same_v<Rule, uniform_rule>) {
                    rows_(runs.data() + first, last - first, w, top, bottom, layout_.floor().data(),
                          layout_.cap().data(), base, parity);
                } else if constexpr (std::is_same_v<Rule, geometric_rule>) {
                    // q^volume: the vector draws, the same values as rule_.draw (the table is read from this
                    // sweeper's own rule: a copied sweeper must not read another's)
                    const geometric_table table = table_of(rule_);
                    for (std::int32_t* h : {top, bottom})
                        if (h != nullptr)
                            geometric_rows_(runs.data() + first, last - first, w, h, layout_.floor().data(),
                                            layout_.cap().data(), base, parity, table);
                } else {
                    for (std::int64_t k = first; k < last; ++k) {
                        scalar_run(top, runs[static_cast<std::size_t>(k)], parity, base);
                        if (bottom != nullptr) scalar_run(bottom, runs[static_cast<std::size_t>(k)], parity, base);
                    }
                }
            });
    }

    // Any rule (the q^volume heat bath): one class's cells of a run, one at a time.
    void scalar_run(std::int32_t* h, const grid_run& run, std::int32_t parity, std::uint64_t base) const {
        const auto& g = layout_.grid();
        const std::int64_t w = g.half_width();
        const std::int32_t* floor = layout_.floor().data();
        const std::int32_t* cap = layout_.cap().data();
        const std::int32_t first = run.first + ((run.row + run.first + parity) & 1);
        std::uint64_t site = static_cast<std::uint64_t>(run.first_site + (first - run.first));
        for (std::int32_t s = first; s <= run.last; s += 2, site += 2) {
            const std::int64_t i = g.index(run.row, s);
            const std::int64_t left = (s & 1) ? i - w : i + w - 1, right = (s & 1) ? i - w + 1 : i + w;
            const std::int32_t hi = std::min({h[i - 2 * w], h[left], cap[i]});
            const std::int32_t lo = std::max({h[i + 2 * w], h[right], floor[i]});
            h[i] = rule_.draw(lo, hi, site_bits(base, site), site, h);
        }
    }

    const column_layout& layout_;
    Rule rule_;
    random_key key_;
    stream stream_;
    std::shared_ptr<thread_team> team_;
    std::vector<std::int64_t> cuts_;  // runs cuts_[p]..cuts_[p + 1] - 1 belong to part p
    column_rows_function rows_;
    column_geometric_function geometric_rows_;
};

}  // namespace frostline::lozenge
