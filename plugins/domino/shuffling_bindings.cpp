// Bindings of domino shuffling (registered into _core.domino by register_domino).
#include "frostline/bindings/support.hpp"

#include <optional>

#include "shuffling.hpp"

namespace frostline::bindings {

namespace {

using weight_array = py::array_t<double, py::array::c_style | py::array::forcecast>;

std::string shape_text(const py::array& a) {
    std::string s = "(";
    for (py::ssize_t i = 0; i < a.ndim(); ++i) s += (i ? ", " : "") + std::to_string(a.shape(i));
    return s + (a.ndim() == 1 ? ",)" : ")");
}

[[noreturn]] void not_real(const py::object& value, const char* name) {
    throw py::type_error(std::string(name) + " must be a 2-D array of real numbers or None, got " +
                         std::string(py::str(py::type::of(value).attr("__name__"))));
}

// Nothing for None, else a C-contiguous float64 view or copy of shape (rows, cols).
std::optional<weight_array> weights_or_none(const py::object& value, const char* name, std::int64_t n,
                                            std::int64_t rows, std::int64_t cols, const char* shape_rule) {
    if (value.is_none()) return std::nullopt;
    if (py::isinstance<py::array>(value) && value.cast<py::array>().dtype().kind() == 'c')
        throw py::type_error(std::string(name) + " must hold real numbers, got a complex array");
    weight_array a;
    try {
        a = value.cast<weight_array>();
    } catch (const py::cast_error&) {
        not_real(value, name);
    } catch (const py::error_already_set& e) {  // numpy could not convert the values
        if (!e.matches(PyExc_ValueError) && !e.matches(PyExc_TypeError)) throw;
        not_real(value, name);
    }
    if (a.ndim() != 2 || a.shape(0) != rows || a.shape(1) != cols)
        throw invalid_model(std::string(name) + " must have shape " + shape_rule + " = (" + std::to_string(rows) +
                            ", " + std::to_string(cols) + ") for order n = " + std::to_string(n) + ", got " +
                            shape_text(a) + "; entry [r, c] is the weight of the domino on cells " +
                            (std::string(name) == "horizontal" ? "(r, c) and (r, c + 1)" : "(r, c) and (r + 1, c)"));
    return a;
}

py::array_t<std::int64_t> aztec_shuffle(std::int64_t n, const py::object& horizontal, const py::object& vertical,
                                        std::uint64_t key0, std::uint64_t key1, const py::object& progress,
                                        std::int64_t segment_orders, double memory_limit, int threads) {
    if (n < 0) throw invalid_model("the order n of the Aztec diamond must be >= 0, got " + std::to_string(n));
    // Refuse an order too large for memory before converting (copying) the weights.
    const bool weighted = !horizontal.is_none() || !vertical.is_none();
    if (!(memory_limit > 0)) throw invalid_model("memory_limit must be a positive number of bytes");
    domino::check_aztec_memory(n, weighted, std::max<std::int64_t>(segment_orders, 0), memory_limit);
    const auto h = weights_or_none(horizontal, "horizontal", n, 2 * n, std::max<std::int64_t>(2 * n - 1, 0),
                                   "(2n, 2n - 1)");
    const auto v = weights_or_none(vertical, "vertical", n, std::max<std::int64_t>(2 * n - 1, 0), 2 * n,
                                   "(2n - 1, 2n)");
    // One given and one omitted: the engine reads the omitted one as weight 1.
    const double* h_data = h ? h->data() : nullptr;
    const double* v_data = v ? v->data() : nullptr;
    const run_control control = make_control(progress, std::int64_t(1) << 40, false);
    auto team = make_team(threads);
    std::vector<std::int32_t> dominoes;
    {
        // Orders in the hundreds take seconds: free the GIL so other Python
        // threads run; the hook re-takes it to check for Ctrl-C.
        py::gil_scoped_release free;
        dominoes = domino::aztec_shuffle(n, h_data, v_data, make_key(key0, key1), &control, segment_orders,
                                         memory_limit, team);
    }
    // int64, the dtype of every tiles array: widened here, in one pass, not by numpy afterwards.
    py::array_t<std::int64_t> out({static_cast<py::ssize_t>(n * (n + 1)), py::ssize_t(2), py::ssize_t(2)});
    std::copy(dominoes.begin(), dominoes.end(), out.mutable_data());
    return out;
}

}  // namespace

void register_domino_shuffling(py::module_& m) {
    m.def("aztec_shuffle", &aztec_shuffle, py::arg("n"), py::arg("horizontal") = py::none(),
          py::arg("vertical") = py::none(), py::arg("key0"), py::arg("key1"), py::arg("progress") = py::none(),
          py::arg("segment_orders") = 0, py::arg("memory_limit") = 2.0 * 1024.0 * 1024.0 * 1024.0,
          py::arg("threads") = 1,
          R"doc(Exact domino tiling of the Aztec diamond of order n by domino shuffling.

horizontal: None or float array (2n, 2n - 1); [r, c] weighs the domino on
cells (r, c), (r, c + 1). vertical: None or (2n - 1, 2n); [r, c] weighs the
domino on (r, c), (r + 1, c). Entries outside the diamond are ignored; those
inside must be positive and finite. Both None: uniform; one None: weight 1
for that orientation. key0, key1: the 128-bit key (same key, same tiling on
every machine). progress(order, face_updates, seconds) is called every few
milliseconds. segment_orders: testing aid, how many orders' weight tables
are kept at once (0: automatic); it never changes the tiling.
memory_limit: bytes the run may use (frostline passes FROSTLINE_MEMORY_LIMIT's
value); a larger estimate is refused before anything is allocated.
threads: threads sharing each order's rows of faces (the tiling is the same for any count).
Returns int64 (n(n+1), 2, 2): each domino as [(r1, c1), (r2, c2)], first
cell top or left, rows sorted.)doc");
}

}  // namespace frostline::bindings
