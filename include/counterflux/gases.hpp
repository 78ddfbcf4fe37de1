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

/// Properties of one gas, in the units of the source tables.
struct gas_data {
    const char* formula;               ///< chemical formula used for look-up ("CO", "O2", "air")
    const char* name;                  ///< English name, also accepted by find_gas
    double molar_mass_g_mol;           ///< g/mol
    double diffusion_volume;           ///< Fuller diffusion volume, dimensionless (cm3/mol scale)
    double lj_sigma_angstrom;          ///< Lennard-Jones collision diameter, angstrom
    double lj_epsilon_over_k_K;        ///< Lennard-Jones well depth over k_B, K
    double kinetic_diameter_angstrom;  ///< kinetic (sieving) diameter, angstrom
};

/// The gas table. Values from memory of the tables named at the top of the file.
inline constexpr gas_data gas_table[] = {
    // formula  name                  M [g/mol]  V (Fuller)  sigma [A]  eps/k [K]  d_k [A]
    {"O2", "oxygen", 31.998, 16.3, 3.467, 106.7, 3.46},
    {"N2", "nitrogen", 28.014, 18.5, 3.798, 71.4, 3.64},
    // air: V and LJ are table entries; kinetic diameter is an estimate, the
    // mole-fraction mean of N2 and O2 (0.79 * 3.64 + 0.21 * 3.46).
    {"air", "air", 28.9644, 19.7, 3.711, 78.6, 3.60},
    {"CO", "carbon monoxide", 28.010, 18.0, 3.690, 91.7, 3.76},
    {"CO2", "carbon dioxide", 44.009, 26.9, 3.941, 195.2, 3.30},
    {"H2", "hydrogen", 2.016, 6.12, 2.827, 59.7, 2.89},
    {"H2O", "water", 18.015, 13.1, 2.641, 809.1, 2.65},
    // CH4: V from atomic increments C + 4 H = 15.9 + 4 * 2.31.
    {"CH4", "methane", 16.043, 25.14, 3.758, 148.6, 3.80},
    // H2S: V from atomic increments S + 2 H = 22.9 + 2 * 2.31.
    {"H2S", "hydrogen sulfide", 34.076, 27.52, 3.623, 301.1, 3.60},
    // NO: no simple-molecule volume in Table 11-1 and the organic N and O
    // increments (4.54 + 6.11) are far too small for it; V = 17.4 is an
    // estimate, the mean of the N2 and O2 volumes.
    {"NO", "nitric oxide", 30.006, 17.4, 3.492, 116.7, 3.17},
    // NO2: not in Tables 11-1, B-1 or 8.14. All three are estimates: V = NO
    // estimate + O increment (17.4 + 6.11); sigma = 0.841 Vc^(1/3) and
    // eps/k = 0.77 Tc (Bird, Stewart & Lightfoot, Transport Phenomena, 2nd ed.,
    // eq. 1.4-11, 1.4-12) with Tc = 431.4 K, Vc = 82.5 cm3/mol from memory;
    // kinetic diameter taken equal to that of CO2 (triatomic, similar size).
    {"NO2", "nitrogen dioxide", 46.005, 23.5, 3.66, 332.0, 3.30},
    {"SO2", "sulfur dioxide", 64.058, 41.8, 4.112, 335.4, 3.60},
    {"NH3", "ammonia", 17.031, 20.7, 2.900, 558.3, 2.60},
    {"Cl2", "chlorine", 70.90, 38.4, 4.217, 316.0, 3.20},
    {"He", "helium", 4.0026, 2.67, 2.551, 10.22, 2.60},
    {"Ar", "argon", 39.948, 16.2, 3.542, 93.3, 3.40},
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

/// The table row whose formula matches exactly, else whose formula or name
/// matches ignoring ASCII case; nullptr with status::unknown_gas when none
/// does (also for a null pointer).
constexpr result<const gas_data*> find_gas(const char* formula_or_name) noexcept {
    for (std::size_t i = 0; i < gas_count; ++i)
        if (detail::string_equal(gas_table[i].formula, formula_or_name, false))
            return {&gas_table[i], status::ok};
    for (std::size_t i = 0; i < gas_count; ++i)
        if (detail::string_equal(gas_table[i].formula, formula_or_name, true) ||
            detail::string_equal(gas_table[i].name, formula_or_name, true))
            return {&gas_table[i], status::ok};
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
