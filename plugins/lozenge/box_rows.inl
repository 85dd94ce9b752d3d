// The uniform heat-bath sweep of the plane-partition box on the split-row
// layout (box_geometry.hpp), written as plain loops the compiler vectorises.
//
// Included inside a level's own namespace by box_rows_<level>.cpp, each
// compiled with that level's flags (the rules of frostline/vector/draws.inl).
//
// The draws are those of frostline::uniform_rule with frostline::site_bits,
// bit for bit (frostline/vector/draws.inl, included before this file).

// One class's cells of one half-row: n cells at out[0..n), neighbours at the
// given offsets, random bits of consecutive sites first_key, first_key + step, ...
// (keys are base + (site + 1) * gamma, so step is 2 * gamma).
inline void row_single(std::int32_t* __restrict out, std::int64_t n, std::int64_t w2, std::int64_t left,
                       std::int64_t right, std::uint64_t first_key) {
    const std::int32_t* __restrict up = out - w2;
    const std::int32_t* __restrict down = out + w2;
    const std::int32_t* __restrict lft = out + left;
    const std::int32_t* __restrict rgt = out + right;
    for (std::int64_t k = 0; k < n; ++k) {
        const std::int32_t hi = up[k] < lft[k] ? up[k] : lft[k];
        const std::int32_t lo = down[k] > rgt[k] ? down[k] : rgt[k];
        const std::uint64_t bits = vector_mix(first_key + static_cast<std::uint64_t>(k) * (2 * vector_gamma));
        out[k] = vector_draw(lo, hi, bits, 0);
    }
}

// The same for both CFTP chains, each site's bits computed once.
inline void row_pair(std::int32_t* __restrict top, std::int32_t* __restrict bottom, std::int64_t n,
                     std::int64_t w2, std::int64_t left, std::int64_t right, std::uint64_t first_key) {
    const std::int32_t* __restrict up_t = top - w2;
    const std::int32_t* __restrict down_t = top + w2;
    const std::int32_t* __restrict lft_t = top + left;
    const std::int32_t* __restrict rgt_t = top + right;
    const std::int32_t* __restrict up_b = bottom - w2;
    const std::int32_t* __restrict down_b = bottom + w2;
    const std::int32_t* __restrict lft_b = bottom + left;
    const std::int32_t* __restrict rgt_b = bottom + right;
    for (std::int64_t k = 0; k < n; ++k) {
        const std::uint64_t bits = vector_mix(first_key + static_cast<std::uint64_t>(k) * (2 * vector_gamma));
        const std::int32_t hi_t = up_t[k] < lft_t[k] ? up_t[k] : lft_t[k];
        const std::int32_t lo_t = down_t[k] > rgt_t[k] ? down_t[k] : rgt_t[k];
        const std::int32_t hi_b = up_b[k] < lft_b[k] ? up_b[k] : lft_b[k];
        const std::int32_t lo_b = down_b[k] > rgt_b[k] ? down_b[k] : rgt_b[k];
        top[k] = vector_draw(lo_t, hi_t, bits, 0);
        bottom[k] = vector_draw(lo_b, hi_b, bits, 0);
    }
}

// One uniform sweep at the given base (class 0, then class 1) of one chain,
// or of two when bottom is not null; rows first_row..last_row - 1 only, so
// threads can share a class (rows of one class never touch).
inline void box_uniform_rows(const box_geometry& g, std::int32_t* top, std::int32_t* bottom, std::uint64_t base,
                             std::int32_t parity, std::int32_t first_row, std::int32_t last_row) {
    const std::int64_t w = g.half_width;
    for (std::int32_t r = first_row; r < last_row; ++r) {
        const std::int32_t odd = (parity + r) & 1;  // the class's cells of row r: odd or even columns
        const std::int64_t n = odd ? g.b / 2 : (g.b + 1) / 2;
        if (n == 0) continue;
        const std::int64_t at = ((static_cast<std::int64_t>(r) + 1) * 2 + odd) * w + 1;
        const std::int64_t left = odd ? -w : w - 1;
        const std::int64_t right = odd ? -w + 1 : w;
        const std::uint64_t site = static_cast<std::uint64_t>(r) * static_cast<std::uint64_t>(g.b) + odd;
        const std::uint64_t first_key = base + (site + 1) * vector_gamma;
        if (bottom == nullptr)
            row_single(top + at, n, 2 * w, left, right, first_key);
        else
            row_pair(top + at, bottom + at, n, 2 * w, left, right, first_key);
    }
}

// One q^h sweep's class `parity` of one chain over rows first_row..last_row - 1
// (geometric_draws.inl): bounds of a block of cells, then their draws.
inline void box_geometric_rows(const box_geometry& g, std::int32_t* h, std::uint64_t base, std::int32_t parity,
                               std::int32_t first_row, std::int32_t last_row, const geometric_table& table) {
    const std::int64_t w = g.half_width;
    alignas(64) std::int32_t lo[geometric_block];
    alignas(64) std::int32_t hi[geometric_block];
    for (std::int32_t r = first_row; r < last_row; ++r) {
        const std::int32_t odd = (parity + r) & 1;
        const std::int64_t n = odd ? g.b / 2 : (g.b + 1) / 2;
        const std::int64_t at = ((static_cast<std::int64_t>(r) + 1) * 2 + odd) * w + 1;
        const std::int64_t left = odd ? -w : w - 1;
        const std::int64_t right = odd ? -w + 1 : w;
        const std::uint64_t site = static_cast<std::uint64_t>(r) * static_cast<std::uint64_t>(g.b) + odd;
        for (std::int64_t k0 = 0; k0 < n; k0 += geometric_block) {
            const std::int64_t m = n - k0 < geometric_block ? n - k0 : geometric_block;
            std::int32_t* out = h + at + k0;
            for (std::int64_t k = 0; k < m; ++k) {
                hi[k] = out[k - 2 * w] < out[k + left] ? out[k - 2 * w] : out[k + left];
                lo[k] = out[k + 2 * w] > out[k + right] ? out[k + 2 * w] : out[k + right];
            }
            const std::uint64_t first_key = base + (site + 2 * static_cast<std::uint64_t>(k0) + 1) * vector_gamma;
            geometric_block_draws(out, lo, hi, m, first_key, 2 * vector_gamma, table);
        }
    }
}

// The entry points each level exports (declared in box_rows.hpp).
void geometric_rows(const box_geometry& g, std::int32_t* h, std::uint64_t base, std::int32_t parity,
                    std::int32_t first_row, std::int32_t last_row, const geometric_table& table) {
    box_geometric_rows(g, h, base, parity, first_row, last_row, table);
}

void uniform_rows(const box_geometry& g, std::int32_t* top, std::int32_t* bottom, std::uint64_t base,
                  std::int32_t parity, std::int32_t first_row, std::int32_t last_row) {
    box_uniform_rows(g, top, bottom, base, parity, first_row, last_row);
}
