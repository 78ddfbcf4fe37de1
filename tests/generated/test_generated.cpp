// tests/generated/test_generated.cpp - the generated C headers (made by the
// table verb during the build, compiled as C99 with -Werror and as C++17)
// against the full model, against the library's table types, and at their
// edges. The expected values are never taken from the tool's output: the
// truth is the library's full model (signal.hpp) evaluated here in double.
#define DOCTEST_CONFIG_IMPLEMENT_WITH_MAIN
#include <doctest/doctest.h>

#include <algorithm>
#include <cmath>
#include <limits>
#include <random>
#include <string>

#include <counterflux/ambient.hpp>
#include <counterflux/compensation.hpp>
#include <counterflux/signal.hpp>

#include "cxx_views.hpp"
#include "sensor_file.hpp"
#include "wrappers.h"

namespace {

using counterflux::tool::sensor_file;

const sensor_file& garage() {
    static const sensor_file f = counterflux::tool::read_sensor_file(COUNTERFLUX_SOURCE_DIR "/examples/garage_co.toml");
    return f;
}

const sensor_file& flue() {
    static const sensor_file f =
        counterflux::tool::read_sensor_file(COUNTERFLUX_SOURCE_DIR "/examples/flue_o2_altitude.toml");
    return f;
}

using reading_fn = float (*)(float, float, float, unsigned*);

double zero_of(const sensor_file& f, double t) {
    if (!f.zero) return 0.0;
    return counterflux::zero_current_A(f.zero->current_A, f.zero->per_K, f.model.reference_temperature_K, t).value;
}

// Worst error of a generated reading against the full model at random
// (T, P, y) inside the table (fixed seed), in the proof's measure: relative to
// the reading, or to 10 % of full scale below that.
double worst_random_error(const sensor_file& f, reading_fn reading, int samples) {
    std::mt19937 rng(20261201u);
    const auto& a = *f.table;
    std::uniform_real_distribution<double> ut(a.temperature.from, a.temperature.to);
    std::uniform_real_distribution<double> up(a.pressure.from, a.pressure.to);
    std::uniform_real_distribution<double> uy(0.0, f.full_scale_mol_mol);
    const bool pp = f.model.reading == counterflux::reading_kind::partial_pressure;
    double worst = 0.0;
    for (int k = 0; k < samples; ++k) {
        const double t = ut(rng), p = up(rng), y = uy(rng);
        const auto i = counterflux::limiting_current_A(f.model, t, p, y);
        REQUIRE(i.ok());
        unsigned status = 0xffffu;
        const double got = static_cast<double>(reading(static_cast<float>(i.value + zero_of(f, t)),
                                                       static_cast<float>(t), static_cast<float>(p), &status));
        CHECK(status == 0u);
        const double scale = pp ? p : 1.0;
        const double e = std::fabs(got - y * scale) / std::max(y * scale, 0.1 * f.full_scale_mol_mol * scale);
        worst = std::max(worst, e);
    }
    return worst;
}

// The proof samples a grid ten times finer than the table; between its points
// the error surface of a bilinear table is smooth, and random points may find
// a worst case slightly above the grid's. The allowance: 2 % of the bound plus
// float rounding (a few units of 2^-24 per operation).
double allowance(float proven) { return 1.02 * static_cast<double>(proven) + 1.0e-6; }

}  // namespace

TEST_CASE("generated float32 header agrees with the full model within its proven bound") {
    const double e = worst_random_error(garage(), f32_reading, 4000);
    MESSAGE("garage_co float32: worst random error " << e << ", proven " << f32_proven_error());
    CHECK(f32_proven_error() > 0.0f);
    CHECK(f32_proven_error() <= 1.0e-3f);  // the file's table.max_error
    CHECK(e <= allowance(f32_proven_error()));
}

TEST_CASE("generated q15 header agrees with the full model within its proven bound") {
    const double e = worst_random_error(garage(), q15_reading, 4000);
    MESSAGE("garage_co q15: worst random error " << e << ", proven " << q15_proven_error());
    CHECK(e <= allowance(q15_proven_error()));
}

TEST_CASE("generated header of a stagnant (curved-law) sensor agrees with the full model over 0..full scale") {
    // The log law of a stagnant background is far from linear at 25 % O2 (about
    // 14 % above the linear current, physics.md sec. 4), and its curvature moves
    // with T and P through the Knudsen share: the tables must carry both.
    const double e16 = worst_random_error(flue(), curved_reading, 3000);
    const double e32 = worst_random_error(flue(), curved32_reading, 3000);
    MESSAGE("flue_o2: worst random error q15 " << e16 << " (proven " << curved_proven_error() << "), float32 " << e32
                                               << " (proven " << curved32_proven_error() << ")");
    CHECK(e16 <= allowance(curved_proven_error()));
    CHECK(e32 <= allowance(curved32_proven_error()));
    // Sanity of the test itself: a reading that ignored the curvature would be
    // far outside the bound at full scale.
    const auto& f = flue();
    const double t = f.model.reference_temperature_K, p = f.model.reference_pressure_Pa;
    const double s = counterflux::sensitivity_A_per_mol_per_mol(f.model, t, p).value;
    const double i = counterflux::limiting_current_A(f.model, t, p, f.full_scale_mol_mol).value;
    CHECK(std::fabs(i / s - f.full_scale_mol_mol) / f.full_scale_mol_mol > 10.0 * static_cast<double>(curved_proven_error()));
}

TEST_CASE("the header's data drive the library's table types to the same reading") {
    const counterflux::compensation_ref<float> view = generated_test::garage_f32_view();
    std::mt19937 rng(7u);
    const auto& a = *garage().table;
    std::uniform_real_distribution<float> ut(static_cast<float>(a.temperature.from), static_cast<float>(a.temperature.to));
    std::uniform_real_distribution<float> up(static_cast<float>(a.pressure.from), static_cast<float>(a.pressure.to));
    std::uniform_real_distribution<float> ui(0.0f, 1.0e-6f);
    for (int k = 0; k < 2000; ++k) {
        const float t = ut(rng), p = up(rng), i = ui(rng);
        unsigned s1 = 0, s2 = 0;
        const float c = f32_reading(i, t, p, &s1);
        const float cxx = generated_test::garage_f32_reading_cxx(i, t, p, &s2);
        const auto lib = counterflux::reading(view, i, t, p);
        CHECK(c == cxx);  // the same source compiled as C99 and as C++17
        CHECK(s1 == s2);
        CHECK(lib.ok());
        // Same data, same formula; the order of float operations may differ.
        CHECK(std::fabs(static_cast<double>(lib.value) - static_cast<double>(c)) <=
              1.0e-5 * std::fabs(static_cast<double>(c)) + 1.0e-12);
    }
}

TEST_CASE("span at the nodes is GAIN over the stored gain table, and 1 near the reference") {
    const std::size_t nt = generated_test::garage_f32_temperature_count(), np = generated_test::garage_f32_pressure_count();
    const float* k = generated_test::garage_f32_gain_table();
    const double gain = static_cast<double>(generated_test::garage_f32_gain());
    const auto& a = *garage().table;
    for (std::size_t i = 0; i < nt; ++i)
        for (std::size_t j = 0; j < np; ++j) {
            const double t = a.temperature.from + (a.temperature.to - a.temperature.from) * static_cast<double>(i) /
                                                      static_cast<double>(nt - 1);
            const double p = a.pressure.from + (a.pressure.to - a.pressure.from) * static_cast<double>(j) /
                                                   static_cast<double>(np - 1);
            unsigned s = 0;
            const float span = f32_span(static_cast<float>(t), static_cast<float>(p), &s);
            CHECK(s == 0u);
            CHECK(std::fabs(static_cast<double>(span) * static_cast<double>(k[i * np + j]) / gain - 1.0) < 1.0e-5);
            // and the model's span factor there (signal.hpp, double)
            const double model = counterflux::span_factor(garage().model, t, p).value;
            CHECK(std::fabs(static_cast<double>(span) / model - 1.0) < 1.0e-5);
        }
    unsigned s = 0;
    const float at_ref = f32_span(static_cast<float>(garage().model.reference_temperature_K),
                                  static_cast<float>(garage().model.reference_pressure_Pa), &s);
    CHECK(std::fabs(static_cast<double>(at_ref) - 1.0) < 2.0e-3);  // the reference lies between nodes
}

TEST_CASE("out-of-range and non-finite inputs: flags set, value finite, taken at the edge") {
    const auto& a = *garage().table;
    const float t_lo = static_cast<float>(a.temperature.from), t_hi = static_cast<float>(a.temperature.to);
    const float p_lo = static_cast<float>(a.pressure.from), p_hi = static_cast<float>(a.pressure.to);
    const float nan = std::numeric_limits<float>::quiet_NaN(), inf = std::numeric_limits<float>::infinity();
    const unsigned not_finite = 0x2u, below = 0x10u, above = 0x20u, t_below = 0x40u, t_above = 0x80u,
                   p_below = 0x100u, p_above = 0x200u;
    const float i = 2.0e-7f;
    unsigned s = 0;
    const float edge = f32_reading(i, t_lo, p_hi, &s);
    CHECK(s == 0u);
    CHECK(f32_reading(i, t_lo - 40.0f, p_hi + 5000.0f, &s) == edge);
    CHECK(s == (t_below | p_above | below | above));
    CHECK(f32_reading(i, t_hi + 1.0f, p_lo - 1.0f, &s) == f32_reading(i, t_hi, p_lo, nullptr));
    CHECK(s == (t_above | p_below | below | above));
    for (reading_fn fn : {f32_reading, q15_reading, curved_reading, curved32_reading}) {
        for (float bad : {nan, inf, -inf}) {
            s = 0;
            const float v1 = fn(bad, 290.0f, 90000.0f, &s);
            CHECK(std::isfinite(v1));
            CHECK((s & not_finite) != 0u);
            s = 0;
            const float v2 = fn(i, bad, 90000.0f, &s);
            CHECK(std::isfinite(v2));
            CHECK((s & not_finite) != 0u);
            s = 0;
            const float v3 = fn(i, 290.0f, bad, &s);
            CHECK(std::isfinite(v3));
            CHECK((s & not_finite) != 0u);
        }
        // finite extremes: finite out, flagged
        s = 0;
        CHECK(std::isfinite(fn(3.0e38f, 1.0e30f, -1.0e30f, &s)));
        CHECK(s != 0u);
        CHECK(std::isfinite(fn(-3.0e38f, -1.0e30f, 1.0e30f, nullptr)));
    }
    for (float bad : {nan, inf, -inf}) {
        s = 0;
        CHECK(std::isfinite(f32_span(bad, bad, &s)));
        CHECK((s & not_finite) != 0u);
        s = 0;
        CHECK(std::isfinite(q15_zero(bad, &s)));
        CHECK((s & not_finite) != 0u);
        s = 0;
        CHECK(std::isfinite(curved_span(bad, 1.0f, &s)));
        CHECK((s & not_finite) != 0u);
        CHECK(std::isfinite(curved_zero(bad, nullptr)));
        CHECK(std::isfinite(f32_zero(bad, nullptr)));
        CHECK(std::isfinite(q15_span(bad, bad, nullptr)));
    }
}

TEST_CASE("integer-only q15 path agrees with the float path within its quantisation") {
    // Quantisation of the integer path: the signal in whole pA, the reading in
    // whole ppb, the axes in whole mK and Pa, and the 2^-shift gain; against the
    // float q15 path on the same tables.
    std::mt19937 rng(99u);
    const auto& a = *garage().table;
    std::uniform_real_distribution<double> ut(a.temperature.from, a.temperature.to);
    std::uniform_real_distribution<double> up(a.pressure.from, a.pressure.to);
    std::uniform_real_distribution<double> uy(0.0, garage().full_scale_mol_mol);
    double worst_ppb = 0.0;
    for (int k = 0; k < 3000; ++k) {
        const double t = ut(rng), p = up(rng), y = uy(rng);
        const double i = counterflux::limiting_current_A(garage().model, t, p, y).value + zero_of(garage(), t);
        const auto i_pA = static_cast<std::int32_t>(std::lround(i * 1.0e12));
        const auto t_mK = static_cast<std::int32_t>(std::lround(t * 1000.0));
        const auto p_Pa = static_cast<std::int32_t>(std::lround(p));
        unsigned s = 0xffffu;
        const std::int32_t fixed = q15_reading_fixed(i_pA, t_mK, p_Pa, &s);
        CHECK(s == 0u);
        const double flt = static_cast<double>(q15_reading(static_cast<float>(static_cast<double>(i_pA) * 1.0e-12),
                                                           static_cast<float>(static_cast<double>(t_mK) / 1000.0),
                                                           static_cast<float>(p_Pa), nullptr));
        worst_ppb = std::max(worst_ppb, std::fabs(static_cast<double>(fixed) - flt * 1.0e9));
        // and against the truth, within the proven bound plus that quantisation
        const double floor = 0.1 * garage().full_scale_mol_mol;
        CHECK(std::fabs(static_cast<double>(fixed) * 1.0e-9 - y) / std::max(y, floor) <=
              allowance(q15_fixed_proven_error()));
    }
    MESSAGE("integer path vs float q15 path: worst " << worst_ppb << " ppb; integer path proven "
                                                       << q15_fixed_proven_error() << ", float q15 path "
                                                       << q15_proven_error());
    // The integer path's own bound includes its quantisation (whole pA, mK, Pa and
    // ppb): near the float path's, not orders above it.
    CHECK(q15_fixed_proven_error() < 2.0f * q15_proven_error());
    // a few ppb of rounding, and the position error of the 1-LSB Q15 fraction
    // on a 500 ppm full scale (1/32768 of a cell of the correction table)
    CHECK(worst_ppb < 20.0);
    unsigned s = 0;
    CHECK(q15_reading_fixed(100000, 100000, 90000, &s) != 0);
    CHECK((s & 0x40u) != 0u);
    CHECK(q15_reading_fixed(2147483647, 400000, 200000, &s) > 0);
    CHECK((s & (0x20u | 0x80u | 0x200u)) == (0x20u | 0x80u | 0x200u));
}
