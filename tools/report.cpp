// tools/report.cpp - see report.hpp.
#include "report.hpp"

#include <cmath>
#include <cstdio>
#include <ostream>

#include "atomic_write.hpp"
#include "errors.hpp"
#include "units_parse.hpp"

namespace counterflux::tool {

std::string format_number(double v, int digits) {
    char buffer[64];
    std::snprintf(buffer, sizeof buffer, "%.*g", digits, v);
    return buffer;
}

std::string format_signed(double v, int digits) {
    char buffer[64];
    std::snprintf(buffer, sizeof buffer, "%+.*g", digits, v);
    return buffer;
}

std::string format_concentration(double y, int digits) {
    const double a = std::fabs(y);
    if (a == 0.0) return "0 ppm";
    if (a < 1.0e-6) return format_number(from_si(y, "ppb"), digits) + " ppb";
    if (a < 1.0e-2) return format_number(from_si(y, "ppm"), digits) + " ppm";
    return format_number(from_si(y, "%"), digits) + " %";
}

std::string format_current(double ampere, int digits) {
    const double a = std::fabs(ampere);
    if (a < 1.0e-6) return format_number(from_si(ampere, "nA"), digits) + " nA";
    if (a < 1.0e-3) return format_number(from_si(ampere, "uA"), digits) + " uA";
    if (a < 1.0) return format_number(from_si(ampere, "mA"), digits) + " mA";
    return format_number(ampere, digits) + " A";
}

std::string format_temperature(double kelvin) {
    return format_number(from_si(kelvin, "C"), 5) + " C (" + format_number(kelvin, 6) + " K)";
}

std::string format_pressure(double pascal) { return format_number(from_si(pascal, "kPa"), 6) + " kPa"; }

std::string format_length(double metre, int digits) {
    const double a = std::fabs(metre);
    if (a < 1.0e-6) return format_number(from_si(metre, "nm"), digits) + " nm";
    if (a < 1.0e-3) return format_number(from_si(metre, "um"), digits) + " um";
    if (a < 1.0) return format_number(from_si(metre, "mm"), digits) + " mm";
    return format_number(metre, digits) + " m";
}

namespace {

void check_finite(const nlohmann::json& j, const std::string& where) {
    if (j.is_number_float() && !std::isfinite(j.get<double>()))
        throw run_error("internal error: non-finite number in JSON output at " + where);
    if (j.is_object())
        for (auto it = j.begin(); it != j.end(); ++it) check_finite(it.value(), where + "." + it.key());
    if (j.is_array())
        for (std::size_t i = 0; i < j.size(); ++i) check_finite(j[i], where + "[" + std::to_string(i) + "]");
}

}  // namespace

std::string json_text(const nlohmann::json& document) {
    check_finite(document, "$");
    return document.dump(2) + "\n";
}

void emit(const std::string& content, const std::optional<std::string>& out_path, std::ostream& stdout_stream) {
    if (out_path) {
        atomic_write(*out_path, content);
        return;
    }
    stdout_stream << content;
    stdout_stream.flush();
    if (!stdout_stream) throw run_error("cannot write to standard output");
}

}  // namespace counterflux::tool
