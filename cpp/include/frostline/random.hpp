// Counter-based random bits: every random decision is a pure function of
// (key, stream, time step, site). No generator state is carried between
// calls, so coupling from the past can revisit any past sweep without
// storing random numbers, and results do not depend on the order in which
// sites or threads do their work.
#pragma once
#include <cstdint>

namespace frostline {

// SplitMix64 finaliser (Steele, Lea, Flood, "Fast splittable pseudorandom
// number generators", OOPSLA 2014): a bijective 64-bit mixing function.
inline std::uint64_t mix64(std::uint64_t z) {
    z = (z ^ (z >> 30)) * 0xbf58476d1ce4e5b9ULL;
    z = (z ^ (z >> 27)) * 0x94d049bb133111ebULL;
    return z ^ (z >> 31);
}

constexpr std::uint64_t golden_gamma = 0x9e3779b97f4a7c15ULL;

// 128 bits of key material, drawn in Python from a numpy SeedSequence.
struct random_key {
    std::uint64_t word0 = 0;
    std::uint64_t word1 = 0;
};

// Stream numbers separate independent uses of one key. The engine owns 1 and
// 2; a lattice declares the ids of its own methods (3 and up) in its Python
// LatticeSpec and writes them here as `static_cast<stream>(id)` (the registry
// test checks that no two lattices share one).
enum class stream : std::uint64_t { coupling_from_the_past = 1, forward_chain = 2 };

// The per-sweep base: a hash of (key, stream, time). Sites of that sweep then
// read the SplitMix64 sequence started at this base, at position site + 1.
inline std::uint64_t sweep_base(const random_key& key, stream s, std::int64_t time) {
    std::uint64_t z = mix64(key.word1 ^ mix64(static_cast<std::uint64_t>(time) + golden_gamma));
    z = mix64(z ^ (static_cast<std::uint64_t>(s) * 0xd1b54a32d192ed03ULL));
    return mix64(z ^ key.word0);
}

// 64 random bits for one site in the sweep whose base is given.
inline std::uint64_t site_bits(std::uint64_t base, std::uint64_t site) {
    return mix64(base + (site + 1) * golden_gamma);
}

}  // namespace frostline
