// tests/command/test_table.cpp - `counterflux table FILE --out DIR` end to end:
// the outputs, the record they hold, the error bound (met, not met, chosen),
// and bad input. The numbers checked are re-derived here from the library or
// from the outputs' own axes, never copied from a previous run.
#include <doctest/doctest.h>

#include <cstdint>
#include <cstdio>
#include <filesystem>
#include <fstream>
#include <iterator>
#include <sstream>
#include <string>
#include <utility>
#include <vector>

#include <counterflux/record.hpp>

#include "command_runner.hpp"

namespace fs = std::filesystem;
using counterflux_command_test::run;
using counterflux_command_test::run_json;

namespace {

const std::string examples = COUNTERFLUX_SOURCE_DIR "/examples";

fs::path fresh_dir(const std::string& name) {
    const fs::path d = fs::temp_directory_path() / ("counterflux-table-test-" + name);
    fs::remove_all(d);
    fs::create_directories(d);
    return d;
}

std::string slurp(const fs::path& p) {
    std::ifstream in(p, std::ios::binary);
    return std::string(std::istreambuf_iterator<char>(in), std::istreambuf_iterator<char>());
}

// The garage example with its [table] section replaced.
fs::path garage_with_table(const fs::path& dir, const std::string& table) {
    std::string text = slurp(examples + "/garage_co.toml");
    const auto at = text.find("[table]");
    REQUIRE(at != std::string::npos);
    const auto end = text.find("\n[", at + 1);
    text = text.substr(0, at) + table + (end == std::string::npos ? "" : text.substr(end));
    const fs::path p = dir / "sensor.toml";
    std::ofstream(p) << text;
    return p;
}

std::size_t lines(const std::string& s) {
    std::size_t n = 0;
    for (char c : s) n += c == '\n';
    return n;
}

}  // namespace

TEST_CASE("table: the garage example writes four outputs that agree with each other") {
    const fs::path dir = fresh_dir("garage");
    const auto j = run_json({"table", examples + "/garage_co.toml", "--out", dir.string(), "--json"});
    CHECK(j.at("bound_met").get<bool>());
    const double proven = j.at("max_interpolation_error").get<double>();
    CHECK(proven > 0.0);
    CHECK(proven <= j.at("max_error_requested").get<double>());
    const auto& axes = j.at("axes");
    REQUIRE(axes.size() == 2);
    const std::size_t nt = axes[0].at("count"), np = axes[1].at("count");
    CHECK(axes[0].at("unit") == "K");
    CHECK(axes[1].at("unit") == "Pa");
    // float32: the correction table nt x np and the zero table nt, 4 bytes each
    CHECK(j.at("table_bytes").get<std::size_t>() == (nt * np + nt) * 4);
    REQUIRE(j.at("files").size() == 4);
    for (const auto& f : j.at("files")) CHECK(fs::is_regular_file(f.get<std::string>()));

    // CSV: units in the header, one row per node
    const std::string csv = slurp(dir / "garage_co.csv");
    CHECK(csv.rfind("temperature[K],temperature[C],pressure[Pa],span[1],span_correction[1],zero_current[A]", 0) == 0);
    CHECK(lines(csv) == nt * np + 1);

    // JSON file: the same proof and the tables
    const auto doc = nlohmann::json::parse(slurp(dir / "garage_co.json"));
    CHECK(doc.at("max_interpolation_error").get<double>() == proven);
    CHECK(doc.at("span").size() == nt);
    CHECK(doc.at("span")[0].size() == np);

    // the record: valid, and its axes and tables those of the JSON
    const std::string bin = slurp(dir / "garage_co.bin");
    const auto check = counterflux::validate_record(reinterpret_cast<const std::uint8_t*>(bin.data()), bin.size());
    REQUIRE(check.fault == counterflux::record_fault::none);
    CHECK(std::string(check.view.symbol()) == "garage_co");
    CHECK(check.view.temperature().count == nt);
    CHECK(check.view.pressure().count == np);
    CHECK(check.view.linear());
    for (std::size_t i = 0; i < nt; ++i)
        for (std::size_t k = 0; k < np; ++k)
            CHECK(static_cast<double>(check.view.value(counterflux::record_table::correction, i * np + k)) ==
                  doc.at("span_correction").at("values")[i][k].get<double>());

    // the header names its source and proof
    const std::string h = slurp(dir / "garage_co.h");
    CHECK(h.find("#include <stdint.h>") != std::string::npos);
    CHECK(h.find("garage_co_reading(") != std::string::npos);
    CHECK(h.find("CRC-32 of its bytes") != std::string::npos);
}

TEST_CASE("table: q15 values halve the table data and keep the bound") {
    const fs::path dir = fresh_dir("q15");
    const auto j = run_json({"table", examples + "/garage_co.toml", "--out", dir.string(), "--values", "q15", "--json"});
    const std::size_t nt = j.at("axes")[0].at("count"), np = j.at("axes")[1].at("count");
    CHECK(j.at("table_bytes").get<std::size_t>() == (nt * np + nt) * 2);
    CHECK(j.at("bound_met").get<bool>());
    const std::string h = slurp(dir / "garage_co.h");
    CHECK(h.find("garage_co_reading_fixed(") != std::string::npos);
}

TEST_CASE("table: a bound the grid cannot meet exits 3 and writes nothing") {
    const fs::path dir = fresh_dir("unmet");
    const fs::path file = garage_with_table(dir, R"([table]
temperature = { from = "-20 C", to = "50 C", points = 2 }
pressure    = { from = "90 kPa", to = "106 kPa", points = 2 }
max_error = "0.001 %"
)");
    const fs::path out = dir / "out";
    fs::create_directories(out);
    std::ofstream(out / "garage_co.h") << "/* a good table from before */\n";
    const auto r = run({"table", file.string(), "--out", out.string(), "--json"});
    CHECK(r.status == 3);
    const auto j = nlohmann::json::parse(r.out);
    CHECK_FALSE(j.at("bound_met").get<bool>());
    CHECK(j.at("max_interpolation_error").get<double>() > 1.0e-5);
    CHECK(j.at("files").empty());
    CHECK(slurp(out / "garage_co.h") == "/* a good table from before */\n");
    CHECK_FALSE(fs::exists(out / "garage_co.bin"));
}

TEST_CASE("table: without point counts the grid is chosen to meet max_error, and one point fewer would not") {
    const fs::path dir = fresh_dir("chosen");
    const fs::path file = garage_with_table(dir, R"([table]
temperature = { from = "-20 C", to = "50 C" }
pressure    = { from = "90 kPa", to = "106 kPa", points = 3 }
max_error = "0.01 %"
)");
    const auto j = run_json({"table", file.string(), "--out", (dir / "out").string(), "--json"});
    CHECK(j.at("bound_met").get<bool>());
    CHECK(j.at("max_interpolation_error").get<double>() <= 1.0e-4);
    const std::size_t nt = j.at("axes")[0].at("count");
    CHECK(nt > 2);
    const fs::path fewer = garage_with_table(dir, "[table]\ntemperature = { from = \"-20 C\", to = \"50 C\", points = " +
                                                      std::to_string(nt - 1) +
                                                      " }\npressure    = { from = \"90 kPa\", to = \"106 kPa\", points = "
                                                      "3 }\nmax_error = \"0.01 %\"\n");
    CHECK(run({"table", fewer.string(), "--out", (dir / "out2").string()}).status == 3);
}

TEST_CASE("table: bad input exits 2 and names what is wrong") {
    const fs::path dir = fresh_dir("bad");
    // no [table] section
    std::string text = slurp(examples + "/garage_co.toml");
    text = text.substr(0, text.find("[table]"));
    const fs::path none = dir / "none.toml";
    std::ofstream(none) << text;
    CHECK(run({"table", none.string(), "--out", (dir / "o").string()}).status == 2);
    // --out is a file
    std::ofstream(dir / "plain") << "x";
    CHECK(run({"table", examples + "/garage_co.toml", "--out", (dir / "plain").string()}).status == 2);
    CHECK(slurp(dir / "plain") == "x");
    // --values unknown, --out missing
    CHECK(run({"table", examples + "/garage_co.toml", "--out", (dir / "o").string(), "--values", "q7"}).status == 2);
    CHECK(run({"table", examples + "/garage_co.toml"}).status == 2);
    CHECK_FALSE(fs::exists(dir / "o"));
}

using counterflux_command_test::run_stderr;

TEST_CASE("table: error messages name the file, the place and what was expected") {
    const fs::path dir = fresh_dir("messages");
    const fs::path file = garage_with_table(dir, R"([table]
temperature = { from = "-20 C", to = "50 C" }
pressure    = { from = "90 kPa", to = "106 kPa", points = 3 }
)");
    const auto [status, err] = run_stderr({"table", file.string(), "--out", (dir / "o").string()});
    CHECK(status == 2);
    // FILE:LINE:COLUMN: error: ... naming the key and the way out
    CHECK(err.find(file.string() + ":") == 0);
    CHECK(err.find(": error: 'table.temperature' has no 'points'") != std::string::npos);
    CHECK(err.find("table.max_error") != std::string::npos);
    const auto [s2, e2] = run_stderr({"table", examples + "/garage_co.toml", "--out", (dir / "o").string(), "--values",
                                      "q7"});
    CHECK(s2 == 2);
    CHECK(e2.find("--values") != std::string::npos);
    CHECK(e2.find("float32 or q15") != std::string::npos);
}

TEST_CASE("table: a plot that cannot be written leaves no output behind") {
    const fs::path dir = fresh_dir("svgfail");
    const fs::path out = dir / "out";
    fs::create_directories(out);
    std::ofstream(out / "garage_co.h") << "/* a good table from before */\n";
    const auto [status, err] = run_stderr({"table", examples + "/garage_co.toml", "--out", out.string(), "--svg",
                                           (dir / "missing" / "plot.svg").string()});
    CHECK(status == 1);
    CHECK(err.find("plot.svg") != std::string::npos);
    CHECK(slurp(out / "garage_co.h") == "/* a good table from before */\n");
    CHECK_FALSE(fs::exists(out / "garage_co.bin"));
    for (const auto& e : fs::directory_iterator(out)) CHECK(e.path().filename() == "garage_co.h");
}
