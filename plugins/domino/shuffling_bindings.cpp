// Bindings of domino shuffling (registered into _core.domino by register_domino).
#include "frostline/bindings/support.hpp"

#include "shuffling.hpp"

namespace frostline::bindings {

void register_domino_shuffling(py::module_& m) { (void)m; }

}  // namespace frostline::bindings
