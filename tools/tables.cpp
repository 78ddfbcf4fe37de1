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
                  const std::vector<double>& ps) {
    const stored_lookup lookup(t);
    table_proof proof;
    proof.fine_t = ts.size();
    proof.fine_p = ps.size();
    proof.fine_temperatures = ts;
    proof.error_by_temperature.assign(ts.size(), 0.0);
    for (std::size_t it = 0; it < ts.size(); ++it) {
        const double tk = ts[it];
        double& worst_here = proof.error_by_temperature[it];
        const double i0 = model_zero(t, tk);
        for (const double pp : ps) {
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
                    throw run_error("the model's current at " + format_concentration(y) + ", " +
                                    format_temperature(tk) + ", " + format_pressure(pp) +
                                    " cannot be computed: " + describe(current.code));
                ++proof.reading_points;
                const double truth = y * scale;
                const double got = lookup.reading_at(current.value + i0, tk, pp);
                const double e = std::fabs(got - truth) / std::max(truth, floor);
                if (!(e <= proof.reading.error)) proof.reading = {tk, pp, y, e};
                worst_here = std::max(worst_here, e);
            }
        }
    }
    proof.max_error = std::max(proof.span.error, proof.reading.error);
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

}  // namespace

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
    t.proof = prove(f, t, refine(temperature), refine(pressure));
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
