// tools/units_parse.hpp - the one parser for quantities with units, shared by the
// sensor file reader and the command-line flags.
//
// A quantity is a number, optional whitespace, then an optional unit: "0.2 mm",
// "0.2mm", "25 C". A bare number is SI. Every key or flag expects one kind of
// quantity; a unit of another kind, an unknown unit or a malformed number is an
// error (unit_error) whose text names the accepted units of the expected kind.
#ifndef COUNTERFLUX_TOOLS_UNITS_PARSE_HPP
#define COUNTERFLUX_TOOLS_UNITS_PARSE_HPP

#include <optional>
#include <stdexcept>
#include <string>
#include <string_view>
#include <vector>

namespace counterflux::tool {

/// The physical kind a key or flag expects.
enum class quantity_kind {
    dimensionless,  ///< a plain number, no unit accepted
    temperature,    ///< K
    pressure,       ///< Pa
    length,         ///< m
    area,           ///< m2
    volume,         ///< m3
    flow,           ///< m3/s
    concentration,  ///< mol/mol
    current,        ///< A
    diffusivity,    ///< m2/s
    permeability,   ///< mol/(m s Pa)
    energy,         ///< J/mol
    time,           ///< s
    velocity,       ///< m/s (first-order electrode rate)
};

/// One accepted unit: value_SI = value * scale + offset.
struct unit_info {
    std::string_view symbol;
    quantity_kind kind;
    double scale;
    double offset;
};

/// Thrown for a malformed number, an unknown unit or a unit of the wrong kind.
/// The message does not name the key; the caller adds it.
class unit_error : public std::runtime_error {
public:
    using std::runtime_error::runtime_error;
};

/// A well-formed number too large for a double ("1e999"), or one whose value
/// in SI overflows ("1e307 bar"): a unit_error the caller may word as "out of range".
class number_out_of_range : public unit_error {
public:
    using unit_error::unit_error;
};

/// Options of one parse.
struct parse_options {
    bool allow_infinity = false;  ///< accept the word "inf" (positive infinity)
};

/// English name of a kind ("temperature", "length", ...).
const char* kind_name(quantity_kind kind) noexcept;

/// The name with its indefinite article ("a temperature", "an area").
std::string kind_with_article(quantity_kind kind);

/// The SI unit of a kind ("K", "m2/s"; "" for dimensionless).
const char* si_unit(quantity_kind kind) noexcept;

/// Comma-separated list of the units a kind accepts ("K, C, degC").
std::string accepted_units(quantity_kind kind);

/// Every accepted unit with its conversion to SI.
const std::vector<unit_info>& unit_table();

/// The unit with exactly this spelling, if any.
std::optional<unit_info> find_unit(std::string_view symbol) noexcept;

/// Parses a strict decimal number (sign, digits, point, exponent; no "nan", no
/// "inf", no hex, no surrounding text). Throws unit_error (number_out_of_range
/// for a number beyond the range of double).
double parse_number(std::string_view text);

/// Parses "number [unit]" as a quantity of the given kind and returns it in SI.
/// Temperatures below absolute zero are rejected. Throws unit_error.
double parse_quantity(std::string_view text, quantity_kind kind, parse_options options = {});

/// Converts an SI value to the named unit (for printing). Throws unit_error for
/// a unit not in unit_table() (a programming error: the callers name literal units).
double from_si(double value_si, std::string_view unit_symbol);

}  // namespace counterflux::tool

#endif  // COUNTERFLUX_TOOLS_UNITS_PARSE_HPP
