// Checking and numbering the runs of free sites that grid kernels sweep.
// (Not included by the vector translation units: they see only grid_run.hpp.)
#pragma once
#include <cstdint>
#include <string>
#include <vector>

#include "errors.hpp"
#include "grid_run.hpp"

namespace frostline {

// Checks that every run lies strictly inside a grid whose border rows are 0 and
// `border_row` and border columns 0 and `border_column` (so every neighbour of a
// free site is on the grid), and that the runs are disjoint and in row-major
// order (so no cell is in two runs, and two threads never share one); then
// numbers the sites consecutively. Returns the number of sites. `what` names the
// sites in errors ("corners", "lattice points").
inline std::int64_t number_runs(std::vector<grid_run>& runs, std::int64_t border_row, std::int64_t border_column,
                                const std::string& what) {
    std::int64_t site = 0;
    for (std::size_t k = 0; k < runs.size(); ++k) {
        auto& run = runs[k];
        if (run.row <= 0 || run.row >= border_row || run.first <= 0 || run.last >= border_column ||
            run.first > run.last)
            throw invalid_model("a run of free " + what + " must lie strictly inside the grid");
        if (k > 0) {
            const auto& before = runs[k - 1];
            if (run.row < before.row || (run.row == before.row && run.first <= before.last))
                throw invalid_model("runs of free " + what + " must be disjoint and in row-major order");
        }
        run.first_site = site;
        site += run.last - run.first + 1;
    }
    return site;
}

}  // namespace frostline
