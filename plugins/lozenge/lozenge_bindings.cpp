// Bindings of the lozenge plugin: the fast plane-partition box kernel.
// Registers `_core.lozenge`; the region logic lives in the Python face.
#include "frostline/bindings/support.hpp"

#include "box_kernel.hpp"
#include "column_kernel.hpp"
#include "point_rows.hpp"

namespace frostline::bindings {

namespace {

using lozenge::box_layout;
using lozenge::box_sweeper;

void check_box(std::int32_t a, std::int32_t b, std::int32_t c) {
    if (a < 0 || b < 0 || c < 0) throw invalid_model("box sides must be non-negative");
}

py::array_t<std::int32_t> as_cells(const box_layout& layout, const std::vector<std::int32_t>& h) {
    py::array_t<std::int32_t> out({static_cast<py::ssize_t>(layout.rows()), static_cast<py::ssize_t>(layout.columns())});
    layout.cells(h.data(), out.mutable_data());
    return out;
}

py::tuple box_sample(std::int32_t a, std::int32_t b, std::int32_t c, double q, std::uint64_t word0,
                     std::uint64_t word1, bool check_order, std::int64_t max_start_time, py::object progress,
                     int threads) {
    check_box(a, b, c);
    auto team = make_team(threads);
    const box_layout layout(a, b, c);
    const auto top = layout.state(c), bottom = layout.state(0);
    // the engine works on the padded layout; Python gets the a x b plane partition
    auto cells = [&layout](const std::vector<std::int32_t>& h) { return as_cells(layout, h); };
    return with_rule(q, 1, 0, c, [&](auto rule) {
        box_sweeper<decltype(rule)> sweeper(layout, rule, make_key(word0, word1), stream::coupling_from_the_past,
                                            team);
        return cftp_result(sweeper, top, bottom, progress, max_start_time, check_order, cells);
    });
}

std::shared_ptr<forward_chain> box_chain(std::int32_t a, std::int32_t b, std::int32_t c, double q,
                                         std::uint64_t word0, std::uint64_t word1, const int_array& start,
                                         std::int64_t time) {
    check_box(a, b, c);
    if (start.size() != static_cast<py::ssize_t>(a) * b) throw invalid_model("start must have a * b cells");
    const box_layout layout(a, b, c);
    return with_rule(q, 1, 0, c, [&](auto rule) {
        box_sweeper<decltype(rule)> sweeper(layout, rule, make_key(word0, word1), stream::forward_chain);
        return chain_of(sweeper, layout.from_cells(start.data()), time);
    });
}

// Uniform CFTP on the lattice points of any simply connected region: heights
// on the rows x columns grid (row-major, as Python holds them), free points as runs.
py::tuple point_sample(std::int32_t rows, std::int32_t columns, std::int32_t shift, const int_array& runs,
                       const int_array& least, const int_array& greatest, std::uint64_t word0, std::uint64_t word1,
                       bool check_order, std::int64_t max_start_time, py::object progress, int threads) {
    check_start_grids(rows, columns, least, greatest, "lattice points");
    const lozenge::point_layout layout(rows, columns, shift, grid_runs_from(runs));
    auto team = make_team(threads);
    lozenge::point_sweeper sweeper(layout, make_key(word0, word1), stream::coupling_from_the_past, team);
    const auto& grid = layout.grid();
    auto joined = [&grid](const std::vector<std::int32_t>& h) { return to_array(grid.join(h)); };
    return cftp_result(sweeper, grid.split(greatest.data()), grid.split(least.data()), progress, max_start_time,
                       check_order, joined);
}

// CFTP on the cube columns of any lozenge region that has them: least and
// greatest are row-major rows x columns grids (also each cell's floor and cap),
// free cells as runs; weight q per cube.
py::tuple column_sample(std::int32_t rows, std::int32_t columns, const int_array& runs, const int_array& least,
                        const int_array& greatest, double q, std::uint64_t word0, std::uint64_t word1,
                        bool check_order, std::int64_t max_start_time, py::object progress, int threads) {
    check_start_grids(rows, columns, least, greatest, "cube columns");
    const lozenge::column_layout layout(rows, columns, grid_runs_from(runs), least.data(), greatest.data());
    auto team = make_team(threads);
    const auto& grid = layout.grid();
    auto joined = [&grid](const std::vector<std::int32_t>& h) { return to_array(grid.join(h)); };
    return with_rule(q, 1, layout.lowest(), layout.highest(), [&](auto rule) {
        lozenge::column_sweeper<decltype(rule)> sweeper(layout, rule, make_key(word0, word1),
                                                       stream::coupling_from_the_past, team);
        return cftp_result(sweeper, layout.cap(), layout.floor(), progress, max_start_time, check_order, joined);
    });
}

}  // namespace

void register_lozenge(py::module_& parent) {
    auto m = parent.def_submodule("lozenge", "Fast kernels of the lozenge plugin.");
    m.def("box_sample", &box_sample, py::arg("a"), py::arg("b"), py::arg("c"), py::arg("q"), py::arg("key0"),
          py::arg("key1"), py::arg("check_order") = false, py::arg("max_start_time") = std::int64_t(1) << 40,
          py::arg("progress") = py::none(), py::arg("threads") = 1,
          "Exact plane partition in the a x b x c box by CFTP with the fast kernel: (cells, report).");
    m.def("box_chain", &box_chain, py::arg("a"), py::arg("b"), py::arg("c"), py::arg("q"), py::arg("key0"),
          py::arg("key1"), py::arg("start"), py::arg("time") = 0,
          "Forward heat-bath chain; its heights are the kernel's padded layout (box_cells reads them).");
    m.def("point_sample", &point_sample, py::arg("rows"), py::arg("columns"), py::arg("shift"), py::arg("runs"),
          py::arg("least"), py::arg("greatest"), py::arg("key0"), py::arg("key1"), py::arg("check_order") = false,
          py::arg("max_start_time") = std::int64_t(1) << 40, py::arg("progress") = py::none(),
          py::arg("threads") = 1,
          "Exact uniform lozenge heights on the lattice points of any region by CFTP with the vector kernel: "
          "(grid heights, report).");
    m.def("column_sample", &column_sample, py::arg("rows"), py::arg("columns"), py::arg("runs"), py::arg("least"),
          py::arg("greatest"), py::arg("q"), py::arg("key0"), py::arg("key1"), py::arg("check_order") = false,
          py::arg("max_start_time") = std::int64_t(1) << 40, py::arg("progress") = py::none(),
          py::arg("threads") = 1,
          "Exact cube-column heights of a lozenge region by CFTP with the column kernel: (grid heights, report).");
    m.def(
        "box_cells",
        [](std::int32_t a, std::int32_t b, std::int32_t c, const int_array& padded) {
            check_box(a, b, c);
            const box_layout layout(a, b, c);
            if (padded.size() != layout.padded_size()) throw invalid_model("not the padded layout of this box");
            py::array_t<std::int32_t> out({static_cast<py::ssize_t>(a), static_cast<py::ssize_t>(b)});
            layout.cells(padded.data(), out.mutable_data());
            return out;
        },
        py::arg("a"), py::arg("b"), py::arg("c"), py::arg("padded"),
        "The a x b plane partition held in a box chain's padded heights.");
}

}  // namespace frostline::bindings
