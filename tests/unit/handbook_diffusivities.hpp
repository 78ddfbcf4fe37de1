// Binary gas diffusivities from a handbook at 1 atm, and the tolerances the
// library's correlations are held to. Shared by the library's unit test
// (tests/unit/test_diffusivity_handbook.cpp) and the command's test
// (tests/command/test_command_handbook.cpp), so both check the same pairs.
// Header only, no test framework: the tests/unit/*.cpp glob does not compile it.
//
// Reference values: CRC Handbook of Chemistry and Physics, section 6, table
// 'Diffusion in Gases' (edition not recorded here; values as transcribed):
// D12 at p = 101.325 kPa, the "large excess of air" rows for a trace gas in
// air and the equimolar-mixture rows. The table cites Marrero & Mason,
// J. Phys. Chem. Ref. Data 1, 3 (1972). Values in cm2/s; the column of each
// value is named beside it.
//
// Tolerances: Poling, Prausnitz & O'Connell, The Properties of Gases and
// Liquids, 5th ed. (2001), sec. 11-3 and 11-4 with Table 11-2, give the
// average absolute error of the Fuller correlation as about 5 % and of
// Chapman-Enskog with Lennard-Jones parameters as about 7 % for nonpolar
// gases (both percentages quoted from memory). Each pair must lie within twice
// that average (a single pair may be off by more than the average), and the
// mean absolute error over the set within the average itself.
// Water is polar: Poling et al. recommend Brokaw's extension instead of the
// Lennard-Jones Chapman-Enskog form, so H2O is only checked against Fuller.
#ifndef COUNTERFLUX_TESTS_UNIT_HANDBOOK_DIFFUSIVITIES_HPP
#define COUNTERFLUX_TESTS_UNIT_HANDBOOK_DIFFUSIVITIES_HPP

namespace counterflux_test {

/// One handbook value: gases a and b, temperature, D12 in cm2/s, and whether
/// the pair involves a polar gas (checked against Fuller only).
struct handbook_row {
    const char* a;
    const char* b;
    double temperature_K;
    double d_cm2_s;
    bool polar;
};

/// Pressure of every row, Pa (1 atm).
inline constexpr double handbook_pressure_Pa = 101325.0;

// CRC Handbook of Chemistry and Physics, section 6, table 'Diffusion in Gases'
// (edition not recorded here; values as transcribed; after Marrero & Mason 1972),
// 101.325 kPa.
inline constexpr handbook_row handbook_rows[] = {
    // large excess of air, 293.15 K column
    {"Ar", "air", 293.15, 0.189, false},
    {"CH4", "air", 293.15, 0.210, false},
    {"CO", "air", 293.15, 0.208, false},
    {"CO2", "air", 293.15, 0.160, false},
    {"H2", "air", 293.15, 0.756, false},
    {"H2O", "air", 293.15, 0.242, true},
    {"He", "air", 293.15, 0.697, false},
    // large excess of air, other columns
    {"He", "air", 273.15, 0.617, false},
    {"CO", "air", 373.15, 0.315, false},
    {"CO", "air", 473.15, 0.475, false},
    {"CO2", "air", 373.15, 0.252, false},
    {"H2", "air", 373.15, 1.153, false},
    // equimolar mixtures, 293.15 K column
    {"Ar", "N2", 293.15, 0.190, false},
    {"Ar", "O2", 293.15, 0.187, false},
    {"Ar", "CO", 293.15, 0.190, false},
    {"Ar", "CO2", 293.15, 0.148, false},
    {"Ar", "H2", 293.15, 0.794, false},
    {"Ar", "He", 293.15, 0.726, false},
    {"CH4", "N2", 293.15, 0.208, false},
    {"CH4", "O2", 293.15, 0.220, false},
    {"CH4", "He", 293.15, 0.650, false},
    {"CH4", "H2", 293.15, 0.708, false},
};

/// Average absolute errors of the two correlations.
inline constexpr double fuller_average_error = 0.05;          // Poling et al. 5th ed., from memory
inline constexpr double chapman_enskog_average_error = 0.07;  // Poling et al. 5th ed., from memory

/// Each pair must lie within this multiple of the average error.
inline constexpr double handbook_pair_tolerance_factor = 2.0;

/// Fewest rows a method must be checked on.
inline constexpr int handbook_minimum_rows = 8;

}  // namespace counterflux_test

#endif  // COUNTERFLUX_TESTS_UNIT_HANDBOOK_DIFFUSIVITIES_HPP
