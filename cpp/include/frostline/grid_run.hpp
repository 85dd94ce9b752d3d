// A run of free sites in one grid row (a plain aggregate: safe to share with
// translation units compiled for other instruction sets).
#pragma once
#include <cstdint>

namespace frostline {

// Columns first..last (inclusive) of `row` are free sites, numbered
// consecutively from first_site.
struct grid_run {
    std::int32_t row;
    std::int32_t first;
    std::int32_t last;
    std::int64_t first_site;
};

}  // namespace frostline
