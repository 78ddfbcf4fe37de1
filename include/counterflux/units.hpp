// counterflux/units.hpp - conversion helpers between common units and SI.
//
// The library is SI inside (K, Pa, m, mol, s, A). These helpers exist for
// callers that hold values in the units of the trade.
#ifndef COUNTERFLUX_UNITS_HPP
#define COUNTERFLUX_UNITS_HPP

#include "constants.hpp"

namespace counterflux {

/// Kelvin from degrees Celsius.
template <class T>
constexpr T celsius_to_kelvin(T celsius) noexcept { return celsius + ice_point_K<T>; }

/// Degrees Celsius from kelvin.
template <class T>
constexpr T kelvin_to_celsius(T kelvin) noexcept { return kelvin - ice_point_K<T>; }

/// Pa per standard atmosphere.
template <class T>
inline constexpr T atm_Pa = standard_atmosphere_Pa<T>;

/// Pa per bar (exact).
template <class T>
inline constexpr T bar_Pa = static_cast<T>(1.0e5);

/// Pa per cmHg at 0 degC: 1 atm / 76 cmHg (conventional definition).
template <class T>
inline constexpr T cmHg_Pa = static_cast<T>(101325.0 / 76.0);

/// Mole fraction of one part per million.
template <class T>
inline constexpr T ppm = static_cast<T>(1.0e-6);

/// Mole fraction of one part per billion.
template <class T>
inline constexpr T ppb = static_cast<T>(1.0e-9);

/// m2/s per cm2/s.
template <class T>
inline constexpr T cm2_per_s_m2_per_s = static_cast<T>(1.0e-4);

/// Moles of ideal gas in 1 cm3 at STP (273.15 K, 101325 Pa): p V / (R T).
template <class T>
inline constexpr T mol_per_cm3_stp =
    static_cast<T>(101325.0 * 1.0e-6 / (8.31446261815324 * 273.15));

/// mol/(m s Pa) per Barrer, 1 Barrer = 1e-10 cm3(STP) cm / (cm2 s cmHg)
/// = 3.3464e-16 mol/(m s Pa).
template <class T>
inline constexpr T barrer_mol_m_s_Pa =
    static_cast<T>(1.0e-10 * (101325.0 * 1.0e-6 / (8.31446261815324 * 273.15)) * 1.0e-2 /
                   (1.0e-4 * (101325.0 / 76.0)));

/// A/(mol/mol) per nA/ppm: multiply nA/ppm by this to get A per mol/mol.
template <class T>
inline constexpr T nA_per_ppm_A_per_mol_per_mol = static_cast<T>(1.0e-9 / 1.0e-6);

/// Sensitivity in nA/ppm from a sensitivity in A per mol/mol.
template <class T>
constexpr T to_nA_per_ppm(T A_per_mol_per_mol) noexcept {
    return A_per_mol_per_mol / nA_per_ppm_A_per_mol_per_mol<T>;
}

}  // namespace counterflux

#endif  // COUNTERFLUX_UNITS_HPP
