// The square-ice row kernel compiled for the avx2 level (flags set in CMakeLists.txt).
#include <cstdint>

namespace frostline::square_ice::simd_avx2 {
#include "frostline/vector/draws.inl"
#include "frostline/vector/grid_rows.inl"
#include "ice_rows.inl"
}  // namespace frostline::square_ice::simd_avx2
