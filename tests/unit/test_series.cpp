// Barrier elements in series (docs/models.md sec. 4): flux continuity, added
// resistances, the interface profile, the inverse current -> concentration
// and its round trips, and a sweep of every public function with extreme
// inputs that must never give NaN or infinity.
#include <doctest/doctest.h>

#include <cmath>
#include <cstddef>
#include <cstdint>
#include <limits>
#include <sstream>
#include <string>

#include <counterflux/counterflux.hpp>

#include "support.hpp"

namespace cf = counterflux;
using namespace counterflux_test;

namespace {

template <class T>
cf::series_transport<T, 4> transport(const cf::sensor_model<T, 4>& m, T t, T p) {
    const auto st = cf::transport_at(m, t, p);
    REQUIRE(st.ok());
    return st.value;
}

// Log-spaced points from lo to hi, n of them, ends included.
template <class T>
T log_point(T lo, T hi, int i, int n) {
    return lo * std::pow(hi / lo, static_cast<T>(i) / static_cast<T>(n - 1));
}

}  // namespace

// ---------------------------------------------------------------------------
// Two identical elements in series carry half the flow of one.
// Equimolar: every element is linear in y, so the resistances add and two
// equal ones halve the flow, exactly. Stagnant film: in the dilute limit the
// elements are linear too (checked at y = 1e-6 to 1e-6); but for identical
// elements the half also holds at any y, because the integrated law
// N L / c = (1/(alpha r_m)) ln[q(y_in)/q(y_out)] is additive in L: two equal
// elements are one element of twice the length (Bird, Stewart & Lightfoot,
// 2nd ed., sec. 18.2, the film solution for length 2 L). That is checked too.
TEST_CASE("series: two identical capillaries carry half the flow of one") {
    const cf::barrier<double> cap =
        cf::make_capillary(0.1e-3, 1.0e-3);  // Knudsen and end corrections on
    const double t = 300.0, p = 100000.0;
    {
        const auto one =
            cf::sensor_model<double, 4>(add(sensor<double>("CO", "air", 2u, -1.0), cap));
        const auto two = add(one, cap);
        const auto st1 = transport(one, t, p);
        const auto st2 = transport(two, t, p);
        const double fractions[] = {1.0e-6, 1.0e-3, 0.1, 0.5, 1.0};
        for (const double y : fractions) {
            INFO("equimolar, y = " << y);
            const cf::result<double> f1 = cf::molar_flow(st1, y);
            const cf::result<double> f2 = cf::molar_flow(st2, y);
            REQUIRE(f1.ok());
            REQUIRE(f2.ok());
            CHECK(rel_diff(f2.value, f1.value / 2.0) <= 1e-12);
        }
    }
    {
        const auto one = cf::sensor_model<double, 4>(add(sensor<double>("O2", "N2", 4u, 0.0), cap));
        const auto two = add(one, cap);
        const auto st1 = transport(one, t, p);
        const auto st2 = transport(two, t, p);
        const cf::result<double> f1 = cf::molar_flow(st1, 1.0e-6);
        const cf::result<double> f2 = cf::molar_flow(st2, 1.0e-6);
        REQUIRE(f1.ok());
        REQUIRE(f2.ok());
        CHECK(rel_diff(f2.value, f1.value / 2.0) <= 1e-6);
        const double fractions[] = {0.2095, 0.5, 0.9};
        for (const double y : fractions) {
            INFO("stagnant, y = " << y);
            const cf::result<double> g1 = cf::molar_flow(st1, y);
            const cf::result<double> g2 = cf::molar_flow(st2, y);
            REQUIRE(g1.ok());
            REQUIRE(g2.ok());
            CHECK(rel_diff(g2.value, g1.value / 2.0) <= 1e-9);
            // ... while the flow is far from linear in y.
            CHECK(g1.value / (cf::molar_flow(st1, 1.0e-6).value * y / 1.0e-6) > 1.1);
        }
    }
}

// ---------------------------------------------------------------------------
// Linear elements in series add their resistances (docs/models.md sec. 4):
// F = y / sum_i R_i with, in s/mol (mole-fraction drop per mol/s),
//   membrane   R = delta / (Pi A P)                 (N = Pi p / delta, p = y P)
//   porous     R = L tau / (eps A c) (1/D + 1/D_K)  (D_eff = eps D / tau, Bosanquet)
//   capillary  R = (L + pi d/4) / (c A D) + L / (c A D_K),  A = pi d^2 / 4
// all at alpha = 0 (equimolar), where the molecular part is linear too.
TEST_CASE("series: membrane + porous + capillary at alpha = 0 is 1 / sum of resistances") {
    const double delta = 25.0e-6, a_m = 1.0e-5, perm = 5.0e-13, e_act = 20000.0;
    const double l_p = 0.5e-3, a_p = 1.0e-7, eps = 0.4, tau = 2.0, d_pore = 2.0e-6;
    const double d_c = 0.2e-3, l_c = 2.0e-3;
    const double t_ref = 293.15, p_ref = 101325.0, d_ref = 2.0e-5, m_exp = 1.75;
    const double m_co = static_cast<double>(28.010f) * 1.0e-3;  // kg/mol, IUPAC C 12.011 + O 15.999, as the float table holds it

    cf::sensor_model<double, 4> m = sensor<double>("CO", "air", 2u, -1.0);
    m.diffusivity = cf::diffusivity_model<double>{
        cf::diffusivity_method::measured, m.target, m.background, d_ref, t_ref, p_ref, m_exp};
    m = add(m, cf::make_membrane(delta, a_m, perm, e_act, t_ref));
    m = add(m, cf::make_porous(l_p, a_p, eps, tau, d_pore));
    m = add(m, cf::make_capillary(d_c, l_c));
    REQUIRE(cf::validate(m) == cf::status::ok);

    const double conditions[][2] = {{293.15, 101325.0}, {310.0, 90000.0}, {253.15, 105000.0}};
    for (const auto& tp : conditions) {
        const double t = tp[0], p = tp[1];
        INFO(t << " K, " << p << " Pa");
        const double c = p / (r_exact * t);
        const double d = d_ref * std::pow(t / t_ref, m_exp) * (p_ref / p);
        const double mean_speed = std::sqrt(8.0 * r_exact * t / (pi_d * m_co));
        const double perm_t = perm * std::exp(-(e_act / r_exact) * (1.0 / t - 1.0 / t_ref));
        const double r_membrane = delta / (perm_t * a_m * p);
        const double r_porous =
            l_p * tau / (eps * a_p * c) * (1.0 / d + 1.0 / (d_pore / 3.0 * mean_speed));
        const double a_c = pi_d * d_c * d_c / 4.0;
        const double r_capillary =
            (l_c + pi_d * d_c / 4.0) / (c * a_c * d) + l_c / (c * a_c * (d_c / 3.0 * mean_speed));
        const double r_total = r_membrane + r_porous + r_capillary;
        // The three resistances are of one order, so each one matters.
        CHECK(r_membrane / r_total > 0.05);
        CHECK(r_porous / r_total > 0.05);
        CHECK(r_capillary / r_total > 0.05);

        const auto st = transport(m, t, p);
        CHECK(rel_diff(cf::dilute_resistance_s_per_mol(st), r_total) <= 1e-12);
        const double fractions[] = {1.0e-6, 1.0e-2, 0.5, 1.0};
        for (const double y : fractions) {
            INFO("y = " << y);
            const cf::result<double> f = cf::molar_flow(st, y);
            REQUIRE(f.ok());
            CHECK(rel_diff(f.value, y / r_total) <= 1e-12);
            const cf::result<double> i = cf::limiting_current_A(m, t, p, y);
            REQUIRE(i.ok());
            CHECK(rel_diff(i.value, 2.0 * f_exact * y / r_total) <= 1e-12);
        }
        const cf::result<double> s = cf::sensitivity_A_per_mol_per_mol(m, t, p);
        REQUIRE(s.ok());
        CHECK(rel_diff(s.value, 2.0 * f_exact / r_total) <= 1e-12);
        // The element reports' shares are R_i / R_total.
        const auto rep = cf::element_reports(m, t, p);
        REQUIRE(rep.ok());
        CHECK(std::fabs(rep.value.elements[0].resistance_share - r_membrane / r_total) <= 1e-12);
        CHECK(std::fabs(rep.value.elements[1].resistance_share - r_porous / r_total) <= 1e-12);
        CHECK(std::fabs(rep.value.elements[2].resistance_share - r_capillary / r_total) <= 1e-12);
    }
}

// ---------------------------------------------------------------------------
TEST_CASE_TEMPLATE("series: molar_flow of one element is element_flux times its area", T, float,
                   double) {
    const cf::element_transport<T> e{T(7.0e-9), T(1.3e-3), T(1) / T(2.0e-5), T(1) / T(1.2e-4),
                                     T(0.01)};
    const T c = T(101325) / (T(8.314462618) * T(298.15));
    const T alphas[] = {T(-1), T(0), T(0.5), T(1)};
    const T pairs[][2] = {{T(1.0e-6), T(0)}, {T(0.2095), T(0)}, {T(0.9), T(0.1)}, {T(0.1), T(0.4)}};
    for (const T alpha : alphas) {
        cf::series_transport<T, 3> st{};
        st.elements[0] = e;
        st.count = 1;
        st.total_concentration_mol_m3 = c;
        st.alpha = alpha;
        for (const auto& y : pairs) {
            INFO("alpha " << alpha << " y " << y[0] << " -> " << y[1]);
            const cf::result<T> n = cf::element_flux(e, c, alpha, y[0], y[1]);
            const cf::result<T> f = cf::molar_flow(st, y[0], y[1]);
            REQUIRE(n.ok());
            REQUIRE(f.ok());
            CHECK(rel_diff(f.value, n.value * e.area_m2) <= pick<T>(1e-15, 1e-7f));
            // The dusty-gas closed form, beta = 1 + D_AB/D_K (Mason & Malinauskas 1983;
            // docs/models.md sec. 1), in double.
            if (alpha != T(0)) {
                const double rm = static_cast<double>(e.inv_molecular_s_m2);
                const double rl = static_cast<double>(e.inv_linear_s_m2);
                const double beta = 1.0 + rl / rm;
                const double ad = static_cast<double>(alpha);
                const double closed = static_cast<double>(c) /
                                      (ad * rm * static_cast<double>(e.length_m)) *
                                      std::log((beta - ad * static_cast<double>(y[1])) /
                                               (beta - ad * static_cast<double>(y[0]))) *
                                      static_cast<double>(e.area_m2);
                CHECK(std::fabs(static_cast<double>(f.value) / closed - 1.0) <=
                      static_cast<double>(pick<T>(1e-9, 1e-5f)));
            }
        }
    }
}

// ---------------------------------------------------------------------------
TEST_CASE_TEMPLATE(
    "series: profile_for_flow is monotone and carries the same flow through every element", T,
    float, double) {
    cf::sensor_model<T, 4> m = sensor<T>("O2", "N2", 4u, cf::stagnant_flux_ratio<T>);
    m = add(m, cf::make_porous(T(0.3e-3), T(2.0e-6), T(0.45), T(1.8), T(5.0e-6)));
    m = add(m, cf::make_membrane(T(12.0e-6), T(2.0e-6), T(3.0e-13), T(18000), T(293.15)));
    m = add(m, cf::make_capillary(T(60.0e-6), T(0.8e-3), 2u));
    const auto st = transport(m, T(300), T(95000));
    const T fractions[] = {T(1.0e-6), T(0.01), T(0.2095), T(0.6), T(0.95)};
    for (const T y : fractions) {
        INFO("y outside = " << y);
        const cf::result<T> f = cf::molar_flow(st, y);
        REQUIRE(f.ok());
        REQUIRE(f.value > T(0));
        const cf::series_profile<T, 4> prof = cf::profile_for_flow(st, f.value);
        REQUIRE(prof.code == cf::status::ok);
        CHECK(prof.fractions[st.count] == T(0));
        CHECK(rel_diff(prof.fractions[0], y) <= pick<T>(1e-12, 2e-6f));
        for (std::size_t i = 0; i < st.count; ++i) {
            CHECK(prof.fractions[i] > prof.fractions[i + 1]);
            // Flux continuity: element i carries F between its two faces.
            const cf::element_transport<T>& e = st.elements[i];
            const cf::result<T> n = cf::element_flux(e, st.total_concentration_mol_m3, st.alpha,
                                                     prof.fractions[i], prof.fractions[i + 1]);
            REQUIRE(n.ok());
            // The flux recomputed from two float fractions close to each other
            // carries eps / (relative drop across the element): up to ~1e-4 here.
            CHECK(rel_diff(n.value * e.area_m2, f.value) <= pick<T>(1e-9, 1e-3f));
        }
        CHECK(cf::outer_fraction_for_flow(st, f.value).value == prof.fractions[0]);
    }
    // More flow, higher outer fraction (the march is monotone in F).
    T last = T(0);
    for (int k = 1; k <= 20; ++k) {
        const T f = cf::molar_flow(st, T(0.95)).value * static_cast<T>(k) / T(20);
        const cf::result<T> y0 = cf::outer_fraction_for_flow(st, f);
        REQUIRE(y0.ok());
        CHECK(y0.value > last);
        last = y0.value;
    }
}

// ---------------------------------------------------------------------------
// Round trips of the inverse in float, 40 log-spaced points:
//   current -> concentration -> current and concentration -> current ->
//   concentration, for a dust filter (porous) + capillary.
// Equimolar (alpha = 0) and r = -2 (alpha = -1): q = r_m (1 - alpha y) + r_l
// stays >= r_m + r_l over 0 .. 1, so the law is regular up to pure target gas
// and the range is 1 ppm .. 100 %.
// Stagnant film (alpha = 1): without Knudsen resistance q(1) = 0 and the flux
// at y -> 1 is infinite (ln(1/(1 - y))), the inverse ill-conditioned; with the
// Knudsen resistance on, q(1) = r_l > 0 and the flux stays finite, so the
// stagnant cell is tested with Knudsen on, over 1 ppm .. 99 %.
namespace {

struct round_trip_worst {
    float current = 0.0f;
    float fraction = 0.0f;
};

round_trip_worst round_trips(const cf::sensor_model<float, 4>& m, float y_lo, float y_hi) {
    const float t = 300.0f, p = 98000.0f;
    const int n = 40;
    round_trip_worst worst;
    // concentration -> current -> concentration
    for (int i = 0; i < n; ++i) {
        const float y = log_point(y_lo, y_hi, i, n);
        const cf::result<float> cur = cf::limiting_current_A(m, t, p, y);
        REQUIRE(cur.ok());
        const cf::result<float> back = cf::mole_fraction_from_current(m, t, p, cur.value);
        INFO("y = " << y << " I = " << cur.value << " y' = " << back.value);
        // y = 1 may come back as 1 + ulp and be clamped: above_range is the
        // only flag allowed, and only there.
        if (y < 1.0f) {
            REQUIRE(back.ok());
        } else {
            CHECK((back.ok() || back.code == cf::status::above_range));
        }
        const float e = std::fabs(back.value / y - 1.0f);
        if (e > worst.fraction) worst.fraction = e;
    }
    // current -> concentration -> current, currents log-spaced between those
    // of y_lo and y_hi
    const float i_lo = cf::limiting_current_A(m, t, p, y_lo).value;
    const float i_hi = cf::limiting_current_A(m, t, p, y_hi).value;
    for (int i = 0; i < n; ++i) {
        float cur = log_point(i_lo, i_hi, i, n);
        if (i == n - 1) cur = i_hi;
        const cf::result<float> y = cf::mole_fraction_from_current(m, t, p, cur);
        INFO("I = " << cur << " y = " << y.value);
        if (y_hi < 1.0f || i < n - 1) {
            REQUIRE(y.ok());
        } else {
            CHECK((y.ok() || y.code == cf::status::above_range));
        }
        const cf::result<float> back = cf::limiting_current_A(m, t, p, y.value);
        REQUIRE(back.ok());
        const float e = std::fabs(back.value / cur - 1.0f);
        if (e > worst.current) worst.current = e;
    }
    return worst;
}

// Both round trips of m from 1 ppm to y_hi, each within a relative error of 1e-6.
void check_round_trips(const cf::sensor_model<float, 4>& m, float y_hi) {
    const float tol = 1.0e-6f;
    const round_trip_worst w = round_trips(m, 1.0e-6f, y_hi);
    MESSAGE("worst relative error: fraction " << w.fraction << ", current " << w.current);
    CHECK(w.fraction <= tol);
    CHECK(w.current <= tol);
}

}  // namespace

TEST_CASE("series: float round trips current <-> concentration, dust filter + capillary") {
    const cf::barrier<float> dust = cf::make_porous(1.0e-3f, 2.0e-5f, 0.5f, 1.5f, 20.0e-6f);
    const cf::barrier<float> cap = cf::make_capillary(0.1e-3f, 1.5e-3f);
    SUBCASE("equimolar CO in air") {
        check_round_trips(add(add(sensor<float>("CO", "air", 2u, cf::equimolar_flux_ratio<float>), dust), cap),
                          1.0f);
    }
    SUBCASE("r = -2 (alpha = -1)") {
        check_round_trips(add(add(sensor<float>("CO", "air", 2u, -2.0f), dust), cap), 1.0f);
    }
    SUBCASE("stagnant O2 in N2, Knudsen on") {
        check_round_trips(add(add(sensor<float>("O2", "N2", 4u, cf::stagnant_flux_ratio<float>), dust), cap),
                          0.99f);
    }
}

// ---------------------------------------------------------------------------
// Never NaN, never inf: every public function that returns a result, fed
// finite inputs, returns a finite value (with whatever status it sets). The
// plain constexpr geometry helpers (barrier_area_m2, effective_length_m,
// dilute_resistance_s_per_mol) are arithmetic on their inputs; resolve() and
// the signal functions check what they give. Two sweeps:
//   - an extreme grid (+-1e300 and 1e-300 in double, +-1e30 and 1e-30 in
//     float, zero, negatives): the value must be finite too; an overflow
//     (T = 1e300 K, P = 1e-300 Pa) is saturated to +-max and flagged.
//   - a moderate grid (magnitudes 1e-9 .. 1e6, zero, negatives): the value
//     must be finite.
// Combinations of many arguments are drawn from the grid by a fixed linear
// congruential sequence, so the sweep is deterministic.
namespace {

// Knuth's MMIX linear congruential generator (TAOCP vol. 2, 3rd ed., sec. 3.3.4).
struct lcg {
    std::uint64_t state;
    std::size_t next(std::size_t n) {
        state = state * 6364136223846793005ull + 1442695040888963407ull;
        return static_cast<std::size_t>((state >> 33) % n);
    }
};

template <class T>
struct value_grid {
    const T* values;
    std::size_t size;
    bool finite_required;  // false: only NaN is an error
    T draw(lcg& g) const { return values[g.next(size)]; }
};

template <class T>
constexpr T extreme_values[] = {-pick<T>(1e300, 1e30f),
                                T(-1.0e6),
                                T(-1),
                                T(-0.5),
                                -pick<T>(1e-300, 1e-30f),
                                T(0),
                                pick<T>(1e-300, 1e-30f),
                                T(1.0e-9),
                                T(1.0e-6),
                                T(1.0e-3),
                                T(0.2095),
                                T(0.5),
                                T(1),
                                T(2),
                                T(300),
                                T(1.0e5),
                                T(1.0e6),
                                pick<T>(1e300, 1e30f)};
template <class T>
constexpr T moderate_values[] = {T(-1.0e6), T(-1),  T(-0.5), T(0), T(1.0e-9), T(1.0e-6), T(1.0e-3),
                                 T(0.2095), T(0.5), T(1),    T(2), T(300),    T(1.0e5),  T(1.0e6)};

template <class... A>
std::string text(const A&... a) {
    std::ostringstream os;
    os.precision(9);
    ((os << a << ' '), ...);
    return os.str();
}

// Counts bad values and keeps the first offending inputs' text.
struct checker {
    checker(const char* name, bool finite_required) : function(name), finite(finite_required) {}
    std::string function;
    bool finite;
    long checked = 0;
    long bad = 0;
    std::string first;
    // describe() gives the inputs' text; it is only called for a bad value.
    template <class T, class F>
    void check(T value, const F& describe) {
        ++checked;
        const bool is_bad = finite ? !std::isfinite(value) : std::isnan(value);
        if (is_bad) {
            if (bad < 4) first += "\n    " + describe() + " -> " + text(value);
            ++bad;
        }
    }
    ~checker() {
        const std::string what = finite ? ": non-finite " : ": NaN ";
        INFO(function << what << bad << " of " << checked << "; first at" << first);
        CHECK(bad == 0);
        CHECK(checked > 0);
    }
    checker(const checker&) = delete;
    checker& operator=(const checker&) = delete;
};

template <class T>
cf::barrier<T> draw_barrier(const value_grid<T>& v, lcg& g) {
    switch (g.next(3)) {
        case 0:
            return cf::make_capillary(v.draw(g), v.draw(g), static_cast<unsigned>(g.next(3)),
                                      g.next(2) == 0, g.next(2) == 0);
        case 1:
            return cf::make_porous(v.draw(g), v.draw(g), v.draw(g), v.draw(g), v.draw(g),
                                   g.next(2) == 0);
        default:
            return cf::make_membrane(v.draw(g), v.draw(g), v.draw(g), v.draw(g), v.draw(g),
                                     v.draw(g));
    }
}

template <class T>
std::string barrier_text(const cf::barrier<T>& b) {
    return text(cf::kind_name(b.kind), b.diameter_m, b.length_m, b.area_m2, b.count, b.porosity,
                b.tortuosity, b.pore_diameter_m, b.permeability_mol_m_s_Pa,
                b.activation_energy_J_mol, b.permeability_temperature_K,
                b.membrane_diffusivity_m2_s);
}

template <class T>
std::string element_text(const cf::element_transport<T>& e) {
    return text(e.area_m2, e.length_m, e.inv_molecular_s_m2, e.inv_linear_s_m2);
}

template <class T>
void sweep(const value_grid<T>& v) {
    const bool fin = v.finite_required;
    const cf::gas_data& co = gas("CO");
    const cf::gas_data& air = gas("air");
    const std::size_t n = v.size;
    const T* x = v.values;

    // Functions of up to three numbers: the full grid.
    {
        checker fuller("fuller_diffusivity", fin), ce("chapman_enskog_diffusivity", fin),
            knud("knudsen_diffusivity", fin), mfp("mean_free_path", fin), kn("knudsen_number", fin),
            sat("saturation_pressure_Pa", fin), alt("standard_pressure_at_altitude_Pa", fin),
            neu("neufeld_collision_integral", fin), bos("bosanquet_diffusivity", fin), c2k("celsius_to_kelvin", fin);
        for (std::size_t i = 0; i < n; ++i) {
            sat.check(cf::saturation_pressure_Pa(x[i]).value, [&] { return text(x[i]); });
            alt.check(cf::standard_pressure_at_altitude_Pa(x[i]).value, [&] { return text(x[i]); });
            c2k.check(cf::celsius_to_kelvin(x[i]) + cf::kelvin_to_celsius(x[i]),
                      [&] { return text(x[i]); });
            neu.check(cf::neufeld_collision_integral(x[i]).value, [&] { return text(x[i]); });
            bos.check(cf::bosanquet_diffusivity(x[i], x[(i + 3) % n]).value, [&] { return text(x[i]); });
            for (std::size_t j = 0; j < n; ++j) {
                fuller.check(cf::fuller_diffusivity(co, air, x[i], x[j]).value,
                             [&] { return text(x[i], x[j]); });
                ce.check(cf::chapman_enskog_diffusivity(co, air, x[i], x[j]).value,
                         [&] { return text(x[i], x[j]); });
                kn.check(cf::knudsen_number(x[i], x[j]).value, [&] { return text(x[i], x[j]); });
                for (std::size_t k = 0; k < n; ++k) {
                    knud.check(cf::knudsen_diffusivity(x[i], x[j], x[k]).value,
                               [&] { return text(x[i], x[j], x[k]); });
                    mfp.check(cf::mean_free_path(x[i], x[j], x[k]).value,
                              [&] { return text(x[i], x[j], x[k]); });
                }
            }
        }
    }

    // Functions of more numbers: sampled combinations.
    lcg g{12345u};
    {
        checker measured("measured_diffusivity", fin), arr("arrhenius_permeability", fin),
            memb("membrane_flux", fin), eq("equimolar_flux", fin), logl("log_law_flux", fin),
            dusty("dusty_gas_flux", fin), ef("element_flux", fin), eo("element_outlet", fin),
            ei("element_inlet", fin), zero("zero_current_A", fin), dry("dry_mole_fraction", fin),
            res("resolve", fin);
        const int samples = 100000;
        for (int s = 0; s < samples; ++s) {
            const T a = v.draw(g), b = v.draw(g), c = v.draw(g), d = v.draw(g), e = v.draw(g),
                    f = v.draw(g);
            const T h = v.draw(g);
            measured.check(cf::measured_diffusivity(a, b, c, d, e, f).value,
                           [&] { return text(a, b, c, d, e, f); });
            arr.check(cf::arrhenius_permeability(a, b, c, d).value,
                      [&] { return text(a, b, c, d); });
            memb.check(cf::membrane_flux(a, b, c, d, e).value, [&] { return text(a, b, c, d, e); });
            eq.check(cf::equimolar_flux(a, b, c, d, e).value, [&] { return text(a, b, c, d, e); });
            logl.check(cf::log_law_flux(a, b, c, d, e, f).value,
                       [&] { return text(a, b, c, d, e, f); });
            dusty.check(cf::dusty_gas_flux(a, b, c, d, e, f, h).value,
                        [&] { return text(a, b, c, d, e, f, h); });
            const cf::element_transport<T> el{v.draw(g), v.draw(g), v.draw(g), v.draw(g),
                                              v.draw(g)};
            ef.check(cf::element_flux(el, a, b, c, d).value,
                     [&] { return element_text(el) + text(a, b, c, d); });
            eo.check(cf::element_outlet(el, a, b, c, d).value,
                     [&] { return element_text(el) + text(a, b, c, d); });
            ei.check(cf::element_inlet(el, a, b, c, d).value,
                     [&] { return element_text(el) + text(a, b, c, d); });
            zero.check(cf::zero_current_A(a, b, c, d).value, [&] { return text(a, b, c, d); });
            dry.check(cf::dry_mole_fraction(a, b, c, d).value, [&] { return text(a, b, c, d); });
            const cf::barrier<T> br = draw_barrier(v, g);
            const auto r = cf::resolve(br, cf::gas_environment<T>{a, b, c, d, e});
            const std::string rt = barrier_text(br) + text(a, b, c, d, e);
            res.check(r.value.area_m2, [&] { return rt; });
            res.check(r.value.length_m, [&] { return rt; });
            res.check(r.value.inv_molecular_s_m2, [&] { return rt; });
            res.check(r.value.inv_linear_s_m2, [&] { return rt; });
            res.check(r.value.knudsen_number, [&] { return rt; });
        }
    }

    // Whole sensors: 1 .. 3 elements (mostly valid ones, so that the solves
    // run; some drawn from the grid), a flux ratio, a condition, a fraction
    // and a current.
    {
        checker flow("molar_flow", fin), prof("profile_for_flow", fin),
            sens("sensitivity_A_per_mol_per_mol", fin), cur("limiting_current_A", fin),
            inv("mole_fraction_from_current", fin), span("span_factor", fin),
            tc("temperature_coefficient_per_K", fin), pc("pressure_coefficient_per_Pa", fin),
            lin("linearity_ratio", fin), rep("element_reports", fin);
        const cf::barrier<T> good[] = {
            cf::make_capillary(T(0.1e-3), T(1.0e-3)),
            cf::make_porous(T(1.0e-3), T(2.0e-5), T(0.5), T(1.5), T(20.0e-6)),
            cf::make_membrane(T(25.0e-6), T(1.0e-5), T(1.0e-15), T(20000), T(293.15))};
        const T flux_ratios[] = {T(-2), T(-1), T(0), T(1), T(-1.0e6), T(1.0e6)};
        const int sensor_samples = 3000;
        for (int s = 0; s < sensor_samples; ++s) {
            cf::sensor_model<T, 4> m =
                sensor<T>(g.next(2) == 0 ? "CO" : "O2", "air", 2u, flux_ratios[g.next(6)]);
            // Half the sensors report partial pressure: S / P and its slopes are on that path.
            if (g.next(2) == 0) m.reading = cf::reading_kind::partial_pressure;
            const std::size_t count = 1 + g.next(3);
            std::string desc = text("ratio", m.flux_ratio);
            for (std::size_t k = 0; k < count; ++k) {
                const cf::barrier<T> b = g.next(3) == 0 ? draw_barrier(v, g) : good[g.next(3)];
                cf::push(m.barriers, b);
                desc += "| " + barrier_text(b);
            }
            const T t = g.next(2) == 0 ? T(300) : v.draw(g);
            const T p = g.next(2) == 0 ? T(1.0e5) : v.draw(g);
            const T y = v.draw(g);
            const T i = v.draw(g);
            desc += text("| T", t, "P", p, "y", y, "I", i);

            const auto st = cf::transport_at(m, t, p);
            flow.check(cf::molar_flow(st.value, y).value, [&] { return desc; });
            const cf::series_profile<T, 4> pr = cf::profile_for_flow(st.value, i);
            for (std::size_t k = 0; k <= st.value.count; ++k)
                prof.check(pr.fractions[k], [&] { return desc; });
            sens.check(cf::sensitivity_A_per_mol_per_mol(m, t, p).value, [&] { return desc; });
            cur.check(cf::limiting_current_A(m, t, p, y).value, [&] { return desc; });
            inv.check(cf::mole_fraction_from_current(m, t, p, i).value, [&] { return desc; });
            span.check(cf::span_factor(m, t, p).value, [&] { return desc; });
            tc.check(cf::temperature_coefficient_per_K(m, t, p).value, [&] { return desc; });
            pc.check(cf::pressure_coefficient_per_Pa(m, t, p).value, [&] { return desc; });
            lin.check(cf::linearity_ratio(m, t, p, y).value, [&] { return desc; });
            const auto rp = cf::element_reports(m, t, p);
            rep.check(rp.value.mean_free_path_m, [&] { return desc; });
            rep.check(rp.value.diffusivity_m2_s, [&] { return desc; });
            for (std::size_t k = 0; k < rp.value.count; ++k) {
                rep.check(rp.value.elements[k].knudsen_number, [&] { return desc; });
                rep.check(rp.value.elements[k].resistance_share, [&] { return desc; });
                rep.check(rp.value.elements[k].knudsen_share, [&] { return desc; });
                rep.check(rp.value.elements[k].area_m2, [&] { return desc; });
                rep.check(rp.value.elements[k].effective_length_m, [&] { return desc; });
            }
        }
    }
}

}  // namespace

TEST_CASE_TEMPLATE("series: every public function is finite for extreme finite input", T, float,
                   double) {
    sweep(value_grid<T>{extreme_values<T>, sizeof(extreme_values<T>) / sizeof(T), true});
}

TEST_CASE_TEMPLATE("series: every public function is finite for moderate finite input", T, float,
                   double) {
    sweep(value_grid<T>{moderate_values<T>, sizeof(moderate_values<T>) / sizeof(T), true});
}
