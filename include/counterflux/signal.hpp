// counterflux/signal.hpp - from flux to signal: limiting current,
// sensitivity, inversion and the span factor of a diffusion-limited sensor.
//
// Amperometric limiting-current cell: the electrode is a perfect sink (y = 0
// there) and I = n F F_A, with F_A the molar flow of A (mol/s) through the
// barrier series and n the electrons per molecule (O2: 4, CO: 2, H2S to
// sulfate: 8, NO2: 2). Sensitivity S = dI/dy at y -> 0, where every element is
// linear: S = n F / sum_i L_i (r_m,i + r_l,i) / (c A_i). The span factor
// s(T, P) = S(T, P) / S(T_ref, P_ref) always comes from the full model; for a
// reading reported as partial pressure it is multiplied by P_ref / P.
// (docs/models.md sec. 4 and 5.)
#ifndef COUNTERFLUX_SIGNAL_HPP
#define COUNTERFLUX_SIGNAL_HPP

#include <array>
#include <cmath>
#include <cstddef>
#include <cstdint>
#include <limits>

#include "barrier.hpp"
#include "constants.hpp"
#include "detail/checked.hpp"
#include "detail/math.hpp"
#include "diffusivity.hpp"
#include "flux.hpp"
#include "gases.hpp"
#include "series.hpp"
#include "status.hpp"

namespace counterflux {

/// What the sensor reports.
enum class reading_kind : std::uint8_t {
    mole_fraction,     ///< mol/mol
    partial_pressure,  ///< Pa
};

/// A whole sensor design: gases, diffusivity model, barrier series, electrode
/// reaction and reference (calibration) condition.
template <class T, std::size_t N>
struct sensor_model {
    const gas_data* target;              ///< gas A consumed at the electrode
    const gas_data* background;          ///< gas B
    diffusivity_model<T> diffusivity;    ///< how D_AB is obtained
    series<T, N> barriers;               ///< elements from the outside in
    unsigned electrons;                  ///< n in I = n F N
    T flux_ratio;                        ///< N_B / N_A: -1 equimolar, 0 stagnant
    reading_kind reading;                ///< mole fraction or partial pressure
    T reference_temperature_K;           ///< calibration temperature, K
    T reference_pressure_Pa;             ///< calibration pressure, Pa
};

/// A sensor model of target in background with no barrier yet (add them with push):
/// D_AB by method from the two gases, measured-value fields 0 (set them for
/// diffusivity_method::measured); reference temperature in K, pressure in Pa.
template <class T, std::size_t N>
constexpr sensor_model<T, N> make_sensor(const gas_data* target, const gas_data* background, unsigned electrons,
                                         T flux_ratio, T reference_temperature_K, T reference_pressure_Pa,
                                         diffusivity_method method = diffusivity_method::fuller,
                                         reading_kind reading = reading_kind::mole_fraction) noexcept {
    return sensor_model<T, N>{target,
                              background,
                              diffusivity_model<T>{method, target, background, T(0), T(0), T(0), T(0)},
                              series<T, N>{},
                              electrons,
                              flux_ratio,
                              reading,
                              reference_temperature_K,
                              reference_pressure_Pa};
}

/// status::ok when the model is complete and physical: known, distinct gases,
/// electrons >= 1, 1..N valid elements, finite flux ratio, valid reference.
template <class T, std::size_t N>
constexpr status validate(const sensor_model<T, N>& m) noexcept {
    if (m.target == nullptr || m.background == nullptr) return status::unknown_gas;
    if (m.target == m.background || detail::string_equal(m.target->formula, m.background->formula, false))
        return status::out_of_domain;
    if (m.electrons < 1u || m.barriers.count < 1 || m.barriers.count > N) return status::out_of_domain;
    if (!detail::finite(m.flux_ratio)) return status::not_finite;
    status s = detail::check_condition(m.reference_temperature_K, m.reference_pressure_Pa);
    for (std::size_t i = 0; i < m.barriers.count; ++i) s |= validate(m.barriers.elements[i]);
    return s;
}

/// The model's barrier series resolved at (T, P); count 0 (and the reason in
/// the flags) when the model, the condition or an element cannot be resolved.
template <class T, std::size_t N>
inline result<series_transport<T, N>> transport_at(const sensor_model<T, N>& m, T temperature_K,
                                                   T pressure_Pa) noexcept {
    series_transport<T, N> st{};
    st.count = 0;
    st.total_concentration_mol_m3 = T(1);
    st.alpha = T(0);
    status s = validate(m);
    s |= detail::check_condition(temperature_K, pressure_Pa);
    if (s != status::ok) return {st, s};
    const result<T> d = evaluate(m.diffusivity, temperature_K, pressure_Pa);
    const result<T> lambda = mean_free_path(kinetic_diameter_m<T>(*m.background), temperature_K, pressure_Pa);
    s |= d.code;
    s |= lambda.code;
    if (has(s, status::not_finite) || !(d.value > T(0)) || !(lambda.value > T(0))) return {st, s};
    const gas_environment<T> env{temperature_K, pressure_Pa, d.value, molar_mass_kg_mol<T>(*m.target),
                                 lambda.value};
    st.total_concentration_mol_m3 = pressure_Pa / (gas_constant_J_mol_K<T> * temperature_K);
    st.alpha = alpha_from_flux_ratio(m.flux_ratio);
    st.count = m.barriers.count;
    bool resolved = true;
    for (std::size_t i = 0; i < st.count; ++i) {
        const result<element_transport<T>> e = resolve(m.barriers.elements[i], env);
        st.elements[i] = e.value;
        s |= e.code;
        resolved = resolved && e.ok();
    }
    if (!resolved) st.count = 0;  // an unresolved element leaves a placeholder: report no series at all
    return {st, s};
}

namespace detail {

/// y limited to [0, 1]; below_range / above_range added to s when it was outside.
template <class T>
constexpr T clamp_fraction(T y, status& s) noexcept {
    if (y < T(0)) { s |= status::below_range; return T(0); }
    if (y > T(1)) { s |= status::above_range; return T(1); }
    return y;
}

}  // namespace detail

/// Sensitivity S = dI/dy at y -> 0 at (T, P), in A per mol/mol.
template <class T, std::size_t N>
inline result<T> sensitivity_A_per_mol_per_mol(const sensor_model<T, N>& m, T temperature_K, T pressure_Pa) noexcept {
    const result<series_transport<T, N>> st = transport_at(m, temperature_K, pressure_Pa);
    if (st.value.count == 0) return {T(0), st.code};
    const T resistance = dilute_resistance_s_per_mol(st.value);
    // A resistance that overflows or underflows (extreme T, P or geometry) has no meaningful sensitivity.
    if (!(detail::finite(resistance) && resistance > T(0))) return {T(0), st.code | status::out_of_domain};
    return detail::checked(static_cast<T>(m.electrons) * faraday_C_mol<T> / resistance, st.code);
}

/// Limiting current at mole fraction y outside the barrier and (T, P), in A.
/// y is clamped to [0, 1] (below_range / above_range).
template <class T, std::size_t N>
inline result<T> limiting_current_A(const sensor_model<T, N>& m, T temperature_K, T pressure_Pa,
                                    T mole_fraction) noexcept {
    if (!detail::finite(mole_fraction)) return {T(0), status::not_finite};
    status s = status::ok;
    const T y = detail::clamp_fraction(mole_fraction, s);
    const result<series_transport<T, N>> st = transport_at(m, temperature_K, pressure_Pa);
    s |= st.code;
    if (st.value.count == 0) return {T(0), s};
    const result<T> f = molar_flow(st.value, y);
    return detail::checked(static_cast<T>(m.electrons) * faraday_C_mol<T> * f.value, s | f.code);
}

/// Mole fraction outside the barrier that gives limiting current I at (T, P):
/// the inverse of limiting_current_A, closed form. Clamped to [0, 1] with
/// below_range / above_range.
template <class T, std::size_t N>
inline result<T> mole_fraction_from_current(const sensor_model<T, N>& m, T temperature_K, T pressure_Pa,
                                            T current_A) noexcept {
    if (!detail::finite(current_A)) return {T(0), status::not_finite};
    const result<series_transport<T, N>> st = transport_at(m, temperature_K, pressure_Pa);
    status s = st.code;
    if (st.value.count == 0) return {T(0), s};
    const T flow = current_A / (static_cast<T>(m.electrons) * faraday_C_mol<T>);
    const result<T> y = outer_fraction_for_flow(st.value, flow);
    // A march that ran off (no finite fraction drives this current) is an edge
    // reading: above the range for a positive current, below for a negative one.
    if (has(y.code, status::out_of_domain))
        s |= y.value > T(0) ? status::above_range : status::below_range;
    else
        s |= y.code;
    const T clamped = detail::clamp_fraction(y.value, s);
    return {clamped, s};
}

/// The reading the sensor reports for limiting current I at (T, P): the mole
/// fraction (mol/mol) or, for a partial-pressure sensor, y P (Pa). Flags as
/// mole_fraction_from_current.
template <class T, std::size_t N>
inline result<T> reading_from_current(const sensor_model<T, N>& m, T temperature_K, T pressure_Pa,
                                      T current_A) noexcept {
    const result<T> y = mole_fraction_from_current(m, temperature_K, pressure_Pa, current_A);
    if (m.reading == reading_kind::partial_pressure && detail::finite(pressure_Pa) && pressure_Pa > T(0))
        return detail::checked(y.value * pressure_Pa, y.code);
    return y;
}

namespace detail {

/// Central-difference step for d ln s / dx at x: x * eps^(1/3).
template <class T>
inline T derivative_step(T x) noexcept {
    return std::fabs(x) * std::cbrt(std::numeric_limits<T>::epsilon());
}

/// Sensitivity per unit of the reading at (T, P): S in A per mol/mol, or S / P
/// in A/Pa for a partial-pressure reading. Its logarithm differs from ln s by a constant.
template <class T, std::size_t N>
inline result<T> reading_sensitivity(const sensor_model<T, N>& m, T temperature_K, T pressure_Pa) noexcept {
    const result<T> s = sensitivity_A_per_mol_per_mol(m, temperature_K, pressure_Pa);
    if (m.reading == reading_kind::partial_pressure && pressure_Pa > T(0))
        return detail::checked(s.value / pressure_Pa, s.code);
    return s;
}

/// Central difference of ln(reading_sensitivity) between two conditions a step 2h apart.
template <class T, std::size_t N>
inline result<T> log_slope(const sensor_model<T, N>& m, T t_hi, T p_hi, T t_lo, T p_lo, T h) noexcept {
    const result<T> hi = reading_sensitivity(m, t_hi, p_hi);
    const result<T> lo = reading_sensitivity(m, t_lo, p_lo);
    const status code = hi.code | lo.code;
    const T top = detail::max_finite<T>();
    if (!(hi.value > T(0)) || !(lo.value > T(0)) || !(hi.value < top) || !(lo.value < top) || !(h > T(0)))
        return {T(0), code | status::out_of_domain};  // a failed or saturated sensitivity has no slope
    return detail::checked((std::log(hi.value) - std::log(lo.value)) / (T(2) * h), code);
}

}  // namespace detail

/// Span factor s(T, P) = S(T, P) / S(T_ref, P_ref), times P_ref / P when the
/// reading is a partial pressure; dimensionless. When either sensitivity cannot
/// be computed the value is 1 (apply no correction) with out_of_domain: a
/// neutral factor a firmware caller can divide by safely, never data.
template <class T, std::size_t N>
inline result<T> span_factor(const sensor_model<T, N>& m, T temperature_K, T pressure_Pa) noexcept {
    const result<T> s = detail::reading_sensitivity(m, temperature_K, pressure_Pa);
    const result<T> s_ref = detail::reading_sensitivity(m, m.reference_temperature_K, m.reference_pressure_Pa);
    const status code = s.code | s_ref.code;
    if (!(s.value > T(0)) || !(s_ref.value > T(0))) return {T(1), code | status::out_of_domain};
    return detail::checked(s.value / s_ref.value, code);
}

/// Temperature coefficient of the span, d ln s / dT at (T, P), in 1/K
/// (central difference on the full model).
template <class T, std::size_t N>
inline result<T> temperature_coefficient_per_K(const sensor_model<T, N>& m, T temperature_K, T pressure_Pa) noexcept {
    const T h = detail::derivative_step(temperature_K);
    return detail::log_slope(m, temperature_K + h, pressure_Pa, temperature_K - h, pressure_Pa, h);
}

/// Pressure coefficient of the span, d ln s / dP at (T, P), in 1/Pa.
template <class T, std::size_t N>
inline result<T> pressure_coefficient_per_Pa(const sensor_model<T, N>& m, T temperature_K, T pressure_Pa) noexcept {
    const T h = detail::derivative_step(pressure_Pa);
    return detail::log_slope(m, temperature_K, pressure_Pa + h, temperature_K, pressure_Pa - h, h);
}

/// Linearity ratio I(y) / (S y) at (T, P): 1 for a linear cell, 1.1221 for a
/// stagnant-film capillary at 20.95 % O2; 1 at y = 0. When the sensitivity
/// cannot be computed the value is the neutral 1 with out_of_domain.
template <class T, std::size_t N>
inline result<T> linearity_ratio(const sensor_model<T, N>& m, T temperature_K, T pressure_Pa,
                                 T mole_fraction) noexcept {
    // I / (S y) = (n F F_A) / (n F / R * y) = F_A R / y: one resolve of the series.
    if (!detail::finite(mole_fraction)) return {T(1), status::not_finite};
    status code = status::ok;
    const T y = detail::clamp_fraction(mole_fraction, code);
    const result<series_transport<T, N>> st = transport_at(m, temperature_K, pressure_Pa);
    code |= st.code;
    if (st.value.count == 0) return {T(1), code | status::out_of_domain};
    const T resistance = dilute_resistance_s_per_mol(st.value);
    if (!(detail::finite(resistance) && resistance > T(0))) return {T(1), code | status::out_of_domain};
    if (!(y > T(0))) return {T(1), code};
    const result<T> f = molar_flow(st.value, y);
    if (!(f.value > T(0))) return {T(1), code | f.code};  // the flow underflows: the dilute limit, ratio 1
    return detail::checked(f.value * resistance / y, code | f.code);
}

/// What the design report says of one element.
template <class T>
struct element_report {
    T knudsen_number;            ///< lambda / d (0 for a membrane)
    T resistance_share;          ///< share of the total dilute-limit resistance, 0..1
    T knudsen_share;             ///< share of this element's resistance that is Knudsen (linear), 0..1
    T area_m2;                   ///< cross-section, m2
    T effective_length_m;        ///< effective length, m
};

/// Reports of every element of a sensor at (T, P) and which one limits.
template <class T, std::size_t N>
struct series_report {
    std::array<element_report<T>, N> elements;  ///< outside first
    std::size_t count;                          ///< elements in use
    std::size_t limiting_element;               ///< index of the largest resistance share
    T mean_free_path_m;                         ///< mean free path of the background gas, m
    T diffusivity_m2_s;                         ///< free-gas D_AB, m2/s
};

/// Per-element Knudsen numbers and resistance shares (the shares sum to 1).
template <class T, std::size_t N>
inline result<series_report<T, N>> element_reports(const sensor_model<T, N>& m, T temperature_K,
                                                   T pressure_Pa) noexcept {
    series_report<T, N> r{};
    const result<series_transport<T, N>> st = transport_at(m, temperature_K, pressure_Pa);
    r.count = st.value.count;
    if (r.count == 0) return {r, st.code};
    const T c = st.value.total_concentration_mol_m3;
    const T total = dilute_resistance_s_per_mol(st.value);
    if (!(detail::finite(total) && total > T(0))) return {r, st.code | status::out_of_domain};  // shares undefined
    T largest = T(-1);
    for (std::size_t i = 0; i < r.count; ++i) {
        const element_transport<T>& e = st.value.elements[i];
        const T share = dilute_resistance_s_per_mol(e, c) / total;
        r.elements[i] = element_report<T>{e.knudsen_number, share,
                                          e.inv_linear_s_m2 / (e.inv_molecular_s_m2 + e.inv_linear_s_m2),
                                          e.area_m2, e.length_m};
        if (share > largest) { largest = share; r.limiting_element = i; }
    }
    r.diffusivity_m2_s = evaluate(m.diffusivity, temperature_K, pressure_Pa).value;
    r.mean_free_path_m = mean_free_path(kinetic_diameter_m<T>(*m.background), temperature_K, pressure_Pa).value;
    return {r, st.code};
}

}  // namespace counterflux

#endif  // COUNTERFLUX_SIGNAL_HPP
