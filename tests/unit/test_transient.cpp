// Step response of the diffusion chain (transient.hpp, docs/models.md "Step
// response"), each check against an analytic or published result:
//   - Crank, The Mathematics of Diffusion, 2nd ed. (1975), ch. 4: a membrane
//     initially empty, a step at x = 0, a sink at x = L: the outflow is
//     I(t)/I_ss = 1 + 2 sum_{n>=1} (-1)^n exp(-n^2 pi^2 D t / L^2), and from it
//     t10, t50, t90 = 0.06611, 0.13879, 0.30352 L^2/D (values of the design
//     contract, physics.md sec. 6; the series itself is summed here as well);
//   - the time lag L^2/(6 D) of the permeated amount (Daynes, Proc. R. Soc. A
//     97, 286, 1920; Crank eq. 4.24a, the equation number from memory);
//   - a flushed volume: first order, tau = V/Q; a lumped volume behind a
//     conductance G D: first order, tau = V/(G D) (a single well-mixed tank);
//   - the slowest decay rate of one layer, pi^2 D / L^2 (the n = 1 term of the
//     series above);
//   - the steady state against the library's own dilute resistance
//     (series.hpp), and the discrete mass balance to 1e-9 in double.
//
// counterflux-test: not-small
// (the solvers here hold 100 to 800 nodes, 10 to 90 KiB each, and the recorders
// use the heap: the M4F test image (1 MiB of stack, heap in the rest of its 4 MiB)
// runs them; the M0+ image (16 KiB of RAM) leaves this file out, and the float
// instantiation is cross-compiled for both by tests/header_checks/instantiate_api.inc.)
#include <doctest/doctest.h>

#include <cmath>
#include <cstddef>
#include <limits>
#include <memory>
#include <vector>

#include <counterflux/counterflux.hpp>

#include "support.hpp"

namespace cf = counterflux;
using namespace counterflux_test;

namespace {

// Crank (1975) ch. 4: the normalised outflow of an initially empty layer at
// tau = D t / L^2 (the series, summed until its terms vanish).
double crank_outflow(double tau) {
    double sum = 1.0;
    for (int n = 1; n <= 400; ++n) {
        const double term = std::exp(-n * n * pi_d * pi_d * tau);
        sum += 2.0 * ((n % 2 == 0) ? term : -term);
        if (term < 1e-18) break;
    }
    return sum;
}

// A time where crank_outflow reaches level, by bisection on the series.
double crank_time(double level) {
    double lo = 1e-3, hi = 2.0;
    for (int i = 0; i < 200; ++i) {
        const double mid = 0.5 * (lo + hi);
        (crank_outflow(mid) < level ? lo : hi) = mid;
    }
    return 0.5 * (lo + hi);
}

// Samples recorded by an observer.
template <class T>
struct recorder {
    std::vector<cf::step_sample<T>> samples;
    void operator()(const cf::step_sample<T>& s) { samples.push_back(s); }
};

template <class T>
cf::transient_chain<T, 4> single_layer(T d, T area, T length, T partition = T(1)) {
    auto c = cf::make_chain<T, 4>();
    REQUIRE(cf::push(c, cf::make_layer(d, area, length, partition)) == cf::status::ok);
    return c;
}

}  // namespace

TEST_CASE("transient: single layer into a perfect sink follows Crank's series at twenty times") {
    // Crank 1975 ch. 4 (membrane initially empty). D = 1e-5 m2/s, L = 1 mm: L^2/D = 0.1 s.
    const double d = 1e-5, l = 1e-3, scale = l * l / d;
    const auto c = single_layer(d, 1e-6, l);
    recorder<double> rec;
    const std::size_t steps = 4000;
    const auto r = cf::step_response<double, 200>(c, 1.0 * scale, steps, rec);
    REQUIRE(r.ok());
    REQUIRE(rec.samples.size() == steps + 1);
    // Twenty times from 0.05 to 1.0 L^2/D (every 200th step).
    int checked = 0;
    for (std::size_t k = 200; k <= steps; k += 200) {
        const auto& s = rec.samples[k];
        const double tau = s.time_s / scale;
        const double exact = crank_outflow(tau);
        CAPTURE(tau);
        CHECK(std::fabs(s.rise - exact) < 2e-4);
        if (exact > 0.05) CHECK(rel_diff(s.rise, exact) < 2e-3);
        // Linearity: the fall from the steady state is the rise mirrored.
        CHECK(std::fabs(s.fall - (1.0 - exact)) < 2e-4);
        ++checked;
    }
    CHECK(checked == 20);
    // t10, t50, t90 = 0.06611, 0.13879, 0.30352 L^2/D (physics.md sec. 6, from
    // Crank's series), to 0.2 %; the bisection of the series agrees with them.
    CHECK(rel_diff(r.value.t10_s / scale, 0.06611) < 2e-3);
    CHECK(rel_diff(r.value.t50_s / scale, 0.13879) < 2e-3);
    CHECK(rel_diff(r.value.t90_s / scale, 0.30352) < 2e-3);
    CHECK(rel_diff(crank_time(0.1), 0.06611) < 1e-4);
    CHECK(rel_diff(crank_time(0.5), 0.13879) < 1e-4);
    CHECK(rel_diff(crank_time(0.9), 0.30352) < 1e-4);
    // Fall t90 (to 10 %) equals the rise t90 for a linear chain.
    CHECK(rel_diff(r.value.fall_t90_s / scale, 0.30352) < 2e-3);
    CHECK(rel_diff(r.value.fall_t10_s / scale, 0.06611) < 2e-3);
    // The steady flow through one layer: D A / L per unit concentration.
    CHECK(rel_diff(r.value.steady_flow_per_conc, d * 1e-6 / l) < 1e-12);
}

TEST_CASE("transient: t90 in float (the Cortex-M4F type) against Crank's value") {
    // Crank 1975 ch. 4 via physics.md sec. 6: t90 = 0.30352 L^2/D.
    const float d = 2e-5f, l = 2e-3f, scale = l * l / d;
    auto c = cf::make_chain<float, 2>();
    REQUIRE(cf::push(c, cf::make_layer(d, 1e-6f, l)) == cf::status::ok);
    const auto r = cf::step_response<float, 64>(c, 1.0f * scale, 1000);
    REQUIRE(r.ok());
    CHECK(static_cast<double>(r.value.t90_s / scale) == doctest::Approx(0.30352).epsilon(2e-3));
    CHECK(static_cast<double>(r.value.t10_s / scale) == doctest::Approx(0.06611).epsilon(2e-3));
    CHECK(static_cast<double>(r.value.max_mass_balance_error) < 1e-4);
}

TEST_CASE("transient: the time lag L^2/(6 D) of a membrane from the integrated flux (Daynes 1920)") {
    // A membrane with partition coefficient 3: the lag does not depend on K
    // (Crank 1975 eq. 4.24a, number from memory). D = 1e-10 m2/s, L = 25 um: L^2/D = 6.25 s.
    const double d = 1e-10, l = 25e-6, scale = l * l / d;
    const auto c = single_layer(d, 1e-4, l, 3.0);
    recorder<double> rec;
    const auto r = cf::step_response<double, 200>(c, 3.0 * scale, 6000, rec);
    REQUIRE(r.ok());
    // At t = 3 L^2/D the transient terms are below exp(-3 pi^2) ~ 1e-13.
    const auto& last = rec.samples.back();
    const double lag = last.time_s - last.rise_consumed / r.value.steady_flow_per_conc;
    CHECK(rel_diff(lag / scale, 1.0 / 6.0) < 2e-3);
    // The steady flow carries the partition coefficient: D K A / L.
    CHECK(rel_diff(r.value.steady_flow_per_conc, d * 3.0 * 1e-4 / l) < 1e-12);
}

TEST_CASE("transient: a flushed volume alone is first order with tau = V/Q") {
    // A single well-mixed tank swept by Q: 1 - exp(-t/tau). The barrier behind
    // it is a fast, thin layer (diffusion time 5e-6 s) whose conductance G D
    // (2e-6 of Q) is included exactly: tau = V / (Q + G D).
    const double v = 1e-6, q = 1e-5;
    const double d = 2e-5, a = 1e-11, l = 1e-5;
    auto c = cf::make_chain<double, 4>();
    REQUIRE(cf::push(c, cf::make_flushed_volume(v, q)) == cf::status::ok);
    REQUIRE(cf::push(c, cf::make_layer(d, a, l)) == cf::status::ok);
    const double tau = v / (q + d * a / l);
    CHECK(rel_diff(tau, v / q) < 1e-5);
    const auto r = cf::step_response<double, 16>(c, 5.0 * tau, 5000);
    REQUIRE(r.ok());
    CHECK(rel_diff(r.value.t10_s, tau * std::log(1.0 / 0.9)) < 2e-3);
    CHECK(rel_diff(r.value.t50_s, tau * std::log(2.0)) < 2e-3);
    CHECK(rel_diff(r.value.t90_s, tau * std::log(10.0)) < 2e-3);
    CHECK(rel_diff(r.value.fall_t90_s, tau * std::log(10.0)) < 2e-3);
    // The slowest mode of the discretised chain is the tank's.
    cf::step_solver<double, 16, 4> solver;
    REQUIRE(solver.setup(c) == cf::status::ok);
    const auto slow = solver.slowest_time_constant_s();
    REQUIRE(slow.ok());
    CHECK(rel_diff(slow.value, tau) < 1e-4);
    // What the part alone would give: ln 10 V / (Q + G D).
    const auto alone = cf::part_t90_s(c, 0);
    REQUIRE(alone.ok());
    CHECK(rel_diff(alone.value, tau * std::log(10.0)) < 1e-12);
}

TEST_CASE("transient: a lumped volume behind a conductance is first order with tau = V/(G D)") {
    // Layer G D = D A / L = 2e-8 m3/s (diffusion time 5e-6 s), cavity 1 mm3,
    // first-order electrode k A = 1e-12 m3/s: tau = V / (G D + k A), which is
    // V/(G D) to 5e-5.
    const double d = 2e-5, a = 1e-8, l = 1e-5, v = 1e-9, k = 1e-4, ae = 1e-8;
    auto c = cf::make_chain<double, 4>();
    REQUIRE(cf::push(c, cf::make_layer(d, a, l)) == cf::status::ok);
    REQUIRE(cf::push(c, cf::make_lumped_volume(v)) == cf::status::ok);
    c.sink_rate_m_s = k;
    c.electrode_area_m2 = ae;
    const double gd = d * a / l;
    const double tau = v / (gd + k * ae);
    CHECK(rel_diff(tau, v / gd) < 1e-4);
    const auto r = cf::step_response<double, 16>(c, 5.0 * tau, 5000);
    REQUIRE(r.ok());
    CHECK(rel_diff(r.value.t50_s, tau * std::log(2.0)) < 2e-3);
    CHECK(rel_diff(r.value.t90_s, tau * std::log(10.0)) < 2e-3);
    CHECK(rel_diff(r.value.t90_s, v / gd * std::log(10.0)) < 2e-3);
    const auto alone = cf::part_t90_s(c, 1);
    REQUIRE(alone.ok());
    CHECK(rel_diff(alone.value, tau * std::log(10.0)) < 1e-12);
    // At a perfect sink the cavity is held at zero and drops out: one layer is left.
    c.sink_rate_m_s = std::numeric_limits<double>::infinity();
    const auto p = cf::step_response<double, 100>(c, 1.0 * l * l / d, 2000);
    REQUIRE(p.ok());
    CHECK(rel_diff(p.value.t90_s / (l * l / d), 0.30352) < 2e-3);
}

TEST_CASE("transient: mass balance of a mixed chain to 1e-9 every step") {
    // Entered = held + consumed is an identity of the discrete scheme; the
    // check is that the bookkeeping and the solves keep it to rounding.
    auto c = cf::make_chain<double, 6>();
    REQUIRE(cf::push(c, cf::make_flushed_volume(0.8e-6, 0.5e-3 / 60.0)) == cf::status::ok);
    REQUIRE(cf::push(c, cf::make_layer(1.5e-10, 2e-5, 25e-6, 0.6)) == cf::status::ok);   // membrane
    REQUIRE(cf::push(c, cf::make_layer(4e-6, 1e-6, 2e-3, 0.4)) == cf::status::ok);       // porous
    REQUIRE(cf::push(c, cf::make_layer(2e-5, 1.8e-8, 1.3e-3)) == cf::status::ok);        // capillary
    REQUIRE(cf::push(c, cf::make_lumped_volume(5e-9)) == cf::status::ok);
    c.sink_rate_m_s = 0.05;
    c.electrode_area_m2 = 3e-5;
    const auto t90 = cf::estimated_t90_s(c);
    REQUIRE(t90.ok());
    recorder<double> rec;
    const auto r = cf::step_response<double, 40>(c, 6.0 * t90.value, 3000, rec);
    REQUIRE(r.ok());
    double worst = 0.0;
    for (const auto& s : rec.samples) worst = std::max(worst, s.mass_balance_error);
    CHECK(worst < 1e-9);
    CHECK(r.value.max_mass_balance_error < 1e-9);
    CHECK(r.value.max_mass_balance_error == worst);
    // The rise ends near 1 and the fall near 0; the signals stay in [0, 1].
    CHECK(r.value.final_rise > 0.999);
    CHECK(r.value.final_fall < 1e-3);
    for (const auto& s : rec.samples) {
        CHECK(s.rise >= -1e-9);
        CHECK(s.rise <= 1.0 + 1e-9);
    }
    // Steady flow against the series of resistances 1/Q + sum L/(D K A) + 1/(k A).
    const auto res = cf::steady_resistance_s_m3(c);
    REQUIRE(res.ok());
    double sum = 60.0 / 0.5e-3 + 1.0 / (0.05 * 3e-5);
    sum += 25e-6 / (1.5e-10 * 0.6 * 2e-5) + 2e-3 / (4e-6 * 0.4 * 1e-6) + 1.3e-3 / (2e-5 * 1.8e-8);
    CHECK(rel_diff(res.value, sum) < 1e-12);
    CHECK(rel_diff(r.value.steady_flow_per_conc, 1.0 / sum) < 1e-10);
}

TEST_CASE("transient: halving the time step and the cell size changes t90 by less than the error estimate") {
    auto c = cf::make_chain<double, 6>();
    REQUIRE(cf::push(c, cf::make_flushed_volume(0.5e-6, 0.2e-3 / 60.0)) == cf::status::ok);
    REQUIRE(cf::push(c, cf::make_layer(1e-10, 1e-5, 20e-6, 0.5)) == cf::status::ok);
    REQUIRE(cf::push(c, cf::make_layer(2e-5, 1e-8, 1e-3)) == cf::status::ok);
    const double scale = cf::estimated_t90_s(c).value;
    for (std::size_t steps : {200u, 400u, 800u}) {
        CAPTURE(steps);
        const auto coarse = cf::step_response_estimate<double, 16>(c, 4.0 * scale, steps);
        const auto finer = cf::step_response<double, 32>(c, 4.0 * scale, 2 * steps);
        REQUIRE(coarse.ok());
        REQUIRE(finer.ok());
        CHECK(coarse.value.t90_error_s > 0.0);
        CHECK(std::fabs(finer.value.t90_s - coarse.value.t90_s) < coarse.value.t90_error_s);
    }
    // And the single layer against Crank's t90: the estimate covers the true error.
    const auto one = single_layer(1e-5, 1e-6, 1e-3);
    const auto e = cf::step_response_estimate<double, 16>(one, 0.1, 100);
    REQUIRE(e.ok());
    CHECK(std::fabs(e.value.t90_s - 0.30352 * 0.1) < e.value.t90_error_s + 0.30352 * 0.1 * 1e-4);
}

TEST_CASE("transient: slowest time constant of one layer is L^2/(pi^2 D); final value predicted from the tail") {
    // The n = 1 term of Crank's series decays as exp(-pi^2 D t / L^2).
    const double d = 1e-5, l = 1e-3, scale = l * l / d;
    const auto c = single_layer(d, 1e-6, l);
    auto solver = std::make_unique<cf::step_solver<double, 200, 4>>();
    REQUIRE(solver->setup(c) == cf::status::ok);
    const auto tau = solver->slowest_time_constant_s();
    REQUIRE(tau.ok());
    const double exact = scale / (pi_d * pi_d);
    CHECK(rel_diff(tau.value, exact) < 1e-4);
    // Firmware use: two samples of the rising signal (Crank's series, scaled
    // to a final value of 250 nA) at 0.5 and 0.6 L^2/D, when the signal is
    // still 0.7 % short, predict the final value.
    const double final_nA = 250.0;
    const double y0 = final_nA * crank_outflow(0.5), y1 = final_nA * crank_outflow(0.6);
    CHECK(y1 < 0.995 * final_nA);
    const auto p = cf::predict_final_value(y0, y1, 0.1 * scale, tau.value);
    REQUIRE(p.ok());
    CHECK(rel_diff(p.value, final_nA) < 1e-6);
    const auto p_exact = cf::predict_final_value(y0, y1, 0.1 * scale, exact);
    CHECK(rel_diff(p_exact.value, final_nA) < 1e-8);
    // Out of domain and non-finite: flagged, finite values.
    CHECK(cf::predict_final_value(y0, y1, 0.0, exact).code == cf::status::out_of_domain);
    CHECK(cf::predict_final_value(y0, y1, 1.0, -1.0).code == cf::status::out_of_domain);
    const auto nan = cf::predict_final_value(std::nan(""), y1, 1.0, 1.0);
    CHECK(nan.code == cf::status::not_finite);
    CHECK(std::isfinite(nan.value));
    const auto tiny = cf::predict_final_value(0.0, 1e300, 1e-300, 1e300);
    CHECK(std::isfinite(tiny.value));
    CHECK_FALSE(tiny.ok());
}

TEST_CASE("transient: the chain of a sensor has the library's steady resistance") {
    // Capillary (Bosanquet with Knudsen), porous disc and membrane: the
    // chain's steady resistance is c times the dilute resistance of series.hpp.
    auto m = sensor<double>("O2", "N2", 4, 0.0);
    m = add(m, cf::make_porous<double>(1.5e-3, 2e-5, 0.4, 2.0, 20e-6));
    m = add(m, cf::make_membrane<double>(25e-6, 2e-5, 1.0e-14, 15e3, 293.15, 1.2e-10));
    m = add(m, cf::make_capillary<double>(5e-6, 0.5e-3));  // Kn ~ 0.01: Knudsen matters
    const double t = 293.15, p = 101325.0;
    const cf::response_setup<double> none{0.0, 0.0, 0.0, std::numeric_limits<double>::infinity(), 0.0};
    const auto chain = cf::chain_from_sensor(m, none, t, p);
    REQUIRE(chain.ok());
    REQUIRE(chain.value.count == 3);
    const auto st = cf::transport_at(m, t, p);
    REQUIRE(st.ok());
    const double c = st.value.total_concentration_mol_m3;
    const double lib = cf::dilute_resistance_s_per_mol(st.value) * c;
    const auto res = cf::steady_resistance_s_m3(chain.value);
    REQUIRE(res.ok());
    CHECK(rel_diff(res.value, lib) < 1e-12);
    // The porous layer holds gas in its pores only: K = porosity.
    CHECK(chain.value.parts[0].partition == 0.4);
    // The membrane's K D equals its permeability times R T (Pi = D S).
    const auto& mem = chain.value.parts[1];
    CHECK(rel_diff(mem.partition * mem.diffusivity_m2_s, 1.0e-14 * r_exact * t) < 1e-9);
    // The simulated steady current agrees: n F times the flow at 1 mol/mol.
    const auto r = cf::step_response<double, 20>(chain.value, 10.0, 100);
    REQUIRE(cf::has(r.code, cf::status::out_of_domain) == false);
    const double current = 4.0 * f_exact * r.value.steady_flow_per_conc * c;  // y = 1, dilute-linear
    const auto s = cf::sensitivity_A_per_mol_per_mol(m, t, p);
    REQUIRE(s.ok());
    CHECK(rel_diff(current, s.value) < 1e-9);

    // With a front volume, a cavity and a first-order electrode: the extra
    // resistances 1/Q and 1/(k A_e) add, the cavity adds none.
    const cf::response_setup<double> full{0.8e-6, 0.5e-3 / 60.0, 5e-9, 0.02, 1e-5};
    const auto chain2 = cf::chain_from_sensor(m, full, t, p);
    REQUIRE(chain2.ok());
    REQUIRE(chain2.value.count == 5);
    CHECK(chain2.value.parts[0].kind == cf::chain_part_kind::flushed_volume);
    CHECK(chain2.value.parts[4].kind == cf::chain_part_kind::lumped_volume);
    CHECK(rel_diff(cf::steady_resistance_s_m3(chain2.value).value, lib + 60.0 / 0.5e-3 + 1.0 / (0.02 * 1e-5)) <
          1e-12);
    // A membrane without a diffusivity cannot be simulated: flagged, its index + 1 in count.
    auto m2 = sensor<double>("O2", "N2", 4, 0.0);
    m2 = add(m2, cf::make_capillary<double>(0.1e-3, 1e-3));
    m2 = add(m2, cf::make_membrane<double>(25e-6, 2e-5, 1.0e-14, 0.0, 293.15));
    const auto bad = cf::chain_from_sensor(m2, none, t, p);
    CHECK(cf::has(bad.code, cf::status::out_of_domain));
    CHECK(bad.value.count == 2);
}

TEST_CASE("transient: non-finite and out-of-domain inputs are flagged, never NaN") {
    const double nan = std::nan("");
    const double inf = std::numeric_limits<double>::infinity();
    const auto finite_times = [](const cf::step_times<double>& t) {
        return std::isfinite(t.t10_s) && std::isfinite(t.t50_s) && std::isfinite(t.t90_s) &&
               std::isfinite(t.fall_t90_s) && std::isfinite(t.steady_flow_per_conc) &&
               std::isfinite(t.max_mass_balance_error);
    };
    for (const auto& part : {cf::make_layer(nan, 1e-6, 1e-3), cf::make_layer(1e-5, -1e-6, 1e-3),
                             cf::make_layer(1e-5, 1e-6, inf), cf::make_layer(1e-5, 1e-6, 1e-3, 0.0)}) {
        auto c = cf::make_chain<double, 2>();
        REQUIRE(cf::push(c, part) == cf::status::ok);
        const auto r = cf::step_response<double, 8>(c, 1.0, 10);
        CHECK_FALSE(r.ok());
        CHECK(finite_times(r.value));
        CHECK(std::isfinite(cf::steady_resistance_s_m3(c).value));
        CHECK(std::isfinite(cf::estimated_t90_s(c).value));
    }
    const auto good = single_layer(1e-5, 1e-6, 1e-3);
    for (double duration : {nan, -1.0, 0.0, inf}) {
        const auto r = cf::step_response<double, 8>(good, duration, 10);
        CHECK_FALSE(r.ok());
        CHECK(finite_times(r.value));
    }
    CHECK(cf::step_response<double, 8>(good, 1.0, 0).code == cf::status::out_of_domain);
    // Too short a run: t90 not reached, flagged above_range and set to the duration.
    const auto short_run = cf::step_response<double, 8>(good, 0.01, 10);
    CHECK(cf::has(short_run.code, cf::status::above_range));
    CHECK(short_run.value.t90_s == 0.01);
    // Chains that make no sense: two volumes side by side, a lumped volume
    // facing the sample, a closed end (rate 0), a flushed volume straight into
    // a perfect sink, an empty chain.
    auto two = cf::make_chain<double, 4>();
    cf::push(two, cf::make_flushed_volume(1e-6, 1e-5));
    cf::push(two, cf::make_lumped_volume(1e-6));
    cf::push(two, cf::make_layer(1e-5, 1e-6, 1e-3));
    CHECK(cf::validate(two) == cf::status::out_of_domain);
    auto front = cf::make_chain<double, 4>();
    cf::push(front, cf::make_lumped_volume(1e-6));
    cf::push(front, cf::make_layer(1e-5, 1e-6, 1e-3));
    CHECK(cf::validate(front) == cf::status::out_of_domain);
    auto closed = single_layer(1e-5, 1e-6, 1e-3);
    closed.sink_rate_m_s = 0.0;
    closed.electrode_area_m2 = 1e-6;
    CHECK(cf::validate(closed) == cf::status::out_of_domain);
    closed.sink_rate_m_s = nan;
    CHECK(cf::validate(closed) == cf::status::not_finite);
    auto flush_only = cf::make_chain<double, 4>();
    cf::push(flush_only, cf::make_flushed_volume(1e-6, 1e-5));
    CHECK(cf::validate(flush_only) == cf::status::out_of_domain);
    CHECK(cf::validate(cf::make_chain<double, 4>()) == cf::status::out_of_domain);
    // A full chain refuses one more part.
    auto full = cf::make_chain<double, 1>();
    CHECK(cf::push(full, cf::make_layer(1e-5, 1e-6, 1e-3)) == cf::status::ok);
    CHECK(cf::push(full, cf::make_layer(1e-5, 1e-6, 1e-3)) == cf::status::out_of_domain);
    // Extreme but valid values stay finite: a huge partition and a tiny area.
    const auto extreme = single_layer(1e-5, 1e-30, 1e-3, 1e30);
    const auto r = cf::step_response<double, 8>(extreme, 0.5, 100);
    CHECK(finite_times(r.value));
}
