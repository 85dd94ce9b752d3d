// The generic height model (docs/design.md section 1): integer heights on sites with
// fixed boundary nodes, difference constraints h[v] - h[u] <= c(u, v), a
// residue rule h[v] = residue[v] (mod step), and colour classes of sites that
// never constrain each other. It knows no lattice: every plugin lowers its
// regions to this form, and it is the reference the fast kernels are tested
// against.
#pragma once
#include <algorithm>
#include <cstdint>
#include <string>
#include <vector>

#include "errors.hpp"

namespace frostline {

// One directed constraint: h[to] - h[from] <= bound. Node ids below
// n_sites are free sites; ids n_sites .. n_sites + n_boundary - 1 are boundary
// nodes with fixed heights.
struct constraint {
    std::int32_t from;
    std::int32_t to;
    std::int32_t bound;
};

// Adjacency of one free site in compressed (CSR) form: its height is at most
// height[node] + offset over `upper`, and at least height[node] - offset over
// `lower`.
struct neighbour_list {
    std::vector<std::int64_t> start;  // size n_sites + 1
    std::vector<std::int32_t> node;
    std::vector<std::int32_t> offset;
};

class height_model {
public:
    height_model(std::int32_t n_sites, std::vector<std::int32_t> boundary_values,
                 std::vector<constraint> constraints, std::vector<std::int32_t> residues,
                 std::int32_t step, std::vector<std::int32_t> colour_of_site)
        : n_sites_(n_sites),
          boundary_values_(std::move(boundary_values)),
          constraints_(std::move(constraints)),
          residues_(std::move(residues)),
          step_(step) {
        if (n_sites < 0) throw invalid_model("the number of sites must be non-negative");
        if (step < 1) throw invalid_model("step must be at least 1, got " + std::to_string(step));
        if (static_cast<std::int64_t>(residues_.size()) != n_sites)
            throw invalid_model("need one residue per site: got " +
                                std::to_string(residues_.size()) + " for " +
                                std::to_string(n_sites) + " sites");
        if (static_cast<std::int64_t>(colour_of_site.size()) != n_sites)
            throw invalid_model("need one colour class per site");
        for (auto& r : residues_) r = ((r % step) + step) % step;
        check_constraints();
        build_neighbours();
        build_colour_classes(colour_of_site);
    }

    std::int32_t n_sites() const { return n_sites_; }
    std::int32_t n_nodes() const { return n_sites_ + static_cast<std::int32_t>(boundary_values_.size()); }
    std::int32_t step() const { return step_; }
    const std::vector<std::int32_t>& boundary_values() const { return boundary_values_; }
    const std::vector<constraint>& constraints() const { return constraints_; }
    const std::vector<std::int32_t>& residues() const { return residues_; }
    const neighbour_list& upper() const { return upper_; }
    const neighbour_list& lower() const { return lower_; }
    std::int32_t n_colour_classes() const { return static_cast<std::int32_t>(class_start_.size()) - 1; }
    const std::vector<std::int64_t>& class_start() const { return class_start_; }
    const std::vector<std::int32_t>& class_sites() const { return class_sites_; }

    // True when `height` (one entry per node) has the boundary values, the
    // residues and satisfies every constraint; otherwise `why` says what fails.
    bool is_valid(const std::vector<std::int32_t>& height, std::string& why) const {
        if (static_cast<std::int64_t>(height.size()) != n_nodes()) {
            why = "need one height per node";
            return false;
        }
        for (std::size_t b = 0; b < boundary_values_.size(); ++b)
            if (height[n_sites_ + b] != boundary_values_[b]) {
                why = "boundary node " + std::to_string(n_sites_ + b) + " must keep its fixed height " +
                      std::to_string(boundary_values_[b]);
                return false;
            }
        for (std::int32_t v = 0; v < n_sites_; ++v)
            if (((height[v] - residues_[v]) % step_ + step_) % step_ != 0) {
                why = "site " + std::to_string(v) + " has height " + std::to_string(height[v]) +
                      ", not congruent to its residue " + std::to_string(residues_[v]) + " modulo " + std::to_string(step_);
                return false;
            }
        for (const auto& c : constraints_)
            if (static_cast<std::int64_t>(height[c.to]) - height[c.from] > c.bound) {
                why = "the heights at nodes " + std::to_string(c.from) + " and " + std::to_string(c.to) +
                      " break the constraint h[" + std::to_string(c.to) + "] - h[" + std::to_string(c.from) +
                      "] <= " + std::to_string(c.bound);
                return false;
            }
        return true;
    }

    // Residue of a node: a site's own, or the fixed value's for a boundary node.
    std::int32_t residue_of(std::int32_t node) const {
        if (node < n_sites_) return residues_[node];
        const std::int32_t v = boundary_values_[node - n_sites_];
        return ((v % step_) + step_) % step_;
    }

private:
    static constexpr std::int32_t max_magnitude = 1 << 30;  // keeps height + bound inside int32

    void check_constraints() const {
        for (std::size_t b = 0; b < boundary_values_.size(); ++b)
            if (boundary_values_[b] > max_magnitude || boundary_values_[b] < -max_magnitude)
                throw invalid_model("boundary value " + std::to_string(boundary_values_[b]) +
                                    " lies outside +-2^30");
        const std::int32_t nodes = n_nodes();
        for (std::size_t e = 0; e < constraints_.size(); ++e) {
            const auto& c = constraints_[e];
            if (c.from < 0 || c.from >= nodes || c.to < 0 || c.to >= nodes)
                throw invalid_model("constraint " + std::to_string(e) + " names node " +
                                    std::to_string(c.from < 0 || c.from >= nodes ? c.from : c.to) +
                                    ", outside 0.." + std::to_string(nodes - 1));
            if (c.bound > max_magnitude || c.bound < -max_magnitude)
                throw invalid_model("constraint " + std::to_string(e) + " has bound " + std::to_string(c.bound) +
                                    "; bounds must lie within +-2^30");
            if (c.from == c.to)
                throw invalid_model("constraint " + std::to_string(e) + " joins node " +
                                    std::to_string(c.from) + " to itself");
            // Thurston's shortest paths stay in the residue classes only when
            // every bound is congruent to the residue difference it spans.
            const std::int64_t diff = residue_of(c.to) - residue_of(c.from) - c.bound;
            if (diff % step_ != 0)
                throw invalid_model("constraint " + std::to_string(e) + " (h[" + std::to_string(c.to) +
                                    "] - h[" + std::to_string(c.from) + "] <= " + std::to_string(c.bound) +
                                    ") is not congruent to the residue difference modulo the step " +
                                    std::to_string(step_));
        }
    }

    void build_neighbours() {
        std::vector<std::int64_t> n_upper(n_sites_ + 1, 0), n_lower(n_sites_ + 1, 0);
        for (const auto& c : constraints_) {
            if (c.to < n_sites_) ++n_upper[c.to + 1];      // h[to] <= h[from] + bound
            if (c.from < n_sites_) ++n_lower[c.from + 1];  // h[from] >= h[to] - bound
        }
        for (std::int32_t v = 0; v < n_sites_; ++v) {
            n_upper[v + 1] += n_upper[v];
            n_lower[v + 1] += n_lower[v];
        }
        upper_.start = n_upper;
        lower_.start = n_lower;
        upper_.node.resize(n_upper.back());
        upper_.offset.resize(n_upper.back());
        lower_.node.resize(n_lower.back());
        lower_.offset.resize(n_lower.back());
        for (const auto& c : constraints_) {
            if (c.to < n_sites_) {
                const auto k = n_upper[c.to]++;
                upper_.node[k] = c.from;
                upper_.offset[k] = c.bound;
            }
            if (c.from < n_sites_) {
                const auto k = n_lower[c.from]++;
                lower_.node[k] = c.to;
                lower_.offset[k] = c.bound;
            }
        }
    }

    void build_colour_classes(const std::vector<std::int32_t>& labels) {
        for (std::int32_t v = 0; v < n_sites_; ++v)
            if (labels[v] < 0)
                throw invalid_model("colour class of site " + std::to_string(v) + " is negative");
        // Classes are updated in increasing label order; labels need not be
        // consecutive, so they are ranked (the class table never outgrows the sites).
        std::vector<std::int32_t> distinct(labels.begin(), labels.end());
        std::sort(distinct.begin(), distinct.end());
        distinct.erase(std::unique(distinct.begin(), distinct.end()), distinct.end());
        std::vector<std::int32_t> colour_of_site(labels.size());
        for (std::size_t v = 0; v < labels.size(); ++v)
            colour_of_site[v] = static_cast<std::int32_t>(
                std::lower_bound(distinct.begin(), distinct.end(), labels[v]) - distinct.begin());
        const auto n_classes = static_cast<std::int32_t>(distinct.size());
        // Sites of one class are updated as if simultaneously: no constraint
        // may join two of them, or the parallel update would be wrong.
        for (const auto& c : constraints_)
            if (c.from < n_sites_ && c.to < n_sites_ && colour_of_site[c.from] == colour_of_site[c.to])
                throw invalid_model("sites " + std::to_string(c.from) + " and " + std::to_string(c.to) +
                                    " share colour class " + std::to_string(colour_of_site[c.from]) +
                                    " but a constraint joins them; give them different classes");
        class_start_.assign(n_classes + 1, 0);
        for (std::int32_t v = 0; v < n_sites_; ++v) ++class_start_[colour_of_site[v] + 1];
        for (std::int32_t k = 0; k < n_classes; ++k) class_start_[k + 1] += class_start_[k];
        class_sites_.resize(n_sites_);
        std::vector<std::int64_t> fill(class_start_.begin(), class_start_.end() - 1);
        for (std::int32_t v = 0; v < n_sites_; ++v) class_sites_[fill[colour_of_site[v]]++] = v;
    }

    std::int32_t n_sites_;
    std::vector<std::int32_t> boundary_values_;
    std::vector<constraint> constraints_;
    std::vector<std::int32_t> residues_;
    std::int32_t step_;
    neighbour_list upper_, lower_;
    std::vector<std::int64_t> class_start_;
    std::vector<std::int32_t> class_sites_;
};

}  // namespace frostline
