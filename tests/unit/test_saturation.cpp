// Saturation at the edges of the model: where no finite current or no finite
// fraction answers, the library returns a finite edge value and says so.
//
// The stagnant-film log law N = c D / L ln(1 / (1 - y)) (Bird, Stewart &
// Lightfoot, Transport Phenomena, 2nd ed., 2002, eq. 18.2-14 in flux form)
// diverges as y -> 1, and its inverse y = 1 - exp(-I / I_s) (docs/models.md
// sec. 4) tends to 1: past a few tens of I_s every larger current reads the
// same fraction.
#include <doctest/doctest.h>

#include <cmath>

#include <counterflux/ambient.hpp>
#include <counterflux/signal.hpp>

#include "support.hpp"

namespace cf = counterflux;
using namespace counterflux_test;

namespace {

template <class T>
cf::sensor_model<T, 4> stagnant_two_elements() {
    // A porous disc and a capillary, both without Knudsen resistance: the series
    // is a pure Stefan-Maxwell log law with no flux-ratio-blind part.
    auto m = sensor<T>("O2", "N2", 4u, cf::stagnant_flux_ratio<T>);
    m = add(m, cf::make_porous(T(0.5e-3), T(12.6e-6), T(0.5), T(1.8), T(1e-6), false));
    m = add(m, cf::make_capillary(T(0.05e-3), T(1.0e-3), 1u, true, false));
    return m;
}

}  // namespace

TEST_CASE_TEMPLATE("saturation: a stagnant series without Knudsen has no finite current at 100 %", T, float,
                   double) {
    const auto m = stagnant_two_elements<T>();
    const cf::result<T> i = cf::limiting_current_A(m, T(293.15), T(101325), T(1));
    CHECK(cf::has(i.code, cf::status::out_of_domain));
    CHECK(std::isfinite(i.value));
    // Just below 100 % the current is finite and ok, and grows towards the singularity.
    const cf::result<T> i99 = cf::limiting_current_A(m, T(293.15), T(101325), T(0.99));
    const cf::result<T> i90 = cf::limiting_current_A(m, T(293.15), T(101325), T(0.90));
    CHECK(i99.ok());
    CHECK(i90.ok());
    CHECK(i99.value > i90.value);
    // The log law: I(0.99)/I(0.90) = ln(1/0.01)/ln(1/0.1) = 2 for a pure log-law series.
    CHECK(rel_diff(i99.value / i90.value, T(2)) <= pick<T>(1e-9, 1e-4f));
}

TEST_CASE_TEMPLATE("saturation: a current past the log law's asymptote reads 1 with above_range", T, float,
                   double) {
    const auto m = stagnant_two_elements<T>();
    const cf::result<T> full = cf::limiting_current_A(m, T(293.15), T(101325), T(0.25));
    REQUIRE(full.ok());
    // A resolvable current still reads its fraction, unflagged.
    const cf::result<T> y = cf::mole_fraction_from_current(m, T(293.15), T(101325), full.value);
    CHECK(y.ok());
    CHECK(rel_diff(y.value, T(0.25)) <= pick<T>(1e-12, 1e-5f));
    // 1000 x full scale (a shorted cell): ln(1/0.75) * 1000 ~ 288 I_s, far past
    // saturation; the reading is the edge, flagged.
    for (const T factor : {T(1e3), T(1e6), T(1e12)}) {
        const cf::result<T> sat = cf::mole_fraction_from_current(m, T(293.15), T(101325), full.value * factor);
        CAPTURE(factor);
        CHECK(cf::has(sat.code, cf::status::above_range));
        CHECK(sat.value <= T(1));
        CHECK(sat.value > T(0.999));
    }
}

TEST_CASE_TEMPLATE("saturation: flux ratio +1 saturates at y = 1/2 and says so", T, float, double) {
    // alpha = 2: the inverse tends to (r_m + r_l)/(alpha r_m) = 1/2 with no
    // Knudsen part; a current beyond it reads 1/2 with above_range.
    auto m = sensor<T>("CO", "air", 2u, T(1));
    m = add(m, cf::make_capillary(T(0.1e-3), T(1.0e-3), 1u, true, false));
    const cf::result<T> s = cf::sensitivity_A_per_mol_per_mol(m, T(293.15), T(101325));
    REQUIRE(s.ok());
    const cf::result<T> y = cf::mole_fraction_from_current(m, T(293.15), T(101325), s.value * T(1e3));
    CHECK(cf::has(y.code, cf::status::above_range));
    CHECK(rel_diff(y.value, T(0.5)) <= pick<T>(1e-12, 1e-6f));
}

TEST_CASE_TEMPLATE("saturation: dry_mole_fraction clamps its input and result to [0, 1]", T, float, double) {
    // y_dry = y / (1 - RH e_s / P) (Alduchov & Eskridge, J. Appl. Meteor. 35, 1996, for e_s).
    const T t = T(298.15);
    const T p = T(101325);
    const cf::result<T> e_s = cf::saturation_pressure_Pa(t);
    REQUIRE(e_s.ok());
    const cf::result<T> ok = cf::dry_mole_fraction(T(0.2), T(0.5), t, p);
    CHECK(ok.ok());
    CHECK(rel_diff(ok.value, T(0.2) / (T(1) - T(0.5) * e_s.value / p)) <= pick<T>(1e-14, 1e-6f));
    const cf::result<T> huge = cf::dry_mole_fraction(std::numeric_limits<T>::max(), T(0.01), t, p);
    CHECK(std::isfinite(huge.value));
    CHECK(huge.value == T(1));
    CHECK(cf::has(huge.code, cf::status::above_range));
    const cf::result<T> negative = cf::dry_mole_fraction(T(-0.1), T(0.5), t, p);
    CHECK(negative.value == T(0));
    CHECK(cf::has(negative.code, cf::status::below_range));
    const cf::result<T> over = cf::dry_mole_fraction(T(0.999), T(1), t, p);  // 3 % water leaves no room
    CHECK(over.value == T(1));
    CHECK(cf::has(over.code, cf::status::above_range));
}

TEST_CASE("saturation: an overflowing sensitivity is flagged, and has no slope") {
    // A 1 km bore 1e-37 m long: S = n F A c D / L overflows float.
    auto m = sensor<float>("CO", "air", 2u, cf::equimolar_flux_ratio<float>);
    m = add(m, cf::make_capillary(1.0e3f, 1.0e-37f, 1u, false, false));
    for (const cf::reading_kind kind : {cf::reading_kind::mole_fraction, cf::reading_kind::partial_pressure}) {
        m.reading = kind;
        const float p = kind == cf::reading_kind::partial_pressure ? 0.5f : 101325.0f;
        const cf::result<float> s = cf::sensitivity_A_per_mol_per_mol(m, 293.15f, p);
        CHECK(std::isfinite(s.value));
        CHECK(cf::has(s.code, cf::status::out_of_domain));
        const cf::result<float> kt = cf::temperature_coefficient_per_K(m, 293.15f, p);
        const cf::result<float> kp = cf::pressure_coefficient_per_Pa(m, 293.15f, p);
        CHECK(std::isfinite(kt.value));
        CHECK(std::isfinite(kp.value));
        CHECK(cf::has(kt.code, cf::status::out_of_domain));
        CHECK(cf::has(kp.code, cf::status::out_of_domain));
        const cf::result<float> span = cf::span_factor(m, 293.15f, p);
        CHECK(std::isfinite(span.value));
        CHECK(!span.ok());
    }
    // A baseline that overflows: a exp(b dT) with b dT = 70 and a = 1e10 A.
    const cf::result<float> i0 = cf::zero_current_A(1.0e10f, 0.1f, 293.15f, 1000.0f);
    CHECK(std::isfinite(i0.value));
    CHECK(cf::has(i0.code, cf::status::out_of_domain));
}

TEST_CASE_TEMPLATE("ambient: saturation pressure of water against the IAPWS values", T, float, double) {
    // Saturation pressure over liquid water, IAPWS-95 (Wagner & Pruss, J. Phys.
    // Chem. Ref. Data 31, 387 (2002)): 611.2 Pa at 0 degC, 2339.3 Pa at 20 degC,
    // 7384.9 Pa at 40 degC (values from memory). Alduchov & Eskridge (J. Appl.
    // Meteor. 35, 601 (1996)) state their eq. 21 within 0.4 % over -40 .. 50 degC.
    const double t_c[] = {0.0, 20.0, 40.0};
    const double iapws_Pa[] = {611.2, 2339.3, 7384.9};
    for (int k = 0; k < 3; ++k) {
        const cf::result<T> e = cf::saturation_pressure_Pa(static_cast<T>(t_c[k] + 273.15));
        REQUIRE(e.ok());
        CHECK(std::fabs(static_cast<double>(e.value) / iapws_Pa[k] - 1.0) < 0.004);
    }
}

TEST_CASE_TEMPLATE("ambient: ISO 2533 standard atmosphere against its table", T, float, double) {
    // ISO 2533:1975 (= U.S. Standard Atmosphere 1976 below 32 km) tabulates
    // 89 874.6 Pa at 1000 m, 79 495.2 Pa at 2000 m and 22 632 Pa at 11 000 m
    // geopotential height (values from memory).
    const double h_m[] = {0.0, 1000.0, 2000.0, 11000.0};
    const double table_Pa[] = {101325.0, 89874.6, 79495.2, 22632.0};
    for (int k = 0; k < 4; ++k) {
        const cf::result<T> p = cf::standard_pressure_at_altitude_Pa(static_cast<T>(h_m[k]));
        REQUIRE(p.ok());
        CHECK(std::fabs(static_cast<double>(p.value) / table_Pa[k] - 1.0) < 2.0e-4);
    }
}

TEST_CASE_TEMPLATE("ambient: zero current doubles where b dT = ln 2", T, float, double) {
    // I_0(T) = a exp(b (T - T_ref)) (common practice, no source).
    const T b = T(0.07);
    const T dt = std::log(T(2)) / b;
    const cf::result<T> i0 = cf::zero_current_A(T(2.0e-9), b, T(293.15), T(293.15) + dt);
    REQUIRE(i0.ok());
    CHECK(rel_diff(i0.value, T(4.0e-9)) <= pick<T>(1e-12, 1e-5f));
    CHECK(cf::zero_current_A(T(2.0e-9), b, T(293.15), T(293.15)).value == T(2.0e-9));
}
