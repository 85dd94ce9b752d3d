// A run of free corners in one row of the domino corner grid (a plain
// aggregate, shared by the scalar kernel and the vector row kernels).
#pragma once
#include <cstdint>

namespace frostline::domino {

struct corner_run {
    std::int32_t row;
    std::int32_t first;  // columns first..last (inclusive) are free corners
    std::int32_t last;
    std::int64_t first_site;
};

}  // namespace frostline::domino
