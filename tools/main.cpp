// tools/main.cpp - the `counterflux` command: one CLI11 app, one subcommand per
// verb (each in tools/verbs/), and the one place where errors become exit codes
// (every error, the command line's included, goes through errors.hpp).
#include <exception>
#include <iostream>
#include <string>
#include <vector>

#include <CLI/CLI.hpp>

#include "errors.hpp"
#include "sensor_file.hpp"
#include "verbs/verbs.hpp"

#ifndef COUNTERFLUX_TOOL_VERSION
#define COUNTERFLUX_TOOL_VERSION "unknown"
#endif

namespace {

using namespace counterflux::tool;

// Help and version text go to standard output; a failed write (a full disk,
// a closed pipe) is an error like any other.
int print(const std::string& text) {
    std::cout << text;
    std::cout.flush();
    if (!std::cout) throw run_error("cannot write to standard output");
    return static_cast<int>(exit_status::ok);
}

// The command-line error as an input_error: an unknown or missing verb is named
// with the known ones; a verb's own error says how to get that verb's help.
input_error usage_error(const CLI::ParseError& e, const std::vector<verb>& verbs, int argc, char** argv) {
    std::vector<std::string> names;
    std::string known;
    const CLI::App* chosen = nullptr;
    for (const auto& v : verbs) {
        names.push_back(v.command->get_name());
        known += (known.empty() ? "" : ", ") + v.command->get_name();
        if (v.command->parsed()) chosen = v.command;
    }
    if (chosen != nullptr)
        return input_error(source_place{}, abbreviate(e.what(), 4 * echo_limit) + "; run '" + program_name + " " +
                                               chosen->get_name() + " --help' for usage");
    // No verb was recognised: the first argument that is not an option is the
    // would-be verb (the top level has no options that take a value).
    const std::string usage = std::string("; run '") + program_name + " --help' for usage";
    for (int i = 1; i < argc; ++i) {
        const std::string arg = argv[i];
        if (!arg.empty() && arg.front() == '-') continue;
        std::string message = "unknown verb '" + abbreviate(arg) + "'";
        if (const auto m = closest_match(arg, names)) message += " (did you mean '" + *m + "'?)";
        return input_error(source_place{}, message + "; known verbs: " + known + usage);
    }
    for (int i = 1; i < argc; ++i) {
        const std::string arg = argv[i];
        if (arg != "--help" && arg != "-h" && arg != "--version")
            return input_error(source_place{}, "unknown option '" + abbreviate(arg) +
                                                   "' before the verb; expected a verb: " +
                                                   known + usage);
    }
    (void)e;
    return input_error(source_place{}, "no verb given; expected one of: " + known + usage);
}

int run(int argc, char** argv) {
    CLI::App app{"counterflux: design and calibration of diffusion-limited amperometric gas sensors", program_name};
    app.set_version_flag("--version", std::string(program_name) + " " + COUNTERFLUX_TOOL_VERSION);
    app.require_subcommand(1);
    app.fallthrough(false);

    // Later verbs (table, fit, step, inspect) slot in here.
    const std::vector<verb> verbs = {
        add_diffusivity_verb(app, std::cout),
        add_design_verb(app, std::cout),
        add_table_verb(app, std::cout),
        add_inspect_verb(app, std::cout),
        add_step_verb(app, std::cout),
    };

    try {
        app.parse(argc, argv);
    } catch (const CLI::CallForHelp&) {
        // A verb's own --help arrives here too, with that verb's help.
        return print(app.help());
    } catch (const CLI::CallForAllHelp&) {
        return print(app.help("", CLI::AppFormatMode::All));
    } catch (const CLI::CallForVersion& e) {
        return print(std::string(e.what()) + "\n");
    } catch (const CLI::ParseError& e) {
        throw usage_error(e, verbs, argc, argv);
    }

    for (const auto& v : verbs)
        if (v.command->parsed()) return v.run();
    throw input_error(source_place{}, "no verb given");
}

}  // namespace

int main(int argc, char** argv) {
    try {
        return run(argc, argv);
    } catch (...) {
        return counterflux::tool::report_exception(std::current_exception(), std::cerr);
    }
}
