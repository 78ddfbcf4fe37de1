// tools/tables.hpp - the compensation tables of one sensor design and the proof
// of their interpolation error.
//
// Every node value comes from the library's full model (signal.hpp span_factor,
// ambient.hpp zero_current_A, compensation.hpp curvature_at and shape_function);
// every checked reading comes from the library's table lookup
// (compensation.hpp reading() on the stored float32 or q15 values), i.e. the
// very arithmetic the firmware runs. This file only lays out the grids, walks
// the proof points and keeps the worst case.
#ifndef COUNTERFLUX_TOOLS_TABLES_HPP
#define COUNTERFLUX_TOOLS_TABLES_HPP

#include <cstddef>
#include <cstdint>
#include <string>
#include <vector>

#include "sensor_file.hpp"

namespace counterflux::tool {

/// One uniform axis of a generated table (SI).
struct grid_axis {
    double from = 0.0;
    double to = 0.0;
    std::size_t count = 0;
    double step() const { return count > 1 ? (to - from) / static_cast<double>(count - 1) : 0.0; }
    double node(std::size_t i) const { return i + 1 == count ? to : from + static_cast<double>(i) * step(); }
};

/// A table in its stored form: float32 values, or q15 values with the scale and
/// offset that decode them (value = offset + scale * q / 32768).
struct stored_table {
    std::vector<double> exact;        ///< the model's node values (double)
    std::vector<float> f32;           ///< float32 form (always filled: also the q15 table's float view)
    std::vector<std::int16_t> q15;    ///< q15 form (only for q15 tables)
    float scale = 1.0f;               ///< q15 scale (1 for float32)
    float offset = 0.0f;              ///< q15 offset (0 for float32)
};

/// Where the proof found its worst case.
struct proof_point {
    double temperature_K = 0.0;
    double pressure_Pa = 0.0;
    double mole_fraction = 0.0;       ///< for the reading; 0 for the span
    double error = 0.0;               ///< relative
};

/// The proven error of a set of tables.
struct table_proof {
    proof_point span;                 ///< worst |s_table - s| / s
    proof_point reading;              ///< worst |r_table - r| / max(r, r_fs / 10)
    double max_error = 0.0;           ///< the larger of the two: the bound the firmware sees
    std::size_t condition_points = 0; ///< (T, P) points checked
    std::size_t reading_points = 0;   ///< (T, P, y) points checked
    std::size_t fine_t = 0, fine_p = 0; ///< the proof grid (ten times finer, cell centres included)
    std::vector<double> fine_temperatures;     ///< K, the proof grid's temperatures
    std::vector<double> error_by_temperature;  ///< worst span or reading error at each of them
};

/// One integer axis of the integer-only reading (q15 tables of a linear law):
/// inputs in whole mK or Pa, position in steps = (x - from) (count - 1) / span.
struct fixed_axis {
    std::int64_t from = 0;        ///< first node, mK or Pa (rounded)
    std::int64_t span = 0;        ///< last node - first node, mK or Pa (rounded)
    std::uint64_t inv_q32 = 0;    ///< round(2^32 (count - 1) / span): steps per unit, Q32
    std::size_t count = 0;
};

/// The constants of SYMBOL_reading_fixed (signal in pA, reading in ppb or mPa)
/// and its own proven error (it quantises inputs, constants and the output).
struct fixed_path {
    bool present = false;         ///< q15 values, linear law, representable axes and currents
    fixed_axis temperature;       ///< mK
    fixed_axis pressure;          ///< Pa
    int shift = 0;                ///< gain constants are scaled by 2^shift
    std::int64_t gain_offset = 0; ///< (gain c) offset, reading units per pA times 2^shift
    std::int64_t gain_scale = 0;  ///< (gain c) q15 scale, same unit
    std::int64_t zero_offset_pA = 0;
    std::int64_t zero_scale_pA = 0;
    double unit = 0.0;            ///< SI value of one output count (1e-9 mol/mol, or 1e-3 Pa)
    proof_point worst;            ///< its worst reading error (proof measure), 0 until proven
};

/// Everything the table verb writes.
struct table_set {
    std::string symbol;
    std::string values;               ///< "float32" or "q15"
    bool partial_pressure = false;    ///< the reading is y P (Pa), else y (mol/mol)
    double reference_temperature_K = 0.0;
    double reference_pressure_Pa = 0.0;
    double sensitivity_A = 0.0;       ///< S_ref, A per mol/mol
    double gain = 0.0;                ///< reading units per A at the reference
    double full_scale = 0.0;          ///< in reading units
    double full_scale_mol_mol = 0.0;
    double zero_current_A = 0.0;      ///< [zero] current at the reference
    double zero_per_K = 0.0;          ///< [zero] temperature coefficient
    grid_axis temperature, pressure;  ///< K, Pa
    stored_table span;                ///< s(T, P) at the nodes (reported; not interpolated by firmware)
    stored_table correction;          ///< c = 1 / s, [it * np + ip]
    stored_table zero;                ///< I0(T), A
    bool linear = true;               ///< false: the curved law r = w h(gamma w)
    stored_table curvature;           ///< gamma(T, P) (1 or 1/Pa), when not linear
    grid_axis shape_axis;             ///< z axis of h, when not linear
    stored_table shape;               ///< h(z), when not linear
    table_proof proof;
    fixed_path fixed;                 ///< the integer-only reading, for q15 tables of a linear law
    std::uint32_t source_crc32 = 0;   ///< CRC-32 of the sensor file's bytes
    std::size_t table_bytes() const;  ///< bytes of table data in the generated header / record
};

/// The integer-only reading of t.fixed, exactly as the generated
/// SYMBOL_reading_fixed computes it (the header's C is the same arithmetic):
/// signal in pA, temperature in mK, pressure in Pa; reading in output counts.
/// flags receives the status bits the C function sets.
std::int32_t fixed_reading(const table_set& t, std::int32_t signal_pA, std::int32_t temperature_mK,
                           std::int32_t pressure_Pa, unsigned& flags);

/// Builds the tables of file's [table] on the given axes (counts > 1) with the
/// given value type and proves them. Throws input_error when the model cannot
/// be evaluated at a node (naming the [table] axis and the part to blame).
table_set build_tables(const sensor_file& file, const grid_axis& temperature, const grid_axis& pressure,
                       const std::string& values);

/// The grid of file's [table]: the given point counts, or, where an axis has
/// none, a count chosen to meet max_error: first from one-dimensional error
/// estimates (half the bound to each chosen axis), grown by about an eighth on
/// the axis with the larger error until the full proof meets the bound, then
/// each chosen axis bisected down to the fewest points that still meet it with
/// the other axis as it is. When no grid up to max_grid_points per axis meets
/// the bound, the largest tried is returned (its proof then exceeds it).
table_set choose_and_build(const sensor_file& file, const std::string& values);

/// Most nodes per axis choose_and_build tries.
inline constexpr std::size_t max_grid_points = 257;

}  // namespace counterflux::tool

#endif  // COUNTERFLUX_TOOLS_TABLES_HPP
