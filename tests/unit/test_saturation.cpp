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
