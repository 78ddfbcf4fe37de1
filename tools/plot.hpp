// tools/plot.hpp - the one SVG plotter of the command (PLplot's svg driver).
//
// A plot is one or more panels stacked vertically, each with its own axes,
// curves (series), legend and labelled vertical markers (a t90, a node). The
// file is written like every other output: rendered to a private temporary
// file, read back and written to the target through atomic_write, so a failed
// run leaves no file behind and never replaces a good one.
#ifndef COUNTERFLUX_TOOLS_PLOT_HPP
#define COUNTERFLUX_TOOLS_PLOT_HPP

#include <filesystem>
#include <string>
#include <vector>

namespace counterflux::tool {

/// One curve: its legend label and its points (x and y of equal length).
struct plot_series {
    std::string label;
    std::vector<double> x, y;
};

/// A vertical line at x with a label (e.g. "t90").
struct plot_marker {
    double x;
    std::string label;
};

/// One panel: title, axis labels, curves, markers; log_y plots y on a log axis
/// (points with y <= 0 are then left out).
struct plot_panel {
    std::string title, x_label, y_label;
    std::vector<plot_series> series;
    std::vector<plot_marker> markers;
    bool log_y = false;
};

/// Writes an SVG with the panels stacked vertically (one above the other),
/// atomically (through atomic_write: render to a temporary file, read it back,
/// atomic_write the bytes), to path. Throws run_error when PLplot fails or the
/// data cannot be plotted (no panel, x and y of different lengths, a non-finite
/// point, a panel with nothing to plot); atomic_write's errors for the target.
/// Labels are plain text ('#', PLplot's escape character, is shown as '#').
void write_svg_plot(const std::filesystem::path& path, const std::string& title,
                    const std::vector<plot_panel>& panels);

}  // namespace counterflux::tool

#endif  // COUNTERFLUX_TOOLS_PLOT_HPP
