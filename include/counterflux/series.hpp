// counterflux/series.hpp - a fixed-size series of barrier elements and the
// steady flow through it.
//
// Elements are listed from the outside in (dust filter, membrane, capillary,
// electrolyte film ...). Flux continuity carries the same molar flow F (mol/s)
// through every element; element i sees the flux F / A_i. Given F and the
// electrode-side fraction, the fractions at every interface follow in closed
// form by marching outwards with element_inlet, so current -> concentration is
// closed form. Concentration -> current is found by a bounded, safeguarded
// monotone root solve on F (Illinois regula falsi with a bisection step every
// third iteration, a fixed iteration cap, status::not_converged at the cap).
// Linear elements simply add resistances; the solve returns that sum to
// rounding.
#ifndef COUNTERFLUX_SERIES_HPP
#define COUNTERFLUX_SERIES_HPP

#include <array>
#include <cmath>
#include <cstddef>
#include <limits>

#include "barrier.hpp"
#include "detail/checked.hpp"
#include "detail/math.hpp"
#include "flux.hpp"
#include "status.hpp"

namespace counterflux {

/// Up to N barrier elements from the outside in; count of them are in use.
template <class T, std::size_t N>
struct series {
    static_assert(N >= 1, "a series holds at least one element");
    std::array<barrier<T>, N> elements;  ///< elements[0] faces the gas
    std::size_t count;                   ///< elements in use, 0..N
};

/// Appends b to s; out_of_domain (s unchanged) when s is full.
template <class T, std::size_t N>
constexpr status push(series<T, N>& s, const barrier<T>& b) noexcept {
    if (s.count >= N) return status::out_of_domain;
    s.elements[s.count] = b;
    ++s.count;
    return status::ok;
}

/// A series resolved at one condition: per-element transport data, the total
/// molar concentration c = P/(R T) and alpha = 1 + N_B/N_A.
template <class T, std::size_t N>
struct series_transport {
    std::array<element_transport<T>, N> elements;  ///< elements[0] faces the gas
    std::size_t count;                             ///< elements in use, 1..N
    T total_concentration_mol_m3;                  ///< c, mol/m3
    T alpha;                                       ///< 1 + N_B / N_A
};

/// Dilute-limit resistance of element e to molar flow, L (r_m + r_l) / (c A), in s/mol
/// (mole-fraction drop per mol/s).
template <class T>
constexpr T dilute_resistance_s_per_mol(const element_transport<T>& e, T total_concentration_mol_m3) noexcept {
    return e.length_m * (e.inv_molecular_s_m2 + e.inv_linear_s_m2) / (total_concentration_mol_m3 * e.area_m2);
}

/// Sum of the dilute-limit resistances of the series, s/mol.
template <class T, std::size_t N>
constexpr T dilute_resistance_s_per_mol(const series_transport<T, N>& st) noexcept {
    T sum = T(0);
    for (std::size_t i = 0; i < st.count && i < N; ++i)
        sum += dilute_resistance_s_per_mol(st.elements[i], st.total_concentration_mol_m3);
    return sum;
}

namespace detail {

/// Status of a resolved series: count in 1..N, c > 0, finite alpha, valid elements.
template <class T, std::size_t N>
constexpr status check_series(const series_transport<T, N>& st) noexcept {
    if (st.count < 1 || st.count > N) return status::out_of_domain;
    status s = check_positive(st.total_concentration_mol_m3);
    if (!finite(st.alpha)) s |= status::not_finite;
    for (std::size_t i = 0; i < st.count; ++i) s |= check_element(st.elements[i]);
    return s;
}

}  // namespace detail

/// Interface fractions for molar flow F (mol/s) with y_inner at the electrode
/// side: profile[i] is the fraction at the outer face of element i and
/// profile[count] = y_inner.
template <class T, std::size_t N>
struct series_profile {
    std::array<T, N + 1> fractions;  ///< mole fractions, outside first
    status code;                     ///< status of the march
};

/// Marches from the electrode side outwards for molar flow F: the fraction at
/// every interface. Closed form (element_inlet per element).
template <class T, std::size_t N>
inline series_profile<T, N> profile_for_flow(const series_transport<T, N>& st, T molar_flow_mol_s,
                                             T y_inner = T(0)) noexcept {
    series_profile<T, N> p{};
    p.code = detail::check_series(st);
    if (!detail::finite(molar_flow_mol_s) || !detail::finite(y_inner)) p.code |= status::not_finite;
    if (p.code != status::ok) return p;
    T y = y_inner;
    p.fractions[st.count] = y;
    for (std::size_t k = st.count; k-- > 0;) {
        const element_transport<T>& e = st.elements[k];
        const result<T> r =
            element_inlet(e, st.total_concentration_mol_m3, st.alpha, y, molar_flow_mol_s / e.area_m2);
        p.code |= r.code;
        y = r.value;
        p.fractions[k] = y;
        if (has(r.code, status::out_of_domain)) {  // ran off: every outer interface is beyond range too
            for (std::size_t j = 0; j < k; ++j) p.fractions[j] = y;
            break;
        }
    }
    return p;
}

/// Outer (gas-side) mole fraction that drives molar flow F (mol/s) to y_inner at the electrode.
template <class T, std::size_t N>
inline result<T> outer_fraction_for_flow(const series_transport<T, N>& st, T molar_flow_mol_s,
                                         T y_inner = T(0)) noexcept {
    const series_profile<T, N> p = profile_for_flow(st, molar_flow_mol_s, y_inner);
    return {p.fractions[0], p.code};
}

/// Maximum iterations of the series root solve.
inline constexpr int series_max_iterations = 200;

/// Steady molar flow (mol/s, positive inwards) through the series from outer
/// fraction y_outside to y_inner (0: a perfect sink). not_converged if the
/// iteration cap is reached (the best estimate is returned); out_of_domain when
/// no finite flow reaches y_outside (e.g. pure A into a stagnant-film capillary).
template <class T, std::size_t N>
inline result<T> molar_flow(const series_transport<T, N>& st, T y_outside, T y_inner = T(0)) noexcept {
    status s = detail::check_series(st);
    if (!detail::finite(y_outside) || !detail::finite(y_inner)) s |= status::not_finite;
    if (s != status::ok) return {T(0), s};
    const T c = st.total_concentration_mol_m3;
    if (st.count == 1) {  // closed form
        const element_transport<T>& e = st.elements[0];
        const result<T> n = element_flux(e, c, st.alpha, y_outside, y_inner);
        return detail::checked(n.value * e.area_m2, n.code);
    }
    if (y_outside == y_inner) return {T(0), status::ok};
    // The log law is singular where q(y) reaches 0 (pure A into stagnant B
    // without Knudsen resistance): no finite flow reaches such an end fraction.
    const element_transport<T>& outer = st.elements[0];
    const element_transport<T>& inner = st.elements[st.count - 1];
    if (detail::q_of(outer, st.alpha, y_outside) <= detail::q_floor(outer) ||
        detail::q_of(inner, st.alpha, y_inner) <= detail::q_floor(inner))
        return {y_outside > y_inner ? detail::max_finite<T>() : -detail::max_finite<T>(), status::out_of_domain};
    // g(F) = y_0(F) - y_outside is increasing in F; g(0) = y_inner - y_outside.
    auto g = [&](T f) noexcept { return outer_fraction_for_flow(st, f, y_inner).value - y_outside; };
    T a = T(0);
    T ga = y_inner - y_outside;
    T b = (y_outside - y_inner) / dilute_resistance_s_per_mol(st);  // the dilute-linear flow
    if (!detail::finite(b)) return detail::checked(b, status::out_of_domain);  // resistance underflowed
    T gb = g(b);
    int doublings = 0;
    while (gb != T(0) && (ga < T(0)) == (gb < T(0))) {  // same sign: expand outwards
        if (++doublings > 60) return {b, status::out_of_domain};
        a = b;
        ga = gb;
        b = b * T(2);
        if (!detail::finite(b)) return detail::checked(b, status::out_of_domain);
        gb = g(b);
    }
    if (gb == T(0)) return {b, status::ok};
    const T tol = T(8) * std::numeric_limits<T>::epsilon();
    int side = 0;  // Illinois: which end was kept last time
    for (int it = 0; it < series_max_iterations; ++it) {
        T x;
        if (it % 3 == 2) {
            x = a + (b - a) / T(2);
        } else {
            x = (a * gb - b * ga) / (gb - ga);
            if (!(x > (a < b ? a : b) && x < (a < b ? b : a))) x = a + (b - a) / T(2);
        }
        const T gx = g(x);
        if (gx == T(0)) return {x, status::ok};
        if ((gx < T(0)) == (gb < T(0))) {  // x replaces b
            b = x;
            gb = gx;
            if (side == -1) ga = ga / T(2);
            side = -1;
        } else {  // x replaces a
            a = x;
            ga = gx;
            if (side == 1) gb = gb / T(2);
            side = 1;
        }
        const T scale = std::fabs(a) > std::fabs(b) ? std::fabs(a) : std::fabs(b);
        if (std::fabs(b - a) <= tol * scale) return {a + (b - a) / T(2), status::ok};
    }
    return {a + (b - a) / T(2), status::not_converged};
}

}  // namespace counterflux

#endif  // COUNTERFLUX_SERIES_HPP
