// The split layout of a rectangular grid for vector kernels: each row stored
// as two half-rows, its even columns then its odd columns, each half with one
// pad entry in front, in half-rows of `half_width` = (columns + 1) / 2 + 2.
// Cell (i, j) sits at (2 i + (j & 1)) * half_width + (j >> 1) + 1.
//
// Why: on a grid coloured like a chessboard, the cells of one colour in a row
// are then contiguous, and so are their four neighbours:
//   even column at p: up p - 2W, down p + 2W, left p + W - 1, right p + W;
//   odd column at p:  up p - 2W, down p + 2W, left p - W,     right p - W + 1.
// Kernels update interior cells only, so the pads are never read.
#pragma once
#include <cstdint>
#include <vector>

namespace frostline {

class split_grid {
public:
    split_grid(std::int64_t rows, std::int64_t columns)
        : rows_(rows), columns_(columns), half_width_((columns + 1) / 2 + 2) {}

    std::int64_t rows() const { return rows_; }
    std::int64_t columns() const { return columns_; }
    std::int64_t half_width() const { return half_width_; }
    std::int64_t size() const { return rows_ * 2 * half_width_; }
    std::int64_t index(std::int64_t i, std::int64_t j) const {
        return (2 * i + (j & 1)) * half_width_ + (j >> 1) + 1;
    }
    // Offsets of the left and right neighbours from a cell in a column of this parity.
    std::int64_t left(std::int64_t j) const { return (j & 1) ? -half_width_ : half_width_ - 1; }
    std::int64_t right(std::int64_t j) const { return (j & 1) ? -half_width_ + 1 : half_width_; }

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
    std::int64_t rows_, columns_, half_width_;
};

}  // namespace frostline
