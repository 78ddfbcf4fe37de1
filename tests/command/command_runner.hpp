// Runs the built `counterflux` binary (COUNTERFLUX_COMMAND) from a doctest
// case and captures its standard output. Header only, for tests/command/*.cpp.
#ifndef COUNTERFLUX_TESTS_COMMAND_RUNNER_HPP
#define COUNTERFLUX_TESTS_COMMAND_RUNNER_HPP

#include <doctest/doctest.h>

#include <array>
#include <cstdio>
#include <string>
#include <utility>
#include <vector>

#include <sys/wait.h>

#include <nlohmann/json.hpp>

namespace counterflux_command_test {

inline const std::string command = COUNTERFLUX_COMMAND;

struct run_result {
    int status;       ///< exit status, -1 when the command did not exit normally
    std::string out;  ///< standard output
};

inline std::string shell_quote(const std::string& s) {
    std::string q = "'";
    for (char c : s) {
        if (c == '\'') q += "'\\''";
        else q += c;
    }
    return q + "'";
}

/// Runs the command with args (each quoted), capturing standard output;
/// standard error is discarded.
inline run_result run(const std::vector<std::string>& args) {
    std::string line = shell_quote(command);
    for (const auto& a : args) line += " " + shell_quote(a);
    line += " 2>/dev/null";
    FILE* pipe = ::popen(line.c_str(), "r");
    REQUIRE(pipe != nullptr);
    std::string out;
    std::array<char, 4096> buffer{};
    std::size_t n = 0;
    while ((n = std::fread(buffer.data(), 1, buffer.size(), pipe)) > 0) out.append(buffer.data(), n);
    const int raw = ::pclose(pipe);
    return {WIFEXITED(raw) ? WEXITSTATUS(raw) : -1, out};
}

/// Runs the command with args, capturing standard error (standard output is
/// discarded): the exit status and the messages.
inline std::pair<int, std::string> run_stderr(const std::vector<std::string>& args) {
    std::string line = shell_quote(command);
    for (const auto& a : args) line += " " + shell_quote(a);
    line += " 2>&1 >/dev/null";
    FILE* pipe = ::popen(line.c_str(), "r");
    REQUIRE(pipe != nullptr);
    std::string err;
    std::array<char, 4096> buffer{};
    std::size_t n = 0;
    while ((n = std::fread(buffer.data(), 1, buffer.size(), pipe)) > 0) err.append(buffer.data(), n);
    const int raw = ::pclose(pipe);
    return {WIFEXITED(raw) ? WEXITSTATUS(raw) : -1, err};
}

/// The JSON the command prints; the test stops unless it exits 0.
inline nlohmann::json run_json(const std::vector<std::string>& args) {
    const run_result r = run(args);
    INFO("counterflux exit status " << r.status);
    REQUIRE(r.status == 0);
    return nlohmann::json::parse(r.out);
}

}  // namespace counterflux_command_test

#endif  // COUNTERFLUX_TESTS_COMMAND_RUNNER_HPP
