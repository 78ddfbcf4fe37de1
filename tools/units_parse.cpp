// tools/units_parse.cpp - see units_parse.hpp.
#include "units_parse.hpp"

#include <charconv>
#include <cmath>
#include <limits>
#include <system_error>

#include <counterflux/constants.hpp>
#include <counterflux/units.hpp>

#include "errors.hpp"

namespace counterflux::tool {

namespace {

constexpr double ice_point = counterflux::ice_point_K<double>;

// The accepted spellings, exactly those of the interface contract (plus m/s for
// the electrode rate, the one key whose documented unit the list lacks).
const std::vector<unit_info> units = {
    {"K", quantity_kind::temperature, 1.0, 0.0},
    {"C", quantity_kind::temperature, 1.0, ice_point},
    {"degC", quantity_kind::temperature, 1.0, ice_point},

    {"Pa", quantity_kind::pressure, 1.0, 0.0},
    {"hPa", quantity_kind::pressure, 1.0e2, 0.0},
    {"kPa", quantity_kind::pressure, 1.0e3, 0.0},
    {"mbar", quantity_kind::pressure, 1.0e2, 0.0},
    {"bar", quantity_kind::pressure, counterflux::bar_Pa<double>, 0.0},
    {"atm", quantity_kind::pressure, counterflux::atm_Pa<double>, 0.0},

    {"m", quantity_kind::length, 1.0, 0.0},
    {"mm", quantity_kind::length, 1.0e-3, 0.0},
    {"um", quantity_kind::length, 1.0e-6, 0.0},
    {"nm", quantity_kind::length, 1.0e-9, 0.0},

    {"m2", quantity_kind::area, 1.0, 0.0},
    {"cm2", quantity_kind::area, 1.0e-4, 0.0},
    {"mm2", quantity_kind::area, 1.0e-6, 0.0},

    {"m3", quantity_kind::volume, 1.0, 0.0},
    {"L", quantity_kind::volume, 1.0e-3, 0.0},
    {"mL", quantity_kind::volume, 1.0e-6, 0.0},
    {"cm3", quantity_kind::volume, 1.0e-6, 0.0},
    {"mm3", quantity_kind::volume, 1.0e-9, 0.0},

    {"L/min", quantity_kind::flow, 1.0e-3 / 60.0, 0.0},
    {"mL/min", quantity_kind::flow, 1.0e-6 / 60.0, 0.0},

    {"mol/mol", quantity_kind::concentration, 1.0, 0.0},
    {"%", quantity_kind::concentration, 1.0e-2, 0.0},
    {"ppm", quantity_kind::concentration, counterflux::ppm<double>, 0.0},
    {"ppb", quantity_kind::concentration, counterflux::ppb<double>, 0.0},

    {"A", quantity_kind::current, 1.0, 0.0},
    {"mA", quantity_kind::current, 1.0e-3, 0.0},
    {"uA", quantity_kind::current, 1.0e-6, 0.0},
    {"nA", quantity_kind::current, 1.0e-9, 0.0},

    {"m2/s", quantity_kind::diffusivity, 1.0, 0.0},
    {"cm2/s", quantity_kind::diffusivity, counterflux::cm2_per_s_m2_per_s<double>, 0.0},

    {"Barrer", quantity_kind::permeability, counterflux::barrer_mol_m_s_Pa<double>, 0.0},
    {"mol/(m s Pa)", quantity_kind::permeability, 1.0, 0.0},

    {"J/mol", quantity_kind::energy, 1.0, 0.0},
    {"kJ/mol", quantity_kind::energy, 1.0e3, 0.0},

    {"s", quantity_kind::time, 1.0, 0.0},
    {"min", quantity_kind::time, 60.0, 0.0},
    {"h", quantity_kind::time, 3600.0, 0.0},

    {"m/s", quantity_kind::velocity, 1.0, 0.0},
};

bool is_space(char c) noexcept { return c == ' ' || c == '\t'; }
bool is_digit(char c) noexcept { return c >= '0' && c <= '9'; }

std::string_view trim(std::string_view s) noexcept {
    while (!s.empty() && is_space(s.front())) s.remove_prefix(1);
    while (!s.empty() && is_space(s.back())) s.remove_suffix(1);
    return s;
}

std::string in_quotes(std::string_view s) { return "'" + abbreviate(s) + "'"; }

// Length of the longest prefix of s that is a strict decimal number; 0 if none.
// A point needs a digit on at least one side: "1.", ".5" and "1.5" are numbers,
// "." is not. Throws for a prefix that starts like a number but is malformed:
// an exponent without digits ("1e", "1e+") or a second point ("1.2.3").
std::size_t scan_number(std::string_view s, std::string_view whole) {
    std::size_t i = 0;
    if (i < s.size() && (s[i] == '+' || s[i] == '-')) ++i;
    std::size_t digits = 0;
    while (i < s.size() && is_digit(s[i])) { ++i; ++digits; }
    if (i < s.size() && s[i] == '.') {
        ++i;
        std::size_t fraction = 0;
        while (i < s.size() && is_digit(s[i])) { ++i; ++fraction; }
        digits += fraction;
        if (fraction == 0 && digits == 0) return 0;
    }
    if (digits == 0) return 0;
    if (i < s.size() && (s[i] == 'e' || s[i] == 'E')) {
        std::size_t j = i + 1;
        if (j < s.size() && (s[j] == '+' || s[j] == '-')) ++j;
        std::size_t exponent = 0;
        while (j < s.size() && is_digit(s[j])) { ++j; ++exponent; }
        if (exponent == 0)
            throw unit_error("malformed number " + in_quotes(whole) + " (exponent without digits)");
        i = j;
    }
    // A second point or more digits right after the number: "1.2.3".
    if (i < s.size() && (s[i] == '.' || is_digit(s[i])))
        throw unit_error("malformed number " + in_quotes(whole));
    return i;
}

double convert(std::string_view digits, std::string_view whole) {
    // from_chars does not accept a leading '+'.
    if (!digits.empty() && digits.front() == '+') digits.remove_prefix(1);
    double value = 0.0;
    const auto [end, ec] = std::from_chars(digits.data(), digits.data() + digits.size(), value);
    if (ec == std::errc::result_out_of_range || !std::isfinite(value))
        throw number_out_of_range("number " + in_quotes(whole) + " is out of range");
    if (ec != std::errc() || end != digits.data() + digits.size())
        throw unit_error("malformed number " + in_quotes(whole));
    return value;
}

// What a key or flag of this kind expects: "a length (m, mm, um, nm; a bare
// number is m)", "a plain number (no unit)".
std::string expected_text(quantity_kind kind) {
    if (kind == quantity_kind::dimensionless) return "a plain number (no unit)";
    return kind_with_article(kind) + " (" + accepted_units(kind) + "; a bare number is " + si_unit(kind) + ")";
}

}  // namespace

const char* kind_name(quantity_kind kind) noexcept {
    switch (kind) {
        case quantity_kind::dimensionless: return "plain number";
        case quantity_kind::temperature: return "temperature";
        case quantity_kind::pressure: return "pressure";
        case quantity_kind::length: return "length";
        case quantity_kind::area: return "area";
        case quantity_kind::volume: return "volume";
        case quantity_kind::flow: return "flow";
        case quantity_kind::concentration: return "concentration";
        case quantity_kind::current: return "current";
        case quantity_kind::diffusivity: return "diffusivity";
        case quantity_kind::permeability: return "permeability";
        case quantity_kind::energy: return "molar energy";
        case quantity_kind::time: return "time";
        case quantity_kind::velocity: return "rate";
    }
    return "quantity";
}

std::string kind_with_article(quantity_kind kind) {
    const std::string name = kind_name(kind);
    const char first = name.empty() ? 'x' : name.front();
    const bool vowel = first == 'a' || first == 'e' || first == 'i' || first == 'o' || first == 'u';
    return (vowel ? "an " : "a ") + name;
}

const char* si_unit(quantity_kind kind) noexcept {
    switch (kind) {
        case quantity_kind::dimensionless: return "";
        case quantity_kind::temperature: return "K";
        case quantity_kind::pressure: return "Pa";
        case quantity_kind::length: return "m";
        case quantity_kind::area: return "m2";
        case quantity_kind::volume: return "m3";
        case quantity_kind::flow: return "m3/s";
        case quantity_kind::concentration: return "mol/mol";
        case quantity_kind::current: return "A";
        case quantity_kind::diffusivity: return "m2/s";
        case quantity_kind::permeability: return "mol/(m s Pa)";
        case quantity_kind::energy: return "J/mol";
        case quantity_kind::time: return "s";
        case quantity_kind::velocity: return "m/s";
    }
    return "";
}

std::string accepted_units(quantity_kind kind) {
    std::string out;
    for (const auto& u : units) {
        if (u.kind != kind) continue;
        if (!out.empty()) out += ", ";
        out += u.symbol;
    }
    if (out.empty()) out = "no unit";
    return out;
}

const std::vector<unit_info>& unit_table() { return units; }

std::optional<unit_info> find_unit(std::string_view symbol) noexcept {
    for (const auto& u : units)
        if (u.symbol == symbol) return u;
    return std::nullopt;
}

double parse_number(std::string_view text) {
    const std::string_view s = trim(text);
    if (s.empty()) throw unit_error("expected a number, got an empty string");
    const std::size_t n = scan_number(s, s);
    if (n == 0 || n != s.size()) throw unit_error("expected a number, got " + in_quotes(s));
    return convert(s.substr(0, n), s);
}

double parse_quantity(std::string_view text, quantity_kind kind, parse_options options) {
    const std::string_view s = trim(text);
    const std::string expected = expected_text(kind);
    if (s.empty()) throw unit_error("empty value, expected " + expected);
    if (options.allow_infinity && s == "inf") return std::numeric_limits<double>::infinity();

    const std::size_t n = scan_number(s, s);
    if (n == 0) {
        // No number at all: "abc", "mm", "nan", "inf" (where not allowed).
        if (s == "inf" || s == "nan" || s == "-inf" || s == "+inf" || s == "infinity")
            throw unit_error(in_quotes(s) + " is not a finite number, expected " + expected);
        throw unit_error("expected a number, got " + in_quotes(s) + "; expected " + expected);
    }
    const double number = convert(s.substr(0, n), s);
    const std::string_view symbol = trim(s.substr(n));

    double value = number;
    if (!symbol.empty()) {
        const auto unit = find_unit(symbol);
        if (!unit) throw unit_error("unknown unit " + in_quotes(symbol) + ", expected " + expected);
        if (unit->kind != kind)
            throw unit_error(in_quotes(s) + " is " + kind_with_article(unit->kind) + ", expected " + expected);
        value = number * unit->scale + unit->offset;
    }
    if (!std::isfinite(value)) throw number_out_of_range("number " + in_quotes(s) + " is out of range");
    if (kind == quantity_kind::temperature && value < 0.0)
        throw unit_error(in_quotes(s) + " is below absolute zero");
    return value;
}

double from_si(double value_si, std::string_view unit_symbol) {
    const auto unit = find_unit(unit_symbol);
    if (!unit) throw unit_error("from_si: unknown unit " + in_quotes(unit_symbol));
    return (value_si - unit->offset) / unit->scale;
}

}  // namespace counterflux::tool
