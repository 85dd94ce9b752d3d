// Uniform heat-bath draws written for vector units, bit for bit those of
// frostline::uniform_rule fed by frostline::site_bits (random.hpp, local_rule.hpp).
//
// Include this inside a level's own namespace, in a translation unit compiled
// with that level's flags (see simd.hpp): it defines inline functions, and a
// shared namespace would let the linker keep one copy compiled for any level.
// So nothing here calls library code.
//
// The 64 x 64 -> 128-bit product that gives the uniform index is split into
// two 32 x 32 -> 64-bit products, which vector units have. With
// bits = 2^32 x1 + x0 and count < 2^32,
//   floor(bits * count / 2^64) = floor((x1 * count + floor(x0 * count / 2^32)) / 2^32),
// and the inner sum stays below 2^64. Levels without a wide vector multiply
// use the one scalar 128-bit product instead (the same value, faster there).

constexpr std::uint64_t vector_gamma = 0x9e3779b97f4a7c15ULL;  // random.hpp's golden_gamma

// random.hpp's mix64: the bits of the site whose key is base + (site + 1) * gamma.
inline std::uint64_t vector_mix(std::uint64_t z) {
    z = (z ^ (z >> 30)) * 0xbf58476d1ce4e5b9ULL;
    z = (z ^ (z >> 27)) * 0x94d049bb133111ebULL;
    return z ^ (z >> 31);
}

// The uniform index floor(bits * count / 2^64), count < 2^32.
inline std::uint64_t vector_index(std::uint64_t bits, std::uint64_t count) {
#if !defined(__AVX2__) && defined(__SIZEOF_INT128__)
    return static_cast<std::uint64_t>((static_cast<unsigned __int128>(bits) * count) >> 64);
#else
    const std::uint64_t low = (bits & 0xffffffffULL) * count;
    const std::uint64_t high = (bits >> 32) * count;
    return (high + (low >> 32)) >> 32;
#endif
}

// Uniform on {lo, lo + 3, ..., hi}, as uniform_rule(3).draw. floor(g / 3) =
// (g * 0xAAAAAAAB) >> 33 exactly for every 32-bit g (0xAAAAAAAB = (2^33 + 1) / 3;
// common practice for division by a constant): a multiply vector units have.
inline std::int32_t vector_draw_step3(std::int32_t lo, std::int32_t hi, std::uint64_t bits) {
    const std::uint64_t gap = static_cast<std::uint32_t>(hi - lo);
    const std::uint64_t count = ((gap * 0xAAAAAAABULL) >> 33) + 1;
    return lo + static_cast<std::int32_t>(vector_index(bits, count) * 3);
}

// Uniform on {lo, lo + 2^shift, ..., hi}, as uniform_rule(2^shift).draw.
inline std::int32_t vector_draw(std::int32_t lo, std::int32_t hi, std::uint64_t bits, int shift) {
    const std::uint64_t count = (static_cast<std::uint32_t>(hi - lo) >> shift) + std::uint64_t(1);
#if !defined(__AVX2__) && defined(__SIZEOF_INT128__)
    const auto k = static_cast<std::uint64_t>((static_cast<unsigned __int128>(bits) * count) >> 64);
#else
    const std::uint64_t low = (bits & 0xffffffffULL) * count;
    const std::uint64_t high = (bits >> 32) * count;
    const std::uint64_t k = (high + (low >> 32)) >> 32;
#endif
    return lo + (static_cast<std::int32_t>(k) << shift);
}
