// The private compiled module frostline._core: one registration call per
// binding file, nothing else.
#include "frostline/bindings/support.hpp"

namespace frostline::bindings {
void register_engine(py::module_& m);
void register_lozenge(py::module_& m);
void register_domino(py::module_& m);
void register_square_ice(py::module_& m);
}  // namespace frostline::bindings

PYBIND11_MODULE(_core, m) {
    using namespace frostline::bindings;
    m.doc() = "frostline's compiled engine (private; use the frostline package).";
    register_exception_translators();
    register_engine(m);
    register_lozenge(m);
    register_domino(m);
    register_square_ice(m);
}
