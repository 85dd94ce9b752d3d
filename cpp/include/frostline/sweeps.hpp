// Heat-bath sweeps of the generic height model. One sweep at time t updates
// every colour class in order; each site reads its random bits from
// (key, stream, t, site), so a sweep is a pure function of the state and t.
#pragma once
#include <algorithm>
#include <cstdint>
#include <limits>
#include <utility>
#include <vector>

#include "height_model.hpp"
#include "local_rule.hpp"
#include "random.hpp"

namespace frostline {

// Heights live in one array over all nodes: sites first, then the boundary.
template <class Rule>
class generic_sweeper {
public:
    generic_sweeper(const height_model& model, Rule rule, random_key key, stream s)
        : model_(model), rule_(rule), key_(key), stream_(s) {}

    std::int64_t n_sites() const { return model_.n_sites(); }
    const Rule& rule() const { return rule_; }

    void sweep(std::int32_t* height, std::int64_t time) const {
        const std::uint64_t base = sweep_base(key_, stream_, time);
        for_each_site([&](std::int32_t v) {
            auto [lo, hi] = bounds(height, v);
            height[v] = rule_.draw(lo, hi, site_bits(base, static_cast<std::uint64_t>(v)), v, height);
        });
    }

    // Both CFTP chains in one pass, each site's bits computed once.
    void sweep_pair(std::int32_t* top, std::int32_t* bottom, std::int64_t time) const {
        const std::uint64_t base = sweep_base(key_, stream_, time);
        for_each_site([&](std::int32_t v) {
            const std::uint64_t bits = site_bits(base, static_cast<std::uint64_t>(v));
            auto [lo_t, hi_t] = bounds(top, v);
            auto [lo_b, hi_b] = bounds(bottom, v);
            top[v] = rule_.draw(lo_t, hi_t, bits, v, top);
            bottom[v] = rule_.draw(lo_b, hi_b, bits, v, bottom);
        });
    }

private:
    // Visits the sites colour class by colour class, in increasing class order.
    template <class Visit>
    void for_each_site(Visit&& visit) const {
        const auto& sites = model_.class_sites();
        const auto& starts = model_.class_start();
        for (std::size_t k = 0; k + 1 < starts.size(); ++k)
            for (std::int64_t i = starts[k]; i < starts[k + 1]; ++i) visit(sites[i]);
    }

    // The interval allowed by the neighbours, rounded into the site's residue class.
    std::pair<std::int32_t, std::int32_t> bounds(const std::int32_t* height, std::int32_t v) const {
        const auto& up = model_.upper();
        const auto& down = model_.lower();
        std::int32_t hi = std::numeric_limits<std::int32_t>::max();
        for (std::int64_t e = up.start[v]; e < up.start[v + 1]; ++e)
            hi = std::min(hi, height[up.node[e]] + up.offset[e]);
        std::int32_t lo = std::numeric_limits<std::int32_t>::min();
        for (std::int64_t e = down.start[v]; e < down.start[v + 1]; ++e)
            lo = std::max(lo, height[down.node[e]] - down.offset[e]);
        round_into_class(lo, hi, model_.residues()[v], model_.step());
        return {lo, hi};
    }

    const height_model& model_;
    Rule rule_;  // by value: small, and chains outlive the caller's copy
    random_key key_;
    stream stream_;
};

}  // namespace frostline
