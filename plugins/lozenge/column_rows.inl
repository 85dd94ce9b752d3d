// The uniform heat-bath sweep of cube-column heights (column_kernel.hpp) on the
// two-part split grid (frostline/split_grid.hpp), for the vector levels.
// Included inside a level's namespace after frostline/vector/draws.inl (its
// rules hold here).
//
// Cell (r, s) holds the height of one cube column; heights do not increase
// along r or s, and each cell has its own floor and cap (the columns of
// Thurston's least and greatest tilings), so
//   hi = min(h[r - 1][s], h[r][s - 1], cap),  lo = max(h[r + 1][s], h[r][s + 1], floor),
// uniform on {lo, ..., hi}: the plane-partition box kernel with two more loads.
// Class (r + s) % 2, class 0 first; site ids are ranks of free cells in
// row-major order, so one class's sites in a run step by 2. The same as the
// generic lowering in lozenge/columns.py, bit for bit.

inline std::int32_t column_draw(std::int32_t up, std::int32_t left, std::int32_t cap, std::int32_t down,
                                std::int32_t right, std::int32_t floor, std::uint64_t bits) {
    std::int32_t hi = up < left ? up : left;
    hi = hi < cap ? hi : cap;
    std::int32_t lo = down > right ? down : right;
    lo = lo > floor ? lo : floor;
    return vector_draw(lo, hi, bits, 0);
}

// n cells of one class of one sub-row from out (bounds at the same offsets in
// floor and cap); the cells written never overlap the neighbours read (other
// sub-rows), hence the restrict pointers.
inline void column_row(std::int32_t* __restrict out, const std::int32_t* __restrict floor,
                       const std::int32_t* __restrict cap, std::int64_t n, std::int64_t w, std::int64_t left,
                       std::int64_t right, std::uint64_t first_key) {
    const std::int32_t* __restrict up = out - 2 * w;
    const std::int32_t* __restrict down = out + 2 * w;
    const std::int32_t* __restrict lft = out + left;
    const std::int32_t* __restrict rgt = out + right;
    for (std::int64_t k = 0; k < n; ++k)
        out[k] = column_draw(up[k], lft[k], cap[k], down[k], rgt[k], floor[k],
                             vector_mix(first_key + static_cast<std::uint64_t>(k) * (2 * vector_gamma)));
}

// Both CFTP chains, each cell's bits computed once.
inline void column_row_pair(std::int32_t* __restrict top, std::int32_t* __restrict bottom,
                            const std::int32_t* __restrict floor, const std::int32_t* __restrict cap, std::int64_t n,
                            std::int64_t w, std::int64_t left, std::int64_t right, std::uint64_t first_key) {
    const std::int32_t* __restrict up_t = top - 2 * w;
    const std::int32_t* __restrict down_t = top + 2 * w;
    const std::int32_t* __restrict lft_t = top + left;
    const std::int32_t* __restrict rgt_t = top + right;
    const std::int32_t* __restrict up_b = bottom - 2 * w;
    const std::int32_t* __restrict down_b = bottom + 2 * w;
    const std::int32_t* __restrict lft_b = bottom + left;
    const std::int32_t* __restrict rgt_b = bottom + right;
    for (std::int64_t k = 0; k < n; ++k) {
        const std::uint64_t bits = vector_mix(first_key + static_cast<std::uint64_t>(k) * (2 * vector_gamma));
        top[k] = column_draw(up_t[k], lft_t[k], cap[k], down_t[k], rgt_t[k], floor[k], bits);
        bottom[k] = column_draw(up_b[k], lft_b[k], cap[k], down_b[k], rgt_b[k], floor[k], bits);
    }
}

// One sweep's class `parity` over runs[0..n_runs) (split grid of half width w).
void column_uniform_runs(const grid_run* runs, std::int64_t n_runs, std::int64_t w, std::int32_t* top,
                         std::int32_t* bottom, const std::int32_t* floor, const std::int32_t* cap, std::uint64_t base,
                         std::int32_t parity) {
    for (std::int64_t k = 0; k < n_runs; ++k) {
        const grid_run& run = runs[k];
        const std::int32_t first = run.first + ((run.row + run.first + parity) & 1);
        if (first > run.last) continue;
        const std::int64_t count = (run.last - first) / 2 + 1;
        const std::int64_t col_odd = first & 1;
        const std::int64_t at = (2 * static_cast<std::int64_t>(run.row) + col_odd) * w + (first >> 1) + 1;
        const std::int64_t left = col_odd ? -w : w - 1, right = col_odd ? -w + 1 : w;
        const std::uint64_t site = static_cast<std::uint64_t>(run.first_site + (first - run.first));
        const std::uint64_t first_key = base + (site + 1) * vector_gamma;
        if (bottom == nullptr)
            column_row(top + at, floor + at, cap + at, count, w, left, right, first_key);
        else
            column_row_pair(top + at, bottom + at, floor + at, cap + at, count, w, left, right, first_key);
    }
}

// One q^h sweep's class `parity` of one chain over runs[0..n_runs)
// (geometric_draws.inl): bounds of a block of cells, then their draws.
void column_geometric_runs(const grid_run* runs, std::int64_t n_runs, std::int64_t w, std::int32_t* h,
                           const std::int32_t* floor, const std::int32_t* cap, std::uint64_t base,
                           std::int32_t parity, const geometric_table& table) {
    alignas(64) std::int32_t lo[geometric_block];
    alignas(64) std::int32_t hi[geometric_block];
    for (std::int64_t r = 0; r < n_runs; ++r) {
        const grid_run& run = runs[r];
        const std::int32_t first = run.first + ((run.row + run.first + parity) & 1);
        if (first > run.last) continue;
        const std::int64_t count = (run.last - first) / 2 + 1;
        const std::int64_t col_odd = first & 1;
        const std::int64_t at = (2 * static_cast<std::int64_t>(run.row) + col_odd) * w + (first >> 1) + 1;
        const std::int64_t left = col_odd ? -w : w - 1, right = col_odd ? -w + 1 : w;
        const std::uint64_t site = static_cast<std::uint64_t>(run.first_site + (first - run.first));
        for (std::int64_t k0 = 0; k0 < count; k0 += geometric_block) {
            const std::int64_t m = count - k0 < geometric_block ? count - k0 : geometric_block;
            std::int32_t* out = h + at + k0;
            const std::int32_t* f = floor + at + k0;
            const std::int32_t* c = cap + at + k0;
            for (std::int64_t k = 0; k < m; ++k) {
                std::int32_t top = out[k - 2 * w] < out[k + left] ? out[k - 2 * w] : out[k + left];
                std::int32_t bottom = out[k + 2 * w] > out[k + right] ? out[k + 2 * w] : out[k + right];
                hi[k] = top < c[k] ? top : c[k];
                lo[k] = bottom > f[k] ? bottom : f[k];
            }
            const std::uint64_t first_key = base + (site + 2 * static_cast<std::uint64_t>(k0) + 1) * vector_gamma;
            geometric_block_draws(out, lo, hi, m, first_key, 2 * vector_gamma, table);
        }
    }
}
