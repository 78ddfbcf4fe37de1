// The compensation object (compensation.hpp): the shape function h, the
// curvature gamma of the non-linear law, and reading() from tables built here
// from the full model, checked against the full model.
//
// The law, integrated by hand for one element into a perfect sink (physics.md
// sec. 1 and 4; the dusty-gas law of Mason & Malinauskas, 1983, with the
// Stefan-Maxwell log law of Bird, Stewart & Lightfoot, Transport Phenomena, 2nd
// ed., 2002, sec. 18.2 as its r_l = 0 limit). With q(y) = r_m (1 - alpha y) + r_l:
//     N(y)  = c / (alpha r_m L) ln[q(0) / q(y)]
//           = -(c / (alpha r_m L)) ln(1 - beta y),    beta = alpha r_m / (r_m + r_l);
//     dN/dy at y -> 0 = c / ((r_m + r_l) L), so S = n F A c / ((r_m + r_l) L);
//     u = I / S = N (r_m + r_l) L / c = -ln(1 - beta y) / beta;
//     y = (1 - exp(-beta u)) / beta = u h(beta u),  h(z) = (1 - exp(-z)) / z.
// So for one element gamma = beta = alpha times the molecular share of the
// element's resistance, and the law is exact at every y, not only at full scale.
// For a partial-pressure reading w = u P and p = y P = w h(beta w / P): gamma = beta / P.
#include <doctest/doctest.h>

#include <cmath>
#include <cstddef>
#include <cstdint>
#include <limits>
#include <random>
#include <vector>

#include <counterflux/ambient.hpp>
#include <counterflux/barrier.hpp>
#include <counterflux/compensation.hpp>
#include <counterflux/series.hpp>
#include <counterflux/signal.hpp>
#include <counterflux/status.hpp>
#include <counterflux/table.hpp>

#include "support.hpp"

namespace cf = counterflux;
using namespace counterflux_test;

namespace {

// The grid of the [table] example in interfaces.md: -20 .. 50 degC, 70 .. 110 kPa, 15 x 9.
constexpr std::size_t nt = 15, np = 9;
constexpr double t_from = 253.15, t_to = 323.15, p_from = 70000.0, p_to = 110000.0;

// (1 - exp(-z)) / z in long double: the closed form for |z| >= 1, where 1 - exp(-z)
// has no cancellation (it is at least 1 - 1/e), and its Taylor series
// sum (-z)^k / (k+1)! below, summed to 30 terms (the remainder is under 1/31! < 1e-33).
// Both hold to a few ulps of long double, also where long double is double (Arm).
long double h_reference(long double z) {
    if (std::fabs(z) >= 1.0L) return (1.0L - std::exp(-z)) / z;
    long double term = 1.0L, sum = 1.0L;  // term k: (-z)^k / (k+1)!
    for (int k = 1; k <= 30; ++k) {
        term *= -z / static_cast<long double>(k + 1);
        sum += term;
    }
    return sum;
}

// Invented example sensors (no real product): O2 in N2 through one capillary bore
// of diameter d and length L, four electrons, stagnant N2 (alpha = 1) unless told.
template <class T>
cf::sensor_model<T, 4> o2_capillary(T diameter_m, T length_m, T flux_ratio = cf::stagnant_flux_ratio<T>,
                                    cf::reading_kind kind = cf::reading_kind::mole_fraction) {
    cf::sensor_model<T, 4> m = cf::make_sensor<T, 4>(&gas("O2"), &gas("N2"), 4u, flux_ratio, T(293.15), T(101325),
                                                     cf::diffusivity_method::fuller, kind);
    m = add(m, cf::make_capillary<T>(diameter_m, length_m));
    REQUIRE(cf::validate(m) == cf::status::ok);
    return m;
}

// CO in air, equimolar (CO + H2O -> CO2 + 2 H+ + 2 e-), 50 bores of 5 um x 0.3 mm:
// transition regime, so the span depends on pressure too.
cf::sensor_model<double, 4> co_sensor() {
    cf::sensor_model<double, 4> m = sensor<double>("CO", "air", 2u, cf::equimolar_flux_ratio<double>);
    m = add(m, cf::make_capillary<double>(5e-6, 0.3e-3, 50u));
    REQUIRE(cf::validate(m) == cf::status::ok);
    return m;
}

// The zero current of the invented sensors: a exp(b (T - T_ref)), b = 0.07 /K.
constexpr double zero_b_per_K = 0.07;
double zero_A(double a_A, double t_K) { return cf::zero_current_A(a_A, zero_b_per_K, 293.15, t_K).value; }

// Linear compensation tables of model m on the 15 x 9 grid, built from span_factor
// (c = 1/s), the zero law and gain = 1/S_ref (reading per A).
struct built_tables {
    double correction[nt * np];
    double zero[nt];
    double gain;
};

template <std::size_t N>
built_tables build(const cf::sensor_model<double, N>& m, double zero_a_A) {
    built_tables b{};
    const cf::uniform_axis<double> at = cf::make_uniform_axis(t_from, t_to, nt);
    const cf::uniform_axis<double> ap = cf::make_uniform_axis(p_from, p_to, np);
    for (std::size_t i = 0; i < nt; ++i) {
        b.zero[i] = zero_A(zero_a_A, cf::axis_node(at, i));
        for (std::size_t j = 0; j < np; ++j) {
            const cf::result<double> s = cf::span_factor(m, cf::axis_node(at, i), cf::axis_node(ap, j));
            REQUIRE(s.ok());
            b.correction[i * np + j] = 1.0 / s.value;
        }
    }
    const cf::result<double> s_ref = cf::sensitivity_A_per_mol_per_mol(m, 293.15, 101325.0);
    REQUIRE(s_ref.ok());
    b.gain = 1.0 / s_ref.value;
    return b;
}

// The largest interpolation errors of a linear compensation, measured on a grid
// ten times finer than the table (every cell centre is on it): relative error of
// the correction, absolute error of the zero current (A), largest correction.
struct measured_error {
    double correction_rel = 0.0;
    double zero_A = 0.0;
    double correction_max = 0.0;
};

template <std::size_t N>
measured_error measure(const cf::sensor_model<double, N>& m, const cf::compensation_ref<double>& c, double zero_a_A) {
    measured_error e;
    const std::size_t ft = (nt - 1) * 10 + 1, fp = (np - 1) * 10 + 1;
    for (std::size_t i = 0; i < ft; ++i) {
        const double t = t_from + (t_to - t_from) * static_cast<double>(i) / static_cast<double>(ft - 1);
        e.zero_A = std::fmax(e.zero_A, std::fabs(cf::zero_current(c, t).value - zero_A(zero_a_A, t)));
        for (std::size_t j = 0; j < fp; ++j) {
            const double p = p_from + (p_to - p_from) * static_cast<double>(j) / static_cast<double>(fp - 1);
            const double exact = 1.0 / cf::span_factor(m, t, p).value;
            const double table = cf::interpolate_2d(c.temperature, c.pressure, c.correction, t, p).value;
            e.correction_rel = std::fmax(e.correction_rel, std::fabs(table / exact - 1.0));
            e.correction_max = std::fmax(e.correction_max, exact);
        }
    }
    return e;
}

// Bilinear interpolation error of a smooth function is, to second order,
// -(1/2)[f_xx h0^2 t(1 - t) + f_yy h1^2 u(1 - u)], largest at the cell centre,
// which the ten-times-finer grid contains; the variation of the second
// derivatives within a cell (third-order terms) is what this margin covers.
constexpr double margin = 1.1;

}  // namespace

// ---------------------------------------------------------------------------
TEST_CASE_TEMPLATE("compensation: h(z) against (1 - exp(-z)) / z in long double", T, float, double) {
    const long double tol = 8.0L * static_cast<long double>(std::numeric_limits<T>::epsilon());
    for (int k = -500; k <= 5000; ++k) {  // z = -5 .. 50 in steps of 0.01
        const T z = static_cast<T>(k) / T(100);
        const cf::result<T> h = cf::shape_function(z);
        const long double ref = h_reference(static_cast<long double>(z));
        INFO("z = " << z);
        CHECK(h.ok());
        CHECK(std::fabs(static_cast<long double>(h.value) / ref - 1.0L) <= tol);
    }
    for (const T z : {T(0), T(1e-12f), T(-1e-12f), T(1e-9f), T(-1e-9f), T(1e-6f), T(-1e-6f), T(1e-5f), T(-1e-5f),
                      T(1.1e-5f), T(-1.1e-5f), T(1e-4f), T(-1e-4f), T(1e-3f), T(-1e-3f)}) {
        const cf::result<T> h = cf::shape_function(z);
        INFO("z = " << z);
        CHECK(h.ok());
        CHECK(std::fabs(static_cast<long double>(h.value) / h_reference(static_cast<long double>(z)) - 1.0L) <= tol);
    }
    // Saturation: below -80 exp(-z) would overflow float; finite, flagged.
    const cf::result<T> low = cf::shape_function(T(-200));
    CHECK(std::isfinite(low.value));
    CHECK(low.code == cf::status::below_range);
    CHECK(low.value == cf::shape_function(T(-80)).value);
    CHECK(cf::shape_function(T(1e30f)).ok());
    CHECK(cf::shape_function(T(1e30f)).value > T(0));
    // Non-finite input: finite value, not_finite.
    for (const T bad : {std::numeric_limits<T>::quiet_NaN(), std::numeric_limits<T>::infinity(),
                        -std::numeric_limits<T>::infinity()}) {
        const cf::result<T> h = cf::shape_function(bad);
        CHECK(std::isfinite(h.value));
        CHECK(cf::has(h.code, cf::status::not_finite));
    }
}

TEST_CASE("compensation: gamma of one capillary is alpha times its molecular share of the resistance") {
    // A 1 um bore: Kn ~ 0.07, Knudsen about a tenth of the resistance (physics.md sec. 2).
    const double conditions[][2] = {{253.15, 70000.0}, {293.15, 101325.0}, {323.15, 110000.0}, {273.15, 85000.0}};
    // Flux ratio 0 (stagnant, alpha = 1) and -2 (alpha = -1: two product molecules per
    // target, physics.md sec. 1), both with the Knudsen share.
    for (const double r : {0.0, -2.0}) {
        const cf::sensor_model<double, 4> m = o2_capillary<double>(1e-6, 0.2e-3, r);
        const double alpha = 1.0 + r;
        for (const auto& tp : conditions) {
            const double t = tp[0], p = tp[1];
            const cf::result<cf::series_transport<double, 4>> st = cf::transport_at(m, t, p);
            REQUIRE(st.ok());
            const cf::element_transport<double>& e = st.value.elements[0];
            const double share = e.inv_molecular_s_m2 / (e.inv_molecular_s_m2 + e.inv_linear_s_m2);
            REQUIRE(share < 0.95);  // the Knudsen part is really there
            REQUIRE(share > 0.5);
            const double full_scale = 0.2095;  // O2 in dry air (physics.md sec. 1)
            const cf::result<double> gamma = cf::curvature_at(m, t, p, full_scale);
            INFO("flux ratio " << r << ", T = " << t << " K, P = " << p << " Pa, share " << share);
            REQUIRE(gamma.ok());
            CHECK(gamma.value == doctest::Approx(alpha * share).epsilon(1e-10));
            // The law with this gamma reproduces the full model's inverse over 0 .. full scale.
            const double s = cf::sensitivity_A_per_mol_per_mol(m, t, p).value;
            for (int k = 0; k <= 40; ++k) {
                const double y = full_scale * k / 40.0;
                const double current = cf::limiting_current_A(m, t, p, y).value;
                const double w = current / s;
                const double law = w * cf::shape_function(gamma.value * w).value;
                const cf::result<double> model = cf::mole_fraction_from_current(m, t, p, current);
                REQUIRE(model.ok());
                CHECK(std::fabs(law - model.value) <= 1e-12 * full_scale);
            }
        }
    }
}

TEST_CASE("compensation: gamma of a partial-pressure sensor is beta / P; equimolar gives exactly 0") {
    const cf::sensor_model<double, 4> m =
        o2_capillary<double>(1e-6, 0.2e-3, 0.0, cf::reading_kind::partial_pressure);
    for (const double p : {70000.0, 101325.0, 110000.0}) {
        const double t = 300.0;
        const cf::element_transport<double> e = cf::transport_at(m, t, p).value.elements[0];
        const double beta = e.inv_molecular_s_m2 / (e.inv_molecular_s_m2 + e.inv_linear_s_m2);
        const cf::result<double> gamma = cf::curvature_at(m, t, p, 0.25);
        REQUIRE(gamma.ok());
        CHECK(gamma.value == doctest::Approx(beta / p).epsilon(1e-10));
        // w = I P / S (the firmware's w with gain P_ref/S_ref and c = 1/s); p_A = w h(gamma w).
        const double s = cf::sensitivity_A_per_mol_per_mol(m, t, p).value;
        for (int k = 1; k <= 20; ++k) {
            const double y = 0.25 * k / 20.0;
            const double current = cf::limiting_current_A(m, t, p, y).value;
            const double w = current * p / s;
            const double law = w * cf::shape_function(gamma.value * w).value;
            const double model = cf::reading_from_current(m, t, p, current).value;
            CHECK(std::fabs(law - model) <= 1e-12 * 0.25 * p);
        }
    }
    // Equimolar counterdiffusion is linear: gamma = 0 exactly.
    const cf::result<double> zero = cf::curvature_at(co_sensor(), 300.0, 90000.0, 1e-3);
    CHECK(zero.ok());
    CHECK(zero.value == 0.0);
    // Inputs outside the domain.
    const cf::sensor_model<double, 4> o2 = o2_capillary<double>(1e-6, 0.2e-3);
    CHECK(cf::has(cf::curvature_at(o2, 300.0, 90000.0, 0.0).code, cf::status::out_of_domain));
    CHECK(cf::has(cf::curvature_at(o2, 300.0, 90000.0, 1.5).code, cf::status::out_of_domain));
    CHECK(cf::has(cf::curvature_at(o2, -1.0, 90000.0, 0.2).code, cf::status::out_of_domain));
    const double nan = std::numeric_limits<double>::quiet_NaN();
    for (const cf::result<double> r : {cf::curvature_at(o2, nan, 90000.0, 0.2), cf::curvature_at(o2, 300.0, nan, 0.2),
                                       cf::curvature_at(o2, 300.0, 90000.0, nan)}) {
        CHECK(std::isfinite(r.value));
        CHECK(cf::has(r.code, cf::status::not_finite));
    }
    // It compiles and works in float too (the tool uses double).
    const cf::result<float> gf = cf::curvature_at(o2_capillary<float>(1e-6f, 0.2e-3f), 293.15f, 101325.0f, 0.2095f);
    CHECK(gf.ok());
    CHECK(static_cast<double>(gf.value) == doctest::Approx(cf::curvature_at(o2, 293.15, 101325.0, 0.2095).value).epsilon(1e-4));
}

// ---------------------------------------------------------------------------
TEST_CASE("compensation: a 15 x 9 linear table reads the full model within its measured error") {
    const cf::sensor_model<double, 4> m = co_sensor();
    const double full_scale = 1e-3;  // 1000 ppm CO
    const double s_ref = cf::sensitivity_A_per_mol_per_mol(m, 293.15, 101325.0).value;
    const double zero_a = 0.01 * s_ref * full_scale;  // a zero current of 1 % of full scale at T_ref
    const built_tables b = build(m, zero_a);
    const cf::compensation<double, nt, np> comp =
        cf::make_compensation<double, nt, np>(t_from, t_to, p_from, p_to, b.correction, b.zero, b.gain);
    const measured_error e = measure(m, comp.ref(), zero_a);
    INFO("correction error " << e.correction_rel << ", zero error " << e.zero_A << " A");
    // The table really has something to carry: the span varies by more than 10 % over the grid.
    CHECK(e.correction_max > 1.1);
    // |delta reading| <= gain c |delta I_0| + y |delta c| / c.
    const double zero_term = b.gain * e.correction_max * e.zero_A;
    std::mt19937 rng(42u);
    std::uniform_real_distribution<double> ut(t_from, t_to), up(p_from, p_to), uy(0.0, full_scale);
    double worst_ratio = 0.0;
    for (int k = 0; k < 2000; ++k) {
        const double t = ut(rng), p = up(rng), y = uy(rng);
        const double signal = zero_A(zero_a, t) + cf::limiting_current_A(m, t, p, y).value;
        const cf::result<double> r = cf::reading(comp, signal, t, p);
        const cf::result<double> model = cf::reading_from_current(m, t, p, signal - zero_A(zero_a, t));
        REQUIRE(r.ok());
        REQUIRE(model.ok());
        const double bound = margin * (zero_term + model.value * e.correction_rel) + 1e-15;
        worst_ratio = std::fmax(worst_ratio, std::fabs(r.value - model.value) / bound);
        CHECK(std::fabs(r.value - model.value) <= bound);
        // span() and zero_current() are the tables' own pieces.
        CHECK(cf::span(comp, t, p).value * cf::interpolate_2d(comp.ref().temperature, comp.ref().pressure,
                                                              comp.correction.values.data(), t, p).value ==
              doctest::Approx(1.0).epsilon(1e-15));
    }
    INFO("worst error / bound " << worst_ratio);
    CHECK(worst_ratio > 0.0);
    // On the nodes the reading is the model's to rounding (no interpolation error there).
    const cf::uniform_axis<double> at = comp.correction.axis0, ap = comp.correction.axis1;
    for (std::size_t i = 0; i < nt; i += 7) {
        for (std::size_t j = 0; j < np; j += 4) {
            const double t = cf::axis_node(at, i), p = cf::axis_node(ap, j);
            const double signal = zero_A(zero_a, t) + cf::limiting_current_A(m, t, p, 0.5 * full_scale).value;
            CHECK(cf::reading(comp, signal, t, p).value == doctest::Approx(0.5 * full_scale).epsilon(1e-12));
        }
    }
    // The same tables in float: the bound plus the rounding of float (a few eps of the reading).
    float cf_[nt * np], zf[nt];
    for (std::size_t i = 0; i < nt * np; ++i) cf_[i] = static_cast<float>(b.correction[i]);
    for (std::size_t i = 0; i < nt; ++i) zf[i] = static_cast<float>(b.zero[i]);
    const cf::compensation<float, nt, np> compf = cf::make_compensation<float, nt, np>(
        253.15f, 323.15f, 70000.0f, 110000.0f, cf_, zf, static_cast<float>(b.gain));
    for (int k = 0; k < 500; ++k) {
        const double t = ut(rng), p = up(rng), y = uy(rng);
        const double signal = zero_A(zero_a, t) + cf::limiting_current_A(m, t, p, y).value;
        const cf::result<float> r =
            cf::reading(compf, static_cast<float>(signal), static_cast<float>(t), static_cast<float>(p));
        const double model = cf::reading_from_current(m, t, p, signal - zero_A(zero_a, t)).value;
        REQUIRE(r.ok());
        const double rounding = 64.0 * static_cast<double>(std::numeric_limits<float>::epsilon()) * full_scale;
        CHECK(std::fabs(static_cast<double>(r.value) - model) <=
              margin * (zero_term + model * e.correction_rel) + rounding);
    }
}

TEST_CASE("compensation: a curved table reads a stagnant-film sensor with a Knudsen share within its bound") {
    // O2 in N2 through one 2 um x 0.3 mm bore: the linearity law itself shifts with
    // T and P through the Knudsen share; full scale 25 % O2.
    const cf::sensor_model<double, 4> m = o2_capillary<double>(2e-6, 0.3e-3);
    const double full_scale = 0.25;
    const double s_ref = cf::sensitivity_A_per_mol_per_mol(m, 293.15, 101325.0).value;
    const double zero_a = 0.002 * s_ref * full_scale;
    const built_tables b = build(m, zero_a);
    constexpr std::size_t nh = 64;
    cf::curved_compensation<double, nt, np, nh> comp{};
    comp.linear = cf::make_compensation<double, nt, np>(t_from, t_to, p_from, p_to, b.correction, b.zero, b.gain);
    comp.curvature.axis0 = comp.linear.correction.axis0;
    comp.curvature.axis1 = comp.linear.correction.axis1;
    double gamma_lo = 1e300, gamma_hi = -1e300;
    for (std::size_t i = 0; i < nt; ++i) {
        for (std::size_t j = 0; j < np; ++j) {
            const cf::result<double> g = cf::curvature_at(m, cf::axis_node(comp.curvature.axis0, i),
                                                         cf::axis_node(comp.curvature.axis1, j), full_scale);
            REQUIRE(g.ok());
            comp.curvature.values[i * np + j] = g.value;
            gamma_lo = std::fmin(gamma_lo, g.value);
            gamma_hi = std::fmax(gamma_hi, g.value);
        }
    }
    CHECK(gamma_hi - gamma_lo > 0.01 * gamma_hi);  // gamma does move over the grid
    // h on z from -0.05 (a signal a little below zero) to 1.5 x the largest z at full scale.
    const double w_max = 1.5 * full_scale / cf::shape_function(gamma_hi * full_scale).value;
    comp.shape.axis = cf::make_uniform_axis(-0.05, gamma_hi * w_max, nh);
    for (std::size_t i = 0; i < nh; ++i) comp.shape.values[i] = cf::shape_function(cf::axis_node(comp.shape.axis, i)).value;
    const cf::compensation_ref<double> c = comp.ref();

    // Measured errors: the linear part and gamma on the (T, P) grid ten times finer,
    // h on its own axis ten times finer.
    const measured_error e = measure(m, c, zero_a);
    double gamma_err = 0.0;
    for (std::size_t i = 0; i <= (nt - 1) * 10; ++i) {
        const double t = t_from + (t_to - t_from) * static_cast<double>(i) / ((nt - 1) * 10.0);
        for (std::size_t j = 0; j <= (np - 1) * 10; ++j) {
            const double p = p_from + (p_to - p_from) * static_cast<double>(j) / ((np - 1) * 10.0);
            const double table = cf::interpolate_2d(c.temperature, c.pressure, c.curvature, t, p).value;
            gamma_err = std::fmax(gamma_err, std::fabs(table - cf::curvature_at(m, t, p, full_scale).value));
        }
    }
    double h_err = 0.0;
    for (std::size_t i = 0; i <= (nh - 1) * 10; ++i) {
        const double z = comp.shape.axis.origin +
                         (cf::axis_node(comp.shape.axis, nh - 1) - comp.shape.axis.origin) * static_cast<double>(i) /
                             ((nh - 1) * 10.0);
        h_err = std::fmax(h_err, std::fabs(comp.shape(z).value - cf::shape_function(z).value));
    }
    INFO("errors: correction " << e.correction_rel << ", zero " << e.zero_A << " A, gamma " << gamma_err << ", h "
                               << h_err);
    // r = w h(g w). To first order, delta r = delta w (h + z h') + w^2 h' delta g + w delta h,
    // where h + z h' = d(z h)/dz = exp(-z) and |h'| <= 1/2 for z >= 0 (h is convex,
    // h'(0) = -1/2); delta w <= gain c_max delta I_0 + w delta c / c.
    const double zero_term = b.gain * e.correction_max * e.zero_A;
    std::mt19937 rng(2718u);
    std::uniform_real_distribution<double> ut(t_from, t_to), up(p_from, p_to), uy(0.0, full_scale);
    for (int k = 0; k < 2000; ++k) {
        const double t = ut(rng), p = up(rng), y = uy(rng);
        const double signal = zero_A(zero_a, t) + cf::limiting_current_A(m, t, p, y).value;
        const cf::result<double> r = cf::reading(comp, signal, t, p);
        const cf::result<double> model = cf::reading_from_current(m, t, p, signal - zero_A(zero_a, t));
        REQUIRE(r.ok());
        REQUIRE(model.ok());
        const double w = (signal - zero_A(zero_a, t)) / cf::sensitivity_A_per_mol_per_mol(m, t, p).value;
        const double dw = zero_term + w * e.correction_rel;
        const double bound = margin * (dw + 0.5 * w * w * gamma_err + w * h_err) + 1e-15;
        INFO("T = " << t << ", P = " << p << ", y = " << y);
        CHECK(std::fabs(r.value - model.value) <= bound);
        // Without the curvature the reading would be off by the non-linearity itself (several %).
        CHECK(std::fabs(r.value - model.value) < 0.2 * std::fabs(cf::reading(comp.linear, signal, t, p).value - model.value) + bound);
    }
    // The proven bound is small against full scale: this grid is fit for a 0.5 % sensor.
    CHECK(zero_term + full_scale * e.correction_rel + 0.5 * full_scale * full_scale * gamma_err + full_scale * h_err <
          0.005 * full_scale);
    // A reading beyond the shape axis clamps and flags; below zero too.
    const double big = zero_A(zero_a, 300.0) + 10.0 * s_ref;
    const cf::result<double> over = cf::reading(comp, big, 300.0, 90000.0);
    CHECK(std::isfinite(over.value));
    CHECK(over.code == cf::status::above_range);
    const cf::result<double> under = cf::reading(comp, zero_A(zero_a, 300.0) - 0.5 * s_ref, 300.0, 90000.0);
    CHECK(std::isfinite(under.value));
    CHECK(under.code == cf::status::below_range);
}

TEST_CASE("compensation: q15 tables read within their quantisation of the float tables") {
    const cf::sensor_model<double, 4> m = co_sensor();
    const double full_scale = 1e-3;
    const double s_ref = cf::sensitivity_A_per_mol_per_mol(m, 293.15, 101325.0).value;
    const double zero_a = 0.01 * s_ref * full_scale;
    const built_tables b = build(m, zero_a);
    const cf::compensation<double, nt, np> comp =
        cf::make_compensation<double, nt, np>(t_from, t_to, p_from, p_to, b.correction, b.zero, b.gain);
    double c_lo = 1e300, c_hi = 0.0, z_lo = 1e300, z_hi = 0.0;
    for (const double v : b.correction) { c_lo = std::fmin(c_lo, v); c_hi = std::fmax(c_hi, v); }
    for (const double v : b.zero) { z_lo = std::fmin(z_lo, v); z_hi = std::fmax(z_hi, v); }
    cf::compensation_q15_ref<double> q{};
    q.temperature = comp.correction.axis0;
    q.pressure = comp.correction.axis1;
    q.correction_scale = cf::q15_scale_for(c_lo, c_hi);
    q.zero_scale = cf::q15_scale_for(z_lo, z_hi);
    q.gain = b.gain;
    std::int16_t qc[nt * np], qz[nt];
    for (std::size_t i = 0; i < nt * np; ++i) qc[i] = cf::q15_encode(b.correction[i], q.correction_scale);
    for (std::size_t i = 0; i < nt; ++i) qz[i] = cf::q15_encode(b.zero[i], q.zero_scale);
    q.correction = qc;
    q.zero = qz;
    // Quantisation, from test_table's derivation: within about 2 counts of the float
    // table in 2-D and 1.2 in 1-D for smooth data; |delta reading| <= gain c dI0 + w dc / c.
    const double lsb_c = q.correction_scale.scale / 32768.0, lsb_z = q.zero_scale.scale / 32768.0;
    std::mt19937 rng(8u);
    std::uniform_real_distribution<double> ut(t_from, t_to), up(p_from, p_to), uy(0.0, full_scale);
    for (int k = 0; k < 1000; ++k) {
        const double t = ut(rng), p = up(rng), y = uy(rng);
        const double signal = zero_A(zero_a, t) + cf::limiting_current_A(m, t, p, y).value;
        const cf::result<double> rf = cf::reading(comp, signal, t, p);
        const cf::result<double> rq = cf::reading(q, signal, t, p);
        REQUIRE(rq.ok());
        const double bound = b.gain * c_hi * 1.2 * lsb_z + rf.value * 2.0 * lsb_c / c_lo + 1e-15;
        CHECK(std::fabs(rq.value - rf.value) <= bound);
        CHECK(cf::span(q, t, p).value == doctest::Approx(cf::span(comp, t, p).value).epsilon(2.0 * lsb_c / c_lo));
        CHECK(std::fabs(cf::zero_current(q, t).value - cf::zero_current(comp, t).value) <= 1.2 * lsb_z);
    }
}

TEST_CASE_TEMPLATE("compensation: out-of-range and non-finite inputs of every function", T, float, double) {
    // A small invented table: c = 1 + 0.001 (T - 250) on 2 x 2 nodes, zero 1e-9 A.. 2e-9 A, gain 1e3 per A.
    const T corr[4] = {T(1), T(1), T(1.08), T(1.08)};
    const T zero[2] = {T(1e-9), T(2e-9)};
    const cf::compensation<T, 2, 2> lin =
        cf::make_compensation<T, 2, 2>(T(250), T(330), T(70000), T(110000), corr, zero, T(1000));
    cf::curved_compensation<T, 2, 2, 3> cur{};
    cur.linear = lin;
    cur.curvature = cf::make_table_2d<T, 2, 2>(T(250), T(330), T(70000), T(110000), {T(0.2), T(0.2), T(0.21), T(0.21)});
    cur.shape = cf::make_table_1d(T(0), T(1), {T(1), cf::shape_function(T(0.5)).value, cf::shape_function(T(1)).value});
    const std::int16_t qc[4] = {0, 0, 1000, 1000}, qz[2] = {-1000, 1000}, qg[4] = {0, 0, 100, 100},
                       qh[3] = {32767, 25000, 20000};
    cf::compensation_q15_ref<T> q{};
    q.temperature = lin.correction.axis0;
    q.pressure = lin.correction.axis1;
    q.shape_axis = cur.shape.axis;
    q.correction = qc;
    q.zero = qz;
    q.curvature = qg;
    q.shape = qh;
    q.correction_scale = cf::q15_scale_for(T(0.9), T(1.2));
    q.zero_scale = cf::q15_scale_for(T(0), T(3e-9));
    q.curvature_scale = cf::q15_scale_for(T(0), T(0.5));
    q.shape_scale = cf::q15_scale_for(T(0), T(1));
    q.gain = T(1000);

    const T nan = std::numeric_limits<T>::quiet_NaN();
    const T inf = std::numeric_limits<T>::infinity();
    const T t_in = T(300), p_in = T(90000), i_in = T(1e-4);
    for (const T bad : {nan, inf, -inf}) {
        INFO("input " << bad);
        const cf::result<T> all[] = {
            cf::span(lin, bad, p_in),     cf::span(lin, t_in, bad),           cf::zero_current(lin, bad),
            cf::reading(lin, bad, t_in, p_in), cf::reading(lin, i_in, bad, p_in), cf::reading(lin, i_in, t_in, bad),
            cf::span(cur, bad, p_in),     cf::span(cur, t_in, bad),           cf::zero_current(cur, bad),
            cf::reading(cur, bad, t_in, p_in), cf::reading(cur, i_in, bad, p_in), cf::reading(cur, i_in, t_in, bad),
            cf::span(q, bad, p_in),       cf::span(q, t_in, bad),             cf::zero_current(q, bad),
            cf::reading(q, bad, t_in, p_in),   cf::reading(q, i_in, bad, p_in),   cf::reading(q, i_in, t_in, bad),
        };
        for (const cf::result<T>& r : all) {
            CHECK(std::isfinite(r.value));
            CHECK(cf::has(r.code, cf::status::not_finite));
        }
    }
    // The fixed-size objects read exactly as their size-erased views, flags included.
    for (const T t : {T(200), T(250), T(290.5), T(330), T(400), nan}) {
        for (const T p : {T(50000), T(70000), T(95000), T(110000), T(200000), inf}) {
            for (const T i : {T(-1), T(0), T(1e-4), T(1), nan, -inf}) {
                const cf::result<T> a = cf::reading(lin, i, t, p), b = cf::reading(lin.ref(), i, t, p);
                const cf::result<T> c = cf::reading(cur, i, t, p), d = cf::reading(cur.ref(), i, t, p);
                CHECK(a.value == b.value);
                CHECK(a.code == b.code);
                CHECK(c.value == d.value);
                CHECK(c.code == d.code);
            }
        }
    }
    // A non-finite signal reads 0 (the zero current is subtracted from itself).
    CHECK(cf::reading(lin, nan, t_in, p_in).value == T(0));
    // Out of range on each axis: the edge value, the axis flag and the generic one.
    const cf::result<T> cold = cf::reading(lin, i_in, T(200), p_in);
    CHECK(cold.code == (cf::status::first_axis_below | cf::status::below_range));
    CHECK(cold.value == cf::reading(lin, i_in, T(250), p_in).value);
    const cf::result<T> hot = cf::zero_current(lin, T(400));
    CHECK(hot.code == (cf::status::first_axis_above | cf::status::above_range));
    CHECK(hot.value == T(2e-9));
    const cf::result<T> thin = cf::span(lin, t_in, T(50000));
    CHECK(thin.code == (cf::status::second_axis_below | cf::status::below_range));
    const cf::result<T> dense = cf::reading(q, i_in, t_in, T(200000));
    CHECK(dense.code == (cf::status::second_axis_above | cf::status::above_range));
    // A reading whose z lies beyond the shape axis: clamped, below_range / above_range.
    CHECK(cf::reading(cur, T(1), t_in, p_in).code == cf::status::above_range);
    CHECK(cf::reading(cur, T(-1), t_in, p_in).code == cf::status::below_range);
    CHECK(cf::reading(q, T(1), t_in, p_in).code == cf::status::above_range);
    // Overflow of a huge finite signal saturates.
    const cf::result<T> huge = cf::reading(lin, std::numeric_limits<T>::max(), t_in, p_in);
    CHECK(std::isfinite(huge.value));
    CHECK(cf::has(huge.code, cf::status::out_of_domain));
    // A view with no data, and a correction that is not positive: refused, never divided by.
    cf::compensation_ref<T> empty = lin.ref();
    empty.correction = nullptr;
    CHECK(cf::reading(empty, i_in, t_in, p_in).code == cf::status::out_of_domain);
    const T bad_corr[4] = {T(0), T(0), T(0), T(0)};
    cf::compensation_ref<T> zeroed = lin.ref();
    zeroed.correction = bad_corr;
    const cf::result<T> s0 = cf::span(zeroed, t_in, p_in);
    CHECK(s0.value == T(1));
    CHECK(s0.code == cf::status::out_of_domain);
}

// ---------------------------------------------------------------------------
// The compact fixed-size object: shared temperature axis, axes as origin and 1/step.
static_assert(sizeof(cf::compensation<float, 15, 9>) == 15 * 9 * 4 + 15 * 4 + 2 * 8 + 4,
              "a float 15 x 9 compensation is its data, two compact axes and the gain");
static_assert(sizeof(cf::compact_axis<float, 15>) == 8, "a compact axis is origin and 1/step");

TEST_CASE_TEMPLATE("compensation: the compact object reads bit for bit as its ref() view, edges and flags too", T,
                   float, double) {
    constexpr std::size_t n0 = 15, n1 = 9;
    T corr[n0 * n1] = {}, zero[n0] = {};
    for (std::size_t i = 0; i < n0; ++i) {
        for (std::size_t j = 0; j < n1; ++j)
            corr[i * n1 + j] = T(1) / (T(1) + T(0.003) * static_cast<T>(i) - T(0.002) * static_cast<T>(j));
        zero[i] = T(1e-9) + T(0.1e-9) * static_cast<T>(i);
    }
    const cf::compensation<T, n0, n1> c =
        cf::make_compensation<T, n0, n1>(T(253.15), T(323.15), T(70000), T(110000), corr, zero, T(1) / T(1.7e-3));
    const cf::compensation_ref<T> r = c.ref();
    // The view's axes: the derived last node is the given end, so it reads exactly the last node.
    CHECK(r.temperature.count == n0);
    CHECK(r.pressure.count == n1);
    CHECK(cf::axis_node(r.temperature, n0 - 1) == T(323.15));
    CHECK(cf::axis_node(r.pressure, n1 - 1) == T(110000));
    CHECK(r.temperature.inv_step == c.correction.axis0.inv_step);
    CHECK(cf::zero_current(c, T(323.15)).value == zero[n0 - 1]);
    CHECK(cf::zero_current(c, T(323.15)).ok());
    const T inf = std::numeric_limits<T>::infinity(), nan = std::numeric_limits<T>::quiet_NaN();
    const T ts[] = {T(200), T(253.15), T(253.2), T(288.7), T(323.1499), T(323.15), T(330), nan, inf, -inf};
    const T ps[] = {T(0), T(70000), T(70001), T(95000), T(109999.99), T(110000), T(2e5), nan, inf, -inf};
    const T is[] = {T(0), T(5e-7), T(-3e-7), T(1e30), nan, inf, -inf, std::numeric_limits<T>::max()};
    for (const T t : ts)
        for (const T p : ps)
            for (const T i : is) {
                const cf::result<T> a = cf::reading(c, i, t, p), b = cf::reading(r, i, t, p);
                CHECK(a.code == b.code);
                CHECK((a.value == b.value || (a.value != a.value && b.value != b.value)));
                CHECK(a.value == a.value);  // never NaN
                CHECK(cf::span(c, t, p).value == cf::span(r, t, p).value);
            }
}

TEST_CASE_TEMPLATE("compensation: the compact object's edge path matches its view ulp by ulp at the grid's ends", T,
                   float, double) {
    constexpr std::size_t n0 = 15, n1 = 9;
    T corr[n0 * n1] = {}, zero[n0] = {};
    for (std::size_t i = 0; i < n0; ++i) {
        for (std::size_t j = 0; j < n1; ++j)
            corr[i * n1 + j] = T(1) / (T(1) + T(0.003) * static_cast<T>(i) - T(0.002) * static_cast<T>(j));
        zero[i] = T(1e-9) + T(0.1e-9) * static_cast<T>(i);
    }
    const cf::compensation<T, n0, n1> c =
        cf::make_compensation<T, n0, n1>(T(253.15), T(323.15), T(70000), T(110000), corr, zero, T(1) / T(1.7e-3));
    const cf::compensation_ref<T> r = c.ref();
    // Walk 48 ulps either side of each end of each axis (the 8-eps band below the
    // last node included), the other input inside and at its ends.
    const T t_ends[] = {T(253.15), T(323.15)}, p_ends[] = {T(70000), T(110000)};
    const T t_other[] = {T(253.15), T(288.7), T(323.15)}, p_other[] = {T(70000), T(95000), T(110000)};
    const auto same = [&](T t, T p) {
        const cf::result<T> a = cf::reading(c, T(5e-7), t, p), b = cf::reading(r, T(5e-7), t, p);
        return a.code == b.code && a.value == b.value;
    };
    int mismatches = 0;
    for (const T end : t_ends)
        for (const T p : p_other) {
            T t = end;
            for (int k = 0; k < 48; ++k) t = std::nextafter(t, T(0));
            for (int k = 0; k <= 96; ++k, t = std::nextafter(t, std::numeric_limits<T>::infinity()))
                if (!same(t, p)) ++mismatches;
        }
    for (const T end : p_ends)
        for (const T t : t_other) {
            T p = end;
            for (int k = 0; k < 48; ++k) p = std::nextafter(p, T(0));
            for (int k = 0; k <= 96; ++k, p = std::nextafter(p, std::numeric_limits<T>::infinity()))
                if (!same(t, p)) ++mismatches;
        }
    CHECK(mismatches == 0);
}

TEST_CASE("compensation: a 3 x 6 float object reads its last pressure node at the requested end") {
    float corr[18] = {}, zero[3] = {};
    for (std::size_t i = 0; i < 18; ++i) corr[i] = 1.0f + 0.01f * static_cast<float>(i);
    for (std::size_t i = 0; i < 3; ++i) zero[i] = 1e-9f * static_cast<float>(i + 1u);
    const cf::compensation<float, 3, 6> c =
        cf::make_compensation<float, 3, 6>(253.15f, 323.15f, 50000.f, 130000.f, corr, zero, 1000.f);
    const float s = 5e-7f;
    const cf::result<float> a = cf::reading(c, s, 253.15f, 130000.0f);
    CHECK(a.code == cf::status::ok);
    CHECK(a.value == (s - zero[0]) * 1000.f * corr[5]);
    const cf::result<float> b = cf::reading(c, s, 323.15f, 130000.0f);
    CHECK(b.code == cf::status::ok);
    CHECK(b.value == (s - zero[2]) * 1000.f * corr[17]);
    const cf::result<float> v = cf::reading(c.ref(), s, 323.15f, 130000.0f);
    CHECK(v.code == b.code);
    CHECK(v.value == b.value);
}

TEST_CASE_TEMPLATE("compensation: random grids read their last nodes exactly, object and view alike", T, float,
                   double) {
    std::mt19937 rng(7331u);
    std::uniform_real_distribution<double> u(0.0, 1.0);
    constexpr std::size_t n0 = 3, n1 = 6;
    T corr[n0 * n1] = {}, zero[n0] = {};
    for (std::size_t i = 0; i < n0 * n1; ++i) corr[i] = T(1) + T(0.01) * static_cast<T>(i);
    for (std::size_t i = 0; i < n0; ++i) zero[i] = T(1e-9) * static_cast<T>(i + 1u);
    const T s = T(5e-7), g = T(1000);
    for (int k = 0; k < 3000; ++k) {
        const T rt_from = static_cast<T>(200.0 + 100.0 * u(rng));
        const T rt_to = static_cast<T>(static_cast<double>(rt_from) + 5.0 + 100.0 * u(rng));
        const T rp_from = static_cast<T>(k % 3 == 0 ? -(1.0 + 1e4 * u(rng)) : 1e4 + 1e5 * u(rng));
        const T rp_to = static_cast<T>(static_cast<double>(rp_from) + 1e3 + 1e5 * u(rng));
        const cf::compensation<T, n0, n1> c =
            cf::make_compensation<T, n0, n1>(rt_from, rt_to, rp_from, rp_to, corr, zero, g);
        CAPTURE(rt_from);
        CAPTURE(rt_to);
        CAPTURE(rp_from);
        CAPTURE(rp_to);
        const cf::result<T> a = cf::reading(c, s, rt_to, rp_to);
        CHECK(a.code == cf::status::ok);
        CHECK(a.value == (s - zero[n0 - 1u]) * g * corr[n0 * n1 - 1u]);
        const cf::result<T> b = cf::reading(c, s, rt_from, rp_to);
        CHECK(b.code == cf::status::ok);
        CHECK(b.value == (s - zero[0]) * g * corr[n1 - 1u]);
        const cf::result<T> ra = cf::reading(c.ref(), s, rt_to, rp_to);
        CHECK(ra.code == a.code);
        CHECK(ra.value == a.value);
    }
}

TEST_CASE_TEMPLATE("compensation: a degenerate or descending grid flags out_of_domain", T, float, double) {
    const T corr[4] = {T(1), T(1), T(1), T(1)}, zero[2] = {T(0), T(0)};
    const cf::compensation<T, 2, 2> flat =
        cf::make_compensation<T, 2, 2>(T(300), T(300), T(70000), T(110000), corr, zero, T(1000));
    const cf::compensation<T, 2, 2> down =
        cf::make_compensation<T, 2, 2>(T(250), T(330), T(110000), T(70000), corr, zero, T(1000));
    for (const T t : {T(250), T(300), T(320)}) {
        CHECK(cf::has(cf::reading(flat, T(1e-6), t, T(90000)).code, cf::status::out_of_domain));
        CHECK(cf::has(cf::reading(flat.ref(), T(1e-6), t, T(90000)).code, cf::status::out_of_domain));
        CHECK(cf::has(cf::reading(down, T(1e-6), t, T(90000)).code, cf::status::out_of_domain));
        CHECK(cf::has(cf::reading(down.ref(), T(1e-6), t, T(90000)).code, cf::status::out_of_domain));
    }
}

TEST_CASE("compensation: the curved view is bounded by NH, not by the shape axis count") {
    const double corr[4] = {1, 1, 1, 1}, zero[2] = {0, 0};
    cf::curved_compensation<double, 2, 2, 3> cur{};
    cur.linear = cf::make_compensation<double, 2, 2>(250, 330, 70000, 110000, corr, zero, 1000);
    cur.curvature = cf::make_table_2d<double, 2, 2>(250, 330, 70000, 110000, {1, 1, 1, 1});
    cur.shape = cf::make_table_1d<double, 3>(0, 1, {1, 0.8, 0.6});
    cur.shape.axis.count = 50;  // a mismatched count must not widen the reads
    CHECK(cur.ref().shape_axis.count == 3u);
    const cf::result<double> r = cf::reading(cur, 1e-2, 300.0, 90000.0);  // gamma w = 10: far above the axis
    CHECK(r.value == 10.0 * 0.6);
    CHECK(cf::has(r.code, cf::status::above_range));
}
