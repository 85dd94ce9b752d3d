// The box row kernel compiled for the scalar level (flags set in CMakeLists.txt).
#include <cstdint>

#include "box_geometry.hpp"
#include "frostline/geometric_table.hpp"

namespace frostline::lozenge::simd_scalar {
#include "frostline/vector/draws.inl"
#include "frostline/vector/geometric_draws.inl"
#include "box_rows.inl"
}  // namespace frostline::lozenge::simd_scalar
