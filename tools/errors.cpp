// tools/errors.cpp - see errors.hpp.
#include "errors.hpp"

#include <new>
#include <ostream>

namespace counterflux::tool {

std::string abbreviate(std::string_view text, std::size_t limit) {
    if (text.size() <= limit) return std::string(text);
    const std::size_t keep = limit > 3 ? limit - 3 : 0;
    std::size_t cut = keep;
    // Back up over UTF-8 continuation bytes (10xxxxxx) to the start of a character.
    while (cut > 0 && (static_cast<unsigned char>(text[cut]) & 0xC0u) == 0x80u) --cut;
    return std::string(text.substr(0, cut)) + "...";
}

std::string format_diagnostic(const diagnostic& d) {
    std::string out;
    const source_place& p = d.place;
    if (!p.file.empty()) {
        out = p.file;
        if (p.line > 0) {
            out += ":" + std::to_string(p.line);
            out += ":" + std::to_string(p.column > 0 ? p.column : 1);
        }
        out += ": error: ";
    } else {
        out = std::string(program_name) + ": error: ";
        if (!p.subject.empty()) out += p.subject + ": ";
    }
    out += d.message;
    return out;
}

input_error::input_error(std::vector<diagnostic> diagnostics) : diagnostics_(std::move(diagnostics)) {
    for (const auto& d : diagnostics_) {
        if (!what_.empty()) what_ += "\n";
        what_ += format_diagnostic(d);
    }
}

input_error::input_error(source_place place, std::string message)
    : input_error(std::vector<diagnostic>{diagnostic{std::move(place), std::move(message)}}) {}

const char* input_error::what() const noexcept { return what_.c_str(); }

check_failed::check_failed(const source_place& place, const std::string& message)
    : std::runtime_error(format_diagnostic(diagnostic{place, message})), placed_(true) {}

input_error flag_error(const std::string& flag, const std::string& message) {
    source_place place;
    place.subject = flag;
    return input_error(std::move(place), message);
}

int report_exception(std::exception_ptr error, std::ostream& err) noexcept {
    const auto general = [&err](const char* message) {
        try {
            err << program_name << ": error: " << message << '\n';
        } catch (...) {
        }
    };
    try {
        std::rethrow_exception(error);
    } catch (const input_error& e) {
        try {
            for (const auto& d : e.diagnostics()) err << format_diagnostic(d) << '\n';
        } catch (...) {
        }
        return static_cast<int>(exit_status::bad_input);
    } catch (const check_failed& e) {
        if (!e.placed()) {
            general(e.what());
        } else {
            try {
                err << e.what() << '\n';
            } catch (...) {
            }
        }
        return static_cast<int>(exit_status::check_failed);
    } catch (const std::bad_alloc&) {
        general("out of memory");
        return static_cast<int>(exit_status::other);
    } catch (const std::exception& e) {
        general(e.what());
        return static_cast<int>(exit_status::other);
    } catch (...) {
        general("unexpected failure");
        return static_cast<int>(exit_status::other);
    }
}

}  // namespace counterflux::tool
