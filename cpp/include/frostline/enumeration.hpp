// Every configuration of a small height model, by depth-first search over the
// sites in order: each site takes the values of its residue class between its
// least and greatest heights that satisfy the constraints to the nodes fixed so
// far. Independent of the local moves, so it can check that the moves connect
// every configuration.
#pragma once
#include <functional>
#include <cstdint>
#include <string>
#include <vector>

#include "height_model.hpp"
#include "thurston.hpp"

namespace frostline {

struct too_many_configurations : invalid_model {
    using invalid_model::invalid_model;
};

// Configurations as rows of site heights (n_sites each), in lexicographic order.
// `keep_going` (optional) is called about every 2^20 steps of the search;
// returning false stops it (throws `cancelled`), so Ctrl-C works on long searches.
inline std::vector<std::int32_t> all_configurations(const height_model& model, std::int64_t cap,
                                                    const std::function<bool()>& keep_going = nullptr) {
    const auto ext = thurston_extremes(model);
    const std::int32_t n = model.n_sites(), step = model.step();
    // constraints touching each site, split into "to an earlier node" (checked when the site is set)
    std::vector<std::vector<constraint>> earlier(static_cast<std::size_t>(n));
    auto order = [&](std::int32_t node) { return node >= n ? -1 : node; };  // boundary nodes come first
    for (const auto& c : model.constraints()) {
        const auto later = std::max(order(c.from), order(c.to));
        if (later >= 0) earlier[later].push_back(c);
    }
    std::vector<std::int32_t> h(ext.least);
    std::vector<std::int32_t> out;
    std::int64_t found = 0;
    std::int32_t v = 0;
    if (n == 0) return out;
    h[0] = ext.least[0];
    std::uint64_t steps = 0;
    for (;;) {
        if ((++steps & ((std::uint64_t(1) << 20) - 1)) == 0 && keep_going && !keep_going()) throw cancelled();
        bool ok = h[v] <= ext.greatest[v];
        if (ok)
            for (const auto& c : earlier[v])
                if (static_cast<std::int64_t>(h[c.to]) - h[c.from] > c.bound) {
                    ok = false;
                    break;
                }
        if (ok && v + 1 == n) {
            if (++found > cap)
                throw too_many_configurations("the model has more than " + std::to_string(cap) +
                                              " configurations; exact enumeration is for tiny regions");
            out.insert(out.end(), h.begin(), h.begin() + n);
        }
        if (ok && v + 1 < n) {
            ++v;
            h[v] = ext.least[v];
            continue;
        }
        // next value at v, backtracking past exhausted sites
        while (v >= 0) {
            h[v] += step;
            if (h[v] <= ext.greatest[v]) break;
            h[v] = ext.least[v];
            --v;
        }
        if (v < 0) break;
    }
    return out;
}

}  // namespace frostline
