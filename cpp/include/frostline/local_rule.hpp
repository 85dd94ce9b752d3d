// Heat-bath local rules: draw a new height from its conditional law on
// {lo, lo + step, ..., hi} by inverse CDF with one word of random bits.
//
// Every path (generic engine, fast kernels, forward chains) calls these same
// inline routines, so the same bits give the same height everywhere. Both rules
// are monotone: for fixed bits the drawn value never decreases when lo or hi
// increases, which is what monotone coupling from the past needs. The proofs
// below hold for the floating-point operations as executed, not only for real
// numbers, because rounding is monotone and no libm call is involved.
#pragma once
#include <cstdint>
#include <cstdio>
#include <limits>
#include <string>
#include <vector>

#include "errors.hpp"

namespace frostline {

// Floor division for possibly negative numerators (positive divisor).
inline std::int64_t floor_div(std::int64_t x, std::int64_t m) {
    std::int64_t q = x / m;
    return (x % m != 0 && x < 0) ? q - 1 : q;
}

// Uniform law on the allowed values. k = floor(bits * n / 2^64) is exact
// integer arithmetic (a 64 x 64 -> 128-bit product, so each value's chance is
// off by at most 2^-64); it is non-decreasing in n, and lo + step * k is
// non-decreasing in lo (raising lo by step lowers n by 1 and k by at most 1).
class uniform_rule {
public:
    explicit uniform_rule(std::int32_t step = 1) : step_(step), shift_(-1) {
        if (step <= 0) throw invalid_model("step must be positive");
        for (int s = 0; s < 31; ++s)
            if (step == (1 << s)) shift_ = s;
    }

    std::int32_t draw(std::int32_t lo, std::int32_t hi, std::uint64_t bits, std::uint64_t /*site*/,
                      const std::int32_t* /*height*/) const {
        // Steps that are powers of two (1 for boxes, 4 for dominoes) avoid an
        // integer division in the hot loop.
        const std::int32_t gap = shift_ >= 0 ? (hi - lo) >> shift_ : (hi - lo) / step_;
        const std::uint64_t count = static_cast<std::uint64_t>(gap) + 1;
        const auto k = static_cast<std::uint64_t>((static_cast<unsigned __int128>(bits) * count) >> 64);
        return lo + static_cast<std::int32_t>(k) * step_;
    }

    std::int64_t wide_intervals() const { return 0; }

private:
    std::int32_t step_;
    int shift_;
};

// Law proportional to q^(h / step): one factor q per step of the height
// (one cube per step for lozenge models). Heights are indexed by their
// position in their residue class, i(x) = floor((x - origin) / step), and the
// table holds tail sums S[j] = sum_{k >= j} q^k over the table's range, built
// from the top by repeated multiplication and addition: no pow/log is ever
// called, so results are identical on every IEEE-754 machine (the kernels are
// compiled with -ffp-contract=off). Tail sums keep full relative precision
// both for q near 1 (where 1 - q^k would cancel) and for q far from 1.
//
// For q < 1 the drawn value is the least allowed x with S[i(x) + 1] < target,
// target = (1 - u) * S[i(lo)] + u * S[i(hi) + 1], clamped to hi: exactly the
// inverse CDF, since P(X <= x) = (S[i(lo)] - S[i(x)+1]) / (S[i(lo)] - S[i(hi)+1]).
// Raising hi lowers S[i(hi)+1] and so target; raising lo lowers S[i(lo)] and
// target; either way the least such x can only rise (rounding is monotone).
// q > 1 is handled by negating heights, which turns the weight into
// (1/q)^(h'/step) and keeps the monotonicity.
class geometric_rule {
public:
    geometric_rule() = default;

    // min_height, max_height: bounds on every height the chain can visit.
    geometric_rule(double q, std::int32_t step, std::int64_t min_height, std::int64_t max_height)
        : step_(step), negate_(q > 1.0) {
        if (!(q > 0.0) || q == std::numeric_limits<double>::infinity() || q != q)
            throw invalid_model("q must be a finite positive number");
        if (step <= 0) throw invalid_model("step must be positive");
        if (q == 1.0) throw invalid_model("q = 1 is the uniform rule; use uniform_rule");
        const double ratio = negate_ ? 1.0 / q : q;
        origin_ = negate_ ? -max_height : min_height;
        const std::int64_t span = floor_div(max_height - min_height, step) + 2;
        std::vector<double> powers(static_cast<std::size_t>(span));
        double p = 1.0;
        for (auto& entry : powers) {
            entry = p;
            p *= ratio;
        }
        if (powers.back() < std::numeric_limits<double>::min()) {
            char text[64];
            std::snprintf(text, sizeof text, "%.6g", q);
            throw invalid_model(std::string("q = ") + text + " is too far from 1 for heights spanning " +
                                std::to_string(span) + " steps: q^steps underflows double precision; "
                                "choose q closer to 1 or a smaller region");
        }
        tail_.assign(powers.size() + 1, 0.0);
        for (std::size_t j = powers.size(); j-- > 0;) tail_[j] = powers[j] + tail_[j + 1];
    }

    std::int32_t draw(std::int32_t lo, std::int32_t hi, std::uint64_t bits, std::uint64_t /*site*/,
                      const std::int32_t* /*height*/) const {
        if (negate_) return -draw_decreasing(-hi, -lo, bits);
        return draw_decreasing(lo, hi, bits);
    }

    std::size_t table_size() const { return tail_.size(); }
    std::int64_t wide_intervals() const { return 0; }

    // The table as plain data, for the vector draws (frostline/vector/geometric_draws.inl).
    const double* tail() const { return tail_.data(); }
    std::int64_t origin() const { return origin_; }
    bool negated() const { return negate_; }
    std::int32_t step() const { return step_; }

private:
    std::int32_t draw_decreasing(std::int32_t lo, std::int32_t hi, std::uint64_t bits) const {
        const double u = static_cast<double>(bits >> 11) * 0x1.0p-53;
        const std::int64_t first = floor_div(static_cast<std::int64_t>(lo) - origin_, step_);
        const std::int64_t last = floor_div(static_cast<std::int64_t>(hi) - origin_, step_);
        if (first < 0 || last + 1 >= static_cast<std::int64_t>(tail_.size()))
            throw invalid_model("a height left the range the q table was built for");
        const double target = (1.0 - u) * tail_[first] + u * tail_[last + 1];
        // least j in [first, last] with tail_[j + 1] < target (monotone in j)
        std::int64_t low = first, high = last;
        while (low < high) {
            const std::int64_t mid = low + (high - low) / 2;
            if (tail_[mid + 1] < target) high = mid;
            else low = mid + 1;
        }
        return lo + static_cast<std::int32_t>(low - first) * step_;
    }

    std::int32_t step_ = 1;
    bool negate_ = false;
    std::int64_t origin_ = 0;
    std::vector<double> tail_;  // tail_[j] = sum_{k >= j} ratio^k over the table
};

// Two-point heat bath with a probability per site: the higher of two allowed
// values is taken when bits < threshold[site], i.e. with probability
// threshold / 2^64 (thresholds are computed exactly by the plugin, e.g. from
// domino edge weights). Monotone: the choice depends on the site only, and a
// forced value (lo == hi) never breaks the order. It is meant for models where
// a site never has more than two allowed values (Thurston heights of dimer
// models); a wider interval is counted in wide_intervals() and the caller
// must refuse the result.
class flip_rule {
public:
    flip_rule(std::vector<std::uint64_t> threshold, std::int32_t step)
        : threshold_(std::move(threshold)), step_(step) {
        if (step <= 0) throw invalid_model("step must be positive");
    }

    std::int32_t draw(std::int32_t lo, std::int32_t hi, std::uint64_t bits, std::uint64_t site,
                      const std::int32_t* /*height*/) const {
        if (lo == hi) return lo;
        if (hi - lo != step_) ++wide_;
        return bits < threshold_[site] ? lo + step_ : lo;
    }

    std::int64_t wide_intervals() const { return wide_; }
    std::size_t size() const { return threshold_.size(); }
    std::uint64_t threshold(std::uint64_t site) const { return threshold_[site]; }

private:
    std::vector<std::uint64_t> threshold_;
    std::int32_t step_;
    mutable std::int64_t wide_ = 0;  // one rule object per run; not shared between threads
};

// Two-point rule whose probability depends on a pattern of nearby heights
// (the "context"): bit k of the pattern is 1 when context node k of the site
// lies above the middle of the site's two allowed values. Probability of the
// higher value: table[offset[site] + pattern] / 2^64. Sites share tables
// through their offsets. Used by the six-vertex model, whose vertex weights
// read the diagonal neighbours. Monotone exactly when raising any context
// node never lowers the threshold; the monotonicity checker verifies that.
class context_rule {
public:
    context_rule(std::vector<std::int64_t> start, std::vector<std::int32_t> node, std::vector<std::int64_t> offset,
                 std::vector<std::uint64_t> table, std::int32_t step)
        : start_(std::move(start)), node_(std::move(node)), offset_(std::move(offset)), table_(std::move(table)),
          step_(step) {
        if (start_.empty() || offset_.size() + 1 != start_.size())
            throw invalid_model("context lists need start offsets for every site");
        if (start_.front() < 0 || start_.back() > static_cast<std::int64_t>(node_.size()))
            throw invalid_model("context_start must run within 0..len(context_nodes) = 0.." +
                                std::to_string(node_.size()) + ", got " + std::to_string(start_.front()) + ".." +
                                std::to_string(start_.back()));
        for (std::size_t v = 0; v + 1 < start_.size(); ++v) {
            const auto k = start_[v + 1] - start_[v];
            if (k < 0 || k > 16) throw invalid_model("a site may have at most 16 context nodes");
            if (offset_[v] < 0 || offset_[v] + (std::int64_t(1) << k) > static_cast<std::int64_t>(table_.size()))
                throw invalid_model("a site's table offset runs past the end of the context table");
        }
    }

    std::int32_t draw(std::int32_t lo, std::int32_t hi, std::uint64_t bits, std::uint64_t site,
                      const std::int32_t* height) const {
        if (lo == hi) return lo;
        if (hi - lo != step_) ++wide_;
        const std::int64_t twice_mid = static_cast<std::int64_t>(lo) + hi;
        std::uint32_t pattern = 0;
        for (std::int64_t e = start_[site], k = 0; e < start_[site + 1]; ++e, ++k)
            pattern |= static_cast<std::uint32_t>(2 * static_cast<std::int64_t>(height[node_[e]]) > twice_mid) << k;
        return bits < table_[offset_[site] + pattern] ? hi : lo;
    }

    // Every context node must index the n_nodes heights the kernel reads.
    void check_nodes(std::int64_t n_nodes) const {
        for (std::size_t e = 0; e < node_.size(); ++e)
            if (node_[e] < 0 || node_[e] >= n_nodes)
                throw invalid_model("context node " + std::to_string(node_[e]) + " (entry " + std::to_string(e) +
                                    " of context_nodes) is outside 0.." + std::to_string(n_nodes - 1));
    }

    std::int64_t wide_intervals() const { return wide_; }
    const std::vector<std::int64_t>& context_start() const { return start_; }
    std::int64_t table_offset(std::uint64_t site) const { return offset_[site]; }
    const std::vector<std::int32_t>& context_nodes() const { return node_; }

private:
    std::vector<std::int64_t> start_;
    std::vector<std::int32_t> node_;
    std::vector<std::int64_t> offset_;
    std::vector<std::uint64_t> table_;
    std::int32_t step_;
    mutable std::int64_t wide_ = 0;
};

// Round lo up and hi down into the residue class of `residue` modulo step.
inline void round_into_class(std::int32_t& lo, std::int32_t& hi, std::int32_t residue,
                             std::int32_t step) {
    if (step == 1) return;
    lo += static_cast<std::int32_t>(((residue - lo) % step + step) % step);
    hi -= static_cast<std::int32_t>(((hi - residue) % step + step) % step);
}

}  // namespace frostline
