// Thurston's algorithm: the least and greatest height functions of a height
// model are shortest-path distances in its constraint graph from the fixed
// boundary (Thurston, "Conway's tiling groups", Amer. Math. Monthly 97, 1990).
// A region has a configuration exactly when the boundary is consistent, which
// this decides, naming the first place where it fails.
#pragma once
#include <cstdint>
#include <deque>
#include <functional>
#include <limits>
#include <queue>
#include <string>
#include <vector>

#include "height_model.hpp"

namespace frostline {

struct extremal_heights {
    std::vector<std::int32_t> least;     // one entry per node (sites, then boundary)
    std::vector<std::int32_t> greatest;
};

namespace detail {

constexpr std::int64_t unreached = std::numeric_limits<std::int64_t>::max();

struct arc {
    std::int32_t to;
    std::int32_t weight;
};

// Multi-source shortest paths: label[v] = min over boundary s of
// value[s] + dist(s, v). Dijkstra when weights are non-negative, otherwise a
// FIFO label-correcting method with a pass count that detects negative cycles.
// A boundary node whose label would drop below its fixed value means the
// fixed values contradict the constraints; `source` names who forced it.
inline std::vector<std::int64_t> boundary_distances(std::int32_t n_sites,
                                                    const std::vector<std::int64_t>& boundary_values,
                                                    const std::vector<std::vector<arc>>& arcs,
                                                    bool any_negative) {
    const auto n_nodes = static_cast<std::int32_t>(arcs.size());
    std::vector<std::int64_t> label(n_nodes, unreached);
    std::vector<std::int32_t> source(n_nodes, -1);
    for (std::size_t b = 0; b < boundary_values.size(); ++b) {
        label[n_sites + b] = boundary_values[b];
        source[n_sites + b] = static_cast<std::int32_t>(n_sites + b);
    }
    auto conflict = [&](std::int32_t node, std::int64_t, std::int32_t from) {
        throw invalid_model("the boundary is inconsistent: the fixed heights of boundary node " +
                            std::to_string(from) + " and boundary node " + std::to_string(node) +
                            " differ by more than the constraints between them allow, so no configuration exists");
    };
    if (!any_negative) {
        using item = std::pair<std::int64_t, std::int32_t>;
        std::priority_queue<item, std::vector<item>, std::greater<item>> heap;
        for (std::int32_t v = n_sites; v < n_nodes; ++v) heap.push({label[v], v});
        std::vector<char> done(n_nodes, 0);
        while (!heap.empty()) {
            auto [d, v] = heap.top();
            heap.pop();
            if (done[v] || d != label[v]) continue;
            done[v] = 1;
            for (const auto& a : arcs[v]) {
                const std::int64_t nd = d + a.weight;
                if (nd < label[a.to]) {
                    if (a.to >= n_sites) conflict(a.to, nd, source[v]);
                    label[a.to] = nd;
                    source[a.to] = source[v];
                    heap.push({nd, a.to});
                }
            }
        }
        return label;
    }
    std::deque<std::int32_t> queue;
    std::vector<char> queued(n_nodes, 0);
    std::vector<std::int32_t> passes(n_nodes, 0);
    for (std::int32_t v = n_sites; v < n_nodes; ++v) { queue.push_back(v); queued[v] = 1; }
    while (!queue.empty()) {
        const std::int32_t v = queue.front();
        queue.pop_front();
        queued[v] = 0;
        for (const auto& a : arcs[v]) {
            const std::int64_t nd = label[v] + a.weight;
            if (nd < label[a.to]) {
                if (a.to >= n_sites) conflict(a.to, nd, source[v]);
                label[a.to] = nd;
                source[a.to] = source[v];
                if (++passes[a.to] > n_nodes)
                    throw invalid_model("the constraints around site " + std::to_string(a.to) +
                                        " form a cycle that no heights can satisfy, so no configuration exists");
                if (!queued[a.to]) { queue.push_back(a.to); queued[a.to] = 1; }
            }
        }
    }
    return label;
}

}  // namespace detail

// Least and greatest height functions; throws invalid_model when the region
// has no configuration or a site is not bounded by the boundary.
inline extremal_heights thurston_extremes(const height_model& model) {
    const std::int32_t n = model.n_sites(), n_nodes = model.n_nodes();
    std::vector<std::vector<detail::arc>> forward(n_nodes), backward(n_nodes);
    bool any_negative = false;
    for (const auto& c : model.constraints()) {
        forward[c.from].push_back({c.to, c.bound});
        backward[c.to].push_back({c.from, c.bound});
        any_negative = any_negative || c.bound < 0;
    }
    std::vector<std::int64_t> values(model.boundary_values().begin(), model.boundary_values().end());
    const auto greatest = detail::boundary_distances(n, values, forward, any_negative);
    for (auto& v : values) v = -v;
    auto least = detail::boundary_distances(n, values, backward, any_negative);
    for (auto& v : least) v = (v == detail::unreached) ? v : -v;

    extremal_heights out;
    out.least.resize(n_nodes);
    out.greatest.resize(n_nodes);
    constexpr std::int64_t limit = std::numeric_limits<std::int32_t>::max() / 2;
    for (std::int32_t v = 0; v < n_nodes; ++v) {
        if (greatest[v] == detail::unreached)
            throw invalid_model("site " + std::to_string(v) +
                                " has no upper bound: no chain of constraints leads to it from the boundary");
        if (least[v] == detail::unreached)
            throw invalid_model("site " + std::to_string(v) +
                                " has no lower bound: no chain of constraints leads from it to the boundary");
        if (least[v] > greatest[v])
            throw invalid_model("site " + std::to_string(v) + " needs height at least " + std::to_string(least[v]) +
                                " and at most " + std::to_string(greatest[v]) + ", so no configuration exists");
        if (greatest[v] > limit || least[v] < -limit)
            throw invalid_model("heights at site " + std::to_string(v) + " exceed the 32-bit range");
        out.least[v] = static_cast<std::int32_t>(least[v]);
        out.greatest[v] = static_cast<std::int32_t>(greatest[v]);
    }
    return out;
}

}  // namespace frostline
