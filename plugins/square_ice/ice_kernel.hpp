// Fast kernel for square ice (six-vertex) heights on the (n+1) x (n+1) corner grid.
//
// Neighbouring corners differ by exactly 1, so a free corner has two allowed
// heights (m - 1, m + 1) when its four neighbours all equal m, and one
// otherwise. Vertex weights (a, b, c) make the chance of the higher value
// depend on the four diagonal corners, read as a 4-bit pattern
// (NW, NE, SW, SE; bit set when the corner lies above m) and looked up in a
// table of uint64 thresholds; without a table the two values are equally
// likely (the uniform rule of the engine, step 2). Colour classes are
// 2 * (i % 2) + (j % 2), in increasing order, so no two corners of a class
// touch even diagonally (uniform weights read no diagonals: then two classes,
// (i + j) % 2, fewer passes); every corner off the border is free, and its site id
// is (i - 1) * (n - 1) + (j - 1), its rank in row-major order. The generic lowering uses the same classes, ids, pattern and table,
// so both paths return the identical sample for the same key.
#pragma once
#include <algorithm>
#include <cstdint>
#include <vector>

#include "frostline/local_rule.hpp"
#include "frostline/random.hpp"

namespace frostline::square_ice {

class ice_sweeper {
public:
    // table: 16 thresholds, or empty for uniform weights.
    ice_sweeper(std::int32_t n, std::vector<std::uint64_t> table, random_key key, stream s)
        : n_(n), table_(std::move(table)), key_(key), stream_(s), uniform_(2),
          n_sites_(static_cast<std::int64_t>(n - 1) * (n - 1)) {}

    std::int64_t n_sites() const { return n_sites_; }
    std::int64_t wide_intervals() const { return 0; }

    void sweep(std::int32_t* h, std::int64_t time) const { run<false>(h, nullptr, time); }
    void sweep_pair(std::int32_t* top, std::int32_t* bottom, std::int64_t time) const { run<true>(top, bottom, time); }

private:
    template <bool pair>
    void run(std::int32_t* a, std::int32_t* b, std::int64_t time) const {
        const std::uint64_t base = sweep_base(key_, stream_, time);
        if (table_.empty()) {  // uniform: two classes, (i + j) % 2, as the generic lowering uses then
            for (std::int32_t parity = 0; parity < 2; ++parity)
                for (std::int32_t i = 1; i < n_; ++i) update_row<pair>(a, b, i, 1 + ((i + 1 + parity) & 1), base);
            return;
        }
        for (std::int32_t colour = 0; colour < 4; ++colour)
            for (std::int32_t i = 1 + ((colour >> 1) ^ 1); i < n_; i += 2)
                update_row<pair>(a, b, i, 1 + ((colour & 1) ^ 1), base);
    }

    // Every other corner of row i from column `first` on (one colour class's share of the row).
    template <bool pair>
    void update_row(std::int32_t* a, std::int32_t* b, std::int32_t i, std::int32_t first, std::uint64_t base) const {
        const std::int64_t w = n_ + 1;
        std::uint64_t site = static_cast<std::uint64_t>(i - 1) * (n_ - 1) + (first - 1);
        for (std::int32_t j = first; j < n_; j += 2, site += 2) {
            const std::int64_t at = static_cast<std::int64_t>(i) * w + j;
            const std::uint64_t bits = site_bits(base, site);
            a[at] = draw(a, at, w, bits);
            if constexpr (pair) b[at] = draw(b, at, w, bits);
        }
    }

    std::int32_t draw(const std::int32_t* h, std::int64_t at, std::int64_t w, std::uint64_t bits) const {
        const std::int32_t up = h[at - w], down = h[at + w], left = h[at - 1], right = h[at + 1];
        const std::int32_t lo = std::max(std::max(up, down), std::max(left, right)) - 1;
        const std::int32_t hi = std::min(std::min(up, down), std::min(left, right)) + 1;
        if (table_.empty()) return uniform_.draw(lo, hi, bits, 0, h);
        if (lo == hi) return lo;
        const std::int64_t twice_mid = static_cast<std::int64_t>(lo) + hi;
        const std::uint32_t pattern = (2 * static_cast<std::int64_t>(h[at - w - 1]) > twice_mid) |
                                      (2 * static_cast<std::int64_t>(h[at - w + 1]) > twice_mid) << 1 |
                                      (2 * static_cast<std::int64_t>(h[at + w - 1]) > twice_mid) << 2 |
                                      (2 * static_cast<std::int64_t>(h[at + w + 1]) > twice_mid) << 3;
        return bits < table_[pattern] ? hi : lo;
    }

    std::int32_t n_;
    std::vector<std::uint64_t> table_;
    random_key key_;
    stream stream_;
    uniform_rule uniform_;
    std::int64_t n_sites_;
};

}  // namespace frostline::square_ice
