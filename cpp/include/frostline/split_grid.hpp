// The split layout of a rectangular grid for vector kernels: each row stored
// as `parts` sub-rows by column residue (for two parts: even columns, then
// odd), each with one pad entry in front, in sub-rows of `part_width` =
// ceil(columns / parts) + 2 entries. Cell (i, j) sits at
//   (parts * i + j % parts) * part_width + j / parts + 1.
//
// Why: on a grid coloured so that the sites of one colour in a row are every
// `parts`-th column (a chessboard for two, the three classes of the
// triangular lattice for three), those sites are then contiguous, and so is
// each of their neighbours at a fixed offset: a row of one class is one run
// of plain vector loads. For two parts, with W = part_width:
//   even column at p: up p - 2W, down p + 2W, left p + W - 1, right p + W;
//   odd column at p:  up p - 2W, down p + 2W, left p - W,     right p - W + 1.
// Kernels update interior cells only, so the pads are never read.
#pragma once
#include <cstdint>
#include <vector>

#include "grid_run.hpp"

namespace frostline {

class split_grid {
public:
    split_grid(std::int64_t rows, std::int64_t columns, std::int64_t parts = 2)
        : rows_(rows), columns_(columns), parts_(parts), half_width_((columns + parts - 1) / parts + 2) {}

    std::int64_t rows() const { return rows_; }
    std::int64_t columns() const { return columns_; }
    std::int64_t parts() const { return parts_; }
    std::int64_t half_width() const { return half_width_; }  // the width of one sub-row
    std::int64_t size() const { return rows_ * parts_ * half_width_; }
    std::int64_t index(std::int64_t i, std::int64_t j) const {
        return (parts_ * i + j % parts_) * half_width_ + j / parts_ + 1;
    }
    // Offset from a cell in a column of residue m to the cell (di, dj) away: a constant of m.
    std::int64_t offset(std::int64_t m, std::int64_t di, std::int64_t dj) const {
        return index(1 + di, parts_ + m + dj) - index(1, parts_ + m);
    }
    // Offsets of the left and right neighbours from a cell in a column of this parity (two parts).
    std::int64_t left(std::int64_t j) const { return offset(j % parts_, 0, -1); }
    std::int64_t right(std::int64_t j) const { return offset(j % parts_, 0, 1); }

    // From and to the row-major (rows x columns) array.
    std::vector<std::int32_t> split(const std::int32_t* row_major) const {
        std::vector<std::int32_t> out(static_cast<std::size_t>(size()), 0);
        for (std::int64_t i = 0; i < rows_; ++i)
            for (std::int64_t j = 0; j < columns_; ++j) out[static_cast<std::size_t>(index(i, j))] = *row_major++;
        return out;
    }
    std::vector<std::int32_t> join(const std::vector<std::int32_t>& split_heights) const {
        std::vector<std::int32_t> out(static_cast<std::size_t>(rows_ * columns_));
        auto it = out.begin();
        for (std::int64_t i = 0; i < rows_; ++i)
            for (std::int64_t j = 0; j < columns_; ++j) *it++ = split_heights[static_cast<std::size_t>(index(i, j))];
        return out;
    }

private:
    std::int64_t rows_, columns_, parts_, half_width_;
};

}  // namespace frostline
