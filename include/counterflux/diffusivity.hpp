// counterflux/diffusivity.hpp - binary gas diffusivity D_AB, Knudsen
// diffusivity, mean free path and Knudsen number.
//
// Sources:
//   Fuller, Schettler & Giddings, Ind. Eng. Chem. 58(5), 18 (1966), in the form
//     of Poling, Prausnitz & O'Connell, The Properties of Gases and Liquids,
//     5th ed. (2001), eq. 11-4.4, written per atm:
//     D [cm2/s] = 1.00e-3 T^1.75 sqrt(1/M_A + 1/M_B) / (P[atm] (V_A^1/3 + V_B^1/3)^2).
//   Chapman-Enskog with Lennard-Jones 12-6 parameters (Hirschfelder, Curtiss &
//     Bird, Molecular Theory of Gases and Liquids, 1954; Poling et al. eq. 11-3.2):
//     D [cm2/s] = 0.00266 T^1.5 / (P[bar] M_AB^0.5 sigma_AB^2 Omega_D),
//     M_AB = 2 / (1/M_A + 1/M_B), sigma_AB = (sigma_A + sigma_B)/2,
//     eps_AB = sqrt(eps_A eps_B); Omega_D from Neufeld, Janzen & Aziz,
//     J. Chem. Phys. 57, 1100 (1972).
//   Knudsen diffusivity D_K = (d/3) sqrt(8 R T / (pi M)) and mean free path
//     lambda = k_B T / (sqrt(2) pi d_m^2 P): kinetic theory of gases (hard
//     spheres), e.g. Cussler, Diffusion, 3rd ed. (2009), sec. 5.1 and 6.4.
// All models are for a low-density gas, where D_AB scales with 1/P and
// D_AB = D_BA exactly.
#ifndef COUNTERFLUX_DIFFUSIVITY_HPP
#define COUNTERFLUX_DIFFUSIVITY_HPP

#include <cmath>
#include <cstdint>

#include "constants.hpp"
#include "detail/checked.hpp"
#include "detail/math.hpp"
#include "gases.hpp"
#include "status.hpp"

namespace counterflux {

/// How D_AB is obtained.
enum class diffusivity_method : std::uint8_t {
    fuller,          ///< Fuller-Schettler-Giddings correlation
    chapman_enskog,  ///< Chapman-Enskog with Lennard-Jones parameters and Neufeld Omega_D
    measured,        ///< a measured value scaled with (T/T_ref)^m (P_ref/P)
};

/// Name of the method as used in files and JSON ("fuller", "chapman-enskog", "measured").
constexpr const char* method_name(diffusivity_method m) noexcept {
    return m == diffusivity_method::fuller           ? "fuller"
           : m == diffusivity_method::chapman_enskog ? "chapman-enskog"
                                                     : "measured";
}

namespace detail {

/// Status of a (temperature, pressure) pair: not_finite, out_of_domain (<= 0) or ok.
template <class T>
constexpr status check_condition(T temperature_K, T pressure_Pa) noexcept {
    if (!finite(temperature_K) || !finite(pressure_Pa)) return status::not_finite;
    if (!(temperature_K > T(0)) || !(pressure_Pa > T(0))) return status::out_of_domain;
    return status::ok;
}

/// Status of a value that must be finite and > 0.
template <class T>
constexpr status check_positive(T x) noexcept {
    if (!finite(x)) return status::not_finite;
    if (!(x > T(0))) return status::out_of_domain;
    return status::ok;
}

}  // namespace detail

/// Neufeld-Janzen-Aziz fit of the diffusion collision integral Omega_D(T*),
/// T* = k T / eps_AB; dimensionless. The fit holds for 0.3 <= T* <= 100: outside
/// it the value is computed and out_of_domain set; T* not > 0 gives 0 with
/// out_of_domain (not_finite for a non-finite T*).
template <class T>
inline result<T> neufeld_collision_integral(T reduced_temperature) noexcept {
    const T ts = reduced_temperature;
    if (!detail::finite(ts)) return {T(0), status::not_finite};
    if (!(ts > T(0))) return {T(0), status::out_of_domain};
    const T omega = T(1.06036) / std::pow(ts, T(0.15610)) + T(0.19300) / std::exp(T(0.47635) * ts) +
                    T(1.03587) / std::exp(T(1.52996) * ts) + T(1.76474) / std::exp(T(3.89411) * ts);
    return detail::checked(omega, (ts < T(0.3) || ts > T(100)) ? status::out_of_domain : status::ok);
}

/// Fuller-Schettler-Giddings D_AB of gases a and b, in m2/s.
/// Returns 0 with out_of_domain / not_finite for T or P not finite and > 0.
template <class T>
inline result<T> fuller_diffusivity(const gas_data& a, const gas_data& b, T temperature_K,
                                    T pressure_Pa) noexcept {
    const status s = detail::check_condition(temperature_K, pressure_Pa);
    if (s != status::ok) return {T(0), s};
    const T inv_m = T(1) / static_cast<T>(a.molar_mass_g_mol) + T(1) / static_cast<T>(b.molar_mass_g_mol);
    const T v = std::cbrt(static_cast<T>(a.diffusion_volume)) + std::cbrt(static_cast<T>(b.diffusion_volume));
    const T p_atm = pressure_Pa / standard_atmosphere_Pa<T>;
    const T d_cm2_s = T(1.00e-3) * std::pow(temperature_K, T(1.75)) * std::sqrt(inv_m) / (p_atm * v * v);
    return detail::checked(d_cm2_s * T(1.0e-4));
}

/// Chapman-Enskog D_AB of gases a and b with the Neufeld collision integral, in m2/s.
/// Returns 0 with out_of_domain / not_finite for T or P not finite and > 0; the
/// value is computed but flagged out_of_domain outside the fit's 0.3 <= T* <= 100.
template <class T>
inline result<T> chapman_enskog_diffusivity(const gas_data& a, const gas_data& b, T temperature_K,
                                            T pressure_Pa) noexcept {
    const status s = detail::check_condition(temperature_K, pressure_Pa);
    if (s != status::ok) return {T(0), s};
    const T m_ab = T(2) / (T(1) / static_cast<T>(a.molar_mass_g_mol) + T(1) / static_cast<T>(b.molar_mass_g_mol));
    const T sigma = (static_cast<T>(a.lj_sigma_angstrom) + static_cast<T>(b.lj_sigma_angstrom)) / T(2);
    const T eps = std::sqrt(static_cast<T>(a.lj_epsilon_over_k_K) * static_cast<T>(b.lj_epsilon_over_k_K));
    const T t_star = temperature_K / eps;
    const result<T> omega_fit = neufeld_collision_integral(t_star);  // flags T* outside the fit
    if (!(omega_fit.value > T(0))) return {T(0), omega_fit.code | status::out_of_domain};
    const T omega = omega_fit.value;
    const T p_bar = pressure_Pa / T(1.0e5);
    const T d_cm2_s =
        T(0.00266) * std::pow(temperature_K, T(1.5)) / (p_bar * std::sqrt(m_ab) * sigma * sigma * omega);
    return detail::checked(d_cm2_s * T(1.0e-4), omega_fit.code);
}

/// A measured D_ref at (T_ref, P_ref) carried to (T, P): D_ref (T/T_ref)^m (P_ref/P), in m2/s.
template <class T>
inline result<T> measured_diffusivity(T value_m2_s, T at_temperature_K, T at_pressure_Pa, T exponent,
                                      T temperature_K, T pressure_Pa) noexcept {
    status s = detail::check_condition(temperature_K, pressure_Pa);
    s |= detail::check_condition(at_temperature_K, at_pressure_Pa);
    s |= detail::check_positive(value_m2_s);
    if (!detail::finite(exponent)) s |= status::not_finite;
    if (s != status::ok) return {T(0), s};
    const T d = value_m2_s * std::pow(temperature_K / at_temperature_K, exponent) * (at_pressure_Pa / pressure_Pa);
    return detail::checked(d);
}

/// Knudsen diffusivity D_K = (d/3) sqrt(8 R T / (pi M)) in a pore of diameter d, in m2/s.
template <class T>
inline result<T> knudsen_diffusivity(T pore_diameter_m, T molar_mass_kg_mol, T temperature_K) noexcept {
    status s = detail::check_positive(pore_diameter_m);
    s |= detail::check_positive(molar_mass_kg_mol);
    s |= detail::check_positive(temperature_K);
    if (s != status::ok) return {T(0), s};
    const T mean_speed = std::sqrt(T(8) * gas_constant_J_mol_K<T> * temperature_K / (pi_v<T> * molar_mass_kg_mol));
    return detail::checked(pore_diameter_m / T(3) * mean_speed);
}

/// Mean free path lambda = k_B T / (sqrt(2) pi d_m^2 P) of molecules of diameter d_m, in m.
template <class T>
inline result<T> mean_free_path(T molecule_diameter_m, T temperature_K, T pressure_Pa) noexcept {
    status s = detail::check_condition(temperature_K, pressure_Pa);
    s |= detail::check_positive(molecule_diameter_m);
    if (s != status::ok) return {T(0), s};
    // Computed as (k_B / d^2) first so that float does not underflow at d^2 ~ 1e-19.
    const T kd = boltzmann_J_K<T> / molecule_diameter_m / molecule_diameter_m;
    return detail::checked(kd * temperature_K / (std::sqrt(T(2)) * pi_v<T> * pressure_Pa));
}

/// Knudsen number Kn = lambda / d (dimensionless). Kn < 0.01 is continuum and
/// Kn > 10 free-molecular (common practice, no source).
template <class T>
inline result<T> knudsen_number(T mean_free_path_m, T pore_diameter_m) noexcept {
    status s = detail::check_positive(mean_free_path_m);
    s |= detail::check_positive(pore_diameter_m);
    if (s != status::ok) return {T(0), s};
    return detail::checked(mean_free_path_m / pore_diameter_m);
}

/// How to obtain D_AB for one gas pair: a method and its data.
template <class T>
struct diffusivity_model {
    diffusivity_method method;  ///< which model
    const gas_data* a;          ///< gas A (target); used by fuller and chapman_enskog
    const gas_data* b;          ///< gas B (background)
    T measured_m2_s;            ///< measured D at the stated condition, m2/s (method measured)
    T measured_temperature_K;   ///< temperature of the measured value, K
    T measured_pressure_Pa;     ///< pressure of the measured value, Pa
    T measured_exponent;        ///< temperature exponent m of the measured value
};

/// D_AB of the model's pair at (T, P), in m2/s; unknown_gas when a needed gas pointer is null.
template <class T>
inline result<T> evaluate(const diffusivity_model<T>& m, T temperature_K, T pressure_Pa) noexcept {
    switch (m.method) {
        case diffusivity_method::measured:
            return measured_diffusivity(m.measured_m2_s, m.measured_temperature_K, m.measured_pressure_Pa,
                                        m.measured_exponent, temperature_K, pressure_Pa);
        case diffusivity_method::chapman_enskog:
            if (m.a == nullptr || m.b == nullptr) return {T(0), status::unknown_gas};
            return chapman_enskog_diffusivity(*m.a, *m.b, temperature_K, pressure_Pa);
        case diffusivity_method::fuller:
        default:
            if (m.a == nullptr || m.b == nullptr) return {T(0), status::unknown_gas};
            return fuller_diffusivity(*m.a, *m.b, temperature_K, pressure_Pa);
    }
}

}  // namespace counterflux

#endif  // COUNTERFLUX_DIFFUSIVITY_HPP
