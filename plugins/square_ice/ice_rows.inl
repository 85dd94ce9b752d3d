// The uniform square-ice sweep on the split corner grid (frostline/split_grid.hpp),
// for the vector levels. Included inside a level's namespace after
// frostline/vector/draws.inl and grid_rows.inl (their rules hold here).
//
// Corners (i, j), 0 <= i, j <= n; the free ones are 1 <= i, j <= n - 1, all
// four neighbours at distance 1 (offsets 1, step 2). Class (i + j) % 2 and
// site id (i - 1) * (n - 1) + (j - 1), as ice_kernel.hpp and the generic
// lowering use them, so every path draws the same bits.

// One sweep's class `parity`, rows first_row..last_row - 1 (within 1..n - 1).
void uniform_rows(std::int32_t n, std::int64_t w, std::int32_t* top, std::int32_t* bottom, std::uint64_t base,
                  std::int32_t parity, std::int32_t first_row, std::int32_t last_row) {
    const grid_offsets unit{1, 1, 1, 1, 1};
    for (std::int32_t i = first_row; i < last_row; ++i) {
        const std::int32_t odd = (parity + i) & 1;  // column parity of this class in row i
        const std::int32_t j0 = odd ? 1 : 2;
        if (j0 > n - 1) continue;
        const std::int64_t count = (n - 1 - j0) / 2 + 1;
        const std::int64_t at = (2 * static_cast<std::int64_t>(i) + odd) * w + (j0 >> 1) + 1;
        const std::int64_t left = odd ? -w : w - 1, right = odd ? -w + 1 : w;
        const std::uint64_t site = static_cast<std::uint64_t>(i - 1) * static_cast<std::uint64_t>(n - 1) + (j0 - 1);
        const std::uint64_t first_key = base + (site + 1) * vector_gamma;
        if (bottom == nullptr)
            grid_row(top + at, count, w, left, right, first_key, 2 * vector_gamma, unit);
        else
            grid_row_pair(top + at, bottom + at, count, w, left, right, first_key, 2 * vector_gamma, unit);
    }
}
