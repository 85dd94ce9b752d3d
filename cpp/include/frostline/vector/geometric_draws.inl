// Heat-bath draws for the weight q^h (frostline::geometric_rule, step 1)
// written for vector units, bit for bit those of geometric_rule::draw fed by
// site_bits. Include inside a level's namespace after draws.inl (same rules).
//
// The scalar rule inverts the CDF by a binary search whose length varies
// from site to site. Here a block of sites first computes its targets, then
// runs a fixed number of bisection passes over the whole block (a site whose
// search is over stops moving), each pass one loop of gathers and selects the
// compiler vectorises; the same comparisons in the same order give the same
// index. A search on [lo, hi] ends within ceil(log2(hi - lo + 1)) steps, so
// the block's widest interval sets the number of passes. No FMA can creep in: the kernels build with -ffp-contract=off.

// The rule's table: frostline::geometric_table (frostline/geometric_table.hpp).

constexpr std::int64_t geometric_block = 256;

// out[k] for k < n (n <= geometric_block): the draw on [lo[k], hi[k]] with the
// bits of key first_key + k * key_step.
inline void geometric_block_draws(std::int32_t* __restrict out, const std::int32_t* __restrict lo,
                                  const std::int32_t* __restrict hi, std::int64_t n, std::uint64_t first_key,
                                  std::uint64_t key_step, const geometric_table& g) {
    alignas(64) std::int64_t low[geometric_block];
    alignas(64) std::int64_t high[geometric_block];
    alignas(64) double target[geometric_block];
    const double* __restrict tail = g.tail;
    const std::int64_t origin = g.origin;
    const bool negate = g.negate;
    std::int32_t widest = 0;  // the block's longest search decides its number of passes (mostly 1 or 2)
    for (std::int64_t k = 0; k < n; ++k) widest = hi[k] - lo[k] > widest ? hi[k] - lo[k] : widest;
    int passes = 0;
    for (std::int64_t span = widest + 1; span > 1; span = (span + 1) / 2) ++passes;
    for (std::int64_t k = 0; k < n; ++k) {
        const std::uint64_t bits = vector_mix(first_key + static_cast<std::uint64_t>(k) * key_step);
        const double u = static_cast<double>(bits >> 11) * 0x1.0p-53;
        // q > 1 runs on negated heights: the search over [-hi, -lo]
        const std::int64_t a = negate ? -static_cast<std::int64_t>(hi[k]) : lo[k];
        const std::int64_t b = negate ? -static_cast<std::int64_t>(lo[k]) : hi[k];
        low[k] = a - origin;
        high[k] = b - origin;
        target[k] = (1.0 - u) * tail[a - origin] + u * tail[b - origin + 1];
    }
    // least j in [first, last] with tail[j + 1] < target, as geometric_rule::draw_decreasing
    for (int pass = 0; pass < passes; ++pass) {
        for (std::int64_t k = 0; k < n; ++k) {
            const std::int64_t l = low[k], h = high[k];
            const std::int64_t mid = l + ((h - l) >> 1);
            const bool below = tail[mid + 1] < target[k];
            const bool open = l < h;
            high[k] = open && below ? mid : h;
            low[k] = open && !below ? mid + 1 : l;
        }
    }
    for (std::int64_t k = 0; k < n; ++k) {
        const std::int64_t value = origin + low[k];
        out[k] = static_cast<std::int32_t>(negate ? -value : value);
    }
}
