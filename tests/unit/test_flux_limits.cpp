// Analytic limits of the one flux law of flux.hpp and the transport
// properties of diffusivity.hpp. Every expected value is computed in this file
// from a published formula, written out here, and the formula's source is
// named beside it. Most cases run in float and in double; tolerances are a
// few rounding errors of the type.
#include <doctest/doctest.h>

#include <cmath>
#include <cstddef>
#include <limits>

#include <counterflux/constants.hpp>
#include <counterflux/diffusivity.hpp>
#include <counterflux/flux.hpp>
#include <counterflux/gases.hpp>
#include <counterflux/units.hpp>

#include "support.hpp"

namespace cf = counterflux;
using namespace counterflux_test;

namespace {

// A typical condition: 25 degC, 1 atm; R as quoted from SI 2019 (BIPM, 9th ed.;
// docs/models.md sec. 0).
template <class T>
T concentration_298() {
    return T(101325) / (T(8.314462618) * T(298.15));
}

}  // namespace

// ---------------------------------------------------------------------------
// alpha -> 0: the log law becomes the equimolar law.
// Equimolar law N = c D (y1 - y2) / L (Bird, Stewart & Lightfoot, Transport
// Phenomena, 2nd ed., 2002, sec. 18.2; docs/models.md sec. 1, alpha = 0).
// The log law c D/(alpha L) ln[(1 - alpha y2)/(1 - alpha y1)] expands as
// c D (y1 - y2)/L [1 + alpha (y1 + y2)/2 + alpha^2 (y1^2 + y1 y2 + y2^2)/3 + ...]
// (Taylor series of ln(1 - x)), so it reaches the equimolar law linearly in
// alpha: at alpha = 1e-10 and at 0 it is within 1e-9 for any fractions, and at
// alpha = 1e-7 within 1e-9 for a dilute pair; a concentrated pair is checked
// against the series itself.
TEST_CASE_TEMPLATE("flux: alpha -> 0 of the log law is the equimolar law", T, float, double) {
    const T c = concentration_298<T>();
    const T d = T(2.1e-5);
    const T len = T(1.0e-3);
    const T alphas[] = {T(1.0e-10), T(1.0e-7), T(0)};
    struct pair {
        T y1, y2;
    };
    const pair pairs[] = {{T(1.0e-3), T(0)}, {T(0.8), T(0.1)}, {T(0.1), T(0.6)}, {T(0.2095), T(0)}};
    for (const T alpha : alphas) {
        for (const pair& p : pairs) {
            INFO("alpha " << alpha << " y1 " << p.y1 << " y2 " << p.y2);
            const cf::result<T> log_law = cf::log_law_flux(c, d, len, alpha, p.y1, p.y2);
            const cf::result<T> equimolar = cf::equimolar_flux(c, d, len, p.y1, p.y2);
            REQUIRE(log_law.ok());
            REQUIRE(equimolar.ok());
            const T direct = c * d * (p.y1 - p.y2) / len;  // the equimolar law by hand
            CHECK(rel_diff(equimolar.value, direct) <= pick<T>(1e-13, 1e-6f));
            const T series =
                direct * (T(1) + alpha * (p.y1 + p.y2) / T(2) +
                          alpha * alpha * (p.y1 * p.y1 + p.y1 * p.y2 + p.y2 * p.y2) / T(3));
            CHECK(rel_diff(log_law.value, series) <= pick<T>(1e-13, 1e-6f));
            const bool dilute = p.y1 + p.y2 < T(0.01);
            if (alpha < T(1.0e-8) || dilute) {
                CHECK(rel_diff(log_law.value, equimolar.value) <= pick<T>(1e-9, 1e-6f));
                CHECK(rel_diff(log_law.value, direct) <= pick<T>(1e-9, 1e-6f));
            }
        }
    }
    // Exactly alpha = 0 at concentrated fractions: the equimolar law by hand.
    CHECK(rel_diff(cf::log_law_flux(c, d, len, T(0), T(0.3), T(0.1)).value, c * d * (T(0.3) - T(0.1)) / len) <=
          pick<T>(1e-15, 1e-7f));
}

// ---------------------------------------------------------------------------
// D_K -> infinity: the dusty-gas law becomes the molecular log law
// (Mason & Malinauskas, Gas Transport in Porous Media: The Dusty-Gas Model,
// 1983; with beta = 1 + D_AB/D_K -> 1 the dusty-gas flux is the Stefan-Maxwell
// log law; docs/models.md sec. 1).
TEST_CASE_TEMPLATE("flux: D_K -> infinity of the dusty-gas law is the molecular law", T, float,
                   double) {
    const T c = concentration_298<T>();
    const T d = T(2.0e-5);
    const T len = T(2.0e-3);
    const T alphas[] = {T(-1), T(0), T(1), T(2)};
    const T inf = std::numeric_limits<T>::infinity();
    for (const T alpha : alphas) {
        // alpha = 2 needs 1 - 2 y > 0: fractions below 0.5.
        const T y_pairs[][2] = {{T(0.3), T(0.05)}, {T(0.45), T(0)}, {T(0.01), T(0.2)}};
        for (const auto& y : y_pairs) {
            INFO("alpha " << alpha << " y1 " << y[0] << " y2 " << y[1]);
            const cf::result<T> molecular = cf::log_law_flux(c, d, len, alpha, y[0], y[1]);
            const cf::result<T> dk_inf = cf::dusty_gas_flux(c, d, inf, len, alpha, y[0], y[1]);
            const cf::result<T> dk_huge =
                cf::dusty_gas_flux(c, d, T(1.0e30), len, alpha, y[0], y[1]);
            REQUIRE(molecular.ok());
            REQUIRE(dk_inf.ok());
            REQUIRE(dk_huge.ok());
            // The Stefan-Maxwell log law written out (alpha = 0: the equimolar law).
            const T closed = alpha == T(0) ? c * d * (y[0] - y[1]) / len
                                           : c * d / (alpha * len) *
                                                 std::log((T(1) - alpha * y[1]) / (T(1) - alpha * y[0]));
            CHECK(rel_diff(dk_inf.value, closed) <= pick<T>(1e-13, 1e-5f));
            CHECK(rel_diff(molecular.value, closed) <= pick<T>(1e-13, 1e-5f));
            CHECK(rel_diff(dk_huge.value, molecular.value) <= pick<T>(1e-14, 1e-7f));
        }
    }
}

// ---------------------------------------------------------------------------
// D_AB -> infinity: pure Knudsen flow N = c D_K (y1 - y2)/L, linear and
// blind to the flux ratio (Knudsen flux of each species is independent;
// Mason & Malinauskas 1983; docs/models.md sec. 1).
TEST_CASE_TEMPLATE("flux: D_AB -> infinity of the dusty-gas law is pure Knudsen flow", T, float,
                   double) {
    const T c = concentration_298<T>();
    const T dk = T(3.7e-6);
    const T len = T(5.0e-4);
    const T alphas[] = {T(-1), T(0), T(0.5), T(1), T(2), T(5)};
    const T inf = std::numeric_limits<T>::infinity();
    const T y_pairs[][2] = {{T(0.9), T(0.1)}, {T(1), T(0)}, {T(0.2), T(0.7)}, {T(1.0e-6), T(0)}};
    for (const T alpha : alphas) {
        for (const auto& y : y_pairs) {
            INFO("alpha " << alpha << " y1 " << y[0] << " y2 " << y[1]);
            const T knudsen = c * dk * (y[0] - y[1]) / len;  // pure Knudsen by hand
            const cf::result<T> dab_inf = cf::dusty_gas_flux(c, inf, dk, len, alpha, y[0], y[1]);
            const cf::result<T> dab_huge =
                cf::dusty_gas_flux(c, T(1.0e30), dk, len, alpha, y[0], y[1]);
            REQUIRE(dab_inf.ok());
            REQUIRE(dab_huge.ok());
            CHECK(rel_diff(dab_inf.value, knudsen) <= pick<T>(1e-14, 1e-6f));
            CHECK(rel_diff(dab_huge.value, knudsen) <= pick<T>(1e-14, 1e-6f));
        }
    }
}

// ---------------------------------------------------------------------------
// Stagnant film at air level: N = c D/L ln[1/(1 - y)] (Bird, Stewart &
// Lightfoot, 2nd ed., sec. 18.2, diffusion through a stagnant gas film), so
// N / (c D y / L) = ln(1/(1 - y))/y. At y = 0.2095 (O2 in dry air) that is
// 1.1221462 (evaluated by hand; docs/models.md sec. 1). The test name's rounded
// 1.12215 is within 4e-6 of it.
TEST_CASE_TEMPLATE("flux: stagnant O2 at 20.95 % gives ln(1/(1-y))/y = 1.12215", T, float, double) {
    const T c = concentration_298<T>();
    const T d = T(2.0e-5);
    const T len = T(1.5e-3);
    const T y = T(0.2095);
    const cf::result<T> n = cf::log_law_flux(c, d, len, T(1), y, T(0));
    REQUIRE(n.ok());
    const T dilute_linear = c * d * y / len;
    const T ratio = n.value / dilute_linear;
    CHECK(std::fabs(ratio / T(1.12215) - T(1)) <= T(5.0e-6));
    CHECK(rel_diff(ratio, std::log(T(1) / (T(1) - y)) / y) <= pick<T>(1e-12, 1e-6f));
    // Same through the stagnant flux ratio constant.
    const T alpha = cf::alpha_from_flux_ratio(cf::stagnant_flux_ratio<T>);
    CHECK(cf::log_law_flux(c, d, len, alpha, y, T(0)).value == n.value);
}

// ---------------------------------------------------------------------------
// The general Stefan-Maxwell log law for a prescribed flux ratio,
// N_A = c D/(alpha L) ln[(1 - alpha y2)/(1 - alpha y1)] (Bird, Stewart &
// Lightfoot, 2nd ed., sec. 18.2-18.3; docs/models.md sec. 1), and its dusty-gas
// extension with beta = 1 + D_AB/D_K,
// N_A = c D_AB/(alpha L) ln[(beta - alpha y2)/(beta - alpha y1)] (Mason &
// Malinauskas 1983; docs/models.md sec. 1).
TEST_CASE_TEMPLATE("flux: the log law matches its closed form for several alpha", T, float,
                   double) {
    const T c = concentration_298<T>();
    const T d = T(1.9e-5);
    const T dk = T(4.0e-5);
    const T len = T(8.0e-4);
    // alpha = -1 is r = N_B/N_A = -2 (two product molecules out per target in).
    const T alphas[] = {cf::alpha_from_flux_ratio(T(-2)), T(0.5), T(1), T(1.5)};
    const T y_pairs[][2] = {
        {T(0.4), T(0.05)}, {T(0.6), T(0)}, {T(0.02), T(0.3)}, {T(1.0e-4), T(0)}};
    for (const T alpha : alphas) {
        for (const auto& y : y_pairs) {
            INFO("alpha " << alpha << " y1 " << y[0] << " y2 " << y[1]);
            // The closed form is evaluated in double from the same inputs: in
            // float, ln of a ratio near 1 would lose digits to cancellation.
            const double cd = static_cast<double>(c), dd = static_cast<double>(d),
                         ad = static_cast<double>(alpha);
            const double ld = static_cast<double>(len), y1 = static_cast<double>(y[0]),
                         y2 = static_cast<double>(y[1]);
            const double closed = cd * dd / (ad * ld) * std::log((1.0 - ad * y2) / (1.0 - ad * y1));
            const cf::result<T> n = cf::log_law_flux(c, d, len, alpha, y[0], y[1]);
            REQUIRE(n.ok());
            // In double the closed form itself carries eps / ln(ratio) ~ 1e-12
            // for the dilute pair.
            CHECK(std::fabs(static_cast<double>(n.value) / closed - 1.0) <=
                  static_cast<double>(pick<T>(1e-11, 1e-6f)));

            const double beta = 1.0 + dd / static_cast<double>(dk);
            const double closed_dg =
                cd * dd / (ad * ld) * std::log((beta - ad * y2) / (beta - ad * y1));
            const cf::result<T> ndg = cf::dusty_gas_flux(c, d, dk, len, alpha, y[0], y[1]);
            REQUIRE(ndg.ok());
            CHECK(std::fabs(static_cast<double>(ndg.value) / closed_dg - 1.0) <=
                  static_cast<double>(pick<T>(1e-11, 1e-6f)));
        }
    }
    // r = -2 by name: alpha = 1 + r.
    CHECK(cf::alpha_from_flux_ratio(T(-2)) == T(-1));
}

// ---------------------------------------------------------------------------
// Bosanquet at alpha = 0: N = c (y1 - y2)/(L (1/D_AB + 1/D_K)) (the equimolar
// dusty-gas result; Mason & Malinauskas 1983; docs/models.md sec. 1).
TEST_CASE_TEMPLATE("flux: Bosanquet at alpha = 0", T, float, double) {
    const T c = concentration_298<T>();
    const T len = T(1.0e-3);
    const T pairs[][2] = {{T(2.0e-5), T(1.0e-5)}, {T(2.0e-5), T(2.0e-7)}, {T(1.0e-6), T(3.0e-4)}};
    for (const auto& dd : pairs) {
        const T d_ab = dd[0];
        const T d_k = dd[1];
        const T d_bosanquet = T(1) / (T(1) / d_ab + T(1) / d_k);
        CHECK(rel_diff(cf::bosanquet_diffusivity(d_ab, d_k).value, d_bosanquet) <= pick<T>(1e-15, 1e-7f));
        const cf::result<T> n = cf::dusty_gas_flux(c, d_ab, d_k, len, T(0), T(0.7), T(0.2));
        REQUIRE(n.ok());
        CHECK(rel_diff(n.value, c * (T(0.7) - T(0.2)) / (len * (T(1) / d_ab + T(1) / d_k))) <=
              pick<T>(1e-14, 1e-6f));
        CHECK(rel_diff(n.value, c * d_bosanquet * (T(0.7) - T(0.2)) / len) <=
              pick<T>(1e-14, 1e-6f));
    }
}

// ---------------------------------------------------------------------------
// element_outlet and element_inlet are the inverses of element_flux in y_out
// and y_in (solving the log law above for either end).
TEST_CASE_TEMPLATE("flux: element_outlet and element_inlet invert element_flux", T, float, double) {
    const T c = concentration_298<T>();
    // molecular only; molecular + Knudsen; pure Knudsen (r_m = 0); Knudsen dominant
    const cf::element_transport<T> elements[] = {
        {T(1.0e-6), T(1.0e-3), T(1) / T(2.0e-5), T(0), T(0)},
        {T(2.0e-6), T(5.0e-4), T(1) / T(2.0e-5), T(1) / T(5.0e-5), T(0)},
        {T(3.0e-6), T(2.0e-3), T(0), T(1) / T(3.0e-6), T(0)},
        {T(1.0e-7), T(1.0e-4), T(1) / T(2.0e-5), T(1) / T(2.0e-7), T(0)},
    };
    const T alphas[] = {T(-1), T(0), T(0.5), T(1), T(2)};
    const T y_pairs[][2] = {
        {T(0.4), T(0)}, {T(0.3), T(0.05)}, {T(0.1), T(0.35)}, {T(1.0e-6), T(0)}};
    for (const cf::element_transport<T>& e : elements) {
        for (const T alpha : alphas) {
            for (const auto& y : y_pairs) {
                INFO("r_m " << e.inv_molecular_s_m2 << " r_l " << e.inv_linear_s_m2 << " alpha "
                            << alpha << " y_in " << y[0] << " y_out " << y[1]);
                const cf::result<T> n = cf::element_flux(e, c, alpha, y[0], y[1]);
                REQUIRE(n.ok());
                const cf::result<T> out = cf::element_outlet(e, c, alpha, y[0], n.value);
                const cf::result<T> in = cf::element_inlet(e, c, alpha, y[1], n.value);
                REQUIRE(out.ok());
                REQUIRE(in.ok());
                const T scale = std::fabs(y[0]) + std::fabs(y[1]);
                CHECK(std::fabs(out.value - y[1]) <= pick<T>(1e-13, 1e-6f) * scale);
                CHECK(std::fabs(in.value - y[0]) <= pick<T>(1e-13, 1e-6f) * scale);
                // ... and back: the flux from the recovered inlet fraction.
                const cf::result<T> n2 = cf::element_flux(e, c, alpha, in.value, y[1]);
                CHECK(rel_diff(n2.value, n.value) <= pick<T>(1e-12, 1e-5f));
            }
        }
    }
}

// ---------------------------------------------------------------------------
// Solution-diffusion membrane N = Pi (p1 - p2)/delta with Arrhenius
// permeability Pi(T) = Pi_ref exp[-(E/R)(1/T - 1/T_ref)] (docs/models.md sec. 1;
// the solution-diffusion model with Pi = D_m S, Wijmans & Baker, J. Membr. Sci.
// 107, 1 (1995)).
TEST_CASE_TEMPLATE("flux: membrane flux and Arrhenius permeability", T, float, double) {
    const T pi_ref = T(1.0e-15);  // mol/(m s Pa), about 3 Barrer
    const T delta = T(25.0e-6);
    const T t = T(298.15);
    const T p_pairs[][2] = {{T(21000), T(0)}, {T(500), T(100)}, {T(10), T(2000)}};
    for (const auto& p : p_pairs) {
        const cf::result<T> n = cf::membrane_flux(pi_ref, delta, t, p[0], p[1]);
        REQUIRE(n.ok());
        CHECK(rel_diff(n.value, pi_ref * (p[0] - p[1]) / delta) <= pick<T>(1e-13, 1e-6f));
    }
    // The same membrane at another temperature carries the same flux for the
    // same permeability (only Pi carries the temperature).
    CHECK(rel_diff(cf::membrane_flux(pi_ref, delta, T(350), T(1000), T(0)).value,
                   pi_ref * T(1000) / delta) <= pick<T>(1e-13, 1e-6f));

    const T t_ref = T(298.15);
    const T e_act = T(25000);  // J/mol
    const cf::result<T> at_ref = cf::arrhenius_permeability(pi_ref, e_act, t_ref, t_ref);
    REQUIRE(at_ref.ok());
    CHECK(at_ref.value == pi_ref);
    const T r = T(6.02214076e23 * 1.380649e-23);  // R = N_A k_B, exact (SI 2019, BIPM 9th ed.)
    const T temps[] = {T(233.15), T(273.15), T(320), T(350)};
    for (const T temp : temps) {
        const cf::result<T> pi_t = cf::arrhenius_permeability(pi_ref, e_act, t_ref, temp);
        REQUIRE(pi_t.ok());
        const T ratio = std::exp(-(e_act / r) * (T(1) / temp - T(1) / t_ref));
        CHECK(rel_diff(pi_t.value / pi_ref, ratio) <= pick<T>(1e-12, 2e-6f));
        // Higher temperature, higher permeability for E > 0.
        CHECK((pi_t.value > pi_ref) == (temp > t_ref));
    }
    CHECK(cf::arrhenius_permeability(pi_ref, T(0), t_ref, T(350)).value == pi_ref);
}

// 1 Barrer = 1e-10 cm3(STP) cm / (cm2 s cmHg) = 3.346e-16 mol/(m s Pa)
// (the definition of the unit). By hand: 1 cm3(STP) = 1e-6 m3 x 101325 Pa / (R 273.15 K);
// 1 cmHg = 101325/76 Pa (conventional).
TEST_CASE("flux: 1 Barrer in SI") {
    const double r = 8.31446261815324;  // N_A k_B, SI 2019 exact
    const double mol_per_cm3 = 1.0e-6 * 101325.0 / (r * 273.15);
    const double by_hand = 1.0e-10 * mol_per_cm3 * 1.0e-2 / (1.0e-4 * (101325.0 / 76.0));
    CHECK(std::fabs(cf::barrer_mol_m_s_Pa<double> / 3.346e-16 - 1.0) <= 1.0e-3);
    CHECK(std::fabs(cf::barrer_mol_m_s_Pa<double> / by_hand - 1.0) <= 1.0e-14);
    CHECK(std::fabs(static_cast<double>(cf::barrer_mol_m_s_Pa<float>) / by_hand - 1.0) <= 1.0e-7);
}

// ---------------------------------------------------------------------------
// D_AB = D_BA for a binary in the low-density limit (Poling et al. 5th ed.,
// sec. 11-1; both correlations are symmetric in A and B by construction,
// eq. 11-4.4 and 11-3.2), and the implementation must keep that exactly.
TEST_CASE_TEMPLATE("diffusivity: D_AB == D_BA exactly for every pair", T, float, double) {
    const T temps[] = {T(250), T(300), T(400)};
    const T p = T(101325);
    std::size_t pairs = 0;
    for (std::size_t i = 0; i < cf::gas_count; ++i) {
        for (std::size_t j = 0; j < cf::gas_count; ++j) {
            if (i == j) continue;
            const cf::gas_data& a = cf::gas_table[i];
            const cf::gas_data& b = cf::gas_table[j];
            for (const T t : temps) {
                INFO(a.formula << "-" << b.formula << " at " << t << " K");
                const cf::result<T> fab = cf::fuller_diffusivity(a, b, t, p);
                const cf::result<T> fba = cf::fuller_diffusivity(b, a, t, p);
                CHECK(fab.value == fba.value);
                CHECK(fab.code == fba.code);
                CHECK(fab.value > T(0));
                const cf::result<T> cab = cf::chapman_enskog_diffusivity(a, b, t, p);
                const cf::result<T> cba = cf::chapman_enskog_diffusivity(b, a, t, p);
                CHECK(cab.value == cba.value);
                CHECK(cab.code == cba.code);
                CHECK(cab.value > T(0));
                ++pairs;
            }
        }
    }
    CHECK(pairs == 3 * cf::gas_count * (cf::gas_count - 1));
}

// ---------------------------------------------------------------------------
// Knudsen diffusivity D_K = (d/3) sqrt(8 R T/(pi M)) (kinetic theory; Cussler,
// Diffusion, 3rd ed., 2009, sec. 6.4; docs/models.md sec. 2), for O2 in a 1 um
// pore at 298.15 K, by hand. The mean molecular speed sqrt(8 R T/(pi M)) of
// O2 at 25 degC is 444 m/s (Atkins, Physical Chemistry, table of mean speeds,
// from memory).
TEST_CASE_TEMPLATE("diffusivity: Knudsen diffusivity of O2 in a 1 um pore", T, float, double) {
    const T d = T(1.0e-6);
    const T t = T(298.15);
    // kg/mol: IUPAC 2 x 15.999 as the float-valued table holds it.
    const T m = static_cast<T>(31.998f) * T(1.0e-3);
    const T r = T(8.314462618);
    const T pi = T(3.14159265358979);
    const T mean_speed = std::sqrt(T(8) * r * t / (pi * m));
    const T by_hand = d / T(3) * mean_speed;
    const cf::result<T> dk = cf::knudsen_diffusivity(d, cf::molar_mass_kg_mol<T>(gas("O2")), t);
    REQUIRE(dk.ok());
    CHECK(rel_diff(dk.value, by_hand) <= pick<T>(1e-9, 1e-6f));
    CHECK(std::fabs(mean_speed - T(444)) <= T(1));
    // D_K ~ d sqrt(T / M): twice the pore, twice D_K; four times T, twice D_K.
    CHECK(rel_diff(cf::knudsen_diffusivity(T(2) * d, m, t).value,
                   T(2) * cf::knudsen_diffusivity(d, m, t).value) <= pick<T>(1e-15, 1e-6f));
    CHECK(rel_diff(cf::knudsen_diffusivity(d, m, T(4) * t).value,
                   T(2) * cf::knudsen_diffusivity(d, m, t).value) <= pick<T>(1e-15, 1e-6f));
}

// Mean free path lambda = k_B T/(sqrt(2) pi d^2 P) (hard-sphere kinetic
// theory, e.g. Cussler, Diffusion, 3rd ed., sec. 5.1). For air at 0 degC and
// 1 atm with a kinetic diameter of about 3.6 angstrom it is 6e-8 .. 7e-8 m
// (the textbook figure "about 65 nm", from memory).
TEST_CASE_TEMPLATE("diffusivity: mean free path of air at 0 degC, 1 atm", T, float, double) {
    const T t = T(273.15);
    const T p = T(101325);
    const T dm = cf::kinetic_diameter_m<T>(gas("air"));
    const cf::result<T> lambda = cf::mean_free_path(dm, t, p);
    REQUIRE(lambda.ok());
    CHECK(lambda.value > T(6.0e-8));
    CHECK(lambda.value < T(7.0e-8));
    const double dmd = static_cast<double>(dm);
    const double by_hand =
        1.380649e-23 * 273.15 / (std::sqrt(2.0) * 3.14159265358979323846 * dmd * dmd * 101325.0);
    CHECK(std::fabs(static_cast<double>(lambda.value) / by_hand - 1.0) <=
          static_cast<double>(pick<T>(1e-13, 1e-6f)));
    // Kn = lambda / d.
    const cf::result<T> kn = cf::knudsen_number(lambda.value, T(1.0e-6));
    REQUIRE(kn.ok());
    CHECK(rel_diff(kn.value, lambda.value / T(1.0e-6)) <= pick<T>(1e-15, 1e-7f));
}

// Neufeld, Janzen & Aziz, J. Chem. Phys. 57, 1100 (1972): Omega_D =
// A/T*^B + C/exp(D T*) + E/exp(F T*) + G/exp(H T*) with the paper's coefficients
// (listed in docs/models.md sec. 3). At T* = 1 every power is 1, so
// Omega_D = A + C e^-D + E e^-F + G e^-H. The tabulated collision integral at
// kT/eps = 1.00 is 1.440 (Bird, Stewart & Lightfoot, 2nd ed., Table E.2, from
// memory); the fit is
// stated to be good to about 0.1 %.
TEST_CASE_TEMPLATE("diffusivity: Neufeld collision integral at T* = 1", T, float, double) {
    const double a = 1.06036, c = 0.19300, e = 1.03587, g = 1.76474;
    const double d = 0.47635, f = 1.52996, h = 3.89411;
    const double at_one = a + c * std::exp(-d) + e * std::exp(-f) + g * std::exp(-h);
    const cf::result<T> fit_one = cf::neufeld_collision_integral(T(1));
    REQUIRE(fit_one.ok());
    const T omega = fit_one.value;
    CHECK(std::fabs(static_cast<double>(omega) / at_one - 1.0) <=
          static_cast<double>(pick<T>(1e-14, 1e-6f)));
    CHECK(std::fabs(at_one / 1.440 - 1.0) <= 3.0e-3);
    // At T* = 2 the powers no longer vanish: A/2^B + ...
    const double at_two = a / std::pow(2.0, 0.15610) + c / std::exp(2.0 * d) +
                          e / std::exp(2.0 * f) + g / std::exp(2.0 * h);
    CHECK(std::fabs(static_cast<double>(cf::neufeld_collision_integral(T(2)).value) / at_two - 1.0) <=
          static_cast<double>(pick<T>(1e-14, 1e-6f)));
}
