// Bindings of the square_ice plugin: registers `_core.square_ice` (the corner-grid kernel).
#include <memory>

#include "frostline/bindings/support.hpp"

#include "ice_kernel.hpp"
#include "ice_rows.hpp"

namespace frostline::bindings {

namespace {

using square_ice::ice_sweeper;

using table_array = py::array_t<std::uint64_t, py::array::c_style | py::array::forcecast>;

ice_sweeper make_sweeper(std::int32_t n, const table_array& table, std::uint64_t word0, std::uint64_t word1, stream s) {
    if (n < 1) throw invalid_model("n must be at least 1");
    if (table.size() != 0 && table.size() != 16) throw invalid_model("the weight table has 16 entries (or none)");
    return ice_sweeper(n, std::vector<std::uint64_t>(table.data(), table.data() + table.size()),
                       make_key(word0, word1), s);
}

void check_size(std::int32_t n, const int_array& a, const char* what) {
    if (a.size() != static_cast<py::ssize_t>(n + 1) * (n + 1))
        throw invalid_model(std::string(what) + " needs one height per corner ((n + 1)^2 entries)");
}

}  // namespace

void register_square_ice(py::module_& parent) {
    auto m = parent.def_submodule("square_ice", "Kernel of the square_ice plugin.");
    m.def("ice_sample", [](std::int32_t n, const table_array& table, const int_array& least,
                           const int_array& greatest, std::uint64_t word0, std::uint64_t word1, bool check_order,
                           std::int64_t max_start_time, py::object progress, int threads) {
        auto team = make_team(threads);
        auto sweeper = make_sweeper(n, table, word0, word1, stream::coupling_from_the_past);
        check_size(n, least, "least");
        check_size(n, greatest, "greatest");
        if (table.size() == 0) {  // uniform weights: the vector kernels, on the split corner grid
            square_ice::ice_split_sweeper split(n, make_key(word0, word1), stream::coupling_from_the_past, team);
            const auto& grid = split.grid();
            auto joined = [&grid](const std::vector<std::int32_t>& h) { return to_array(grid.join(h)); };
            return cftp_result(split, grid.split(greatest.data()), grid.split(least.data()), progress,
                               max_start_time, check_order, joined);
        }
        return cftp_result(sweeper, to_vector(greatest), to_vector(least), progress, max_start_time, check_order);
    }, py::arg("n"), py::arg("table"), py::arg("least"), py::arg("greatest"), py::arg("key0"),
       py::arg("key1"), py::arg("check_order") = false, py::arg("max_start_time") = std::int64_t(1) << 40,
       py::arg("progress") = py::none(), py::arg("threads") = 1,
       "Exact square-ice heights (threads: uniform weights only) by CFTP with the fast kernel: (heights, report).");
    m.def("ice_chain", [](std::int32_t n, const table_array& table, const int_array& start, std::uint64_t word0,
                          std::uint64_t word1, std::int64_t time) {
        auto sweeper = make_sweeper(n, table, word0, word1, stream::forward_chain);
        check_size(n, start, "start");
        return chain_of(sweeper, to_vector(start), time);
    }, py::arg("n"), py::arg("table"), py::arg("start"), py::arg("key0"), py::arg("key1"),
       py::arg("time") = 0);
}

}  // namespace frostline::bindings
