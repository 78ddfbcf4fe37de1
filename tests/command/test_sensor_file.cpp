// The sensor-file reader: keys to library types in SI, defaults, and errors
// with FILE:LINE:COLUMN. (The broken-file catalogue in tests/data/bad checks
// the command end to end; these cases check the reader's values.)
#include <doctest/doctest.h>

#include <cmath>
#include <filesystem>
#include <fstream>
#include <limits>
#include <set>
#include <sstream>
#include <string>

#include <sys/stat.h>
#include <unistd.h>

#include <counterflux/counterflux.hpp>

#include "errors.hpp"
#include "sensor_file.hpp"

using counterflux::tool::input_error;
using counterflux::tool::parse_sensor_file;
using counterflux::tool::read_sensor_file;
using counterflux::tool::sensor_file;

namespace {

const std::string examples = COUNTERFLUX_SOURCE_DIR "/examples/";

const std::string minimal = R"([sensor]
symbol = "cell"
target = "CO"
background = "air"
electrons = 2
flux_ratio = "equimolar"
full_scale = "1000 ppm"

[reference]
temperature = "20 C"
pressure = "101.325 kPa"

[diffusivity]
method = "fuller"

[[barrier]]
type = "capillary"
diameter = "0.15 mm"
length = "1.2 mm"
)";

// The diagnostics of parsing text (empty when it parses).
std::vector<counterflux::tool::diagnostic> problems(const std::string& text) {
    try {
        (void)parse_sensor_file(text, "test.toml");
    } catch (const input_error& e) {
        return e.diagnostics();
    }
    return {};
}

std::string first_line(const std::string& text) {
    const auto d = problems(text);
    return d.empty() ? std::string() : counterflux::tool::format_diagnostic(d.front());
}

}  // namespace

TEST_CASE("sensor file: the minimal file, in SI, with the defaults") {
    const sensor_file f = parse_sensor_file(minimal, "test.toml");
    const auto& m = f.model;
    CHECK(f.symbol == "cell");
    REQUIRE(m.target != nullptr);
    REQUIRE(m.background != nullptr);
    CHECK(std::string(m.target->formula) == "CO");
    CHECK(std::string(m.background->formula) == "air");
    CHECK(m.electrons == 2u);
    CHECK(m.flux_ratio == -1.0);
    CHECK(f.flux_ratio_name == "equimolar");
    CHECK(m.reading == counterflux::reading_kind::mole_fraction);  // report defaults to fraction
    CHECK(f.full_scale_mol_mol == doctest::Approx(1e-3).epsilon(1e-15));
    CHECK(m.reference_temperature_K == doctest::Approx(293.15).epsilon(1e-15));
    CHECK(m.reference_pressure_Pa == 101325.0);
    CHECK(m.diffusivity.method == counterflux::diffusivity_method::fuller);
    CHECK(m.diffusivity.a == m.target);
    CHECK(m.diffusivity.b == m.background);
    REQUIRE(m.barriers.count == 1);
    const auto& b = m.barriers.elements[0];
    CHECK(b.kind == counterflux::barrier_kind::capillary);
    CHECK(b.diameter_m == doctest::Approx(1.5e-4).epsilon(1e-15));
    CHECK(b.length_m == doctest::Approx(1.2e-3).epsilon(1e-15));
    CHECK(b.count == 1u);             // default
    CHECK(b.end_correction == true);  // default
    CHECK(b.knudsen == true);         // default
    CHECK_FALSE(f.table.has_value());
    CHECK_FALSE(f.response.has_value());
    CHECK(f.element_places.size() == 1);
    CHECK(f.element_places[0].line == 16);
}

TEST_CASE("sensor file: TOML numbers are bare SI") {
    std::string text = minimal;
    text.replace(text.find("\"0.15 mm\""), 9, "0.00015");
    text.replace(text.find("\"20 C\""), 6, "293.15");
    text.replace(text.find("\"1000 ppm\""), 10, "1e-3");
    const sensor_file f = parse_sensor_file(text, "test.toml");
    CHECK(f.model.barriers.elements[0].diameter_m == 1.5e-4);
    CHECK(f.model.reference_temperature_K == 293.15);
    CHECK(f.full_scale_mol_mol == 1e-3);
}

TEST_CASE("sensor file: the examples") {
    const sensor_file co = read_sensor_file(examples + "garage_co.toml");
    CHECK(co.symbol == "garage_co");
    CHECK(co.model.electrons == 2u);
    CHECK(co.model.flux_ratio == -1.0);
    CHECK(co.full_scale_mol_mol == doctest::Approx(500e-6));
    CHECK(co.model.diffusivity.method == counterflux::diffusivity_method::chapman_enskog);
    REQUIRE(co.model.barriers.count == 2);
    CHECK(co.model.barriers.elements[0].kind == counterflux::barrier_kind::porous);
    CHECK(co.model.barriers.elements[1].kind == counterflux::barrier_kind::capillary);
    REQUIRE(co.table.has_value());
    CHECK(co.table->temperature.from == doctest::Approx(253.15));
    CHECK(co.table->temperature.points == 15u);
    CHECK(co.table->values == "float32");
    CHECK(co.table->max_error == doctest::Approx(1e-3));
    REQUIRE(co.response.has_value());
    CHECK(std::isinf(co.response->electrode_rate_m_s));
    CHECK(*co.response->cavity_volume_m3 == doctest::Approx(3e-9));
    CHECK_FALSE(co.response->front_volume_m3.has_value());

    const sensor_file o2 = read_sensor_file(examples + "flue_o2_altitude.toml");
    CHECK(o2.symbol == "flue_o2");
    CHECK(o2.model.electrons == 4u);
    CHECK(o2.model.flux_ratio == 0.0);
    CHECK(o2.flux_ratio_name == "stagnant");
    CHECK(o2.full_scale_mol_mol == doctest::Approx(0.25));
    // ISO 2533 at 1600 m: 101325 (1 - 2.25577e-5 * 1600)^5.25588 = 83.5 kPa
    const double iso = 101325.0 * std::pow(1.0 - 2.25577e-5 * 1600.0, 5.25588);
    CHECK(o2.model.reference_pressure_Pa == doctest::Approx(iso).epsilon(1e-3));
    REQUIRE(o2.table.has_value());
    CHECK(o2.table->values == "q15");
    REQUIRE(o2.response.has_value());
    CHECK(*o2.response->sample_flow_m3_s == doctest::Approx(0.5e-3 / 60.0));
    CHECK(*o2.response->front_volume_m3 == doctest::Approx(0.8e-6));
    // strongly non-linear at air level: the log law at 21 % is ln(1/(1-y))/y = 1.12
    const auto lin = counterflux::linearity_ratio(o2.model, o2.model.reference_temperature_K,
                                                  o2.model.reference_pressure_Pa, 0.2095);
    REQUIRE(lin.ok());
    CHECK(lin.value > 1.1);
}

TEST_CASE("sensor file: a measured diffusivity, a membrane, a numeric flux ratio, partial pressure") {
    std::string text = minimal;
    text.replace(text.find("method = \"fuller\""), 17,
                 "method = \"measured\"\nvalue = \"0.208 cm2/s\"\nat_temperature = \"25 C\"\nat_pressure = \"1 atm\"");
    text.replace(text.find("flux_ratio = \"equimolar\""), 24, "flux_ratio = -2\nreport = \"partial-pressure\"");
    text += "\n[[barrier]]\ntype = \"membrane\"\nthickness = \"25 um\"\narea = \"10 mm2\"\n"
            "permeability = \"1000 Barrer\"\nactivation_energy = \"12 kJ/mol\"\ndiffusivity = \"1e-9 m2/s\"\n";
    const sensor_file f = parse_sensor_file(text, "test.toml");
    const auto& m = f.model;
    CHECK(m.flux_ratio == -2.0);
    CHECK(f.flux_ratio_name.empty());
    CHECK(m.reading == counterflux::reading_kind::partial_pressure);
    CHECK(m.diffusivity.method == counterflux::diffusivity_method::measured);
    CHECK(m.diffusivity.measured_m2_s == doctest::Approx(0.208e-4));
    CHECK(m.diffusivity.measured_temperature_K == doctest::Approx(298.15));
    CHECK(m.diffusivity.measured_pressure_Pa == 101325.0);
    CHECK(m.diffusivity.measured_exponent == 1.75);  // default
    REQUIRE(m.barriers.count == 2);
    const auto& b = m.barriers.elements[1];
    CHECK(b.kind == counterflux::barrier_kind::membrane);
    CHECK(b.length_m == doctest::Approx(25e-6));
    CHECK(b.area_m2 == doctest::Approx(10e-6));
    CHECK(b.permeability_mol_m_s_Pa == doctest::Approx(1000.0 * counterflux::barrer_mol_m_s_Pa<double>));
    CHECK(b.activation_energy_J_mol == 12000.0);
    CHECK(b.permeability_temperature_K == m.reference_temperature_K);  // "at the reference temperature"
    CHECK(b.membrane_diffusivity_m2_s == 1e-9);
}

TEST_CASE("sensor file: errors carry the file, line and column of the key") {
    std::string text = minimal;
    text.replace(text.find("length = \"1.2 mm\""), 17, "length = \"1.2 psi\"");
    CHECK(first_line(text).rfind("test.toml:19:10: error: 'barrier[1].length'", 0) == 0);

    std::string missing = minimal;
    missing.erase(missing.find("electrons = 2\n"), 14);
    CHECK(first_line(missing).rfind("test.toml:1:1: error: missing required key 'electrons' in [sensor]", 0) == 0);

    CHECK(first_line("[sensor\n").rfind("test.toml:1:", 0) == 0);
    CHECK(first_line("[sensor\n").find("TOML syntax error") != std::string::npos);
}

TEST_CASE("sensor file: every problem is reported, in file order") {
    std::string text = minimal;
    text.replace(text.find("electrons = 2"), 13, "electrons = 0");
    text.replace(text.find("\"1.2 mm\""), 8, "\"-1 mm\"");
    text.replace(text.find("symbol = \"cell\""), 15, "symbol = \"9cell\"");
    const auto d = problems(text);
    REQUIRE(d.size() == 3);
    CHECK(d[0].place.line == 2);
    CHECK(d[1].place.line == 5);
    CHECK(d[2].place.line == 19);
}

TEST_CASE("sensor file: did you mean") {
    std::string text = minimal;
    text.replace(text.find("diameter"), 8, "diametre");
    const std::string line = first_line(text);
    CHECK(line.find("unknown key 'diametre'") != std::string::npos);
    CHECK(line.find("did you mean 'diameter'?") != std::string::npos);
    CHECK(problems(text).size() == 1);  // no second "missing 'diameter'" for the same slip

    CHECK(counterflux::tool::edit_distance("length", "lenght") == 1);
    CHECK(counterflux::tool::edit_distance("", "abc") == 3);
    CHECK(counterflux::tool::edit_distance("porosity", "porosity") == 0);
    CHECK(counterflux::tool::closest_match("tortuosty", {"porosity", "tortuosity"}) == std::string("tortuosity"));
    CHECK_FALSE(counterflux::tool::closest_match("colour", {"symbol", "target", "electrons"}).has_value());
}

TEST_CASE("sensor file: at most max_elements barriers") {
    std::string text = minimal;
    for (std::size_t i = 0; i < counterflux::tool::max_elements; ++i)
        text += "\n[[barrier]]\ntype = \"capillary\"\ndiameter = \"0.15 mm\"\nlength = \"1.2 mm\"\n";
    CHECK(first_line(text).find("too many [[barrier]]") != std::string::npos);
}

TEST_CASE("sensor file: a file that cannot be opened") {
    try {
        (void)read_sensor_file("/nonexistent/dir/x.toml");
        FAIL("no error");
    } catch (const input_error& e) {
        CHECK(counterflux::tool::format_diagnostic(e.diagnostics().front()).rfind("/nonexistent/dir/x.toml: error: ", 0) ==
              0);
    }
}

namespace {

// A fresh scratch directory for one test case, removed afterwards.
struct scratch_dir {
    std::filesystem::path dir;
    explicit scratch_dir(const std::string& name) {
        dir = std::filesystem::temp_directory_path() /
              ("counterflux_sensor_file_" + name + "_" + std::to_string(::getpid()));
        std::filesystem::remove_all(dir);
        std::filesystem::create_directories(dir);
    }
    ~scratch_dir() {
        std::error_code ec;
        std::filesystem::remove_all(dir, ec);
    }
};

// The first diagnostic of reading path, formatted; empty when it reads.
std::string read_error(const std::filesystem::path& path) {
    try {
        (void)read_sensor_file(path);
    } catch (const input_error& e) {
        return counterflux::tool::format_diagnostic(e.diagnostics().front());
    }
    return {};
}

}  // namespace

TEST_CASE("sensor file: a FIFO is refused without being opened") {
    scratch_dir s("fifo");
    const auto fifo = s.dir / "sensor.toml";
    REQUIRE(::mkfifo(fifo.c_str(), 0600) == 0);
    // Opening a FIFO for reading would block until a writer comes: the test
    // finishing at all shows that the reader never opened it.
    const std::string e = read_error(fifo);
    CHECK(e.rfind(fifo.string() + ": error: is a FIFO, expected a sensor file", 0) == 0);
    std::filesystem::create_symlink("sensor.toml", s.dir / "link.toml");
    CHECK(read_error(s.dir / "link.toml").find("is a FIFO") != std::string::npos);
}

TEST_CASE("sensor file: at most 1 MiB is read") {
    scratch_dir s("size");
    const auto big = s.dir / "big.toml";
    {
        std::ofstream out(big, std::ios::binary);
        out << minimal;
        out << std::string(counterflux::tool::max_sensor_file_bytes, '#') << "\n";  // a long comment
    }
    CHECK(read_error(big).rfind(big.string() + ": error: is larger than 1024 KiB (1 MiB)", 0) == 0);

    // Exactly at the cap is still read: padding with a comment line.
    const auto edge = s.dir / "edge.toml";
    {
        std::string text = minimal + "#";
        text += std::string(counterflux::tool::max_sensor_file_bytes - text.size() - 1, 'x') + "\n";
        REQUIRE(text.size() == counterflux::tool::max_sensor_file_bytes);
        std::ofstream out(edge, std::ios::binary);
        out << text;
    }
    CHECK(read_error(edge).empty());
}

TEST_CASE("sensor file: a symbolic link to a regular file is read; a directory is refused") {
    scratch_dir s("link");
    {
        std::ofstream out(s.dir / "real.toml", std::ios::binary);
        out << minimal;
    }
    std::filesystem::create_symlink("real.toml", s.dir / "link.toml");
    CHECK(read_sensor_file(s.dir / "link.toml").symbol == "cell");
    CHECK(read_error(s.dir).find("is a directory") != std::string::npos);
}

TEST_CASE("sensor file: implausible values are refused at their key, with the range") {
    const auto replaced = [](const std::string& from, const std::string& to) {
        std::string text = minimal;
        REQUIRE(text.find(from) != std::string::npos);
        text.replace(text.find(from), from.size(), to);
        return first_line(text);
    };
    CHECK(replaced("\"0.15 mm\"", "\"1e300 m\"") ==
          "test.toml:18:12: error: 'barrier[1].diameter' = \"1e300 m\" is out of range; expected a length from 1 nm "
          "to 1 m");
    CHECK(replaced("\"0.15 mm\"", "\"1e-300 m\"").find("'barrier[1].diameter'") != std::string::npos);
    CHECK(replaced("\"1.2 mm\"", "1e308").find("test.toml:19:10: error: 'barrier[1].length' = 1e+308 is out of range") ==
          0);
    CHECK(replaced("\"1.2 mm\"", "\"1 nm\"").empty());   // the edges are accepted
    CHECK(replaced("\"1.2 mm\"", "\"1 m\"").empty());
    CHECK(replaced("\"20 C\"", "\"1e6 K\"").find("'reference.temperature' = \"1e6 K\" is out of range; expected a "
                                                  "temperature from 100 K to 1000 K") != std::string::npos);
    CHECK(replaced("\"20 C\"", "\"99 K\"").find("'reference.temperature'") != std::string::npos);
    CHECK(replaced("\"20 C\"", "\"100 K\"").empty());
    CHECK(replaced("\"101.325 kPa\"", "\"1e300 Pa\"").find("expected a pressure from 100 Pa to 10000 kPa") !=
          std::string::npos);
    CHECK(replaced("\"101.325 kPa\"", "\"10 MPa\"").find("unknown unit") != std::string::npos);  // MPa is not a unit
    CHECK(replaced("\"101.325 kPa\"", "1e7").empty());
    CHECK(replaced("\"equimolar\"", "\"1e999\"") ==
          "test.toml:6:14: error: 'sensor.flux_ratio' = \"1e999\" is out of range; expected a value from -10 to 10");
}

TEST_CASE("sensor file: porosity from 1e-4 to 1, refused at the key") {
    const auto porous = [](const std::string& porosity) {
        return first_line(minimal + "\n[[barrier]]\ntype = \"porous\"\nthickness = \"1 mm\"\narea = \"10 mm2\"\n"
                                    "porosity = " + porosity + "\ntortuosity = 2\npore_diameter = \"1 um\"\n");
    };
    CHECK(porous("1e-4").empty());
    CHECK(porous("1").empty());
    CHECK(porous("0.35").empty());
    CHECK(porous("9.9e-5") ==
          "test.toml:25:12: error: 'barrier[2].porosity' = 9.9e-05 is out of range; expected a porosity from 1e-4 to 1");
    CHECK(porous("1.01").find("'barrier[2].porosity' = 1.01 is out of range") != std::string::npos);
    CHECK(porous("0").find("expected a porosity from 1e-4 to 1") != std::string::npos);
}

TEST_CASE("sensor file: membrane permeability and activation energy ranges") {
    const auto membrane = [](const std::string& permeability, const std::string& energy) {
        return first_line(minimal + "\n[[barrier]]\ntype = \"membrane\"\nthickness = \"25 um\"\narea = \"10 mm2\"\n"
                                    "permeability = \"" + permeability + "\"\nactivation_energy = \"" + energy + "\"\n");
    };
    CHECK(membrane("1000 Barrer", "12 kJ/mol").empty());
    CHECK(membrane("1e-3 mol/(m s Pa)", "12 kJ/mol").find("'barrier[2].permeability'") != std::string::npos);
    CHECK(membrane("0 Barrer", "12 kJ/mol").find("from 1e-6 Barrer") != std::string::npos);
    CHECK(membrane("1e-320 mol/(m s Pa)", "12 kJ/mol").find("'barrier[2].permeability'") != std::string::npos);
    CHECK(membrane("1e-6 Barrer", "12 kJ/mol").empty());
    CHECK(membrane("1000 Barrer", "499 kJ/mol").empty());
    CHECK(membrane("1000 Barrer", "-499 kJ/mol").empty());
    CHECK(membrane("1000 Barrer", "500 kJ/mol").find("magnitude below 500 kJ/mol") != std::string::npos);
    CHECK(membrane("1000 Barrer", "-600 kJ/mol").find("'barrier[2].activation_energy'") != std::string::npos);
}

TEST_CASE("sensor file: a model that fails at the reference condition is blamed on the part that fails") {
    // Chapman-Enskog outside its fit range: at diffusivity.method, with T*.
    std::string ce = minimal;
    ce.replace(ce.find("\"CO\""), 4, "\"H2O\"");
    ce.replace(ce.find("\"air\""), 5, "\"NH3\"");
    ce.replace(ce.find("\"20 C\""), 6, "\"150 K\"");
    ce.replace(ce.find("\"fuller\""), 8, "\"chapman-enskog\"");
    const std::string e = first_line(ce);
    CHECK(e.rfind("test.toml:14:10: error: the diffusivity of H2O in NH3 (chapman-enskog)", 0) == 0);
    CHECK(e.find("T* = T / sqrt(eps_H2O eps_NH3)") != std::string::npos);
    CHECK(e.find("Neufeld fit range 0.3 .. 100") != std::string::npos);

    // An element whose resistivity overflows: at its [[barrier]] header, with the
    // library's status text. A porosity that small is refused at its key now
    // (porosity_range); the element is made unresolvable after reading.
    const std::string porous = minimal + "\n[[barrier]]\ntype = \"porous\"\nthickness = \"1 mm\"\narea = \"10 mm2\"\n"
                                         "porosity = 0.4\ntortuosity = 2\npore_diameter = \"1 um\"\n";
    sensor_file tampered = parse_sensor_file(porous, "test.toml");
    REQUIRE(tampered.model.barriers.count == 2);
    tampered.model.barriers.elements[1].porosity = 1e-310;
    const auto blamed = counterflux::tool::diagnose_condition(tampered, 293.15, 101325.0, "the reference condition");
    REQUIRE(blamed.has_value());
    CHECK(counterflux::tool::format_diagnostic(*blamed) ==
          "test.toml:21:1: error: [[barrier]] #2 (porous) cannot be resolved at the reference condition: " +
              std::string(counterflux::describe(counterflux::status::not_finite)));
    // A permeability so small that 1/permeability overflows is refused at its key.
    const std::string membrane = minimal + "\n[[barrier]]\ntype = \"membrane\"\nthickness = \"25 um\"\n"
                                           "area = \"10 mm2\"\npermeability = \"1e-320 mol/(m s Pa)\"\n";
    CHECK(first_line(membrane).find("'barrier[2].permeability' = \"1e-320 mol/(m s Pa)\" is out of range") !=
          std::string::npos);
    // A porosity below 1e-4 is refused at the key, with the range.
    CHECK(first_line(minimal + "\n[[barrier]]\ntype = \"porous\"\nthickness = \"1 mm\"\narea = \"10 mm2\"\n"
                               "porosity = 1e-310\ntortuosity = 2\npore_diameter = \"1 um\"\n") ==
          "test.toml:25:12: error: 'barrier[2].porosity' = 1e-310 is out of range; expected a porosity from 1e-4 to 1");

    // diagnose_condition at another condition: nothing to blame for a good file.
    const sensor_file good = parse_sensor_file(minimal, "test.toml");
    CHECK_FALSE(counterflux::tool::diagnose_condition(good, 300.0, 1e5, "here").has_value());
}

TEST_CASE("sensor file: the singular log law is explained from the flux ratio and the outer element") {
    using counterflux::tool::singular_log_law;
    const auto with = [](const std::string& flux_ratio, const std::string& knudsen) {
        std::string text = minimal;
        text.replace(text.find("\"equimolar\""), 11, flux_ratio);
        text += knudsen;
        return parse_sensor_file(text, "test.toml");
    };
    // Equimolar (alpha = 0) and alpha < 0: never singular.
    CHECK_FALSE(singular_log_law(with("\"equimolar\"", "knudsen = false\n"), 1.0, "full_scale").has_value());
    CHECK_FALSE(singular_log_law(with("-3", "knudsen = false\n"), 1.0, "full_scale").has_value());
    // Stagnant: singular at 1 only, and only without a Knudsen term.
    const sensor_file stagnant = with("\"stagnant\"", "knudsen = false\n");
    CHECK_FALSE(singular_log_law(stagnant, 0.99, "full_scale").has_value());
    const auto s = singular_log_law(stagnant, 1.0, "full_scale");
    REQUIRE(s.has_value());
    CHECK(*s == "the stagnant-film log law has no finite current at 100 % (singular at y = 1/alpha = 1); lower "
                "full_scale below 100 % or give the barrier a Knudsen (knudsen = true) or membrane resistance");
    CHECK_FALSE(singular_log_law(with("\"stagnant\"", ""), 1.0, "full_scale").has_value());
    // flux_ratio = 10: singular at 1/11, named with the flux ratio.
    const auto ten = singular_log_law(with("10", "knudsen = false\n"), 0.5, "--concentration");
    REQUIRE(ten.has_value());
    CHECK(ten->rfind("with 'sensor.flux_ratio' = 10 (alpha = 1 + N_B/N_A = 11) the log law has no finite current at "
                     "50 % (singular at y = 1/alpha = 1/11 = 9.091 %); lower --concentration below 9.091 %, lower the "
                     "flux ratio",
                     0) == 0);
    CHECK_FALSE(singular_log_law(with("10", "knudsen = false\n"), 0.05, "full_scale").has_value());
    // With a Knudsen term the limit is lifted, maybe not far enough.
    const auto lifted = singular_log_law(with("10", ""), 1.0, "full_scale");
    REQUIRE(lifted.has_value());
    CHECK(lifted->find("lifts that limit, but not up to 100 %") != std::string::npos);
    // A membrane first never leaves the log law singular.
    const sensor_file membrane_first = parse_sensor_file(
        std::string(minimal).replace(minimal.find("type = \"capillary\""), 18,
                                     "type = \"membrane\"\nthickness = \"25 um\"\narea = \"10 mm2\"\n"
                                     "permeability = \"600 Barrer\"\n[[barrier]]\ntype = \"capillary\"") +
            "knudsen = false\n",
        "test.toml");
    REQUIRE(membrane_first.model.barriers.count == 2);
    CHECK_FALSE(singular_log_law(membrane_first, 1.0, "full_scale").has_value());
}

TEST_CASE("messages echo at most about 60 characters of a key or value") {
    using counterflux::tool::abbreviate;
    CHECK(abbreviate("diameter") == "diameter");
    CHECK(abbreviate(std::string(60, 'k')) == std::string(60, 'k'));
    CHECK(abbreviate(std::string(61, 'k')) == std::string(57, 'k') + "...");
    // Not in the middle of a UTF-8 sequence: 56 ASCII bytes, then a 2-byte character.
    const std::string utf8 = std::string(56, 'a') + "\xC3\xA9" + std::string(10, 'b');
    CHECK(abbreviate(utf8) == std::string(56, 'a') + "...");

    // A 1 MB unknown key: one short line, no "did you mean" (the edit-distance
    // table of so long a word is skipped).
    const std::string key(1000000, 'k');
    const auto p = problems(minimal + "\n" + key + " = 1\n");
    REQUIRE(p.size() == 1);
    const std::string line = counterflux::tool::format_diagnostic(p.front());
    CAPTURE(line.substr(0, 200));
    CHECK(line.size() < 300);
    CHECK(line.find("unknown key '" + std::string(57, 'k') + "...' in [[barrier]] #1; expected one of: ") !=
          std::string::npos);
    CHECK(line.find("did you mean") == std::string::npos);
    // A key of 64 characters still gets a suggestion when one is close; 65 do not.
    CHECK(counterflux::tool::closest_match(std::string(64, 'x'), {std::string(63, 'x')}).has_value());
    CHECK_FALSE(counterflux::tool::closest_match(std::string(65, 'x'), {std::string(64, 'x')}).has_value());

    // A long value, as a string and through the unit parser.
    std::string text = minimal;
    text.replace(text.find("\"CO\""), 4, "\"" + std::string(5000, 'Q') + "\"");
    const std::string gas = first_line(text);
    CHECK(gas.rfind("test.toml:3:10: error: unknown gas \"" + std::string(57, 'Q') + "...\" for 'sensor.target'", 0) ==
          0);
    CHECK(gas.size() < 400);
    text = minimal;
    text.replace(text.find("\"0.15 mm\""), 9, "\"0.15 " + std::string(5000, 'u') + "\"");
    const std::string unit = first_line(text);
    CHECK(unit.find("unknown unit '" + std::string(57, 'u') + "...'") != std::string::npos);
    CHECK(unit.size() < 400);
}

TEST_CASE("sensor file: gas formulas are case-sensitive, English names are not") {
    const auto with_target = [](const std::string& target) {
        std::string text = minimal;
        text.replace(text.find("\"CO\""), 4, "\"" + target + "\"");
        return text;
    };
    CHECK(parse_sensor_file(with_target("carbon monoxide"), "test.toml").model.target->formula == std::string("CO"));
    CHECK(parse_sensor_file(with_target("Carbon Monoxide"), "test.toml").model.target->formula == std::string("CO"));
    const std::string e = first_line(with_target("co"));
    CHECK(e.rfind("test.toml:3:10: error: unknown gas \"co\" for 'sensor.target'; did you mean 'CO'?", 0) == 0);
    CHECK(e.find("case-sensitive") != std::string::npos);
    CHECK(first_line(with_target("CH3OH")).find("did you mean") == std::string::npos);
}

TEST_CASE("docs/sensor-file.md lists exactly the gases of the library's table") {
    std::ifstream in(COUNTERFLUX_SOURCE_DIR "/docs/sensor-file.md");
    REQUIRE(in);
    std::ostringstream text;
    text << in.rdbuf();
    const std::string doc = text.str();
    const auto start = doc.find("holds exactly these gases");
    REQUIRE(start != std::string::npos);
    const auto end = doc.find("\n\n", doc.find("|---", start));
    const std::string table = doc.substr(start, end - start);
    // Every "| `F` | name |" cell pair of the table.
    std::set<std::string> listed;
    for (std::size_t at = table.find("| `"); at != std::string::npos; at = table.find("| `", at + 1)) {
        const auto close = table.find('`', at + 3);
        const std::string formula = table.substr(at + 3, close - at - 3);
        const auto name_begin = table.find("| ", close) + 2;
        const std::string name = table.substr(name_begin, table.find(" |", name_begin) - name_begin);
        const auto g = counterflux::find_gas(formula.c_str());
        CAPTURE(formula);
        REQUIRE(g.ok());
        CHECK(g.value->formula == formula);
        CHECK(g.value->name == name);
        listed.insert(formula);
    }
    CHECK(listed.size() == counterflux::gas_count);
}
