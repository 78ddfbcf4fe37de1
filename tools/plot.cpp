// tools/plot.cpp - SVG plots through PLplot's C API and its svg driver.
//
// PLplot keeps global state (a table of streams, the current stream), so each
// call creates its own stream (plmkstrm), draws, ends exactly that stream
// (plend1) and restores the stream that was current before: calls are
// independent and may be repeated. PLplot's own fatal errors end the process
// (plexit), so everything that could make it fail is checked here first: the
// data, and the output file, which is a private temporary file this code has
// already created (the svg driver only reopens it). PLplot's non-fatal
// complaints (plabort) are caught and turned into run_error.
#include "plot.hpp"

#include <algorithm>
#include <cmath>
#include <cstdio>
#include <cstdlib>
#include <fstream>
#include <iterator>
#include <limits>
#include <mutex>
#include <sstream>
#include <string>
#include <system_error>
#include <vector>

#include <unistd.h>

#include <plplot.h>

#include "atomic_write.hpp"
#include "errors.hpp"

namespace counterflux::tool {

namespace {

// PLplot's text escape character is '#': show it literally.
std::string plain(const std::string& text) {
    std::string out;
    out.reserve(text.size());
    for (char c : text) {
        out += c;
        if (c == '#') out += '#';
    }
    return out;
}

// The messages of plabort during one plot (one plot at a time, under the mutex).
std::string& abort_messages() {
    static std::string messages;
    return messages;
}

void record_abort(PLCHAR_VECTOR message) {
    if (!abort_messages().empty()) abort_messages() += "; ";
    abort_messages() += message != nullptr ? message : "unknown PLplot error";
}

// The svg driver writes every character of a text as a numeric character
// reference (&#x4f;): printable ASCII is written as itself (except the five
// characters XML escapes), so that the labels can be read and searched in the
// file. Other references are kept.
std::string readable_text(const std::string& svg) {
    std::string out;
    out.reserve(svg.size());
    std::size_t i = 0;
    while (i < svg.size()) {
        if (svg.compare(i, 3, "&#x") == 0) {
            const std::size_t end = svg.find(';', i + 3);
            if (end != std::string::npos && end - i - 3 >= 1 && end - i - 3 <= 6) {
                const std::string hex = svg.substr(i + 3, end - i - 3);
                if (hex.find_first_not_of("0123456789abcdefABCDEF") == std::string::npos) {
                    const unsigned long code = std::strtoul(hex.c_str(), nullptr, 16);
                    const std::string escaped = "&<>\"'";
                    if (code >= 0x20 && code < 0x7f && escaped.find(static_cast<char>(code)) == std::string::npos) {
                        out += static_cast<char>(code);
                        i = end + 1;
                        continue;
                    }
                }
            }
        }
        out += svg[i];
        ++i;
    }
    return out;
}

struct range {
    double lo = std::numeric_limits<double>::infinity();
    double hi = -std::numeric_limits<double>::infinity();
    void add(double v) {
        lo = std::min(lo, v);
        hi = std::max(hi, v);
    }
    bool empty() const { return !(lo <= hi); }
    // Widened so that a flat curve still gets an axis, and a margin on y.
    void widen(double margin) {
        if (hi - lo <= 1e-300 + 1e-12 * std::max(std::fabs(lo), std::fabs(hi))) {
            const double pad = lo == 0.0 ? 1.0 : 0.05 * std::fabs(lo);
            lo -= pad;
            hi += pad;
        }
        const double span = hi - lo;
        lo -= margin * span;
        hi += margin * span;
    }
};

// A panel's points as PLplot draws them (log10 of y on a log axis).
struct prepared_panel {
    std::vector<std::vector<double>> x, y;
    range xr, yr;
};

prepared_panel prepare(const plot_panel& p, std::size_t index) {
    prepared_panel out;
    const std::string where = "plot panel " + std::to_string(index + 1) + " ('" + p.title + "')";
    for (const plot_series& s : p.series) {
        if (s.x.size() != s.y.size())
            throw run_error(where + ": series '" + s.label + "' has " + std::to_string(s.x.size()) + " x and " +
                            std::to_string(s.y.size()) + " y values");
        std::vector<double> xs, ys;
        for (std::size_t i = 0; i < s.x.size(); ++i) {
            if (!std::isfinite(s.x[i]) || !std::isfinite(s.y[i]))
                throw run_error(where + ": series '" + s.label + "' has a non-finite point");
            if (p.log_y && !(s.y[i] > 0.0)) continue;
            xs.push_back(s.x[i]);
            ys.push_back(p.log_y ? std::log10(s.y[i]) : s.y[i]);
            out.xr.add(xs.back());
            out.yr.add(ys.back());
        }
        out.x.push_back(std::move(xs));
        out.y.push_back(std::move(ys));
    }
    for (const plot_marker& m : p.markers) {
        if (!std::isfinite(m.x)) throw run_error(where + ": marker '" + m.label + "' is not finite");
        out.xr.add(m.x);
    }
    if (out.xr.empty() || out.yr.empty()) throw run_error(where + ": nothing to plot");
    out.xr.widen(0.0);
    out.yr.widen(0.05);
    return out;
}

// A private temporary file for the svg driver to write into; removed on destruction.
struct temporary_file {
    std::string path;
    temporary_file() {
        std::error_code ec;
        std::filesystem::path dir = std::filesystem::temp_directory_path(ec);
        if (ec) dir = "/tmp";
        std::string name = (dir / "counterflux-plot-XXXXXX").string();
        std::vector<char> buffer(name.begin(), name.end());
        buffer.push_back('\0');
        const int fd = ::mkstemp(buffer.data());
        if (fd < 0) throw run_error("cannot create a temporary file for the plot in " + dir.string());
        ::close(fd);
        path = buffer.data();
    }
    ~temporary_file() {
        std::error_code ec;
        std::filesystem::remove(path, ec);
    }
    temporary_file(const temporary_file&) = delete;
    temporary_file& operator=(const temporary_file&) = delete;
};

// Colours of map 0: 0 background, 1 axes and text, 2.. the series, then markers.
constexpr int series_colours[][3] = {{0, 90, 181},  {220, 50, 32},  {0, 140, 70},
                                     {150, 80, 190}, {230, 140, 0}, {90, 90, 90}};
constexpr int colour_count = static_cast<int>(sizeof(series_colours) / sizeof(series_colours[0]));
constexpr int marker_colour = 2 + colour_count;

void draw_panel(const plot_panel& p, const prepared_panel& d, const std::string& title, bool first) {
    pladv(0);
    plvsta();
    plwind(d.xr.lo, d.xr.hi, d.yr.lo, d.yr.hi);
    plcol0(1);
    plschr(0.0, 0.9);
    plbox("bcnst", 0.0, 0, p.log_y ? "bcnstvl" : "bcnstv", 0.0, 0);
    pllab(plain(p.x_label).c_str(), plain(p.y_label).c_str(), plain(p.title).c_str());
    if (first && !title.empty()) {
        plschr(0.0, 1.1);
        plmtex("t", 3.6, 0.5, 0.5, plain(title).c_str());
        plschr(0.0, 0.9);
    }
    for (std::size_t i = 0; i < d.x.size(); ++i) {
        if (d.x[i].empty()) continue;
        plcol0(2 + static_cast<PLINT>(i % colour_count));
        plwidth(2.0);
        plline(static_cast<PLINT>(d.x[i].size()), d.x[i].data(), d.y[i].data());
    }
    // The legend goes in the right-hand corner away from the curves: the
    // bottom when they end high (a rise), the top when they end low (a fall);
    // the marker labels in the other half.
    double sum = 0.0;
    std::size_t count = 0;
    const double x_right = d.xr.lo + 0.6 * (d.xr.hi - d.xr.lo);
    for (std::size_t i = 0; i < d.x.size(); ++i)
        for (std::size_t k = 0; k < d.x[i].size(); ++k)
            if (d.x[i][k] >= x_right) {
                sum += d.y[i][k];
                ++count;
            }
    const bool high = count == 0 || sum / static_cast<double>(count) > 0.5 * (d.yr.lo + d.yr.hi);
    plwidth(1.0);
    for (std::size_t i = 0; i < p.markers.size(); ++i) {
        const plot_marker& m = p.markers[i];
        const PLFLT xs[2] = {m.x, m.x};
        const PLFLT ys[2] = {d.yr.lo, d.yr.hi};
        plcol0(marker_colour);
        pllsty(2);
        plline(2, xs, ys);
        pllsty(1);
        // Labels stagger so that close markers stay legible.
        const double step = 0.07 * static_cast<double>(i % 4);
        const double y = high ? d.yr.hi - (0.08 + step) * (d.yr.hi - d.yr.lo)
                              : d.yr.lo + (0.30 - step) * (d.yr.hi - d.yr.lo);
        plptex(m.x, y, 1.0, 0.0, -0.05, plain(m.label).c_str());
    }
    // Legend of the labelled series, in the corner chosen above.
    std::vector<std::string> texts;
    std::vector<PLINT> opts, text_colours, line_colours, line_styles;
    std::vector<PLFLT> line_widths;
    for (std::size_t i = 0; i < p.series.size(); ++i) {
        if (p.series[i].label.empty()) continue;
        texts.push_back(plain(p.series[i].label));
        opts.push_back(PL_LEGEND_LINE);
        text_colours.push_back(1);
        line_colours.push_back(2 + static_cast<PLINT>(i % colour_count));
        line_styles.push_back(1);
        line_widths.push_back(2.0);
    }
    if (texts.empty()) return;
    std::vector<const char*> text_ptrs;
    for (const auto& t : texts) text_ptrs.push_back(t.c_str());
    const PLINT n = static_cast<PLINT>(texts.size());
    PLFLT width = 0.0, height = 0.0;
    plcol0(1);
    pllegend(&width, &height, PL_LEGEND_BACKGROUND | PL_LEGEND_BOUNDING_BOX,
             PL_POSITION_RIGHT | (high ? PL_POSITION_BOTTOM : PL_POSITION_TOP),
             0.02, 0.04, 0.08, 0, 1, 1, 0, 0, n, opts.data(), 1.0, 0.8, 2.0, 0.0, text_colours.data(),
             text_ptrs.data(), nullptr, nullptr, nullptr, nullptr, line_colours.data(), line_styles.data(),
             line_widths.data(), nullptr, nullptr, nullptr, nullptr);
}

std::string render(const std::string& title, const std::vector<plot_panel>& panels) {
    if (panels.empty()) throw run_error("a plot needs at least one panel");
    std::vector<prepared_panel> data;
    for (std::size_t i = 0; i < panels.size(); ++i) data.push_back(prepare(panels[i], i));

    static std::mutex plplot_mutex;  // PLplot's stream table is global
    const std::lock_guard<std::mutex> lock(plplot_mutex);
    // Without its svg driver PLplot would ask on standard input for another
    // device and then end the process: look for the driver first.
    {
        constexpr int capacity = 128;
        const char* menus[capacity] = {};
        const char* names[capacity] = {};
        const char** menu_list = menus;
        const char** name_list = names;
        int count = capacity;
        plgDevs(&menu_list, &name_list, &count);
        bool found = false;
        for (int i = 0; i < count && i < capacity; ++i)
            found = found || (names[i] != nullptr && std::string(names[i]) == "svg");
        if (!found)
            throw run_error("PLplot has no svg driver (Debian: install the PLplot drivers package with svg.so)");
    }
    temporary_file file;
    abort_messages().clear();

    PLINT previous = 0;
    plgstrm(&previous);
    PLINT stream = 0;
    plmkstrm(&stream);
    if (stream < 0) throw run_error("PLplot: cannot create a plot stream");
    plsabort(record_abort);
    plsdev("svg");
    plsfnam(file.path.c_str());
    const PLINT height = static_cast<PLINT>(340 * panels.size() + 40);
    plspage(90.0, 90.0, 900, height, 0, 0);
    plscol0(0, 255, 255, 255);
    plscol0(1, 0, 0, 0);
    plscmap0n(marker_colour + 1);
    plscol0(0, 255, 255, 255);
    plscol0(1, 0, 0, 0);
    for (int i = 0; i < colour_count; ++i)
        plscol0(2 + i, series_colours[i][0], series_colours[i][1], series_colours[i][2]);
    plscol0(marker_colour, 60, 60, 60);
    plssub(1, static_cast<PLINT>(panels.size()));
    plinit();
    for (std::size_t i = 0; i < panels.size(); ++i) draw_panel(panels[i], data[i], title, i == 0);
    plend1();
    plsstrm(previous);
    plsabort(nullptr);

    if (!abort_messages().empty()) throw run_error("PLplot could not draw the plot: " + abort_messages());
    std::ifstream in(file.path, std::ios::binary);
    std::string bytes((std::istreambuf_iterator<char>(in)), std::istreambuf_iterator<char>());
    if (!in.good() && !in.eof()) throw run_error("cannot read back the rendered plot " + file.path);
    if (bytes.find("<svg") == std::string::npos) throw run_error("PLplot did not write an SVG plot");
    return readable_text(bytes);
}

}  // namespace

void write_svg_plot(const std::filesystem::path& path, const std::string& title,
                    const std::vector<plot_panel>& panels) {
    const std::string bytes = render(title, panels);
    atomic_write(path, bytes);
}

}  // namespace counterflux::tool
