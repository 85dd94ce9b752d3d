// The split-row layout of the plane-partition box, shared by the scalar box
// sweeper and the vector row kernels (a plain aggregate and nothing else: safe
// to share between translation units compiled with different instruction sets;
// box_kernel.hpp makes one).
//
// Heights of an a x b plane partition sit in (a + 2) blocks of two half-rows
// of `half_width` = (b + 1) / 2 + 2 entries: block r + 1 holds row r, its even
// columns in the first half-row and its odd columns in the second, each half
// with one pad entry in front. Cell (r, s) is at
//   ((r + 1) * 2 + (s & 1)) * half_width + (s >> 1) + 1.
// Why split: the cells of one colour class ((r + s) % 2) of a row are then
// contiguous, and so are their four neighbours, so a row of one class is one
// run of plain vector loads. With W = half_width:
//   even column at i: up i - 2W, down i + 2W, left i + W - 1, right i + W;
//   odd column at i:  up i - 2W, down i + 2W, left i - W,     right i - W + 1.
// The border holds the box: c in block 0 and in the front pads (the cells
// above and to the left), 0 in the last block and after each half-row's cells.
#pragma once
#include <cstdint>

namespace frostline::lozenge {

struct box_geometry {
    std::int32_t a, b, c;
    std::int64_t half_width;
};

}  // namespace frostline::lozenge
