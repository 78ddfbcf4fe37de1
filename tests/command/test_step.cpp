// The SVG plot module (tools/plot.hpp) and the `step` verb end to end.
#include <doctest/doctest.h>

#include <cmath>
#include <filesystem>
#include <fstream>
#include <iterator>
#include <string>
#include <vector>

#include "atomic_write.hpp"
#include "errors.hpp"
#include "plot.hpp"

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
