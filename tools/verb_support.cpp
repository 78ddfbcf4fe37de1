// tools/verb_support.cpp - see verb_support.hpp.
#include "verb_support.hpp"

namespace counterflux::tool {

double flag_quantity(const std::string& flag, const std::string& text, quantity_kind kind, parse_options options) {
    try {
        return parse_quantity(text, kind, options);
    } catch (const unit_error& e) {
        throw flag_error(flag, e.what());
    }
}

void require_ok(counterflux::status code, const std::string& what) {
    using counterflux::status;
    if (code == status::ok) return;
    const std::string message = "cannot compute " + what + ": " + counterflux::describe(code);
    if (has(code, status::out_of_domain) || has(code, status::below_range) || has(code, status::above_range) ||
        has(code, status::unknown_gas))
        throw input_error(source_place{}, message);
    throw run_error(message);
}

}  // namespace counterflux::tool
