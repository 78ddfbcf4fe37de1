// Binary gas diffusivities against experimental handbook values at 1 atm.
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
#include <doctest/doctest.h>

#include <cmath>
#include <cstddef>

#include <counterflux/diffusivity.hpp>
#include <counterflux/gases.hpp>

#include "support.hpp"

namespace cf = counterflux;
using namespace counterflux_test;

namespace {

struct handbook_row {
    const char* a;
    const char* b;
    double temperature_K;
    double d_cm2_s;
    bool polar;
};

// CRC Handbook of Chemistry and Physics, section 6, table 'Diffusion in Gases'
// (edition not recorded here; values as transcribed; after Marrero & Mason 1972),
// 101.325 kPa.
constexpr handbook_row rows[] = {
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

constexpr double fuller_average_error = 0.05;          // Poling et al. 5th ed., from memory
constexpr double chapman_enskog_average_error = 0.07;  // Poling et al. 5th ed., from memory

template <class T>
void check_method(bool fuller, double average_error) {
    double sum = 0.0;
    int n = 0;
    for (const handbook_row& row : rows) {
        if (!fuller && row.polar) continue;
        const T t = static_cast<T>(row.temperature_K);
        const T p = T(101325);
        const cf::result<T> d = fuller ? cf::fuller_diffusivity(gas(row.a), gas(row.b), t, p)
                                       : cf::chapman_enskog_diffusivity(gas(row.a), gas(row.b), t, p);
        REQUIRE(d.ok());
        const double model_cm2_s = static_cast<double>(d.value) * 1.0e4;
        const double rel = model_cm2_s / row.d_cm2_s - 1.0;
        INFO(row.a << "-" << row.b << " at " << row.temperature_K << " K: model " << model_cm2_s
                   << " cm2/s, handbook " << row.d_cm2_s);
        CHECK(std::fabs(rel) < 2.0 * average_error);
        sum += std::fabs(rel);
        ++n;
    }
    REQUIRE(n >= 8);
    CHECK(sum / n < average_error);
}

}  // namespace

TEST_CASE_TEMPLATE("Fuller diffusivities agree with handbook values at 1 atm", T, float, double) {
    check_method<T>(true, fuller_average_error);
}

TEST_CASE_TEMPLATE("Chapman-Enskog diffusivities agree with handbook values at 1 atm", T, float, double) {
    check_method<T>(false, chapman_enskog_average_error);
}

TEST_CASE("float and double paths agree to float precision") {
    for (const handbook_row& row : rows) {
        const auto df = cf::fuller_diffusivity(gas(row.a), gas(row.b), static_cast<float>(row.temperature_K), 101325.0f);
        const auto dd = cf::fuller_diffusivity(gas(row.a), gas(row.b), row.temperature_K, 101325.0);
        CHECK(static_cast<double>(df.value) == doctest::Approx(dd.value).epsilon(1e-5));
        const auto cf_ = cf::chapman_enskog_diffusivity(gas(row.a), gas(row.b), static_cast<float>(row.temperature_K),
                                                        101325.0f);
        const auto cd = cf::chapman_enskog_diffusivity(gas(row.a), gas(row.b), row.temperature_K, 101325.0);
        CHECK(static_cast<double>(cf_.value) == doctest::Approx(cd.value).epsilon(1e-5));
    }
}

TEST_CASE("low-density scaling: D ~ 1/P, Fuller D ~ T^1.75") {
    // Both are properties of the published forms (Poling et al. eq. 11-4.4 and 11-3.2).
    const cf::gas_data& co = gas("CO");
    const cf::gas_data& air = gas("air");
    const double d1 = cf::fuller_diffusivity(co, air, 300.0, 101325.0).value;
    const double d2 = cf::fuller_diffusivity(co, air, 300.0, 2.0 * 101325.0).value;
    CHECK(d1 / d2 == doctest::Approx(2.0).epsilon(1e-14));
    const double d3 = cf::fuller_diffusivity(co, air, 400.0, 101325.0).value;
    CHECK(d3 / d1 == doctest::Approx(std::pow(400.0 / 300.0, 1.75)).epsilon(1e-13));
    const double c1 = cf::chapman_enskog_diffusivity(co, air, 300.0, 101325.0).value;
    const double c2 = cf::chapman_enskog_diffusivity(co, air, 300.0, 0.5 * 101325.0).value;
    CHECK(c2 / c1 == doctest::Approx(2.0).epsilon(1e-14));
}

TEST_CASE("Fuller at 1 atm by hand for CO in air") {
    // Poling et al. 5th ed. eq. 11-4.4 written per atm, evaluated here step by
    // step from the Table 11-1 volumes (CO 18.0, air 19.7) and molar masses.
    // Inputs: the table's values (CO 28.010 g/mol, V 18.0; air 28.9644 g/mol, V 19.7).
    const cf::gas_data& co = gas("CO");
    const cf::gas_data& air = gas("air");
    CHECK(co.diffusion_volume == 18.0f);
    CHECK(air.diffusion_volume == 19.7f);
    const double t = 298.15;
    const double inv_m = 1.0 / static_cast<double>(co.molar_mass_g_mol) + 1.0 / static_cast<double>(air.molar_mass_g_mol);
    const double v = std::cbrt(static_cast<double>(co.diffusion_volume)) + std::cbrt(static_cast<double>(air.diffusion_volume));
    const double expected_cm2_s = 1.0e-3 * std::pow(t, 1.75) * std::sqrt(inv_m) / (v * v);
    const auto d = cf::fuller_diffusivity(co, air, t, 101325.0);
    REQUIRE(d.ok());
    CHECK(d.value * 1.0e4 == doctest::Approx(expected_cm2_s).epsilon(1e-13));
}

TEST_CASE("measured diffusivity carried to another condition") {
    // D = D_ref (T/T_ref)^m (P_ref/P), docs/models.md sec. 3.
    const auto d = cf::measured_diffusivity(2.08e-5, 293.15, 101325.0, 1.75, 350.0, 80000.0);
    REQUIRE(d.ok());
    CHECK(d.value == doctest::Approx(2.08e-5 * std::pow(350.0 / 293.15, 1.75) * (101325.0 / 80000.0)).epsilon(1e-14));
    const auto at_ref = cf::measured_diffusivity(2.08e-5, 293.15, 101325.0, 1.75, 293.15, 101325.0);
    CHECK(at_ref.value == doctest::Approx(2.08e-5).epsilon(1e-15));
}

TEST_CASE("diffusivity_model dispatches to the named method") {
    const cf::gas_data* co = &gas("CO");
    const cf::gas_data* air = &gas("air");
    const cf::diffusivity_model<double> f{cf::diffusivity_method::fuller, co, air, 0, 0, 0, 0};
    const cf::diffusivity_model<double> c{cf::diffusivity_method::chapman_enskog, co, air, 0, 0, 0, 0};
    const cf::diffusivity_model<double> m{cf::diffusivity_method::measured, nullptr, nullptr, 2.0e-5, 300.0, 1e5, 1.7};
    CHECK(cf::evaluate(f, 310.0, 9.0e4).value == cf::fuller_diffusivity(*co, *air, 310.0, 9.0e4).value);
    CHECK(cf::evaluate(c, 310.0, 9.0e4).value == cf::chapman_enskog_diffusivity(*co, *air, 310.0, 9.0e4).value);
    CHECK(cf::evaluate(m, 300.0, 1e5).value == doctest::Approx(2.0e-5).epsilon(1e-15));
    const cf::diffusivity_model<double> missing{cf::diffusivity_method::fuller, nullptr, air, 0, 0, 0, 0};
    const auto r = cf::evaluate(missing, 300.0, 1e5);
    CHECK(cf::has(r.code, cf::status::unknown_gas));
    CHECK(std::isfinite(r.value));
}
