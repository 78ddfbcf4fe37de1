// tools/errors.hpp - the one error reporter of the command.
//
// Input errors are printed in the GNU convention, one line each:
//     FILE:LINE:COLUMN: error: MESSAGE      (a place in an input file)
//     FILE: error: MESSAGE                  (a whole file: cannot open, ...)
//     counterflux: error: --flag: MESSAGE   (a command-line flag)
//     counterflux: error: MESSAGE           (anything else)
// Exit status: 0 success, 2 bad input or usage, 3 a check failed, 1 anything else.
#ifndef COUNTERFLUX_TOOLS_ERRORS_HPP
#define COUNTERFLUX_TOOLS_ERRORS_HPP

#include <cstddef>
#include <exception>
#include <iosfwd>
#include <stdexcept>
#include <string>
#include <string_view>
#include <vector>

namespace counterflux::tool {

/// Process exit status of the command.
enum class exit_status : int { ok = 0, other = 1, bad_input = 2, check_failed = 3 };

/// The program name used in messages not tied to a file.
inline constexpr const char* program_name = "counterflux";

/// Where a diagnostic points. An empty file means "the command line".
struct source_place {
    std::string file;     ///< input file path as given, or empty
    long line = 0;        ///< 1-based; 0 when the whole file is meant
    long column = 0;      ///< 1-based; 0 when unknown
    std::string subject;  ///< a flag name ("--temperature") when file is empty
};

/// One message with its place.
struct diagnostic {
    source_place place;
    std::string message;
};

/// Most bytes of user text (a key, a value, an argument) a message echoes.
inline constexpr std::size_t echo_limit = 60;

/// text as a message echoes it: unchanged up to echo_limit bytes, else its
/// first bytes (not splitting a UTF-8 sequence) and "...". A 1 MB key makes a
/// one-line message, not a 1 MB one.
std::string abbreviate(std::string_view text, std::size_t limit = echo_limit);

/// Formats one diagnostic as a single line (no trailing newline).
std::string format_diagnostic(const diagnostic& d);

/// Bad input or usage (exit 2); carries one or more diagnostics.
class input_error : public std::exception {
public:
    explicit input_error(std::vector<diagnostic> diagnostics);
    input_error(source_place place, std::string message);
    const char* what() const noexcept override;
    const std::vector<diagnostic>& diagnostics() const noexcept { return diagnostics_; }

private:
    std::vector<diagnostic> diagnostics_;
    std::string what_;
};

/// A bad command-line flag value: "counterflux: error: --flag: message".
input_error flag_error(const std::string& flag, const std::string& message);

/// A check that failed (exit 3): corrupt record, error bound not met, ...
/// Printed "counterflux: error: MESSAGE", or "FILE: error: MESSAGE" when made
/// with a place.
class check_failed : public std::runtime_error {
public:
    using std::runtime_error::runtime_error;
    /// A failed check about an input: what() is the formatted diagnostic.
    check_failed(const source_place& place, const std::string& message);
    /// True when what() is already a formatted diagnostic (made with a place).
    bool placed() const noexcept { return placed_; }

private:
    bool placed_ = false;
};

/// Anything else that stops a run (exit 1): I/O failure, library failure.
class run_error : public std::runtime_error {
public:
    using std::runtime_error::runtime_error;
};

/// Prints the exception to err in the format above and returns the exit status
/// it maps to. Never throws.
int report_exception(std::exception_ptr error, std::ostream& err) noexcept;

}  // namespace counterflux::tool

#endif  // COUNTERFLUX_TOOLS_ERRORS_HPP
