// Fast kernel for plane partitions in an a x b x c box (lozenge tilings of the
// a, b, c hexagon). Heights sit in an (a + 2) x (b + 2) row-major array whose
// border holds the box: c above and to the left, 0 below and to the right, so
// the update of cell (r, s) is two loads for each bound and no branches:
//   lo = max(h[r+1][s], h[r][s+1]),  hi = min(h[r-1][s], h[r][s-1]).
// Colour class (r + s) % 2, class 0 first; site id r * b + s. The generic
// lowering in python uses the same classes and ids, so for the same key both
// paths draw the same bits and return the identical sample.
#pragma once
#include <algorithm>
#include <cstdint>
#include <vector>

#include "frostline/random.hpp"

namespace frostline::lozenge {

class box_layout {
public:
    box_layout(std::int32_t a, std::int32_t b, std::int32_t c) : a_(a), b_(b), c_(c) {}

    std::int32_t rows() const { return a_; }
    std::int32_t columns() const { return b_; }
    std::int64_t width() const { return b_ + 2; }
    std::int64_t padded_size() const { return static_cast<std::int64_t>(a_ + 2) * width(); }
    std::int64_t index(std::int32_t r, std::int32_t s) const { return (r + 1) * width() + (s + 1); }

    // The padded array with every cell at `fill`.
    std::vector<std::int32_t> state(std::int32_t fill) const {
        std::vector<std::int32_t> h(static_cast<std::size_t>(padded_size()), 0);
        for (std::int64_t s = 0; s < width(); ++s) h[s] = c_;                       // row above
        for (std::int32_t r = 0; r <= a_; ++r) h[static_cast<std::size_t>((r) * width())] = c_;  // column left
        for (std::int32_t r = 0; r < a_; ++r)
            for (std::int32_t s = 0; s < b_; ++s) h[static_cast<std::size_t>(index(r, s))] = fill;
        return h;
    }

    // Copies the cells (without the border) into `out` (a * b, row-major).
    void cells(const std::vector<std::int32_t>& h, std::int32_t* out) const {
        for (std::int32_t r = 0; r < a_; ++r)
            std::copy_n(h.data() + index(r, 0), b_, out + static_cast<std::int64_t>(r) * b_);
    }

    // The padded array from cells given row-major (a * b).
    std::vector<std::int32_t> from_cells(const std::int32_t* cells) const {
        auto h = state(0);
        for (std::int32_t r = 0; r < a_; ++r)
            std::copy_n(cells + static_cast<std::int64_t>(r) * b_, b_, h.data() + index(r, 0));
        return h;
    }

private:
    std::int32_t a_, b_, c_;
};

template <class Rule>
class box_sweeper {
public:
    box_sweeper(box_layout layout, Rule rule, random_key key, stream s)
        : layout_(layout), rule_(std::move(rule)), key_(key), stream_(s) {}

    std::int64_t n_sites() const { return static_cast<std::int64_t>(layout_.rows()) * layout_.columns(); }

    void sweep(std::int32_t* h, std::int64_t time) const {
        const std::uint64_t base = sweep_base(key_, stream_, time);
        for (std::int32_t parity = 0; parity < 2; ++parity)
            for (std::int32_t r = 0; r < layout_.rows(); ++r) update_row(h, r, parity, base);
    }

    // Both CFTP chains in one pass: each site's random bits are computed once
    // and used by both (the same bits the single-chain sweep would use).
    void sweep_pair(std::int32_t* top, std::int32_t* bottom, std::int64_t time) const {
        const std::uint64_t base = sweep_base(key_, stream_, time);
        const std::int32_t b = layout_.columns();
        const std::int64_t w = layout_.width();
        for (std::int32_t parity = 0; parity < 2; ++parity) {
            for (std::int32_t r = 0; r < layout_.rows(); ++r) {
                std::int32_t* row_t = top + layout_.index(r, 0);
                std::int32_t* row_b = bottom + layout_.index(r, 0);
                const std::uint64_t first_site = static_cast<std::uint64_t>(r) * b;
                for (std::int32_t s = (parity + r) & 1; s < b; s += 2) {
                    const std::int32_t hi_t = std::min(row_t[s - w], row_t[s - 1]);
                    const std::int32_t lo_t = std::max(row_t[s + w], row_t[s + 1]);
                    const std::int32_t hi_b = std::min(row_b[s - w], row_b[s - 1]);
                    const std::int32_t lo_b = std::max(row_b[s + w], row_b[s + 1]);
                    const std::uint64_t site = first_site + s;
                    const std::uint64_t bits = site_bits(base, site);
                    row_t[s] = rule_.draw(lo_t, hi_t, bits, site, top);
                    row_b[s] = rule_.draw(lo_b, hi_b, bits, site, bottom);
                }
            }
        }
    }

private:
    void update_row(std::int32_t* h, std::int32_t r, std::int32_t parity, std::uint64_t base) const {
        const std::int64_t w = layout_.width();
        std::int32_t* row = h + layout_.index(r, 0);
        const std::uint64_t first_site = static_cast<std::uint64_t>(r) * layout_.columns();
        for (std::int32_t s = (parity + r) & 1; s < layout_.columns(); s += 2) {
            const std::int32_t hi = std::min(row[s - w], row[s - 1]);
            const std::int32_t lo = std::max(row[s + w], row[s + 1]);
            row[s] = rule_.draw(lo, hi, site_bits(base, first_site + s), first_site + s, h);
        }
    }

    box_layout layout_;
    Rule rule_;
    random_key key_;
    stream stream_;
};

}  // namespace frostline::lozenge
