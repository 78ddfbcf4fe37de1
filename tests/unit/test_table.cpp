// Lookup tables (table.hpp): uniform axes, linear and bilinear interpolation in
// float and double, q15 encoding and the q15 lookups (real and integer axes).
//
// The outside reference for every check is the definition of piecewise-linear
// and bilinear interpolation on a regular grid (Press, Teukolsky, Vetterling &
// Flannery, Numerical Recipes, 3rd ed., 2007, sec. 3.6.1, eq. 3.6.5):
//   - it reproduces every node value;
//   - it is exact for every function linear in each axis, a + b x + c y + d x y
//     (the bilinear interpolant of such a function is the function itself);
//   - between nodes it is (1 - f) v_i + f v_(i+1) with f the position in the cell,
//     computed here independently in long double with std::floor.
// "Exact" is to the rounding of T: the position t = (x - origin) / step is formed
// with the stored reciprocal of the step, which moves t by a few ulps, so a node
// may come out as the previous cell at fraction 1 - O(eps). The tolerances below
// are a small multiple of eps times the size of the values, said at each check.
#include <doctest/doctest.h>

#include <cmath>
#include <cstddef>
#include <cstdint>
#include <limits>
#include <random>
#include <vector>

#include <counterflux/status.hpp>
#include <counterflux/table.hpp>

#include "support.hpp"

namespace cf = counterflux;
using namespace counterflux_test;

namespace {

// ---------------------------------------------------------------------------
// Compile-time checks: construction and node values are constant expressions.
constexpr cf::uniform_axis<double> t_axis = cf::make_uniform_axis(250.0, 330.0, 15);
static_assert(t_axis.count == 15, "count kept");
static_assert(t_axis.origin == 250.0, "first node is `from`");
static_assert(cf::axis_node(t_axis, 14) == 330.0, "last node is `to` exactly");
static_assert(cf::axis_node(t_axis, 7) == 290.0, "middle node: 250 + 7 * 80/14");

constexpr cf::uniform_axis<float> p_axis = cf::make_uniform_axis(70000.0f, 110000.0f, 9);
static_assert(cf::axis_node(p_axis, 8) == 110000.0f, "last node is `to` exactly (float)");
static_assert(p_axis.step == 5000.0f && p_axis.inv_step == 1.0f / 5000.0f, "the reciprocal step is stored");

constexpr cf::table_1d<double, 4> cube = cf::make_table_1d(0.0, 3.0, {0.0, 1.0, 8.0, 27.0});
static_assert(cube(0.0).value == 0.0 && cube(1.0).value == 1.0 && cube(2.0).value == 8.0, "nodes");
static_assert(cube(3.0).value == 27.0 && cube(3.0).ok(), "the last node is reachable, unflagged");
static_assert(cube(2.5).value == 17.5, "half way: (8 + 27) / 2");
static_assert(cube(-1.0).value == 0.0 && cf::has(cube(-1.0).code, cf::status::first_axis_below),
              "below: clamped to the first node, flagged");
static_assert(cube(4.0).value == 27.0 && cf::has(cube(4.0).code, cf::status::above_range),
              "above: clamped to the last node, flagged");

// 2 x 3 table of v = 10 i0 + i1 on axes 0..1 and 0..2 (steps 1: no rounding at all).
constexpr cf::table_2d<double, 2, 3> grid = cf::make_table_2d<double, 2, 3>(0.0, 1.0, 0.0, 2.0, {0, 1, 2, 10, 11, 12});
static_assert(grid(1.0, 2.0).value == 12.0, "the far corner is reachable");
static_assert(grid(0.5, 1.5).value == 6.5, "bilinear centre: 10 * 0.5 + 1.5");
static_assert(grid(0.0, 0.0).ok() && grid(1.0, 2.0).ok(), "corners are inside");

constexpr cf::q15_scale<double> unit_scale = cf::q15_scale_for(-1.0, 1.0);
static_assert(cf::q15_encode(1.0, unit_scale) == 32767 && cf::q15_encode(-1.0, unit_scale) == -32767,
              "the range ends map to +-32767");
static_assert(cf::q15_encode(0.0, unit_scale) == 0, "the middle maps to 0");

constexpr cf::q15_table_1d<3> q_line = cf::make_q15_table_1d<3>(-100, 50, {0, 1000, -1000});
static_assert(q_line(-75).value == 500 && q_line(-25).value == 0 && q_line(0).value == -1000,
              "integer interpolation, the last node reachable");

// ---------------------------------------------------------------------------
// Independent reference: the interpolant of node values v on an axis (from, step,
// n) at x, clamped, in long double with std::floor.
long double reference_1d(long double from, long double step, std::size_t n, const std::vector<long double>& v,
                         long double x) {
    long double t = (x - from) / step;
    if (t < 0) t = 0;
    if (t > static_cast<long double>(n - 1)) t = static_cast<long double>(n - 1);
    std::size_t i = static_cast<std::size_t>(std::floor(t));
    if (i > n - 2) i = n - 2;
    const long double f = t - static_cast<long double>(i);
    return (1 - f) * v[i] + f * v[i + 1];
}

// A bilinear function a + b x + c y + d x y.
struct bilinear_fn {
    double a, b, c, d;
    double operator()(double x, double y) const { return a + b * x + c * y + d * x * y; }
};

}  // namespace

// ---------------------------------------------------------------------------
TEST_CASE_TEMPLATE("table: every node is reproduced, 1-D and 2-D", T, float, double) {
    std::mt19937 rng(20240611u);
    std::uniform_real_distribution<double> value(-5.0, 5.0);
    constexpr std::size_t n0 = 15, n1 = 9;
    const cf::uniform_axis<T> a0 = cf::make_uniform_axis(T(253.15), T(323.15), n0);
    const cf::uniform_axis<T> a1 = cf::make_uniform_axis(T(70000), T(110000), n1);
    std::vector<T> v(n0 * n1);
    for (T& x : v) x = static_cast<T>(value(rng));
    // Tolerance: the node may be found as the previous cell at 1 - f = O(n eps):
    // the value then moves by that times a neighbour difference (<= 10).
    const T tol = T(64) * std::numeric_limits<T>::epsilon() * T(10);
    for (std::size_t i = 0; i < n0; ++i) {
        const cf::result<T> r1 = cf::interpolate_1d(a0, v.data() + 0, cf::axis_node(a0, i));
        CHECK(r1.ok());
        CHECK(std::fabs(r1.value - v[i]) <= tol);
        for (std::size_t j = 0; j < n1; ++j) {
            const cf::result<T> r2 = cf::interpolate_2d(a0, a1, v.data(), cf::axis_node(a0, i), cf::axis_node(a1, j));
            INFO("node " << i << ", " << j);
            CHECK(r2.ok());
            CHECK(std::fabs(r2.value - v[i * n1 + j]) <= tol);
        }
    }
    // The first and last nodes are exact, not merely close.
    CHECK(cf::interpolate_1d(a0, v.data(), cf::axis_node(a0, 0)).value == v[0]);
    CHECK(cf::interpolate_1d(a0, v.data(), cf::axis_node(a0, n0 - 1)).value == v[n0 - 1]);
    CHECK(cf::interpolate_2d(a0, a1, v.data(), cf::axis_node(a0, n0 - 1), cf::axis_node(a1, n1 - 1)).value ==
          v[n0 * n1 - 1]);
    CHECK(cf::interpolate_2d(a0, a1, v.data(), cf::axis_node(a0, 0), cf::axis_node(a1, 0)).value == v[0]);
}

TEST_CASE_TEMPLATE("table: exact for functions linear in each axis at random points", T, float, double) {
    std::mt19937 rng(7u);
    constexpr std::size_t n0 = 15, n1 = 9;
    // Axis 0 on a negative origin (temperature in degC, -20 .. 50) and axis 1 in kPa.
    const T from0 = T(-20), to0 = T(50), from1 = T(70), to1 = T(110);
    const cf::uniform_axis<T> a0 = cf::make_uniform_axis(from0, to0, n0);
    const cf::uniform_axis<T> a1 = cf::make_uniform_axis(from1, to1, n1);
    const bilinear_fn fns[] = {{1.0, 0.0, 0.0, 0.0}, {0.5, 0.02, 0.0, 0.0}, {-3.0, 0.0, 0.04, 0.0},
                               {2.0, -0.01, 0.03, 0.0005}};
    std::uniform_real_distribution<double> u0(-20.0, 50.0), u1(70.0, 110.0);
    for (const bilinear_fn& fn : fns) {
        std::vector<T> v(n0 * n1), line(n0);
        double biggest = 0.0;
        for (std::size_t i = 0; i < n0; ++i) {
            const double x = static_cast<double>(cf::axis_node(a0, i));
            line[i] = static_cast<T>(fn(x, 90.0));
            for (std::size_t j = 0; j < n1; ++j) {
                v[i * n1 + j] = static_cast<T>(fn(x, static_cast<double>(cf::axis_node(a1, j))));
                biggest = std::fmax(biggest, std::fabs(static_cast<double>(v[i * n1 + j])));
            }
        }
        // Rounding only: of the node values (eps |v|), of t (a few eps times the count) and of the blend.
        const double tol = 64.0 * static_cast<double>(std::numeric_limits<T>::epsilon()) * (biggest + 1.0);
        for (int k = 0; k < 500; ++k) {
            const T x = static_cast<T>(u0(rng));
            const T y = static_cast<T>(u1(rng));
            const cf::result<T> r2 = cf::interpolate_2d(a0, a1, v.data(), x, y);
            const cf::result<T> r1 = cf::interpolate_1d(a0, line.data(), x);
            INFO("x = " << x << ", y = " << y);
            REQUIRE(r2.ok());
            REQUIRE(r1.ok());
            CHECK(std::fabs(static_cast<double>(r2.value) - fn(static_cast<double>(x), static_cast<double>(y))) <= tol);
            CHECK(std::fabs(static_cast<double>(r1.value) - fn(static_cast<double>(x), 90.0)) <= tol);
        }
    }
}

TEST_CASE_TEMPLATE("table: a smooth function matches the long-double interpolant", T, float, double) {
    // v = exp((x - 290) / 40) on 250 .. 330 K: not linear, so this checks the cell and the
    // fraction against std::floor in long double, not just exactness.
    constexpr std::size_t n = 15;
    const cf::uniform_axis<T> a = cf::make_uniform_axis(T(250), T(330), n);
    std::vector<T> v(n);
    std::vector<long double> vl(n);
    for (std::size_t i = 0; i < n; ++i) {
        v[i] = static_cast<T>(std::exp((static_cast<double>(cf::axis_node(a, i)) - 290.0) / 40.0));
        vl[i] = static_cast<long double>(v[i]);
    }
    std::mt19937 rng(99u);
    std::uniform_real_distribution<double> ux(240.0, 340.0);
    const long double step = (330.0L - 250.0L) / 14.0L;
    for (int k = 0; k < 1000; ++k) {
        const T x = static_cast<T>(ux(rng));
        const long double expected = reference_1d(250.0L, step, n, vl, static_cast<long double>(x));
        const cf::result<T> r = cf::interpolate_1d(a, v.data(), x);
        // Values 0.37 .. 2.7: rounding of t (n eps) times a neighbour difference (< 0.41) plus eps |v|.
        const long double tol = 64.0L * static_cast<long double>(std::numeric_limits<T>::epsilon()) * 3.0L;
        INFO("x = " << x);
        CHECK(std::fabs(static_cast<long double>(r.value) - expected) <= tol);
        CHECK(cf::has(r.code, cf::status::first_axis_below) == (x < T(250)));
        CHECK(cf::has(r.code, cf::status::first_axis_above) == (x > T(330)));
    }
}

TEST_CASE_TEMPLATE("table: locate floors, clamps at both edges and reaches the last node", T, float, double) {
    const cf::status lo = cf::status::second_axis_below;
    const cf::status hi = cf::status::second_axis_above;
    const cf::uniform_axis<T> a = cf::make_uniform_axis(T(-20), T(50), 15);  // step 5
    // floor, not truncation: -17.5 is half way into cell 0, -2.5 half way into cell 3.
    const cf::axis_position<T> p0 = cf::locate(a, T(-17.5), lo, hi);
    CHECK(p0.index == 0u);
    CHECK(static_cast<double>(p0.fraction) == doctest::Approx(0.5).epsilon(1e-6));
    const cf::axis_position<T> p3 = cf::locate(a, T(-2.5), lo, hi);
    CHECK(p3.index == 3u);
    CHECK(static_cast<double>(p3.fraction) == doctest::Approx(0.5).epsilon(1e-6));
    // Just below the origin: clamped to the first node (index 0, fraction 0), never
    // extrapolated with a negative fraction, and flagged on this axis and generically.
    for (const T x : {T(-20.001), T(-25), T(-1e30f), -std::numeric_limits<T>::max()}) {
        const cf::axis_position<T> p = cf::locate(a, x, lo, hi);
        INFO("x = " << x);
        CHECK(p.index == 0u);
        CHECK(p.fraction == T(0));
        CHECK(p.code == (lo | cf::status::below_range));
    }
    // Exactly on the edges: not flagged; the last node is index count - 2, fraction exactly 1.
    const cf::axis_position<T> first = cf::locate(a, T(-20), lo, hi);
    CHECK(first.code == cf::status::ok);
    CHECK(first.index == 0u);
    CHECK(first.fraction == T(0));
    const cf::axis_position<T> last = cf::locate(a, T(50), lo, hi);
    CHECK(last.code == cf::status::ok);
    CHECK(last.index == 13u);
    CHECK(last.fraction == T(1));
    for (const T x : {T(50.001), T(60), T(1e30f), std::numeric_limits<T>::max()}) {
        const cf::axis_position<T> p = cf::locate(a, x, lo, hi);
        INFO("x = " << x);
        CHECK(p.index == 13u);
        CHECK(p.fraction == T(1));
        CHECK(p.code == (hi | cf::status::above_range));
    }
    // Non-finite: NaN to the first node, +-inf to its edge; always not_finite.
    const cf::axis_position<T> pn = cf::locate(a, std::numeric_limits<T>::quiet_NaN(), lo, hi);
    CHECK(pn.index == 0u);
    CHECK(pn.fraction == T(0));
    CHECK(pn.code == cf::status::not_finite);
    const cf::axis_position<T> pi = cf::locate(a, std::numeric_limits<T>::infinity(), lo, hi);
    CHECK(pi.index == 13u);
    CHECK(pi.fraction == T(1));
    CHECK(pi.code == (hi | cf::status::above_range | cf::status::not_finite));
    const cf::axis_position<T> pm = cf::locate(a, -std::numeric_limits<T>::infinity(), lo, hi);
    CHECK(pm.index == 0u);
    CHECK(pm.fraction == T(0));
    CHECK(pm.code == (lo | cf::status::below_range | cf::status::not_finite));
}

TEST_CASE_TEMPLATE("table: the last node is reached from every axis length", T, float, double) {
    // For every count, the step (to - from)/(count - 1) times count - 1 may miss `to`
    // by rounding; the lookup at the last node must still give its value exactly.
    for (std::size_t n = 2; n < 200; ++n) {
        const cf::uniform_axis<T> a = cf::make_uniform_axis(T(233.15), T(358.15), n);
        std::vector<T> v(n);
        for (std::size_t i = 0; i < n; ++i) v[i] = T(1) + static_cast<T>(i) * T(0.37);
        const T last = cf::axis_node(a, n - 1);
        const cf::result<T> r = cf::interpolate_1d(a, v.data(), last);
        INFO("count " << n);
        CHECK(r.value == v[n - 1]);
        CHECK(r.ok());
        CHECK(cf::locate(a, last, cf::status::below_range, cf::status::above_range).index == n - 2);
        // One ulp either side of the last node: within the edge tolerance, so the last
        // node unflagged; beyond the tolerance (8 eps (|from| + |to|)) flagged.
        const cf::result<T> in = cf::interpolate_1d(a, v.data(), std::nextafter(last, T(0)));
        const cf::result<T> near = cf::interpolate_1d(a, v.data(), std::nextafter(last, T(1e30f)));
        const T beyond = last + T(16) * std::numeric_limits<T>::epsilon() * (a.origin + last);
        const cf::result<T> out = cf::interpolate_1d(a, v.data(), beyond);
        CHECK(in.ok());
        CHECK(std::fabs(in.value - v[n - 1]) <= T(4) * std::numeric_limits<T>::epsilon() * v[n - 1]);
        CHECK(near.ok());
        CHECK(near.value == v[n - 1]);
        CHECK(out.code == (cf::status::first_axis_above | cf::status::above_range));
        CHECK(out.value == v[n - 1]);
        // And at the first node: one ulp below is flagged, the node itself is not.
        const cf::result<T> under = cf::interpolate_1d(a, v.data(), std::nextafter(a.origin, T(0)));
        CHECK(under.code == (cf::status::first_axis_below | cf::status::below_range));
        CHECK(under.value == v[0]);
        // The fixed-size table reads the same as the size-erased kernel.
        if (n == 15) {
            cf::table_1d<T, 15> t15{a, {}};
            for (std::size_t i = 0; i < 15; ++i) t15.values[i] = v[i];
            for (const T x : {T(233), last, std::nextafter(last, T(0)), T(300.3), T(400)}) {
                CHECK(t15(x).value == cf::interpolate_1d(a, v.data(), x).value);
                CHECK(t15(x).code == cf::interpolate_1d(a, v.data(), x).code);
            }
        }
    }
}

TEST_CASE_TEMPLATE("table: 2-D clamps and flags each axis separately", T, float, double) {
    // v = 10 i0 + i1 on 3 x 4 nodes: corners and edges are recognisable values.
    const cf::uniform_axis<T> a0 = cf::make_uniform_axis(T(250), T(330), 3);
    const cf::uniform_axis<T> a1 = cf::make_uniform_axis(T(70000), T(110000), 4);
    std::vector<T> v(12);
    for (std::size_t i = 0; i < 3; ++i)
        for (std::size_t j = 0; j < 4; ++j) v[i * 4 + j] = T(10) * static_cast<T>(i) + static_cast<T>(j);
    struct probe {
        T t, p, expected;
        cf::status code;
    };
    const cf::status t_lo = cf::status::first_axis_below | cf::status::below_range;
    const cf::status t_hi = cf::status::first_axis_above | cf::status::above_range;
    const cf::status p_lo = cf::status::second_axis_below | cf::status::below_range;
    const cf::status p_hi = cf::status::second_axis_above | cf::status::above_range;
    const probe probes[] = {
        {T(200), T(90000), T(1.5), t_lo},          // T below: row 0, half way between p nodes 1 and 2
        {T(400), T(90000), T(21.5), t_hi},         // T above: row 2
        {T(290), T(50000), T(10), p_lo},           // P below: column 0 of row 1
        {T(290), T(200000), T(13), p_hi},          // P above: column 3
        {T(100), T(1), T(0), t_lo | p_lo},         // both below: corner (0, 0)
        {T(1000), T(1e7), T(23), t_hi | p_hi},     // both above: corner (2, 3)
        {T(100), T(1e7), T(3), t_lo | p_hi},       // mixed corners
        {T(1000), T(1), T(20), t_hi | p_lo},
        {T(330), T(110000), T(23), cf::status::ok},  // the far corner itself, unflagged
    };
    for (const probe& pr : probes) {
        const cf::result<T> r = cf::interpolate_2d(a0, a1, v.data(), pr.t, pr.p);
        INFO("T = " << pr.t << ", P = " << pr.p);
        CHECK(static_cast<double>(r.value) == doctest::Approx(static_cast<double>(pr.expected)).epsilon(1e-6));
        CHECK(r.code == pr.code);
    }
}

TEST_CASE_TEMPLATE("table: NaN and inf on every input give a finite value and not_finite", T, float, double) {
    const T nan = std::numeric_limits<T>::quiet_NaN();
    const T inf = std::numeric_limits<T>::infinity();
    const cf::table_1d<T, 3> t1 = cf::make_table_1d(T(0), T(2), {T(1), T(2), T(4)});
    const cf::table_2d<T, 2, 2> t2 = cf::make_table_2d<T, 2, 2>(T(0), T(1), T(0), T(1), {T(1), T(2), T(3), T(4)});
    const std::int16_t q1[3] = {-100, 0, 100};
    const std::int16_t q2[4] = {-100, 0, 100, 200};
    const cf::q15_scale<T> s = cf::q15_scale_for(T(-1), T(1));
    const cf::uniform_axis<T> a = cf::make_uniform_axis(T(0), T(1), 2);
    for (const T bad : {nan, inf, -inf}) {
        INFO("input " << bad);
        const cf::result<T> r1[] = {t1(bad), cf::interpolate_1d(t1.axis, t1.values.data(), bad),
                                    cf::interpolate_1d(a, q1, s, bad)};
        for (const cf::result<T>& r : r1) {
            CHECK(std::isfinite(r.value));
            CHECK(cf::has(r.code, cf::status::not_finite));
        }
        const cf::result<T> r2[] = {t2(bad, T(0.5)), t2(T(0.5), bad), t2(bad, bad),
                                    cf::interpolate_2d(a, a, q2, s, bad, T(0.5)),
                                    cf::interpolate_2d(a, a, q2, s, T(0.5), bad)};
        for (const cf::result<T>& r : r2) {
            CHECK(std::isfinite(r.value));
            CHECK(cf::has(r.code, cf::status::not_finite));
        }
        // Encoding: NaN is 0, +-inf saturate.
        const std::int16_t q = cf::q15_encode(bad, s);
        CHECK(q == (bad != bad ? 0 : (bad > T(0) ? 32767 : -32768)));
    }
    // Axis ends that are not finite: q15_scale_for gives the null scale, which encodes everything as 0.
    CHECK(cf::q15_scale_for(nan, T(1)).scale == T(0));
    CHECK(cf::q15_encode(T(0.3), cf::q15_scale_for(T(0), inf)) == 0);
    // Null data or a degenerate axis: out_of_domain, never a read.
    CHECK(cf::interpolate_1d(a, static_cast<const T*>(nullptr), T(0.5)).code == cf::status::out_of_domain);
    CHECK(cf::interpolate_2d(a, a, static_cast<const T*>(nullptr), T(0.5), T(0.5)).code == cf::status::out_of_domain);
}

// ---------------------------------------------------------------------------
TEST_CASE_TEMPLATE("q15: encode rounds to nearest and saturates; decode inverts it", T, float, double) {
    // Scale for [lo, hi]: q = round((v - mid) / half * 32767), the definition of the
    // format, computed here in long double with std::lround.
    const T lo = T(0.8), hi = T(1.3);
    const cf::q15_scale<T> s = cf::q15_scale_for(lo, hi);
    const long double mid = (static_cast<long double>(lo) + static_cast<long double>(hi)) / 2;
    const long double half = (static_cast<long double>(hi) - static_cast<long double>(lo)) / 2;
    std::mt19937 rng(3u);
    std::uniform_real_distribution<double> uv(0.8, 1.3);
    for (int k = 0; k < 2000; ++k) {
        const T v = static_cast<T>(uv(rng));
        const long double exact = (static_cast<long double>(v) - mid) / half * 32767.0L;
        const std::int16_t q = cf::q15_encode(v, s);
        INFO("v = " << v << ", exact counts " << static_cast<double>(exact));
        // Nearest: within half a count of the exact count (plus the rounding of T in
        // the scale, a few eps times 32767).
        CHECK(std::fabs(static_cast<long double>(q) - exact) <=
              0.5L + 8.0L * 32767.0L * static_cast<long double>(std::numeric_limits<T>::epsilon()));
        // Decoding lands within half a step scale / 32768 of the value.
        const T back = cf::q15_decode(q, s);
        CHECK(std::fabs(static_cast<double>(back - v)) <=
              static_cast<double>(s.scale) / 65536.0 * (1.0 + 1e-3));
    }
    // The ends and the middle (exact for these dyadic values in [-1, 1]).
    const cf::q15_scale<T> unit = cf::q15_scale_for(T(-1), T(1));
    CHECK(cf::q15_encode(T(1), unit) == 32767);
    CHECK(cf::q15_encode(T(-1), unit) == -32767);
    CHECK(cf::q15_encode(T(0), unit) == 0);
    CHECK(static_cast<double>(cf::q15_decode(32767, unit)) == doctest::Approx(1.0).epsilon(1e-6));
    CHECK(static_cast<double>(cf::q15_decode(-32767, unit)) == doctest::Approx(-1.0).epsilon(1e-6));
    // Saturation at both ends of int16, also far beyond the range.
    CHECK(cf::q15_encode(T(2), unit) == 32767);
    CHECK(cf::q15_encode(T(1e30f), unit) == 32767);
    CHECK(cf::q15_encode(T(-2), unit) == -32768);
    CHECK(cf::q15_encode(-std::numeric_limits<T>::max(), unit) == -32768);
    // Round to nearest, not truncate: 0.7 counts is 1, -0.7 is -1, 0.3 is 0.
    const cf::q15_scale<T> counts{T(32768), T(0)};  // value = q exactly
    CHECK(cf::q15_encode(T(0.7), counts) == 1);
    CHECK(cf::q15_encode(T(-0.7), counts) == -1);
    CHECK(cf::q15_encode(T(0.3), counts) == 0);
    CHECK(cf::q15_encode(T(0.49999997f), counts) == 0);  // x + 0.5 would round this up in float
    CHECK(cf::q15_encode(T(123.5), counts) == 124);
    // Degenerate and reversed ranges.
    const cf::q15_scale<T> flat = cf::q15_scale_for(T(3), T(3));
    CHECK(flat.scale == T(0));
    CHECK(cf::q15_encode(T(3), flat) == 0);
    CHECK(cf::q15_decode(cf::q15_encode(T(7), flat), flat) == T(3));
    const cf::q15_scale<T> reversed = cf::q15_scale_for(T(1.3), T(0.8));
    CHECK(reversed.scale == s.scale);
    CHECK(reversed.offset == s.offset);
}

TEST_CASE_TEMPLATE("q15: the lookup agrees with the float lookup within its quantisation step", T, float, double) {
    // A smooth span-like surface 1 + 0.3 sin on 15 x 9 nodes, encoded for [0.6, 1.4].
    constexpr std::size_t n0 = 15, n1 = 9;
    const cf::uniform_axis<T> a0 = cf::make_uniform_axis(T(253.15), T(323.15), n0);
    const cf::uniform_axis<T> a1 = cf::make_uniform_axis(T(70000), T(110000), n1);
    const cf::q15_scale<T> s = cf::q15_scale_for(T(0.6), T(1.4));
    std::vector<T> v(n0 * n1), line(n0);
    std::vector<std::int16_t> q(n0 * n1), qline(n0);
    for (std::size_t i = 0; i < n0; ++i) {
        for (std::size_t j = 0; j < n1; ++j) {
            const double x = 0.4 * static_cast<double>(i) + 0.7 * static_cast<double>(j);
            v[i * n1 + j] = static_cast<T>(1.0 + 0.3 * std::sin(x));
            q[i * n1 + j] = cf::q15_encode(v[i * n1 + j], s);
        }
        line[i] = v[i * n1];
        qline[i] = q[i * n1];
    }
    const double lsb = static_cast<double>(s.scale) / 32768.0;
    // Bound, in counts: the node values are quantised (1/2); each blend rounds (1/2:
    // one blend in 1-D; in 2-D the two row blends are averaged by the last one, so
    // 1/2 + 1/2); the Q15 fraction is off by at most 1/2^16 of a cell, times the node
    // difference: 0.3 * 0.4 = 0.12 along axis 0 (9800 counts: 0.15) and 0.3 * 0.7 =
    // 0.21 along axis 1 (17200 counts: 0.27). The rounding of T adds < 0.05 count.
    const double bound_1d = (0.5 + 0.5 + 0.15 + 0.05) * lsb;
    const double bound_2d = (0.5 + 1.0 + 0.15 + 0.27 + 0.05) * lsb;
    std::mt19937 rng(11u);
    std::uniform_real_distribution<double> u0(250.0, 326.0), u1(68000.0, 112000.0);
    double worst_1d = 0.0, worst_2d = 0.0;
    for (int k = 0; k < 3000; ++k) {
        const T x0 = static_cast<T>(u0(rng));
        const T x1 = static_cast<T>(u1(rng));
        const cf::result<T> f2 = cf::interpolate_2d(a0, a1, v.data(), x0, x1);
        const cf::result<T> q2 = cf::interpolate_2d(a0, a1, q.data(), s, x0, x1);
        const cf::result<T> f1 = cf::interpolate_1d(a0, line.data(), x0);
        const cf::result<T> q1 = cf::interpolate_1d(a0, qline.data(), s, x0);
        CHECK(q2.code == f2.code);
        CHECK(q1.code == f1.code);
        worst_2d = std::fmax(worst_2d, std::fabs(static_cast<double>(q2.value - f2.value)));
        worst_1d = std::fmax(worst_1d, std::fabs(static_cast<double>(q1.value - f1.value)));
    }
    INFO("worst 1-D " << worst_1d / lsb << " counts, 2-D " << worst_2d / lsb << " counts");
    CHECK(worst_1d <= bound_1d);
    CHECK(worst_2d <= bound_2d);
}

TEST_CASE("q15: integer axes agree with real axes and with exact interpolation") {
    // Temperature in mK (253150 .. 323150 in steps of 5000) and pressure in Pa
    // (70000 .. 110000 in steps of 5000); the same table on real axes in K and Pa.
    constexpr std::size_t n0 = 15, n1 = 9;
    const cf::q15_axis i0 = cf::make_q15_axis(253150, 5000, n0);
    const cf::q15_axis i1 = cf::make_q15_axis(70000, 5000, n1);
    REQUIRE(i0.count == n0);
    REQUIRE(i1.count == n1);
    CHECK(i0.inv_step_q32 == 858993u);  // round(2^32 / 5000) = round(858993.4592)
    const cf::uniform_axis<double> k0 = cf::make_uniform_axis(253.15, 323.15, n0);
    const cf::uniform_axis<double> k1 = cf::make_uniform_axis(70000.0, 110000.0, n1);
    const cf::q15_scale<double> unit{32768.0, 0.0};  // decode to counts
    std::mt19937 rng(5u);
    std::uniform_int_distribution<int> uq(-32768, 32767);
    std::vector<std::int16_t> q(n0 * n1);
    for (std::int16_t& x : q) x = static_cast<std::int16_t>(uq(rng));  // worst case: any neighbour difference
    // Nodes are exact.
    for (std::size_t i = 0; i < n0; ++i) {
        for (std::size_t j = 0; j < n1; ++j) {
            const cf::result<std::int16_t> r = cf::q15_interpolate_2d(
                i0, i1, q.data(), 253150 + 5000 * static_cast<std::int32_t>(i), 70000 + 5000 * static_cast<std::int32_t>(j));
            CHECK(r.ok());
            CHECK(r.value == q[i * n1 + j]);
        }
        CHECK(cf::q15_interpolate_1d(i0, q.data(), 253150 + 5000 * static_cast<std::int32_t>(i)).value == q[i]);
    }
    std::uniform_int_distribution<std::int32_t> ut(240000, 335000), up(60000, 120000);
    for (int k = 0; k < 5000; ++k) {
        const std::int32_t t_mK = ut(rng);
        const std::int32_t p_Pa = up(rng);
        // Exact interpolant in long double (NR eq. 3.6.5), clamped.
        long double tt = (t_mK - 253150) / 5000.0L, tp = (p_Pa - 70000) / 5000.0L;
        tt = std::fmin(std::fmax(tt, 0.0L), 14.0L);
        tp = std::fmin(std::fmax(tp, 0.0L), 8.0L);
        const std::size_t a = std::min<std::size_t>(static_cast<std::size_t>(std::floor(tt)), 13u);
        const std::size_t b = std::min<std::size_t>(static_cast<std::size_t>(std::floor(tp)), 7u);
        const long double fa = tt - static_cast<long double>(a), fb = tp - static_cast<long double>(b);
        auto at = [&](std::size_t i, std::size_t j) { return static_cast<long double>(q[i * n1 + j]); };
        const long double exact2 = (1 - fa) * ((1 - fb) * at(a, b) + fb * at(a, b + 1)) +
                                   fa * ((1 - fb) * at(a + 1, b) + fb * at(a + 1, b + 1));
        const long double exact1 = (1 - fa) * q[a] + fa * q[a + 1];
        const cf::result<std::int16_t> r2 = cf::q15_interpolate_2d(i0, i1, q.data(), t_mK, p_Pa);
        const cf::result<std::int16_t> r1 = cf::q15_interpolate_1d(i0, q.data(), t_mK);
        INFO("T = " << t_mK << " mK, P = " << p_Pa << " Pa");
        // Counts: 1-D one rounding (1/2) plus the Q15 fraction error (1/2 + 5000/2^16
        // counts of a 1/32768 cell) times a node difference up to 65535: 1/2 + 1.15.
        // 2-D: the rows carry 1.65 through the final blend, which adds 1/2 + 1.15.
        CHECK(std::fabs(static_cast<long double>(r1.value) - exact1) <= 1.65L);
        CHECK(std::fabs(static_cast<long double>(r2.value) - exact2) <= 3.3L);
        // Integer axes against real axes (the same data, decoded as counts): the real
        // path rounds its fraction to 1/2 count of a cell, so within 1/2 + 1 per blend
        // of the exact value, 3 in 2-D; the two paths within the sum of the bounds.
        const cf::result<double> d2 = cf::interpolate_2d(k0, k1, q.data(), unit, t_mK / 1000.0, static_cast<double>(p_Pa));
        CHECK(std::fabs(static_cast<long double>(d2.value) - exact2) <= 3.0L);
        CHECK(std::fabs(static_cast<double>(r2.value) - d2.value) <= 6.3);
        // The flags agree with the real-axis lookup.
        CHECK(r2.code == d2.code);
        CHECK(cf::has(r2.code, cf::status::first_axis_below) == (t_mK < 253150));
        CHECK(cf::has(r2.code, cf::status::second_axis_above) == (p_Pa > 110000));
        CHECK(cf::has(r1.code, cf::status::first_axis_above) == (t_mK > 323150));
    }
    // Invalid axes: step < 2, or a last node beyond int32: every lookup refuses.
    CHECK(cf::make_q15_axis(0, 1, 10).count == 0u);
    CHECK(cf::make_q15_axis(2000000000, 100000000, 10).count == 0u);
    CHECK(cf::q15_interpolate_1d(cf::make_q15_axis(0, 1, 10), q.data(), 5).code == cf::status::out_of_domain);
    CHECK(cf::q15_interpolate_2d(i0, i1, nullptr, 260000, 80000).code == cf::status::out_of_domain);
    // Extreme integer inputs clamp without overflow.
    CHECK(cf::q15_interpolate_1d(i0, q.data(), std::numeric_limits<std::int32_t>::min()).value == q[0]);
    CHECK(cf::q15_interpolate_1d(i0, q.data(), std::numeric_limits<std::int32_t>::max()).value == q[n0 - 1]);
}

// ---------------------------------------------------------------------------
// The requested last node is always reached (review fixes)

namespace {

// A random axis [from, to]: offsets like the tool's (K, Pa) and axes straddling zero.
template <class T>
void random_axis(std::mt19937& rng, int kind, T& from, T& to) {
    std::uniform_real_distribution<double> u(0.0, 1.0);
    if (kind == 0) {  // offset axis, e.g. 253.15 .. 323.15 K or 50 .. 130 kPa
        const double base = std::pow(10.0, 1.0 + 4.0 * u(rng));
        from = static_cast<T>(base * (0.5 + u(rng)));
        to = static_cast<T>(static_cast<double>(from) + base * (0.01 + u(rng)));
    } else {  // straddling zero, e.g. the shape axis -2 .. 0.1
        from = static_cast<T>(-(0.01 + 10.0 * u(rng)));
        to = static_cast<T>(0.001 + 10.0 * u(rng));
    }
}

}  // namespace

TEST_CASE_TEMPLATE("table: reading exactly at the requested to gives the last node, no flag, on random axes", T,
                   float, double) {
    std::mt19937 rng(20261201u);
    std::uniform_int_distribution<int> count(2, 40);
    for (int k = 0; k < 4000; ++k) {
        T from{}, to{};
        random_axis(rng, k % 2, from, to);
        const std::size_t n = static_cast<std::size_t>(count(rng));
        const cf::uniform_axis<T> ax = cf::make_uniform_axis(from, to, n);
        std::vector<T> v(n);
        for (std::size_t i = 0; i < n; ++i) v[i] = T(1) + static_cast<T>(i) * T(0.37);
        const cf::result<T> r = cf::interpolate_1d(ax, v.data(), to);
        CAPTURE(from);
        CAPTURE(to);
        CAPTURE(n);
        CHECK(r.code == cf::status::ok);
        CHECK(r.value == v[n - 1u]);
        const cf::result<T> r0 = cf::interpolate_1d(ax, v.data(), from);
        CHECK(r0.code == cf::status::ok);
        CHECK(r0.value == v[0]);
        // The compact axis, through the 2-D compact table (3 x 6, as the fixed compensation).
        T vals[18];
        for (std::size_t i = 0; i < 18; ++i) vals[i] = T(2) + static_cast<T>(i);
        const cf::compact_table_2d<T, 3, 6> t = cf::make_compact_table_2d<T, 3, 6>(from, to, from, to, vals);
        const cf::result<T> c = t(to, to);
        CHECK(c.code == cf::status::ok);
        CHECK(c.value == vals[17]);
        const cf::result<T> c0 = t(from, to);
        CHECK(c0.code == cf::status::ok);
        CHECK(c0.value == vals[5]);
        // Just beyond the tolerance: flagged above.
        const T beyond = to + T(64) * std::numeric_limits<T>::epsilon() * (std::fabs(from) + std::fabs(to));
        CHECK(cf::interpolate_1d(ax, v.data(), beyond).code ==
              (cf::status::first_axis_above | cf::status::above_range));
    }
}

TEST_CASE("table: an axis straddling zero reaches its requested last node") {
    const cf::uniform_axis<float> ax = cf::make_uniform_axis(-2.f, 0.1f, 2);
    const float v[2] = {3.f, 7.f};
    const cf::result<float> r = cf::interpolate_1d(ax, v, 0.1f);
    CHECK(r.code == cf::status::ok);
    CHECK(r.value == 7.f);
    const cf::table_1d<float, 2> t = cf::make_table_1d(-2.f, 0.1f, v);
    CHECK(t(0.1f).code == cf::status::ok);
    CHECK(t(0.1f).value == 7.f);
}

TEST_CASE_TEMPLATE("table: a degenerate or descending axis flags out_of_domain", T, float, double) {
    const T v[3] = {T(1), T(2), T(3)};
    for (const cf::uniform_axis<T>& ax : {cf::make_uniform_axis(T(5), T(5), 3), cf::make_uniform_axis(T(5), T(1), 3)}) {
        for (const T x : {T(0), T(3), T(5), T(7)}) {
            CAPTURE(x);
            CHECK(cf::has(cf::interpolate_1d(ax, v, x).code, cf::status::out_of_domain));
            CHECK(cf::has(cf::detail::locate_clamped(ax, x, cf::status::first_axis_below,
                                                     cf::status::first_axis_above)
                              .code,
                          cf::status::out_of_domain));
        }
    }
    const T vals[4] = {T(1), T(2), T(3), T(4)};
    const cf::compact_table_2d<T, 2, 2> t = cf::make_compact_table_2d<T, 2, 2>(T(5), T(5), T(0), T(1), vals);
    CHECK(cf::has(t(T(5), T(0.5)).code, cf::status::out_of_domain));
}

TEST_CASE("q15: an axis whose step times its cells overflows int32 is read without overflow") {
    constexpr cf::q15_axis a = cf::make_q15_axis(-2000000000, 1000000000, 4);
    static_assert(a.count == 4u, "the last node 1e9 fits int32");
    constexpr std::int16_t q[4] = {100, 200, 300, 400};
    constexpr cf::result<std::int16_t> last = cf::q15_interpolate_1d(a, q, 1000000000);
    static_assert(last.value == 400 && last.code == cf::status::ok, "the last node exactly");
    constexpr cf::result<std::int16_t> above = cf::q15_interpolate_1d(a, q, 2000000000);
    static_assert(above.value == 400, "clamped to the last node");
    CHECK(above.code == (cf::status::first_axis_above | cf::status::above_range));
    CHECK(cf::q15_interpolate_1d(a, q, -1000000000).value == 200);  // nodes exactly (the fraction is coarse at this step)
    CHECK(cf::q15_interpolate_1d(a, q, 0).value == 300);
    // Too many nodes for int32: invalid, without overflow in the check.
    static_assert(cf::make_q15_axis(0, 1000000000, 4).count == 0u, "last node 3e9 does not fit");
    static_assert(cf::make_q15_axis(0, 2, std::size_t(0x80000000u)).count == 0u, "count above 2^31 - 1");
}

TEST_CASE("q15: fixed-size tables are bounded by their size, not by the axis count") {
    const cf::q15_table_1d<3> t{cf::make_q15_axis(0, 100, 10), {{1, 2, 3}}};
    CHECK(t(850).code == cf::status::out_of_domain);
    CHECK(t(50).code == cf::status::out_of_domain);
    const cf::q15_table_2d<2, 2> t2{cf::make_q15_axis(0, 100, 2), cf::make_q15_axis(0, 100, 9), {{1, 2, 3, 4}}};
    CHECK(t2(50, 750).code == cf::status::out_of_domain);
    const cf::q15_table_1d<3> ok = cf::make_q15_table_1d<3>(0, 100, {10, 20, 30});
    CHECK(ok(200).value == 30);
    CHECK(ok(200).code == cf::status::ok);
}
