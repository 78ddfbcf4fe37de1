// tools/verbs/verbs.hpp - the verbs of the command. Each verb lives in its own
// file: an options struct, a run function that parses the option values, calls
// the library and emits (usable without the command line, e.g. from tests), and
// an add_* function that declares its command-line interface.
#ifndef COUNTERFLUX_TOOLS_VERBS_HPP
#define COUNTERFLUX_TOOLS_VERBS_HPP

#include <functional>
#include <iosfwd>
#include <optional>
#include <string>

namespace CLI {
class App;
}

namespace counterflux::tool {

/// A verb as registered on the command line: its subcommand and what runs it.
struct verb {
    CLI::App* command;         ///< the CLI11 subcommand
    std::function<int()> run;  ///< returns the exit status; throws on errors
};

// ---- diffusivity -----------------------------------------------------------

/// Options of `counterflux diffusivity A B`.
struct diffusivity_options {
    std::string gas_a;
    std::string gas_b;
    std::string temperature = "298.15 K";
    std::string pressure = "101325 Pa";
    std::string method = "fuller";  ///< "fuller" or "chapman-enskog"
    bool json = false;
};

/// Prints D_AB of the pair. Throws input_error / run_error.
int run_diffusivity(const diffusivity_options& options, std::ostream& out);

/// Declares the verb on app; output goes to out.
verb add_diffusivity_verb(CLI::App& app, std::ostream& out);

// ---- design ----------------------------------------------------------------

/// Options of `counterflux design FILE`.
struct design_options {
    std::string file;
    std::optional<std::string> temperature;    ///< default: the reference temperature
    std::optional<std::string> pressure;       ///< default: the reference pressure
    std::optional<std::string> concentration;  ///< default: full scale
    std::optional<std::string> out;            ///< write here (atomically) instead of stdout
    bool json = false;
};

/// Prints the steady-state design report. Throws input_error / run_error.
int run_design(const design_options& options, std::ostream& out);

/// Declares the verb on app; output goes to out.
verb add_design_verb(CLI::App& app, std::ostream& out);

// ---- table -----------------------------------------------------------------

/// Options of `counterflux table FILE --out DIR`.
struct table_options {
    std::string file;
    std::string out;                    ///< directory for the four outputs
    std::optional<std::string> values;  ///< "float32" or "q15"; default: table.values
    std::optional<std::string> svg;     ///< also write an SVG plot here
    bool json = false;
};

/// Builds, proves and writes the tables. Throws input_error / run_error, and
/// check_failed (exit 3) when the proven error exceeds table.max_error.
int run_table(const table_options& options, std::ostream& out);

/// Declares the verb on app; output goes to out.
verb add_table_verb(CLI::App& app, std::ostream& out);

// ---- inspect ---------------------------------------------------------------

/// Options of `counterflux inspect FILE.bin`.
struct inspect_options {
    std::string file;
    bool json = false;
};

/// Validates the calibration record in options.file and prints it. Throws
/// input_error (unreadable, not a regular file, over 1 MiB) or check_failed
/// (an invalid record; with --json the JSON with "valid": false is printed first).
int run_inspect(const inspect_options& options, std::ostream& out);

/// Declares the verb on app; output goes to out.
verb add_inspect_verb(CLI::App& app, std::ostream& out);

// ---- step ------------------------------------------------------------------

/// Options of `counterflux step FILE`.
struct step_options {
    std::string file;
    std::optional<std::string> csv;  ///< write the curve here (atomically)
    std::optional<std::string> svg;  ///< write the plot here (atomically)
    bool json = false;
};

/// Prints the step response of the file's chain (t10, t50, t90, fall t90, the
/// error estimate, what sets t90); writes the curve and the plot when asked.
/// Throws input_error / run_error / check_failed (t90 not settled to 0.1 %).
int run_step(const step_options& options, std::ostream& out);

/// Declares the verb on app; output goes to out.
verb add_step_verb(CLI::App& app, std::ostream& out);

}  // namespace counterflux::tool

#endif  // COUNTERFLUX_TOOLS_VERBS_HPP
