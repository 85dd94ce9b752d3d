// The square-ice row kernel compiled for the avx512 level (flags set in CMakeLists.txt).
#include <cstdint>

namespace frostline::square_ice::simd_avx512 {
#include "frostline/vector/draws.inl"
#include "frostline/vector/grid_rows.inl"
#include "ice_rows.inl"
}  // namespace frostline::square_ice::simd_avx512
