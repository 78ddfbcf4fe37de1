// counterflux/gases.hpp - constexpr property table of the gases a sensor meets.
//
// Columns and their sources (each row repeats the source of any value that
// departs from these):
//   molar mass        IUPAC standard atomic weights (conventional values,
//                     CIAAW 2013); air: U.S. Standard Atmosphere 1976 (28.9644).
//   diffusion volume  Fuller, Ensley & Giddings (1969) as tabulated in Poling,
//                     Prausnitz & O'Connell, The Properties of Gases and Liquids,
//                     5th ed. (2001), Table 11-1 (simple molecules; atomic
//                     increments C 15.9, H 2.31, S 22.9 for the others).
//   sigma, eps/k      Lennard-Jones 12-6 parameters from viscosity, Svehla, NASA
//                     TR R-132 (1962), as tabulated in Poling et al. 5th ed.,
//                     Appendix B, Table B-1.
//   kinetic diameter  Breck, Zeolite Molecular Sieves (Wiley, 1974), Table 8.14.
// All values were transcribed from memory of those tables and are marked so;
// a value that is an estimate and not a table entry says "estimate".
#ifndef COUNTERFLUX_GASES_HPP
#define COUNTERFLUX_GASES_HPP

#include <cstddef>

#include "status.hpp"

namespace counterflux {

/// Properties of one gas, in the units of the source tables. Stored as float
/// (the tables give at most five significant figures), so that the float path
/// of a Cortex-M4F reads them without a software double conversion.
struct gas_data {
    const char* formula;               ///< chemical formula used for look-up ("CO", "O2", "air")
    const char* name;                  ///< English name, also accepted by find_gas
    float molar_mass_g_mol;           ///< g/mol
    float diffusion_volume;           ///< Fuller diffusion volume, dimensionless (cm3/mol scale)
    float lj_sigma_angstrom;          ///< Lennard-Jones collision diameter, angstrom
    float lj_epsilon_over_k_K;        ///< Lennard-Jones well depth over k_B, K
    float kinetic_diameter_angstrom;  ///< kinetic (sieving) diameter, angstrom
};

/// The gas table. Values from memory of the tables named at the top of the file.
inline constexpr gas_data gas_table[] = {
    // formula  name                  M [g/mol]  V (Fuller)  sigma [A]  eps/k [K]  d_k [A]
    {"O2", "oxygen", 31.998f, 16.3f, 3.467f, 106.7f, 3.46f},
    {"N2", "nitrogen", 28.014f, 18.5f, 3.798f, 71.4f, 3.64f},
    // air: V and LJ are table entries; kinetic diameter is an estimate, the
    // mole-fraction mean of N2 and O2 (0.79 * 3.64 + 0.21 * 3.46).
    {"air", "air", 28.9644f, 19.7f, 3.711f, 78.6f, 3.60f},
    {"CO", "carbon monoxide", 28.010f, 18.0f, 3.690f, 91.7f, 3.76f},
    {"CO2", "carbon dioxide", 44.009f, 26.9f, 3.941f, 195.2f, 3.30f},
    {"H2", "hydrogen", 2.016f, 6.12f, 2.827f, 59.7f, 2.89f},
    {"H2O", "water", 18.015f, 13.1f, 2.641f, 809.1f, 2.65f},
    // CH4: V from atomic increments C + 4 H = 15.9 + 4 * 2.31.
    {"CH4", "methane", 16.043f, 25.14f, 3.758f, 148.6f, 3.80f},
    // H2S: V from atomic increments S + 2 H = 22.9 + 2 * 2.31.
    {"H2S", "hydrogen sulfide", 34.076f, 27.52f, 3.623f, 301.1f, 3.60f},
    // NO: no simple-molecule volume in Table 11-1 and the organic N and O
    // increments (4.54 + 6.11) are far too small for it; V = 17.4 is an
    // estimate, the mean of the N2 and O2 volumes.
    {"NO", "nitric oxide", 30.006f, 17.4f, 3.492f, 116.7f, 3.17f},
    // NO2: not in Tables 11-1, B-1 or 8.14. All three are estimates: V = NO
    // estimate + O increment (17.4 + 6.11); sigma = 0.841 Vc^(1/3) and
    // eps/k = 0.77 Tc (Bird, Stewart & Lightfoot, Transport Phenomena, 2nd ed.,
    // eq. 1.4-11, 1.4-12) with Tc = 431.4 K, Vc = 82.5 cm3/mol from memory;
    // kinetic diameter taken equal to that of CO2 (triatomic, similar size).
    {"NO2", "nitrogen dioxide", 46.005f, 23.5f, 3.66f, 332.0f, 3.30f},
    {"SO2", "sulfur dioxide", 64.058f, 41.8f, 4.112f, 335.4f, 3.60f},
    {"NH3", "ammonia", 17.031f, 20.7f, 2.900f, 558.3f, 2.60f},
    {"Cl2", "chlorine", 70.90f, 38.4f, 4.217f, 316.0f, 3.20f},
    {"He", "helium", 4.0026f, 2.67f, 2.551f, 10.22f, 2.60f},
    {"Ar", "argon", 39.948f, 16.2f, 3.542f, 93.3f, 3.40f},
};

/// Number of rows in gas_table.
inline constexpr std::size_t gas_count = sizeof(gas_table) / sizeof(gas_table[0]);

namespace detail {

/// ASCII lower case of c.
constexpr char ascii_lower(char c) noexcept {
    return (c >= 'A' && c <= 'Z') ? static_cast<char>(c - 'A' + 'a') : c;
}

/// True when a and b are equal strings; case-insensitive when fold is true.
constexpr bool string_equal(const char* a, const char* b, bool fold) noexcept {
    if (a == nullptr || b == nullptr) return false;
    for (std::size_t i = 0;; ++i) {
        const char ca = fold ? ascii_lower(a[i]) : a[i];
        const char cb = fold ? ascii_lower(b[i]) : b[i];
        if (ca != cb) return false;
        if (ca == '\0') return true;
    }
}

}  // namespace detail

/// The table row whose formula matches exactly (formulas are case-sensitive:
/// "CO" is carbon monoxide, "Co" is not in the table), else whose English name
/// matches ignoring ASCII case ("oxygen", "Carbon Monoxide", "AIR"); nullptr
/// with status::unknown_gas when none does (also for a null pointer).
constexpr result<const gas_data*> find_gas(const char* formula_or_name) noexcept {
    for (std::size_t i = 0; i < gas_count; ++i)
        if (detail::string_equal(gas_table[i].formula, formula_or_name, false))
            return {&gas_table[i], status::ok};
    for (std::size_t i = 0; i < gas_count; ++i)
        if (detail::string_equal(gas_table[i].name, formula_or_name, true)) return {&gas_table[i], status::ok};
    return {nullptr, status::unknown_gas};
}

/// Molar mass of g in kg/mol.
template <class T>
constexpr T molar_mass_kg_mol(const gas_data& g) noexcept {
    return static_cast<T>(g.molar_mass_g_mol) * T(1.0e-3);
}

/// Kinetic diameter of g in m.
template <class T>
constexpr T kinetic_diameter_m(const gas_data& g) noexcept {
    return static_cast<T>(g.kinetic_diameter_angstrom) * T(1.0e-10);
}

}  // namespace counterflux

#endif  // COUNTERFLUX_GASES_HPP
