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

std::string flag_with_value(const std::string& flag, const std::string& text) { return flag + " " + abbreviate(text); }

double flag_quantity_in(const std::string& flag, const std::string& text, quantity_kind kind,
                        const value_range& range) {
    const double v = flag_quantity(flag, text, kind);
    if (!range.contains(v))
        throw flag_error(flag_with_value(flag, text), range.outside());
    return v;
}

void require_ok(counterflux::status code, const std::string& what, const std::string& subject,
                const std::vector<diagnostic>& details) {
    using counterflux::status;
    if (code == status::ok) return;
    const std::string message = "cannot compute " + what + ": " + counterflux::describe(code);
    const bool input = has(code, status::out_of_domain) || has(code, status::below_range) ||
                       has(code, status::above_range) || has(code, status::unknown_gas);
    if (!input && details.empty()) throw run_error(subject.empty() ? message : subject + ": " + message);
    source_place place;
    place.subject = subject;
    std::vector<diagnostic> all{diagnostic{place, message}};
    all.insert(all.end(), details.begin(), details.end());
    throw input_error(std::move(all));
}

}  // namespace counterflux::tool
