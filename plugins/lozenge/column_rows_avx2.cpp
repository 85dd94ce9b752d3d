// The cube-column row kernel compiled for the avx2 level (flags set in CMakeLists.txt).
#include <cstdint>

#include "frostline/geometric_table.hpp"
#include "frostline/grid_run.hpp"

namespace frostline::lozenge::simd_avx2 {
#include "frostline/vector/draws.inl"
#include "frostline/vector/geometric_draws.inl"
#include "column_rows.inl"
}  // namespace frostline::lozenge::simd_avx2
