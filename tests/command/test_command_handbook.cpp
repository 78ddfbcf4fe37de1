// `counterflux diffusivity` agrees with the handbook on the same pairs, and to
// the same tolerances, as the library's unit test: the rows and tolerances come
// from one shared header (tests/unit/handbook_diffusivities.hpp, which names
// the sources). The command is run as a user would, once per row and method:
//   counterflux diffusivity A B --temperature T --pressure 101325 --method M --json
#include <doctest/doctest.h>

#include <cmath>
#include <cstdio>
#include <string>

#include <nlohmann/json.hpp>

#include "../unit/handbook_diffusivities.hpp"
#include "command_runner.hpp"

namespace {

using counterflux_command_test::run_json;
using counterflux_test::handbook_row;
using counterflux_test::handbook_rows;

// T as a bare number in K that parses back to exactly the row's double.
std::string kelvin_text(double t) {
    char text[64];
    std::snprintf(text, sizeof text, "%.17g", t);
    return text;
}

void check_command_method(const char* method, bool chapman_enskog, double average_error) {
    double sum = 0.0;
    int n = 0;
    for (const handbook_row& row : handbook_rows) {
        if (chapman_enskog && row.polar) continue;  // H2O: Fuller only (see the header)
        const nlohmann::json j = run_json({"diffusivity", row.a, row.b, "--temperature", kelvin_text(row.temperature_K),
                                           "--pressure", "101325", "--method", method, "--json"});
        CHECK(j["method"] == method);
        CHECK(j["temperature_K"].get<double>() == row.temperature_K);
        CHECK(j["pressure_Pa"].get<double>() == counterflux_test::handbook_pressure_Pa);
        const double command_cm2_s = j["diffusivity_m2_s"].get<double>() * 1.0e4;
        CHECK(j["diffusivity_cm2_s"].get<double>() == doctest::Approx(command_cm2_s).epsilon(1e-14));
        const double rel = command_cm2_s / row.d_cm2_s - 1.0;
        INFO(row.a << "-" << row.b << " at " << row.temperature_K << " K: command " << command_cm2_s
                   << " cm2/s, handbook " << row.d_cm2_s);
        CHECK(std::fabs(rel) < counterflux_test::handbook_pair_tolerance_factor * average_error);
        sum += std::fabs(rel);
        ++n;
    }
    REQUIRE(n >= counterflux_test::handbook_minimum_rows);
    CHECK(sum / n < average_error);
}

}  // namespace

TEST_CASE("diffusivity --method fuller agrees with the handbook values at 1 atm") {
    check_command_method("fuller", false, counterflux_test::fuller_average_error);
}

TEST_CASE("diffusivity --method chapman-enskog agrees with the handbook values at 1 atm (H2O excluded)") {
    check_command_method("chapman-enskog", true, counterflux_test::chapman_enskog_average_error);
}
