// Run-time choice among the box row kernels compiled for each level.
#pragma once
#include <cstdint>

#include "box_geometry.hpp"
#include "frostline/geometric_table.hpp"
#include "frostline/simd.hpp"

namespace frostline::lozenge {

FROSTLINE_DECLARE_LEVELS(void, uniform_rows,
                         (const box_geometry& g, std::int32_t* top, std::int32_t* bottom, std::uint64_t base,
                          std::int32_t parity, std::int32_t first_row, std::int32_t last_row))

FROSTLINE_DECLARE_LEVELS(void, geometric_rows,
                         (const box_geometry& g, std::int32_t* h, std::uint64_t base, std::int32_t parity,
                          std::int32_t first_row, std::int32_t last_row, const geometric_table& table))

using box_geometric_function = void (*)(const box_geometry&, std::int32_t*, std::uint64_t, std::int32_t,
                                        std::int32_t, std::int32_t, const geometric_table&);

inline box_geometric_function box_geometric_for(simd_level level) {
    return FROSTLINE_PICK_LEVEL(level, geometric_rows);
}

using box_rows_function = void (*)(const box_geometry&, std::int32_t*, std::int32_t*, std::uint64_t, std::int32_t,
                                   std::int32_t, std::int32_t);

inline box_rows_function box_rows_for(simd_level level) { return FROSTLINE_PICK_LEVEL(level, uniform_rows); }

}  // namespace frostline::lozenge
