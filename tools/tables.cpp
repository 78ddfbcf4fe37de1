// tools/tables.cpp - builds and proves the compensation tables (see tables.hpp).
#include "tables.hpp"

#include <algorithm>
#include <cmath>
#include <limits>
#include <string>

#include <counterflux/ambient.hpp>
#include <counterflux/compensation.hpp>
#include <counterflux/record.hpp>
#include <counterflux/signal.hpp>
#include <counterflux/table.hpp>

#include "errors.hpp"
#include "report.hpp"

namespace counterflux::tool {

namespace {

// The proof grid is ten times finer than the table on each axis: ten proof
// intervals per table cell, so the cell centres (interval 5) are on it.
constexpr std::size_t proof_refinement = 10;

// Concentrations of the reading proof: 0, 10 %, ..., 100 % of full scale for a
// linear law; for a curved law ten per cell of the shape table h(z) as well.
std::size_t proof_fractions(const table_set& t) {
    if (t.linear) return 10;
    return std::max<std::size_t>(10, proof_refinement * (t.shape_axis.count - 1));
}

// The reading error is relative to the reading, and to a tenth of full scale
// below that: an accuracy stated "of reading or of 10 % of full scale, whichever
// is greater" (common practice for gas detectors, no source).
constexpr double reading_floor_of_full_scale = 0.1;

// The shape axis covers z from the full-scale reading's z times this margin
// (over-range up to 125 % of the linearised full scale, common practice) down
// to a tenth of it on the other side of zero (readings below zero).
constexpr double shape_over_range = 1.25;
constexpr double shape_under_range = 0.1;

// Most nodes of the shape table h(z).
constexpr std::size_t max_shape_points = 1025;

// Fills the stored forms of t.exact.
void store(stored_table& t, const std::string& values) {
    t.f32.resize(t.exact.size());
    t.q15.clear();
    t.scale = 1.0f;
    t.offset = 0.0f;
    if (values == "q15") {
        const auto [lo, hi] = std::minmax_element(t.exact.begin(), t.exact.end());
        const q15_scale<float> s = q15_scale_for(static_cast<float>(*lo), static_cast<float>(*hi));
        t.scale = s.scale;
        t.offset = s.offset;
        t.q15.resize(t.exact.size());
        for (std::size_t i = 0; i < t.exact.size(); ++i) {
            t.q15[i] = q15_encode(static_cast<float>(t.exact[i]), s);
            t.f32[i] = q15_decode(t.q15[i], s);
        }
    } else {
        for (std::size_t i = 0; i < t.exact.size(); ++i) t.f32[i] = static_cast<float>(t.exact[i]);
    }
}

uniform_axis<float> float_axis(const grid_axis& a) {
    return make_uniform_axis(static_cast<float>(a.from), static_cast<float>(a.to), a.count);
}

// The library's reading over the stored tables, exactly as firmware runs it.
class stored_lookup {
public:
    explicit stored_lookup(const table_set& t) : t_(t) {
        if (t.values == "q15") {
            q_.temperature = float_axis(t.temperature);
            q_.pressure = float_axis(t.pressure);
            q_.correction = t.correction.q15.data();
            q_.zero = t.zero.q15.data();
            q_.correction_scale = {t.correction.scale, t.correction.offset};
            q_.zero_scale = {t.zero.scale, t.zero.offset};
            q_.gain = static_cast<float>(t.gain);
            q_.curvature = nullptr;
            q_.shape = nullptr;
            q_.shape_axis = make_uniform_axis(0.0f, 1.0f, 2);
            if (!t.linear) {
                q_.curvature = t.curvature.q15.data();
                q_.shape = t.shape.q15.data();
                q_.curvature_scale = {t.curvature.scale, t.curvature.offset};
                q_.shape_scale = {t.shape.scale, t.shape.offset};
                q_.shape_axis = float_axis(t.shape_axis);
            }
        } else {
            f_.temperature = float_axis(t.temperature);
            f_.pressure = float_axis(t.pressure);
            f_.correction = t.correction.f32.data();
            f_.zero = t.zero.f32.data();
            f_.gain = static_cast<float>(t.gain);
            f_.curvature = nullptr;
            f_.shape = nullptr;
            f_.shape_axis = make_uniform_axis(0.0f, 1.0f, 2);
            if (!t.linear) {
                f_.curvature = t.curvature.f32.data();
                f_.shape = t.shape.f32.data();
                f_.shape_axis = float_axis(t.shape_axis);
            }
        }
    }
    double span_at(double temperature_K, double pressure_Pa) const {
        const auto tk = static_cast<float>(temperature_K);
        const auto pp = static_cast<float>(pressure_Pa);
        return static_cast<double>(q15() ? span(q_, tk, pp).value : span(f_, tk, pp).value);
    }
    double reading_at(double signal_A, double temperature_K, double pressure_Pa) const {
        const auto i = static_cast<float>(signal_A);
        const auto tk = static_cast<float>(temperature_K);
        const auto pp = static_cast<float>(pressure_Pa);
        return static_cast<double>(q15() ? reading(q_, i, tk, pp).value : reading(f_, i, tk, pp).value);
    }

private:
    bool q15() const { return t_.values == "q15"; }
    const table_set& t_;
    compensation_ref<float> f_{};
    compensation_q15_ref<float> q_{};
};

double model_zero(const table_set& t, double temperature_K) {
    const auto z = zero_current_A(t.zero_current_A, t.zero_per_K, t.reference_temperature_K, temperature_K);
    return z.value;
}

// The full model's span factor at a node, or an input_error naming the axis.
double model_span(const sensor_file& f, double temperature_K, double pressure_Pa) {
    const auto s = span_factor(f.model, temperature_K, pressure_Pa);
    if (s.ok() && s.value > 0.0) return s.value;
    const std::string condition = "the table node " + format_temperature(temperature_K) + ", " +
                                  format_pressure(pressure_Pa);
    std::vector<diagnostic> why;
    why.push_back({f.table->place, "the span factor cannot be computed at " + condition + ": " + describe(s.code) +
                                       "; narrow the [table] axes"});
    if (auto d = diagnose_condition(f, temperature_K, pressure_Pa, condition)) why.push_back(*d);
    throw input_error(std::move(why));
}

// The proof on the grid fine_t x fine_p (subdivisions of the table's axes):
// span everywhere, reading at every concentration of the proof set.
table_proof prove(const sensor_file& f, const table_set& t, const std::vector<double>& ts,
                  const std::vector<double>& ps, proof_point* fixed_out = nullptr) {
    const stored_lookup lookup(t);
    table_proof proof;
    const bool fixed = fixed_out != nullptr && t.fixed.present;
    proof_point fixed_worst;
    proof.fine_t = ts.size();
    proof.fine_p = ps.size();
    proof.fine_temperatures = ts;
    proof.error_by_temperature.assign(ts.size(), 0.0);
    // One condition: the span, and the reading at every concentration of the set.
    const auto check = [&](double tk, double pp, double& worst_here) {
        const double i0 = model_zero(t, tk);
        ++proof.condition_points;
        const double s = model_span(f, tk, pp);
        const double se = std::fabs(lookup.span_at(tk, pp) - s) / s;
        if (!(se <= proof.span.error)) proof.span = {tk, pp, 0.0, se};
        worst_here = std::max(worst_here, se);
        const double scale = t.partial_pressure ? pp : 1.0;
        const double floor = reading_floor_of_full_scale * t.full_scale_mol_mol * scale;
        const std::size_t ny = proof_fractions(t);
        for (std::size_t k = 0; k <= ny; ++k) {
            const double y = t.full_scale_mol_mol * static_cast<double>(k) / static_cast<double>(ny);
            const auto current = limiting_current_A(f.model, tk, pp, y);
            if (!current.ok())
                throw run_error("the model's current at " + format_concentration(y) + ", " + format_temperature(tk) +
                                ", " + format_pressure(pp) + " cannot be computed: " + describe(current.code));
            ++proof.reading_points;
            const double truth = y * scale;
            const double got = lookup.reading_at(current.value + i0, tk, pp);
            const double e = std::fabs(got - truth) / std::max(truth, floor);
            if (!(e <= proof.reading.error)) proof.reading = {tk, pp, y, e};
            worst_here = std::max(worst_here, e);
            if (fixed) {
                // The integer path's inputs as firmware has them: whole pA, mK and Pa.
                unsigned flags = 0u;
                const auto i_pA = static_cast<std::int32_t>(std::llround((current.value + i0) * 1.0e12));
                const auto t_mK = static_cast<std::int32_t>(std::llround(tk * 1000.0));
                const auto p_Pa = static_cast<std::int32_t>(std::llround(pp));
                const double r = static_cast<double>(fixed_reading(t, i_pA, t_mK, p_Pa, flags)) * t.fixed.unit;
                const double ef = std::fabs(r - truth) / std::max(truth, floor);
                if (!(ef <= fixed_worst.error)) fixed_worst = {tk, pp, y, ef};
            }
        }
    };
    for (std::size_t it = 0; it < ts.size(); ++it)
        for (const double pp : ps) check(ts[it], pp, proof.error_by_temperature[it]);
    // Then ten times finer again around the worst points found (one proof step
    // either side), where the error surface peaks.
    if (ts.size() > 1 && ps.size() > 1) {
        const double ht = ts[1] - ts[0], hp = ps[1] - ps[0];
        double unused = 0.0;
        for (const proof_point w : {proof.reading, proof.span}) {
            for (int a = -10; a <= 10; ++a)
                for (int b = -10; b <= 10; ++b) {
                    const double tk = std::clamp(w.temperature_K + ht * a / 10.0, ts.front(), ts.back());
                    const double pp = std::clamp(w.pressure_Pa + hp * b / 10.0, ps.front(), ps.back());
                    check(tk, pp, unused);
                }
        }
    }
    proof.max_error = std::max(proof.span.error, proof.reading.error);
    if (fixed) {
        // The proof points are round numbers, where the integer path's input and
        // output rounding vanish; add its worst case in the proof's measure: half
        // an output count and half a pA of signal, over the smallest floor, and
        // half a mK / half a Pa times the steepest relative slope of the tables.
        const double floor_min = reading_floor_of_full_scale * t.full_scale_mol_mol *
                                 (t.partial_pressure ? t.pressure.from : 1.0);
        const std::size_t nt = t.temperature.count, np = t.pressure.count;
        double c_max = 0.0, slope_t = 0.0, slope_p = 0.0, zero_slope = 0.0;
        for (std::size_t i = 0; i < nt; ++i)
            for (std::size_t j = 0; j < np; ++j) {
                const double c = t.correction.exact[i * np + j];
                c_max = std::max(c_max, c);
                if (i + 1 < nt)
                    slope_t = std::max(slope_t, std::fabs(t.correction.exact[(i + 1) * np + j] - c) /
                                                    (c * t.temperature.step()));
                if (j + 1 < np)
                    slope_p = std::max(slope_p, std::fabs(t.correction.exact[i * np + j + 1] - c) /
                                                    (c * t.pressure.step()));
            }
        for (std::size_t i = 0; i + 1 < nt; ++i)
            zero_slope = std::max(zero_slope, std::fabs(t.zero.exact[i + 1] - t.zero.exact[i]) / t.temperature.step());
        const double quantisation = (0.5 * t.fixed.unit + 0.5e-12 * t.gain * c_max) / floor_min +
                                    0.5e-3 * (slope_t + zero_slope * t.gain * c_max / floor_min) + 0.5 * slope_p;
        fixed_worst.error += quantisation;
        *fixed_out = fixed_worst;
    }
    return proof;
}

std::vector<double> refine(const grid_axis& a) {
    std::vector<double> v;
    const std::size_t n = (a.count - 1) * proof_refinement + 1;
    v.reserve(n);
    for (std::size_t i = 0; i < n; ++i)
        v.push_back(i + 1 == n ? a.to
                               : a.from + (a.to - a.from) * static_cast<double>(i) / static_cast<double>(n - 1));
    return v;
}

// h(z) on n nodes over [lo, hi], and its worst relative interpolation error on
// a ten times finer grid (in the stored form).
double shape_table(table_set& t, double lo, double hi, std::size_t n, const std::string& values) {
    t.shape_axis = {lo, hi, n};
    t.shape.exact.resize(n);
    for (std::size_t i = 0; i < n; ++i) t.shape.exact[i] = shape_function(t.shape_axis.node(i)).value;
    store(t.shape, values);
    const uniform_axis<float> a = float_axis(t.shape_axis);
    double worst = 0.0;
    for (const double z : refine(t.shape_axis)) {
        const double h = shape_function(z).value;
        const double got = values == "q15"
                               ? static_cast<double>(interpolate_1d(a, t.shape.q15.data(),
                                                                    q15_scale<float>{t.shape.scale, t.shape.offset},
                                                                    static_cast<float>(z))
                                                         .value)
                               : static_cast<double>(interpolate_1d(a, t.shape.f32.data(), static_cast<float>(z)).value);
        worst = std::max(worst, std::fabs(got - h) / h);
    }
    return worst;
}

// The integer axis of a grid axis scaled to whole units (mK: 1000, Pa: 1); absent
// (count 0) when the span has fewer than two units per step or leaves int32.
fixed_axis make_fixed_axis(const grid_axis& a, double units) {
    fixed_axis f;
    const double from = std::round(a.from * units), to = std::round(a.to * units);
    const double span = to - from;
    if (!(span >= 2.0 * static_cast<double>(a.count - 1)) || std::fabs(from) > 2.0e9 || std::fabs(to) > 2.0e9)
        return f;
    f.from = static_cast<std::int64_t>(from);
    f.span = static_cast<std::int64_t>(span);
    f.inv_q32 = static_cast<std::uint64_t>(std::llround(4294967296.0 * static_cast<double>(a.count - 1) / span));
    f.count = a.count;
    return f;
}

// The constants of the integer-only reading (q15 values, linear law).
fixed_path make_fixed(const table_set& t) {
    fixed_path f;
    if (t.values != "q15" || !t.linear) return f;
    f.temperature = make_fixed_axis(t.temperature, 1000.0);
    f.pressure = make_fixed_axis(t.pressure, 1.0);
    if (f.temperature.count == 0 || f.pressure.count == 0) return f;
    // Full-scale current (with the zero) must fit int32 pA, and the zero table too.
    const double i_max = t.full_scale / t.gain * 2.0 + std::fabs(static_cast<double>(t.zero.offset)) +
                         std::fabs(static_cast<double>(t.zero.scale));
    if (!(i_max * 1.0e12 < 2.0e9)) return f;
    f.unit = t.partial_pressure ? 1.0e-3 : 1.0e-9;
    const double per_pA = t.gain * 1.0e-12 / f.unit;  // output counts per pA at c = 1
    const double c_hi = std::max(std::fabs(static_cast<double>(t.correction.offset)) +
                                     std::fabs(static_cast<double>(t.correction.scale)),
                                 1.0e-30);
    int shift = 0;
    while (shift < 46 && per_pA * c_hi * std::ldexp(1.0, shift + 1) < 1073741824.0) ++shift;
    f.shift = shift;
    f.gain_offset = std::llround(static_cast<double>(t.correction.offset) * per_pA * std::ldexp(1.0, shift));
    f.gain_scale = std::llround(static_cast<double>(t.correction.scale) * per_pA * std::ldexp(1.0, shift));
    f.zero_offset_pA = std::llround(static_cast<double>(t.zero.offset) * 1.0e12);
    f.zero_scale_pA = std::llround(static_cast<double>(t.zero.scale) * 1.0e12);
    f.present = true;
    return f;
}

std::int32_t lerp_q15(std::int32_t a, std::int32_t b, std::int32_t f) { return a + (((b - a) * f + 16384) >> 15); }

// Cell index and Q15 fraction on an integer axis, clamped and flagged, as the header does.
std::int32_t fixed_position(const fixed_axis& a, std::int32_t x, unsigned below, unsigned above, unsigned& flags,
                            std::int32_t& fraction) {
    std::int64_t d = static_cast<std::int64_t>(x) - a.from;
    if (d < 0) {
        flags |= below | 0x10u;
        d = 0;
    }
    if (d > a.span) {
        flags |= above | 0x20u;
        d = a.span;
    }
    const auto pos = static_cast<std::uint32_t>((static_cast<std::uint64_t>(d) * a.inv_q32 + 65536u) >> 17);
    auto i = static_cast<std::int32_t>(pos >> 15);
    fraction = static_cast<std::int32_t>(pos & 0x7fffu);
    const auto last_cell = static_cast<std::int32_t>(a.count) - 2;
    if (i > last_cell) {
        i = last_cell;
        fraction = 32768;
    }
    return i;
}

}  // namespace

std::int32_t fixed_reading(const table_set& t, std::int32_t signal_pA, std::int32_t temperature_mK,
                           std::int32_t pressure_Pa, unsigned& flags) {
    const fixed_path& f = t.fixed;
    flags = 0u;
    std::int32_t ft = 0, fp = 0;
    const std::int32_t it = fixed_position(f.temperature, temperature_mK, 0x40u, 0x80u, flags, ft);
    const std::int32_t ip = fixed_position(f.pressure, pressure_Pa, 0x100u, 0x200u, flags, fp);
    const auto np = static_cast<std::size_t>(f.pressure.count);
    const std::int16_t* v = t.correction.q15.data() + static_cast<std::size_t>(it) * np + static_cast<std::size_t>(ip);
    const std::int32_t a = lerp_q15(v[0], v[1], fp);
    const std::int32_t b = lerp_q15(v[np], v[np + 1], fp);
    const std::int32_t q = lerp_q15(a, b, ft);
    const std::int32_t zq = lerp_q15(t.zero.q15[static_cast<std::size_t>(it)], t.zero.q15[static_cast<std::size_t>(it) + 1], ft);
    const std::int64_t k = f.gain_offset + ((f.gain_scale * q) >> 15);
    const std::int64_t zero = f.zero_offset_pA + ((f.zero_scale_pA * zq) >> 15);
    std::int64_t r = (static_cast<std::int64_t>(signal_pA) - zero) * k;
    if (f.shift > 0) r = (r + (std::int64_t(1) << (f.shift - 1))) >> f.shift;
    if (r > 2147483647) {
        r = 2147483647;
        flags |= 0x20u;
    }
    if (r < -2147483647) {
        r = -2147483647;
        flags |= 0x10u;
    }
    return static_cast<std::int32_t>(r);
}

std::size_t table_set::table_bytes() const {
    const std::size_t element = values == "q15" ? 2 : 4;
    std::size_t n = correction.exact.size() + zero.exact.size();
    if (!linear) n += curvature.exact.size() + shape.exact.size();
    return n * element;
}

namespace {

// The node values and their stored forms, without the proof.
table_set build_nodes(const sensor_file& f, const grid_axis& temperature, const grid_axis& pressure,
                      const std::string& values) {
    const auto& m = f.model;
    table_set t;
    t.symbol = f.symbol;
    t.values = values;
    t.partial_pressure = m.reading == reading_kind::partial_pressure;
    t.reference_temperature_K = m.reference_temperature_K;
    t.reference_pressure_Pa = m.reference_pressure_Pa;
    t.full_scale_mol_mol = f.full_scale_mol_mol;
    t.full_scale = t.full_scale_mol_mol * (t.partial_pressure ? t.reference_pressure_Pa : 1.0);
    const auto s = sensitivity_A_per_mol_per_mol(m, t.reference_temperature_K, t.reference_pressure_Pa);
    if (!s.ok() || !(s.value > 0.0)) throw run_error("the sensitivity at the reference condition cannot be computed");
    t.sensitivity_A = s.value;
    t.gain = (t.partial_pressure ? t.reference_pressure_Pa : 1.0) / s.value;
    if (f.zero) {
        t.zero_current_A = f.zero->current_A;
        t.zero_per_K = f.zero->per_K;
    }
    t.source_crc32 = crc32(reinterpret_cast<const std::uint8_t*>(f.text.data()), f.text.size());
    t.temperature = temperature;
    t.pressure = pressure;

    const std::size_t nt = temperature.count, np = pressure.count;
    t.span.exact.resize(nt * np);
    t.correction.exact.resize(nt * np);
    t.zero.exact.resize(nt);
    t.linear = m.flux_ratio == -1.0;  // alpha = 1 + N_B/N_A = 0: the log law is linear
    if (!t.linear) t.curvature.exact.resize(nt * np);
    double z_low = 0.0, z_high = 0.0, z_abs = 0.0;
    for (std::size_t i = 0; i < nt; ++i) {
        const double tk = temperature.node(i);
        t.zero.exact[i] = model_zero(t, tk);
        for (std::size_t j = 0; j < np; ++j) {
            const double pp = pressure.node(j);
            const double sv = model_span(f, tk, pp);
            t.span.exact[i * np + j] = sv;
            t.correction.exact[i * np + j] = 1.0 / sv;
            if (t.linear) continue;
            const auto g = curvature_at(m, tk, pp, t.full_scale_mol_mol);
            if (!g.ok())
                throw run_error("the curvature of the linearity law at " + format_temperature(tk) + ", " +
                                format_pressure(pp) + " cannot be computed: " + describe(g.code));
            t.curvature.exact[i * np + j] = g.value;
            const auto current = limiting_current_A(m, tk, pp, t.full_scale_mol_mol);
            if (!current.ok())
                throw run_error("the current at full scale at " + format_temperature(tk) + ", " +
                                format_pressure(pp) + " cannot be computed: " + describe(current.code));
            const double w_fs = current.value * t.gain / sv;
            const double z = g.value * w_fs;
            z_low = std::min(z_low, z);
            z_high = std::max(z_high, z);
            z_abs = std::max(z_abs, std::fabs(z));
        }
    }
    store(t.span, "float32");
    store(t.correction, values);
    store(t.zero, values);
    t.fixed = make_fixed(t);
    if (!t.linear) {
        store(t.curvature, values);
        double lo = std::min(shape_over_range * z_low, -shape_under_range * z_abs);
        double hi = std::max(shape_over_range * z_high, shape_under_range * z_abs);
        if (!(hi > lo)) hi = lo + 1.0;
        // The smallest shape table whose own error is a quarter of the bound.
        const double target = (f.table ? f.table->max_error : 1.0e-3) / 4.0;
        std::size_t n = 2;
        while (shape_table(t, lo, hi, n, values) > target && n < max_shape_points) n = std::min(max_shape_points, n * 2 - 1);
        if (n > 2) {
            std::size_t good = n, bad = (n + 1) / 2;  // bad failed (or is 2)
            while (good - bad > 1) {
                const std::size_t mid = (good + bad) / 2;
                if (shape_table(t, lo, hi, mid, values) > target) bad = mid;
                else good = mid;
            }
            shape_table(t, lo, hi, good, values);
        }
    }
    return t;
}

}  // namespace

table_set build_tables(const sensor_file& f, const grid_axis& temperature, const grid_axis& pressure,
                       const std::string& values) {
    table_set t = build_nodes(f, temperature, pressure, values);
    t.proof = prove(f, t, refine(temperature), refine(pressure), &t.fixed.worst);
    return t;
}

namespace {

// The worst error along one axis alone: the other axis has its two end nodes
// only, and the proof runs on those two lines, where its interpolation is exact.
double axis_error(const sensor_file& f, bool along_temperature, std::size_t count, const std::string& values) {
    const auto& spec = *f.table;
    grid_axis t{spec.temperature.from, spec.temperature.to, along_temperature ? count : 2};
    grid_axis p{spec.pressure.from, spec.pressure.to, along_temperature ? 2 : count};
    table_set s = build_nodes(f, t, p, values);
    const std::vector<double> fine = refine(along_temperature ? t : p);
    const std::vector<double> ends = {along_temperature ? p.from : t.from, along_temperature ? p.to : t.to};
    s.proof = along_temperature ? prove(f, s, fine, ends) : prove(f, s, ends, fine);
    return s.proof.max_error;
}

// The smallest count (2 .. max_grid_points) whose one-axis error meets target.
std::size_t smallest_count(const sensor_file& f, bool along_temperature, double target, const std::string& values) {
    std::size_t good = 2;
    if (axis_error(f, along_temperature, good, values) <= target) return good;
    std::size_t bad = 2;
    good = 3;
    while (axis_error(f, along_temperature, good, values) > target) {
        bad = good;
        if (good == max_grid_points) return good;
        good = std::min(max_grid_points, good * 2 - 1);
    }
    while (good - bad > 1) {
        const std::size_t mid = (good + bad) / 2;
        if (axis_error(f, along_temperature, mid, values) > target) bad = mid;
        else good = mid;
    }
    return good;
}

// The grid met the bound: take each chosen axis down to the fewest points that
// still meet it with the other axis as it is (bisection on the full proof).
table_set shrink(const sensor_file& f, table_set best, bool choose_t, bool choose_p, const std::string& values) {
    const auto& spec = *f.table;
    for (const bool along_t : {true, false}) {
        if (along_t ? !choose_t : !choose_p) continue;
        std::size_t good = along_t ? best.temperature.count : best.pressure.count, bad = 1;
        while (good - bad > 1) {
            const std::size_t mid = (good + bad) / 2;
            const grid_axis ta{spec.temperature.from, spec.temperature.to, along_t ? mid : best.temperature.count};
            const grid_axis pa{spec.pressure.from, spec.pressure.to, along_t ? best.pressure.count : mid};
            table_set t = build_tables(f, ta, pa, values);
            if (t.proof.max_error <= spec.max_error) {
                good = mid;
                best = std::move(t);
            } else {
                bad = mid;
            }
        }
    }
    return best;
}

}  // namespace

table_set choose_and_build(const sensor_file& f, const std::string& values) {
    const auto& spec = *f.table;
    std::size_t nt = spec.temperature.points, np = spec.pressure.points;
    const bool choose_t = nt == 0, choose_p = np == 0;
    // Half the bound to each axis to start with; the errors of the two axes add
    // (to first order) in the bilinear interpolation.
    if (choose_t) nt = smallest_count(f, true, spec.max_error / 2.0, values);
    if (choose_p) np = smallest_count(f, false, spec.max_error / 2.0, values);
    for (;;) {
        table_set t = build_tables(f, {spec.temperature.from, spec.temperature.to, nt},
                                   {spec.pressure.from, spec.pressure.to, np}, values);
        if (!choose_t && !choose_p) return t;
        if (t.proof.max_error <= spec.max_error) return shrink(f, std::move(t), choose_t, choose_p, values);
        // Grow, by about an eighth, the chosen axis whose own error is larger.
        const bool t_can = choose_t && nt < max_grid_points, p_can = choose_p && np < max_grid_points;
        const double et = t_can ? axis_error(f, true, nt, values) : 0.0;
        const double ep = p_can ? axis_error(f, false, np, values) : 0.0;
        if (t_can && (et >= ep || !p_can)) nt = std::min(max_grid_points, nt + std::max<std::size_t>(1, nt / 8));
        else if (p_can) np = std::min(max_grid_points, np + std::max<std::size_t>(1, np / 8));
        else return t;
    }
}

}  // namespace counterflux::tool
