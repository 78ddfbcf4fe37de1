// counterflux/flux.hpp - steady molar flux of target gas A through one barrier
// element, for any flux ratio r = N_B / N_A (alpha = 1 + r).
//
// One law covers every case. The element carries two diffusion resistivities
// (reciprocal diffusivities, s/m2): a molecular one r_m = 1/D_AB,eff that
// couples to the flux ratio, and a linear one r_l that does not (Knudsen
// 1/D_K,eff, or a solution-diffusion membrane written as 1/(Pi R T)). With
// q(y) = r_m (1 - alpha y) + r_l, the binary dusty-gas model (isobaric,
// viscous flux neglected; Mason & Malinauskas, Gas Transport in Porous Media:
// The Dusty-Gas Model, Elsevier 1983) integrates over the effective length L to
//
//     N_A = c / (alpha r_m L) * ln[q(y2) / q(y1)]
//         = c (y1 - y2) / (L q(y1)) * log1p(x) / x,   x = alpha r_m (y1 - y2) / q(y1),
//
// the second form being the one computed for |x| < 1/2: it is regular at
// alpha -> 0, where it becomes the Bosanquet form c (y1 - y2) / (L (1/D_AB + 1/D_K)),
// and at r_m -> 0 (pure Knudsen or membrane). For |x| >= 1/2 the first form is
// well conditioned and is used (it keeps a q(y2) << q(y1) that 1 + x would round away). Its limits are the equimolar law
// (alpha = 0, r_l = 0), the Stefan stagnant-film log law (alpha = 1, r_l = 0) and
// the general Stefan-Maxwell log law (Bird, Stewart & Lightfoot, Transport
// Phenomena, 2nd ed., 2002, sec. 18.2 and 18.3).
//
// Assumption: with a flux ratio prescribed by the electrode reaction a real
// barrier builds a small pressure difference (viscous flow) that this model
// neglects; it is exact for an isobaric element.
#ifndef COUNTERFLUX_FLUX_HPP
#define COUNTERFLUX_FLUX_HPP

#include <cmath>
#include <limits>

#include "constants.hpp"
#include "detail/checked.hpp"
#include "detail/math.hpp"
#include "status.hpp"

namespace counterflux {

/// alpha = 1 + r for the flux ratio r = N_B / N_A.
template <class T>
constexpr T alpha_from_flux_ratio(T flux_ratio) noexcept { return T(1) + flux_ratio; }

/// Flux ratio of equimolar counterdiffusion (one B out per A in), N_B/N_A = -1.
template <class T>
inline constexpr T equimolar_flux_ratio = T(-1);

/// Flux ratio of diffusion through stagnant B, N_B/N_A = 0.
template <class T>
inline constexpr T stagnant_flux_ratio = T(0);

/// One barrier element resolved at a condition: what the flux law needs.
template <class T>
struct element_transport {
    T area_m2;             ///< cross-section the flow passes, m2
    T length_m;            ///< effective diffusion length, m
    T inv_molecular_s_m2;  ///< r_m = 1/D_AB,eff, s/m2 (0: no molecular resistance)
    T inv_linear_s_m2;     ///< r_l: Knudsen 1/D_K,eff or membrane 1/(Pi R T), s/m2 (0: none)
    T knudsen_number;      ///< lambda / d of the element (0 for a membrane)
};

namespace detail {

/// Status of an element's data: finite, L > 0, A > 0, r_m >= 0, r_l >= 0, r_m + r_l > 0.
template <class T>
constexpr status check_element(const element_transport<T>& e) noexcept {
    if (!finite(e.area_m2) || !finite(e.length_m) || !finite(e.inv_molecular_s_m2) || !finite(e.inv_linear_s_m2))
        return status::not_finite;
    if (!(e.area_m2 > T(0)) || !(e.length_m > T(0)) || e.inv_molecular_s_m2 < T(0) || e.inv_linear_s_m2 < T(0) ||
        !(e.inv_molecular_s_m2 + e.inv_linear_s_m2 > T(0)))
        return status::out_of_domain;
    return status::ok;
}

/// q(y) = r_m (1 - alpha y) + r_l, s/m2.
template <class T>
constexpr T q_of(const element_transport<T>& e, T alpha, T y) noexcept {
    return e.inv_molecular_s_m2 * (T(1) - alpha * y) + e.inv_linear_s_m2;
}

/// Smallest q allowed before the log law is singular: a tiny share of r_m + r_l.
template <class T>
constexpr T q_floor(const element_transport<T>& e) noexcept {
    return (e.inv_molecular_s_m2 + e.inv_linear_s_m2) * T(1.0e-6);
}

}  // namespace detail

namespace detail {

/// Status of the inputs of the flux law: the element, c > 0, and finite alpha, a, b.
template <class T>
constexpr status check_flux_inputs(const element_transport<T>& e, T total_concentration_mol_m3, T alpha, T a,
                                   T b) noexcept {
    status s = check_element(e);
    if (!finite(total_concentration_mol_m3) || !finite(alpha) || !finite(a) || !finite(b))
        s |= status::not_finite;
    else if (!(total_concentration_mol_m3 > T(0)))
        s |= status::out_of_domain;
    return s;
}

/// Fraction downstream of y_from after the element carries flux N:
/// y_from - q(y_from) (L N / c) expm1(z)/z with z = alpha r_m L N / c (the
/// element_flux law solved for its second fraction). Marching upstream is the
/// same with -N. above_range when the fraction has saturated at its asymptote.
template <class T>
inline result<T> march(const element_transport<T>& e, T total_concentration_mol_m3, T alpha, T y_from,
                       T flux_mol_m2_s) noexcept {
    const status s = check_flux_inputs(e, total_concentration_mol_m3, alpha, y_from, flux_mol_m2_s);
    if (s != status::ok) return {T(0), s};
    const T q = q_of(e, alpha, y_from);
    if (!(q > T(0))) return {y_from, status::out_of_domain};
    const T ln_c = e.length_m * flux_mol_m2_s / total_concentration_mol_m3;  // L N / c, m2/s
    const T z = alpha * e.inv_molecular_s_m2 * ln_c;
    // Beyond exp's range, or on overflow, the fraction runs off to -inf
    // (downstream of a positive flux) or +inf.
    const T runaway = ln_c > T(0) ? -max_finite<T>() : max_finite<T>();
    if (z > max_exponent<T>()) return {runaway, status::out_of_domain};
    const T y = y_from - q * ln_c * expm1_over_x(z);
    if (!finite(y)) return {runaway, status::out_of_domain};
    // exp(z) below the precision of T: the fraction sits at its asymptote
    // (r_m + r_l)/(alpha r_m) and no longer tells one flux from a larger one.
    if (z < saturation_exponent<T>()) return {y, status::above_range};
    return {y, status::ok};
}

}  // namespace detail

/// Molar flux of A from y_in to y_out through element e, in mol/(m2 s); c is
/// the total molar concentration P/(R T) in mol/m3. Where q(y) <= 0 (the log law
/// is singular, e.g. pure A into stagnant B) q is floored, the large finite
/// flux returned and out_of_domain set.
template <class T>
inline result<T> element_flux(const element_transport<T>& e, T total_concentration_mol_m3, T alpha, T y_in,
                              T y_out) noexcept {
    status s = detail::check_flux_inputs(e, total_concentration_mol_m3, alpha, y_in, y_out);
    if (s != status::ok) return {T(0), s};
    const T floor = detail::q_floor(e);
    T q1 = detail::q_of(e, alpha, y_in);
    T q2 = detail::q_of(e, alpha, y_out);
    if (q1 < floor) { q1 = floor; s |= status::out_of_domain; }
    if (q2 < floor) { q2 = floor; s |= status::out_of_domain; }
    const T c = total_concentration_mol_m3;
    const T dy = y_in - y_out;
    const T x = alpha * e.inv_molecular_s_m2 * dy / q1;
    T n;
    if (s != status::ok || !(std::fabs(x) < T(0.5))) {
        // Singular (floored q), or q2/q1 = 1 + x far from 1: the exact log form
        // on the ratio itself (1 + x would round away a q2 << q1).
        if (alpha * e.inv_molecular_s_m2 == T(0)) return {T(0), s};
        n = c / (alpha * e.inv_molecular_s_m2 * e.length_m) * std::log(q2 / q1);
    } else {
        n = c * dy / (e.length_m * q1) * detail::log1p_over_x(x);
    }
    if (!detail::finite(n)) {  // overflow for extreme inputs: saturate in the direction of the drop
        s |= status::out_of_domain;
        n = y_in > y_out ? detail::max_finite<T>() : -detail::max_finite<T>();
    }
    return {n, s};
}

/// Mole fraction at the outlet of element e carrying flux N (mol/(m2 s)) from
/// inlet fraction y_in: the inverse of element_flux in y_out. Flags
/// out_of_domain (value -max or +max, the side the fraction runs off to) when
/// the flux cannot be carried; above_range when the fraction has saturated at
/// its asymptote (alpha < 0).
template <class T>
inline result<T> element_outlet(const element_transport<T>& e, T total_concentration_mol_m3, T alpha, T y_in,
                                T flux_mol_m2_s) noexcept {
    return detail::march(e, total_concentration_mol_m3, alpha, y_in, flux_mol_m2_s);
}

/// Mole fraction at the inlet of element e that drives flux N (mol/(m2 s)) to
/// outlet fraction y_out: the inverse of element_flux in y_in. For alpha > 0
/// the value tends to (r_m + r_l)/(alpha r_m) as N grows, and above_range is
/// set once it has saturated there (larger fluxes give the same fraction).
/// Flags out_of_domain (value +max or -max) when no finite inlet fraction
/// drives the flux.
template <class T>
inline result<T> element_inlet(const element_transport<T>& e, T total_concentration_mol_m3, T alpha, T y_out,
                               T flux_mol_m2_s) noexcept {
    return detail::march(e, total_concentration_mol_m3, alpha, y_out, -flux_mol_m2_s);
}

/// Transport data of a free-gas element of length L with molecular
/// diffusivity D_AB and Knudsen diffusivity D_K (either may be +inf for "no
/// resistance of that kind"); unit area.
template <class T>
constexpr element_transport<T> gas_element(T diffusivity_m2_s, T knudsen_diffusivity_m2_s, T length_m) noexcept {
    return element_transport<T>{T(1), length_m, T(1) / diffusivity_m2_s, T(1) / knudsen_diffusivity_m2_s, T(0)};
}

/// Equimolar counterdiffusion (alpha = 0): N = c D (y1 - y2) / L, mol/(m2 s).
template <class T>
inline result<T> equimolar_flux(T total_concentration_mol_m3, T diffusivity_m2_s, T length_m, T y1, T y2) noexcept {
    return element_flux(gas_element(diffusivity_m2_s, std::numeric_limits<T>::infinity(), length_m),
                        total_concentration_mol_m3, T(0), y1, y2);
}

/// Stefan-Maxwell log law for any alpha = 1 + N_B/N_A (alpha = 1: stagnant
/// film), no Knudsen resistance: N = c D / (alpha L) ln[(1 - alpha y2)/(1 - alpha y1)], mol/(m2 s).
template <class T>
inline result<T> log_law_flux(T total_concentration_mol_m3, T diffusivity_m2_s, T length_m, T alpha, T y1,
                              T y2) noexcept {
    return element_flux(gas_element(diffusivity_m2_s, std::numeric_limits<T>::infinity(), length_m),
                        total_concentration_mol_m3, alpha, y1, y2);
}

/// Dusty-gas law with molecular D_AB and Knudsen D_K (beta = 1 + D_AB/D_K):
/// N = c D_AB / (alpha L) ln[(beta - alpha y2)/(beta - alpha y1)]; Bosanquet at alpha = 0; mol/(m2 s).
template <class T>
inline result<T> dusty_gas_flux(T total_concentration_mol_m3, T diffusivity_m2_s, T knudsen_diffusivity_m2_s,
                                T length_m, T alpha, T y1, T y2) noexcept {
    return element_flux(gas_element(diffusivity_m2_s, knudsen_diffusivity_m2_s, length_m), total_concentration_mol_m3,
                        alpha, y1, y2);
}

/// Bosanquet combination 1/D = 1/D_AB + 1/D_K, m2/s (either may be +inf for no
/// resistance of that kind); 0 with out_of_domain unless both are > 0.
template <class T>
constexpr result<T> bosanquet_diffusivity(T diffusivity_m2_s, T knudsen_diffusivity_m2_s) noexcept {
    if (!(diffusivity_m2_s > T(0)) || !(knudsen_diffusivity_m2_s > T(0))) return {T(0), status::out_of_domain};
    return detail::checked(T(1) / (T(1) / diffusivity_m2_s + T(1) / knudsen_diffusivity_m2_s));
}

/// Arrhenius permeability Pi(T) = Pi_ref exp[-(E_P/R)(1/T - 1/T_ref)], in the unit of Pi_ref.
template <class T>
inline result<T> arrhenius_permeability(T permeability_ref, T activation_energy_J_mol, T reference_temperature_K,
                                        T temperature_K) noexcept {
    if (!detail::finite(permeability_ref) || !detail::finite(activation_energy_J_mol) ||
        !detail::finite(reference_temperature_K) || !detail::finite(temperature_K))
        return {T(0), status::not_finite};
    if (!(permeability_ref > T(0)) || !(reference_temperature_K > T(0)) || !(temperature_K > T(0)))
        return {T(0), status::out_of_domain};
    const T exponent = -(activation_energy_J_mol / gas_constant_J_mol_K<T>) *
                       (T(1) / temperature_K - T(1) / reference_temperature_K);
    if (exponent > detail::max_exponent<T>())
        return {detail::finite_or_max(permeability_ref * std::exp(detail::max_exponent<T>())), status::out_of_domain};
    return detail::checked(permeability_ref * std::exp(exponent));
}

/// Solution-diffusion flux through a membrane, N = Pi (p1 - p2) / delta, in
/// mol/(m2 s), for permeability Pi in mol/(m s Pa) and partial pressures in Pa.
/// Computed by element_flux with r_l = 1/(Pi R T), c = P/(R T), blind to the flux ratio.
template <class T>
inline result<T> membrane_flux(T permeability_mol_m_s_Pa, T thickness_m, T temperature_K, T p1_Pa, T p2_Pa) noexcept {
    if (!detail::finite(temperature_K)) return {T(0), status::not_finite};
    if (!(temperature_K > T(0)) || !(permeability_mol_m_s_Pa > T(0))) return {T(0), status::out_of_domain};
    const T rt = gas_constant_J_mol_K<T> * temperature_K;
    const element_transport<T> e{T(1), thickness_m, T(0), T(1) / (permeability_mol_m_s_Pa * rt), T(0)};
    // With "fractions" given as partial pressures, c = 1/(R T) makes c * y = p/(R T).
    return element_flux(e, T(1) / rt, T(0), p1_Pa, p2_Pa);
}

}  // namespace counterflux

#endif  // COUNTERFLUX_FLUX_HPP
