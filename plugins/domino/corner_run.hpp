// A run of free corners in one row of the domino corner grid: the engine's
// grid_run (row, first and last column, first site id).
#pragma once
#include "frostline/grid_run.hpp"

namespace frostline::domino {

using corner_run = grid_run;

}  // namespace frostline::domino
