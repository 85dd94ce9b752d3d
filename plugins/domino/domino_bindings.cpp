// Bindings of the domino plugin: registers `_core.domino`.
#include "frostline/bindings/support.hpp"

namespace frostline::bindings {

void register_domino_shuffling(py::module_& m);

void register_domino(py::module_& parent) {
    auto m = parent.def_submodule("domino", "Kernels of the domino plugin.");
    register_domino_shuffling(m);
}

}  // namespace frostline::bindings
