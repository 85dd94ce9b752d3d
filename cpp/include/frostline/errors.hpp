// Exceptions the engine throws; the binding layer maps each to a Python type.
#pragma once
#include <stdexcept>
#include <string>

namespace frostline {

// A model or argument that breaks a documented rule (maps to ValueError).
struct invalid_model : std::invalid_argument {
    using std::invalid_argument::invalid_argument;
};

// The user asked to stop (Ctrl-C); maps to KeyboardInterrupt.
struct cancelled : std::runtime_error {
    cancelled() : std::runtime_error("cancelled") {}
};

// A run exceeded a time or start-time budget the caller set (maps to RuntimeError).
struct budget_exceeded : std::runtime_error {
    using std::runtime_error::runtime_error;
};

}  // namespace frostline
