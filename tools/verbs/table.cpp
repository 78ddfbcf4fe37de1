// tools/verbs/table.cpp - `counterflux table FILE --out DIR`: the compensation
// tables of a sensor design, their proven interpolation error, and the four
// outputs (C header, CSV, JSON, binary record) of interfaces.md.
#include <filesystem>
#include <functional>
#include <memory>
#include <ostream>
#include <sstream>
#include <string>
#include <vector>

#include <CLI/CLI.hpp>
#include <nlohmann/json.hpp>

#include "../atomic_write.hpp"
#include "../emit/emit.hpp"
#include "../errors.hpp"
#include "../plot.hpp"
#include "../report.hpp"
#include "../sensor_file.hpp"
#include "../tables.hpp"
#include "verbs.hpp"

namespace counterflux::tool {

namespace {

std::string percent(double relative) { return format_number(100.0 * relative, 3) + " %"; }

std::string where(const proof_point& p) {
    return format_temperature(p.temperature_K) + ", " + format_pressure(p.pressure_Pa);
}

// The SVG: the span over temperature at each pressure node, and the proven
// error over temperature (worst over pressure and concentration).
void write_plot(const std::filesystem::path& path, const table_set& t, double bound) {
    plot_panel span;
    span.title = "span factor s(T, P) = S / S_ref";
    span.x_label = "temperature [C]";
    span.y_label = "s [1]";
    const std::size_t np = t.pressure.count;
    for (std::size_t j = 0; j < np; ++j) {
        plot_series c;
        c.label = format_pressure(t.pressure.node(j));
        for (std::size_t i = 0; i < t.temperature.count; ++i) {
            c.x.push_back(t.temperature.node(i) - 273.15);
            c.y.push_back(t.span.exact[i * np + j]);
        }
        span.series.push_back(std::move(c));
    }
    plot_panel error;
    error.title = "proven interpolation error (worst over pressure and 0..full scale)";
    error.x_label = "temperature [C]";
    error.y_label = "error [%]";
    plot_series e;
    e.label = "table vs full model";
    plot_series b;
    b.label = "bound " + percent(bound);
    for (std::size_t i = 0; i < t.proof.error_by_temperature.size(); ++i) {
        const double tk = t.proof.fine_temperatures[i];
        e.x.push_back(tk - 273.15);
        e.y.push_back(100.0 * t.proof.error_by_temperature[i]);
        b.x.push_back(tk - 273.15);
        b.y.push_back(100.0 * bound);
    }
    error.series.push_back(std::move(e));
    error.series.push_back(std::move(b));
    write_svg_plot(path, t.symbol + ": compensation tables", {span, error});
}

// Writes the four outputs as a set: every target is checked first (a regular
// file or a new name; a directory, link or device there is refused and nothing is
// written), the plot is drawn first (its own atomic write), then each output goes
// to a staged name beside its target, and only when all are staged are they
// renamed over their targets, one rename each. A failure before the renames
// removes what was staged and leaves every target as it was.
void write_set(const std::filesystem::path& dir, const std::filesystem::file_status& dir_status,
               const std::string& dir_text, const std::vector<std::pair<std::filesystem::path, std::string>>& files,
               const std::function<void()>& plot) {
    namespace fs = std::filesystem;
    std::error_code ec;
    for (const auto& fl : files) {
        const auto ts = fs::symlink_status(fl.first, ec);
        if (fs::exists(ts) && !fs::is_regular_file(ts))
            throw flag_error("--out", fl.first.string() + " exists and is not a regular file; nothing was written");
    }
    if (!fs::exists(dir_status)) {
        fs::create_directories(dir, ec);
        if (ec) throw run_error(dir_text + ": cannot create the directory: " + ec.message());
    }
    plot();
    std::vector<fs::path> staged;
    try {
        for (const auto& fl : files) {
            const fs::path s = fl.first.parent_path() / ("." + fl.first.filename().string() + ".staged");
            atomic_write(s, fl.second);
            staged.push_back(s);
        }
    } catch (...) {
        for (const auto& s : staged) fs::remove(s, ec);
        throw;
    }
    for (std::size_t i = 0; i < files.size(); ++i) {
        fs::rename(staged[i], files[i].first, ec);
        if (ec) {
            for (std::size_t k = i; k < staged.size(); ++k) fs::remove(staged[k], ec);
            throw run_error(files[i].first.string() + ": cannot replace it: " + ec.message() +
                            (i > 0 ? " (the outputs before it were replaced)" : ""));
        }
    }
}

}  // namespace

int run_table(const table_options& o, std::ostream& out) {
    if (o.out.empty()) throw flag_error("--out", "the directory is empty; expected a directory name");
    if (o.values && *o.values != "float32" && *o.values != "q15")
        throw flag_error("--values", "'" + abbreviate(*o.values) + "' is not float32 or q15");
    if (o.svg && o.svg->empty()) throw flag_error("--svg", "the path is empty; expected a file name");
    const sensor_file f = read_sensor_file(o.file);
    if (!f.table) {
        source_place p;
        p.file = f.path;
        throw input_error(p, "no [table] section: add [table] with temperature and pressure axes "
                             "(see docs/sensor-file.md)");
    }
    const std::filesystem::path dir(o.out);
    std::error_code ec;
    const auto st = std::filesystem::status(dir, ec);
    if (std::filesystem::exists(st) && !std::filesystem::is_directory(st))
        throw flag_error("--out", "'" + abbreviate(o.out) + "' exists and is not a directory");

    const std::string values = o.values ? *o.values : f.table->values;
    const table_set t = choose_and_build(f, values);
    const double bound = f.table->max_error;
    const bool met = t.proof.max_error <= bound;

    provenance prov;
    prov.generator = std::string("counterflux ") + COUNTERFLUX_TOOL_VERSION;
    prov.input = f.path;
    prov.recipe = "counterflux table " + f.path + " --out " + o.out + (o.values ? " --values " + *o.values : "");

    // Everything is computed before anything is written: a failed run writes nothing.
    std::vector<std::pair<std::filesystem::path, std::string>> files;
    nlohmann::json doc = json_document(t, prov);
    doc["max_error_requested"] = bound;
    doc["bound_met"] = met;
    if (met) {
        const std::vector<std::uint8_t> bin = record_bytes(t, prov);
        files.emplace_back(dir / (t.symbol + ".h"), c_header_text(t, prov));
        files.emplace_back(dir / (t.symbol + ".csv"), csv_text(t));
        files.emplace_back(dir / (t.symbol + ".json"), std::string());
        files.emplace_back(dir / (t.symbol + ".bin"), std::string(bin.begin(), bin.end()));
        nlohmann::json names = nlohmann::json::array();
        for (const auto& fl : files) names.push_back(fl.first.string());
        if (o.svg) names.push_back(*o.svg);
        doc["files"] = names;
        files[2].second = json_text(doc);
        write_set(dir, st, o.out, files, [&] {
            if (o.svg) write_plot(*o.svg, t, bound);
        });
    } else {
        doc["files"] = nlohmann::json::array();
    }

    if (o.json) {
        nlohmann::json summary = {{"symbol", t.symbol},
                                  {"max_interpolation_error", t.proof.max_error},
                                  {"max_span_error", t.proof.span.error},
                                  {"max_reading_error", t.proof.reading.error},
                                  {"max_error_requested", bound},
                                  {"bound_met", met},
                                  {"table_bytes", t.table_bytes()},
                                  {"values", t.values},
                                  {"axes", doc["axes"]},
                                  {"linear", t.linear},
                                  {"max_fixed_point_error", t.fixed.present ? nlohmann::json(t.fixed.worst.error)
                                                                            : nlohmann::json()},
                                  {"files", doc["files"]}};
        out << json_text(summary);
    } else {
        std::ostringstream r;
        r << t.symbol << ": compensation tables from " << f.path << "\n"
          << "  grid        " << t.temperature.count << " temperatures (" << format_temperature(t.temperature.from)
          << " .. " << format_temperature(t.temperature.to) << ") x " << t.pressure.count << " pressures ("
          << format_pressure(t.pressure.from) << " .. " << format_pressure(t.pressure.to) << ")"
          << (f.table->temperature.points == 0 || f.table->pressure.points == 0 ? ", chosen to meet the bound" : "")
          << "\n"
          << "  values      " << t.values << ", " << t.table_bytes() << " bytes of table data\n";
        double lo = t.span.exact.front(), hi = lo;
        for (const double v : t.span.exact) {
            lo = std::min(lo, v);
            hi = std::max(hi, v);
        }
        r << "  span        " << format_number(lo, 4) << " .. " << format_number(hi, 4)
          << " over the grid (1 at the reference)\n";
        if (t.linear)
            r << "  linearity   linear law (equimolar counterdiffusion): reading = (I - I0) gain / s(T, P)\n";
        else
            r << "  linearity   curved law reading = w h(gamma w), w = (I - I0) gain / s(T, P), h(z) = (1 - e^-z)/z:\n"
              << "              gamma(T, P) is its own table (" << t.temperature.count << " x " << t.pressure.count
              << "), so the shift of the\n"
              << "              law with T and P through the Knudsen/membrane share is carried; h has "
              << t.shape_axis.count << " nodes\n";
        r << "  proven      " << percent(t.proof.max_error) << " (bound " << percent(bound) << ", "
          << (met ? "met" : "NOT met") << ")\n"
          << "              span " << percent(t.proof.span.error) << " at " << where(t.proof.span) << "\n"
          << "              reading " << percent(t.proof.reading.error) << " at "
          << format_concentration(t.proof.reading.mole_fraction) << ", " << where(t.proof.reading)
          << " (of reading, or of 10 % of full scale below that)\n"
          << "              against the full model at " << t.proof.condition_points << " conditions ("
          << t.proof.fine_t << " x " << t.proof.fine_p << ", every cell centre, ten times finer) and "
          << t.proof.reading_points << " readings from 0 to full scale\n";
        if (t.fixed.present)
            r << "  integer     " << t.symbol << "_reading_fixed (pA, mK, Pa in; "
              << (t.partial_pressure ? "mPa" : "ppb") << " out): " << percent(t.fixed.worst.error)
              << ", its quantisation included (reported, not held to the bound)\n";
        if (met) {
            r << "  wrote       ";
            for (std::size_t i = 0; i < files.size(); ++i) r << (i ? ", " : "") << files[i].first.string();
            if (o.svg) r << ", " << *o.svg;
            r << "\n";
        } else {
            r << "  nothing written: the tables do not meet table.max_error; add points to the axes, or leave "
                 "'points' out and the grid is chosen to meet the bound\n";
        }
        out << r.str();
    }
    if (!met)
        throw check_failed(f.path + ": the interpolation error " + percent(t.proof.max_error) +
                           " exceeds table.max_error = " + percent(bound));
    return 0;
}

verb add_table_verb(CLI::App& app, std::ostream& out) {
    auto options = std::make_shared<table_options>();
    CLI::App* cmd = app.add_subcommand("table", "Compensation tables for firmware, with their proven error");
    cmd->add_option("FILE", options->file, "Sensor file (TOML) with a [table] section")->required();
    cmd->add_option("--out", options->out, "Directory for <symbol>.h, .csv, .json and .bin")->required();
    cmd->add_option("--values", options->values, "float32 or q15; default: table.values of the file");
    cmd->add_option("--svg", options->svg, "Also write an SVG plot of the span and the proven error here");
    cmd->add_flag("--json", options->json, "Print the result as JSON");
    return verb{cmd, [options, &out] { return run_table(*options, out); }};
}

}  // namespace counterflux::tool
