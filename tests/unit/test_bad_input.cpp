// Bad input: every rejection is a status flag next to a finite value
// (status.hpp: errors are values; never an exception, never NaN). Each check
// names the specific flag the function documents.
#include <doctest/doctest.h>

#include <cmath>
#include <cstddef>
#include <limits>
#include <string>

#include <counterflux/counterflux.hpp>

#include "support.hpp"

namespace cf = counterflux;
using namespace counterflux_test;

namespace {

constexpr double nan_v = std::numeric_limits<double>::quiet_NaN();
constexpr double inf_v = std::numeric_limits<double>::infinity();

// The value is finite and the flag is set.
template <class T>
void expect(const cf::result<T>& r, cf::status flag) {
    INFO("status " << static_cast<unsigned>(r.code) << " (" << std::string(cf::describe(r.code))
                   << "), value " << r.value);
    CHECK(cf::has(r.code, flag));
    CHECK(std::isfinite(r.value));
}

const cf::barrier<double> good_capillary = cf::make_capillary(0.1e-3, 1.0e-3);

cf::sensor_model<double, 4> co_sensor(const cf::barrier<double>& b) {
    return add(sensor("CO", "air", 2u, -1.0), b);
}

// A sensor must refuse to work with model m: validate flags it, and every
// signal function returns a finite value with the same flag.
void expect_sensor_rejected(const cf::sensor_model<double, 4>& m, cf::status flag) {
    CHECK(cf::has(cf::validate(m), flag));
    expect(cf::sensitivity_A_per_mol_per_mol(m, 300.0, 1.0e5), flag);
    expect(cf::limiting_current_A(m, 300.0, 1.0e5, 1.0e-3), flag);
    expect(cf::mole_fraction_from_current(m, 300.0, 1.0e5, 1.0e-6), flag);
    expect(cf::span_factor(m, 300.0, 1.0e5), flag);
    expect(cf::linearity_ratio(m, 300.0, 1.0e5, 0.1), flag);
    expect(cf::temperature_coefficient_per_K(m, 300.0, 1.0e5), flag);
    expect(cf::pressure_coefficient_per_Pa(m, 300.0, 1.0e5), flag);
    const auto st = cf::transport_at(m, 300.0, 1.0e5);
    CHECK(cf::has(st.code, flag));
    const auto rep = cf::element_reports(m, 300.0, 1.0e5);
    CHECK(cf::has(rep.code, flag));
}

}  // namespace

// ---------------------------------------------------------------------------
TEST_CASE("bad input: unknown gases") {
    const char* names[] = {"Xx", "", "O3x", "oxygen2", "C O"};
    for (const char* name : names) {
        INFO("name '" << name << "'");
        const auto r = cf::find_gas(name);
        CHECK(r.code == cf::status::unknown_gas);
        CHECK(r.value == nullptr);
    }
    const auto null_name = cf::find_gas(nullptr);
    CHECK(null_name.code == cf::status::unknown_gas);
    CHECK(null_name.value == nullptr);

    // Formulas are case-sensitive ("Co" is cobalt); English names fold case.
    CHECK(cf::find_gas("co").code == cf::status::unknown_gas);
    CHECK(cf::find_gas("Co").value == nullptr);
    const auto co = cf::find_gas("carbon monoxide");
    REQUIRE(co.ok());
    CHECK(std::string(co.value->formula) == "CO");
    const auto o2 = cf::find_gas("oxygen");
    REQUIRE(o2.ok());
    CHECK(std::string(o2.value->formula) == "O2");
    CHECK(cf::find_gas("OXYGEN").value == o2.value);
    CHECK(cf::find_gas("Nitrogen").value == cf::find_gas("N2").value);

    // A diffusivity model or a sensor with a missing gas.
    const cf::diffusivity_model<double> no_b{
        cf::diffusivity_method::chapman_enskog, &gas("CO"), nullptr, 0.0, 0.0, 0.0, 0.0};
    expect(cf::evaluate(no_b, 300.0, 1.0e5), cf::status::unknown_gas);
    const cf::diffusivity_model<double> no_a{
        cf::diffusivity_method::fuller, nullptr, &gas("air"), 0.0, 0.0, 0.0, 0.0};
    expect(cf::evaluate(no_a, 300.0, 1.0e5), cf::status::unknown_gas);

    cf::sensor_model<double, 4> m = co_sensor(good_capillary);
    m.target = cf::find_gas("Xx").value;
    expect_sensor_rejected(m, cf::status::unknown_gas);
    cf::sensor_model<double, 4> m2 = co_sensor(good_capillary);
    m2.background = nullptr;
    expect_sensor_rejected(m2, cf::status::unknown_gas);
}

TEST_CASE("bad input: a sensor whose target is its background, or with no electrons or barriers") {
    cf::sensor_model<double, 4> same = co_sensor(good_capillary);
    same.background = same.target;
    CHECK(cf::validate(same) == cf::status::out_of_domain);
    expect_sensor_rejected(same, cf::status::out_of_domain);

    cf::sensor_model<double, 4> no_electrons = co_sensor(good_capillary);
    no_electrons.electrons = 0;
    expect_sensor_rejected(no_electrons, cf::status::out_of_domain);

    cf::sensor_model<double, 4> no_barrier = sensor("CO", "air", 2u, -1.0);
    expect_sensor_rejected(no_barrier, cf::status::out_of_domain);

    cf::sensor_model<double, 4> nan_ratio = co_sensor(good_capillary);
    nan_ratio.flux_ratio = nan_v;
    expect_sensor_rejected(nan_ratio, cf::status::not_finite);

    cf::sensor_model<double, 4> bad_ref = co_sensor(good_capillary);
    bad_ref.reference_temperature_K = -10.0;
    CHECK(cf::validate(bad_ref) == cf::status::out_of_domain);
    expect(cf::span_factor(bad_ref, 300.0, 1.0e5), cf::status::out_of_domain);
}

TEST_CASE("bad input: push onto a full series") {
    cf::series<double, 2> s{};
    s.count = 0;
    CHECK(cf::push(s, good_capillary) == cf::status::ok);
    CHECK(cf::push(s, good_capillary) == cf::status::ok);
    const cf::barrier<double> third = cf::make_porous(1.0e-3, 1.0e-5, 0.4, 2.0, 1.0e-6);
    CHECK(cf::push(s, third) == cf::status::out_of_domain);
    CHECK(s.count == 2);
    CHECK(s.elements[1].kind == cf::barrier_kind::capillary);

    cf::sensor_model<double, 4> m = sensor("CO", "air", 2u, -1.0);
    for (int i = 0; i < 4; ++i)
        CHECK(cf::push(m.barriers, good_capillary) == cf::status::ok);
    CHECK(cf::push(m.barriers, third) == cf::status::out_of_domain);
    CHECK(m.barriers.count == 4);
    CHECK(cf::validate(m) == cf::status::ok);
}

// ---------------------------------------------------------------------------
TEST_CASE("bad input: barrier geometry") {
    struct bad_case {
        const char* what;
        cf::barrier<double> b;
        cf::status flag;
    };
    const bad_case cases[] = {
        {"capillary, negative length", cf::make_capillary(0.1e-3, -1.0e-3),
         cf::status::out_of_domain},
        {"capillary, zero diameter", cf::make_capillary(0.0, 1.0e-3), cf::status::out_of_domain},
        {"capillary, negative diameter", cf::make_capillary(-0.1e-3, 1.0e-3),
         cf::status::out_of_domain},
        {"capillary, no bores", cf::make_capillary(0.1e-3, 1.0e-3, 0u), cf::status::out_of_domain},
        {"capillary, NaN diameter", cf::make_capillary(nan_v, 1.0e-3), cf::status::not_finite},
        {"capillary, infinite length", cf::make_capillary(0.1e-3, inf_v), cf::status::not_finite},
        {"porous, negative thickness", cf::make_porous(-1.0e-3, 1.0e-5, 0.4, 2.0, 1.0e-6),
         cf::status::out_of_domain},
        {"porous, zero area", cf::make_porous(1.0e-3, 0.0, 0.4, 2.0, 1.0e-6),
         cf::status::out_of_domain},
        {"porous, porosity 0", cf::make_porous(1.0e-3, 1.0e-5, 0.0, 2.0, 1.0e-6),
         cf::status::out_of_domain},
        {"porous, porosity 1.5", cf::make_porous(1.0e-3, 1.0e-5, 1.5, 2.0, 1.0e-6),
         cf::status::out_of_domain},
        {"porous, tortuosity 0.5", cf::make_porous(1.0e-3, 1.0e-5, 0.4, 0.5, 1.0e-6),
         cf::status::out_of_domain},
        {"porous, zero pore with Knudsen", cf::make_porous(1.0e-3, 1.0e-5, 0.4, 2.0, 0.0),
         cf::status::out_of_domain},
        {"porous, NaN porosity", cf::make_porous(1.0e-3, 1.0e-5, nan_v, 2.0, 1.0e-6),
         cf::status::not_finite},
        {"porous, infinite area", cf::make_porous(1.0e-3, inf_v, 0.4, 2.0, 1.0e-6),
         cf::status::not_finite},
        {"membrane, negative thickness",
         cf::make_membrane(-25.0e-6, 1.0e-5, 1.0e-15, 2.0e4, 298.15), cf::status::out_of_domain},
        {"membrane, zero area", cf::make_membrane(25.0e-6, 0.0, 1.0e-15, 2.0e4, 298.15),
         cf::status::out_of_domain},
        {"membrane, zero permeability", cf::make_membrane(25.0e-6, 1.0e-5, 0.0, 2.0e4, 298.15),
         cf::status::out_of_domain},
        {"membrane, reference temperature 0",
         cf::make_membrane(25.0e-6, 1.0e-5, 1.0e-15, 2.0e4, 0.0), cf::status::out_of_domain},
        {"membrane, negative film diffusivity",
         cf::make_membrane(25.0e-6, 1.0e-5, 1.0e-15, 2.0e4, 298.15, -1.0e-10),
         cf::status::out_of_domain},
        {"membrane, NaN activation energy",
         cf::make_membrane(25.0e-6, 1.0e-5, 1.0e-15, nan_v, 298.15), cf::status::not_finite},
    };
    const cf::gas_environment<double> env{300.0, 1.0e5, 2.0e-5, 28.010e-3, 6.7e-8};
    for (const bad_case& c : cases) {
        INFO(c.what);
        CHECK(cf::validate(c.b) == c.flag);
        const auto r = cf::resolve(c.b, env);
        CHECK(cf::has(r.code, c.flag));
        CHECK(std::isfinite(r.value.area_m2));
        CHECK(std::isfinite(r.value.length_m));
        CHECK(std::isfinite(r.value.inv_molecular_s_m2));
        CHECK(std::isfinite(r.value.inv_linear_s_m2));
        CHECK(std::isfinite(r.value.knudsen_number));
        expect_sensor_rejected(co_sensor(c.b), c.flag);
        // A bad element anywhere in a series spoils it.
        expect_sensor_rejected(add(co_sensor(good_capillary), c.b), c.flag);
    }
}

// ---------------------------------------------------------------------------
TEST_CASE("bad input: temperature and pressure <= 0, NaN and infinite") {
    const cf::gas_data& co = gas("CO");
    const cf::gas_data& air = gas("air");
    struct condition {
        double t, p;
        cf::status flag;
    };
    const condition conditions[] = {
        {0.0, 1.0e5, cf::status::out_of_domain}, {-10.0, 1.0e5, cf::status::out_of_domain},
        {300.0, 0.0, cf::status::out_of_domain}, {300.0, -5.0, cf::status::out_of_domain},
        {nan_v, 1.0e5, cf::status::not_finite},  {300.0, nan_v, cf::status::not_finite},
        {inf_v, 1.0e5, cf::status::not_finite},  {300.0, inf_v, cf::status::not_finite},
        {-inf_v, 1.0e5, cf::status::not_finite}, {300.0, -inf_v, cf::status::not_finite},
    };
    const cf::sensor_model<double, 4> m = co_sensor(good_capillary);
    for (const condition& c : conditions) {
        INFO("T = " << c.t << " K, P = " << c.p << " Pa");
        expect(cf::fuller_diffusivity(co, air, c.t, c.p), c.flag);
        expect(cf::chapman_enskog_diffusivity(co, air, c.t, c.p), c.flag);
        expect(cf::mean_free_path(3.6e-10, c.t, c.p), c.flag);
        expect(cf::measured_diffusivity(2.0e-5, 298.15, 101325.0, 1.75, c.t, c.p), c.flag);
        expect(cf::measured_diffusivity(2.0e-5, c.t, c.p, 1.75, 300.0, 1.0e5), c.flag);
        expect(cf::sensitivity_A_per_mol_per_mol(m, c.t, c.p), c.flag);
        expect(cf::limiting_current_A(m, c.t, c.p, 1.0e-3), c.flag);
        expect(cf::mole_fraction_from_current(m, c.t, c.p, 1.0e-7), c.flag);
        expect(cf::span_factor(m, c.t, c.p), c.flag);
        expect(cf::linearity_ratio(m, c.t, c.p, 0.1), c.flag);
        expect(cf::temperature_coefficient_per_K(m, c.t, c.p), c.flag);
        expect(cf::pressure_coefficient_per_Pa(m, c.t, c.p), c.flag);
        CHECK(cf::has(cf::transport_at(m, c.t, c.p).code, c.flag));
        if (c.p == 1.0e5) {  // the temperature is the bad one
            expect(cf::knudsen_diffusivity(1.0e-6, 28.010e-3, c.t), c.flag);
            expect(cf::arrhenius_permeability(1.0e-15, 2.0e4, 298.15, c.t), c.flag);
            expect(cf::arrhenius_permeability(1.0e-15, 2.0e4, c.t, 300.0), c.flag);
            expect(cf::membrane_flux(1.0e-15, 25.0e-6, c.t, 1000.0, 0.0), c.flag);
            expect(cf::saturation_pressure_Pa(c.t), c.flag);
            expect(cf::dry_mole_fraction(0.2, 0.5, c.t, 1.0e5), c.flag);
        } else {
            expect(cf::dry_mole_fraction(0.2, 0.5, 300.0, c.p), c.flag);
        }
    }
    // A reference condition that is bad spoils the span but not the sensitivity.
    cf::sensor_model<double, 4> bad_ref = m;
    bad_ref.reference_pressure_Pa = nan_v;
    expect(cf::span_factor(bad_ref, 300.0, 1.0e5), cf::status::not_finite);
}

TEST_CASE("bad input: NaN and infinite values into the flux laws and transport helpers") {
    const double c = 40.0, d = 2.0e-5, len = 1.0e-3;
    const double bad[] = {nan_v, inf_v, -inf_v};
    for (const double x : bad) {
        INFO("bad value " << x);
        expect(cf::equimolar_flux(x, d, len, 0.2, 0.0), cf::status::not_finite);
        expect(cf::equimolar_flux(c, d, len, x, 0.0), cf::status::not_finite);
        expect(cf::log_law_flux(c, d, len, x, 0.2, 0.0), cf::status::not_finite);
        expect(cf::log_law_flux(c, d, len, 1.0, 0.2, x), cf::status::not_finite);
        expect(cf::dusty_gas_flux(c, d, 1.0e-4, x, 1.0, 0.2, 0.0), cf::status::not_finite);
        expect(cf::membrane_flux(1.0e-15, 25.0e-6, 300.0, x, 0.0), cf::status::not_finite);
        expect(cf::knudsen_diffusivity(x, 28.010e-3, 300.0), cf::status::not_finite);
        expect(cf::knudsen_diffusivity(1.0e-6, x, 300.0), cf::status::not_finite);
        expect(cf::mean_free_path(x, 300.0, 1.0e5), cf::status::not_finite);
        expect(cf::knudsen_number(x, 1.0e-6), cf::status::not_finite);
        expect(cf::knudsen_number(6.7e-8, x), cf::status::not_finite);
        expect(cf::measured_diffusivity(x, 298.15, 101325.0, 1.75, 300.0, 1.0e5),
               cf::status::not_finite);
        expect(cf::measured_diffusivity(2.0e-5, 298.15, 101325.0, x, 300.0, 1.0e5),
               cf::status::not_finite);
        expect(cf::arrhenius_permeability(1.0e-15, x, 298.15, 300.0), cf::status::not_finite);
        expect(cf::zero_current_A(1.0e-9, x, 293.15, 300.0), cf::status::not_finite);
        expect(cf::zero_current_A(1.0e-9, 0.05, 293.15, x), cf::status::not_finite);
        expect(cf::standard_pressure_at_altitude_Pa(x), cf::status::not_finite);
        expect(cf::dry_mole_fraction(x, 0.5, 300.0, 1.0e5), cf::status::not_finite);
        expect(cf::dry_mole_fraction(0.2, x, 300.0, 1.0e5), cf::status::not_finite);

        const cf::element_transport<double> e{1.0e-8, 1.0e-3, 5.0e4, 1.0e3, 0.0};
        expect(cf::element_flux(e, c, 1.0, x, 0.0), cf::status::not_finite);
        expect(cf::element_outlet(e, c, 1.0, 0.2, x), cf::status::not_finite);
        expect(cf::element_inlet(e, c, x, 0.0, 1.0e-3), cf::status::not_finite);
        const cf::element_transport<double> e_bad{1.0e-8, x, 5.0e4, 1.0e3, 0.0};
        expect(cf::element_flux(e_bad, c, 1.0, 0.2, 0.0), cf::status::not_finite);

        const cf::gas_environment<double> env{300.0, 1.0e5, x, 28.010e-3, 6.7e-8};
        const auto r = cf::resolve(good_capillary, env);
        CHECK(cf::has(r.code, cf::status::not_finite));
        CHECK(std::isfinite(r.value.inv_molecular_s_m2));

        const cf::sensor_model<double, 4> m = co_sensor(good_capillary);
        expect(cf::limiting_current_A(m, 300.0, 1.0e5, x), cf::status::not_finite);
        expect(cf::mole_fraction_from_current(m, 300.0, 1.0e5, x), cf::status::not_finite);
        expect(cf::linearity_ratio(m, 300.0, 1.0e5, x), cf::status::not_finite);

        const auto st = cf::transport_at(m, 300.0, 1.0e5);
        REQUIRE(st.ok());
        expect(cf::molar_flow(st.value, x), cf::status::not_finite);
        expect(cf::outer_fraction_for_flow(st.value, x), cf::status::not_finite);
    }
}

TEST_CASE("bad input: out-of-domain values into the flux laws") {
    const double c = 40.0, d = 2.0e-5, len = 1.0e-3;
    expect(cf::equimolar_flux(c, d, -len, 0.2, 0.0), cf::status::out_of_domain);  // negative length
    expect(cf::equimolar_flux(c, d, 0.0, 0.2, 0.0), cf::status::out_of_domain);   // zero length
    expect(cf::equimolar_flux(-c, d, len, 0.2, 0.0),
           cf::status::out_of_domain);  // negative concentration
    expect(cf::equimolar_flux(c, -d, len, 0.2, 0.0),
           cf::status::out_of_domain);  // negative diffusivity
    expect(cf::dusty_gas_flux(c, d, -1.0e-4, len, 0.0, 0.2, 0.0), cf::status::out_of_domain);
    expect(cf::membrane_flux(0.0, 25.0e-6, 300.0, 1000.0, 0.0), cf::status::out_of_domain);
    expect(cf::membrane_flux(1.0e-15, -25.0e-6, 300.0, 1000.0, 0.0), cf::status::out_of_domain);
    expect(cf::knudsen_diffusivity(0.0, 28.010e-3, 300.0), cf::status::out_of_domain);
    expect(cf::knudsen_diffusivity(-1.0e-6, 28.010e-3, 300.0), cf::status::out_of_domain);
    expect(cf::knudsen_diffusivity(1.0e-6, 0.0, 300.0), cf::status::out_of_domain);
    expect(cf::mean_free_path(0.0, 300.0, 1.0e5), cf::status::out_of_domain);
    expect(cf::knudsen_number(6.7e-8, 0.0), cf::status::out_of_domain);
    expect(cf::knudsen_number(-6.7e-8, 1.0e-6), cf::status::out_of_domain);
    expect(cf::measured_diffusivity(-2.0e-5, 298.15, 101325.0, 1.75, 300.0, 1.0e5),
           cf::status::out_of_domain);
    expect(cf::arrhenius_permeability(-1.0e-15, 2.0e4, 298.15, 300.0), cf::status::out_of_domain);
    // An element with no resistance at all.
    const cf::element_transport<double> none{1.0e-8, 1.0e-3, 0.0, 0.0, 0.0};
    expect(cf::element_flux(none, c, 0.0, 0.2, 0.0), cf::status::out_of_domain);
    const cf::element_transport<double> negative_area{-1.0e-8, 1.0e-3, 5.0e4, 0.0, 0.0};
    expect(cf::element_outlet(negative_area, c, 0.0, 0.2, 1.0e-3), cf::status::out_of_domain);
    expect(cf::element_inlet(negative_area, c, 0.0, 0.0, 1.0e-3), cf::status::out_of_domain);

    // A series with no element in use.
    cf::series_transport<double, 2> empty{};
    empty.count = 0;
    empty.total_concentration_mol_m3 = c;
    empty.alpha = 0.0;
    expect(cf::molar_flow(empty, 0.2), cf::status::out_of_domain);
    CHECK(cf::has(cf::profile_for_flow(empty, 1.0e-9).code, cf::status::out_of_domain));

    // Chapman-Enskog outside the Neufeld fit range 0.3 <= T* <= 100: the
    // value is still computed, finite and positive, and flagged.
    // He-H2: eps_AB = sqrt(10.22 x 59.7) = 24.7 K, so T* > 100 above ~2470 K.
    const auto hot = cf::chapman_enskog_diffusivity(gas("He"), gas("H2"), 3000.0, 1.0e5);
    expect(hot, cf::status::out_of_domain);
    CHECK(hot.value > 0.0);
}

// ---------------------------------------------------------------------------
TEST_CASE("bad input: fractions and currents outside the range") {
    const cf::sensor_model<double, 4> co = co_sensor(good_capillary);
    const auto over = cf::limiting_current_A(co, 300.0, 1.0e5, 1.5);
    expect(over, cf::status::above_range);
    CHECK(over.value == cf::limiting_current_A(co, 300.0, 1.0e5, 1.0).value);
    const auto under = cf::limiting_current_A(co, 300.0, 1.0e5, -0.1);
    expect(under, cf::status::below_range);
    CHECK(under.value == 0.0);
    const auto lin = cf::linearity_ratio(co, 300.0, 1.0e5, 2.0);
    expect(lin, cf::status::above_range);

    // A stagnant-film cell (O2 into stagnant N2) with Knudsen resistance on:
    // q(y) = r_m (1 - y) + r_l stays > 0 at y = 1, so pure O2 drives a finite
    // current I(1). A larger current is out of reach of any fraction: the
    // reading is the edge, 1, with above_range.
    const cf::sensor_model<double, 4> o2 = add(sensor("O2", "N2", 4u, 0.0), good_capillary);
    const auto i_full = cf::limiting_current_A(o2, 300.0, 1.0e5, 1.0);
    REQUIRE(i_full.ok());
    const double too_much[] = {1.0001 * i_full.value, 2.0 * i_full.value, 1.0, 1.0e6};
    for (const double i : too_much) {
        INFO("I = " << i << " A, I(y = 1) = " << i_full.value << " A");
        const auto y = cf::mole_fraction_from_current(o2, 300.0, 1.0e5, i);
        CHECK(y.code == cf::status::above_range);
        CHECK(y.value == 1.0);
    }
    // Just below I(1): in range.
    const auto y_in = cf::mole_fraction_from_current(o2, 300.0, 1.0e5, 0.999 * i_full.value);
    CHECK(y_in.ok());
    CHECK(y_in.value < 1.0);
    CHECK(y_in.value > 0.9);

    // Negative currents read 0 with below_range, small or huge (a huge one
    // saturates the inverse march: it must still read as the bottom edge).
    const double negative[] = {-1.0e-12, -1.0e-6, -1.0, -1.0e6};
    for (const double i : negative) {
        INFO("I = " << i << " A");
        const auto y = cf::mole_fraction_from_current(o2, 300.0, 1.0e5, i);
        CHECK(y.code == cf::status::below_range);
        CHECK(y.value == 0.0);
        const auto yc = cf::mole_fraction_from_current(co, 300.0, 1.0e5, i);
        CHECK(yc.code == cf::status::below_range);
        CHECK(yc.value == 0.0);
    }

    // Without Knudsen resistance a stagnant film has q(1) = 0: the flux at
    // pure O2 is singular. The library floors q, returns a large finite
    // current and flags out_of_domain.
    const cf::sensor_model<double, 4> o2_molecular =
        add(sensor("O2", "N2", 4u, 0.0), cf::make_capillary(0.1e-3, 1.0e-3, 1u, true, false));
    const auto singular = cf::limiting_current_A(o2_molecular, 300.0, 1.0e5, 1.0);
    expect(singular, cf::status::out_of_domain);
    CHECK(singular.value > cf::limiting_current_A(o2_molecular, 300.0, 1.0e5, 0.999).value);
}

TEST_CASE("bad input: ambient helpers outside their ranges") {
    // Alduchov & Eskridge fit range -40 .. 50 degC: outside, computed and flagged.
    const auto cold = cf::saturation_pressure_Pa(cf::celsius_to_kelvin(-60.0));
    expect(cold, cf::status::below_range);
    CHECK(cold.value > 0.0);
    const auto hot = cf::saturation_pressure_Pa(cf::celsius_to_kelvin(80.0));
    expect(hot, cf::status::above_range);
    // Relative humidity outside 0 .. 1 is clamped and flagged.
    const auto wet = cf::dry_mole_fraction(0.2, 1.5, 300.0, 1.0e5);
    expect(wet, cf::status::above_range);
    CHECK(wet.value == cf::dry_mole_fraction(0.2, 1.0, 300.0, 1.0e5).value);
    expect(cf::dry_mole_fraction(0.2, -0.5, 300.0, 1.0e5), cf::status::below_range);
    // Water partial pressure at or above the total pressure: no dry basis.
    expect(cf::dry_mole_fraction(0.2, 1.0, cf::celsius_to_kelvin(50.0), 5000.0),
           cf::status::out_of_domain);
    // ISO 2533 troposphere: the altitude is clamped to -5000 .. 11000 m.
    const auto high = cf::standard_pressure_at_altitude_Pa(20000.0);
    expect(high, cf::status::above_range);
    CHECK(high.value == cf::standard_pressure_at_altitude_Pa(11000.0).value);
    expect(cf::standard_pressure_at_altitude_Pa(-8000.0), cf::status::below_range);
    // Zero current with a runaway exponent is clamped and flagged.
    expect(cf::zero_current_A(1.0e-9, 10.0, 293.15, 400.0), cf::status::above_range);
}
