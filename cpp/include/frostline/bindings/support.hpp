// Helpers shared by every plugin's pybind11 bindings (built-in or outside):
// argument conversion, the Ctrl-C / progress hook, rule dispatch, reports.
// Only the binding layer includes pybind11; the engine headers do not.
#pragma once
#include <pybind11/functional.h>
#include <pybind11/numpy.h>
#include <pybind11/pybind11.h>

#include <cstdint>
#include <memory>
#include <string>
#include <vector>

#include "../coupling_from_the_past.hpp"
#include "../errors.hpp"
#include "../grid_run.hpp"
#include "../local_rule.hpp"
#include "../random.hpp"
#include "../thread_team.hpp"

namespace frostline::bindings {

namespace py = pybind11;
using int_array = py::array_t<std::int32_t, py::array::c_style | py::array::forcecast>;

// Threads sharing each colour class of one sample (null for one thread).
inline std::shared_ptr<thread_team> make_team(int threads) {
    if (threads < 1 || threads > 1024) throw invalid_model("threads must be between 1 and 1024");
    // More spinning threads than cores only slows the team down; the sample is
    // the same for any count, so asking for more is served with the cores there are.
    const int cores = static_cast<int>(std::thread::hardware_concurrency());
    if (cores > 0 && threads > cores) threads = cores;
    return threads == 1 ? nullptr : std::make_shared<thread_team>(threads);
}

inline random_key make_key(std::uint64_t word0, std::uint64_t word1) { return random_key{word0, word1}; }

inline std::vector<std::int32_t> to_vector(const int_array& a) {
    return std::vector<std::int32_t>(a.data(), a.data() + a.size());
}

inline py::array_t<std::int32_t> to_array(const std::vector<std::int32_t>& v) {
    py::array_t<std::int32_t> out(static_cast<py::ssize_t>(v.size()));
    std::copy(v.begin(), v.end(), out.mutable_data());
    return out;
}

// The hook the engine polls (with the GIL released): it takes the GIL back
// briefly, lets Python handle signals (Ctrl-C raises KeyboardInterrupt here),
// and forwards progress to an optional Python callable.
inline run_control make_control(py::object progress, std::int64_t max_start_time, bool check_order) {
    run_control control;
    control.max_start_time = max_start_time;
    control.check_order = check_order;
    control.keep_going = [progress](const run_progress& p) {
        py::gil_scoped_acquire hold;
        if (PyErr_CheckSignals() != 0) throw py::error_already_set();
        if (!progress.is_none()) progress(p.start_time, p.site_updates, p.seconds);
        return true;
    };
    return control;
}

// Runs of free sites from Python's (k, 3) int array of (row, first column,
// last column); grid kernels number and check them (grid_runs.hpp).
inline std::vector<grid_run> grid_runs_from(const int_array& runs) {
    if (runs.ndim() != 2 || runs.shape(1) != 3)
        throw invalid_model("runs must be an int array of shape (k, 3): (row, first column, last column)");
    std::vector<grid_run> list;
    auto r = runs.unchecked<2>();
    for (py::ssize_t k = 0; k < runs.shape(0); ++k) list.push_back({r(k, 0), r(k, 1), r(k, 2), 0});
    return list;
}

// Checks a rows x columns grid kernel's start grids: at least 3 x 3 (free
// sites lie strictly inside) and one height per cell in each.
inline void check_start_grids(std::int64_t rows, std::int64_t columns, const int_array& least,
                              const int_array& greatest, const std::string& what) {
    if (rows < 3 || columns < 3) throw invalid_model("the grid of " + what + " needs at least 3 x 3 entries");
    if (least.size() != rows * columns || greatest.size() != rows * columns)
        throw invalid_model("least and greatest need one height per grid entry (" + what + ")");
}

inline py::dict report_dict(const run_report& r) {
    py::dict d;
    d["start_time"] = r.start_time;
    d["coalescence_time"] = r.coalescence_time;
    d["site_updates"] = r.site_updates;
    d["epochs"] = r.epochs;
    d["seconds"] = r.seconds;
    return d;
}

// Calls body(rule) with the heat-bath rule for weight q^(h / step): the
// integer uniform rule when q == 1, the geometric rule otherwise. Dispatch
// happens once per call, never per site.
template <class Body>
auto with_rule(double q, std::int32_t step, std::int64_t min_height, std::int64_t max_height, Body&& body) {
    if (q == 1.0) return body(uniform_rule(step));
    return body(geometric_rule(q, step, min_height, max_height));
}

template <class T>
std::vector<T> vector_of(const py::handle& obj, const char* what) {
    try {
        auto a = obj.cast<py::array_t<T, py::array::c_style | py::array::forcecast>>();
        return std::vector<T>(a.data(), a.data() + a.size());
    } catch (const py::cast_error&) {
        throw invalid_model(std::string("rule entry '") + what + "' must be a numeric array");
    }
}

// Calls body(rule) for a rule described from Python: None means the q rule
// of with_rule; a dict with "thresholds" (uint64, one per site) the two-point
// rule; a dict with "context_start", "context_nodes", "context_offset",
// "context_table" the context rule, whose node ids must index the n_nodes
// heights the kernel reads (checked here again, whatever Python checked, so no
// path can read past an array). Dispatch happens once per call.
template <class Body>
auto with_rule_spec(const py::object& spec, std::int64_t n_sites, std::int64_t n_nodes, double q, std::int32_t step,
                    std::int64_t min_height, std::int64_t max_height, Body&& body) {
    if (spec.is_none()) return with_rule(q, step, min_height, max_height, body);
    if (!py::isinstance<py::dict>(spec)) throw invalid_model("a rule is None or a dict");
    const auto d = spec.cast<py::dict>();
    if (q != 1.0) throw invalid_model("a rule with thresholds and a q weight cannot be combined");
    if (d.contains("thresholds")) {
        auto t = vector_of<std::uint64_t>(d["thresholds"], "thresholds");
        if (static_cast<std::int64_t>(t.size()) != n_sites)
            throw invalid_model("need one threshold per site: got " + std::to_string(t.size()) + " for " +
                                std::to_string(n_sites) + " sites");
        return body(flip_rule(std::move(t), step));
    }
    if (d.contains("context_table")) {
        auto start = vector_of<std::int64_t>(d["context_start"], "context_start");
        if (static_cast<std::int64_t>(start.size()) != n_sites + 1)
            throw invalid_model("context_start needs n_sites + 1 entries");
        context_rule rule(std::move(start), vector_of<std::int32_t>(d["context_nodes"], "context_nodes"),
                          vector_of<std::int64_t>(d["context_offset"], "context_offset"),
                          vector_of<std::uint64_t>(d["context_table"], "context_table"), step);
        rule.check_nodes(n_nodes);
        return body(std::move(rule));
    }
    throw invalid_model("a rule dict needs 'thresholds' or the four 'context_*' arrays");
}

// Refuses a result when a two-point rule met a wider interval.
template <class Rule>
void check_rule_fit(const Rule& rule) {
    if (rule.wide_intervals() > 0)
        throw invalid_model("the two-point (flip) rule met " + std::to_string(rule.wide_intervals()) +
                            " site updates with more than two allowed heights; it only suits models whose sites "
                            "have at most two allowed values");
}

// A sweeper whose local rule can report misuse (a two-point rule that met a
// wider interval) offers rule(); those results are checked before returning.
template <class Sweeper, class = void>
struct has_rule : std::false_type {};
template <class Sweeper>
struct has_rule<Sweeper, std::void_t<decltype(std::declval<const Sweeper&>().rule().wide_intervals())>>
    : std::true_type {};

// Heights as a flat int32 array: the default shape of a CFTP result.
struct flat_heights {
    py::object operator()(const std::vector<std::int32_t>& h) const { return to_array(h); }
};

// The one binding sequence of an exact sample by coupling from the past, for
// any sweeper: control (Ctrl-C, progress, limits) -> GIL released -> CFTP ->
// rule check -> (finish(heights), report). Every kernel's binding calls this;
// `finish` turns the kernel's layout into the array Python receives.
template <class Sweeper, class Finish = flat_heights>
py::tuple cftp_result(const Sweeper& sweeper, const std::vector<std::int32_t>& greatest,
                      const std::vector<std::int32_t>& least, const py::object& progress,
                      std::int64_t max_start_time, bool check_order, Finish finish = {}) {
    static_assert(detail::is_sweeper<Sweeper>::value,
                  "a sweeper needs n_sites() const and sweep(std::int32_t*, std::int64_t) const");
    const auto control = make_control(progress, max_start_time, check_order);
    run_report report;
    std::vector<std::int32_t> out;
    {
        // Why release the GIL: one exact sample can take hours; other Python
        // threads (and other samples) run meanwhile. The hook re-takes it.
        py::gil_scoped_release free;
        out = monotone_cftp(sweeper, greatest, least, control, report);
    }
    if constexpr (has_rule<Sweeper>::value) check_rule_fit(sweeper.rule());
    return py::make_tuple(finish(out), report_dict(report));
}

// A forward chain driven by any sweeper. `owner` (a layout or model the
// sweeper points into) is kept alive as long as the chain.
template <class Sweeper>
std::shared_ptr<forward_chain> chain_of(Sweeper sweeper, std::vector<std::int32_t> start, std::int64_t time,
                                        std::shared_ptr<const void> owner = nullptr) {
    static_assert(detail::is_sweeper<Sweeper>::value,
                  "a sweeper needs n_sites() const and sweep(std::int32_t*, std::int64_t) const");
    const std::int64_t n = sweeper.n_sites();
    auto sweep = [owner, sweeper](std::int32_t* h, std::int64_t t) { sweeper.sweep(h, t); };
    return std::make_shared<forward_chain>(sweep, n, std::move(start), time);
}

// Maps engine exceptions to Python types. Registered once by the core module.
inline void register_exception_translators() {
    py::register_exception_translator([](std::exception_ptr p) {
        try {
            if (p) std::rethrow_exception(p);
        } catch (const invalid_model& e) {
            PyErr_SetString(PyExc_ValueError, e.what());
        } catch (const budget_exceeded& e) {
            PyErr_SetString(PyExc_RuntimeError, e.what());
        } catch (const cancelled&) {
            PyErr_SetNone(PyExc_KeyboardInterrupt);
        }
    });
}

}  // namespace frostline::bindings
