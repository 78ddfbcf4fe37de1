// tools/verbs/step.cpp - `counterflux step FILE`: the step response of the
// sensor's diffusion chain at its reference condition. The chain, the solver,
// the part times and the error estimate are the library's (transient.hpp);
// this file chooses the grids (refining until t90 settles to 0.1 %), and
// formats and writes the results.
#include <algorithm>
#include <cmath>
#include <cstddef>
#include <limits>
#include <memory>
#include <ostream>
#include <sstream>
#include <string>
#include <vector>

#include <CLI/CLI.hpp>
#include <nlohmann/json.hpp>

#include <counterflux/transient.hpp>

#include "../atomic_write.hpp"
#include "../errors.hpp"
#include "../plot.hpp"
#include "../report.hpp"
#include "../sensor_file.hpp"
#include "../units_parse.hpp"
#include "../verb_support.hpp"
#include "verbs.hpp"

namespace counterflux::tool {

namespace {

constexpr std::size_t chain_parts = max_elements + 2;
using chain_type = counterflux::transient_chain<double, chain_parts>;

// t90 must settle to this relative change between two grids.
constexpr double t90_tolerance = 1e-3;
// Time steps per estimated t90 on the coarsest grid (16 cells per layer).
constexpr double steps_per_t90 = 40.0;
// Most time steps of the run that draws the curve over a long duration (ten
// per CSV row: finer than the rows, which are what a person reads).
constexpr double max_curve_steps = 20000.0;
// Most rows of the CSV curve, and points per SVG curve.
constexpr std::size_t max_csv_rows = 2001;
constexpr std::size_t max_plot_points = 801;

struct sample {
    double t, rise, fall;
};

// The response of one grid: times, and the curve thinned to every stride-th step.
struct level_result {
    counterflux::result<counterflux::step_times<double>> times;
    std::vector<sample> curve;
    std::size_t cells = 0;
};

template <std::size_t Cells>
level_result run_level(const chain_type& chain, double duration, std::size_t steps) {
    level_result out;
    out.cells = Cells;
    const std::size_t stride = std::max<std::size_t>(1, (steps + max_csv_rows - 2) / (max_csv_rows - 1));
    out.curve.reserve(steps / stride + 2);
    std::size_t k = 0;
    auto observe = [&](const counterflux::step_sample<double>& s) noexcept {
        if (k % stride == 0 || k == steps) out.curve.push_back(sample{s.time_s, s.rise, s.fall});
        ++k;
    };
    out.times = counterflux::step_response_estimate<double, Cells, chain_parts>(chain, duration, steps, observe);
    return out;
}

level_result run_grid(int level, const chain_type& chain, double duration, std::size_t steps) {
    switch (level) {
        case 0: return run_level<16>(chain, duration, steps);
        case 1: return run_level<32>(chain, duration, steps);
        case 2: return run_level<64>(chain, duration, steps);
        case 3: return run_level<128>(chain, duration, steps);
        case 4: return run_level<256>(chain, duration, steps);
        default: return run_level<512>(chain, duration, steps);
    }
}
constexpr int finest_level = 5;

// The slowest time constant of the chain on the grid of `cells` cells per layer.
double slowest_time_constant(int level, const chain_type& chain) {
    const auto get = [&](auto solver) {
        if (solver->setup(chain) != counterflux::status::ok) return 0.0;
        const auto tau = solver->slowest_time_constant_s();
        return tau.ok() ? tau.value : 0.0;
    };
    switch (level) {
        case 0: return get(std::make_unique<counterflux::step_solver<double, 16, chain_parts>>());
        case 1: return get(std::make_unique<counterflux::step_solver<double, 32, chain_parts>>());
        case 2: return get(std::make_unique<counterflux::step_solver<double, 64, chain_parts>>());
        case 3: return get(std::make_unique<counterflux::step_solver<double, 128, chain_parts>>());
        case 4: return get(std::make_unique<counterflux::step_solver<double, 256, chain_parts>>());
        default: return get(std::make_unique<counterflux::step_solver<double, 512, chain_parts>>());
    }
}

std::string format_time(double s) {
    if (s < 1e-3) return format_number(s * 1e6, 4) + " us";
    if (s < 1.0) return format_number(s * 1e3, 4) + " ms";
    if (s < 600.0) return format_number(s, 4) + " s";
    return format_number(s / 60.0, 4) + " min";
}

// What a part of the chain is called in the report, and in JSON.
struct part_name {
    std::string text;  // "front volume 0.8 cm3 at 0.5 L/min"
    std::string key;   // "front_volume", "barrier_1", "cavity"
};

std::vector<part_name> part_names(const sensor_file& f, const chain_type& chain) {
    std::vector<part_name> names;
    std::size_t element = 0;
    for (std::size_t i = 0; i < chain.count; ++i) {
        const auto& p = chain.parts[i];
        switch (p.kind) {
            case counterflux::chain_part_kind::flushed_volume:
                names.push_back({"front volume " + format_number(from_si(p.volume_m3, "cm3")) + " cm3 at " +
                                     format_number(from_si(p.flow_m3_s, "L/min")) + " L/min",
                                 "front_volume"});
                break;
            case counterflux::chain_part_kind::layer: {
                const auto kind = f.model.barriers.elements[element].kind;
                names.push_back({"[[barrier]] #" + std::to_string(element + 1) + " " + counterflux::kind_name(kind),
                                 "barrier_" + std::to_string(element + 1)});
                ++element;
                break;
            }
            case counterflux::chain_part_kind::lumped_volume:
            default:
                names.push_back({"cavity " + format_number(from_si(p.volume_m3, "mm3")) + " mm3", "cavity"});
                break;
        }
    }
    return names;
}

std::string csv_text(const std::vector<sample>& curve) {
    std::ostringstream s;
    s.precision(10);
    s << "time[s],rise[1],fall[1]\n";
    for (const auto& p : curve) s << p.t << "," << p.rise << "," << p.fall << "\n";
    return s.str();
}

// Every k-th point so that a curve has at most max_plot_points (the last one kept).
std::vector<sample> thinned(const std::vector<sample>& curve) {
    if (curve.size() <= max_plot_points) return curve;
    const std::size_t stride = (curve.size() + max_plot_points - 2) / (max_plot_points - 1);
    std::vector<sample> out;
    for (std::size_t i = 0; i < curve.size(); i += stride) out.push_back(curve[i]);
    if (out.back().t != curve.back().t) out.push_back(curve.back());
    return out;
}

}  // namespace

int run_step(const step_options& o, std::ostream& out) {
    if (o.csv && o.csv->empty()) throw flag_error("--csv", "the path is empty; expected a file name");
    if (o.svg && o.svg->empty()) throw flag_error("--svg", "the path is empty; expected a file name");
    const sensor_file f = read_sensor_file(o.file);
    const model_type& m = f.model;
    const double t = m.reference_temperature_K;
    const double p = m.reference_pressure_Pa;

    // Every membrane needs its film diffusivity (or partition coefficient) here.
    std::vector<diagnostic> missing;
    for (std::size_t i = 0; i < m.barriers.count; ++i) {
        const auto& b = m.barriers.elements[i];
        if (b.kind == counterflux::barrier_kind::membrane && !(b.membrane_diffusivity_m2_s > 0.0))
            missing.push_back({f.element_places[i], "[[barrier]] #" + std::to_string(i + 1) +
                                                         " (membrane) has no 'diffusivity' or 'partition'; the step "
                                                         "response needs one of them (the permeability fixes the other)"});
    }
    if (!missing.empty()) throw input_error(missing);

    counterflux::response_setup<double> setup{0.0, 0.0, 0.0, std::numeric_limits<double>::infinity(), 0.0};
    if (f.response) {
        setup.front_volume_m3 = f.response->front_volume_m3.value_or(0.0);
        setup.sample_flow_m3_s = f.response->sample_flow_m3_s.value_or(0.0);
        setup.cavity_volume_m3 = f.response->cavity_volume_m3.value_or(0.0);
        setup.electrode_rate_m_s = f.response->electrode_rate_m_s;
        setup.electrode_area_m2 = f.response->electrode_area_m2.value_or(0.0);
    }
    const std::string at = " at " + format_temperature(t) + ", " + format_pressure(p);
    const auto chain_r = counterflux::chain_from_sensor(m, setup, t, p);
    if (!chain_r.ok()) {
        std::vector<diagnostic> details;
        if (const auto d = diagnose_condition(f, t, p, "the reference condition")) details.push_back(*d);
        require_ok(chain_r.code, "the step-response chain" + at, {}, details);
    }
    const chain_type& chain = chain_r.value;
    const double estimate = value_of(counterflux::estimated_t90_s(chain), "the response-time estimate" + at);
    if (!(estimate > 0.0)) throw run_error("the response-time estimate" + at + " is zero");

    // The times come from runs long enough for the rise and the fall to pass
    // 90 % (four estimated t90, doubled until they do), refined until t90
    // settles; the file's duration only sets the span of the curve.
    double duration = 4.0 * estimate;
    const double base_steps = std::ceil(steps_per_t90 * 4.0);
    level_result result;
    bool settled = false;
    int level = 0;
    for (int attempt = 0; attempt < 12; ++attempt) {
        settled = false;
        bool reached = true;
        for (level = 0; level <= finest_level; ++level) {
            const auto steps = static_cast<std::size_t>(base_steps * std::pow(2.0, level + attempt));
            result = run_grid(level, chain, duration, steps);
            const auto& r = result.times;
            if (counterflux::has(r.code, counterflux::status::above_range)) {
                reached = false;
                break;
            }
            require_ok(r.code, "the step response" + at);
            if (r.value.t90_error_s <= t90_tolerance * r.value.t90_s) {
                settled = true;
                break;
            }
        }
        if (reached) break;
        duration *= 2.0;
    }
    if (counterflux::has(result.times.code, counterflux::status::above_range))
        throw run_error("the step response" + at + " did not reach 90 % within " + format_time(duration));
    const auto& times = result.times.value;
    if (!settled)
        throw check_failed("t90 did not settle to " + format_number(100.0 * t90_tolerance) + " % (" +
                           format_time(times.t90_s) + ", last change " +
                           format_number(100.0 * times.t90_error_s / times.t90_s, 3) + " % with " +
                           std::to_string(result.cells) + " cells per layer)");
    // The curve over the file's duration: cut from the run, or one more run
    // on the settled grid with the same time step (at most max_curve_steps).
    std::vector<sample> curve = result.curve;
    double curve_duration = duration;
    if (f.response && f.response->duration_s) {
        curve_duration = *f.response->duration_s;
        if (curve_duration <= duration) {
            // Cut at the duration, the last row interpolated to it.
            const auto past = std::find_if(curve.begin(), curve.end(),
                                           [&](const sample& x) { return x.t >= curve_duration; });
            if (past != curve.end() && past != curve.begin()) {
                const sample a = *(past - 1), b = *past;
                const double w = (curve_duration - a.t) / (b.t - a.t);
                curve.erase(past, curve.end());
                curve.push_back(sample{curve_duration, a.rise + w * (b.rise - a.rise), a.fall + w * (b.fall - a.fall)});
            }
        } else {
            const double dt = duration / static_cast<double>(times.steps);
            const double steps = std::min(std::ceil(curve_duration / dt), max_curve_steps);
            curve = run_grid(level, chain, curve_duration, static_cast<std::size_t>(steps)).curve;
        }
    }
    const double tau = slowest_time_constant(level, chain);

    // What each part alone would give, and which set t90.
    const auto names = part_names(f, chain);
    std::vector<double> alone;
    double sum = 0.0;
    for (std::size_t i = 0; i < chain.count; ++i) {
        alone.push_back(value_of(counterflux::part_t90_s(chain, i), "the response time of " + names[i].text + at));
        sum += alone.back();
    }
    std::vector<std::size_t> order(chain.count);
    for (std::size_t i = 0; i < order.size(); ++i) order[i] = i;
    std::stable_sort(order.begin(), order.end(), [&](std::size_t a, std::size_t b) { return alone[a] > alone[b]; });
    // The parts that set t90: the largest, until they make 80 % of the sum.
    std::vector<std::size_t> setters;
    double covered = 0.0;
    for (std::size_t i : order) {
        if (covered >= 0.8 * sum) break;
        setters.push_back(i);
        covered += alone[i];
    }
    const std::size_t dominant = order.front();

    if (o.csv) atomic_write(*o.csv, csv_text(curve));
    if (o.svg) {
        const auto pts = thinned(curve);
        plot_series rise{"rise (step up from zero)", {}, {}}, fall{"fall (step down from steady state)", {}, {}};
        for (const auto& s : pts) {
            rise.x.push_back(s.t);
            rise.y.push_back(s.rise);
            fall.x.push_back(s.t);
            fall.y.push_back(s.fall);
        }
        plot_panel up{"Rise", "time [s]", "I / I_ss [1]", {rise},
                      {{times.t10_s, "t10 " + format_time(times.t10_s)},
                       {times.t50_s, "t50 " + format_time(times.t50_s)},
                       {times.t90_s, "t90 " + format_time(times.t90_s)}},
                      false};
        plot_panel down{"Fall", "time [s]", "I / I_ss [1]", {fall},
                        {{times.fall_t90_s, "fall t90 " + format_time(times.fall_t90_s)}}, false};
        write_svg_plot(*o.svg, f.symbol + ": step response at " + format_temperature(t) + ", " + format_pressure(p),
                       {up, down});
    }

    if (o.json) {
        nlohmann::json j;
        j["file"] = f.path;
        j["symbol"] = f.symbol;
        j["temperature_K"] = t;
        j["pressure_Pa"] = p;
        j["t10_s"] = times.t10_s;
        j["t50_s"] = times.t50_s;
        j["t90_s"] = times.t90_s;
        j["fall_t10_s"] = times.fall_t10_s;
        j["fall_t50_s"] = times.fall_t50_s;
        j["fall_t90_s"] = times.fall_t90_s;
        j["t90_error_s"] = times.t90_error_s;
        j["slowest_time_constant_s"] = tau;
        j["duration_s"] = duration;
        j["curve_duration_s"] = curve_duration;
        j["steps"] = times.steps;
        j["cells_per_layer"] = result.cells;
        j["nodes"] = times.nodes;
        j["max_mass_balance_error"] = times.max_mass_balance_error;
        j["steady_flow_m3_s"] = times.steady_flow_per_conc;
        j["csv_rows"] = curve.size();
        nlohmann::json parts = nlohmann::json::array();
        for (std::size_t i = 0; i < chain.count; ++i)
            parts.push_back({{"part", names[i].key},
                             {"description", names[i].text},
                             {"t90_alone_s", alone[i]},
                             {"share", sum > 0.0 ? alone[i] / sum : 0.0}});
        j["parts"] = parts;
        j["dominant_part"] = names[dominant].key;
        nlohmann::json set = nlohmann::json::array();
        for (std::size_t i : setters) set.push_back(names[i].key);
        j["t90_set_by"] = set;
        out << json_text(j);
        out.flush();
        if (!out) throw run_error("cannot write to standard output");
        return 0;
    }

    std::ostringstream s;
    s << f.symbol << ": step response of the diffusion chain at " << format_temperature(t) << ", "
      << format_pressure(p) << " (dilute, linear)\n";
    s << "  rise    t10 " << format_time(times.t10_s) << ", t50 " << format_time(times.t50_s) << ", t90 "
      << format_time(times.t90_s) << "\n";
    s << "  fall    t10 " << format_time(times.fall_t10_s) << ", t50 " << format_time(times.fall_t50_s) << ", t90 "
      << format_time(times.fall_t90_s) << "\n";
    s << "  t90 error estimate " << format_time(times.t90_error_s) << " ("
      << format_number(100.0 * times.t90_error_s / times.t90_s, 2) << " %; " << result.cells
      << " cells per layer, " << times.steps << " steps over " << format_time(duration) << ")\n";
    s << "  slowest time constant " << format_time(tau) << "; mass balance held to "
      << format_number(times.max_mass_balance_error, 2) << "\n";
    s << "  t90 of each part alone, outside in:\n";
    for (std::size_t i = 0; i < chain.count; ++i) {
        std::string label = names[i].text;
        label.resize(std::max<std::size_t>(label.size() + 1, 40), ' ');
        const bool held_at_zero = chain.parts[i].kind == counterflux::chain_part_kind::lumped_volume &&
                                  !std::isfinite(chain.sink_rate_m_s);
        if (held_at_zero) {
            s << "    " << label << "-  (a perfect sink holds it at zero: no effect)\n";
            continue;
        }
        s << "    " << label << format_time(alone[i]) << "  (" << format_number(100.0 * alone[i] / sum, 3) << " %)"
          << (i == dominant ? "  <- dominates" : "") << "\n";
    }
    s << "  t90 is set by ";
    for (std::size_t k = 0; k < setters.size(); ++k)
        s << (k == 0 ? "" : k + 1 == setters.size() ? " and " : ", ") << names[setters[k]].text;
    s << " (" << format_number(100.0 * covered / sum, 3) << " % of the parts' times)";
    std::vector<std::string> others;
    for (std::size_t i : order)
        if (std::find(setters.begin(), setters.end(), i) == setters.end()) others.push_back(names[i].text);
    if (!others.empty()) {
        s << "; not by ";
        for (std::size_t k = 0; k < others.size(); ++k)
            s << (k == 0 ? "" : k + 1 == others.size() ? " or " : ", ") << others[k];
    }
    s << "\n";
    out << s.str();
    out.flush();
    if (!out) throw run_error("cannot write to standard output");
    return 0;
}

verb add_step_verb(CLI::App& app, std::ostream& out) {
    auto options = std::make_shared<step_options>();
    CLI::App* cmd = app.add_subcommand("step", "Step response of the sensor's diffusion chain (t10, t50, t90, fall)");
    cmd->add_option("FILE", options->file, "Sensor file (TOML)")->required();
    cmd->add_option("--csv", options->csv, "Write the curve (time[s],rise[1],fall[1]) to this file");
    cmd->add_option("--svg", options->svg, "Write a plot of the rise and the fall, with t90 marked, to this file");
    cmd->add_flag("--json", options->json, "Print JSON (SI units)");
    cmd->footer(
        "The chain, outside in: [response] front_volume and sample_flow (a flushed volume), one diffusion layer per "
        "[[barrier]] element, cavity_volume (a lumped volume) and the electrode (electrode_rate over electrode_area; "
        "\"inf\" is a perfect sink). At the reference condition. Grids are refined (cells per layer and time steps "
        "doubled) until t90 changes by at most 0.1 %; exit status 3 if it does not. JSON: t10_s, t50_s, t90_s, "
        "fall_t10_s, fall_t50_s, fall_t90_s, t90_error_s (the last change of t90), slowest_time_constant_s, parts "
        "(each part's t90 alone and its share of their sum), dominant_part, t90_set_by.");
    return verb{cmd, [options, &out] { return run_step(*options, out); }};
}

}  // namespace counterflux::tool
