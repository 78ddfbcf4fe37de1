// tools/main.cpp - the `counterflux` command: one CLI11 app, one subcommand per
// verb (each in tools/verbs/), and the one place where errors become exit codes.
#include <exception>
#include <iostream>
#include <vector>

#include <CLI/CLI.hpp>

#include "errors.hpp"
#include "verbs/verbs.hpp"

#ifndef COUNTERFLUX_TOOL_VERSION
#define COUNTERFLUX_TOOL_VERSION "unknown"
#endif

namespace {

int run(int argc, char** argv) {
    using namespace counterflux::tool;
    CLI::App app{"counterflux: design and calibration of diffusion-limited amperometric gas sensors", program_name};
    app.set_version_flag("--version", std::string(program_name) + " " + COUNTERFLUX_TOOL_VERSION);
    app.require_subcommand(1);
    app.fallthrough(false);

    // Later verbs (table, fit, step, inspect) slot in here.
    const std::vector<verb> verbs = {
        add_diffusivity_verb(app, std::cout),
        add_design_verb(app, std::cout),
    };

    try {
        app.parse(argc, argv);
    } catch (const CLI::CallForHelp&) {
        std::cout << app.help();
        return 0;
    } catch (const CLI::CallForAllHelp&) {
        std::cout << app.help("", CLI::AppFormatMode::All);
        return 0;
    } catch (const CLI::CallForVersion& e) {
        std::cout << e.what() << '\n';
        return 0;
    } catch (const CLI::ParseError& e) {
        // A verb's own --help arrives as CallForHelp above with the verb's help;
        // everything else is a usage error.
        std::cerr << program_name << ": error: " << e.what() << '\n'
                  << "Run '" << program_name << " --help' for usage.\n";
        return static_cast<int>(exit_status::bad_input);
    }

    for (const auto& v : verbs)
        if (v.command->parsed()) return v.run();
    std::cerr << program_name << ": error: no verb given\n";
    return static_cast<int>(exit_status::bad_input);
}

}  // namespace

int main(int argc, char** argv) {
    try {
        return run(argc, argv);
    } catch (...) {
        return counterflux::tool::report_exception(std::current_exception(), std::cerr);
    }
}
