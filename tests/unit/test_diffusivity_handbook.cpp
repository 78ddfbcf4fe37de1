// Binary gas diffusivities against experimental handbook values at 1 atm.
//
// The handbook rows with their source (CRC Handbook of Chemistry and Physics,
// section 6, table 'Diffusion in Gases', after Marrero & Mason 1972) and the
// tolerances (Poling et al. 5th ed., quoted from memory) are in
// handbook_diffusivities.hpp, shared with the command's test of
// `counterflux diffusivity` on the same pairs: each pair within twice the
// average error of its correlation, the mean within the average, H2O (polar)
// checked against Fuller only.
#include <doctest/doctest.h>

#include <cmath>
#include <cstddef>

#include <counterflux/diffusivity.hpp>
#include <counterflux/gases.hpp>

#include "handbook_diffusivities.hpp"
#include "support.hpp"

namespace cf = counterflux;
using namespace counterflux_test;

namespace {

template <class T>
void check_method(bool fuller, double average_error) {
    double sum = 0.0;
    int n = 0;
    for (const handbook_row& row : handbook_rows) {
        if (!fuller && row.polar) continue;
        const T t = static_cast<T>(row.temperature_K);
        const T p = static_cast<T>(handbook_pressure_Pa);
        const cf::result<T> d = fuller ? cf::fuller_diffusivity(gas(row.a), gas(row.b), t, p)
                                       : cf::chapman_enskog_diffusivity(gas(row.a), gas(row.b), t, p);
        REQUIRE(d.ok());
        const double model_cm2_s = static_cast<double>(d.value) * 1.0e4;
        const double rel = model_cm2_s / row.d_cm2_s - 1.0;
        INFO(row.a << "-" << row.b << " at " << row.temperature_K << " K: model " << model_cm2_s
                   << " cm2/s, handbook " << row.d_cm2_s);
        CHECK(std::fabs(rel) < handbook_pair_tolerance_factor * average_error);
        sum += std::fabs(rel);
        ++n;
    }
    REQUIRE(n >= handbook_minimum_rows);
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
    for (const handbook_row& row : handbook_rows) {
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

TEST_CASE("Chapman-Enskog: the worked example of Poling et al.") {
    // Poling, Prausnitz & O'Connell, 5th ed., Example 11-1 (from memory): N2-CO2
    // at 590 K and 1 bar, with sigma and eps/k of Table B-1 (CO2 3.941 A,
    // 195.2 K; N2 3.798 A, 71.4 K): sigma_AB = 3.8695 A, eps_AB/k = 118.1 K,
    // T* = 4.998, Omega_D = 0.842, M_AB = 34.23 g/mol, D = 0.52 cm2/s (the
    // measured value, 0.583 cm2/s, is 11 % higher).
    const cf::gas_data& n2 = gas("N2");
    const cf::gas_data& co2 = gas("CO2");
    const auto d = cf::chapman_enskog_diffusivity(n2, co2, 590.0, 1.0e5);
    REQUIRE(d.ok());
    CHECK(d.value * 1.0e4 == doctest::Approx(0.52).epsilon(0.01));
    const auto omega = cf::neufeld_collision_integral(590.0 / std::sqrt(195.2 * 71.4));
    REQUIRE(omega.ok());
    CHECK(omega.value == doctest::Approx(0.842).epsilon(1.0e-3));
}
