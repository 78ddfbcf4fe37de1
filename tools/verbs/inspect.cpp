// tools/verbs/inspect.cpp - `counterflux inspect FILE.bin`: validates a binary
// calibration record with the library's own reader (record.hpp) and prints
// what it holds. Exit 0 for a valid record, 3 for an invalid one, 2 when the
// file cannot be read or is not a regular file of at most 1 MiB.
#include <algorithm>
#include <cerrno>
#include <cstdint>
#include <cstdio>
#include <cstdlib>
#include <cstring>
#include <filesystem>
#include <fstream>
#include <memory>
#include <optional>
#include <ostream>
#include <string>
#include <system_error>
#include <vector>

#include <CLI/CLI.hpp>
#include <nlohmann/json.hpp>

#include <counterflux/record.hpp>

#include "../errors.hpp"
#include "../report.hpp"
#include "verbs.hpp"

namespace counterflux::tool {

namespace {

using counterflux::record_table;

// The file's bytes; input_error (exit 2) naming the file when it is missing,
// not a regular file (symbolic links followed) or larger than the record cap.
std::vector<std::uint8_t> read_record_file(const std::string& name) {
    source_place whole;
    whole.file = name;
    const std::filesystem::path path(name);
    std::error_code ec;
    const auto st = std::filesystem::status(path, ec);
    if (ec || !std::filesystem::exists(st)) {
        const int e = ec ? ec.value() : ENOENT;
        throw input_error(whole, std::string("cannot open the calibration record: ") + std::strerror(e));
    }
    const auto type = st.type();
    if (type != std::filesystem::file_type::regular) {
        const char* what = type == std::filesystem::file_type::directory   ? "a directory"
                           : type == std::filesystem::file_type::fifo      ? "a FIFO"
                           : type == std::filesystem::file_type::socket    ? "a socket"
                           : type == std::filesystem::file_type::character ? "a character device"
                           : type == std::filesystem::file_type::block     ? "a block device"
                                                                            : "not a regular file";
        throw input_error(whole, std::string("is ") + what + ", expected a calibration record (a regular file)");
    }
    const std::size_t cap = counterflux::record_max_size;
    const auto too_big = [&] {
        return input_error(whole, "is larger than " + std::to_string(cap / 1024) +
                                      " KiB (1 MiB), too large for a calibration record");
    };
    const auto size = std::filesystem::file_size(path, ec);
    if (!ec && size > cap) throw too_big();
    std::ifstream in(path, std::ios::binary);
    if (!in) throw input_error(whole, std::string("cannot open the calibration record: ") + std::strerror(errno));
    // Read at most one byte past the cap, so a file that grows is still bounded.
    std::vector<std::uint8_t> bytes(cap + 1);
    in.read(reinterpret_cast<char*>(bytes.data()), static_cast<std::streamsize>(bytes.size()));
    if (in.bad()) throw input_error(whole, "cannot read the calibration record");
    bytes.resize(static_cast<std::size_t>(in.gcount()));
    if (bytes.size() > cap) throw too_big();
    return bytes;
}

const char* fault_name(counterflux::record_fault f) {
    using counterflux::record_fault;
    switch (f) {
        case record_fault::none: return "none";
        case record_fault::truncated: return "truncated";
        case record_fault::wrong_magic: return "wrong_magic";
        case record_fault::unknown_version: return "unknown_version";
        case record_fault::size_mismatch: return "size_mismatch";
        case record_fault::crc_mismatch: return "crc_mismatch";
        case record_fault::bad_contents: return "bad_contents";
    }
    return "unknown";
}

const char* table_name(record_table t) {
    switch (t) {
        case record_table::correction: return "correction";
        case record_table::zero: return "zero";
        case record_table::curvature: return "curvature";
        case record_table::shape: return "shape";
    }
    return "unknown";
}

bool partial_pressure(const counterflux::record_view& v) {
    return v.report() == counterflux::record_report::partial_pressure;
}

// The unit of a table's values (SI; "1" for dimensionless).
std::string table_unit(const counterflux::record_view& v, record_table t) {
    switch (t) {
        case record_table::correction: return "1";
        case record_table::zero: return "A";
        case record_table::curvature: return partial_pressure(v) ? "1/Pa" : "1/(mol/mol)";
        case record_table::shape: return "1";
    }
    return "1";
}

std::string hex32(std::uint32_t x) {
    char buffer[16];
    std::snprintf(buffer, sizeof buffer, "0x%08X", static_cast<unsigned>(x));
    return buffer;
}

struct axis_info {
    const char* name;
    counterflux::record_axis axis;
    const char* unit;
};

std::vector<axis_info> axes_of(const counterflux::record_view& v) {
    std::vector<axis_info> axes{{"temperature", v.temperature(), "K"}, {"pressure", v.pressure(), "Pa"}};
    if (!v.linear()) axes.push_back({"shape", v.shape(), "1"});
    return axes;
}

// The last node from + (count - 1) step, as firmware computes it (in float).
double last_node(const counterflux::record_axis& a) {
    return static_cast<double>(a.from + static_cast<float>(a.count - 1u) * a.step);
}

struct table_summary {
    std::size_t count = 0;
    double first = 0, last = 0, min = 0, max = 0;
};

table_summary summarise(const counterflux::record_view& v, record_table t) {
    table_summary s;
    s.count = v.count(t);
    if (s.count == 0) return s;
    s.first = static_cast<double>(v.value(t, 0));
    s.last = static_cast<double>(v.value(t, s.count - 1));
    s.min = s.max = s.first;
    for (std::size_t i = 0; i < s.count; ++i) {
        const double x = static_cast<double>(v.value(t, i));
        s.min = std::min(s.min, x);
        s.max = std::max(s.max, x);
    }
    return s;
}

constexpr record_table all_tables[] = {record_table::correction, record_table::zero, record_table::curvature,
                                       record_table::shape};

nlohmann::json record_json(const std::string& file, const counterflux::record_view& v) {
    const bool q15 = v.values() == counterflux::record_values::q15;
    nlohmann::json j;
    j["file"] = file;
    j["valid"] = true;
    j["format_version"] = counterflux::record_version;
    j["size_bytes"] = v.size();
    j["crc32"] = v.crc32();
    j["symbol"] = v.symbol();
    j["unit_id"] = v.unit_id();
    j["values"] = q15 ? "q15" : "float32";
    j["report"] = partial_pressure(v) ? "partial_pressure" : "mole_fraction";
    j["reading_unit"] = partial_pressure(v) ? "Pa" : "mol/mol";
    j["reference_temperature_K"] = static_cast<double>(v.reference_temperature_K());
    j["reference_pressure_Pa"] = static_cast<double>(v.reference_pressure_Pa());
    j["gain_per_A"] = static_cast<double>(v.gain());
    j["full_scale"] = static_cast<double>(v.full_scale());
    j["source_hash"] = v.source_hash();
    j["linear"] = v.linear();
    nlohmann::json axes = nlohmann::json::array();
    for (const axis_info& a : axes_of(v))
        axes.push_back({{"name", a.name},
                        {"from", static_cast<double>(a.axis.from)},
                        {"step", static_cast<double>(a.axis.step)},
                        {"count", a.axis.count},
                        {"to", last_node(a.axis)},
                        {"unit", a.unit}});
    j["axes"] = axes;
    nlohmann::json tables = nlohmann::json::array();
    for (const record_table t : all_tables) {
        const table_summary s = summarise(v, t);
        if (s.count == 0) continue;
        nlohmann::json values = nlohmann::json::array();
        for (std::size_t i = 0; i < s.count; ++i) values.push_back(static_cast<double>(v.value(t, i)));
        nlohmann::json entry{{"name", table_name(t)}, {"count", s.count},     {"unit", table_unit(v, t)},
                             {"first", s.first},      {"last", s.last},       {"min", s.min},
                             {"max", s.max},          {"values", values}};
        if (t == record_table::correction || t == record_table::curvature)
            entry["shape"] = {v.temperature().count, v.pressure().count};
        if (q15) {
            const counterflux::record_scale sc = v.scale(t);
            entry["scale"] = static_cast<double>(sc.scale);
            entry["offset"] = static_cast<double>(sc.offset);
            nlohmann::json raw = nlohmann::json::array();
            for (std::size_t i = 0; i < s.count; ++i) raw.push_back(v.raw_q15(t, i));
            entry["raw_q15"] = raw;
        }
        tables.push_back(entry);
    }
    j["tables"] = tables;
    return j;
}

// x as the decimal of 7 significant digits nearest to it, for the text report:
// a float axis of 273.15 K (stored as 273.149994) prints as 0 C, not -6.1e-06 C.
double shown(float x) { return std::strtod(format_number(static_cast<double>(x), 7).c_str(), nullptr); }

std::string reading_text(const counterflux::record_view& v, double x) {
    return partial_pressure(v) ? format_number(x, 6) + " Pa" : format_concentration(x, 6);
}

std::string axis_text(const axis_info& a) {
    const double from = shown(a.axis.from);
    const double step = shown(a.axis.step);
    const double to = shown(static_cast<float>(last_node(a.axis)));
    const std::string points = std::to_string(a.axis.count) + " points";
    if (std::string(a.unit) == "K")
        return points + ", " + format_temperature(from) + " .. " + format_temperature(to) + ", step " +
               format_number(step, 6) + " K";
    if (std::string(a.unit) == "Pa")
        return points + ", " + format_pressure(from) + " .. " + format_pressure(to) + ", step " +
               format_pressure(step);
    return points + ", z = " + format_number(from, 6) + " .. " + format_number(to, 6) + ", step " +
           format_number(step, 6);
}

std::string record_text(const std::string& file, const counterflux::record_view& v) {
    const bool q15 = v.values() == counterflux::record_values::q15;
    std::string t = file + ": valid calibration record, format version " + std::to_string(counterflux::record_version) +
                    ", " + std::to_string(v.size()) + " bytes, CRC-32 " + hex32(v.crc32()) + "\n";
    const auto line = [&t](const std::string& key, const std::string& value) {
        std::string k = "  " + key;
        k.resize(std::max<std::size_t>(k.size() + 1, 15), ' ');
        t += k + value + "\n";
    };
    line("symbol", v.symbol());
    line("unit", *v.unit_id() != '\0' ? std::string(v.unit_id()) : std::string("none (a design table)"));
    line("values", q15 ? "q15 (int16, value = offset + scale * q / 32768)" : "float32");
    line("report", partial_pressure(v) ? "partial pressure (Pa)" : "mole fraction (mol/mol)");
    line("reference", format_temperature(shown(v.reference_temperature_K())) + ", " +
                          format_pressure(shown(v.reference_pressure_Pa())));
    line("gain", format_number(shown(v.gain()), 6) + (partial_pressure(v) ? " Pa/A" : " (mol/mol)/A"));
    line("full scale", reading_text(v, shown(v.full_scale())));
    line("source hash", hex32(v.source_hash()));
    line("law", v.linear() ? "linear (no curvature or shape table)" : "curved: reading = w h(gamma w)");
    t += "  axes\n";
    for (const axis_info& a : axes_of(v)) {
        std::string k = "    " + std::string(a.name);
        k.resize(17, ' ');
        t += k + axis_text(a) + "\n";
    }
    t += "  tables\n";
    for (const record_table tb : all_tables) {
        std::string k = "    " + std::string(table_name(tb));
        k.resize(17, ' ');
        const table_summary s = summarise(v, tb);
        if (s.count == 0) {
            t += k + "none\n";
            continue;
        }
        std::string size = std::to_string(s.count) + " values";
        if (tb == record_table::correction || tb == record_table::curvature)
            size = std::to_string(v.temperature().count) + " x " + std::to_string(v.pressure().count) + " = " + size;
        const std::string unit = table_unit(v, tb) == "1" ? "" : " " + table_unit(v, tb);
        t += k + size + ", first " + format_number(s.first, 6) + unit + ", last " + format_number(s.last, 6) + unit +
             ", min " + format_number(s.min, 6) + unit + ", max " + format_number(s.max, 6) + unit;
        if (q15) {
            const counterflux::record_scale sc = v.scale(tb);
            t += " (scale " + format_number(static_cast<double>(sc.scale), 6) + ", offset " +
                 format_number(static_cast<double>(sc.offset), 6) + ")";
        }
        t += "\n";
    }
    return t;
}

}  // namespace

int run_inspect(const inspect_options& o, std::ostream& out) {
    const std::vector<std::uint8_t> bytes = read_record_file(o.file);
    const counterflux::record_check r = counterflux::validate_record(bytes.data(), bytes.size());
    if (r.fault != counterflux::record_fault::none) {
        if (o.json) {
            nlohmann::json j;
            j["file"] = o.file;
            j["valid"] = false;
            j["fault"] = fault_name(r.fault);
            j["fault_text"] = counterflux::describe(r.fault);
            j["size_bytes"] = bytes.size();
            emit(json_text(j), std::nullopt, out);
        }
        source_place whole;
        whole.file = o.file;
        throw check_failed(whole, std::string("invalid calibration record: ") + counterflux::describe(r.fault));
    }
    emit(o.json ? json_text(record_json(o.file, r.view)) : record_text(o.file, r.view), std::nullopt, out);
    return 0;
}

verb add_inspect_verb(CLI::App& app, std::ostream& out) {
    auto options = std::make_shared<inspect_options>();
    CLI::App* cmd = app.add_subcommand(
        "inspect", "Validate a binary calibration record (.bin) and print it (exit 3 when it is invalid)");
    cmd->add_option("FILE", options->file, "Calibration record written by 'counterflux table' (at most 1 MiB)")
        ->required();
    cmd->add_flag("--json", options->json, "Print JSON (SI units)");
    return verb{cmd, [options, &out] { return run_inspect(*options, out); }};
}

}  // namespace counterflux::tool
