// counterflux/constants.hpp - physical constants, SI.
//
// Source: BIPM, The International System of Units (SI), 9th ed., 2019: the
// defining constants h, e, k_B and N_A are exact; R = N_A k_B and F = N_A e
// follow exactly. Standard atmosphere: 101325 Pa by definition (ISO 2533).
#ifndef COUNTERFLUX_CONSTANTS_HPP
#define COUNTERFLUX_CONSTANTS_HPP

namespace counterflux {

/// Molar gas constant R = N_A k_B, in J/(mol K).
template <class T>
inline constexpr T gas_constant_J_mol_K = static_cast<T>(8.31446261815324);

/// Faraday constant F = N_A e, in C/mol.
template <class T>
inline constexpr T faraday_C_mol = static_cast<T>(96485.3321233100184);

/// Boltzmann constant k_B, in J/K (exact).
template <class T>
inline constexpr T boltzmann_J_K = static_cast<T>(1.380649e-23);

/// Avogadro constant N_A, in 1/mol (exact).
template <class T>
inline constexpr T avogadro_per_mol = static_cast<T>(6.02214076e23);

/// Standard atmosphere, in Pa (exact by definition).
template <class T>
inline constexpr T standard_atmosphere_Pa = static_cast<T>(101325.0);

/// 0 degC in K (exact by definition).
template <class T>
inline constexpr T ice_point_K = static_cast<T>(273.15);

/// pi.
template <class T>
inline constexpr T pi_v = static_cast<T>(3.14159265358979323846264338327950288);

}  // namespace counterflux

#endif  // COUNTERFLUX_CONSTANTS_HPP
