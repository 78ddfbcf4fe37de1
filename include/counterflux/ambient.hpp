// counterflux/ambient.hpp - the surroundings a sensor reading is corrected
// for: zero current, humidity dilution and altitude.
//
// Sources:
//   zero current I_0(T) = a exp(b (T - T_ref)), fitted from zero-gas bench
//     points (common practice, no source);
//   saturation vapour pressure over water e_s = 610.94 exp(17.625 t / (t + 243.04)) Pa,
//     t in degC (Alduchov & Eskridge, J. Appl. Meteor. 35, 601 (1996), eq. 21);
//   standard-atmosphere pressure P = 101325 (1 - 2.25577e-5 h)^5.25588 Pa for
//     geopotential height h in m in the troposphere (ISO 2533:1975).
#ifndef COUNTERFLUX_AMBIENT_HPP
#define COUNTERFLUX_AMBIENT_HPP

#include <cmath>

#include "constants.hpp"
#include "detail/checked.hpp"
#include "detail/math.hpp"
#include "status.hpp"

namespace counterflux {

/// Zero (baseline) current a exp(b (T - T_ref)), in the unit of a (A).
template <class T>
inline result<T> zero_current_A(T a_A, T b_per_K, T reference_temperature_K, T temperature_K) noexcept {
    if (!detail::finite(a_A) || !detail::finite(b_per_K) || !detail::finite(reference_temperature_K) ||
        !detail::finite(temperature_K))
        return {T(0), status::not_finite};
    T x = b_per_K * (temperature_K - reference_temperature_K);
    status s = status::ok;
    if (x > detail::max_exponent<T>()) { x = detail::max_exponent<T>(); s = status::above_range; }
    return detail::checked(a_A * std::exp(x), s);
}

/// Saturation vapour pressure of water at temperature T (Alduchov & Eskridge), in Pa.
/// Fit range -40 .. 50 degC; outside it the value is computed and below_range /
/// above_range set.
template <class T>
inline result<T> saturation_pressure_Pa(T temperature_K) noexcept {
    if (!detail::finite(temperature_K)) return {T(0), status::not_finite};
    if (!(temperature_K > T(0))) return {T(0), status::out_of_domain};
    const T t = temperature_K - ice_point_K<T>;
    status s = status::ok;
    if (t < T(-40)) s = status::below_range;
    if (t > T(50)) s = status::above_range;
    // Far below the fit range (t < -243.04 degC) the fit's exponent changes
    // sign and can overflow: the value is then saturated (still below_range).
    return detail::checked(T(610.94) * std::exp(T(17.625) * t / (t + T(243.04))), s);
}

/// Dry-basis mole fraction y / (1 - p_w / P) of a reading y taken in gas with
/// water partial pressure p_w (relative humidity 0..1 times e_s) at total P.
/// y and the result are clamped to [0, 1], relative humidity to [0, 1], with
/// below_range / above_range.
template <class T>
inline result<T> dry_mole_fraction(T mole_fraction, T relative_humidity, T temperature_K, T pressure_Pa) noexcept {
    if (!detail::finite(mole_fraction) || !detail::finite(relative_humidity) || !detail::finite(pressure_Pa))
        return {detail::finite(mole_fraction) ? detail::clamp(mole_fraction, T(0), T(1)) : T(0), status::not_finite};
    status s = status::ok;
    const T y = detail::clamp(mole_fraction, T(0), T(1));
    if (y != mole_fraction) s |= mole_fraction < T(0) ? status::below_range : status::above_range;
    if (!(pressure_Pa > T(0))) return {y, s | status::out_of_domain};
    const result<T> es = saturation_pressure_Pa(temperature_K);
    s |= es.code;
    const T rh = detail::clamp(relative_humidity, T(0), T(1));
    if (rh != relative_humidity) s |= relative_humidity < T(0) ? status::below_range : status::above_range;
    const T water = rh * es.value / pressure_Pa;
    if (!(water < T(1))) return {y, s | status::out_of_domain};
    const T dry = y / (T(1) - water);
    if (dry > T(1)) return {T(1), s | status::above_range};  // more water than the reading leaves room for
    return {dry, s};
}

/// ISO 2533 standard-atmosphere pressure at altitude h (m), in Pa, for -5000 ..
/// 11000 m (the table's lower end to the tropopause); outside that the altitude
/// is clamped and below_range / above_range set.
template <class T>
inline result<T> standard_pressure_at_altitude_Pa(T altitude_m) noexcept {
    if (!detail::finite(altitude_m)) return {standard_atmosphere_Pa<T>, status::not_finite};
    status s = status::ok;
    T h = altitude_m;
    if (h < T(-5000)) { h = T(-5000); s = status::below_range; }
    if (h > T(11000)) { h = T(11000); s = status::above_range; }
    return {standard_atmosphere_Pa<T> * std::pow(T(1) - T(2.25577e-5) * h, T(5.25588)), s};
}

}  // namespace counterflux

#endif  // COUNTERFLUX_AMBIENT_HPP
