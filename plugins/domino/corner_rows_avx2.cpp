// The domino row kernel compiled for the avx2 level (flags set in CMakeLists.txt).
#include <cstdint>

#include "corner_run.hpp"

namespace frostline::domino::simd_avx2 {
#include "frostline/vector/draws.inl"
#include "frostline/vector/grid_rows.inl"
#include "corner_rows.inl"
}  // namespace frostline::domino::simd_avx2
