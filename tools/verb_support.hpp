// tools/verb_support.hpp - small helpers every verb shares: reading a flag's
// quantity through the one unit parser, and turning a library status into the
// right error.
#ifndef COUNTERFLUX_TOOLS_VERB_SUPPORT_HPP
#define COUNTERFLUX_TOOLS_VERB_SUPPORT_HPP

#include <string>

#include <counterflux/status.hpp>

#include "errors.hpp"
#include "units_parse.hpp"

namespace counterflux::tool {

/// The flag's value in SI; throws input_error "counterflux: error: --flag: ...".
double flag_quantity(const std::string& flag, const std::string& text, quantity_kind kind,
                     parse_options options = {});

/// Throws unless code is ok: input_error (exit 2) when the inputs are outside
/// the model's domain, run_error (exit 1) otherwise. what says what was being
/// computed ("the current at 21 %").
void require_ok(counterflux::status code, const std::string& what);

/// The value of r, after require_ok(r.code, what).
template <class T>
T value_of(const counterflux::result<T>& r, const std::string& what) {
    require_ok(r.code, what);
    return r.value;
}

}  // namespace counterflux::tool

#endif  // COUNTERFLUX_TOOLS_VERB_SUPPORT_HPP
