// A fast kernel for restricted solid-on-solid (RSOS) surfaces, built outside
// frostline against its shipped headers. Heights on the cells of a rows x
// columns grid, 0 <= h <= max_height, neighbouring cells (and the frame of
// zeros around the grid) differ by at most 1. The engine's templates
// (monotone_cftp, forward_chain, the heat-bath rules) are instantiated here, in
// this module: no C++ object crosses between compiled modules.
//
// Colour class (r + c) % 2, class 0 first; site id r * columns + c: the same
// as the generic lowering in frostline_rsos, so both give the identical sample.
#include <algorithm>
#include <vector>

#include "frostline/bindings/support.hpp"

namespace rsos {

using namespace frostline;
using frostline::bindings::int_array;
namespace py = pybind11;

template <class Rule>
class surface_sweeper {
public:
    surface_sweeper(std::int32_t rows, std::int32_t columns, std::int32_t max_height, Rule rule, random_key key,
                    stream s)
        : rows_(rows), columns_(columns), max_height_(max_height), rule_(std::move(rule)), key_(key), stream_(s) {}

    std::int64_t n_sites() const { return static_cast<std::int64_t>(rows_) * columns_; }

    void sweep(std::int32_t* h, std::int64_t time) const { run<false>(h, nullptr, time); }
    void sweep_pair(std::int32_t* top, std::int32_t* bottom, std::int64_t time) const { run<true>(top, bottom, time); }

private:
    template <bool pair>
    void run(std::int32_t* a, std::int32_t* b, std::int64_t time) const {
        const std::uint64_t base = sweep_base(key_, stream_, time);
        const std::int64_t w = columns_ + 2;  // padded: a frame of zeros around the grid
        for (std::int32_t parity = 0; parity < 2; ++parity)
            for (std::int32_t r = 0; r < rows_; ++r)
                for (std::int32_t c = (parity + r) & 1; c < columns_; c += 2) {
                    const std::int64_t at = (r + 1) * w + (c + 1);
                    const auto site = static_cast<std::uint64_t>(r) * columns_ + c;
                    const std::uint64_t bits = site_bits(base, site);
                    a[at] = draw(a, at, w, bits, site);
                    if constexpr (pair) b[at] = draw(b, at, w, bits, site);
                }
    }

    std::int32_t draw(const std::int32_t* h, std::int64_t at, std::int64_t w, std::uint64_t bits,
                      std::uint64_t site) const {
        const std::int32_t lo = std::max({0, h[at - 1] - 1, h[at + 1] - 1, h[at - w] - 1, h[at + w] - 1});
        const std::int32_t hi = std::min({max_height_, h[at - 1] + 1, h[at + 1] + 1, h[at - w] + 1, h[at + w] + 1});
        return rule_.draw(lo, hi, bits, site, h);
    }

    std::int32_t rows_, columns_, max_height_;
    Rule rule_;
    random_key key_;
    stream stream_;
};

py::tuple sample(std::int32_t rows, std::int32_t columns, std::int32_t max_height, double q, std::uint64_t key0,
                 std::uint64_t key1, const int_array& least, const int_array& greatest, py::object progress,
                 std::int64_t max_start_time, bool check_order) {
    if (rows < 1 || columns < 1 || max_height < 0) throw invalid_model("need rows, columns >= 1 and max_height >= 0");
    const std::int64_t padded = static_cast<std::int64_t>(rows + 2) * (columns + 2);
    if (least.size() != padded || greatest.size() != padded)
        throw invalid_model("least and greatest are padded (rows + 2) x (columns + 2) arrays");
    const auto top = bindings::to_vector(greatest), bottom = bindings::to_vector(least);
    return bindings::with_rule(q, 1, 0, max_height, [&](auto rule) {
        surface_sweeper<decltype(rule)> sweeper(rows, columns, max_height, rule, bindings::make_key(key0, key1),
                                               stream::coupling_from_the_past);
        return bindings::cftp_result(sweeper, top, bottom, progress, max_start_time, check_order);
    });
}

}  // namespace rsos

PYBIND11_MODULE(_kernel, m) {
    m.doc() = "Fast RSOS kernel of the frostline-rsos plugin.";
    frostline::bindings::register_exception_translators();
    m.def("sample", &rsos::sample, pybind11::arg("rows"), pybind11::arg("columns"), pybind11::arg("max_height"),
          pybind11::arg("q"), pybind11::arg("key0"), pybind11::arg("key1"), pybind11::arg("least"),
          pybind11::arg("greatest"), pybind11::arg("progress") = pybind11::none(),
          pybind11::arg("max_start_time") = std::int64_t(1) << 40, pybind11::arg("check_order") = false);
}
