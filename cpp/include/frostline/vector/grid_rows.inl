// Uniform heat-bath rows on a split grid (split_grid.hpp) whose site is bounded
// by its four neighbours with fixed offsets:
//   hi = min(min(up, down) + up_v, min(left, right) + up_h)
//   lo = max(max(up, down) - down_v, max(left, right) - down_h),
// uniform on {lo, lo + 2^shift, ..., hi}. Lattice-free: the square-ice corner
// grid (all offsets 1, step 2) and the domino corner grid (Thurston's offsets
// 1 and 3, step 4) are two uses. Include inside a level's namespace after
// draws.inl (same rules as there).

struct grid_offsets {
    std::int32_t up_v, up_h, down_v, down_h;
    int shift;
    // up + down = step in both directions: then hi - lo <= step (hi - lo <=
    // min(l, r) + up_h - max(l, r) + down_h), so a site has one or two values.
    bool two_valued() const { return up_v + down_v == (1 << shift) && up_h + down_h == (1 << shift); }
};

inline std::int32_t grid_draw(std::int32_t u, std::int32_t d, std::int32_t l, std::int32_t r, std::uint64_t bits,
                              const grid_offsets& o) {
    const std::int32_t v_min = u < d ? u : d, v_max = u > d ? u : d;
    const std::int32_t h_min = l < r ? l : r, h_max = l > r ? l : r;
    const std::int32_t hi = v_min + o.up_v < h_min + o.up_h ? v_min + o.up_v : h_min + o.up_h;
    const std::int32_t lo = v_max - o.down_v > h_max - o.down_h ? v_max - o.down_v : h_max - o.down_h;
    return vector_draw(lo, hi, bits, o.shift);
}

// grid_draw when o.two_valued(): with count = gap / step + 1 in {1, 2},
// floor(bits * count / 2^64) is the top bit of bits when count = 2 and 0
// otherwise, so the draw needs no multiply and gives the identical value.
inline std::int32_t grid_draw_two(std::int32_t u, std::int32_t d, std::int32_t l, std::int32_t r,
                                  std::uint64_t bits, const grid_offsets& o) {
    const std::int32_t v_min = u < d ? u : d, v_max = u > d ? u : d;
    const std::int32_t h_min = l < r ? l : r, h_max = l > r ? l : r;
    const std::int32_t hi = v_min + o.up_v < h_min + o.up_h ? v_min + o.up_v : h_min + o.up_h;
    const std::int32_t lo = v_max - o.down_v > h_max - o.down_h ? v_max - o.down_v : h_max - o.down_h;
    const std::int32_t coin = static_cast<std::int32_t>(bits >> 63);
    return lo + ((coin & ((hi - lo) >> o.shift)) << o.shift);
}

// One class's cells of one half-row of one chain: n cells from out, w = half
// width, the left/right neighbours at out + left, out + right; the bits of
// cell k are vector_mix(first_key + k * key_step). The cells written never
// overlap the neighbours read (other half-rows), hence the restrict pointers.
inline void grid_row(std::int32_t* __restrict out, std::int64_t n, std::int64_t w, std::int64_t left,
                     std::int64_t right, std::uint64_t first_key, std::uint64_t key_step, const grid_offsets& o) {
    const std::int32_t* __restrict up = out - 2 * w;
    const std::int32_t* __restrict down = out + 2 * w;
    const std::int32_t* __restrict lft = out + left;
    const std::int32_t* __restrict rgt = out + right;
    if (o.two_valued()) {
        for (std::int64_t k = 0; k < n; ++k)
            out[k] = grid_draw_two(up[k], down[k], lft[k], rgt[k],
                                   vector_mix(first_key + static_cast<std::uint64_t>(k) * key_step), o);
        return;
    }
    for (std::int64_t k = 0; k < n; ++k)
        out[k] = grid_draw(up[k], down[k], lft[k], rgt[k],
                           vector_mix(first_key + static_cast<std::uint64_t>(k) * key_step), o);
}

// The same for both CFTP chains, each cell's bits computed once.
inline void grid_row_pair(std::int32_t* __restrict top, std::int32_t* __restrict bottom, std::int64_t n,
                          std::int64_t w, std::int64_t left, std::int64_t right, std::uint64_t first_key,
                          std::uint64_t key_step, const grid_offsets& o) {
    const std::int32_t* __restrict up_t = top - 2 * w;
    const std::int32_t* __restrict down_t = top + 2 * w;
    const std::int32_t* __restrict lft_t = top + left;
    const std::int32_t* __restrict rgt_t = top + right;
    const std::int32_t* __restrict up_b = bottom - 2 * w;
    const std::int32_t* __restrict down_b = bottom + 2 * w;
    const std::int32_t* __restrict lft_b = bottom + left;
    const std::int32_t* __restrict rgt_b = bottom + right;
    if (o.two_valued()) {
        for (std::int64_t k = 0; k < n; ++k) {
            const std::uint64_t bits = vector_mix(first_key + static_cast<std::uint64_t>(k) * key_step);
            top[k] = grid_draw_two(up_t[k], down_t[k], lft_t[k], rgt_t[k], bits, o);
            bottom[k] = grid_draw_two(up_b[k], down_b[k], lft_b[k], rgt_b[k], bits, o);
        }
        return;
    }
    for (std::int64_t k = 0; k < n; ++k) {
        const std::uint64_t bits = vector_mix(first_key + static_cast<std::uint64_t>(k) * key_step);
        top[k] = grid_draw(up_t[k], down_t[k], lft_t[k], rgt_t[k], bits, o);
        bottom[k] = grid_draw(up_b[k], down_b[k], lft_b[k], rgt_b[k], bits, o);
    }
}
