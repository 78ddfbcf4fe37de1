// counterflux/compensation.hpp - the firmware reading: raw current to a
// compensated mole fraction or partial pressure from lookup tables.
//
// The reading (docs/models.md, "Compensation tables"):
//
//     w       = (I - I_0(T)) * gain * c(T, P)
//     reading = w                       (linear law)
//     reading = w * h(gamma(T, P) * w)  (non-linear law),  h(z) = (1 - exp(-z)) / z,  h(0) = 1
//
// I_0(T) is the zero current (a 1-D table over temperature, A); c = 1/s the span
// correction, the reciprocal of the span factor s(T, P) of signal.hpp (a 2-D
// table over temperature and pressure, which already carries the
// partial-pressure convention); gain the reading per ampere at the reference
// condition (1/S_ref, or P_ref/S_ref for a partial-pressure sensor). Storing 1/s
// keeps division off the hot path, and tabulating h keeps exp off it.
//
// Where the law comes from (physics.md sec. 1 and 4): one element with the
// dusty-gas law, q(y) = r_m (1 - alpha y) + r_l, into a perfect sink carries
//     N = c / (alpha r_m L) ln[q(0) / q(y)] = -(c / (alpha r_m L)) ln(1 - beta y),
//     beta = alpha r_m / (r_m + r_l)  (alpha times the molecular share of the resistance).
// With S = n F A c / (L (r_m + r_l)) the normalised current u = I / S is
// -ln(1 - beta y) / beta, so y = (1 - exp(-beta u)) / beta = u h(beta u): the
// Stefan-Maxwell log law (Bird, Stewart & Lightfoot, Transport Phenomena, 2nd
// ed., 2002, sec. 18.2) with the Knudsen share of Mason & Malinauskas (Gas
// Transport in Porous Media: The Dusty-Gas Model, 1983), flux.hpp's law. The firmware's w is u
// for a mole-fraction reading (gamma = beta) and u P for a partial-pressure one
// (gamma = beta / P). For a series of elements gamma is the effective value that
// makes the law exact at full scale (curvature_at).
#ifndef COUNTERFLUX_COMPENSATION_HPP
#define COUNTERFLUX_COMPENSATION_HPP

#include <array>
#include <cmath>
#include <cstddef>
#include <cstdint>
#include <limits>

#include "detail/checked.hpp"
#include "detail/math.hpp"
#include "diffusivity.hpp"
#include "flux.hpp"
#include "signal.hpp"
#include "status.hpp"
#include "table.hpp"

namespace counterflux {

// ---------------------------------------------------------------------------
// Size-erased views

/// The compensation tables as raw arrays (what the tool and the record loader
/// hold): span correction and curvature on the (temperature, pressure) grid, zero
/// current on the temperature axis, the shape function h on its own axis.
template <class T>
struct compensation_ref {
    uniform_axis<T> temperature;  ///< K
    uniform_axis<T> pressure;     ///< Pa
    const T* correction;          ///< c(T, P) = 1/s, [it * pressure.count + ip], dimensionless
    const T* zero;                ///< I_0(T) on the temperature axis, A
    T gain;                       ///< reading units (mol/mol or Pa) per A at the reference
    uniform_axis<T> shape_axis;   ///< z axis of h, dimensionless; unused when curvature == nullptr
    const T* curvature;           ///< gamma(T, P), same grid as correction (1/reading unit); nullptr = linear law
    const T* shape;               ///< h(z) on shape_axis, dimensionless
};

/// The same tables as q15 data, each with its scale (value = offset + scale q / 32768);
/// the axes are real.
template <class T>
struct compensation_q15_ref {
    uniform_axis<T> temperature;     ///< K
    uniform_axis<T> pressure;        ///< Pa
    uniform_axis<T> shape_axis;      ///< z axis of h; unused when curvature == nullptr
    const std::int16_t* correction;  ///< q15 of c(T, P) = 1/s, [it * pressure.count + ip]
    const std::int16_t* zero;        ///< q15 of I_0(T), A
    const std::int16_t* curvature;   ///< q15 of gamma(T, P); nullptr = linear law
    const std::int16_t* shape;       ///< q15 of h(z) on shape_axis
    q15_scale<T> correction_scale;   ///< scale of correction
    q15_scale<T> zero_scale;         ///< scale of zero, A
    q15_scale<T> curvature_scale;    ///< scale of curvature
    q15_scale<T> shape_scale;        ///< scale of shape
    T gain;                          ///< reading units per A at the reference
};

namespace detail {

/// The span 1/c from a correction value c, neutral 1 with out_of_domain unless c > 0.
template <class T>
constexpr result<T> span_from_correction(T correction, status code) noexcept {
    if (!(correction > T(0)) || !finite(correction)) return {T(1), code | status::out_of_domain};
    return checked(T(1) / correction, code);
}

/// True when x lies in [-max, max]: finite, in two comparisons.
template <class T>
[[gnu::always_inline]] constexpr bool within_range(T x) noexcept {
    return x >= -std::numeric_limits<T>::max() && x <= std::numeric_limits<T>::max();
}

/// The reading w once computed: a w that is not finite came from a non-finite
/// signal (reading 0, not_finite) or overflowed (saturated, out_of_domain).
/// One well-predicted test on the usual path.
template <class T>
constexpr result<T> finished(T w, T signal_A, status code) noexcept {
    if (within_range(w)) return {w, code};
    if (!within_range(signal_A)) return {T(0), code | status::not_finite};
    const T saturated = w < T(0) ? -std::numeric_limits<T>::max() : std::numeric_limits<T>::max();
    return {w == w ? saturated : T(0), code | status::out_of_domain};  // w is +-inf or NaN here
}

/// The linear reading w = (I - I_0(T)) gain c(T, P) at cell positions pt, pp, in
/// reading units; the one expression both the fast paths and the kernel evaluate.
template <class T>
[[gnu::always_inline]] constexpr T linear_at(const T* correction, const T* zero, std::size_t stride, T gain,
                                             const axis_position<T>& pt, const axis_position<T>& pp,
                                             T signal_A) noexcept {
    const T zero_A = lerp(zero[pt.index], zero[pt.index + 1u], pt.fraction);
    return (signal_A - zero_A) * gain * bilinear(correction, stride, pt, pp);
}

/// True when the grids of a view can be read: data present, axes of at least two nodes.
template <class V, class P>
constexpr bool readable(const V& c, const P* correction, const P* zero) noexcept {
    return correction != nullptr && zero != nullptr && c.temperature.count >= 2u && c.pressure.count >= 2u;
}

/// The full reading of a view, the kernel every reading ends in: checks, one
/// locate per axis (shared by the zero, correction and curvature tables), the
/// non-linear law, edges and flags. Out of line, so that the readings' inline fast
/// paths (linear law, inside the grid) keep their values in registers.
template <class T>
[[gnu::noinline]] constexpr result<T> read_view(const compensation_ref<T>& c, T signal_A, T temperature_K,
                                                T pressure_Pa) noexcept {
    if (!readable(c, c.correction, c.zero)) return {T(0), status::out_of_domain};
    const axis_position<T> pt =
        locate_clamped(c.temperature, temperature_K, status::first_axis_below, status::first_axis_above);
    const axis_position<T> pp =
        locate_clamped(c.pressure, pressure_Pa, status::second_axis_below, status::second_axis_above);
    status code = pt.code | pp.code;
    T w = linear_at(c.correction, c.zero, c.pressure.count, c.gain, pt, pp, signal_A);
    if (c.curvature != nullptr && c.shape != nullptr && c.shape_axis.count >= 2u && within_range(w)) {
        // (only for a finite w, so a bad signal flags no shape edge)
        const T gamma = bilinear(c.curvature, c.pressure.count, pt, pp);
        const axis_position<T> pz =
            locate_clamped(c.shape_axis, gamma * w, status::below_range, status::above_range);
        code |= pz.code;
        w = w * lerp(c.shape[pz.index], c.shape[pz.index + 1u], pz.fraction);
    }
    return finished(w, signal_A, code);
}

}  // namespace detail

// ---------------------------------------------------------------------------
// Reading from float / double tables

/// Span factor s(T, P) = 1 / c(T, P), dimensionless; the neutral 1 with
/// out_of_domain when the tabulated correction is not positive. Axis flags as
/// interpolate_2d.
template <class T>
constexpr result<T> span(const compensation_ref<T>& c, T temperature_K, T pressure_Pa) noexcept {
    const result<T> k = interpolate_2d(c.temperature, c.pressure, c.correction, temperature_K, pressure_Pa);
    return detail::span_from_correction(k.value, k.code);
}

/// Zero current I_0(T) from the table, in A. Flags as interpolate_1d.
template <class T>
constexpr result<T> zero_current(const compensation_ref<T>& c, T temperature_K) noexcept {
    return interpolate_1d(c.temperature, c.zero, temperature_K);
}

/// The compensated reading for signal current I (A) at (T, P): mol/mol, or Pa for
/// a partial-pressure sensor. Temperature and pressure clamp to the grid (axis
/// flags); w outside the shape axis clamps there (below_range / above_range); a
/// non-finite signal reads 0 with not_finite; an overflow saturates (out_of_domain).
/// (Inline fast path: linear law, both inputs strictly inside the grid and a finite
/// w; everything else goes to the out-of-line kernel, with the same arithmetic.)
template <class T>
constexpr result<T> reading(const compensation_ref<T>& c, T signal_A, T temperature_K, T pressure_Pa) noexcept {
    const T tt = detail::position(c.temperature, temperature_K);
    const T tp = detail::position(c.pressure, pressure_Pa);
    // count - 1 as the cells: an axis of fewer than 2 nodes fails inside().
    if (c.curvature == nullptr && c.correction != nullptr && c.zero != nullptr &&
        detail::inside(tt, static_cast<std::ptrdiff_t>(c.temperature.count) - 1) &&
        detail::inside(tp, static_cast<std::ptrdiff_t>(c.pressure.count) - 1)) {
        const T w = detail::linear_at(c.correction, c.zero, c.pressure.count, c.gain, detail::position_inside(tt),
                                      detail::position_inside(tp), signal_A);
        if (detail::within_range(w)) return {w, status::ok};
    }
    return detail::read_view(c, signal_A, temperature_K, pressure_Pa);
}

// ---------------------------------------------------------------------------
// Reading from q15 tables

/// Span factor s(T, P) = 1 / c(T, P) from q15 data, dimensionless; flags as span.
template <class T>
constexpr result<T> span(const compensation_q15_ref<T>& c, T temperature_K, T pressure_Pa) noexcept {
    const result<T> k =
        interpolate_2d(c.temperature, c.pressure, c.correction, c.correction_scale, temperature_K, pressure_Pa);
    return detail::span_from_correction(k.value, k.code);
}

/// Zero current I_0(T) from q15 data, in A; flags as interpolate_1d.
template <class T>
constexpr result<T> zero_current(const compensation_q15_ref<T>& c, T temperature_K) noexcept {
    return interpolate_1d(c.temperature, c.zero, c.zero_scale, temperature_K);
}

/// The compensated reading for signal current I (A) at (T, P) from q15 tables:
/// mol/mol or Pa; flags as reading.
template <class T>
constexpr result<T> reading(const compensation_q15_ref<T>& c, T signal_A, T temperature_K, T pressure_Pa) noexcept {
    if (!detail::readable(c, c.correction, c.zero)) return {T(0), status::out_of_domain};
    const axis_position<T> pt = locate(c.temperature, temperature_K, status::first_axis_below, status::first_axis_above);
    const axis_position<T> pp = locate(c.pressure, pressure_Pa, status::second_axis_below, status::second_axis_above);
    status code = pt.code | pp.code;
    const std::int32_t ft = detail::q15_fraction(pt.fraction);
    const std::int32_t fp = detail::q15_fraction(pp.fraction);
    const T zero = q15_decode(detail::q15_blend(c.zero[pt.index], c.zero[pt.index + 1u], ft), c.zero_scale);
    const T correction =
        q15_decode(detail::q15_bilinear(c.correction, c.pressure.count, pt.index, ft, pp.index, fp), c.correction_scale);
    T w = (signal_A - zero) * c.gain * correction;
    if (c.curvature != nullptr && c.shape != nullptr && c.shape_axis.count >= 2u) {
        if (!detail::within_range(w)) return detail::finished(w, signal_A, code);
        const T gamma =
            q15_decode(detail::q15_bilinear(c.curvature, c.pressure.count, pt.index, ft, pp.index, fp), c.curvature_scale);
        const result<T> h = detail::q15_interpolate_1d_flagged(c.shape_axis, c.shape, c.shape_scale, gamma * w,
                                                               status::below_range, status::above_range);
        code |= h.code;
        w = w * h.value;
    }
    return detail::finished(w, signal_A, code);
}

// ---------------------------------------------------------------------------
// Fixed-size compensation objects

/// A linear-law compensation: span correction c(T, P) = 1/s on NT x NP nodes,
/// zero current on the same NT temperatures, and the gain. Compact: the
/// temperature axis is stored once (correction.axis0, shared by zero) and each
/// axis as origin and 1/step, so a float 15 x 9 one is its 600 B of data + 20 B.
template <class T, std::size_t NT, std::size_t NP>
struct compensation {
    compact_table_2d<T, NT, NP> correction;  ///< c = 1/s over (T in K, P in Pa), dimensionless
    std::array<T, NT> zero;                  ///< I_0(T) on correction.axis0, A
    T gain;                                  ///< reading units per A at the reference

    /// The size-erased view of these tables (axes built from the compact ones).
    constexpr compensation_ref<T> ref() const noexcept {
        return compensation_ref<T>{correction.axis0.uniform(), correction.axis1.uniform(), correction.values.data(),
                                   zero.data(), gain, uniform_axis<T>{T(0), T(0), T(0), 0u}, nullptr, nullptr};
    }
};

/// A compensation with the non-linear law: the linear part, gamma(T, P) on the
/// same grid and h(z) on NH nodes.
template <class T, std::size_t NT, std::size_t NP, std::size_t NH>
struct curved_compensation {
    compensation<T, NT, NP> linear;  ///< span correction, zero current, gain
    table_2d<T, NT, NP> curvature;   ///< gamma(T, P), 1/reading unit; axes equal to linear.correction's
    table_1d<T, NH> shape;           ///< h(z), dimensionless

    /// The size-erased view of these tables.
    constexpr compensation_ref<T> ref() const noexcept {
        compensation_ref<T> r = linear.ref();
        // NH, not shape.axis.count, bounds the reads of the shape values.
        r.shape_axis = uniform_axis<T>{shape.axis.origin, shape.axis.step, shape.axis.inv_step, NH};
        r.curvature = curvature.values.data();
        r.shape = shape.values.data();
        return r;
    }
};

/// A linear compensation on [t_from, t_to] K x [p_from, p_to] Pa from node
/// values: correction row-major [it * NP + ip], zero per temperature node (A), gain.
template <class T, std::size_t NT, std::size_t NP>
constexpr compensation<T, NT, NP> make_compensation(T t_from_K, T t_to_K, T p_from_Pa, T p_to_Pa,
                                                    const T (&correction)[NT * NP], const T (&zero_A)[NT],
                                                    T gain) noexcept {
    compensation<T, NT, NP> c{make_compact_table_2d<T, NT, NP>(t_from_K, t_to_K, p_from_Pa, p_to_Pa, correction), {},
                              gain};
    for (std::size_t i = 0; i < NT; ++i) c.zero[i] = zero_A[i];
    return c;
}

/// Span factor of a compensation object, dimensionless (see span).
template <class T, std::size_t NT, std::size_t NP>
constexpr result<T> span(const compensation<T, NT, NP>& c, T temperature_K, T pressure_Pa) noexcept {
    return span(c.ref(), temperature_K, pressure_Pa);
}

/// Zero current of a compensation object, A (see zero_current).
template <class T, std::size_t NT, std::size_t NP>
constexpr result<T> zero_current(const compensation<T, NT, NP>& c, T temperature_K) noexcept {
    return zero_current(c.ref(), temperature_K);
}

namespace detail {

/// The full reading of a (linear) compensation object, edges and flags, out of
/// line: read_view's steps for a view without curvature, with the sizes constant
/// and no curvature code linked in, so the same result bit for bit.
template <class T, std::size_t NT, std::size_t NP>
[[gnu::noinline]] constexpr result<T> read_fixed(const compensation<T, NT, NP>& c, T signal_A, T temperature_K,
                                                 T pressure_Pa) noexcept {
    static_assert(NT - 1u <= packed_index_mask && NP - 1u <= packed_index_mask, "at most 32767 cells per axis");
    // The cells come back in registers; the fractions are found here, from the axes
    // as ref() gives them.
    const auto& a0 = c.correction.axis0;
    const auto& a1 = c.correction.axis1;
    const std::uint32_t ct = locate_compact_cell(temperature_K, a0.origin, a0.inv_step, std::ptrdiff_t(NT) - 1,
                                                 edge_flag_pair(status::first_axis_below, status::first_axis_above));
    const std::uint32_t cp = locate_compact_cell(pressure_Pa, a1.origin, a1.inv_step, std::ptrdiff_t(NP) - 1,
                                                 edge_flag_pair(status::second_axis_below, status::second_axis_above));
    const axis_position<T> pt = edge_position(ct, position(a0, temperature_K));
    const axis_position<T> pp = edge_position(cp, position(a1, pressure_Pa));
    const T w = linear_at(c.correction.values.data(), c.zero.data(), NP, c.gain, pt, pp, signal_A);
    return finished(w, signal_A, pt.code | pp.code);
}

}  // namespace detail

/// Reading of a compensation object, mol/mol or Pa (see reading).
/// (Same result as reading(c.ref(), ...), bit for bit; the sizes are constants
/// here, so the checks of the view fall away.)
template <class T, std::size_t NT, std::size_t NP>
constexpr result<T> reading(const compensation<T, NT, NP>& c, T signal_A, T temperature_K, T pressure_Pa) noexcept {
    const T tt = detail::position(c.correction.axis0, temperature_K);
    const T tp = detail::position(c.correction.axis1, pressure_Pa);
    if (detail::inside(tt, std::ptrdiff_t(NT) - 1) && detail::inside(tp, std::ptrdiff_t(NP) - 1)) {
        const T w = detail::linear_at(c.correction.values.data(), c.zero.data(), NP, c.gain,
                                      detail::position_inside(tt), detail::position_inside(tp), signal_A);
        if (detail::within_range(w)) return {w, status::ok};
    }
    return detail::read_fixed(c, signal_A, temperature_K, pressure_Pa);
}

/// Span factor of a curved compensation object, dimensionless (see span).
template <class T, std::size_t NT, std::size_t NP, std::size_t NH>
constexpr result<T> span(const curved_compensation<T, NT, NP, NH>& c, T temperature_K, T pressure_Pa) noexcept {
    return span(c.ref(), temperature_K, pressure_Pa);
}

/// Zero current of a curved compensation object, A (see zero_current).
template <class T, std::size_t NT, std::size_t NP, std::size_t NH>
constexpr result<T> zero_current(const curved_compensation<T, NT, NP, NH>& c, T temperature_K) noexcept {
    return zero_current(c.ref(), temperature_K);
}

/// Reading of a curved compensation object, mol/mol or Pa (see reading): the
/// kernel of its view, so the same result as reading(c.ref(), ...).
template <class T, std::size_t NT, std::size_t NP, std::size_t NH>
constexpr result<T> reading(const curved_compensation<T, NT, NP, NH>& c, T signal_A, T temperature_K,
                            T pressure_Pa) noexcept {
    return detail::read_view(c.ref(), signal_A, temperature_K, pressure_Pa);
}

// ---------------------------------------------------------------------------
// Design-time helpers (the tool calls them in double; they compile in float)

/// The shape function h(z) = (1 - exp(-z)) / z, h(0) = 1, dimensionless; computed
/// as expm1(-z)/(-z), stable near 0. Below z = -80 exp would overflow float: the
/// value at -80 with below_range. NaN gives 1, +inf gives 0, -inf the value at
/// -80, all with not_finite.
template <class T>
inline result<T> shape_function(T z) noexcept {
    if (!(z == z)) return {T(1), status::not_finite};
    if (z == std::numeric_limits<T>::infinity()) return {T(0), status::not_finite};
    status s = status::ok;
    if (z < -detail::max_exponent<T>()) {
        s = z == -std::numeric_limits<T>::infinity() ? status::below_range | status::not_finite : status::below_range;
        z = -detail::max_exponent<T>();
    }
    return detail::checked(detail::expm1_over_x(-z), s);
}

/// Maximum bisection steps of curvature_at.
inline constexpr int curvature_max_iterations = 200;

/// The curvature gamma(T, P) of the non-linear law for full scale y_fs (mol/mol):
/// the beta that makes y_fs = u h(beta u) exact, u = I(y_fs) / S at (T, P), in
/// 1/(mol/mol); divided by P (1/Pa) for a partial-pressure reading. Exactly 0 for
/// equimolar counterdiffusion (alpha = 0). Bisection on z = beta u in a bracket
/// from the bounds of h, at most curvature_max_iterations steps (not_converged at
/// the cap); out_of_domain and 0 when the model cannot give I or S, or y_fs is
/// not in (0, 1].
template <class T, std::size_t N>
inline result<T> curvature_at(const sensor_model<T, N>& m, T temperature_K, T pressure_Pa,
                              T full_scale_mol_mol) noexcept {
    status s = validate(m) | detail::check_condition(temperature_K, pressure_Pa);
    if (!detail::finite(full_scale_mol_mol)) return {T(0), s | status::not_finite};
    if (!(full_scale_mol_mol > T(0)) || full_scale_mol_mol > T(1)) return {T(0), s | status::out_of_domain};
    if (s != status::ok) return {T(0), s};
    if (alpha_from_flux_ratio(m.flux_ratio) == T(0)) return {T(0), s};
    const result<T> current = limiting_current_A(m, temperature_K, pressure_Pa, full_scale_mol_mol);
    const result<T> sensitivity = sensitivity_A_per_mol_per_mol(m, temperature_K, pressure_Pa);
    s |= current.code | sensitivity.code;
    if (has(s, status::out_of_domain) || has(s, status::not_finite) || !(current.value > T(0)) ||
        !(sensitivity.value > T(0)))
        return {T(0), s | status::out_of_domain};
    const T u = current.value / sensitivity.value;  // normalised current, mol/mol
    const T rho = full_scale_mol_mol / u;           // h(z) must equal this
    if (!(detail::finite(rho) && rho > T(0))) return {T(0), s | status::out_of_domain};
    T z = T(0);
    if (rho != T(1)) {
        // h decreases from +inf to 0. For z > 0, h(z) < 1/z, so h(1/rho) < rho; for
        // a = -z > 0, h(-a) = (e^a - 1)/a > 1 + a/2, so h(-2 (rho - 1)) > rho.
        T lo = rho < T(1) ? T(0) : -T(2) * (rho - T(1));  // h(lo) >= rho
        T hi = rho < T(1) ? T(1) / rho : T(0);             // h(hi) <= rho
        if (lo < -detail::max_exponent<T>()) return {T(0), s | status::out_of_domain};  // beyond h's range
        bool converged = false;
        for (int it = 0; it < curvature_max_iterations; ++it) {
            const T mid = lo + (hi - lo) / T(2);
            if (!(mid > lo && mid < hi)) { converged = true; break; }  // the bracket is two neighbours
            if (shape_function(mid).value >= rho)
                lo = mid;
            else
                hi = mid;
            const T scale = std::fabs(lo) > std::fabs(hi) ? std::fabs(lo) : std::fabs(hi);
            if (hi - lo <= T(2) * std::numeric_limits<T>::epsilon() * scale) { converged = true; break; }
        }
        z = lo + (hi - lo) / T(2);
        if (!converged) s |= status::not_converged;
    }
    const T beta = z / u;
    if (m.reading == reading_kind::partial_pressure) return detail::checked(beta / pressure_Pa, s);
    return detail::checked(beta, s);
}

}  // namespace counterflux

#endif  // COUNTERFLUX_COMPENSATION_HPP
