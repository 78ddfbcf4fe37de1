// `counterflux inspect`: records written here with the library's write_record
// are validated and printed by the built binary; a damaged or truncated record
// exits 3 naming the file and the fault; a missing file, a directory and an
// oversized file exit 2.
#include <doctest/doctest.h>

#include <array>
#include <cstdint>
#include <cstdio>
#include <filesystem>
#include <fstream>
#include <iterator>
#include <sstream>
#include <string>
#include <vector>

#include <unistd.h>

#include <nlohmann/json.hpp>

#include <counterflux/record.hpp>

#include "command_runner.hpp"

namespace cf = counterflux;
namespace fs = std::filesystem;
using counterflux_command_test::command;
using counterflux_command_test::shell_quote;

namespace {

const fs::path work = fs::temp_directory_path() / "counterflux-inspect-test";

struct full_run {
    int status;
    std::string out;
    std::string err;
};

std::string slurp(const fs::path& p) {
    std::ifstream in(p, std::ios::binary);
    return std::string(std::istreambuf_iterator<char>(in), std::istreambuf_iterator<char>());
}

// Runs the command with args, capturing standard output and standard error
// (through a file named after this process: CTest runs the cases in parallel).
full_run run_full(const std::vector<std::string>& args) {
    fs::create_directories(work);
    const fs::path err = work / ("stderr-" + std::to_string(::getpid()) + ".txt");
    std::string line = shell_quote(command);
    for (const auto& a : args) line += " " + shell_quote(a);
    line += " 2>" + shell_quote(err.string());
    FILE* pipe = ::popen(line.c_str(), "r");
    REQUIRE(pipe != nullptr);
    std::string out;
    std::array<char, 4096> buffer{};
    std::size_t n = 0;
    while ((n = std::fread(buffer.data(), 1, buffer.size(), pipe)) > 0) out.append(buffer.data(), n);
    const int raw = ::pclose(pipe);
    full_run r{WIFEXITED(raw) ? WEXITSTATUS(raw) : -1, out, slurp(err)};
    fs::remove(err);
    return r;
}

void save(const fs::path& p, const std::vector<std::uint8_t>& bytes) {
    fs::create_directories(p.parent_path());
    std::ofstream f(p, std::ios::binary | std::ios::trunc);
    f.write(reinterpret_cast<const char*>(bytes.data()), static_cast<std::streamsize>(bytes.size()));
    REQUIRE(f.good());
}

// An invented linear float32 design table, 3 temperatures x 2 pressures (the
// worked example of docs/record-format.md is this record).
const std::array<float, 6> correction = {1.0f, 1.25f, 0.875f, 1.0f, 0.75f, 0.8125f};
const std::array<float, 3> zero_A = {1.0e-9f, 2.0e-9f, 4.0e-9f};
const std::array<std::int16_t, 6> q_correction = {-32768, -100, 0, 1, 16384, 32767};
const std::array<std::int16_t, 3> q_zero = {0, 1000, 2000};
const std::array<std::int16_t, 6> q_curvature = {10, 20, 30, 40, 50, 60};
const std::array<std::int16_t, 4> q_shape = {32767, 30000, 25000, 20000};

cf::record_contents example_contents() {
    cf::record_contents c{};
    c.symbol = "demo_cell";
    c.unit_id = "";
    c.values = cf::record_values::float32;
    c.report = cf::record_report::mole_fraction;
    c.reference_temperature_K = 293.15f;
    c.reference_pressure_Pa = 101325.0f;
    c.gain = 2000.0f;
    c.full_scale = 1.0e-3f;
    c.source_hash = 0xCBF43926u;
    c.temperature = cf::record_axis{253.15f, 35.0f, 3};
    c.pressure = cf::record_axis{70000.0f, 40000.0f, 2};
    c.shape = cf::record_axis{0.0f, 0.0f, 0};
    c.data_f32[0] = correction.data();
    c.data_f32[1] = zero_A.data();
    return c;
}

cf::record_contents q15_contents() {
    cf::record_contents c = example_contents();
    c.symbol = "unit_cell";
    c.unit_id = "SN 0042";
    c.values = cf::record_values::q15;
    c.report = cf::record_report::partial_pressure;
    c.gain = 2.0e8f;
    c.full_scale = 100.0f;
    c.shape = cf::record_axis{0.0f, 0.5f, 4};
    c.scales[0] = cf::record_scale{0.5f, 1.0f};
    c.scales[1] = cf::record_scale{8.0e-9f, 0.0f};
    c.scales[2] = cf::record_scale{0.001f, 0.0f};
    c.scales[3] = cf::record_scale{1.0f, 0.0f};
    c.data_q15[0] = q_correction.data();
    c.data_q15[1] = q_zero.data();
    c.data_q15[2] = q_curvature.data();
    c.data_q15[3] = q_shape.data();
    return c;
}

std::vector<std::uint8_t> bytes_of(const cf::record_contents& c) {
    std::vector<std::uint8_t> b(cf::record_size(c));
    std::size_t written = 0;
    REQUIRE(cf::write_record(c, b.data(), b.size(), written) == cf::record_fault::none);
    REQUIRE(written == b.size());
    return b;
}

// The CRC-32 trailer, read by hand (little-endian, the last four bytes).
std::uint32_t trailer(const std::vector<std::uint8_t>& b) {
    const std::size_t n = b.size();
    return std::uint32_t(b[n - 4]) | std::uint32_t(b[n - 3]) << 8 | std::uint32_t(b[n - 2]) << 16 |
           std::uint32_t(b[n - 1]) << 24;
}

}  // namespace

TEST_CASE("inspect: a valid float32 record, as text and as JSON") {
    const std::vector<std::uint8_t> bytes = bytes_of(example_contents());
    const fs::path file = work / "example.bin";
    save(file, bytes);

    const full_run text = run_full({"inspect", file.string()});
    CHECK(text.status == 0);
    CHECK(text.err.empty());
    CHECK(text.out.find(file.string() + ": valid calibration record") != std::string::npos);
    CHECK(text.out.find("demo_cell") != std::string::npos);
    CHECK(text.out.find("none (a design table)") != std::string::npos);
    CHECK(text.out.find("3 x 2 = 6 values") != std::string::npos);
    char crc_text[16];
    std::snprintf(crc_text, sizeof crc_text, "0x%08X", static_cast<unsigned>(trailer(bytes)));
    CHECK(text.out.find(crc_text) != std::string::npos);

    const full_run r = run_full({"inspect", file.string(), "--json"});
    REQUIRE(r.status == 0);
    const nlohmann::json j = nlohmann::json::parse(r.out);
    CHECK(j.at("valid") == true);
    CHECK(j.at("symbol") == "demo_cell");
    CHECK(j.at("unit_id") == "");
    CHECK(j.at("values") == "float32");
    CHECK(j.at("report") == "mole_fraction");
    CHECK(j.at("crc32").is_number_unsigned());
    CHECK(j.at("crc32").get<std::uint32_t>() == trailer(bytes));
    CHECK(j.at("size_bytes") == bytes.size());
    CHECK(j.at("source_hash") == 0xCBF43926u);
    CHECK(j.at("linear") == true);
    // Every float32 converts exactly to double, so the numbers are the ones written.
    CHECK(j.at("reference_temperature_K").get<double>() == double(293.15f));
    CHECK(j.at("gain_per_A").get<double>() == 2000.0);
    const nlohmann::json& axes = j.at("axes");
    REQUIRE(axes.size() == 2);
    CHECK(axes[0].at("name") == "temperature");
    CHECK(axes[0].at("unit") == "K");
    CHECK(axes[0].at("from").get<double>() == double(253.15f));
    CHECK(axes[0].at("step").get<double>() == 35.0);
    CHECK(axes[0].at("count") == 3);
    CHECK(axes[1].at("name") == "pressure");
    CHECK(axes[1].at("unit") == "Pa");
    CHECK(axes[1].at("from").get<double>() == 70000.0);
    CHECK(axes[1].at("count") == 2);
    const nlohmann::json& tables = j.at("tables");
    REQUIRE(tables.size() == 2);
    CHECK(tables[0].at("name") == "correction");
    CHECK(tables[1].at("name") == "zero");
    CHECK(tables[1].at("unit") == "A");
    for (std::size_t i = 0; i < correction.size(); ++i)
        CHECK(tables[0].at("values")[i].get<double>() == double(correction[i]));
    for (std::size_t i = 0; i < zero_A.size(); ++i) CHECK(tables[1].at("values")[i].get<double>() == double(zero_A[i]));
    CHECK(tables[0].at("min").get<double>() == 0.75);
    CHECK(tables[0].at("max").get<double>() == 1.25);
}

TEST_CASE("inspect: a q15 record with a curved law") {
    const std::vector<std::uint8_t> bytes = bytes_of(q15_contents());
    const fs::path file = work / "q15.bin";
    save(file, bytes);
    const full_run r = run_full({"inspect", "--json", file.string()});
    REQUIRE(r.status == 0);
    const nlohmann::json j = nlohmann::json::parse(r.out);
    CHECK(j.at("values") == "q15");
    CHECK(j.at("unit_id") == "SN 0042");
    CHECK(j.at("report") == "partial_pressure");
    CHECK(j.at("linear") == false);
    REQUIRE(j.at("axes").size() == 3);
    CHECK(j.at("axes")[2].at("name") == "shape");
    CHECK(j.at("axes")[2].at("count") == 4);
    const nlohmann::json& tables = j.at("tables");
    REQUIRE(tables.size() == 4);
    CHECK(tables[2].at("unit") == "1/Pa");
    for (std::size_t i = 0; i < q_correction.size(); ++i) CHECK(tables[0].at("raw_q15")[i] == q_correction[i]);
    for (std::size_t i = 0; i < q_shape.size(); ++i) CHECK(tables[3].at("raw_q15")[i] == q_shape[i]);
    // value = offset + scale * q / 32768: correction q = -32768 -> 1 - 0.5 = 0.5 exactly.
    CHECK(tables[0].at("values")[0].get<double>() == 0.5);
    CHECK(tables[0].at("scale").get<double>() == 0.5);
    const full_run text = run_full({"inspect", file.string()});
    CHECK(text.status == 0);
    CHECK(text.out.find("SN 0042") != std::string::npos);
    CHECK(text.out.find("q15") != std::string::npos);
}

TEST_CASE("inspect: a damaged record exits 3 naming the file and the fault") {
    std::vector<std::uint8_t> bytes = bytes_of(example_contents());
    bytes[170] = static_cast<std::uint8_t>(bytes[170] ^ 0x10u);  // one bit of a table value
    const fs::path file = work / "damaged.bin";
    save(file, bytes);
    const full_run r = run_full({"inspect", file.string()});
    CHECK(r.status == 3);
    CHECK(r.err == file.string() + ": error: invalid calibration record: " +
                       cf::describe(cf::record_fault::crc_mismatch) + "\n");
    CHECK(r.out.empty());

    const full_run j = run_full({"inspect", file.string(), "--json"});
    CHECK(j.status == 3);
    const nlohmann::json doc = nlohmann::json::parse(j.out);
    CHECK(doc.at("valid") == false);
    CHECK(doc.at("fault") == "crc_mismatch");
    CHECK(j.err.find(file.string() + ": error: invalid calibration record") == 0);
}

TEST_CASE("inspect: truncated, wrong magic, trailing bytes and an empty file exit 3") {
    const std::vector<std::uint8_t> good = bytes_of(example_contents());
    struct variant {
        const char* name;
        std::vector<std::uint8_t> bytes;
        const char* fault;
    };
    std::vector<std::uint8_t> magic = good;
    magic[0] = 'X';
    std::vector<std::uint8_t> longer = good;
    longer.push_back(0);
    const std::vector<variant> variants = {
        {"truncated.bin", std::vector<std::uint8_t>(good.begin(), good.end() - 1), "truncated"},
        {"magic.bin", magic, "wrong_magic"},
        {"longer.bin", longer, "size_mismatch"},
        {"empty.bin", {}, "truncated"},
    };
    for (const variant& v : variants) {
        INFO(v.name);
        const fs::path file = work / v.name;
        save(file, v.bytes);
        const full_run r = run_full({"inspect", "--json", file.string()});
        CHECK(r.status == 3);
        CHECK(nlohmann::json::parse(r.out).at("fault") == v.fault);
        CHECK(r.err.find(file.string() + ": error: invalid calibration record: ") == 0);
    }
}

TEST_CASE("inspect: a missing file, a directory and an oversized file exit 2") {
    fs::create_directories(work / "a_directory.bin");
    const fs::path missing = work / "no_such_record.bin";
    fs::remove(missing);
    const full_run m = run_full({"inspect", missing.string()});
    CHECK(m.status == 2);
    CHECK(m.err.find(missing.string() + ": error: cannot open the calibration record") == 0);

    const full_run d = run_full({"inspect", (work / "a_directory.bin").string()});
    CHECK(d.status == 2);
    CHECK(d.err.find((work / "a_directory.bin").string() + ": error: is a directory") == 0);

    const fs::path big = work / "big.bin";
    save(big, std::vector<std::uint8_t>(cf::record_max_size + 1, 0));
    const full_run b = run_full({"inspect", big.string()});
    CHECK(b.status == 2);
    CHECK(b.err.find(big.string() + ": error: is larger than") == 0);
    fs::remove(big);

    const full_run none = run_full({"inspect"});
    CHECK(none.status == 2);
}

TEST_CASE("inspect: the record `table` writes for the bundled example is valid and agrees with it") {
    const fs::path out = work / "table_garage_co";
    fs::remove_all(out);
    const full_run t = run_full({"table", COUNTERFLUX_SOURCE_DIR "/examples/garage_co.toml", "--out", out.string(),
                                 "--json"});
    REQUIRE(t.status == 0);
    const nlohmann::json table = nlohmann::json::parse(t.out);
    const fs::path bin = out / "garage_co.bin";
    REQUIRE(fs::is_regular_file(bin));
    const std::string raw = slurp(bin);
    const std::vector<std::uint8_t> bytes(raw.begin(), raw.end());

    const full_run r = run_full({"inspect", "--json", bin.string()});
    REQUIRE(r.status == 0);
    const nlohmann::json j = nlohmann::json::parse(r.out);
    CHECK(j.at("valid") == true);
    CHECK(j.at("symbol") == "garage_co");
    CHECK(j.at("crc32").get<std::uint32_t>() == trailer(bytes));
    CHECK(j.at("size_bytes") == bytes.size());
    CHECK(j.at("linear") == table.at("linear"));
    // The axes as the table verb reports them (in double) and as the record
    // stores them (binary32): the same counts, nodes equal to float precision.
    REQUIRE(j.at("axes").size() == table.at("axes").size());
    for (std::size_t k = 0; k < j.at("axes").size(); ++k) {
        const nlohmann::json& a = j.at("axes")[k];
        const nlohmann::json& b = table.at("axes")[k];
        CHECK(a.at("name") == b.at("name"));
        CHECK(a.at("count") == b.at("count"));
        CHECK(a.at("unit") == b.at("unit"));
        const double from = b.at("from").get<double>();
        CHECK(a.at("from").get<double>() == double(static_cast<float>(from)));
    }
}
