// Instruction-set levels for kernels compiled several times in one wheel.
//
// A kernel with vector versions is compiled once per level, each copy in its
// own translation unit and namespace with that level's compiler flags, and
// picked here at run time. Every level computes exactly the same integers, so
// the level changes the speed, never the sample (tests/test_simd_levels.py).
// FROSTLINE_SIMD=scalar|avx2|avx512 forces a level (for tests and benchmarks);
// asking for one the processor or the build lacks is an error, not a fallback.
#pragma once
#include <cstdlib>
#include <string>
#include <vector>

#include "errors.hpp"

namespace frostline {

enum class simd_level : int { scalar = 0, avx2 = 1, avx512 = 2 };

inline const char* simd_name(simd_level level) {
    switch (level) {
        case simd_level::avx2: return "avx2";
        case simd_level::avx512: return "avx512";
        default: return "scalar";
    }
}

// Whether this build holds the level's code and this processor can run it.
inline bool simd_supported(simd_level level) {
    if (level == simd_level::scalar) return true;
#if defined(FROSTLINE_X86_LEVELS) && (defined(__GNUC__) || defined(__clang__))
    __builtin_cpu_init();
    if (level == simd_level::avx2) return __builtin_cpu_supports("avx2");
    if (level == simd_level::avx512)
        return __builtin_cpu_supports("avx512f") && __builtin_cpu_supports("avx512dq") &&
               __builtin_cpu_supports("avx512vl") && __builtin_cpu_supports("avx512bw");
#endif
    return false;
}

// The levels this machine can run, slowest first.
inline std::vector<simd_level> simd_levels() {
    std::vector<simd_level> out;
    for (auto level : {simd_level::scalar, simd_level::avx2, simd_level::avx512})
        if (simd_supported(level)) out.push_back(level);
    return out;
}

// The level a kernel uses now: FROSTLINE_SIMD when set, else the best supported.
// Read on every call (cheap next to a sample), so tests can switch levels.
inline simd_level simd_choice() {
    const char* forced = std::getenv("FROSTLINE_SIMD");
    if (forced == nullptr || *forced == '\0') return simd_levels().back();
    const std::string name(forced);
    for (auto level : {simd_level::scalar, simd_level::avx2, simd_level::avx512}) {
        if (name != simd_name(level)) continue;
        if (!simd_supported(level))
            throw invalid_model("FROSTLINE_SIMD=" + name +
                                " is not available on this processor or in this build; "
                                "frostline.simd_levels() lists the levels that are");
        return level;
    }
    throw invalid_model("FROSTLINE_SIMD must be scalar, avx2 or avx512 (or unset), not '" + name + "'");
}

}  // namespace frostline

// Declares a kernel's entry point `name` in the level namespaces simd_scalar,
// simd_avx2 and simd_avx512 of the enclosing namespace (each defined by one
// translation unit compiled with that level's flags; the AVX ones in x86 builds only).
#define FROSTLINE_DECLARE_LEVELS(ret, name, params) \
    namespace simd_scalar {                         \
    ret name params;                                \
    }                                               \
    namespace simd_avx2 {                           \
    ret name params;                                \
    }                                               \
    namespace simd_avx512 {                         \
    ret name params;                                \
    }

// The entry point `name` of the given simd_level (scalar where the build has no other).
#if defined(FROSTLINE_X86_LEVELS)
#define FROSTLINE_PICK_LEVEL(level, name)                                           \
    ((level) == ::frostline::simd_level::avx512 ? &simd_avx512::name               \
     : (level) == ::frostline::simd_level::avx2 ? &simd_avx2::name : &simd_scalar::name)
#else
#define FROSTLINE_PICK_LEVEL(level, name) ((void)(level), &simd_scalar::name)
#endif
