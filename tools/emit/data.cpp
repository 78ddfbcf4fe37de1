// tools/emit/data.cpp - the CSV, JSON and binary-record outputs of a table set.
#include <cstdio>
#include <sstream>
#include <string>

#include <counterflux/record.hpp>

#include "../errors.hpp"
#include "emit.hpp"

namespace counterflux::tool {

namespace {

std::string num(double v) {
    char b[40];
    std::snprintf(b, sizeof b, "%.9g", v);
    return b;
}

// Rows of n values of a row-major nt x n table as nested JSON arrays.
nlohmann::json rows(const std::vector<float>& v, std::size_t n) {
    nlohmann::json a = nlohmann::json::array();
    for (std::size_t i = 0; i < v.size(); i += n) {
        nlohmann::json r = nlohmann::json::array();
        for (std::size_t j = 0; j < n; ++j) r.push_back(static_cast<double>(v[i + j]));
        a.push_back(r);
    }
    return a;
}

nlohmann::json rows(const std::vector<double>& v, std::size_t n) {
    nlohmann::json a = nlohmann::json::array();
    for (std::size_t i = 0; i < v.size(); i += n)
        a.push_back(std::vector<double>(v.begin() + static_cast<std::ptrdiff_t>(i),
                                        v.begin() + static_cast<std::ptrdiff_t>(i + n)));
    return a;
}

nlohmann::json axis(const char* name, const grid_axis& a, const char* unit) {
    return {{"name", name}, {"from", a.from}, {"to", a.to}, {"step", a.step()}, {"count", a.count}, {"unit", unit}};
}

nlohmann::json point(const proof_point& p, bool with_fraction) {
    nlohmann::json j = {{"temperature_K", p.temperature_K}, {"pressure_Pa", p.pressure_Pa}, {"error", p.error}};
    if (with_fraction) j["mole_fraction"] = p.mole_fraction;
    return j;
}

nlohmann::json stored(const stored_table& t, std::size_t row, const char* unit) {
    nlohmann::json j;
    j["unit"] = unit;
    j["values"] = row > 0 ? rows(t.f32, row) : nlohmann::json(std::vector<double>(t.f32.begin(), t.f32.end()));
    if (!t.q15.empty()) {
        j["q15"] = t.q15;
        j["q15_scale"] = static_cast<double>(t.scale);
        j["q15_offset"] = static_cast<double>(t.offset);
    }
    return j;
}

}  // namespace

std::string csv_text(const table_set& t) {
    std::ostringstream o;
    o << "temperature[K],temperature[C],pressure[Pa],span[1],span_correction[1],zero_current[A]";
    if (!t.linear) o << (t.partial_pressure ? ",curvature[1/Pa]" : ",curvature[1]");
    o << "\r\n";  // RFC 4180 line ends
    const std::size_t np = t.pressure.count;
    for (std::size_t i = 0; i < t.temperature.count; ++i)
        for (std::size_t j = 0; j < np; ++j) {
            const double tk = t.temperature.node(i);
            o << num(tk) << ',' << num(tk - 273.15) << ',' << num(t.pressure.node(j)) << ','
              << num(t.span.exact[i * np + j]) << ',' << num(t.correction.exact[i * np + j]) << ','
              << num(t.zero.exact[i]);
            if (!t.linear) o << ',' << num(t.curvature.exact[i * np + j]);
            o << "\r\n";
        }
    return o.str();
}

nlohmann::json json_document(const table_set& t, const provenance& p) {
    nlohmann::json j;
    j["symbol"] = t.symbol;
    j["generator"] = p.generator;
    j["input"] = p.input;
    j["input_crc32"] = t.source_crc32;
    j["recipe"] = p.recipe;
    if (!p.unit_id.empty()) j["unit"] = p.unit_id;
    j["values"] = t.values;
    j["report"] = t.partial_pressure ? "partial-pressure" : "fraction";
    j["reference"] = {{"temperature_K", t.reference_temperature_K}, {"pressure_Pa", t.reference_pressure_Pa}};
    j["sensitivity_A_per_mol_per_mol"] = t.sensitivity_A;
    j["gain"] = t.gain;
    j["full_scale"] = t.full_scale;
    j["zero_model"] = {{"current_A", t.zero_current_A}, {"temperature_coefficient_per_K", t.zero_per_K}};
    j["axes"] = nlohmann::json::array({axis("temperature", t.temperature, "K"), axis("pressure", t.pressure, "Pa")});
    j["span"] = rows(t.span.exact, t.pressure.count);
    j["span_correction"] = stored(t.correction, t.pressure.count, "1");
    j["zero_current"] = stored(t.zero, 0, "A");
    j["linear"] = t.linear;
    if (!t.linear) {
        j["curvature"] = stored(t.curvature, t.pressure.count, t.partial_pressure ? "1/Pa" : "1");
        j["shape_axis"] = axis("z", t.shape_axis, "1");
        j["shape"] = stored(t.shape, 0, "1");
    }
    j["max_interpolation_error"] = t.proof.max_error;
    j["max_span_error"] = t.proof.span.error;
    j["max_reading_error"] = t.proof.reading.error;
    j["worst_span"] = point(t.proof.span, false);
    j["worst_reading"] = point(t.proof.reading, true);
    j["proof"] = {{"grid", {t.proof.fine_t, t.proof.fine_p}},
                  {"conditions", t.proof.condition_points},
                  {"readings", t.proof.reading_points},
                  {"reading_error_floor_of_full_scale", 0.1}};
    j["table_bytes"] = t.table_bytes();
    if (t.fixed.present) {
        j["max_fixed_point_error"] = t.fixed.worst.error;
        j["fixed_point_output_unit"] = t.fixed.unit;
    }
    return j;
}

std::vector<std::uint8_t> record_bytes(const table_set& t, const provenance& p) {
    const bool q15 = t.values == "q15";
    record_contents c{};
    c.symbol = t.symbol.c_str();
    c.unit_id = p.unit_id.c_str();
    c.values = q15 ? record_values::q15 : record_values::float32;
    c.report = t.partial_pressure ? record_report::partial_pressure : record_report::mole_fraction;
    c.reference_temperature_K = static_cast<float>(t.reference_temperature_K);
    c.reference_pressure_Pa = static_cast<float>(t.reference_pressure_Pa);
    c.gain = static_cast<float>(t.gain);
    c.full_scale = static_cast<float>(t.full_scale);
    c.source_hash = t.source_crc32;
    const auto ax = [](const grid_axis& a) {
        return record_axis{static_cast<float>(a.from), static_cast<float>(a.step()),
                           static_cast<std::uint16_t>(a.count)};
    };
    c.temperature = ax(t.temperature);
    c.pressure = ax(t.pressure);
    c.shape = t.linear ? record_axis{0.0f, 0.0f, 0} : ax(t.shape_axis);
    const stored_table* tables[4] = {&t.correction, &t.zero, t.linear ? nullptr : &t.curvature,
                                     t.linear ? nullptr : &t.shape};
    for (int k = 0; k < 4; ++k) {
        c.scales[k] = record_scale{1.0f, 0.0f};
        c.data_f32[k] = nullptr;
        c.data_q15[k] = nullptr;
        if (tables[k] == nullptr) continue;
        if (q15) {
            c.scales[k] = record_scale{tables[k]->scale, tables[k]->offset};
            c.data_q15[k] = tables[k]->q15.data();
        } else {
            c.data_f32[k] = tables[k]->f32.data();
        }
    }
    std::vector<std::uint8_t> bytes(record_size(c));
    std::size_t written = 0;
    const record_fault fault = write_record(c, bytes.data(), bytes.size(), written);
    if (fault != record_fault::none)
        throw run_error(std::string("cannot write the calibration record: ") + describe(fault));
    bytes.resize(written);
    return bytes;
}

}  // namespace counterflux::tool
