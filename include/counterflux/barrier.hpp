// counterflux/barrier.hpp - the barrier elements of a sensor and their
// transport data at a condition.
//
// Geometry (docs/models.md sec. 2):
//   capillary: n parallel bores of diameter d and length L; area n pi d^2 / 4;
//     effective length L + pi d / 8 per open end, the access resistance of a
//     disc aperture 1/(4 D a) written as a length (Brown & Escombe, Phil.
//     Trans. R. Soc. B 193, 223 (1900)); the end correction is on by default.
//     The ends lie in free gas, so the Knudsen resistance acts over L only.
//   porous disc or sintered plug: D_eff = (eps / tau) D for both the molecular
//     and the Knudsen part, D_K from the mean pore diameter.
//   membrane (solution-diffusion): N = Pi(T) (p1 - p2) / delta with Arrhenius
//     permeability, represented as a linear resistivity 1/(Pi R T).
#ifndef COUNTERFLUX_BARRIER_HPP
#define COUNTERFLUX_BARRIER_HPP

#include <cstdint>

#include "constants.hpp"
#include "detail/math.hpp"
#include "diffusivity.hpp"
#include "flux.hpp"
#include "status.hpp"

namespace counterflux {

/// The kinds of barrier element.
enum class barrier_kind : std::uint8_t {
    capillary,  ///< n parallel bores
    porous,     ///< porous disc, sintered plug, dust filter
    membrane,   ///< solution-diffusion film (PTFE, FEP, silicone) or electrolyte film
};

/// Name of a barrier kind as used in sensor files ("capillary", "porous", "membrane").
constexpr const char* kind_name(barrier_kind k) noexcept {
    return k == barrier_kind::capillary ? "capillary" : k == barrier_kind::porous ? "porous" : "membrane";
}

/// One barrier element; the fields a kind does not use are zero.
template <class T>
struct barrier {
    barrier_kind kind;             ///< which kind of element
    T diameter_m;                  ///< capillary bore diameter, m
    T length_m;                    ///< capillary length, or porous / membrane thickness, m
    T area_m2;                     ///< porous / membrane area, m2 (capillary: derived from the bores)
    unsigned count;                ///< capillary: number of parallel bores
    bool end_correction;           ///< capillary: add pi d / 8 per open end
    bool knudsen;                  ///< capillary, porous: include the Knudsen resistance
    T porosity;                    ///< porous: void fraction eps, (0, 1]
    T tortuosity;                  ///< porous: tortuosity factor tau, >= 1
    T pore_diameter_m;             ///< porous: mean pore diameter, m
    T permeability_mol_m_s_Pa;     ///< membrane: permeability at permeability_temperature_K, mol/(m s Pa)
    T activation_energy_J_mol;     ///< membrane: activation energy of the permeability, J/mol
    T permeability_temperature_K;  ///< membrane: temperature of the permeability value, K
    T membrane_diffusivity_m2_s;   ///< membrane: diffusivity in the film (step response), m2/s; 0 if unknown
};

/// A capillary element of count bores of diameter d and length L.
template <class T>
constexpr barrier<T> make_capillary(T diameter_m, T length_m, unsigned count = 1, bool end_correction = true,
                                    bool knudsen = true) noexcept {
    return barrier<T>{barrier_kind::capillary, diameter_m, length_m, T(0), count, end_correction, knudsen,
                      T(0), T(0), T(0), T(0), T(0), T(0), T(0)};
}

/// A porous element: thickness, area, porosity, tortuosity and mean pore diameter.
template <class T>
constexpr barrier<T> make_porous(T thickness_m, T area_m2, T porosity, T tortuosity, T pore_diameter_m,
                                 bool knudsen = true) noexcept {
    return barrier<T>{barrier_kind::porous, T(0), thickness_m, area_m2, 1u, false, knudsen,
                      porosity, tortuosity, pore_diameter_m, T(0), T(0), T(0), T(0)};
}

/// A solution-diffusion membrane: thickness, area, permeability at the
/// reference temperature and its activation energy, and optionally the
/// diffusivity in the film.
template <class T>
constexpr barrier<T> make_membrane(T thickness_m, T area_m2, T permeability_mol_m_s_Pa, T activation_energy_J_mol,
                                   T reference_temperature_K, T diffusivity_m2_s = T(0)) noexcept {
    return barrier<T>{barrier_kind::membrane, T(0), thickness_m, area_m2, 1u, false, false,
                      T(0), T(0), T(0), permeability_mol_m_s_Pa, activation_energy_J_mol, reference_temperature_K,
                      diffusivity_m2_s};
}

/// status::ok when b is a physical element, else out_of_domain (negative or
/// zero length or area, porosity outside (0, 1], tortuosity < 1, no bores, ...)
/// or not_finite.
template <class T>
constexpr status validate(const barrier<T>& b) noexcept {
    using detail::finite;
    switch (b.kind) {
        case barrier_kind::capillary:
            if (!finite(b.diameter_m) || !finite(b.length_m)) return status::not_finite;
            if (!(b.diameter_m > T(0)) || b.length_m < T(0) || b.count < 1u) return status::out_of_domain;
            if (!(b.length_m > T(0)) && !b.end_correction) return status::out_of_domain;
            return status::ok;
        case barrier_kind::porous:
            if (!finite(b.length_m) || !finite(b.area_m2) || !finite(b.porosity) || !finite(b.tortuosity) ||
                !finite(b.pore_diameter_m))
                return status::not_finite;
            if (!(b.length_m > T(0)) || !(b.area_m2 > T(0)) || !(b.porosity > T(0)) || b.porosity > T(1) ||
                b.tortuosity < T(1) || (b.knudsen && !(b.pore_diameter_m > T(0))))
                return status::out_of_domain;
            return status::ok;
        case barrier_kind::membrane:
        default:
            if (!finite(b.length_m) || !finite(b.area_m2) || !finite(b.permeability_mol_m_s_Pa) ||
                !finite(b.activation_energy_J_mol) || !finite(b.permeability_temperature_K) ||
                !finite(b.membrane_diffusivity_m2_s))
                return status::not_finite;
            if (!(b.length_m > T(0)) || !(b.area_m2 > T(0)) || !(b.permeability_mol_m_s_Pa > T(0)) ||
                !(b.permeability_temperature_K > T(0)) || b.membrane_diffusivity_m2_s < T(0))
                return status::out_of_domain;
            return status::ok;
    }
}

/// Cross-section of element b through which the flow passes, m2.
template <class T>
constexpr T barrier_area_m2(const barrier<T>& b) noexcept {
    return b.kind == barrier_kind::capillary
               ? static_cast<T>(b.count) * pi_v<T> * b.diameter_m * b.diameter_m / T(4)
               : b.area_m2;
}

/// Effective diffusion length of element b, m (capillary: with end corrections).
template <class T>
constexpr T effective_length_m(const barrier<T>& b) noexcept {
    return (b.kind == barrier_kind::capillary && b.end_correction) ? b.length_m + pi_v<T> * b.diameter_m / T(4)
                                                                   : b.length_m;
}

/// The gas around the barrier at one condition.
template <class T>
struct gas_environment {
    T temperature_K;             ///< K
    T pressure_Pa;               ///< Pa
    T diffusivity_m2_s;          ///< free-gas D_AB at (T, P), m2/s
    T target_molar_mass_kg_mol;  ///< molar mass of A, for D_K, kg/mol
    T mean_free_path_m;          ///< mean free path of the background gas, m
};

namespace detail {

/// e with status ok when its data are usable by the flux law (check_element
/// and a finite Knudsen number), else the placeholder with the reason.
template <class T>
constexpr result<element_transport<T>> checked_transport(const element_transport<T>& e,
                                                         const element_transport<T>& placeholder) noexcept {
    status s = check_element(e);
    if (!finite(e.knudsen_number)) s |= status::not_finite;
    if (s != status::ok) return {placeholder, s};
    return {e, status::ok};
}

}  // namespace detail

/// Transport data of element b in environment g (area, effective length,
/// resistivities, Knudsen number). Status out_of_domain / not_finite for an
/// invalid element or environment, or when the data overflow or underflow
/// (e.g. a permeability that vanishes at a very low temperature); the data are
/// then unit placeholders.
template <class T>
inline result<element_transport<T>> resolve(const barrier<T>& b, const gas_environment<T>& g) noexcept {
    const element_transport<T> placeholder{T(1), T(1), T(1), T(0), T(0)};
    status s = validate(b);
    s |= detail::check_condition(g.temperature_K, g.pressure_Pa);
    s |= detail::check_positive(g.diffusivity_m2_s);
    s |= detail::check_positive(g.target_molar_mass_kg_mol);
    s |= detail::check_positive(g.mean_free_path_m);
    if (s != status::ok) return {placeholder, s};
    const T area = barrier_area_m2(b);
    const T length = effective_length_m(b);
    switch (b.kind) {
        case barrier_kind::capillary: {
            T r_l = T(0);
            if (b.knudsen && b.length_m > T(0)) {  // a bare orifice (L = 0) has no bore
                const result<T> dk = knudsen_diffusivity(b.diameter_m, g.target_molar_mass_kg_mol, g.temperature_K);
                if (!dk.ok()) return {placeholder, dk.code};
                r_l = (T(1) / dk.value) * (b.length_m / length);  // Knudsen acts in the bore only
            }
            return detail::checked_transport(
                element_transport<T>{area, length, T(1) / g.diffusivity_m2_s, r_l, g.mean_free_path_m / b.diameter_m},
                placeholder);
        }
        case barrier_kind::porous: {
            const T geometry = b.tortuosity / b.porosity;  // D_eff = (eps / tau) D
            T r_l = T(0);
            T kn = T(0);
            if (b.knudsen) {
                const result<T> dk =
                    knudsen_diffusivity(b.pore_diameter_m, g.target_molar_mass_kg_mol, g.temperature_K);
                if (!dk.ok()) return {placeholder, dk.code};
                r_l = geometry / dk.value;
            }
            if (b.pore_diameter_m > T(0)) kn = g.mean_free_path_m / b.pore_diameter_m;
            return detail::checked_transport(element_transport<T>{area, length, geometry / g.diffusivity_m2_s, r_l, kn},
                                             placeholder);
        }
        case barrier_kind::membrane:
        default: {
            const result<T> perm = arrhenius_permeability(b.permeability_mol_m_s_Pa, b.activation_energy_J_mol,
                                                          b.permeability_temperature_K, g.temperature_K);
            if (!perm.ok()) return {placeholder, perm.code};
            const T r_l = T(1) / (perm.value * gas_constant_J_mol_K<T> * g.temperature_K);
            return detail::checked_transport(element_transport<T>{area, length, T(0), r_l, T(0)}, placeholder);
        }
    }
}

}  // namespace counterflux

#endif  // COUNTERFLUX_BARRIER_HPP
