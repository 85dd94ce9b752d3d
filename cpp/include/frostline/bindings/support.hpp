// Helpers shared by every plugin's pybind11 bindings (built-in or outside):
// argument conversion, the Ctrl-C / progress hook, rule dispatch, reports.
// Only the binding layer includes pybind11; the engine headers do not.
#pragma once
#include <pybind11/functional.h>
#include <pybind11/numpy.h>
#include <pybind11/pybind11.h>

#include <cstdint>
#include <string>
#include <vector>

#include "../coupling_from_the_past.hpp"
#include "../errors.hpp"
#include "../local_rule.hpp"
#include "../random.hpp"

namespace frostline::bindings {

namespace py = pybind11;
using int_array = py::array_t<std::int32_t, py::array::c_style | py::array::forcecast>;

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

// Calls body(rule) with the two-point rule when per-site thresholds are given
// (one uint64 per site), else with the q rule of with_rule.
template <class Body>
auto with_rule_or_thresholds(const py::object& thresholds, std::int64_t n_sites, double q, std::int32_t step,
                             std::int64_t min_height, std::int64_t max_height, Body&& body) {
    if (thresholds.is_none()) return with_rule(q, step, min_height, max_height, body);
    auto t = thresholds.cast<py::array_t<std::uint64_t, py::array::c_style | py::array::forcecast>>();
    if (t.size() != n_sites)
        throw invalid_model("need one threshold per site: got " + std::to_string(t.size()) + " for " +
                            std::to_string(n_sites) + " sites");
    if (q != 1.0) throw invalid_model("per-site thresholds and a q weight cannot be combined");
    return body(flip_rule(std::vector<std::uint64_t>(t.data(), t.data() + t.size()), step));
}

// Refuses a result when a two-point rule met a wider interval.
template <class Rule>
void check_rule_fit(const Rule& rule) {
    if (rule.wide_intervals() > 0)
        throw invalid_model("the two-point (flip) rule met " + std::to_string(rule.wide_intervals()) +
                            " site updates with more than two allowed heights; it only suits models whose sites "
                            "have at most two allowed values");
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
