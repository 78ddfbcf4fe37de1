// counterflux/table.hpp - lookup tables on uniform axes: linear (1-D) and
// bilinear (2-D) interpolation in float or double, and the same on q15 data
// (int16 with a stated scale and offset) with an integer-only path for a
// microcontroller without FPU.
//
// Algorithm: piecewise-linear and bilinear interpolation on a regular grid
// (Press, Teukolsky, Vetterling & Flannery, Numerical Recipes, 3rd ed., 2007,
// sec. 3.6.1, eq. 3.6.5):
//     v(x0, x1) = (1 - f0) [(1 - f1) v(i0, i1) + f1 v(i0, i1 + 1)]
//               +      f0  [(1 - f1) v(i0 + 1, i1) + f1 v(i0 + 1, i1 + 1)],
// with i = floor((x - origin) / step) and f = (x - origin) / step - i. On a
// uniform axis the cell is found without search: the position t = (x - origin)
// * (1/step) uses the stored reciprocal of the step (no division per call).
//
// Rules (docs/models.md, "Compensation tables"):
//   - the index is a floor, never a truncation towards zero: positions below the
//     origin clamp to the first node, they never extrapolate from cell 0;
//   - the last node is reachable: x at or beyond the last node gives index
//     count - 2 with fraction exactly 1, so the value is exactly the last node's;
//     "at" includes x within 16 eps max(|origin|, |last|) of the derived last node
//     (which may miss the requested end by rounding), unflagged, so x = `to`
//     always reads the last node; above_range only beyond that tolerance;
//   - an axis that is not ascending (inv_step not > 0: from == to, to < from)
//     reads with out_of_domain;
//   - out-of-range inputs clamp to the edge and set the axis flag
//     (first_axis_below / first_axis_above for axis 0 = temperature,
//     second_axis_below / second_axis_above for axis 1 = pressure) together with
//     the generic below_range / above_range; NaN clamps to the first node and
//     sets not_finite, +-inf clamps to its edge and sets not_finite;
//   - q15: an int16 q stands for offset + scale * q / 32768; encoding rounds to
//     nearest and saturates; the interpolation weights are Q15 integers f and
//     32768 - f, so 1 - fraction is exact, and the blends round to nearest.
#ifndef COUNTERFLUX_TABLE_HPP
#define COUNTERFLUX_TABLE_HPP

#include <array>
#include <cstddef>
#include <cstdint>
#include <limits>

#include "detail/math.hpp"
#include "status.hpp"

namespace counterflux {

// ---------------------------------------------------------------------------
// Uniform axes

/// A uniform axis: node i is origin + i * step, for i in 0 .. count - 1 (count >= 2);
/// inv_step = 1 / step is stored so that a lookup never divides.
template <class T>
struct uniform_axis {
    T origin;           ///< first node, in the unit of the axis (K, Pa, ...)
    T step;             ///< node spacing, unit of the axis
    T inv_step;         ///< 1 / step; 0 (or any value not > 0) marks an axis every lookup flags out_of_domain
    std::size_t count;  ///< number of nodes, >= 2
};

/// The axis of count nodes from `from` to `to` (count < 2 is raised to 2). The
/// step is (to - from) / (count - 1), nudged by at most an ulp where that makes
/// the last node equal `to` exactly; inv_step = 1 / step, or 0 unless to > from
/// (a degenerate or descending axis: every lookup on it flags out_of_domain).
/// Where no step hits `to` exactly, x within the edge tolerance of the last node
/// (detail::edge_tolerance) reads the last node: x = `to` always does.
template <class T>
constexpr uniform_axis<T> make_uniform_axis(T from, T to, std::size_t count) noexcept {
    const std::size_t n = count < 2u ? std::size_t(2) : count;
    const T cells = static_cast<T>(n - 1u);
    T step = (to - from) / cells;
    // (to - from) / cells is the correctly rounded step, but from + cells * step may
    // miss `to` by an ulp; a neighbour of the step often hits it exactly.
    if (from + cells * step != to) {
        const T eps = std::numeric_limits<T>::epsilon();
        const T candidates[2] = {step + step * eps, step - step * eps};
        for (const T c : candidates)
            if (from + cells * c == to) { step = c; break; }
    }
    // Only an ascending axis gets a reciprocal: from == to, to < from or a NaN end
    // leave inv_step 0, which every lookup flags out_of_domain.
    const T inv = step > T(0) ? T(1) / step : T(0);
    return uniform_axis<T>{from, step, detail::finite(inv) ? inv : T(0), n};
}

/// Node i of axis a: origin + i * step, in the unit of the axis.
template <class T>
constexpr T axis_node(const uniform_axis<T>& a, std::size_t i) noexcept {
    return a.origin + static_cast<T>(i) * a.step;
}

/// Where x lies on an axis: value = (1 - fraction) v[index] + fraction v[index + 1].
template <class T>
struct axis_position {
    std::size_t index;  ///< cell, 0 .. count - 2
    T fraction;         ///< position in the cell, 0 .. 1 (exactly 1 at the last node)
    status code;        ///< ok, or the axis flag with below_range / above_range, not_finite
};

namespace detail {

/// The flags of an axis lookup as a status: each set bool contributes its flag.
constexpr status axis_flags(bool below, bool above, bool not_finite_input, status below_flag,
                            status above_flag) noexcept {
    const std::uint16_t none = 0u;
    const std::uint16_t b = below ? static_cast<std::uint16_t>(below_flag | status::below_range) : none;
    const std::uint16_t a = above ? static_cast<std::uint16_t>(above_flag | status::above_range) : none;
    const std::uint16_t n = not_finite_input ? static_cast<std::uint16_t>(status::not_finite) : none;
    return static_cast<status>(static_cast<std::uint16_t>(b | a | n));
}

/// One linear blend (1 - f) v0 + f v1.
template <class T>
[[gnu::always_inline]] constexpr T lerp(T v0, T v1, T f) noexcept {
    return (T(1) - f) * v0 + f * v1;
}

/// Bilinear blend of the cell at (p0, p1) of values[i0 * stride + i1].
template <class T>
[[gnu::always_inline]] constexpr T bilinear(const T* values, std::size_t stride, const axis_position<T>& p0,
                     const axis_position<T>& p1) noexcept {
    const T* row0 = values + p0.index * stride + p1.index;
    const T* row1 = row0 + stride;
    return lerp(lerp(row0[0], row0[1], p1.fraction), lerp(row1[0], row1[1], p1.fraction), p0.fraction);
}

}  // namespace detail

namespace detail {

/// The position t of an edge input clamped to [0, top] (NaN to 0).
template <class T>
[[gnu::always_inline]] constexpr T clamp_position(T t, T top) noexcept {
    t = t > T(0) ? t : T(0);  // also maps NaN to 0
    return t < top ? t : top;
}

/// The cell of a clamped position t: its floor, limited to the last cell.
template <class T>
[[gnu::always_inline]] constexpr std::ptrdiff_t clamped_cell(T t, std::ptrdiff_t cells) noexcept {
    const std::ptrdiff_t i = static_cast<std::ptrdiff_t>(t);  // t >= 0: the truncation is the floor
    return i < cells - 1 ? i : cells - 1;
}

/// The fraction of a clamped position t in cell i: exactly 1 at or beyond the last node.
template <class T>
[[gnu::always_inline]] constexpr T clamped_fraction(T t, std::ptrdiff_t i, bool at_last) noexcept {
    const T f = t - static_cast<T>(i);  // in [0, 1]
    return at_last ? T(1) : f;          // the last node exactly, whatever t rounded to
}

/// The flags of an edge input x on an axis from origin to last (last already
/// widened by the edge tolerance).
template <class T>
[[gnu::always_inline]] constexpr status edge_flags(T x, T origin, T last, status below_flag,
                                                   status above_flag) noexcept {
    // One test for NaN and +-inf: neither lies within [-max, max]; x < origin is false for NaN.
    const bool not_finite_x = !(x >= -std::numeric_limits<T>::max() && x <= std::numeric_limits<T>::max());
    return axis_flags(x < origin, x > last, not_finite_x, below_flag, above_flag);
}

/// How far x may lie from the derived last node origin + cells * step and still
/// count as AT it: 16 eps max(|origin|, |last|), which is at least
/// 8 eps (|origin| + |last|). The derived last node carries the rounding of the
/// step (or of 1 / inv_step) and of the sum, a few ulps of the larger end, so it
/// can miss the requested `to` on either side; within this tolerance x reads the
/// last node exactly and sets no flag. On an ascending axis (origin <= last, the
/// only kind that reads) max(|origin|, |last|) = max(last, -origin): one select.
template <class T>
[[gnu::always_inline]] constexpr T edge_tolerance(T origin, T last) noexcept {
    const T larger = last > -origin ? last : -origin;
    return T(16) * std::numeric_limits<T>::epsilon() * larger;
}

/// locate() for the inputs its fast path does not take: at or beyond an edge,
/// not finite, or on an axis that is not ascending (inv_step not > 0, flagged
/// out_of_domain). Clamps and flags; branch-free selects. x within the edge
/// tolerance of the last node is at it: the last cell with fraction exactly 1.
template <class T>
constexpr axis_position<T> locate_edge(T x, T t, T top, T last, std::ptrdiff_t cells, status below_flag,
                                       status above_flag, T origin, T inv_step) noexcept {
    const T tol = edge_tolerance(origin, last);
    const bool at_last = x >= last - tol;
    t = at_last ? top : clamp_position(t, top);  // top - (cells - 1) is exactly 1
    const std::ptrdiff_t i = clamped_cell(t, cells);
    const status code = edge_flags(x, origin, last + tol, below_flag, above_flag);
    return axis_position<T>{static_cast<std::size_t>(i), t - static_cast<T>(i),
                            inv_step > T(0) ? code : code | status::out_of_domain};
}

}  // namespace detail

namespace detail {

/// locate() on an axis of `cells` cells (count - 1, at least 1), given apart from
/// the axis so that fixed-size tables pass a constant.
/// The position t = (x - origin) / step of x in cells, with the stored reciprocal.
template <class T>
[[gnu::always_inline]] constexpr T position(const uniform_axis<T>& a, T x) noexcept {
    return (x - a.origin) * a.inv_step;
}

/// True when position t is strictly inside an axis of `cells` cells, far enough from
/// the last node that x is surely below it. x - origin > 0 exactly when x > origin,
/// so t > 0 is the lower edge test (NaN fails it, and so does every x on an axis
/// with inv_step 0, which the edge path flags; x at the origin reads the same
/// there). At the upper edge t carries the
/// rounding of x - origin, of inv_step and of the last node (a few eps relative): t
/// below top (1 - 8 eps) is surely below the last node, and the few inputs closer to
/// it take the exact test on x in locate_edge.
template <class T>
[[gnu::always_inline]] constexpr bool inside(T t, std::ptrdiff_t cells) noexcept {
    const T top = static_cast<T>(cells);
    return t > T(0) && t < top - top * (T(8) * std::numeric_limits<T>::epsilon());
}

/// The cell and fraction of a position t that is inside().
template <class T>
[[gnu::always_inline]] constexpr axis_position<T> position_inside(T t) noexcept {
    const std::ptrdiff_t i = static_cast<std::ptrdiff_t>(t);  // t >= 0: the truncation is the floor
    return axis_position<T>{static_cast<std::size_t>(i), t - static_cast<T>(i), status::ok};
}

template <class T>
constexpr axis_position<T> locate_cells(const uniform_axis<T>& a, std::ptrdiff_t cells, T x, status below_flag,
                                        status above_flag) noexcept {
    const T t = position(a, x);
    if (inside(t, cells)) return position_inside(t);  // the fast path, for x strictly inside
    const T top = static_cast<T>(cells);
    return locate_edge(x, t, top, a.origin + top * a.step, cells, below_flag, above_flag, a.origin, a.inv_step);
}

/// The cells of a runtime-sized axis: count - 1, at least 1.
template <class T>
constexpr std::ptrdiff_t cells_of(const uniform_axis<T>& a) noexcept {
    return a.count >= 2u ? static_cast<std::ptrdiff_t>(a.count) - 1 : 1;
}

/// locate() without its fast path, for the kernels' edge paths (one copy serves
/// every axis): the same cell, fraction and flags for every x, branch-free.
/// locate_clamped on an axis given by its scalars (in registers, nothing on the
/// stack): the one out-of-line copy every edge path calls.
template <class T>
[[gnu::noinline]] constexpr axis_position<T> locate_clamped_scalar(T x, T origin, T step, T inv_step,
                                                                   std::ptrdiff_t cells, status below_flag,
                                                                   status above_flag) noexcept {
    const T top = static_cast<T>(cells);
    return locate_edge(x, (x - origin) * inv_step, top, origin + top * step, cells, below_flag, above_flag, origin,
                       inv_step);
}

template <class T>
[[gnu::always_inline]] constexpr axis_position<T> locate_clamped(const uniform_axis<T>& a, T x, status below_flag,
                                                                 status above_flag) noexcept {
    return locate_clamped_scalar(x, a.origin, a.step, a.inv_step, cells_of(a), below_flag, above_flag);
}

/// Bits of a packed edge cell (locate_compact_cell): the cell index below bit 15 (so
/// at most 32767 cells), bit 15 set at (within the edge tolerance) or beyond the
/// last node, the status above.
inline constexpr std::uint32_t packed_index_mask = 0x7fffu;
inline constexpr std::uint32_t packed_at_last = 0x8000u;  ///< x at or beyond the last node: fraction exactly 1
inline constexpr unsigned packed_status_shift = 16u;      ///< the status sits in bits 16 .. 31

/// The axis_position of an edge input from its packed cell (locate_compact_cell)
/// and its unclamped position t: the same cell, fraction and flags as locate_clamped.
template <class T>
[[gnu::always_inline]] constexpr axis_position<T> edge_position(std::uint32_t packed, T t) noexcept {
    const std::ptrdiff_t i = static_cast<std::ptrdiff_t>(packed & packed_index_mask);
    // Without packed_at_last t < top (see locate_compact_cell): the lower clamp is the whole clamp.
    return axis_position<T>{static_cast<std::size_t>(i),
                            clamped_fraction(t > T(0) ? t : T(0), i, (packed & packed_at_last) != 0u),
                            static_cast<status>(static_cast<std::uint16_t>(packed >> packed_status_shift))};
}

}  // namespace detail

/// The cell and fraction of x on an ascending axis a, clamped to the axis: below
/// the first node (or NaN) index 0 / fraction 0, at or above the last node index
/// count - 2 / fraction 1. below_flag or above_flag (with below_range /
/// above_range) when x is outside [first node, last node]; not_finite for NaN or
/// +-inf. Search-free and division-free; an input inside the axis takes one
/// well-predicted branch past the clamps and flags. Signed index arithmetic:
/// float <-> signed integer conversions are single instructions on x86-64 and
/// Cortex-M4F, unsigned 64-bit ones are not.
template <class T>
constexpr axis_position<T> locate(const uniform_axis<T>& a, T x, status below_flag, status above_flag) noexcept {
    return detail::locate_cells(a, detail::cells_of(a), x, below_flag, above_flag);
}

namespace detail {

/// 1-D lookup on an axis of `cells` cells with the caller's axis flags (no checks).
template <class T>
constexpr result<T> interpolate_1d_cells(const uniform_axis<T>& a, std::ptrdiff_t cells, const T* values, T x,
                                         status below_flag, status above_flag) noexcept {
    const axis_position<T> p = locate_cells(a, cells, x, below_flag, above_flag);
    return {lerp(values[p.index], values[p.index + 1u], p.fraction), p.code};
}

/// 1-D lookup with the caller's axis flags; out_of_domain and 0 when values is
/// null or the axis has fewer than 2 nodes.
template <class T>
constexpr result<T> interpolate_1d_flagged(const uniform_axis<T>& a, const T* values, T x, status below_flag,
                                           status above_flag) noexcept {
    if (values == nullptr || a.count < 2u) return {T(0), status::out_of_domain};
    return interpolate_1d_cells(a, cells_of(a), values, x, below_flag, above_flag);
}

/// 2-D lookup on axes of c0 and c1 cells, values[i0 * (c1 + 1) + i1] (no checks).
template <class T>
constexpr result<T> interpolate_2d_cells(const uniform_axis<T>& a0, std::ptrdiff_t c0, const uniform_axis<T>& a1,
                                         std::ptrdiff_t c1, const T* values, T x0, T x1) noexcept {
    const axis_position<T> p0 = locate_cells(a0, c0, x0, status::first_axis_below, status::first_axis_above);
    const axis_position<T> p1 = locate_cells(a1, c1, x1, status::second_axis_below, status::second_axis_above);
    return {bilinear(values, static_cast<std::size_t>(c1) + 1u, p0, p1), p0.code | p1.code};
}

}  // namespace detail

/// Linear interpolation of values[0 .. a.count - 1] on axis a at x, in the unit
/// of the values. Clamped at the edges with first_axis_below / first_axis_above
/// (and below_range / above_range); not_finite for non-finite x; out_of_domain and
/// 0 for null data or an axis of fewer than 2 nodes.
template <class T>
constexpr result<T> interpolate_1d(const uniform_axis<T>& a, const T* values, T x) noexcept {
    return detail::interpolate_1d_flagged(a, values, x, status::first_axis_below, status::first_axis_above);
}

/// Bilinear interpolation of values[i0 * a1.count + i1] on axes a0 (first, e.g.
/// temperature) and a1 (second, e.g. pressure) at (x0, x1), in the unit of the
/// values. Clamped at every edge with that axis's flag; not_finite for
/// non-finite input; out_of_domain and 0 for null data or a short axis.
template <class T>
constexpr result<T> interpolate_2d(const uniform_axis<T>& a0, const uniform_axis<T>& a1, const T* values, T x0,
                                   T x1) noexcept {
    if (values == nullptr || a0.count < 2u || a1.count < 2u) return {T(0), status::out_of_domain};
    return detail::interpolate_2d_cells(a0, detail::cells_of(a0), a1, detail::cells_of(a1), values, x0, x1);
}

// ---------------------------------------------------------------------------
// Fixed-size float / double tables

/// N values on a uniform axis, interpolated linearly.
template <class T, std::size_t N>
struct table_1d {
    static_assert(N >= 2, "a table needs at least two nodes");
    uniform_axis<T> axis;     ///< the axis (count == N)
    std::array<T, N> values;  ///< value at each node

    /// The interpolated value at x (see interpolate_1d), unit of the values.
    /// (The size N, not axis.count, bounds the reads.)
    constexpr result<T> operator()(T x) const noexcept {
        return detail::interpolate_1d_cells(axis, std::ptrdiff_t(N) - 1, values.data(), x, status::first_axis_below,
                                            status::first_axis_above);
    }
};

/// N0 x N1 values on two uniform axes, interpolated bilinearly; values[i0 * N1 + i1].
template <class T, std::size_t N0, std::size_t N1>
struct table_2d {
    static_assert(N0 >= 2 && N1 >= 2, "a table needs at least two nodes per axis");
    uniform_axis<T> axis0;          ///< first axis (temperature), count == N0
    uniform_axis<T> axis1;          ///< second axis (pressure), count == N1
    std::array<T, N0 * N1> values;  ///< row-major: values[i0 * N1 + i1]

    /// The interpolated value at (x0, x1) (see interpolate_2d), unit of the values.
    /// (The sizes N0, N1, not the axes' counts, bound the reads.)
    constexpr result<T> operator()(T x0, T x1) const noexcept {
        return detail::interpolate_2d_cells(axis0, std::ptrdiff_t(N0) - 1, axis1, std::ptrdiff_t(N1) - 1,
                                            values.data(), x0, x1);
    }
};

/// A 1-D table from `from` to `to` holding the N given node values.
template <class T, std::size_t N>
constexpr table_1d<T, N> make_table_1d(T from, T to, const T (&values)[N]) noexcept {
    table_1d<T, N> t{make_uniform_axis(from, to, N), {}};
    for (std::size_t i = 0; i < N; ++i) t.values[i] = values[i];
    return t;
}

/// A 2-D table on [from0, to0] x [from1, to1] holding the N0 x N1 node values
/// row-major (values[i0 * N1 + i1]); N0 and N1 are given explicitly.
template <class T, std::size_t N0, std::size_t N1>
constexpr table_2d<T, N0, N1> make_table_2d(T from0, T to0, T from1, T to1, const T (&values)[N0 * N1]) noexcept {
    table_2d<T, N0, N1> t{make_uniform_axis(from0, to0, N0), make_uniform_axis(from1, to1, N1), {}};
    for (std::size_t i = 0; i < N0 * N1; ++i) t.values[i] = values[i];
    return t;
}

// ---------------------------------------------------------------------------
// Compact fixed-size axes and tables (the count is a template parameter)

namespace detail {

/// The step 1 / inv_step of a compact axis (0 when inv_step is 0 or the quotient overflows).
template <class T>
constexpr T step_from_inverse(T inv_step) noexcept {
    const T s = inv_step != T(0) ? T(1) / inv_step : T(0);
    // finite(s), in the two comparisons that suffice (NaN fails both, +-inf one)
    return s >= -std::numeric_limits<T>::max() && s <= std::numeric_limits<T>::max() ? s : T(0);
}

}  // namespace detail

/// A uniform axis of N nodes held in flash as two numbers: origin and 1/step. The
/// step, which only the edge path and design-time code need, is derived as
/// 1 / inv_step, so node i is origin + i * step() everywhere.
template <class T, std::size_t N>
struct compact_axis {
    static_assert(N >= 2, "an axis needs at least two nodes");
    T origin;    ///< first node, in the unit of the axis (K, Pa, ...)
    T inv_step;  ///< 1 / step, per unit of the axis (0 for a degenerate axis)

    /// The node spacing 1 / inv_step, unit of the axis (0 when inv_step is 0 or the quotient overflows).
    constexpr T step() const noexcept { return detail::step_from_inverse(inv_step); }

    /// The same axis as a uniform_axis (what the size-erased views hold).
    constexpr uniform_axis<T> uniform() const noexcept { return uniform_axis<T>{origin, step(), inv_step, N}; }

    /// Converts to the uniform_axis of uniform().
    constexpr operator uniform_axis<T>() const noexcept { return uniform(); }
};

namespace detail {

/// The position t = (x - origin) / step of x in cells on a compact axis, with the stored reciprocal.
template <class T, std::size_t N>
[[gnu::always_inline]] constexpr T position(const compact_axis<T, N>& a, T x) noexcept {
    return (x - a.origin) * a.inv_step;
}

/// The flags argument of locate_compact_cell: below in bits 0 .. 15, above in 16 .. 31.
constexpr std::uint32_t edge_flag_pair(status below_flag, status above_flag) noexcept {
    return static_cast<std::uint32_t>(static_cast<std::uint16_t>(below_flag)) |
           (static_cast<std::uint32_t>(static_cast<std::uint16_t>(above_flag)) << 16);
}

/// The packed cell and flags (see packed_index_mask) of an edge input x on a
/// compact axis of `cells` cells (at most 32767) given by its origin and inv_step:
/// locate_clamped's cell and flags on the axis's uniform() view, returned in a
/// register; the caller finds the fraction from its own position (edge_position).
/// flags holds the below flag in bits 0 .. 15 and the above flag in bits 16 .. 31.
/// The axis comes by reference: the caller loads nothing it would keep across the
/// call, and GCC makes a local copy (IPA-SRA) whose register use the caller knows,
/// so its own values stay in scratch registers (no callee-saved FP registers pushed).
template <class T>
[[gnu::noinline]] constexpr std::uint32_t locate_compact_cell(T x, const T& origin, const T& inv_step,
                                                              std::ptrdiff_t cells, std::uint32_t flags) noexcept {
    const T top = static_cast<T>(cells);
    const T last = origin + top * step_from_inverse(inv_step);
    const T tol = edge_tolerance(origin, last);  // as locate_edge
    const bool at_last = x >= last - tol;
    const T t = at_last ? top : clamp_position((x - origin) * inv_step, top);
    const std::ptrdiff_t i = clamped_cell(t, cells);
    // edge_flags as masks, selected without branches.
    const std::uint32_t below = x < origin ? (flags & 0xffffu) | std::uint32_t(status::below_range) : 0u;
    const std::uint32_t above = x > last + tol ? (flags >> 16) | std::uint32_t(status::above_range) : 0u;
    const T magnitude = x < T(0) ? -x : x;  // NaN stays NaN and fails the test below
    const std::uint32_t not_finite_x =
        magnitude <= std::numeric_limits<T>::max() ? 0u : std::uint32_t(status::not_finite);
    const std::uint32_t bad_axis = inv_step > T(0) ? 0u : std::uint32_t(status::out_of_domain);
    // At the top the clamped fraction is exactly 1 whatever x: t = top gives cell
    // cells - 1 and top - (cells - 1) = 1. So the bit spares the caller the upper clamp.
    return static_cast<std::uint32_t>(i) | (t >= top ? packed_at_last : 0u) |
           ((below | above | not_finite_x | bad_axis) << packed_status_shift);
}

}  // namespace detail

/// The compact axis of N nodes from `from` to `to`: inv_step as make_uniform_axis
/// gives it, nudged by an ulp or two where that makes the derived last node
/// from + (N - 1) / inv_step equal `to` exactly.
template <class T, std::size_t N>
constexpr compact_axis<T, N> make_compact_axis(T from, T to) noexcept {
    compact_axis<T, N> a{from, make_uniform_axis(from, to, N).inv_step};
    const T cells = static_cast<T>(N - 1u);
    if (a.inv_step != T(0) && from + cells * a.step() != to) {
        const T nudge = a.inv_step * std::numeric_limits<T>::epsilon();
        const T candidates[4] = {a.inv_step + nudge, a.inv_step - nudge, a.inv_step + T(2) * nudge,
                                 a.inv_step - T(2) * nudge};
        for (const T c : candidates) {
            const compact_axis<T, N> b{from, c};
            if (from + cells * b.step() == to) {
                a = b;
                break;
            }
        }
    }
    return a;
}

/// N0 x N1 values on two compact axes, row-major (values[i0 * N1 + i1]).
template <class T, std::size_t N0, std::size_t N1>
struct compact_table_2d {
    compact_axis<T, N0> axis0;      ///< first axis (temperature)
    compact_axis<T, N1> axis1;      ///< second axis (pressure)
    std::array<T, N0 * N1> values;  ///< row-major values

    /// The interpolated value at (x0, x1) (see interpolate_2d), unit of the values.
    constexpr result<T> operator()(T x0, T x1) const noexcept {
        const uniform_axis<T> a0 = axis0.uniform(), a1 = axis1.uniform();
        return detail::interpolate_2d_cells(a0, std::ptrdiff_t(N0) - 1, a1, std::ptrdiff_t(N1) - 1, values.data(),
                                            x0, x1);
    }
};

/// A compact 2-D table on [from0, to0] x [from1, to1] holding the N0 x N1 node
/// values row-major; N0 and N1 are given explicitly.
template <class T, std::size_t N0, std::size_t N1>
constexpr compact_table_2d<T, N0, N1> make_compact_table_2d(T from0, T to0, T from1, T to1,
                                                            const T (&values)[N0 * N1]) noexcept {
    compact_table_2d<T, N0, N1> t{make_compact_axis<T, N0>(from0, to0), make_compact_axis<T, N1>(from1, to1), {}};
    for (std::size_t i = 0; i < N0 * N1; ++i) t.values[i] = values[i];
    return t;
}

// ---------------------------------------------------------------------------
// q15 values: int16 q stands for offset + scale * q / 32768

/// Scale and offset of q15 data: value = offset + scale * q / 32768.
template <class T>
struct q15_scale {
    T scale;   ///< value change per 32768 counts, unit of the values
    T offset;  ///< value at q = 0, unit of the values
};

/// The scale that maps [lo, hi] onto q = -32767 .. 32767 (the ends exactly, up to
/// rounding); lo and hi may come in either order. A degenerate range (lo == hi)
/// gives scale 0 (every q decodes to lo); non-finite ends give {0, 0}.
template <class T>
constexpr q15_scale<T> q15_scale_for(T lo, T hi) noexcept {
    if (!detail::finite(lo) || !detail::finite(hi)) return q15_scale<T>{T(0), T(0)};
    if (hi < lo) {
        const T lower = hi;
        hi = lo;
        lo = lower;
    }
    // Halves first: hi - lo overflows for ends near +-max.
    const T half = hi / T(2) - lo / T(2);
    const T mid = lo / T(2) + hi / T(2);
    return q15_scale<T>{half * (T(32768) / T(32767)), mid};
}

/// value in q15 counts for scale s: round to nearest (halves away from zero),
/// saturated to -32768 .. 32767; NaN and a zero scale give 0.
template <class T>
constexpr std::int16_t q15_encode(T value, const q15_scale<T>& s) noexcept {
    if (!(value == value) || !(s.scale != T(0)) || !detail::finite(s.scale)) return 0;
    T x = (value - s.offset) * (T(32768) / s.scale);
    x = x > T(-32768) ? x : T(-32768);  // saturate first: +-inf and huge values land on the ends
    x = x < T(32767) ? x : T(32767);
    // Round to nearest without std::round (not constexpr) and without x + 0.5,
    // which rounds 0.49999997f up: split off the integer part, which is exact.
    const std::int32_t whole = static_cast<std::int32_t>(x);  // towards zero
    const T rest = x - static_cast<T>(whole);                 // exact, |rest| < 1
    std::int32_t q = whole;
    if (rest >= T(0.5)) ++q;
    if (rest <= T(-0.5)) --q;
    q = q > 32767 ? 32767 : (q < -32768 ? -32768 : q);
    return static_cast<std::int16_t>(q);
}

/// The value that q15 count q stands for under scale s: offset + scale * q / 32768.
template <class T>
constexpr T q15_decode(std::int16_t q, const q15_scale<T>& s) noexcept {
    return s.offset + s.scale * (static_cast<T>(q) * (T(1) / T(32768)));
}

// ---------------------------------------------------------------------------
// Integer-only path: integer axes (e.g. temperature in mK, pressure in Pa), q15 data

/// An integer uniform axis: node i is origin + i * step (step >= 2); inv_step_q32 =
/// round(2^32 / step) makes the cell a multiply and a shift. count 0 marks an
/// invalid axis (every lookup returns out_of_domain). The Q15 fraction is within
/// 1/2 + step / 2^16 counts: keep step below 2^15 units (mK and Pa steps are).
struct q15_axis {
    std::int32_t origin;         ///< first node, axis unit (mK, Pa, ...)
    std::int32_t step;           ///< node spacing, axis unit, >= 2
    std::uint32_t inv_step_q32;  ///< round(2^32 / step)
    std::size_t count;           ///< number of nodes, >= 2 (0: invalid)
};

/// The integer axis of count nodes from origin in steps of step. count is set to
/// 0 (invalid) when step < 2, count < 2 or the last node does not fit int32.
constexpr q15_axis make_q15_axis(std::int32_t origin, std::int32_t step, std::size_t count) noexcept {
    // The count is checked before it is multiplied: step < 2^31 and count - 1 < 2^31,
    // so the last node is exact in int64.
    const bool shape = step >= 2 && count >= 2u && count <= std::size_t(0x7fffffff);
    const std::int64_t last =
        shape ? static_cast<std::int64_t>(origin) + static_cast<std::int64_t>(step) * static_cast<std::int64_t>(count - 1u)
              : std::int64_t(0);
    const bool valid = shape && last <= std::int64_t(std::numeric_limits<std::int32_t>::max());
    const std::uint64_t two32 = std::uint64_t(1) << 32;
    const std::uint32_t inv =
        step >= 2 ? static_cast<std::uint32_t>((two32 + static_cast<std::uint64_t>(step) / 2u) /
                                                static_cast<std::uint64_t>(step))
                  : 0u;
    return q15_axis{origin, step, inv, valid ? count : std::size_t(0)};
}

/// Where an integer x lies on a q15 axis: cell and Q15 fraction 0 .. 32768.
struct q15_position {
    std::size_t index;       ///< cell, 0 .. count - 2
    std::int32_t fraction;   ///< Q15 fraction of the cell, 0 .. 32768 (32768 at the last node)
    status code;             ///< ok, or the axis flag with below_range / above_range
};

namespace detail {

/// The cell and Q15 fraction of x on a valid q15 axis, clamped with the given flags.
/// Integer only: one 32 x 32 -> 64-bit multiply estimates the cell, the exact
/// remainder corrects it (so every node is hit exactly), and a 32-bit multiply by
/// the Q31 inverse gives the fraction, within 1/2 + step / 2^16 Q15 counts.
constexpr q15_position q15_locate(const q15_axis& a, std::int32_t x, status below_flag, status above_flag) noexcept {
    const std::size_t last_cell = a.count - 2u;
    if (x <= a.origin) return {0u, 0, axis_flags(x < a.origin, false, false, below_flag, above_flag)};
    // The last node in int64: origin + step * (count - 1) fits int32 (make_q15_axis),
    // but the product alone need not (origin -2e9, step 1e9, 4 nodes).
    const std::int64_t last = static_cast<std::int64_t>(a.origin) +
                              static_cast<std::int64_t>(a.step) * static_cast<std::int64_t>(last_cell + 1u);
    const std::int64_t x64 = x;
    if (x64 >= last) return {last_cell, 32768, axis_flags(false, x64 > last, false, below_flag, above_flag)};
    // 0 < d < last - origin < 2^32: unsigned arithmetic, no overflow.
    const std::uint32_t d = static_cast<std::uint32_t>(x) - static_cast<std::uint32_t>(a.origin);
    const std::uint32_t step = static_cast<std::uint32_t>(a.step);
    // d / step + at most 1/4 (the rounding of inv_step_q32 times d < 2^31): floor is off by at most one.
    std::uint32_t i = static_cast<std::uint32_t>((static_cast<std::uint64_t>(d) * a.inv_step_q32) >> 32);
    std::uint32_t r = d - i * step;  // wraps above d when i is one too high
    if (r > d) { --i; r += step; }
    if (r >= step) { ++i; r -= step; }
    // r < step: r * (2^31 / step) < 2^31 + step / 2, and the rounding term keeps it below 2^32.
    const std::uint32_t f = (r * (a.inv_step_q32 >> 1) + (std::uint32_t(1) << 15)) >> 16;
    return {static_cast<std::size_t>(i), static_cast<std::int32_t>(f > 32768u ? 32768u : f), status::ok};
}

/// round((32768 - f) q0 + f q1) / 32768) for f in 0 .. 32768: exact weights, the
/// sum is at most 2^30 in magnitude, int32 throughout. The shift is done on a
/// non-negative unsigned value (no implementation-defined signed shift).
constexpr std::int16_t q15_blend(std::int32_t q0, std::int32_t q1, std::int32_t f) noexcept {
    const std::int32_t sum = (32768 - f) * q0 + f * q1 + 16384;  // |sum| <= 2^30 + 2^14
    const std::uint32_t biased = static_cast<std::uint32_t>(sum) + (std::uint32_t(1) << 30);  // >= 0, < 2^31 + 2^15
    return static_cast<std::int16_t>(static_cast<std::int32_t>(biased >> 15) - 32768);
}

/// The Q15 fraction 0 .. 32768 nearest to a real fraction f in [0, 1].
template <class T>
constexpr std::int32_t q15_fraction(T f) noexcept {
    const std::int32_t q = static_cast<std::int32_t>(f * T(32768) + T(0.5));
    return q < 0 ? 0 : (q > 32768 ? 32768 : q);
}

/// Bilinear blend of q15 data at Q15 fractions f0, f1 in the cell at (i0, i1):
/// the two rows are rounded to q15 first, then blended (at most one count of
/// rounding in all).
constexpr std::int16_t q15_bilinear(const std::int16_t* q, std::size_t stride, std::size_t i0, std::int32_t f0,
                                    std::size_t i1, std::int32_t f1) noexcept {
    const std::int16_t* row0 = q + i0 * stride + i1;
    const std::int16_t* row1 = row0 + stride;
    const std::int16_t r0 = q15_blend(row0[0], row0[1], f1);
    const std::int16_t r1 = q15_blend(row1[0], row1[1], f1);
    return q15_blend(r0, r1, f0);
}

}  // namespace detail

/// Linear interpolation of q15 data q[0 .. a.count - 1] on integer axis a at x,
/// in q15 counts; integer arithmetic only. Clamped with first_axis_below /
/// first_axis_above (and below_range / above_range); out_of_domain and 0 for an
/// invalid axis or null data.
constexpr result<std::int16_t> q15_interpolate_1d(const q15_axis& a, const std::int16_t* q, std::int32_t x) noexcept {
    if (q == nullptr || a.count < 2u) return {std::int16_t(0), status::out_of_domain};
    const q15_position p = detail::q15_locate(a, x, status::first_axis_below, status::first_axis_above);
    return {detail::q15_blend(q[p.index], q[p.index + 1u], p.fraction), p.code};
}

/// Bilinear interpolation of q15 data q[i0 * a1.count + i1] on integer axes a0
/// (temperature) and a1 (pressure) at (x0, x1), in q15 counts; integer only.
/// Clamped with each axis's flag; out_of_domain and 0 for an invalid axis or null data.
constexpr result<std::int16_t> q15_interpolate_2d(const q15_axis& a0, const q15_axis& a1, const std::int16_t* q,
                                                  std::int32_t x0, std::int32_t x1) noexcept {
    if (q == nullptr || a0.count < 2u || a1.count < 2u) return {std::int16_t(0), status::out_of_domain};
    const q15_position p0 = detail::q15_locate(a0, x0, status::first_axis_below, status::first_axis_above);
    const q15_position p1 = detail::q15_locate(a1, x1, status::second_axis_below, status::second_axis_above);
    return {detail::q15_bilinear(q, a1.count, p0.index, p0.fraction, p1.index, p1.fraction), p0.code | p1.code};
}

namespace detail {

/// 1-D lookup of q15 data with real input and the caller's flags: decoded value.
template <class T>
constexpr result<T> q15_interpolate_1d_flagged(const uniform_axis<T>& a, const std::int16_t* q,
                                               const q15_scale<T>& s, T x, status below_flag,
                                               status above_flag) noexcept {
    if (q == nullptr || a.count < 2u) return {s.offset, status::out_of_domain};
    const axis_position<T> p = locate(a, x, below_flag, above_flag);
    return {q15_decode(q15_blend(q[p.index], q[p.index + 1u], q15_fraction(p.fraction)), s), p.code};
}

}  // namespace detail

/// Linear interpolation of q15 data on a real axis at x, decoded with scale s, in
/// the unit of the values: the fraction is found in T and rounded to Q15, the
/// blend is integer. Flags as interpolate_1d.
template <class T>
constexpr result<T> interpolate_1d(const uniform_axis<T>& a, const std::int16_t* q, const q15_scale<T>& s,
                                   T x) noexcept {
    return detail::q15_interpolate_1d_flagged(a, q, s, x, status::first_axis_below, status::first_axis_above);
}

/// Bilinear interpolation of q15 data q[i0 * a1.count + i1] on real axes at
/// (x0, x1), decoded with scale s, in the unit of the values. Flags as interpolate_2d.
template <class T>
constexpr result<T> interpolate_2d(const uniform_axis<T>& a0, const uniform_axis<T>& a1, const std::int16_t* q,
                                   const q15_scale<T>& s, T x0, T x1) noexcept {
    if (q == nullptr || a0.count < 2u || a1.count < 2u) return {s.offset, status::out_of_domain};
    const axis_position<T> p0 = locate(a0, x0, status::first_axis_below, status::first_axis_above);
    const axis_position<T> p1 = locate(a1, x1, status::second_axis_below, status::second_axis_above);
    const std::int16_t v = detail::q15_bilinear(q, a1.count, p0.index, detail::q15_fraction(p0.fraction), p1.index,
                                                detail::q15_fraction(p1.fraction));
    return {q15_decode(v, s), p0.code | p1.code};
}

/// N q15 values on an integer axis, interpolated linearly in integer arithmetic.
template <std::size_t N>
struct q15_table_1d {
    static_assert(N >= 2, "a table needs at least two nodes");
    q15_axis axis;                       ///< integer axis (count == N)
    std::array<std::int16_t, N> values;  ///< q15 value at each node

    /// The interpolated value at x, in q15 counts (see q15_interpolate_1d). The
    /// size N bounds the reads: an axis whose count is not N reads nothing and
    /// gives out_of_domain (its last node is only validated for its own count).
    constexpr result<std::int16_t> operator()(std::int32_t x) const noexcept {
        if (axis.count != N) return {std::int16_t(0), status::out_of_domain};
        return q15_interpolate_1d(axis, values.data(), x);
    }
};

/// N0 x N1 q15 values on two integer axes, interpolated bilinearly; values[i0 * N1 + i1].
template <std::size_t N0, std::size_t N1>
struct q15_table_2d {
    static_assert(N0 >= 2 && N1 >= 2, "a table needs at least two nodes per axis");
    q15_axis axis0;                            ///< first axis (temperature), count == N0
    q15_axis axis1;                            ///< second axis (pressure), count == N1
    std::array<std::int16_t, N0 * N1> values;  ///< row-major q15 values

    /// The interpolated value at (x0, x1), in q15 counts (see q15_interpolate_2d).
    /// The sizes N0, N1 bound the reads: axes whose counts are not N0 and N1 read
    /// nothing and give out_of_domain.
    constexpr result<std::int16_t> operator()(std::int32_t x0, std::int32_t x1) const noexcept {
        if (axis0.count != N0 || axis1.count != N1) return {std::int16_t(0), status::out_of_domain};
        return q15_interpolate_2d(axis0, axis1, values.data(), x0, x1);
    }
};

/// A q15 1-D table of the N given counts on the integer axis origin + i * step.
template <std::size_t N>
constexpr q15_table_1d<N> make_q15_table_1d(std::int32_t origin, std::int32_t step,
                                            const std::int16_t (&values)[N]) noexcept {
    q15_table_1d<N> t{make_q15_axis(origin, step, N), {}};
    for (std::size_t i = 0; i < N; ++i) t.values[i] = values[i];
    return t;
}

/// A q15 2-D table of the N0 x N1 given counts (row-major) on two integer axes.
template <std::size_t N0, std::size_t N1>
constexpr q15_table_2d<N0, N1> make_q15_table_2d(std::int32_t origin0, std::int32_t step0, std::int32_t origin1,
                                                 std::int32_t step1, const std::int16_t (&values)[N0 * N1]) noexcept {
    q15_table_2d<N0, N1> t{make_q15_axis(origin0, step0, N0), make_q15_axis(origin1, step1, N1), {}};
    for (std::size_t i = 0; i < N0 * N1; ++i) t.values[i] = values[i];
    return t;
}

}  // namespace counterflux

#endif  // COUNTERFLUX_TABLE_HPP
