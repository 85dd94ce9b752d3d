// Fast kernel for domino heights on the corner grid of any mask.
//
// Heights sit in the (R + 1) x (C + 1) corner array, row-major. The free
// corners (all four cells around them in the region) are listed as runs
// (row, first column, last column); boundary corners keep their fixed heights.
// Thurston's orientation makes the bounds depend only on the corner's parity:
//   r + c odd:  lo = max(left, right) - 1 and max(up, down) - 3, hi = min(left, right) + 3 and min(up, down) + 1;
//   r + c even: the horizontal and vertical offsets swap.
// Colour class (r + c) % 2, class 0 first; site id = rank of the corner among
// free corners in row-major order. The generic lowering uses the same classes
// and ids, so both paths return the identical sample for the same key.
#pragma once
#include <algorithm>
#include <cstdint>
#include <vector>

#include "frostline/errors.hpp"
#include "corner_run.hpp"
#include "frostline/grid_runs.hpp"
#include "frostline/random.hpp"

namespace frostline::domino {

class corner_layout {
public:
    corner_layout(std::int32_t rows, std::int32_t columns, std::vector<corner_run> runs)
        : rows_(rows), columns_(columns), runs_(std::move(runs)) {
        n_sites_ = number_runs(runs_, rows_, columns_, "corners");  // corner rows 0..rows, columns 0..columns
    }

    std::int32_t rows() const { return rows_; }
    std::int32_t columns() const { return columns_; }
    std::int64_t width() const { return columns_ + 1; }
    std::int64_t size() const { return static_cast<std::int64_t>(rows_ + 1) * width(); }
    std::int64_t n_sites() const { return n_sites_; }
    const std::vector<corner_run>& runs() const { return runs_; }

private:
    std::int32_t rows_, columns_;  // of cells
    std::vector<corner_run> runs_;
    std::int64_t n_sites_ = 0;
};

template <class Rule>
class corner_sweeper {
public:
    corner_sweeper(const corner_layout& layout, Rule rule, random_key key, stream s)
        : layout_(layout), rule_(std::move(rule)), key_(key), stream_(s) {}

    std::int64_t n_sites() const { return layout_.n_sites(); }
    const Rule& rule() const { return rule_; }

    void sweep(std::int32_t* h, std::int64_t time) const {
        const std::uint64_t base = sweep_base(key_, stream_, time);
        for (std::int32_t parity = 0; parity < 2; ++parity)
            for (const auto& run : layout_.runs()) update_run<false>(h, nullptr, run, parity, base);
    }

    // Both CFTP chains in one pass, each site's bits computed once.
    void sweep_pair(std::int32_t* top, std::int32_t* bottom, std::int64_t time) const {
        const std::uint64_t base = sweep_base(key_, stream_, time);
        for (std::int32_t parity = 0; parity < 2; ++parity)
            for (const auto& run : layout_.runs()) update_run<true>(top, bottom, run, parity, base);
    }

private:
    // Updates the corners of one parity in a run (of one chain, or of two with shared bits).
    template <bool pair>
    void update_run(std::int32_t* a, std::int32_t* b, const corner_run& run, std::int32_t parity,
                    std::uint64_t base) const {
        const std::int32_t first = run.first + ((run.row + run.first + parity) & 1);
        const bool odd = ((run.row + first) & 1) != 0;
        const std::int32_t h_down = odd ? 1 : 3, v_down = odd ? 3 : 1;  // h >= neighbour - down
        const std::int32_t h_up = 4 - h_down, v_up = 4 - v_down;         // h <= neighbour + up
        const std::int64_t w = layout_.width();
        const std::int64_t row_start = static_cast<std::int64_t>(run.row) * w;
        std::uint64_t site = static_cast<std::uint64_t>(run.first_site + (first - run.first));
        for (std::int32_t c = first; c <= run.last; c += 2, site += 2) {
            const std::int64_t at = row_start + c;
            const std::uint64_t bits = site_bits(base, site);
            a[at] = draw_at(a, at, w, h_down, v_down, h_up, v_up, bits, site);
            if constexpr (pair) b[at] = draw_at(b, at, w, h_down, v_down, h_up, v_up, bits, site);
        }
    }

    std::int32_t draw_at(const std::int32_t* h, std::int64_t at, std::int64_t w, std::int32_t h_down,
                         std::int32_t v_down, std::int32_t h_up, std::int32_t v_up, std::uint64_t bits,
                         std::uint64_t site) const {
        const std::int32_t left = h[at - 1], right = h[at + 1], up = h[at - w], down = h[at + w];
        const std::int32_t lo = std::max(std::max(left, right) - h_down, std::max(up, down) - v_down);
        const std::int32_t hi = std::min(std::min(left, right) + h_up, std::min(up, down) + v_up);
        return rule_.draw(lo, hi, bits, site, h);
    }

    const corner_layout& layout_;
    Rule rule_;
    random_key key_;
    stream stream_;
};

}  // namespace frostline::domino
