// The command adds no physics: the numbers `design --json` and
// `diffusivity --json` print are the library's, called directly on the same
// model (built by the same sensor-file reader).
#include <doctest/doctest.h>

#include <cstdio>
#include <string>
#include <vector>

#include <nlohmann/json.hpp>

#include <counterflux/counterflux.hpp>

#include "command_runner.hpp"
#include "sensor_file.hpp"

namespace {

using counterflux_command_test::run;
using counterflux_command_test::run_json;
using counterflux_command_test::run_result;

const std::string examples = COUNTERFLUX_SOURCE_DIR "/examples/";

// JSON round-trips doubles exactly; allow only the last-digit noise of printing.
void same(const nlohmann::json& j, const char* key, double library) {
    CAPTURE(key);
    REQUIRE(j.contains(key));
    REQUIRE(j[key].is_number());
    CHECK(j[key].get<double>() == doctest::Approx(library).epsilon(1e-14));
}

void check_design(const std::string& file, const std::vector<std::string>& flags, double t, double p, double y) {
    const auto f = counterflux::tool::read_sensor_file(file);
    const auto& m = f.model;
    if (t == 0.0) t = m.reference_temperature_K;
    if (p == 0.0) p = m.reference_pressure_Pa;
    if (y < 0.0) y = f.full_scale_mol_mol;

    std::vector<std::string> args = {"design", file, "--json"};
    args.insert(args.end(), flags.begin(), flags.end());
    const nlohmann::json j = run_json(args);

    same(j, "temperature_K", t);
    same(j, "pressure_Pa", p);
    // The library is called at the condition the command parsed ("40 C" may be
    // 313.15 plus an ulp): the central-difference coefficients amplify an ulp.
    t = j["temperature_K"].get<double>();
    p = j["pressure_Pa"].get<double>();
    same(j, "concentration_mol_mol", y);
    same(j, "current_A", counterflux::limiting_current_A(m, t, p, y).value);
    same(j, "sensitivity_A_per_mol_per_mol", counterflux::sensitivity_A_per_mol_per_mol(m, t, p).value);
    same(j, "temperature_coefficient_per_K", counterflux::temperature_coefficient_per_K(m, t, p).value);
    same(j, "pressure_coefficient_per_Pa", counterflux::pressure_coefficient_per_Pa(m, t, p).value);
    same(j, "linearity_ratio", counterflux::linearity_ratio(m, t, p, y).value);
    same(j, "span_factor", counterflux::span_factor(m, t, p).value);
    const auto reports = counterflux::element_reports(m, t, p);
    REQUIRE(reports.ok());
    REQUIRE(j["knudsen_numbers"].size() == m.barriers.count);
    REQUIRE(j["resistance_shares"].size() == m.barriers.count);
    for (std::size_t i = 0; i < m.barriers.count; ++i) {
        CHECK(j["knudsen_numbers"][i].get<double>() ==
              doctest::Approx(reports.value.elements[i].knudsen_number).epsilon(1e-14));
        CHECK(j["resistance_shares"][i].get<double>() ==
              doctest::Approx(reports.value.elements[i].resistance_share).epsilon(1e-14));
    }
    CHECK(j["limiting_element"].get<std::size_t>() == reports.value.limiting_element);
    // Per element: a membrane has no Knudsen number (null; 0 in the contract
    // array), and linear_resistance_share is the library's knudsen_share.
    REQUIRE(j["elements"].size() == m.barriers.count);
    for (std::size_t i = 0; i < m.barriers.count; ++i) {
        CAPTURE(i);
        const nlohmann::json& e = j["elements"][i];
        const auto& lib = reports.value.elements[i];
        const bool membrane = m.barriers.elements[i].kind == counterflux::barrier_kind::membrane;
        CHECK(e["type"] == counterflux::kind_name(m.barriers.elements[i].kind));
        if (membrane) {
            CHECK(e["knudsen_number"].is_null());
            CHECK(j["knudsen_numbers"][i].get<double>() == 0.0);
        } else {
            CHECK(e["knudsen_number"].get<double>() == doctest::Approx(lib.knudsen_number).epsilon(1e-14));
        }
        CHECK_FALSE(e.contains("knudsen_share"));
        CHECK(e["linear_resistance_share"].get<double>() == doctest::Approx(lib.knudsen_share).epsilon(1e-14));
        CHECK(e["resistance_share"].get<double>() == doctest::Approx(lib.resistance_share).epsilon(1e-14));
        CHECK(e["area_m2"].get<double>() == doctest::Approx(lib.area_m2).epsilon(1e-14));
        CHECK(e["effective_length_m"].get<double>() == doctest::Approx(lib.effective_length_m).epsilon(1e-14));
    }
}

}  // namespace

TEST_CASE("design --json equals the library on the garage CO example") {
    const std::string file = examples + "garage_co.toml";
    check_design(file, {}, 0.0, 0.0, -1.0);
    check_design(file, {"--temperature", "40 C", "--pressure", "95 kPa", "--concentration", "200 ppm"}, 313.15,
                 95000.0, 200e-6);
    check_design(file, {"--temperature", "-20 C", "--concentration", "0"}, 253.15, 0.0, 0.0);
}

TEST_CASE("design --json equals the library on the flue-gas O2 example") {
    const std::string file = examples + "flue_o2_altitude.toml";
    check_design(file, {}, 0.0, 0.0, -1.0);
    check_design(file, {"--concentration", "20.95 %"}, 0.0, 0.0, 0.2095);
    check_design(file, {"--pressure", "1 atm", "--temperature", "5 C"}, 278.15, 101325.0, -1.0);
}

TEST_CASE("design --json equals the library on a membrane cell read as partial pressure") {
    const std::string file = COUNTERFLUX_SOURCE_DIR "/tests/data/good/membrane_o2.toml";
    check_design(file, {}, 0.0, 0.0, -1.0);
    check_design(file, {"--temperature", "0 C", "--pressure", "80 kPa", "--concentration", "5 %"}, 273.15, 80000.0,
                 0.05);
    const nlohmann::json j = run_json({"design", file, "--json"});
    // The membrane's resistance is all solution-diffusion: linear in the flux ratio.
    CHECK(j["elements"][0]["type"] == "membrane");
    CHECK(j["elements"][0]["linear_resistance_share"].get<double>() == 1.0);
    CHECK(j["elements"][1]["knudsen_number"].get<double>() > 0.0);
}

TEST_CASE("design: the O2 example is strongly non-linear at air level") {
    const nlohmann::json j =
        run_json({"design", examples + "flue_o2_altitude.toml", "--json", "--concentration", "20.95 %"});
    // the stagnant-film log law ln(1/(1-y))/y at y = 0.2095 is 1.1221; the small
    // Knudsen parts of the barriers pull it slightly towards 1
    CHECK(j["linearity_ratio"].get<double>() > 1.10);
    CHECK(j["linearity_ratio"].get<double>() < 1.1221 + 1e-3);
}

TEST_CASE("diffusivity --json equals the library") {
    struct pair_case {
        const char* a;
        const char* b;
        const char* t;
        double t_K;
        const char* p;
        double p_Pa;
    };
    const pair_case cases[] = {
        {"N2", "O2", "298.15 K", 298.15, "1 atm", 101325.0},
        {"CO", "air", "25 C", 298.15, "101.325 kPa", 101325.0},
        {"O2", "N2", "0 C", 273.15, "1 bar", 1e5},
        {"H2S", "air", "40 C", 313.15, "90 kPa", 90000.0},
        {"CO2", "N2", "300", 300.0, "83500", 83500.0},
    };
    for (const auto& c : cases) {
        CAPTURE(c.a);
        CAPTURE(c.b);
        const auto* a = counterflux::find_gas(c.a).value;
        const auto* b = counterflux::find_gas(c.b).value;
        REQUIRE(a != nullptr);
        REQUIRE(b != nullptr);
        const nlohmann::json fuller =
            run_json({"diffusivity", c.a, c.b, "--temperature", c.t, "--pressure", c.p, "--json"});
        CHECK(fuller["method"] == "fuller");
        same(fuller, "temperature_K", c.t_K);
        same(fuller, "pressure_Pa", c.p_Pa);
        same(fuller, "diffusivity_m2_s", counterflux::fuller_diffusivity(*a, *b, c.t_K, c.p_Pa).value);
        const nlohmann::json ce = run_json(
            {"diffusivity", c.a, c.b, "--temperature", c.t, "--pressure", c.p, "--method", "chapman-enskog", "--json"});
        CHECK(ce["method"] == "chapman-enskog");
        same(ce, "diffusivity_m2_s", counterflux::chapman_enskog_diffusivity(*a, *b, c.t_K, c.p_Pa).value);
    }
}

TEST_CASE("diffusivity: defaults are 298.15 K, 101325 Pa and fuller") {
    const nlohmann::json j = run_json({"diffusivity", "CO", "air", "--json"});
    CHECK(j["method"] == "fuller");
    CHECK(j["temperature_K"].get<double>() == 298.15);
    CHECK(j["pressure_Pa"].get<double>() == 101325.0);
    const auto* co = counterflux::find_gas("CO").value;
    const auto* air = counterflux::find_gas("air").value;
    same(j, "diffusivity_m2_s", counterflux::fuller_diffusivity(*co, *air, 298.15, 101325.0).value);
}

TEST_CASE("diffusivity: the same gas twice is its self-diffusivity, and says so") {
    const auto* co = counterflux::find_gas("CO").value;
    for (const char* second : {"CO", "carbon monoxide"}) {
        CAPTURE(second);
        const nlohmann::json j = run_json({"diffusivity", "CO", second, "--json"});
        REQUIRE(j.contains("self_diffusivity"));
        CHECK(j["self_diffusivity"] == true);
        same(j, "diffusivity_m2_s", counterflux::fuller_diffusivity(*co, *co, 298.15, 101325.0).value);
        const run_result r = run({"diffusivity", "CO", second});
        REQUIRE(r.status == 0);
        CAPTURE(r.out);
        CHECK(r.out.find("cm2/s (self-diffusivity of CO)\n") != std::string::npos);
    }
    const nlohmann::json pair = run_json({"diffusivity", "CO", "air", "--json"});
    CHECK(pair["self_diffusivity"] == false);
    CHECK(run({"diffusivity", "CO", "air"}).out.find("self-diffusivity") == std::string::npos);
}

TEST_CASE("design: the span line says what the span factor divides, per report mode") {
    const run_result fraction = run({"design", examples + "garage_co.toml"});
    REQUIRE(fraction.status == 0);
    CAPTURE(fraction.out);
    CHECK(fraction.out.find(" (sensitivity / sensitivity at reference)\n") != std::string::npos);
    const run_result pressure =
        run({"design", COUNTERFLUX_SOURCE_DIR "/tests/data/good/membrane_o2.toml", "--pressure", "80 kPa"});
    REQUIRE(pressure.status == 0);
    CAPTURE(pressure.out);
    CHECK(pressure.out.find(" ((S/P) / (S_ref/P_ref): sensitivity to partial pressure / that at reference)\n") !=
          std::string::npos);
    CHECK(pressure.out.find("(sensitivity / sensitivity at reference)") == std::string::npos);
}

TEST_CASE("design: the human report shows the library's sensitivity in nA/ppm") {
    const std::string file = examples + "garage_co.toml";
    const auto f = counterflux::tool::read_sensor_file(file);
    const double s = counterflux::sensitivity_A_per_mol_per_mol(f.model, f.model.reference_temperature_K,
                                                                f.model.reference_pressure_Pa)
                         .value;
    const run_result r = run({"design", file});
    REQUIRE(r.status == 0);
    char expected[64];
    std::snprintf(expected, sizeof expected, "%.4g nA/ppm", counterflux::to_nA_per_ppm(s));
    CAPTURE(r.out);
    CHECK(r.out.find(expected) != std::string::npos);
    CHECK(r.out.find("limiting element") != std::string::npos);
}
