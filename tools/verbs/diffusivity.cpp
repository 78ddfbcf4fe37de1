// tools/verbs/diffusivity.cpp - `counterflux diffusivity A B`: the binary
// diffusivity of a gas pair from the library's correlations.
#include <memory>
#include <optional>
#include <ostream>
#include <string>

#include <CLI/CLI.hpp>
#include <nlohmann/json.hpp>

#include <counterflux/diffusivity.hpp>
#include <counterflux/gases.hpp>

#include "../errors.hpp"
#include "../report.hpp"
#include "../sensor_file.hpp"
#include "../verb_support.hpp"
#include "verbs.hpp"

namespace counterflux::tool {

namespace {

const counterflux::gas_data& gas_argument(const std::string& name, const char* which) {
    const auto found = counterflux::find_gas(name.c_str());
    if (!found.ok() || found.value == nullptr) {
        source_place place;
        place.subject = which;
        throw input_error(place, "unknown gas '" + abbreviate(name) + "'" + unknown_gas_hint(name));
    }
    return *found.value;
}

}  // namespace

int run_diffusivity(const diffusivity_options& o, std::ostream& out) {
    const auto& a = gas_argument(o.gas_a, "A");
    const auto& b = gas_argument(o.gas_b, "B");
    counterflux::diffusivity_method method = counterflux::diffusivity_method::fuller;
    if (o.method == "fuller") method = counterflux::diffusivity_method::fuller;
    else if (o.method == "chapman-enskog") method = counterflux::diffusivity_method::chapman_enskog;
    else throw flag_error("--method", "'" + abbreviate(o.method) + "' is not fuller or chapman-enskog");

    const double t = flag_quantity("--temperature", o.temperature, quantity_kind::temperature);
    const std::string t_flag = flag_with_value("--temperature", o.temperature);
    // Chapman-Enskog first: its own limit, the fit range of the collision
    // integral in T*, says more than the general temperature range.
    const auto fit_problem = [&]() -> std::optional<std::string> {
        if (method != counterflux::diffusivity_method::chapman_enskog) return std::nullopt;
        return chapman_enskog_fit_problem(a, b, t);
    };
    if (const auto fit = fit_problem()) throw flag_error(t_flag, *fit + "; use --method fuller");
    (void)flag_quantity_in("--temperature", o.temperature, quantity_kind::temperature, temperature_range);
    const double p = flag_quantity_in("--pressure", o.pressure, quantity_kind::pressure, pressure_range);

    const counterflux::result<double> d = method == counterflux::diffusivity_method::fuller
                                              ? counterflux::fuller_diffusivity(a, b, t, p)
                                              : counterflux::chapman_enskog_diffusivity(a, b, t, p);
    // The same gas twice is a self-diffusivity (the correlations take it); say so.
    const bool self = &a == &b;
    const std::string self_words = std::string("self-diffusivity of ") + a.formula;
    const std::string what = self ? "the " + self_words
                                  : std::string("the diffusivity of ") + a.formula + "-" + b.formula;
    const double value =
        value_of(d, what, t_flag + ", " + flag_with_value("--pressure", o.pressure));

    if (o.json) {
        nlohmann::json j;
        j["gases"] = {a.formula, b.formula};
        j["method"] = counterflux::method_name(method);
        j["temperature_K"] = t;
        j["pressure_Pa"] = p;
        j["diffusivity_m2_s"] = value;
        j["diffusivity_cm2_s"] = from_si(value, "cm2/s");
        j["self_diffusivity"] = self;
        emit(json_text(j), std::nullopt, out);
    } else {
        std::string text = "D(" + std::string(a.formula) + ", " + b.formula + ") = " + format_number(value, 5) +
                           " m2/s = " + format_number(from_si(value, "cm2/s"), 5) + " cm2/s" +
                           (self ? " (" + self_words + ")" : std::string()) + "\n";
        text += "  method " + std::string(counterflux::method_name(method)) + ", at " + format_temperature(t) +
                ", " + format_pressure(p) + "\n";
        emit(text, std::nullopt, out);
    }
    return 0;
}

verb add_diffusivity_verb(CLI::App& app, std::ostream& out) {
    auto options = std::make_shared<diffusivity_options>();
    CLI::App* cmd = app.add_subcommand("diffusivity",
                                        "Binary diffusivity D_AB of a gas pair (the same gas twice: its self-diffusivity)");
    cmd->add_option("A", options->gas_a, "First gas (formula, e.g. CO)")->required();
    cmd->add_option("B", options->gas_b, "Second gas (formula, e.g. air)")->required();
    cmd->add_option("--temperature", options->temperature, "Temperature (K, C, degC; bare number K)")
        ->capture_default_str();
    cmd->add_option("--pressure", options->pressure, "Pressure (Pa, hPa, kPa, mbar, bar, atm; bare number Pa)")
        ->capture_default_str();
    cmd->add_option("--method", options->method, "Correlation: fuller or chapman-enskog")
        ->capture_default_str()
        ->check(CLI::IsMember({"fuller", "chapman-enskog"}));
    cmd->add_flag("--json", options->json, "Print JSON (SI units)");
    return verb{cmd, [options, &out] { return run_diffusivity(*options, out); }};
}

}  // namespace counterflux::tool
