// The uniform domino sweep on the split corner grid (frostline/split_grid.hpp),
// for the vector levels. Included inside a level's namespace after
// frostline/vector/draws.inl and grid_rows.inl (their rules hold here).
//
// Free corners come as runs (corner_kernel.hpp); Thurston's offsets depend on
// the corner's parity only, so they are fixed along one class's share of a
// run: r + c odd: 1 horizontally and 3 vertically below, 3 and 1 above; even:
// swapped. Step 4. Classes and site ids as in corner_kernel.hpp.

// One sweep's class `parity` over runs[0..n_runs).
void uniform_runs(const corner_run* runs, std::int64_t n_runs, std::int64_t w, std::int32_t* top,
                  std::int32_t* bottom, std::uint64_t base, std::int32_t parity) {
    for (std::int64_t k = 0; k < n_runs; ++k) {
        const corner_run& run = runs[k];
        const std::int32_t first = run.first + ((run.row + run.first + parity) & 1);
        if (first > run.last) continue;
        const bool odd = ((run.row + first) & 1) != 0;
        const std::int32_t h_down = odd ? 1 : 3, v_down = odd ? 3 : 1;
        const grid_offsets o{4 - v_down, 4 - h_down, v_down, h_down, 2};
        const std::int64_t count = (run.last - first) / 2 + 1;
        const std::int64_t col_odd = first & 1;
        const std::int64_t at = (2 * static_cast<std::int64_t>(run.row) + col_odd) * w + (first >> 1) + 1;
        const std::int64_t left = col_odd ? -w : w - 1, right = col_odd ? -w + 1 : w;
        const std::uint64_t site = static_cast<std::uint64_t>(run.first_site + (first - run.first));
        const std::uint64_t first_key = base + (site + 1) * vector_gamma;
        if (bottom == nullptr)
            grid_row(top + at, count, w, left, right, first_key, 2 * vector_gamma, o);
        else
            grid_row_pair(top + at, bottom + at, count, w, left, right, first_key, 2 * vector_gamma, o);
    }
}
