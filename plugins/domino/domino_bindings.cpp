// Bindings of the domino plugin: registers `_core.domino` (corner-grid kernel, shuffling).
#include <memory>

#include "frostline/bindings/support.hpp"

#include "corner_kernel.hpp"
#include "corner_rows.hpp"

namespace frostline::bindings {

void register_domino_shuffling(py::module_& m);

namespace {

using domino::corner_layout;
using domino::corner_run;
using domino::corner_sweeper;

std::shared_ptr<corner_layout> make_layout(std::int32_t rows, std::int32_t columns, const int_array& runs) {
    return std::make_shared<corner_layout>(rows, columns, grid_runs_from(runs));
}

void check_state(const corner_layout& layout, const int_array& a, const char* what) {
    if (a.size() != layout.size())
        throw invalid_model(std::string(what) + " must hold one height per corner");
}

py::tuple corner_sample(std::shared_ptr<corner_layout> layout, const int_array& least, const int_array& greatest,
                        py::object rule_spec, std::uint64_t word0, std::uint64_t word1, bool check_order,
                        std::int64_t max_start_time, py::object progress, int threads) {
    auto team = make_team(threads);
    check_state(*layout, least, "least");
    check_state(*layout, greatest, "greatest");
    if (rule_spec.is_none()) {  // uniform weights: the vector kernels, on the split corner grid
        domino::corner_split_sweeper sweeper(*layout, make_key(word0, word1), stream::coupling_from_the_past, team);
        const auto& grid = sweeper.grid();
        auto joined = [&grid](const std::vector<std::int32_t>& h) { return to_array(grid.join(h)); };
        return cftp_result(sweeper, grid.split(greatest.data()), grid.split(least.data()), progress, max_start_time,
                           check_order, joined);
    }
    const auto top = to_vector(greatest), bottom = to_vector(least);
    return with_rule_spec(rule_spec, layout->n_sites(), layout->size(), 1.0, 4, 0, 0, [&](auto rule) {
        corner_sweeper<decltype(rule)> sweeper(*layout, rule, make_key(word0, word1), stream::coupling_from_the_past);
        return cftp_result(sweeper, top, bottom, progress, max_start_time, check_order);
    });
}

std::shared_ptr<forward_chain> corner_chain(std::shared_ptr<corner_layout> layout, const int_array& start,
                                            py::object rule_spec, std::uint64_t word0, std::uint64_t word1,
                                            std::int64_t time) {
    check_state(*layout, start, "start");
    return with_rule_spec(rule_spec, layout->n_sites(), layout->size(), 1.0, 4, 0, 0, [&](auto rule) {
        corner_sweeper<decltype(rule)> sweeper(*layout, rule, make_key(word0, word1), stream::forward_chain);
        return chain_of(sweeper, to_vector(start), time, layout);  // the chain keeps the layout alive
    });
}

}  // namespace

// Corner heights down the columns: h[r][c] = h[r - 1][c] + step[r - 1][c] at
// every interior corner, rows in order (each interior corner's upper
// neighbour is a boundary corner or an interior one of the row above).
using byte_array = py::array_t<std::uint8_t, py::array::c_style | py::array::forcecast>;
using step_array = py::array_t<std::int8_t, py::array::c_style | py::array::forcecast>;

py::array_t<std::int32_t> scan_columns(const int_array& start, const byte_array& interior, const step_array& step) {
    if (start.ndim() != 2 || interior.ndim() != 2 || step.ndim() != 2 || interior.shape(0) != start.shape(0) ||
        interior.shape(1) != start.shape(1) || step.shape(0) + 1 != start.shape(0) || step.shape(1) != start.shape(1))
        throw invalid_model("scan_columns needs heights (R + 1, C + 1), interior (R + 1, C + 1), steps (R, C + 1)");
    const py::ssize_t rows = start.shape(0), columns = start.shape(1);
    py::array_t<std::int32_t> out({rows, columns});
    std::int32_t* h = out.mutable_data();
    std::copy(start.data(), start.data() + start.size(), h);
    const std::uint8_t* inside = interior.data();
    const std::int8_t* d = step.data();
    for (py::ssize_t r = 1; r < rows; ++r)
        for (py::ssize_t c = 0; c < columns; ++c)
            if (inside[r * columns + c]) h[r * columns + c] = h[(r - 1) * columns + c] + d[(r - 1) * columns + c];
    return out;
}

void register_domino(py::module_& parent) {
    auto m = parent.def_submodule("domino", "Kernels of the domino plugin.");
    py::class_<corner_layout, std::shared_ptr<corner_layout>>(m, "CornerLayout")
        .def(py::init(&make_layout), py::arg("rows"), py::arg("columns"), py::arg("runs"))
        .def_property_readonly("n_sites", &corner_layout::n_sites);
    m.def("corner_sample", &corner_sample, py::arg("layout"), py::arg("least"), py::arg("greatest"),
          py::arg("rule"), py::arg("key0"), py::arg("key1"), py::arg("check_order") = false,
          py::arg("max_start_time") = std::int64_t(1) << 40, py::arg("progress") = py::none(),
          py::arg("threads") = 1, "Exact domino heights on the corner grid by CFTP with the fast kernel: (heights, report).");
    m.def("corner_chain", &corner_chain, py::arg("layout"), py::arg("start"), py::arg("rule"),
          py::arg("key0"), py::arg("key1"), py::arg("time") = 0);
    m.def("scan_columns", &scan_columns, py::arg("start"), py::arg("interior"), py::arg("step"),
          "Corner heights from the boundary down the columns (the domino plugin's height walk).");
    register_domino_shuffling(m);
}

}  // namespace frostline::bindings
