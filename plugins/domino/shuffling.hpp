// Exact domino tilings of the (weighted) Aztec diamond by generalized domino
// shuffling (Elkies, Kuperberg, Larsen, Propp, "Alternating-sign matrices and
// domino tilings", J. Algebraic Combin. 1, 1992; Propp, "Generalized
// domino-shuffling", Theoret. Comput. Sci. 303, 2003), in O(n^3) time.
//
// Geometry. Cell (r, c) of the 2n x 2n mask has centre (c - n + 1/2,
// n - r - 1/2); lattice corners are integer points (X, Y), corner (r, c) of the
// mask (the top-left corner of cell (r, c)) sitting at (c - n, n - r). The
// faces of order k are the k^2 corners with X + Y = k - 1 (mod 2) and
// |X| + |Y| <= k - 1; face (u, v), u, v in [0, k), is the corner
// X = u + v - (k - 1), Y = u - v. Every domino position of the order-k diamond
// is one of the four edges (top, right, bottom, left) of exactly one order-k
// face: the end of its middle segment with that parity.
//
// A tiling of order k is stored as one 4-bit state per order-k face: bit T, R,
// B or L set when a domino lies on that edge of the face. The order-(k+1) face
// (u, v) sees exactly the order-k dominoes on its edges, which are the bottom
// edge of old face (u, v-1), the top of (u-1, v), the left of (u, v) and the
// right of (u-1, v-1). Shuffling step k -> k+1, face by face:
//   two dominoes (a 2x2 block)   -> both removed (the face stays empty);
//   one domino                   -> slides across the face to the opposite edge;
//   none                         -> a new pair, horizontal (T + B) or vertical
//                                   (L + R), with probability proportional to
//                                   w_T w_B : w_L w_R of the order-(k+1) weights.
// With the bit layout below "slides to the opposite edge" is the identity on
// the neighbour's bit, so the new state is one OR of four masked loads.
//
// Weights of the lower orders come from urban renewal (Propp 2003): the face
// with edge weights (w_T, w_R, w_B, w_L) and D = w_T w_B + w_L w_R becomes a
// face whose edges carry (w_B, w_L, w_T, w_R) / D, and Z(order k) =
// prod_faces D * Z(order k - 1). In the face-indexed layout the order-(k-1)
// face (a, b) takes its top weight from order-k face (a+1, b), right from
// (a+1, b+1), bottom from (a, b+1) and left from (a, b), each divided by that
// face's D. So each of the four weight arrays is renewed in place, and going
// down one order only moves the array's window (top: one row, right: one row
// and one column, bottom: one column).
//
// Randomness: step k (growing to order k) uses sweep_base(key, domino_shuffling,
// k) and, for the new pair in order-k face (u, v), site_bits(base, u * k + v).
// Horizontal when (bits >> 11) < floor(p * 2^53), p = w_T w_B / D: an integer
// comparison against thresholds computed with +, *, / only (no libm), so every
// machine draws the same tiling, provided the compiler does not contract
// a * b + c * d into an FMA (frostline builds with -ffp-contract=off). With
// p = 1/2 the rule is "top bit clear", the rule of the uniform path, so
// uniform and constant weights give the identical tiling.
#pragma once
#include <algorithm>
#include <cstdint>
#include <cstdio>
#include <cstring>
#include <limits>
#include <memory>
#include <stdexcept>
#include <string>
#include <vector>

#include "frostline/coupling_from_the_past.hpp"
#include "frostline/errors.hpp"
#include "frostline/random.hpp"
#include "frostline/thread_team.hpp"

namespace frostline::domino {

// The random stream of domino shuffling: declared as "domino_shuffling" in the
// domino LatticeSpec (domino/declaration.py); the value is part of the golden
// samples and never changes.
constexpr stream shuffling_stream = static_cast<stream>(3);

namespace shuffling_detail {

// Edge bits of a face state.
constexpr std::uint8_t top_edge = 1, right_edge = 2, bottom_edge = 4, left_edge = 8;
constexpr std::uint8_t horizontal_pair = top_edge | bottom_edge, vertical_pair = left_edge | right_edge;

constexpr double two_to_53 = 9007199254740992.0;
// Below this the thresholds of every order are kept at once (one renewal pass);
// above it orders are processed in segments (renewal done twice, far less memory).
constexpr double single_pass_bytes = 256.0 * 1024.0 * 1024.0;

inline std::string number_text(double x) {
    char text[32];
    std::snprintf(text, sizeof text, "%.17g", x);
    return text;
}

inline std::string gibibytes(double bytes) {
    const double g = bytes / (1024.0 * 1024.0 * 1024.0);
    std::string s = std::to_string(g);
    return s.substr(0, s.find('.') + 3) + " GiB";
}

// p = 1/2 everywhere (the uniform law at every order): one bit per new pair.
struct uniform_choice {
    bool horizontal(std::uint64_t bits, std::int64_t) const { return (bits >> 63) == 0; }
};

// Thresholds of one order, row-major over its faces.
struct table_choice {
    const std::uint64_t* threshold;
    bool horizontal(std::uint64_t bits, std::int64_t face) const { return (bits >> 11) < threshold[face]; }
};

// Face states of orders k and k + 1 live in (n + 2) x (n + 2) byte grids,
// face (u, v) at [u + 1][v + 1]; row 0 and column 0 stay zero and stand for
// the faces outside the diamond, so the gather needs no bounds checks.
class face_grids {
public:
    explicit face_grids(std::int64_t n, std::shared_ptr<thread_team> team = nullptr)
        : width_(n + 2), old_(static_cast<std::size_t>(width_ * width_), 0),
          new_(static_cast<std::size_t>(width_ * width_), 0), team_(std::move(team)),
          empty_(static_cast<std::size_t>(team_ ? team_->size() : 1), std::vector<std::int32_t>(
                                                                          static_cast<std::size_t>(width_))) {}

    // Step to order m (the grid `old_` holds order m - 1). Rows of new faces
    // read only the old grid and their bits depend on the face alone, so the
    // team's members take blocks of rows and the tiling does not depend on them.
    template <class Choice>
    void step(std::int64_t m, const Choice& choice, std::uint64_t base) {
        if (!team_ || m < 64) {
            for (std::int64_t u = 0; u < m; ++u) row(u, m, choice, base, empty_[0]);
        } else {
            team_->run([&](int part) {
                const auto range = team_->block(m, part);
                for (std::int64_t u = range.first; u < range.second; ++u)
                    row(u, m, choice, base, empty_[static_cast<std::size_t>(part)]);
            });
        }
        old_.swap(new_);
    }

    // State of face (u, v) of the current order.
    std::uint8_t state(std::int64_t u, std::int64_t v) const {
        return old_[static_cast<std::size_t>((u + 1) * width_ + v + 1)];
    }

private:
    // Row u of the new order m, with `empty` as scratch.
    template <class Choice>
    void row(std::int64_t u, std::int64_t m, const Choice& choice, std::uint64_t base,
             std::vector<std::int32_t>& empty) {
        const std::int64_t w = width_;
        const std::uint8_t* here = old_.data() + (u + 1) * w;  // old faces (u, v - 1) at [v]
        const std::uint8_t* above = old_.data() + u * w;       // old faces (u - 1, v - 1) at [v]
        std::uint8_t* out = new_.data() + (u + 1) * w + 1;
        // Each incoming domino keeps its bit: the bottom edge of (u, v-1)
        // slides to the bottom edge of the new face, and so on. A bit with
        // its opposite (T with B, L with R) is a colliding block: both go.
        // Faces where nothing arrived are marked `unfilled`. Branch-free,
        // so the compiler vectorises it.
        for (std::int64_t v = 0; v < m; ++v) {
            const unsigned in = static_cast<unsigned>((here[v] & bottom_edge) | (above[v + 1] & top_edge) |
                                                      (here[v + 1] & left_edge) | (above[v] & right_edge));
            out[v] = static_cast<std::uint8_t>((in & ~((in << 2) | (in >> 2)) & 15) | (in == 0 ? unfilled : 0));
        }
        // The unfilled faces, listed without branches (about one face in
        // seven, at unpredictable places), then given their new pairs.
        std::int64_t count = 0;
        for (std::int64_t v = 0; v < m; ++v) {
            empty[static_cast<std::size_t>(count)] = static_cast<std::int32_t>(v);
            count += out[v] >> 4;
        }
        for (std::int64_t i = 0; i < count; ++i) {
            const std::int64_t v = empty[static_cast<std::size_t>(i)];
            const std::int64_t face = u * m + v;
            // Arithmetic, not a branch: the choice is a coin flip the branch
            // predictor cannot learn (the branch cost a third of the shuffle).
            const unsigned vertical =
                static_cast<unsigned>(!choice.horizontal(site_bits(base, static_cast<std::uint64_t>(face)), face));
            out[v] = static_cast<std::uint8_t>(horizontal_pair + vertical * (vertical_pair - horizontal_pair));
        }
    }

    static constexpr std::uint8_t unfilled = 16;
    std::int64_t width_;
    std::vector<std::uint8_t> old_, new_;
    std::shared_ptr<thread_team> team_;
    std::vector<std::vector<std::int32_t>> empty_;  // per team member: the unfilled faces of one row
};

// The four edge-weight arrays of the faces, n x n each, renewed in place. At
// order k the window of face (u, v) starts at `offset(side, k)`.
class renewal {
public:
    explicit renewal(std::int64_t n)
        : n_(n), weight_{std::vector<double>(static_cast<std::size_t>(n * n)),
                         std::vector<double>(static_cast<std::size_t>(n * n)),
                         std::vector<double>(static_cast<std::size_t>(n * n)),
                         std::vector<double>(static_cast<std::size_t>(n * n))} {}

    // side 0 top, 1 right, 2 bottom, 3 left.
    std::int64_t offset(int side, std::int64_t k) const {
        const std::int64_t d = n_ - k;
        switch (side) {
            case 0: return d * n_;
            case 1: return d * (n_ + 1);
            case 2: return d;
            default: return 0;
        }
    }

    double& at(int side, std::int64_t k, std::int64_t u, std::int64_t v) {
        return weight_[side][static_cast<std::size_t>(offset(side, k) + u * n_ + v)];
    }

    // Writes floor(p * 2^53), p = w_T w_B / D, for every face of order k
    // (row-major, k * k entries) when `threshold` is not null, then renews the
    // weights to order k - 1.
    void step_down(std::int64_t k, std::uint64_t* threshold) {
        double* t = weight_[0].data() + offset(0, k);
        double* r = weight_[1].data() + offset(1, k);
        double* b = weight_[2].data() + offset(2, k);
        double* l = weight_[3].data() + offset(3, k);
        for (std::int64_t u = 0; u < k; ++u) {
            const std::int64_t i = u * n_;
            const bool usable = threshold != nullptr
                                    ? renew_row<true>(t + i, r + i, b + i, l + i, threshold + u * k, k)
                                    : renew_row<false>(t + i, r + i, b + i, l + i, nullptr, k);
            if (!usable) out_of_range(k, u);
        }
    }

    // Copies the order-k windows out (4 k^2 values) or back in.
    void save(std::int64_t k, std::vector<double>& out) const {
        out.resize(static_cast<std::size_t>(4 * k * k));
        double* o = out.data();
        for (int side = 0; side < 4; ++side)
            for (std::int64_t u = 0; u < k; ++u, o += k)
                std::memcpy(o, weight_[side].data() + offset(side, k) + u * n_, sizeof(double) * k);
    }

    void restore(std::int64_t k, const std::vector<double>& in) {
        const double* o = in.data();
        for (int side = 0; side < 4; ++side)
            for (std::int64_t u = 0; u < k; ++u, o += k)
                std::memcpy(weight_[side].data() + offset(side, k) + u * n_, o, sizeof(double) * k);
    }

private:
    // One row of faces; false when some D left the floating-point range. The
    // four arrays never overlap (restrict): no reloads after each store.
    template <bool with_threshold>
    static bool renew_row(double* __restrict t, double* __restrict r, double* __restrict b, double* __restrict l,
                          std::uint64_t* __restrict threshold, std::int64_t k) {
        std::uint64_t unusable = 0;
        for (std::int64_t v = 0; v < k; ++v) {
            const double horizontal = t[v] * b[v];
            const double d = horizontal + l[v] * r[v];
            unusable |= static_cast<std::uint64_t>((d > 0.0) & (d <= std::numeric_limits<double>::max())) ^ 1u;
            // p = w_T w_B / D <= 1, correctly rounded; p * 2^53 <= 2^53, so the
            // signed conversion is exact (and faster than the unsigned one).
            if (with_threshold)
                threshold[v] = static_cast<std::uint64_t>(static_cast<std::int64_t>(horizontal / d * two_to_53));
            // The weights use one reciprocal: as exact a rule as w / D, and
            // the same on every IEEE machine.
            const double inverse = 1.0 / d;
            t[v] *= inverse;
            r[v] *= inverse;
            b[v] *= inverse;
            l[v] *= inverse;
        }
        return unusable == 0;
    }

    [[noreturn]] static void out_of_range(std::int64_t k, std::int64_t u) {
        throw invalid_model("urban renewal left the floating-point range at order " + std::to_string(k) +
                            " (face row " + std::to_string(u) +
                            "); the weights span too many orders of magnitude for double precision");
    }

    std::int64_t n_;
    std::vector<double> weight_[4];
};

// Reads the order-n face weights from the mask arrays, checking every
// position inside the diamond (positions outside are ignored). A null array
// stands for weight 1. Weights are divided by their largest value, which
// changes no probability and keeps the renewal away from overflow.
inline void load_weights(std::int64_t n, const double* horizontal, const double* vertical, renewal& w) {
    const std::int64_t cols_h = 2 * n - 1, cols_v = 2 * n;
    auto read = [](const double* a, const char* name, std::int64_t r, std::int64_t c, std::int64_t cols) {
        if (a == nullptr) return 1.0;
        const double x = a[r * cols + c];
        if (!(x > 0.0 && x <= std::numeric_limits<double>::max()))
            throw invalid_model(std::string(name) + "[" + std::to_string(r) + ", " + std::to_string(c) + "] = " +
                                number_text(x) +
                                " is not a usable weight: every domino position inside the diamond needs a "
                                "positive finite weight (zero weights are not supported by shuffling)");
        return x;
    };
    double largest = 0.0;
    for (std::int64_t u = 0; u < n; ++u)
        for (std::int64_t v = 0; v < n; ++v) {
            // Face (u, v) is mask corner (r, c), the top-left corner of cell (r, c).
            const std::int64_t r = n - u + v, c = u + v + 1;
            const double t = read(horizontal, "horizontal", r - 1, c - 1, cols_h);
            const double rt = read(vertical, "vertical", r - 1, c, cols_v);
            const double b = read(horizontal, "horizontal", r, c - 1, cols_h);
            const double l = read(vertical, "vertical", r - 1, c - 1, cols_v);
            w.at(0, n, u, v) = t;
            w.at(1, n, u, v) = rt;
            w.at(2, n, u, v) = b;
            w.at(3, n, u, v) = l;
            largest = std::max({largest, t, rt, b, l});
        }
    for (int side = 0; side < 4; ++side)
        for (std::int64_t u = 0; u < n; ++u)
            for (std::int64_t v = 0; v < n; ++v) w.at(side, n, u, v) /= largest;
}

// Orders are processed in segments of `length` orders: the thresholds of one
// segment are kept, and the weights at each segment's top order are saved.
struct segment_plan {
    std::int64_t length = 1;
    double bytes = 0.0;
};

inline double thresholds_bytes(std::int64_t lo, std::int64_t hi) {  // orders lo..hi
    auto cube_sum = [](double m) { return m * (m + 1) * (2 * m + 1) / 6; };
    return 8.0 * (cube_sum(static_cast<double>(hi)) - cube_sum(static_cast<double>(lo - 1)));
}

inline double plan_bytes(std::int64_t n, std::int64_t length) {
    double saved = 0.0, largest_segment = 0.0;
    for (std::int64_t hi = n; hi > 0; hi -= length) {
        const std::int64_t lo = std::max<std::int64_t>(1, hi - length + 1);
        saved += 8.0 * 4.0 * static_cast<double>(hi) * static_cast<double>(hi);
        largest_segment = std::max(largest_segment, thresholds_bytes(lo, hi));
    }
    const double nn = static_cast<double>(n) * static_cast<double>(n);
    return saved + largest_segment + 8.0 * 4.0 * nn;  // + the working weight arrays
}

// `length` > 0 forces that segment length (a testing aid: the tiling does not
// depend on it); 0 picks one pass when it fits single_pass_bytes, else the
// length with the least memory.
inline segment_plan plan_segments(std::int64_t n, std::int64_t length = 0) {
    if (length > 0) {
        length = std::min(length, n);
        return {length, plan_bytes(n, length)};
    }
    segment_plan best{n, plan_bytes(n, n)};
    if (best.bytes <= single_pass_bytes) return best;
    for (std::int64_t candidate = 1; candidate < n; ++candidate) {
        const double bytes = plan_bytes(n, candidate);
        if (bytes < best.bytes) best = {candidate, bytes};
    }
    return best;
}

// Bytes of the face grids, the cell map and the output (int32 here, int64 in
// the array handed to Python: 48 bytes per domino).
inline double common_bytes(std::int64_t n) {
    const double nn = static_cast<double>(n) * static_cast<double>(n);
    return 2.0 * (static_cast<double>(n) + 2) * (static_cast<double>(n) + 2) + 4.0 * nn + 48.0 * (nn + static_cast<double>(n));
}

// The tiling from the order-n face states: dominoes as (r1, c1, r2, c2), the
// first cell top or left, sorted by the first cell.
inline std::vector<std::int32_t> tiles(std::int64_t n, const face_grids& faces) {
    const std::int64_t side = 2 * n;
    // 1: first cell of a horizontal domino, 2: of a vertical one.
    std::vector<std::uint8_t> first(static_cast<std::size_t>(side * side), 0);
    auto mark = [&](std::int64_t r, std::int64_t c, std::uint8_t kind) {
        first[static_cast<std::size_t>(r * side + c)] = kind;
    };
    for (std::int64_t u = 0; u < n; ++u)
        for (std::int64_t v = 0; v < n; ++v) {
            const std::int64_t r = n - u + v, c = u + v + 1;  // the face's corner
            const std::uint8_t s = faces.state(u, v);
            if (s & top_edge) mark(r - 1, c - 1, 1);
            if (s & bottom_edge) mark(r, c - 1, 1);
            if (s & left_edge) mark(r - 1, c - 1, 2);
            if (s & right_edge) mark(r - 1, c, 2);
        }
    std::vector<std::int32_t> out;
    out.reserve(static_cast<std::size_t>(4 * n * (n + 1)));
    for (std::int64_t r = 0; r < side; ++r)
        for (std::int64_t c = 0; c < side; ++c) {
            const std::uint8_t kind = first[static_cast<std::size_t>(r * side + c)];
            if (kind == 0) continue;
            out.insert(out.end(), {static_cast<std::int32_t>(r), static_cast<std::int32_t>(c),
                                   static_cast<std::int32_t>(kind == 1 ? r : r + 1),
                                   static_cast<std::int32_t>(kind == 1 ? c + 1 : c)});
        }
    if (out.size() != static_cast<std::size_t>(4 * n * (n + 1)))
        throw std::logic_error("domino shuffling produced a wrong number of dominoes (a bug in frostline)");
    return out;
}

}  // namespace shuffling_detail

// Upper bound on what aztec_shuffle allocates, in bytes.
inline double aztec_shuffle_bytes(std::int64_t n, bool weighted, std::int64_t segment_length = 0) {
    using namespace shuffling_detail;
    if (n <= 0) return 0.0;
    return common_bytes(n) + (weighted ? plan_segments(n, segment_length).bytes : 0.0);
}

// Throws invalid_model, naming the estimate, when it exceeds `limit_bytes`
// (the caller's memory policy: FROSTLINE_MEMORY_LIMIT, read by Python).
inline void check_aztec_memory(std::int64_t n, bool weighted, std::int64_t segment_length, double limit_bytes) {
    using namespace shuffling_detail;
    const double bytes = aztec_shuffle_bytes(n, weighted, segment_length);
    if (bytes > limit_bytes)
        throw invalid_model("shuffling the " + std::string(weighted ? "weighted " : "") +
                            "Aztec diamond of order " + std::to_string(n) + " needs about " + gibibytes(bytes) +
                            " of memory, over the limit of " + gibibytes(limit_bytes) +
                            "; use a smaller order" +
                            (weighted ? " (or omit the weights: the uniform case needs no weight tables)" : "") +
                            ", or raise FROSTLINE_MEMORY_LIMIT (bytes)");
}

// One exact tiling of the Aztec diamond of order n. `horizontal` (2n x
// (2n - 1), row-major) and `vertical` ((2n - 1) x 2n) are the weights of the
// dominoes covering (r, c)+(r, c+1) and (r, c)+(r+1, c); null means weight 1
// everywhere, both null the uniform law. Returns n(n+1) dominoes as
// (r1, c1, r2, c2) rows, first cell top or left, sorted lexicographically.
// Throws invalid_model for bad weights or when the memory estimate exceeds
// limit_bytes, cancelled when control->keep_going returns false (polled by the
// engine's poller about every 2^22 face updates). segment_length:
// orders whose weight tables are kept at once (0: automatic; see
// plan_segments); it changes memory and time, never the tiling.
inline std::vector<std::int32_t> aztec_shuffle(std::int64_t n, const double* horizontal, const double* vertical,
                                               random_key key, const run_control* control = nullptr,
                                               std::int64_t segment_length = 0,
                                               double limit_bytes = 2.0 * 1024.0 * 1024.0 * 1024.0,
                                               std::shared_ptr<thread_team> team = nullptr) {
    using namespace shuffling_detail;
    if (n < 0) throw invalid_model("the order n of the Aztec diamond must be >= 0, got " + std::to_string(n));
    if (segment_length < 0)
        throw invalid_model("segment_length must be >= 0 (0: automatic), got " + std::to_string(segment_length));
    if (n == 0) return {};
    const bool weighted = horizontal != nullptr || vertical != nullptr;
    check_aztec_memory(n, weighted, segment_length, limit_bytes);

    // the engine's one poller; every 2^22 face updates is a few milliseconds. The caller's hook is
    // reached through a pointer, never copied: it may hold Python objects, whose reference counts must
    // not change here, where the GIL is released (copying it raced on the count of None and crashed
    // ensembles of shuffled samples on several threads).
    run_control polling;
    polling.poll_interval = std::int64_t(1) << 22;
    if (control != nullptr && control->keep_going)
        polling.keep_going = [control](const run_progress& p) { return control->keep_going(p); };
    const frostline::detail::stopwatch clock;
    frostline::detail::poller poll(polling, clock);
    face_grids faces(n, std::move(team));
    auto grow = [&](std::int64_t k, const auto& choice) {
        faces.step(k, choice, sweep_base(key, shuffling_stream, k));
        poll.add(k * k, k);
    };

    if (!weighted) {
        for (std::int64_t k = 1; k <= n; ++k) grow(k, uniform_choice{});
        poll.poll(n);
        return tiles(n, faces);
    }

    renewal weights(n);
    load_weights(n, horizontal, vertical, weights);
    const segment_plan plan = plan_segments(n, segment_length);
    // Segment tops, lowest first; the weights at each top are saved.
    std::vector<std::int64_t> tops;
    for (std::int64_t hi = n; hi > 0; hi -= plan.length) tops.push_back(hi);
    std::reverse(tops.begin(), tops.end());
    std::vector<std::vector<double>> saved(tops.size());
    weights.save(n, saved.back());
    for (std::size_t j = tops.size() - 1; j > 0; --j) {  // one renewal pass down to the lowest top
        for (std::int64_t k = tops[j]; k > tops[j - 1]; --k) {
            weights.step_down(k, nullptr);
            poll.add(k * k, k);
        }
        weights.save(tops[j - 1], saved[j - 1]);
    }

    std::vector<std::uint64_t> threshold;
    std::vector<std::int64_t> start;  // start[k - lo]: where order k's thresholds begin
    std::int64_t lo = 1;
    for (std::size_t j = 0; j < tops.size(); ++j) {
        const std::int64_t hi = tops[j];
        weights.restore(hi, saved[j]);
        std::vector<double>().swap(saved[j]);
        start.assign(static_cast<std::size_t>(hi - lo + 1), 0);
        std::int64_t size = 0;
        for (std::int64_t k = lo; k <= hi; ++k) {
            start[static_cast<std::size_t>(k - lo)] = size;
            size += k * k;
        }
        threshold.resize(static_cast<std::size_t>(size));
        for (std::int64_t k = hi; k >= lo; --k) {
            weights.step_down(k, threshold.data() + start[static_cast<std::size_t>(k - lo)]);
            poll.add(k * k, k);
        }
        for (std::int64_t k = lo; k <= hi; ++k)
            grow(k, table_choice{threshold.data() + start[static_cast<std::size_t>(k - lo)]});
        lo = hi + 1;
    }
    poll.poll(n);
    return tiles(n, faces);
}

}  // namespace frostline::domino
