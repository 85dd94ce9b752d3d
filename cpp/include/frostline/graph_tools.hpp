// Lattice-free graph helpers used by plugins on large regions: connected
// components (union-find) and integrating heights along edges from known values.
#pragma once
#include <cstdint>
#include <deque>
#include <numeric>
#include <string>
#include <vector>

#include "errors.hpp"

namespace frostline {

// Component label (0..k-1, in order of first appearance) of each item joined by links.
inline std::vector<std::int64_t> connected_components(std::int64_t n, const std::vector<std::int64_t>& a,
                                                      const std::vector<std::int64_t>& b) {
    std::vector<std::int64_t> parent(static_cast<std::size_t>(n));
    std::iota(parent.begin(), parent.end(), 0);
    auto find = [&](std::int64_t x) {
        while (parent[x] != x) x = parent[x] = parent[parent[x]];
        return x;
    };
    for (std::size_t e = 0; e < a.size(); ++e) {
        if (a[e] < 0 || a[e] >= n || b[e] < 0 || b[e] >= n) throw invalid_model("a link names an item out of range");
        const auto ra = find(a[e]), rb = find(b[e]);
        if (ra != rb) parent[std::max(ra, rb)] = std::min(ra, rb);
    }
    std::vector<std::int64_t> label(static_cast<std::size_t>(n), -1), root_label(static_cast<std::size_t>(n), -1);
    std::int64_t next = 0;
    for (std::int64_t x = 0; x < n; ++x) {
        const auto r = find(x);
        if (root_label[r] < 0) root_label[r] = next++;
        label[x] = root_label[r];
    }
    return label;
}

// Heights at every point reachable from the known ones along edges with
// h[head] - h[tail] = delta (breadth first). Throws when two paths disagree.
inline std::vector<std::int64_t> integrate_heights(std::vector<std::int64_t> value, std::vector<std::uint8_t> known,
                                                   const std::vector<std::int64_t>& tail,
                                                   const std::vector<std::int64_t>& head,
                                                   const std::vector<std::int64_t>& delta) {
    const auto n = static_cast<std::int64_t>(value.size());
    std::vector<std::int64_t> start(static_cast<std::size_t>(n) + 1, 0), to, step;
    for (std::size_t e = 0; e < tail.size(); ++e) {
        if (tail[e] < 0 || tail[e] >= n || head[e] < 0 || head[e] >= n) throw invalid_model("an edge names a point out of range");
        ++start[tail[e] + 1];
        ++start[head[e] + 1];
    }
    for (std::int64_t v = 0; v < n; ++v) start[v + 1] += start[v];
    to.resize(start.back());
    step.resize(start.back());
    std::vector<std::int64_t> fill(start.begin(), start.end() - 1);
    for (std::size_t e = 0; e < tail.size(); ++e) {
        to[fill[tail[e]]] = head[e];
        step[fill[tail[e]]++] = delta[e];
        to[fill[head[e]]] = tail[e];
        step[fill[head[e]]++] = -delta[e];
    }
    std::deque<std::int64_t> queue;
    for (std::int64_t v = 0; v < n; ++v)
        if (known[v]) queue.push_back(v);
    while (!queue.empty()) {
        const auto v = queue.front();
        queue.pop_front();
        for (auto k = start[v]; k < start[v + 1]; ++k) {
            const auto w = to[k];
            const auto h = value[v] + step[k];
            if (!known[w]) {
                known[w] = 1;
                value[w] = h;
                queue.push_back(w);
            } else if (value[w] != h) {
                throw invalid_model("the tiles do not give a consistent height function (at point " +
                                    std::to_string(w) + ")");
            }
        }
    }
    return value;
}

}  // namespace frostline
