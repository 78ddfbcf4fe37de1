// tools/verb_support.hpp - small helpers every verb shares: reading a flag's
// quantity through the one unit parser and the plausibility ranges, and
// turning a library status into the right error.
#ifndef COUNTERFLUX_TOOLS_VERB_SUPPORT_HPP
#define COUNTERFLUX_TOOLS_VERB_SUPPORT_HPP

#include <string>
#include <vector>

#include <counterflux/status.hpp>

#include "errors.hpp"
#include "plausibility.hpp"
#include "units_parse.hpp"

namespace counterflux::tool {

/// The flag's value in SI; throws input_error "counterflux: error: --flag: ...".
double flag_quantity(const std::string& flag, const std::string& text, quantity_kind kind,
                     parse_options options = {});

/// The flag's value in SI, which must also lie in range; throws input_error
/// "counterflux: error: --flag TEXT: outside LOW .. HIGH".
double flag_quantity_in(const std::string& flag, const std::string& text, quantity_kind kind,
                        const value_range& range);

/// "--flag TEXT": how messages name a flag together with its value.
std::string flag_with_value(const std::string& flag, const std::string& text);

/// Throws unless code is ok: input_error (exit 2) when the inputs are outside
/// the model's domain, run_error (exit 1) otherwise. what says what was being
/// computed ("the current at 21 %"). subject names the flags that set the
/// condition ("--temperature 900 K"; empty when every value is a default): the
/// message then reads "counterflux: error: SUBJECT: cannot compute ...". details
/// are further diagnostics printed after it (e.g. the element to blame).
void require_ok(counterflux::status code, const std::string& what, const std::string& subject = {},
                const std::vector<diagnostic>& details = {});

/// The value of r, after require_ok(r.code, what, subject).
template <class T>
T value_of(const counterflux::result<T>& r, const std::string& what, const std::string& subject = {}) {
    require_ok(r.code, what, subject);
    return r.value;
}

}  // namespace counterflux::tool

#endif  // COUNTERFLUX_TOOLS_VERB_SUPPORT_HPP
