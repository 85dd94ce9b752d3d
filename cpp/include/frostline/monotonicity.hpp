// A general monotonicity checker for heat-bath rules (any model, any rule).
//
// Monotone coupling from the past is exact only when each update, for fixed
// random bits, never lowers the new height when a neighbour's height rises.
// For one site this enumerates every assignment of its neighbourhood (the
// nodes its constraints and its rule read) to heights within `window` steps
// of 0 in their residue classes, raises each neighbour by one step in turn,
// and compares the drawn heights for every test word of random bits. Raising
// one neighbour at a time suffices: any pointwise increase is a chain of them.
#pragma once
#include <algorithm>
#include <cstdint>
#include <limits>
#include <string>
#include <type_traits>
#include <vector>

#include "height_model.hpp"
#include "local_rule.hpp"

namespace frostline {

struct monotonicity_report {
    bool monotone = true;
    std::int64_t configurations = 0;  // neighbourhood assignments with at least one allowed height
    std::int64_t comparisons = 0;
    std::string detail;               // the first violation found, in words
};

namespace detail {

template <class Rule>
std::vector<std::int32_t> context_of(const Rule& rule, std::int32_t site) {
    if constexpr (std::is_same_v<Rule, context_rule>) {
        const auto& start = rule.context_start();
        const auto& node = rule.context_nodes();
        return std::vector<std::int32_t>(node.begin() + start[site], node.begin() + start[site + 1]);
    } else {
        (void)rule;
        (void)site;
        return {};
    }
}

inline std::pair<std::int32_t, std::int32_t> allowed(const height_model& model, const std::vector<std::int32_t>& h,
                                                     std::int32_t v) {
    const auto& up = model.upper();
    const auto& down = model.lower();
    std::int32_t hi = std::numeric_limits<std::int32_t>::max(), lo = std::numeric_limits<std::int32_t>::min();
    for (std::int64_t e = up.start[v]; e < up.start[v + 1]; ++e) hi = std::min(hi, h[up.node[e]] + up.offset[e]);
    for (std::int64_t e = down.start[v]; e < down.start[v + 1]; ++e) lo = std::max(lo, h[down.node[e]] - down.offset[e]);
    round_into_class(lo, hi, model.residues()[v], model.step());
    return {lo, hi};
}

}  // namespace detail

// The nodes a site's update reads: its constraint neighbours and its rule's context.
template <class Rule>
std::vector<std::int32_t> neighbourhood(const height_model& model, const Rule& rule, std::int32_t site) {
    std::vector<std::int32_t> nodes;
    const auto& up = model.upper();
    const auto& down = model.lower();
    for (std::int64_t e = up.start[site]; e < up.start[site + 1]; ++e) nodes.push_back(up.node[e]);
    for (std::int64_t e = down.start[site]; e < down.start[site + 1]; ++e) nodes.push_back(down.node[e]);
    for (auto u : detail::context_of(rule, site)) nodes.push_back(u);
    std::sort(nodes.begin(), nodes.end());
    nodes.erase(std::unique(nodes.begin(), nodes.end()), nodes.end());
    nodes.erase(std::remove(nodes.begin(), nodes.end(), site), nodes.end());
    return nodes;
}

// Everything check_site_monotone reads about a site, with node ids replaced by
// their places in the site's neighbourhood: two sites with equal signatures get
// the identical check (same enumeration, same draws), so a regular lattice is
// checked once per kind of site instead of once per site.
template <class Rule>
std::vector<std::int64_t> site_signature(const height_model& model, const Rule& rule, std::int32_t site) {
    const auto nodes = neighbourhood(model, rule, site);
    auto place = [&](std::int32_t u) {
        return static_cast<std::int64_t>(std::lower_bound(nodes.begin(), nodes.end(), u) - nodes.begin());
    };
    std::vector<std::int64_t> s{static_cast<std::int64_t>(nodes.size()), model.residue_of(site)};
    for (auto u : nodes) s.push_back(model.residue_of(u));
    const auto& up = model.upper();
    const auto& down = model.lower();
    s.push_back(-1);
    for (std::int64_t e = up.start[site]; e < up.start[site + 1]; ++e) {
        s.push_back(place(up.node[e]));
        s.push_back(up.offset[e]);
    }
    s.push_back(-2);
    for (std::int64_t e = down.start[site]; e < down.start[site + 1]; ++e) {
        s.push_back(place(down.node[e]));
        s.push_back(down.offset[e]);
    }
    s.push_back(-3);
    for (auto u : detail::context_of(rule, site)) s.push_back(place(u));  // in the rule's order: bit k
    if constexpr (std::is_same_v<Rule, flip_rule>) s.push_back(static_cast<std::int64_t>(rule.threshold(site)));
    if constexpr (std::is_same_v<Rule, context_rule>) s.push_back(rule.table_offset(site));
    return s;
}

template <class Rule>
monotonicity_report check_site_monotone(const height_model& model, const Rule& rule, std::int32_t site,
                                        std::int32_t window, const std::vector<std::uint64_t>& test_bits) {
    if (site < 0 || site >= model.n_sites()) throw invalid_model("site out of range");
    const auto nodes = neighbourhood(model, rule, site);
    if (nodes.size() > 12) throw invalid_model("the checker handles at most 12 neighbourhood nodes per site");
    const std::int32_t step = model.step();
    const std::int32_t values = 2 * window + 1;

    monotonicity_report report;
    std::vector<std::int32_t> h(model.n_nodes(), 0), raised;
    std::vector<std::int32_t> k(nodes.size(), 0);
    auto value_of = [&](std::int32_t u, std::int32_t kk) { return model.residue_of(u) + step * (kk - window); };
    for (;;) {
        for (std::size_t i = 0; i < nodes.size(); ++i) h[nodes[i]] = value_of(nodes[i], k[i]);
        auto [lo, hi] = detail::allowed(model, h, site);
        if (lo <= hi) {
            ++report.configurations;
            for (std::size_t i = 0; i < nodes.size() && report.monotone; ++i) {
                if (k[i] + 1 >= values) continue;
                raised = h;
                raised[nodes[i]] += step;
                auto [lo2, hi2] = detail::allowed(model, raised, site);
                if (lo2 > hi2) continue;
                for (auto bits : test_bits) {
                    ++report.comparisons;
                    h[site] = lo;
                    raised[site] = lo2;
                    const auto x = rule.draw(lo, hi, bits, static_cast<std::uint64_t>(site), h.data());
                    const auto y = rule.draw(lo2, hi2, bits, static_cast<std::uint64_t>(site), raised.data());
                    if (y < x) {
                        report.monotone = false;
                        std::string around;
                        for (std::size_t j = 0; j < nodes.size(); ++j)
                            around += (j ? ", " : "") + std::to_string(nodes[j]) + ":" + std::to_string(h[nodes[j]]);
                        report.detail = "at site " + std::to_string(site) + " with neighbours {" + around +
                                        "}, raising node " + std::to_string(nodes[i]) + " by " + std::to_string(step) +
                                        " lowers the drawn height from " + std::to_string(x) + " to " +
                                        std::to_string(y) + " for the same random bits";
                        return report;
                    }
                }
            }
        }
        std::size_t i = 0;
        while (i < k.size() && ++k[i] == values) k[i++] = 0;
        if (i == k.size()) break;
    }
    return report;
}

}  // namespace frostline
