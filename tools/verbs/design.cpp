// tools/verbs/design.cpp - `counterflux design FILE`: the steady state of a
// sensor design at one condition. Every number comes from the library
// (signal.hpp); this file only chooses the condition and formats the result.
#include <algorithm>
#include <memory>
#include <ostream>
#include <sstream>
#include <string>
#include <vector>

#include <CLI/CLI.hpp>
#include <nlohmann/json.hpp>

#include <counterflux/signal.hpp>
#include <counterflux/units.hpp>

#include "../errors.hpp"
#include "../report.hpp"
#include "../sensor_file.hpp"
#include "../verb_support.hpp"
#include "verbs.hpp"

namespace counterflux::tool {

namespace {

const char* flux_description(const sensor_file& f) {
    if (f.flux_ratio_name == "equimolar") return "equimolar counterdiffusion";
    if (f.flux_ratio_name == "stagnant") return "diffusion through stagnant background";
    return "flux ratio";
}

}  // namespace

int run_design(const design_options& o, std::ostream& out) {
    if (o.out && o.out->empty()) throw flag_error("--out", "the path is empty; expected a file name");
    const sensor_file f = read_sensor_file(o.file);
    const model_type& m = f.model;

    // The condition: each flag in its plausible range (plausibility.hpp), else the
    // file's reference condition and full scale.
    const double t = o.temperature ? flag_quantity_in("--temperature", *o.temperature, quantity_kind::temperature,
                                                      temperature_range)
                                   : m.reference_temperature_K;
    const double p = o.pressure ? flag_quantity_in("--pressure", *o.pressure, quantity_kind::pressure, pressure_range)
                                : m.reference_pressure_Pa;
    const double y = o.concentration ? flag_quantity_in("--concentration", *o.concentration,
                                                        quantity_kind::concentration, concentration_range)
                                     : f.full_scale_mol_mol;

    // The flags that set the condition name a failure; with none, it is the file's.
    std::string subject;
    const auto name_flag = [&subject](const char* flag, const std::optional<std::string>& text) {
        if (!text) return;
        if (!subject.empty()) subject += ", ";
        subject += flag_with_value(flag, *text);
    };
    name_flag("--temperature", o.temperature);
    name_flag("--pressure", o.pressure);
    name_flag("--concentration", o.concentration);
    const std::string at = " at " + format_temperature(t) + ", " + format_pressure(p);
    // A failure is blamed on the part of the file that cannot be resolved there, if any.
    // A current with no finite value at y (the log law singular at 1/alpha) is
    // explained from the file's flux ratio and outer element.
    const auto get = [&](const auto& r, const std::string& what, bool at_y = false) {
        if (!r.ok()) {
            std::vector<diagnostic> details;
            if (const auto d = diagnose_condition(f, t, p, format_temperature(t) + ", " + format_pressure(p)))
                details.push_back(*d);
            else if (at_y) {
                const char* knob = o.concentration ? "--concentration" : "full_scale";
                if (const auto why = singular_log_law(f, y, knob)) {
                    source_place place;
                    place.subject = subject;
                    details.push_back(diagnostic{place, *why});
                }
            }
            require_ok(r.code, what, subject, details);
        }
        return r.value;
    };
    const double current = get(counterflux::limiting_current_A(m, t, p, y),
                               "the current at " + format_concentration(y) + at, true);
    const double sensitivity = get(counterflux::sensitivity_A_per_mol_per_mol(m, t, p), "the sensitivity" + at);
    const double tc = get(counterflux::temperature_coefficient_per_K(m, t, p), "the temperature coefficient" + at);
    const double pc = get(counterflux::pressure_coefficient_per_Pa(m, t, p), "the pressure coefficient" + at);
    const double span = get(counterflux::span_factor(m, t, p), "the span factor" + at);
    const double linearity =
        get(counterflux::linearity_ratio(m, t, p, y), "the linearity ratio at " + format_concentration(y) + at, true);
    const auto reports = get(counterflux::element_reports(m, t, p), "the element reports" + at);

    if (o.json) {
        nlohmann::json j;
        j["file"] = f.path;
        j["symbol"] = f.symbol;
        j["target"] = m.target->formula;
        j["background"] = m.background->formula;
        j["electrons"] = m.electrons;
        j["flux_ratio"] = m.flux_ratio;
        j["report"] = m.reading == counterflux::reading_kind::mole_fraction ? "fraction" : "partial-pressure";
        j["diffusivity_method"] = counterflux::method_name(m.diffusivity.method);
        j["reference_temperature_K"] = m.reference_temperature_K;
        j["reference_pressure_Pa"] = m.reference_pressure_Pa;
        j["full_scale_mol_mol"] = f.full_scale_mol_mol;
        j["temperature_K"] = t;
        j["pressure_Pa"] = p;
        j["concentration_mol_mol"] = y;
        j["current_A"] = current;
        j["sensitivity_A_per_mol_per_mol"] = sensitivity;
        j["sensitivity_nA_per_ppm"] = counterflux::to_nA_per_ppm(sensitivity);
        j["temperature_coefficient_per_K"] = tc;
        j["pressure_coefficient_per_Pa"] = pc;
        j["span_factor"] = span;
        j["linearity_ratio"] = linearity;
        j["diffusivity_m2_s"] = reports.diffusivity_m2_s;
        j["mean_free_path_m"] = reports.mean_free_path_m;
        nlohmann::json kn = nlohmann::json::array(), shares = nlohmann::json::array(),
                       elements = nlohmann::json::array();
        for (std::size_t i = 0; i < reports.count; ++i) {
            const auto& e = reports.elements[i];
            // A membrane has no Knudsen number: null per element; the contract
            // array keeps one number per element, 0 for a membrane.
            const bool membrane = m.barriers.elements[i].kind == counterflux::barrier_kind::membrane;
            kn.push_back(e.knudsen_number);
            shares.push_back(e.resistance_share);
            elements.push_back({{"type", counterflux::kind_name(m.barriers.elements[i].kind)},
                                {"knudsen_number",
                                 membrane ? nlohmann::json(nullptr) : nlohmann::json(e.knudsen_number)},
                                {"resistance_share", e.resistance_share},
                                {"linear_resistance_share", e.knudsen_share},
                                {"area_m2", e.area_m2},
                                {"effective_length_m", e.effective_length_m}});
        }
        j["knudsen_numbers"] = kn;
        j["resistance_shares"] = shares;
        j["limiting_element"] = reports.limiting_element;
        j["elements"] = elements;
        emit(json_text(j), o.out, out);
        return 0;
    }

    std::ostringstream s;
    s << f.symbol << ": " << m.target->formula << " in " << m.background->formula << ", " << m.electrons
      << " electrons, " << flux_description(f);
    if (f.flux_ratio_name.empty()) s << " N_B/N_A = " << format_number(m.flux_ratio);
    s << ", reads "
      << (m.reading == counterflux::reading_kind::mole_fraction ? "mole fraction" : "partial pressure") << "\n";
    s << "  condition          " << format_temperature(t) << ", " << format_pressure(p) << ", "
      << format_concentration(y) << "\n";
    s << "  reference          " << format_temperature(m.reference_temperature_K) << ", "
      << format_pressure(m.reference_pressure_Pa) << "; full scale " << format_concentration(f.full_scale_mol_mol)
      << "\n";
    std::string d_label = "D(" + std::string(m.target->formula) + ", " + m.background->formula + ")";
    d_label.resize(std::max<std::size_t>(d_label.size() + 1, 19), ' ');
    s << "  " << d_label << format_number(from_si(reports.diffusivity_m2_s, "cm2/s")) << " cm2/s ("
      << counterflux::method_name(m.diffusivity.method) << "); mean free path "
      << format_length(reports.mean_free_path_m) << "\n";
    s << "  sensitivity        " << format_number(counterflux::to_nA_per_ppm(sensitivity)) << " nA/ppm ("
      << format_number(sensitivity) << " A per mol/mol)\n";
    s << "  current            " << format_current(current) << " at " << format_concentration(y) << "\n";
    s << "  linearity ratio    " << format_number(linearity, 5) << " (current / dilute-linear current at "
      << format_concentration(y) << ")\n";
    // The span factor is of the reading: S / S_ref for a mole fraction, (S/P) / (S_ref/P_ref)
    // for a partial pressure (signal.hpp).
    s << "  span factor        " << format_number(span, 5)
      << (m.reading == counterflux::reading_kind::mole_fraction
              ? " (sensitivity / sensitivity at reference)\n"
              : " ((S/P) / (S_ref/P_ref): sensitivity to partial pressure / that at reference)\n");
    s << "  temperature coeff. " << format_signed(tc * 100.0) << " %/K\n";
    s << "  pressure coeff.    " << format_signed(pc * 100.0 * 1000.0) << " %/kPa\n";
    s << "  elements, outside in:\n";
    s << "    #  type        Knudsen number  resistance share\n";
    for (std::size_t i = 0; i < reports.count; ++i) {
        const auto& e = reports.elements[i];
        std::string type = counterflux::kind_name(m.barriers.elements[i].kind);
        type.resize(10, ' ');
        std::string kn = m.barriers.elements[i].kind == counterflux::barrier_kind::membrane
                             ? std::string("-")
                             : format_number(e.knudsen_number, 3);
        kn.resize(14, ' ');
        s << "    " << (i + 1) << "  " << type << "  " << kn << "  " << format_number(e.resistance_share * 100.0, 3)
          << " %" << (i == reports.limiting_element ? "  <- limits" : "") << "\n";
    }
    s << "  limiting element   #" << (reports.limiting_element + 1) << " "
      << counterflux::kind_name(m.barriers.elements[reports.limiting_element].kind) << " ("
      << format_number(reports.elements[reports.limiting_element].resistance_share * 100.0, 3)
      << " % of the diffusion resistance)\n";
    emit(s.str(), o.out, out);
    return 0;
}

verb add_design_verb(CLI::App& app, std::ostream& out) {
    auto options = std::make_shared<design_options>();
    CLI::App* cmd = app.add_subcommand("design", "Steady state of a sensor design at one condition");
    cmd->add_option("FILE", options->file, "Sensor file (TOML)")->required();
    cmd->add_option("--temperature", options->temperature,
                    "Temperature (K, C, degC; bare number K); default: the reference temperature");
    cmd->add_option("--pressure", options->pressure,
                    "Pressure (Pa, hPa, kPa, mbar, bar, atm; bare number Pa); default: the reference pressure");
    cmd->add_option("--concentration", options->concentration,
                    "Target concentration (mol/mol, %, ppm, ppb; bare number mol/mol); default: full scale");
    cmd->add_flag("--json", options->json, "Print JSON (SI units)");
    cmd->add_option("--out", options->out, "Write the report to this file (atomically) instead of standard output");
    cmd->footer(
        "JSON, per element (\"elements\", outside in): knudsen_number is lambda / d, null for a membrane, which has no "
        "Knudsen number (the contract array knudsen_numbers keeps one number per element: 0 for a membrane); "
        "resistance_share is the element's share of the dilute-limit resistance of the barrier; "
        "linear_resistance_share is the share of the element's own resistance that does not couple to the flux "
        "ratio: the Knudsen part for a capillary or porous element, the solution-diffusion resistance (all of it) "
        "for a membrane.");
    return verb{cmd, [options, &out] { return run_design(*options, out); }};
}

}  // namespace counterflux::tool
