// The SVG plot module (tools/plot.hpp) and the `step` verb end to end.
#include <doctest/doctest.h>

#include <cmath>
#include <filesystem>
#include <fstream>
#include <iterator>
#include <string>
#include <vector>

#include <cstdio>
#include <tuple>
#include <utility>

#include <sys/wait.h>

#include <nlohmann/json.hpp>

#include <counterflux/transient.hpp>

#include "atomic_write.hpp"
#include "command_runner.hpp"
#include "errors.hpp"
#include "plot.hpp"
#include "sensor_file.hpp"

namespace {

namespace fs = std::filesystem;
using counterflux::tool::plot_marker;
using counterflux::tool::plot_panel;
using counterflux::tool::plot_series;
using counterflux::tool::write_svg_plot;

std::string slurp(const fs::path& p) {
    std::ifstream in(p, std::ios::binary);
    return std::string((std::istreambuf_iterator<char>(in)), std::istreambuf_iterator<char>());
}

fs::path scratch(const std::string& name) {
    const fs::path dir = fs::current_path() / "work" / "step" / name;
    fs::remove_all(dir);
    fs::create_directories(dir);
    return dir;
}

std::vector<plot_panel> two_panels() {
    plot_panel rise{"Rise panel", "time [s]", "I/I_ss [1]", {}, {{2.5, "t90 = 2.5 s"}}, false};
    plot_panel fall{"Fall panel", "time [s]", "I/I_ss [1]", {}, {}, true};
    plot_series r{"rise curve", {}, {}};
    plot_series f{"fall curve #1", {}, {}};
    for (int i = 0; i <= 50; ++i) {
        const double t = 0.1 * i;
        r.x.push_back(t);
        r.y.push_back(1.0 - std::exp(-t));
        f.x.push_back(t);
        f.y.push_back(std::exp(-t));
    }
    rise.series.push_back(r);
    fall.series.push_back(f);
    return {rise, fall};
}

bool well_formed_svg(const std::string& s) {
    const auto start = s.find_first_not_of(" \t\r\n");
    if (start == std::string::npos) return false;
    const bool head = s.compare(start, 5, "<?xml") == 0 || s.compare(start, 4, "<svg") == 0;
    return head && s.find("</svg>") != std::string::npos;
}

}  // namespace

TEST_CASE("plot: an SVG with both panels, its labels and the marker, twice in one process") {
    const fs::path dir = scratch("plot");
    // PLplot keeps global state: a second call must work exactly like the first.
    for (const char* name : {"a.svg", "b.svg"}) {
        CAPTURE(name);
        write_svg_plot(dir / name, "Overall title", two_panels());
        const std::string svg = slurp(dir / name);
        CHECK(well_formed_svg(svg));
        for (const char* label : {"Overall title", "Rise panel", "Fall panel", "rise curve", "fall curve #1",
                                  "t90 = 2.5 s", "time [s]"}) {
            CAPTURE(label);
            CHECK(svg.find(label) != std::string::npos);
        }
    }
    CHECK(slurp(dir / "a.svg") == slurp(dir / "b.svg"));
    for (const auto& e : fs::directory_iterator(dir))
        CHECK_FALSE(counterflux::tool::is_atomic_write_temporary(e.path().filename().string()));
}

TEST_CASE("plot: a failed write leaves no file, bad data is refused") {
    const fs::path dir = scratch("plot_fail");
    const fs::path missing = dir / "no_such_dir" / "p.svg";
    CHECK_THROWS(write_svg_plot(missing, "t", two_panels()));
    CHECK_FALSE(fs::exists(missing));
    CHECK(fs::is_empty(dir));
    // A directory where the file should go is refused and left alone.
    fs::create_directory(dir / "d.svg");
    CHECK_THROWS_AS(write_svg_plot(dir / "d.svg", "t", two_panels()), counterflux::tool::input_error);
    CHECK(fs::is_directory(dir / "d.svg"));

    auto bad = two_panels();
    bad[0].series[0].y.pop_back();
    CHECK_THROWS_AS(write_svg_plot(dir / "bad.svg", "t", bad), counterflux::tool::run_error);
    bad = two_panels();
    bad[1].series[0].y[3] = std::nan("");
    CHECK_THROWS_AS(write_svg_plot(dir / "bad.svg", "t", bad), counterflux::tool::run_error);
    CHECK_THROWS_AS(write_svg_plot(dir / "bad.svg", "t", {}), counterflux::tool::run_error);
    CHECK_FALSE(fs::exists(dir / "bad.svg"));
    // And the module still works after the failures.
    write_svg_plot(dir / "good.svg", "t", two_panels());
    CHECK(well_formed_svg(slurp(dir / "good.svg")));
}

// ---- the step verb ---------------------------------------------------------------

namespace {

using counterflux_command_test::run;
using counterflux_command_test::run_json;
using counterflux_command_test::shell_quote;

const std::string step_example = COUNTERFLUX_SOURCE_DIR "/examples/pumped_h2s_membrane.toml";

using counterflux_command_test::run_stderr;

std::vector<std::string> lines_of(const std::string& text) {
    std::vector<std::string> out;
    std::size_t start = 0;
    while (start < text.size()) {
        const std::size_t end = text.find('\n', start);
        out.push_back(text.substr(start, end == std::string::npos ? std::string::npos : end - start));
        if (end == std::string::npos) break;
        start = end + 1;
    }
    return out;
}

// The library's own run on the grid the command reports (no physics in the tool).
template <std::size_t Cells>
counterflux::result<counterflux::step_times<double>> library_run(const counterflux::tool::sensor_file& f, double duration,
                                                                 std::size_t steps) {
    const auto& r = *f.response;
    const counterflux::response_setup<double> setup{r.front_volume_m3.value_or(0.0), r.sample_flow_m3_s.value_or(0.0),
                                                    r.cavity_volume_m3.value_or(0.0), r.electrode_rate_m_s,
                                                    r.electrode_area_m2.value_or(0.0)};
    const auto chain = counterflux::chain_from_sensor(f.model, setup, f.model.reference_temperature_K,
                                                      f.model.reference_pressure_Pa);
    REQUIRE(chain.ok());
    return counterflux::step_response_estimate<double, Cells, counterflux::tool::max_elements + 2>(chain.value, duration,
                                                                                                    steps);
}

}  // namespace

TEST_CASE("step: the example's JSON keys, what sets t90, and the library's numbers") {
    const nlohmann::json j = run_json({"step", step_example, "--json"});
    for (const char* key : {"t10_s", "t50_s", "t90_s", "fall_t90_s", "t90_error_s", "duration_s", "steps",
                            "cells_per_layer", "slowest_time_constant_s", "max_mass_balance_error"}) {
        CAPTURE(key);
        REQUIRE(j.contains(key));
        REQUIRE(j[key].is_number());
    }
    const double t10 = j["t10_s"], t50 = j["t50_s"], t90 = j["t90_s"], fall = j["fall_t90_s"];
    CHECK(0.0 < t10);
    CHECK(t10 < t50);
    CHECK(t50 < t90);
    // A linear chain falls as it rises (superposition).
    CHECK(fall == doctest::Approx(t90).epsilon(1e-6));
    // Refined until t90 settles to 0.1 %.
    CHECK(j["t90_error_s"].get<double>() <= 1e-3 * t90);
    CHECK(j["max_mass_balance_error"].get<double>() < 1e-9);
    // The housing's front volume and the membrane set t90, not the capillary.
    const auto& set_by = j["t90_set_by"];
    REQUIRE(set_by.is_array());
    const auto in_set = [&](const char* key) {
        for (const auto& k : set_by)
            if (k == key) return true;
        return false;
    };
    CHECK(in_set("front_volume"));
    CHECK(in_set("barrier_1"));
    CHECK_FALSE(in_set("barrier_2"));
    CHECK(j["dominant_part"] != "barrier_2");

    // The same numbers from the library on the grid the command chose.
    const auto f = counterflux::tool::read_sensor_file(step_example);
    const std::size_t cells = j["cells_per_layer"], steps = j["steps"];
    const double duration = j["duration_s"];
    counterflux::result<counterflux::step_times<double>> lib{};
    if (cells == 16) lib = library_run<16>(f, duration, steps);
    else if (cells == 32) lib = library_run<32>(f, duration, steps);
    else if (cells == 64) lib = library_run<64>(f, duration, steps);
    else FAIL("unexpected grid of " << cells << " cells per layer");
    REQUIRE(lib.ok());
    CHECK(lib.value.t90_s == doctest::Approx(t90).epsilon(1e-14));
    CHECK(lib.value.t10_s == doctest::Approx(t10).epsilon(1e-14));
    CHECK(lib.value.t90_error_s == doctest::Approx(j["t90_error_s"].get<double>()).epsilon(1e-12));
}

TEST_CASE("step: the report names what sets t90") {
    const auto r = run({"step", step_example});
    REQUIRE(r.status == 0);
    CHECK(r.out.find("t90 is set by [[barrier]] #1 membrane and front volume") != std::string::npos);
    CHECK(r.out.find("not by [[barrier]] #2 capillary") != std::string::npos);
    CHECK(r.out.find("t90 error estimate") != std::string::npos);
}

TEST_CASE("step: a lone capillary gives Crank's t90 = 0.30352 L^2/D end to end") {
    // Crank, The Mathematics of Diffusion, 2nd ed. (1975), ch. 4, via
    // physics.md sec. 6: t90 = 0.30352 L^2/D for a layer between a step and a
    // perfect sink. No end correction and no Knudsen term: L is the bore and D
    // the free-gas D_AB the `diffusivity` verb prints (Fuller, at the reference).
    const fs::path dir = scratch("step_crank");
    const fs::path file = dir / "lone.toml";
    std::ofstream(file) << "[sensor]\nsymbol = \"lone\"\ntarget = \"CO\"\nbackground = \"N2\"\nelectrons = 2\n"
                           "flux_ratio = \"equimolar\"\nfull_scale = \"1000 ppm\"\n\n[reference]\n"
                           "temperature = \"298.15 K\"\npressure = \"101325 Pa\"\n\n[diffusivity]\nmethod = \"fuller\"\n\n"
                           "[[barrier]]\ntype = \"capillary\"\ndiameter = \"1 mm\"\nlength = \"3 mm\"\n"
                           "end_correction = false\nknudsen = false\n";
    const nlohmann::json d = run_json({"diffusivity", "CO", "N2", "--temperature", "298.15 K", "--pressure",
                                       "101325 Pa", "--json"});
    const double dab = d["diffusivity_m2_s"];
    const nlohmann::json j = run_json({"step", file.string(), "--json"});
    const double scale = 3e-3 * 3e-3 / dab;
    CHECK(j["t90_s"].get<double>() / scale == doctest::Approx(0.30352).epsilon(2e-3));
    CHECK(j["t50_s"].get<double>() / scale == doctest::Approx(0.13879).epsilon(2e-3));
    CHECK(j["t10_s"].get<double>() / scale == doctest::Approx(0.06611).epsilon(2e-3));
}

TEST_CASE("step: --csv writes the curve with its header and row count, --svg the plot") {
    const fs::path dir = scratch("step_files");
    const fs::path csv = dir / "curve.csv", svg = dir / "plot.svg";
    const nlohmann::json j = run_json({"step", step_example, "--json", "--csv", csv.string(), "--svg", svg.string()});
    const auto rows = lines_of(slurp(csv));
    REQUIRE(rows.size() >= 3);
    CHECK(rows[0] == "time[s],rise[1],fall[1]");
    CHECK(rows.size() - 1 == j["csv_rows"].get<std::size_t>());
    CHECK(rows[1] == "0,0,1");
    // The curve spans the file's duration, 60 s; rise and fall stay within [0, 1].
    double last_t = 0.0;
    for (std::size_t i = 1; i < rows.size(); ++i) {
        double t = 0, rise = 0, fall = 0;
        REQUIRE(std::sscanf(rows[i].c_str(), "%lf,%lf,%lf", &t, &rise, &fall) == 3);
        CHECK(t >= last_t);
        CHECK(rise >= -1e-9);
        CHECK(rise <= 1.0 + 1e-9);
        CHECK(fall >= -1e-9);
        CHECK(fall <= 1.0 + 1e-9);
        last_t = t;
    }
    CHECK(last_t == doctest::Approx(60.0).epsilon(1e-9));
    const std::string plot = slurp(svg);
    CHECK(well_formed_svg(plot));
    CHECK(plot.find("t90") != std::string::npos);
    CHECK(plot.find("fall t90") != std::string::npos);
    for (const auto& e : fs::directory_iterator(dir))
        CHECK_FALSE(counterflux::tool::is_atomic_write_temporary(e.path().filename().string()));
}

TEST_CASE("step: bad input exits 2 with FILE:LINE:COLUMN, a failed write leaves no file") {
    // A membrane without a film diffusivity: the step response cannot be computed.
    const std::string membrane = COUNTERFLUX_SOURCE_DIR "/tests/data/good/membrane_o2.toml";
    auto [status, err] = run_stderr({"step", membrane});
    CHECK(status == 2);
    CHECK(err.rfind(membrane + ":19:1: error: ", 0) == 0);
    CHECK(err.find("diffusivity") != std::string::npos);
    // A broken file is refused by the reader like every verb's.
    const std::string bad = COUNTERFLUX_SOURCE_DIR "/tests/data/bad/membrane_partition_zero.toml";
    std::tie(status, err) = run_stderr({"step", bad, "--json"});
    CHECK(status == 2);
    CHECK(err.rfind(bad + ":24:13: error: ", 0) == 0);
    // An empty --csv path is a usage error; a directory that does not exist a failed write.
    std::tie(status, err) = run_stderr({"step", step_example, "--csv", ""});
    CHECK(status == 2);
    const fs::path dir = scratch("step_fail");
    const fs::path missing = dir / "nowhere" / "curve.csv";
    std::tie(status, err) = run_stderr({"step", step_example, "--csv", missing.string()});
    CHECK(status != 0);
    CHECK_FALSE(fs::exists(missing));
    CHECK(fs::is_empty(dir));
}

TEST_CASE("step: every example settles its t90 to 0.1 % and keeps its mass balance") {
    int seen = 0;
    for (const auto& e : fs::directory_iterator(COUNTERFLUX_SOURCE_DIR "/examples")) {
        if (e.path().extension() != ".toml") continue;
        CAPTURE(e.path().string());
        const nlohmann::json j = run_json({"step", e.path().string(), "--json"});
        const double t90 = j["t90_s"];
        CHECK(t90 > 0.0);
        CHECK(j["t90_error_s"].get<double>() <= 1e-3 * t90);
        CHECK(j["max_mass_balance_error"].get<double>() < 1e-9);
        // The parts' shares of their summed times add up to 1.
        double share = 0.0;
        for (const auto& p : j["parts"]) share += p["share"].get<double>();
        CHECK(share == doctest::Approx(1.0).epsilon(1e-12));
        ++seen;
    }
    CHECK(seen >= 3);
}
