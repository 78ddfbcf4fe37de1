// Span factor, sensitivity and linearity of whole sensors against the limits
// of docs/models.md sec. 4 and 5. Sensors are built by hand: CO in air
// (equimolar counterdiffusion, CO + H2O -> CO2 + 2 H+ + 2 e-, n = 2) and O2 in
// N2 (diffusion through stagnant N2, O2 + 4 H+ + 4 e- -> 2 H2O, n = 4).
//
// The limits:
//   continuum capillary, Fuller D ~ T^1.75/P (Poling et al. 5th ed.
//     eq. 11-4.4), c = P/(R T): S = n F c A D / L ~ T^0.75, independent of P;
//   free-molecular pores, D_K ~ sqrt(T) (kinetic theory, Cussler, Diffusion,
//     3rd ed., sec. 6.4): S = n F c A D_K / L ~ P T^-0.5;
//   solution-diffusion membrane, N = Pi (p1 - p2)/delta with p = y P and
//     Arrhenius Pi (docs/models.md sec. 1): S = n F Pi(T) P A / delta.
// A partial-pressure reading divides S by P, i.e. multiplies s by P_ref / P.
#include <doctest/doctest.h>

#include <cmath>
#include <cstddef>
#include <type_traits>

#include <counterflux/barrier.hpp>
#include <counterflux/diffusivity.hpp>
#include <counterflux/flux.hpp>
#include <counterflux/gases.hpp>
#include <counterflux/series.hpp>
#include <counterflux/signal.hpp>

#include "support.hpp"

namespace cf = counterflux;
using namespace counterflux_test;

namespace {

// Calibration condition of every sensor here (support.hpp's sensor()): 20 degC, 1 atm.
template <class T>
constexpr T t_ref = T(293.15);
template <class T>
constexpr T p_ref = T(101325);

template <class T>
cf::sensor_model<T, 4> co_in_air() {
    return sensor<T>("CO", "air", 2u, cf::equimolar_flux_ratio<T>);
}

template <class T>
cf::sensor_model<T, 4> o2_in_n2() {
    return sensor<T>("O2", "N2", 4u, cf::stagnant_flux_ratio<T>);
}

// m with element b added; the test stops unless the result is a valid sensor.
template <class T>
cf::sensor_model<T, 4> with(const cf::sensor_model<T, 4>& m, const cf::barrier<T>& b) {
    cf::sensor_model<T, 4> out = add(m, b);
    REQUIRE(cf::validate(out) == cf::status::ok);
    return out;
}

// A grid covering the [table] example of docs/sensor-file.md (-20 .. 50 degC,
// 70 .. 110 kPa): 250 .. 330 K, 70 .. 110 kPa.
template <class T>
constexpr T temps[] = {T(250), T(260), T(273.15), T(280), T(293.15),
                       T(300), T(310), T(320),    T(330)};
template <class T>
constexpr T pressures[] = {T(70000), T(80000), T(90000), T(101325), T(110000)};

}  // namespace

// ---------------------------------------------------------------------------
TEST_CASE_TEMPLATE("span: continuum capillary with Fuller follows (T/T_ref)^0.75, independent of P",
                   T, float, double) {
    // knudsen = false: the continuum limit exactly.
    const cf::barrier<T> cap = cf::make_capillary(T(0.15e-3), T(1.2e-3), 1u, true, false);
    const cf::sensor_model<T, 4> models[] = {with(co_in_air<T>(), cap), with(o2_in_n2<T>(), cap)};
    for (const cf::sensor_model<T, 4>& m : models) {
        for (const T t : temps<T>) {
            const T expected = std::pow(t / t_ref<T>, T(0.75));
            const cf::result<T> at_ref_p = cf::span_factor(m, t, p_ref<T>);
            REQUIRE(at_ref_p.ok());
            for (const T p : pressures<T>) {
                INFO(m.target->formula << " at " << t << " K, " << p << " Pa");
                const cf::result<T> s = cf::span_factor(m, t, p);
                REQUIRE(s.ok());
                CHECK(rel_diff(s.value, expected) <= pick<T>(1e-6, 5e-6f));
                CHECK(rel_diff(s.value, at_ref_p.value) <= pick<T>(1e-6, 5e-6f));
            }
        }
        const cf::result<T> one = cf::span_factor(m, t_ref<T>, p_ref<T>);
        CHECK(one.value == T(1));
    }
}

TEST_CASE_TEMPLATE("span: continuum capillary coefficients d ln s/dT = 0.75/T, d ln s/dP = 0", T,
                   float, double) {
    const cf::barrier<T> cap = cf::make_capillary(T(0.15e-3), T(1.2e-3), 1u, true, false);
    const cf::sensor_model<T, 4> models[] = {with(co_in_air<T>(), cap), with(o2_in_n2<T>(), cap)};
    for (const cf::sensor_model<T, 4>& m : models) {
        for (const T t : temps<T>) {
            for (const T p : pressures<T>) {
                INFO(m.target->formula << " at " << t << " K, " << p << " Pa");
                const cf::result<T> kt = cf::temperature_coefficient_per_K(m, t, p);
                const cf::result<T> kp = cf::pressure_coefficient_per_Pa(m, t, p);
                REQUIRE(kt.ok());
                REQUIRE(kp.ok());
                // Central difference with step T eps^(1/3): ~1e-10 in double,
                // ~1e-4 in float (rounding over a step of 5e-3 T).
                CHECK(rel_diff(kt.value, T(0.75) / t) <= pick<T>(1e-6, 2e-4f));
                CHECK(std::fabs(kp.value) * p <= pick<T>(1e-9, 1e-4f));
            }
        }
    }
}

TEST_CASE("span: wide-bore capillary with Knudsen on is continuum to its Knudsen share") {
    using T = double;
    // 5 mm bore, 100 mm long, Knudsen on: the Knudsen resistance L/D_K is a
    // tiny share of the total L_eff/D + L/D_K; the span departs from the
    // continuum law by no more than twice that share.
    const T d = 5.0e-3;
    const T len = 0.1;
    const cf::sensor_model<T, 4> m = with(co_in_air<T>(), cf::make_capillary(d, len));
    const T l_eff = len + pi_d * d / 4.0;  // pi d / 8 per end (Brown & Escombe 1900)
    const T area = pi_d * d * d / 4.0;
    const T m_co = static_cast<T>(28.010f) * T(1.0e-3);  // kg/mol, IUPAC C 12.011 + O 15.999, as the float table holds it
    auto sensitivity_by_hand = [&](T t, T p, T* share) {
        const T dab = cf::fuller_diffusivity(gas("CO"), gas("air"), t, p).value;
        const T dk = d / 3.0 * std::sqrt(8.0 * r_exact * t / (pi_d * m_co));
        const T resistance = l_eff / dab + len / dk;  // per c A
        *share = (len / dk) / resistance;
        return 2.0 * f_exact * (p / (r_exact * t)) * area / resistance;
    };
    T share_ref = 0.0;
    const T s_ref_hand = sensitivity_by_hand(t_ref<T>, p_ref<T>, &share_ref);
    CHECK(rel_diff(cf::sensitivity_A_per_mol_per_mol(m, t_ref<T>, p_ref<T>).value, s_ref_hand) <=
          1e-12);
    T max_share = share_ref;
    for (const T t : temps<T>) {
        for (const T p : pressures<T>) {
            T share = 0.0;
            const T s_hand = sensitivity_by_hand(t, p, &share) / s_ref_hand;
            if (share > max_share) max_share = share;
            const cf::result<T> s = cf::span_factor(m, t, p);
            REQUIRE(s.ok());
            INFO(t << " K, " << p << " Pa, Knudsen share " << share);
            CHECK(rel_diff(s.value, s_hand) <= 1e-12);
            CHECK(rel_diff(s.value, std::pow(t / t_ref<T>, 0.75)) <= 2.0 * max_share);
        }
    }
    CHECK(max_share < 1.0e-4);
    // The library's own report of the share agrees.
    const auto rep = cf::element_reports(m, t_ref<T>, p_ref<T>);
    REQUIRE(rep.ok());
    CHECK(rel_diff(rep.value.elements[0].knudsen_share, share_ref) <= 1e-9);
}

// ---------------------------------------------------------------------------
// Free-molecular limit. With the Fuller D of a real gas a 10 nm pore is still
// ~7 % molecular (D_K ~ 1.6e-6 vs D ~ 2e-5 m2/s), so the molecular part is
// made negligible by a measured D of 0.3 m2/s (scaled T^1.75/P like a real
// gas): the molecular share D_K/(D + D_K) is then < 1e-4 over the grid, which
// the test asserts, and the span must follow P T^-0.5 to within twice it.
TEST_CASE_TEMPLATE(
    "span: free-molecular pores follow P T^-0.5 (mole fraction) and T^-0.5 (partial pressure)", T,
    float, double) {
    cf::sensor_model<T, 4> base = co_in_air<T>();
    base.diffusivity = cf::diffusivity_model<T>{cf::diffusivity_method::measured,
                                                base.target,
                                                base.background,
                                                T(0.3),
                                                t_ref<T>,
                                                p_ref<T>,
                                                T(1.75)};
    const T pore = T(10.0e-9);
    const T bore = T(50.0e-9);
    const cf::barrier<T> elements[] = {cf::make_porous(T(1.0e-3), T(1.0e-5), T(0.3), T(3), pore),
                                       cf::make_capillary(bore, T(1.0e-3), 1000u)};
    const double m_co = static_cast<double>(28.010f) * 1.0e-3;  // kg/mol, IUPAC C 12.011 + O 15.999, as the float table holds it
    for (const cf::barrier<T>& b : elements) {
        const cf::sensor_model<T, 4> m = with(base, b);
        const double d = static_cast<double>(b.kind == cf::barrier_kind::porous ? pore : bore);
        double max_share = 0.0;
        for (const T t : temps<T>) {
            for (const T p : pressures<T>) {
                const double td = static_cast<double>(t), pd = static_cast<double>(p);
                const double dab = 0.3 * std::pow(td / 293.15, 1.75) * (101325.0 / pd);
                const double dk = d / 3.0 * std::sqrt(8.0 * r_exact * td / (pi_d * m_co));
                const double share = dk / (dab + dk);  // molecular share of the resistance
                if (share > max_share) max_share = share;
                const auto rep = cf::element_reports(m, t, p);
                REQUIRE(rep.ok());
                CHECK(static_cast<double>(rep.value.elements[0].knudsen_share) >= 1.0 - 1.0e-4);
            }
        }
        REQUIRE(max_share < 1.0e-4);
        const double tol = 2.0 * max_share + static_cast<double>(pick<T>(1e-12, 5e-6f));

        cf::sensor_model<T, 4> pp = m;
        pp.reading = cf::reading_kind::partial_pressure;
        for (const T t : temps<T>) {
            for (const T p : pressures<T>) {
                INFO(cf::kind_name(b.kind) << " at " << t << " K, " << p << " Pa");
                const double td = static_cast<double>(t), pd = static_cast<double>(p);
                const cf::result<T> s = cf::span_factor(m, t, p);
                REQUIRE(s.ok());
                const double expected = (pd / 101325.0) * std::pow(td / 293.15, -0.5);
                CHECK(std::fabs(static_cast<double>(s.value) / expected - 1.0) <= tol);
                const cf::result<T> s_pp = cf::span_factor(pp, t, p);
                REQUIRE(s_pp.ok());
                CHECK(std::fabs(static_cast<double>(s_pp.value) / std::pow(td / 293.15, -0.5) -
                                1.0) <= tol);
            }
        }
        // Coefficients: d ln s/dT = -0.5/T, d ln s/dP = 1/P (fraction) or 0 (partial pressure).
        if constexpr (std::is_same<T, double>::value) {
            const cf::result<T> kt = cf::temperature_coefficient_per_K(m, T(300), T(90000));
            const cf::result<T> kp = cf::pressure_coefficient_per_Pa(m, T(300), T(90000));
            const cf::result<T> kp_pp = cf::pressure_coefficient_per_Pa(pp, T(300), T(90000));
            REQUIRE(kt.ok());
            REQUIRE(kp.ok());
            REQUIRE(kp_pp.ok());
            CHECK(std::fabs(kt.value / (-0.5 / 300.0) - 1.0) <= 4.0 * max_share + 1e-6);
            CHECK(std::fabs(kp.value / (1.0 / 90000.0) - 1.0) <= 4.0 * max_share + 1e-6);
            CHECK(std::fabs(kp_pp.value) * 90000.0 <= 4.0 * max_share + 1e-6);
        }
    }
}

// ---------------------------------------------------------------------------
TEST_CASE_TEMPLATE("span: membrane sensor follows (P/P_ref) exp(-(E/R)(1/T - 1/T_ref))", T, float,
                   double) {
    const T pi_ref = T(1.0e-15);  // mol/(m s Pa) at T_ref
    const T e_act = T(30000);     // J/mol
    const T delta = T(25.0e-6);
    const T area = T(1.0e-5);
    const cf::sensor_model<T, 4> m =
        with(o2_in_n2<T>(), cf::make_membrane(delta, area, pi_ref, e_act, t_ref<T>));
    cf::sensor_model<T, 4> pp = m;
    pp.reading = cf::reading_kind::partial_pressure;

    // S = n F Pi P A / delta at the reference.
    const double s_hand = 4.0 * f_exact * 1.0e-15 * 101325.0 * 1.0e-5 / 25.0e-6;
    CHECK(std::fabs(
              static_cast<double>(cf::sensitivity_A_per_mol_per_mol(m, t_ref<T>, p_ref<T>).value) /
                  s_hand -
              1.0) <= static_cast<double>(pick<T>(1e-12, 1e-6f)));

    for (const T t : temps<T>) {
        for (const T p : pressures<T>) {
            INFO(t << " K, " << p << " Pa");
            const double td = static_cast<double>(t), pd = static_cast<double>(p);
            const double arrhenius = std::exp(-(30000.0 / r_exact) * (1.0 / td - 1.0 / 293.15));
            const cf::result<T> s = cf::span_factor(m, t, p);
            const cf::result<T> s_pp = cf::span_factor(pp, t, p);
            REQUIRE(s.ok());
            REQUIRE(s_pp.ok());
            CHECK(std::fabs(static_cast<double>(s.value) / ((pd / 101325.0) * arrhenius) - 1.0) <=
                  static_cast<double>(pick<T>(1e-9, 5e-6f)));
            CHECK(std::fabs(static_cast<double>(s_pp.value) / arrhenius - 1.0) <=
                  static_cast<double>(pick<T>(1e-9, 5e-6f)));
        }
    }
    // d ln s/dT = E/(R T^2) for the Arrhenius law.
    if constexpr (std::is_same<T, double>::value) {
        const cf::result<T> kt = cf::temperature_coefficient_per_K(m, 300.0, 101325.0);
        REQUIRE(kt.ok());
        CHECK(rel_diff(kt.value, 30000.0 / (r_exact * 300.0 * 300.0)) <= 1e-6);
    }
}

// ---------------------------------------------------------------------------
TEST_CASE("signal: capillary sensitivity is n F c A D / L_eff") {
    // docs/models.md sec. 4 with the geometry of sec. 2, no Knudsen.
    const double d = 0.15e-3, len = 1.2e-3;
    const cf::sensor_model<double, 4> m =
        with(co_in_air<double>(), cf::make_capillary(d, len, 1u, true, false));
    const double t = 298.15, p = 95000.0;
    const double dab = cf::fuller_diffusivity(gas("CO"), gas("air"), t, p).value;
    const double expected =
        2.0 * f_exact * (p / (r_exact * t)) * (pi_d * d * d / 4.0) * dab / (len + pi_d * d / 4.0);
    const cf::result<double> s = cf::sensitivity_A_per_mol_per_mol(m, t, p);
    REQUIRE(s.ok());
    CHECK(rel_diff(s.value, expected) <= 1e-12);
    // In the dilute limit the current is S y.
    const cf::result<double> i = cf::limiting_current_A(m, t, p, 1.0e-6);
    REQUIRE(i.ok());
    CHECK(rel_diff(i.value, expected * 1.0e-6) <= 1e-12);
}

TEST_CASE("signal: linearity ratio of a single capillary without Knudsen") {
    const cf::barrier<double> cap = cf::make_capillary(0.15e-3, 1.2e-3, 1u, true, false);
    const cf::sensor_model<double, 4> co = with(co_in_air<double>(), cap);
    const cf::sensor_model<double, 4> o2 = with(o2_in_n2<double>(), cap);
    const double fractions[] = {1.0e-6, 1.0e-4, 1.0e-2, 0.1, 0.2095, 0.5, 0.8, 0.9, 0.99};
    for (const double y : fractions) {
        INFO("y = " << y);
        // Equimolar: N = c D y / L, linear (docs/models.md sec. 1, alpha = 0).
        const cf::result<double> lin = cf::linearity_ratio(co, 300.0, 101325.0, y);
        REQUIRE(lin.ok());
        CHECK(std::fabs(lin.value - 1.0) <= 1e-12);
        // Stagnant film: N = c D/L ln(1/(1 - y)) (Bird, Stewart & Lightfoot,
        // 2nd ed., sec. 18.2), so I/(S y) = ln(1/(1 - y))/y, evaluated as
        // -log1p(-y)/y (the same function; std::log(1/(1 - y)) would lose
        // eps/y to the rounding of 1 - y at y = 1e-6).
        const cf::result<double> stag = cf::linearity_ratio(o2, 300.0, 101325.0, y);
        REQUIRE(stag.ok());
        CHECK(rel_diff(stag.value, -std::log1p(-y) / y) <= 1e-12);
        CHECK(rel_diff(stag.value, std::log(1.0 / (1.0 - y)) / y) <= 1e-15 / y + 1e-12);
    }
    // At air level: 1.12215 (ln(1/0.7905)/0.2095 = 1.1221462 by hand; docs/models.md sec. 1
    // quotes 1.1221).
    CHECK(std::fabs(cf::linearity_ratio(o2, 293.15, 101325.0, 0.2095).value / 1.12215 - 1.0) <=
          5.0e-6);
    // y = 0: the ratio is 1 by definition.
    CHECK(cf::linearity_ratio(o2, 300.0, 101325.0, 0.0).value == 1.0);
    // The float path agrees.
    const cf::sensor_model<float, 4> o2f =
        with(o2_in_n2<float>(), cf::make_capillary(0.15e-3f, 1.2e-3f, 1u, true, false));
    const float yf = 0.2095f;
    CHECK(std::fabs(cf::linearity_ratio(o2f, 293.15f, 101325.0f, yf).value /
                        (std::log(1.0f / (1.0f - yf)) / yf) -
                    1.0f) <= 2.0e-6f);
}

TEST_CASE_TEMPLATE("reading_from_current reports a fraction or a partial pressure", T, float, double) {
    // y from the inverse; a partial-pressure sensor reports p = y P (Dalton's law).
    namespace ct = counterflux_test;
    const cf::gas_data& o2 = ct::gas("O2");
    const cf::gas_data& n2 = ct::gas("N2");
    auto m = cf::make_sensor<T, 2>(&o2, &n2, 4u, cf::stagnant_flux_ratio<T>, T(298.15), T(101325));
    REQUIRE(cf::push(m.barriers, cf::make_capillary(T(0.05e-3), T(1.0e-3))) == cf::status::ok);
    const T t = T(298.15);
    const T p = T(83500);
    const cf::result<T> i = cf::limiting_current_A(m, t, p, T(0.2095));
    REQUIRE(i.ok());
    const cf::result<T> as_fraction = cf::reading_from_current(m, t, p, i.value);
    CHECK(as_fraction.ok());
    CHECK(ct::rel_diff(as_fraction.value, T(0.2095)) <= ct::pick<T>(1e-12, 1e-5f));
    m.reading = cf::reading_kind::partial_pressure;
    const cf::result<T> as_pressure = cf::reading_from_current(m, t, p, i.value);
    CHECK(as_pressure.ok());
    CHECK(ct::rel_diff(as_pressure.value, T(0.2095) * p) <= ct::pick<T>(1e-12, 1e-5f));
}
