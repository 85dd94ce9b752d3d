// Python face of the lattice-free engine: the generic height model, Thurston's
// extremes, exact samples by coupling from the past, and forward chains.
#include <memory>
#include <set>

#include "frostline/bindings/support.hpp"
#include "frostline/enumeration.hpp"
#include "frostline/graph_tools.hpp"
#include "frostline/height_model.hpp"
#include "frostline/monotonicity.hpp"
#include "frostline/simd.hpp"
#include "frostline/sweeps.hpp"
#include "frostline/thurston.hpp"

namespace frostline::bindings {

namespace {

std::shared_ptr<height_model> make_model(std::int32_t n_sites, const int_array& boundary_values,
                                         const int_array& constraints, const int_array& residues,
                                         std::int32_t step, const int_array& colour_classes) {
    if (constraints.ndim() != 2 || constraints.shape(1) != 3)
        throw invalid_model("constraints must be an integer array of shape (E, 3) with rows (from, to, bound)");
    std::vector<constraint> list(static_cast<std::size_t>(constraints.shape(0)));
    auto c = constraints.unchecked<2>();
    for (py::ssize_t e = 0; e < constraints.shape(0); ++e) list[e] = constraint{c(e, 0), c(e, 1), c(e, 2)};
    return std::make_shared<height_model>(n_sites, to_vector(boundary_values), std::move(list),
                                          to_vector(residues), step, to_vector(colour_classes));
}

std::pair<std::int64_t, std::int64_t> height_range(const int_array& least, const int_array& greatest) {
    if (least.size() == 0) return {0, 0};
    const auto* lo = least.data();
    const auto* hi = greatest.data();
    return {*std::min_element(lo, lo + least.size()), *std::max_element(hi, hi + greatest.size())};
}

py::tuple sample(std::shared_ptr<height_model> model, const int_array& least, const int_array& greatest,
                 double q, std::uint64_t word0, std::uint64_t word1, bool check_order,
                 std::int64_t max_start_time, py::object progress, py::object rule_spec) {
    if (least.size() != model->n_nodes() || greatest.size() != model->n_nodes())
        throw invalid_model("least and greatest states need one height per node");
    const auto [min_h, max_h] = height_range(least, greatest);
    const auto top = to_vector(greatest), bottom = to_vector(least);
    return with_rule_spec(rule_spec, model->n_sites(), model->n_nodes(), q, model->step(), min_h, max_h, [&](auto rule) {
        generic_sweeper<decltype(rule)> sweeper(*model, rule, make_key(word0, word1), stream::coupling_from_the_past);
        return cftp_result(sweeper, top, bottom, progress, max_start_time, check_order);
    });
}

std::shared_ptr<forward_chain> make_chain(std::shared_ptr<height_model> model, const int_array& start,
                                          std::int64_t min_height, std::int64_t max_height, double q,
                                          std::uint64_t word0, std::uint64_t word1, std::int64_t time,
                                          py::object rule_spec) {
    if (start.size() != model->n_nodes()) throw invalid_model("the start state needs one height per node");
    std::string why;
    if (!model->is_valid(to_vector(start), why)) throw invalid_model("the start state is not a valid configuration: " + why);
    return with_rule_spec(rule_spec, model->n_sites(), model->n_nodes(), q, model->step(), min_height, max_height, [&](auto rule) {
        generic_sweeper<decltype(rule)> sweeper(*model, rule, make_key(word0, word1), stream::forward_chain);
        return chain_of(sweeper, to_vector(start), time, model);  // the chain keeps the model alive
    });
}

py::array_t<std::int32_t> heat_bath_draws(std::int32_t lo, std::int32_t hi, std::int32_t step, double q,
                                          std::int64_t min_height, std::int64_t max_height,
                                          const py::array_t<std::uint64_t, py::array::c_style | py::array::forcecast>& bits) {
    if (lo > hi) throw invalid_model("lo must not exceed hi");
    py::array_t<std::int32_t> out(bits.size());
    with_rule(q, step, min_height, max_height, [&](auto rule) {
        for (py::ssize_t i = 0; i < bits.size(); ++i) out.mutable_data()[i] = rule.draw(lo, hi, bits.data()[i], 0, nullptr);
        return 0;
    });
    return out;
}

py::dict check_monotone(std::shared_ptr<height_model> model, double q, py::object rule_spec,
                        const py::array_t<std::int32_t, py::array::c_style | py::array::forcecast>& sites,
                        std::int32_t window,
                        const py::array_t<std::uint64_t, py::array::c_style | py::array::forcecast>& test_bits,
                        py::object progress) {
    if (window < 1 || window > 4) throw invalid_model("window must be 1..4 steps");
    const std::vector<std::uint64_t> bits(test_bits.data(), test_bits.data() + test_bits.size());
    // heights the check can meet: neighbours within `window` steps, plus the largest constraint bound
    std::int64_t widest = 0;
    for (const auto& c : model->constraints()) widest = std::max<std::int64_t>(widest, std::abs(c.bound));
    const std::int64_t reach = static_cast<std::int64_t>(window + 2) * model->step() + widest;
    for (py::ssize_t i = 0; i < sites.size(); ++i)
        if (sites.data()[i] < 0 || sites.data()[i] >= model->n_sites())
            throw invalid_model("site " + std::to_string(sites.data()[i]) + " is outside 0.." +
                                std::to_string(model->n_sites() - 1));
    const std::vector<std::int32_t> chosen(sites.data(), sites.data() + sites.size());
    std::int64_t configurations = 0, comparisons = 0, distinct = 0;
    bool monotone = true;
    std::string violation;
    const auto control = make_control(progress, 0, false);
    with_rule_spec(rule_spec, model->n_sites(), model->n_nodes(), q, model->step(), -reach, reach, [&](auto rule) {
        // Why release the GIL: large regions take seconds; Ctrl-C is polled between sites.
        py::gil_scoped_release free;
        detail::stopwatch clock;
        detail::poller poll(control, clock);
        std::set<std::vector<std::int64_t>> seen;  // one check per kind of site (see site_signature)
        for (const auto site : chosen) {
            if (!seen.insert(site_signature(*model, rule, site)).second) continue;
            ++distinct;
            const auto r = check_site_monotone(*model, rule, site, window, bits);
            configurations += r.configurations;
            comparisons += r.comparisons;
            poll.add(std::max<std::int64_t>(r.comparisons, 1) * 64, 0);
            if (!r.monotone) {
                monotone = false;
                violation = r.detail;
                break;
            }
        }
        return 0;
    });
    py::dict out;
    out["monotone"] = monotone;
    out["detail"] = violation;
    out["distinct"] = distinct;
    out["configurations"] = configurations;
    out["comparisons"] = comparisons;
    return out;
}

}  // namespace

void register_engine(py::module_& parent) {
    auto m = parent.def_submodule("engine", "The lattice-free engine: generic height model, Thurston, CFTP, chains.");

    py::class_<height_model, std::shared_ptr<height_model>>(m, "HeightModel")
        .def(py::init(&make_model), py::arg("n_sites"), py::arg("boundary_values"), py::arg("constraints"),
             py::arg("residues"), py::arg("step"), py::arg("colour_classes"))
        .def_property_readonly("n_sites", &height_model::n_sites)
        .def_property_readonly("n_nodes", &height_model::n_nodes)
        .def_property_readonly("step", &height_model::step)
        .def_property_readonly("n_colour_classes", &height_model::n_colour_classes);

    m.def("simd_levels", [] {
        py::list out;
        for (auto level : simd_levels()) out.append(simd_name(level));
        return out;
    }, "Instruction-set levels of the vector kernels that this processor and build can run, slowest first.");
    m.def("simd_choice", [] { return std::string(simd_name(simd_choice())); },
          "The level the vector kernels use now (FROSTLINE_SIMD when set, else the fastest).");
    m.def("extremes", [](const height_model& model) {
        extremal_heights e;
        {
            py::gil_scoped_release free;  // shortest paths on large regions take a while
            e = thurston_extremes(model);
        }
        return py::make_tuple(to_array(e.least), to_array(e.greatest));
    }, py::arg("model"));

    m.def("sample", &sample, py::arg("model"), py::arg("least"), py::arg("greatest"), py::arg("q"),
          py::arg("key0"), py::arg("key1"), py::arg("check_order") = false,
          py::arg("max_start_time") = std::int64_t(1) << 40, py::arg("progress") = py::none(),
          py::arg("rule") = py::none());

    py::class_<forward_chain, std::shared_ptr<forward_chain>>(m, "ForwardChain")
        .def("run", [](forward_chain& chain, std::int64_t sweeps, py::object progress) {
            if (sweeps < 0) throw invalid_model("sweeps must be non-negative");
            const auto control = make_control(progress, 0, false);
            py::gil_scoped_release free;  // long runs; the hook re-takes the GIL for Ctrl-C
            return chain.run(sweeps, control);
        }, py::arg("sweeps"), py::arg("progress") = py::none())
        .def_property_readonly("heights", [](const forward_chain& c) { return to_array(c.height()); })
        .def_property_readonly("time", &forward_chain::time);

    m.def("generic_chain", &make_chain, py::arg("model"), py::arg("start"), py::arg("min_height"),
          py::arg("max_height"), py::arg("q"), py::arg("key0"), py::arg("key1"), py::arg("time") = 0,
          py::arg("rule") = py::none());

    m.def("check_monotone", &check_monotone, py::arg("model"), py::arg("q"), py::arg("rule"), py::arg("sites"),
          py::arg("window"), py::arg("test_bits"), py::arg("progress") = py::none(),
          "Exhaustive monotonicity check of the heat-bath rule at the given sites (see monotonicity.hpp).");

    using long_array = py::array_t<std::int64_t, py::array::c_style | py::array::forcecast>;
    auto longs = [](const long_array& a) { return std::vector<std::int64_t>(a.data(), a.data() + a.size()); };
    m.def("connected_components", [longs](std::int64_t n, const long_array& a, const long_array& b) {
        if (a.size() != b.size()) throw invalid_model("links need two equally long arrays");
        std::vector<std::int64_t> out;
        {
            const auto va = longs(a), vb = longs(b);
            py::gil_scoped_release free;  // large regions: millions of links
            out = connected_components(n, va, vb);
        }
        py::array_t<std::int64_t> result(static_cast<py::ssize_t>(out.size()));
        std::copy(out.begin(), out.end(), result.mutable_data());
        return result;
    }, py::arg("n"), py::arg("a"), py::arg("b"), "Component labels of n items joined by links (a[k], b[k]).");
    m.def("integrate_heights", [longs](const long_array& values,
                                       const py::array_t<std::uint8_t, py::array::c_style | py::array::forcecast>& known,
                                       const long_array& tails, const long_array& heads, const long_array& deltas) {
        if (known.size() != values.size() || tails.size() != heads.size() || tails.size() != deltas.size())
            throw invalid_model("integrate_heights: array lengths disagree");
        std::vector<std::int64_t> out;
        {
            auto v = longs(values);
            std::vector<std::uint8_t> k(known.data(), known.data() + known.size());
            const auto t = longs(tails), h = longs(heads), d = longs(deltas);
            py::gil_scoped_release free;
            out = integrate_heights(std::move(v), std::move(k), t, h, d);
        }
        py::array_t<std::int64_t> result(static_cast<py::ssize_t>(out.size()));
        std::copy(out.begin(), out.end(), result.mutable_data());
        return result;
    }, py::arg("values"), py::arg("known"), py::arg("tails"), py::arg("heads"), py::arg("deltas"),
       "Heights along edges (h[head] - h[tail] = delta) from the known ones, breadth first.");

    m.def("all_configurations", [](const height_model& model, std::int64_t cap) {
        std::vector<std::int32_t> rows;
        const std::function<bool()> keep_going = [] {  // Ctrl-C reaches Python here
            py::gil_scoped_acquire hold;
            if (PyErr_CheckSignals() != 0) throw py::error_already_set();
            return true;
        };
        {
            py::gil_scoped_release free;  // can take a while near the cap
            rows = all_configurations(model, cap, keep_going);
        }
        const py::ssize_t n = model.n_sites();
        py::array_t<std::int32_t> out({n ? static_cast<py::ssize_t>(rows.size()) / n : py::ssize_t(0), n});
        std::copy(rows.begin(), rows.end(), out.mutable_data());
        return out;
    }, py::arg("model"), py::arg("cap"),
       "Every configuration (rows of site heights) by depth-first search; independent of local moves.");

    m.def("heat_bath_draws", &heat_bath_draws, py::arg("lo"), py::arg("hi"), py::arg("step"), py::arg("q"),
          py::arg("min_height"), py::arg("max_height"), py::arg("bits"),
          "The shared inverse-CDF routine applied to each word of `bits` (for tests).");
}

}  // namespace frostline::bindings
