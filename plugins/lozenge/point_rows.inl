// The uniform heat-bath sweep of lozenge heights on lattice points, any
// simply connected region, on the three-part split grid (frostline/split_grid.hpp),
// for the vector levels. Included inside a level's namespace after
// frostline/vector/draws.inl (its rules hold here).
//
// Grid cell (i, j) is the lattice point (x, y) = (i + ox, j + oy); heights
// step 3. Along the edge directions d = (1, 0), (-1, 1), (0, -1) the height
// rises by 1 or falls by 2 (lozenge/geometry.py), so a free point p reads
//   forward neighbours p + d:  lo >= h - 1, hi <= h + 2,
//   backward neighbours p - d: lo >= h - 2, hi <= h + 1,
// and draws uniformly on {lo, lo + 3, ..., hi}. Class (x - y) % 3, classes in
// increasing order; site ids are ranks of free points in row-major order, so
// one class's sites in a run step by 3. The same as the generic lowering of
// LozengeRegion, bit for bit.

// Offsets of the six neighbours of a site in a column of residue m, in the order
// forward (+1, 0), (-1, +1), (0, -1), backward (-1, 0), (+1, -1), (0, +1).
struct point_offsets {
    std::int64_t f0, f1, f2, b0, b1, b2;
};

inline std::int32_t max3(std::int32_t a, std::int32_t b, std::int32_t c) {
    const std::int32_t m = a > b ? a : b;
    return m > c ? m : c;
}

inline std::int32_t min3(std::int32_t a, std::int32_t b, std::int32_t c) {
    const std::int32_t m = a < b ? a : b;
    return m < c ? m : c;
}

inline std::int32_t point_draw(std::int32_t f0, std::int32_t f1, std::int32_t f2, std::int32_t b0, std::int32_t b1,
                               std::int32_t b2, std::uint64_t bits) {
    const std::int32_t f_max = max3(f0, f1, f2), f_min = min3(f0, f1, f2);
    const std::int32_t b_max = max3(b0, b1, b2), b_min = min3(b0, b1, b2);
    const std::int32_t lo = f_max - 1 > b_max - 2 ? f_max - 1 : b_max - 2;
    const std::int32_t hi = f_min + 2 < b_min + 1 ? f_min + 2 : b_min + 1;
    return vector_draw_step3(lo, hi, bits);
}

// The six neighbour rows of a run of sites starting at p.
struct point_neighbours {
    const std::int32_t* __restrict f0;
    const std::int32_t* __restrict f1;
    const std::int32_t* __restrict f2;
    const std::int32_t* __restrict b0;
    const std::int32_t* __restrict b1;
    const std::int32_t* __restrict b2;
};

inline point_neighbours neighbours_of(const std::int32_t* p, const point_offsets& o) {
    return {p + o.f0, p + o.f1, p + o.f2, p + o.b0, p + o.b1, p + o.b2};
}

// n sites of one chain from out. The sites written (one sub-row) never
// overlap the neighbours read (the other sub-rows of the row and the rows
// beside it): hence the restrict pointers, which let the loop vectorise.
inline void point_row(std::int32_t* __restrict out, point_neighbours nb, std::int64_t n, std::uint64_t first_key) {
    for (std::int64_t k = 0; k < n; ++k) {
        const std::uint64_t bits = vector_mix(first_key + static_cast<std::uint64_t>(k) * (3 * vector_gamma));
        out[k] = point_draw(nb.f0[k], nb.f1[k], nb.f2[k], nb.b0[k], nb.b1[k], nb.b2[k], bits);
    }
}

// Both CFTP chains, each site's bits computed once.
inline void point_row_pair(std::int32_t* __restrict top, std::int32_t* __restrict bottom, point_neighbours t,
                           point_neighbours b, std::int64_t n, std::uint64_t first_key) {
    for (std::int64_t k = 0; k < n; ++k) {
        const std::uint64_t bits = vector_mix(first_key + static_cast<std::uint64_t>(k) * (3 * vector_gamma));
        top[k] = point_draw(t.f0[k], t.f1[k], t.f2[k], t.b0[k], t.b1[k], t.b2[k], bits);
        bottom[k] = point_draw(b.f0[k], b.f1[k], b.f2[k], b.b0[k], b.b1[k], b.b2[k], bits);
    }
}

// One sweep's class `k` over runs[0..n_runs) of a grid of `parts` = 3 sub-rows of width w.
// shift = (ox - oy) mod 3: the class of grid cell (i, j) is (i - j + shift) mod 3.
void uniform_runs(const grid_run* runs, std::int64_t n_runs, std::int64_t w, std::int32_t shift,
                  std::int32_t* top, std::int32_t* bottom, std::uint64_t base, std::int32_t k) {
    for (std::int64_t r = 0; r < n_runs; ++r) {
        const grid_run& run = runs[r];
        // columns j of this class: (row - j + shift - k) = 0 mod 3
        const std::int32_t m = static_cast<std::int32_t>(((run.row + shift - k) % 3 + 3) % 3);  // j = m (mod 3)
        const std::int32_t first = run.first + ((m - run.first) % 3 + 3) % 3;
        if (first > run.last) continue;
        const std::int64_t n = (run.last - first) / 3 + 1;
        // the offsets of grid_split::offset(m, di, dj), written out for three parts
        auto offset = [w, m](std::int64_t di, std::int64_t dj) {
            const std::int64_t j = 3 + m, i = 1;
            const std::int64_t from = (3 * i + j % 3) * w + j / 3;
            const std::int64_t to = (3 * (i + di) + (j + dj) % 3) * w + (j + dj) / 3;
            return to - from;
        };
        const point_offsets o{offset(1, 0), offset(-1, 1), offset(0, -1), offset(-1, 0), offset(1, -1), offset(0, 1)};
        const std::int64_t at = (3 * static_cast<std::int64_t>(run.row) + m) * w + first / 3 + 1;
        const std::uint64_t site = static_cast<std::uint64_t>(run.first_site + (first - run.first));
        const std::uint64_t first_key = base + (site + 1) * vector_gamma;
        if (bottom == nullptr)
            point_row(top + at, neighbours_of(top + at, o), n, first_key);
        else
            point_row_pair(top + at, bottom + at, neighbours_of(top + at, o), neighbours_of(bottom + at, o), n,
                           first_key);
    }
}
