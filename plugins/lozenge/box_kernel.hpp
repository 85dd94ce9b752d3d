// Fast kernel for plane partitions in an a x b x c box (lozenge tilings of the
// a, b, c hexagon), on the split-row layout of box_geometry.hpp: the update of
// cell (r, s) is two loads for each bound and no branches,
//   lo = max(h[r+1][s], h[r][s+1]),  hi = min(h[r-1][s], h[r][s-1]).
// Colour class (r + s) % 2, class 0 first; site id r * b + s. Cells of one
// class never neighbour each other, so the order inside a class (and how its
// rows are shared among threads) cannot change the result; the generic
// lowering in Python uses the same classes and ids, so for the same key every
// path draws the same bits and returns the identical sample. The uniform and
// q^volume rules run the vector row kernels (box_rows.inl), any other rule a
// scalar loop.
#pragma once
#include <algorithm>
#include <cstdint>
#include <memory>
#include <type_traits>
#include <vector>

#include "box_geometry.hpp"
#include "box_rows.hpp"
#include "frostline/local_rule.hpp"
#include "frostline/random.hpp"
#include "frostline/thread_team.hpp"

namespace frostline::lozenge {

class box_layout {
public:
    box_layout(std::int32_t a, std::int32_t b, std::int32_t c)
        : g_{a, b, c, static_cast<std::int64_t>(b + 1) / 2 + 2} {}

    const box_geometry& geometry() const { return g_; }
    std::int32_t rows() const { return g_.a; }
    std::int32_t columns() const { return g_.b; }
    std::int64_t padded_size() const { return (static_cast<std::int64_t>(g_.a) + 2) * 2 * g_.half_width; }
    std::int64_t index(std::int32_t r, std::int32_t s) const {
        return ((static_cast<std::int64_t>(r) + 1) * 2 + (s & 1)) * g_.half_width + (s >> 1) + 1;
    }

    // The padded array with every cell at `fill` and the border of the box.
    std::vector<std::int32_t> state(std::int32_t fill) const {
        std::vector<std::int32_t> h(static_cast<std::size_t>(padded_size()), 0);
        const std::int64_t w = g_.half_width;
        std::fill_n(h.begin(), 2 * w, g_.c);  // the row above
        for (std::int32_t r = 0; r < g_.a; ++r) {
            h[static_cast<std::size_t>(index(r, 0) - 1)] = g_.c;  // front pads: the column to the left
            h[static_cast<std::size_t>(index(r, 1) - 1)] = g_.c;
            for (std::int32_t s = 0; s < g_.b; ++s) h[static_cast<std::size_t>(index(r, s))] = fill;
        }
        return h;
    }

    // Copies the cells into `out` (a * b, row-major).
    void cells(const std::int32_t* h, std::int32_t* out) const {
        for (std::int32_t r = 0; r < g_.a; ++r)
            for (std::int32_t s = 0; s < g_.b; ++s) *out++ = h[index(r, s)];
    }

    // The padded array from cells given row-major (a * b).
    std::vector<std::int32_t> from_cells(const std::int32_t* cells) const {
        auto h = state(0);
        for (std::int32_t r = 0; r < g_.a; ++r)
            for (std::int32_t s = 0; s < g_.b; ++s) h[static_cast<std::size_t>(index(r, s))] = *cells++;
        return h;
    }

private:
    box_geometry g_;
};

template <class Rule>
class box_sweeper {
public:
    // team: threads that share each colour class (uniform rule only; null: the calling thread alone).
    box_sweeper(box_layout layout, Rule rule, random_key key, stream s, std::shared_ptr<thread_team> team = nullptr,
                simd_level level = simd_choice())
        : layout_(layout), rule_(std::move(rule)), key_(key), stream_(s), team_(std::move(team)),
          rows_(box_rows_for(level)), geometric_rows_(box_geometric_for(level)) {}

    std::int64_t n_sites() const { return static_cast<std::int64_t>(layout_.rows()) * layout_.columns(); }

    void sweep(std::int32_t* h, std::int64_t time) const { run(h, nullptr, time); }

    // Both CFTP chains in one pass: each site's random bits are computed once
    // and used by both (the same bits the single-chain sweep would use).
    void sweep_pair(std::int32_t* top, std::int32_t* bottom, std::int64_t time) const { run(top, bottom, time); }

private:
    void run(std::int32_t* top, std::int32_t* bottom, std::int64_t time) const {
        const std::uint64_t base = sweep_base(key_, stream_, time);
        for (std::int32_t parity = 0; parity < 2; ++parity) {
            if constexpr (std::is_same_v<Rule, uniform_rule>) {
                for_blocks(team_, layout_.rows(), [&](std::int64_t first, std::int64_t last) {
                    rows_(layout_.geometry(), top, bottom, base, parity, static_cast<std::int32_t>(first),
                          static_cast<std::int32_t>(last));
                });
            } else if constexpr (std::is_same_v<Rule, geometric_rule>) {
                // q^volume: the vector draws of geometric_draws.inl, the same values as rule_.draw
                // (the table is taken here, not kept: a copied sweeper must read its own rule's table)
                const geometric_table table = table_of(rule_);
                for_blocks(team_, layout_.rows(), [&](std::int64_t first, std::int64_t last) {
                    const auto a = static_cast<std::int32_t>(first), b = static_cast<std::int32_t>(last);
                    geometric_rows_(layout_.geometry(), top, base, parity, a, b, table);
                    if (bottom != nullptr) geometric_rows_(layout_.geometry(), bottom, base, parity, a, b, table);
                });
            } else {
                for (std::int32_t r = 0; r < layout_.rows(); ++r) {
                    scalar_row(top, r, parity, base);
                    if (bottom != nullptr) scalar_row(bottom, r, parity, base);
                }
            }
        }
    }

    // Any rule: one class's cells of row r, one at a time.
    void scalar_row(std::int32_t* h, std::int32_t r, std::int32_t parity, std::uint64_t base) const {
        const std::int64_t w = layout_.geometry().half_width;
        const std::uint64_t first_site = static_cast<std::uint64_t>(r) * layout_.columns();
        for (std::int32_t s = (parity + r) & 1; s < layout_.columns(); s += 2) {
            const std::int64_t i = layout_.index(r, s);
            const std::int64_t left = (s & 1) ? i - w : i + w - 1, right = (s & 1) ? i - w + 1 : i + w;
            const std::int32_t hi = std::min(h[i - 2 * w], h[left]);
            const std::int32_t lo = std::max(h[i + 2 * w], h[right]);
            h[i] = rule_.draw(lo, hi, site_bits(base, first_site + s), first_site + s, h);
        }
    }

    box_layout layout_;
    Rule rule_;
    random_key key_;
    stream stream_;
    std::shared_ptr<thread_team> team_;
    box_rows_function rows_;
    box_geometric_function geometric_rows_;
};

}  // namespace frostline::lozenge
