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
    register_domino_shuffling(m);
}

}  // namespace frostline::bindings
