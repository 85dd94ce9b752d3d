// The q^h heat-bath table as plain data (a plain aggregate: safe to share with
// translation units compiled for other instruction sets), read by the vector
// draws of frostline/vector/geometric_draws.inl.
#pragma once
#include <cstdint>

namespace frostline {

struct geometric_table {
    const double* tail;   // geometric_rule's tail sums
    std::int64_t origin;  // its index origin (the lowest height, or minus the highest when negated)
    bool negate;          // q > 1: the search runs on negated heights
};

// The table of a geometric_rule (step 1).
template <class Rule>
geometric_table table_of(const Rule& rule) {
    return {rule.tail(), rule.origin(), rule.negated()};
}

}  // namespace frostline
