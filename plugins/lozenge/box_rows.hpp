// Run-time choice among the box row kernels compiled for each level.
#pragma once
#include <cstdint>

#include "box_geometry.hpp"
#include "frostline/simd.hpp"

namespace frostline::lozenge {

#define FROSTLINE_BOX_ROWS_DECLARE(level)                                                                       \
    namespace simd_##level {                                                                                     \
    void uniform_rows(const box_geometry& g, std::int32_t* top, std::int32_t* bottom, std::uint64_t base,        \
                      std::int32_t parity, std::int32_t first_row, std::int32_t last_row);                       \
    }
FROSTLINE_BOX_ROWS_DECLARE(scalar)
FROSTLINE_BOX_ROWS_DECLARE(avx2)
FROSTLINE_BOX_ROWS_DECLARE(avx512)
#undef FROSTLINE_BOX_ROWS_DECLARE

using box_rows_function = void (*)(const box_geometry&, std::int32_t*, std::int32_t*, std::uint64_t, std::int32_t,
                                   std::int32_t, std::int32_t);

inline box_rows_function box_rows_for(simd_level level) {
#if defined(FROSTLINE_X86_LEVELS)
    if (level == simd_level::avx512) return &simd_avx512::uniform_rows;
    if (level == simd_level::avx2) return &simd_avx2::uniform_rows;
#endif
    (void)level;
    return &simd_scalar::uniform_rows;
}

}  // namespace frostline::lozenge
