// The one unit parser: every accepted unit with its factor, the strict number
// grammar, and the spellings it must refuse.
#include <doctest/doctest.h>

#include <cmath>
#include <limits>
#include <set>
#include <string>
#include <vector>

#include <counterflux/units.hpp>

#include "plausibility.hpp"
#include "units_parse.hpp"

using counterflux::tool::parse_number;
using counterflux::tool::parse_options;
using counterflux::tool::parse_quantity;
using counterflux::tool::quantity_kind;
using counterflux::tool::unit_error;

namespace {

struct expected_unit {
    const char* text;     // "1 <unit>" as a user writes it
    quantity_kind kind;
    double si;            // what it must be in SI
};

// The accepted list of the interface contract, written out independently of
// the parser's own table, with each conversion from its definition.
const std::vector<expected_unit> contract = {
    {"1 K", quantity_kind::temperature, 1.0},
    {"25 C", quantity_kind::temperature, 298.15},
    {"25 degC", quantity_kind::temperature, 298.15},
    {"1 Pa", quantity_kind::pressure, 1.0},
    {"1 hPa", quantity_kind::pressure, 100.0},
    {"1 kPa", quantity_kind::pressure, 1000.0},
    {"1 mbar", quantity_kind::pressure, 100.0},
    {"1 bar", quantity_kind::pressure, 1.0e5},
    {"1 atm", quantity_kind::pressure, 101325.0},
    {"1 m", quantity_kind::length, 1.0},
    {"1 mm", quantity_kind::length, 1.0e-3},
    {"1 um", quantity_kind::length, 1.0e-6},
    {"1 nm", quantity_kind::length, 1.0e-9},
    {"1 m2", quantity_kind::area, 1.0},
    {"1 cm2", quantity_kind::area, 1.0e-4},
    {"1 mm2", quantity_kind::area, 1.0e-6},
    {"1 m3", quantity_kind::volume, 1.0},
    {"1 L", quantity_kind::volume, 1.0e-3},
    {"1 mL", quantity_kind::volume, 1.0e-6},
    {"1 cm3", quantity_kind::volume, 1.0e-6},
    {"1 mm3", quantity_kind::volume, 1.0e-9},
    {"1 L/min", quantity_kind::flow, 1.0e-3 / 60.0},
    {"1 mL/min", quantity_kind::flow, 1.0e-6 / 60.0},
    {"1 mol/mol", quantity_kind::concentration, 1.0},
    {"1 %", quantity_kind::concentration, 0.01},
    {"1 ppm", quantity_kind::concentration, 1.0e-6},
    {"1 ppb", quantity_kind::concentration, 1.0e-9},
    {"1 A", quantity_kind::current, 1.0},
    {"1 mA", quantity_kind::current, 1.0e-3},
    {"1 uA", quantity_kind::current, 1.0e-6},
    {"1 nA", quantity_kind::current, 1.0e-9},
    {"1 m2/s", quantity_kind::diffusivity, 1.0},
    {"1 cm2/s", quantity_kind::diffusivity, 1.0e-4},
    // 1 Barrer = 1e-10 cm3(STP) cm/(cm2 s cmHg) by definition = 3.346e-16 mol/(m s Pa)
    {"1 Barrer", quantity_kind::permeability, 3.346e-16},
    {"1 mol/(m s Pa)", quantity_kind::permeability, 1.0},
    {"1 J/mol", quantity_kind::energy, 1.0},
    {"1 kJ/mol", quantity_kind::energy, 1000.0},
    {"1 s", quantity_kind::time, 1.0},
    {"1 min", quantity_kind::time, 60.0},
    {"1 h", quantity_kind::time, 3600.0},
    {"1 m/s", quantity_kind::velocity, 1.0},  // the electrode rate's documented unit
};

bool rejects(const std::string& text, quantity_kind kind, parse_options options = {}) {
    try {
        (void)parse_quantity(text, kind, options);
        return false;
    } catch (const unit_error&) {
        return true;
    }
}

std::string message_of(const std::string& text, quantity_kind kind) {
    try {
        (void)parse_quantity(text, kind);
    } catch (const unit_error& e) {
        return e.what();
    }
    return "";
}

}  // namespace

TEST_CASE("units: every accepted unit converts to SI with its factor") {
    for (const auto& u : contract) {
        CAPTURE(u.text);
        // 4 significant digits for the Barrer (3.346e-16 is the rounded value),
        // round-off only for the rest.
        const double tolerance = std::string(u.text).find("Barrer") != std::string::npos ? 2e-4 : 1e-12;
        CHECK(parse_quantity(u.text, u.kind) == doctest::Approx(u.si).epsilon(tolerance));
    }
}

TEST_CASE("units: the parser's table is exactly the contract's list") {
    std::set<std::string> wanted;
    for (const auto& u : contract) {
        std::string t = u.text;
        wanted.insert(t.substr(t.find(' ') + 1));
    }
    std::set<std::string> have;
    for (const auto& u : counterflux::tool::unit_table()) have.insert(std::string(u.symbol));
    CHECK(have == wanted);
}

TEST_CASE("units: conversions named in the contract") {
    CHECK(parse_quantity("1 atm", quantity_kind::pressure) == 101325.0);
    CHECK(parse_quantity("25 C", quantity_kind::temperature) == doctest::Approx(298.15).epsilon(1e-15));
    CHECK(parse_quantity("0 C", quantity_kind::temperature) == 273.15);
    CHECK(parse_quantity("-20 degC", quantity_kind::temperature) == doctest::Approx(253.15).epsilon(1e-15));
    CHECK(parse_quantity("1 Barrer", quantity_kind::permeability) == counterflux::barrer_mol_m_s_Pa<double>);
    CHECK(parse_quantity("1 Barrer", quantity_kind::permeability) == doctest::Approx(3.346e-16).epsilon(2e-4));
    CHECK(parse_quantity("0.5 L/min", quantity_kind::flow) == doctest::Approx(8.333333333e-6).epsilon(1e-9));
    CHECK(parse_quantity("1000 ppm", quantity_kind::concentration) == doctest::Approx(1e-3).epsilon(1e-15));
    CHECK(parse_quantity("20.95 %", quantity_kind::concentration) == doctest::Approx(0.2095).epsilon(1e-15));
    CHECK(parse_quantity("83.5 kPa", quantity_kind::pressure) == 83500.0);
}

TEST_CASE("units: a bare number is SI") {
    CHECK(parse_quantity("298.15", quantity_kind::temperature) == 298.15);
    CHECK(parse_quantity("101325", quantity_kind::pressure) == 101325.0);
    CHECK(parse_quantity("1.5e-4", quantity_kind::length) == 1.5e-4);
    CHECK(parse_quantity("0.001", quantity_kind::concentration) == 0.001);
    CHECK(parse_quantity("2", quantity_kind::dimensionless) == 2.0);
}

TEST_CASE("units: number grammar and spacing") {
    CHECK(parse_quantity("0.2mm", quantity_kind::length) == doctest::Approx(2e-4));
    CHECK(parse_quantity("0.2 mm", quantity_kind::length) == doctest::Approx(2e-4));
    CHECK(parse_quantity("  0.2 \t mm  ", quantity_kind::length) == doctest::Approx(2e-4));
    CHECK(parse_quantity(".5 mm", quantity_kind::length) == doctest::Approx(5e-4));
    CHECK(parse_quantity("5. mm", quantity_kind::length) == doctest::Approx(5e-3));
    CHECK(parse_quantity("+5 K", quantity_kind::temperature) == 5.0);
    CHECK(parse_quantity("1E3 Pa", quantity_kind::pressure) == 1000.0);
    CHECK(parse_quantity("1e+3 Pa", quantity_kind::pressure) == 1000.0);
    CHECK(parse_quantity("15e-3 m", quantity_kind::length) == doctest::Approx(0.015));
    CHECK(parse_quantity("-1 mm", quantity_kind::length) == doctest::Approx(-1e-3));  // sign is the key's business
    CHECK(parse_number("3") == 3.0);
    CHECK(parse_number(" -2.5e1 ") == -25.0);
}

TEST_CASE("units: rejected spellings") {
    const quantity_kind length = quantity_kind::length;
    CHECK(rejects("1 MM", length));
    CHECK(rejects("1 Mm", length));
    CHECK(rejects("1 cm", length));  // not in the accepted list
    CHECK(rejects("1 micron", length));
    CHECK(rejects("1 ppm", length));  // right syntax, wrong kind
    CHECK(rejects("1 mm2", length));
    CHECK(rejects("5 kelvin", quantity_kind::temperature));
    CHECK(rejects("5 k", quantity_kind::temperature));
    CHECK(rejects("5 F", quantity_kind::temperature));
    CHECK(rejects("5 Pa", quantity_kind::temperature));
    CHECK(rejects("3 psi", quantity_kind::pressure));
    CHECK(rejects("3 torr", quantity_kind::pressure));
    CHECK(rejects("3 KPa", quantity_kind::pressure));
    CHECK(rejects("1e", length));
    CHECK(rejects("1e+", length));
    CHECK(rejects("1e mm", length));
    CHECK(rejects("", length));
    CHECK(rejects("   ", length));
    CHECK(rejects("mm", length));
    CHECK(rejects("abc", length));
    CHECK(rejects("1.2.3", length));
    CHECK(rejects("1.2.3 mm", length));
    CHECK(rejects("1..2 mm", length));
    CHECK(rejects(".", length));
    CHECK(rejects("-", length));
    CHECK(rejects("--1 mm", length));
    CHECK(rejects("1,5 mm", length));
    CHECK(rejects("0x10", length));
    CHECK(rejects("1 m m", length));
    CHECK(rejects("1 mm mm", length));
    CHECK(rejects("nan", length));
    CHECK(rejects("NaN", length));
    CHECK(rejects("inf", length));
    CHECK(rejects("-inf", length));
    CHECK(rejects("infinity", length));
    CHECK(rejects("1e999 m", length));
    CHECK(rejects("1 Barrers", quantity_kind::permeability));
    CHECK(rejects("1 mol/(m*s*Pa)", quantity_kind::permeability));
    CHECK(rejects("1 L/s", quantity_kind::flow));
    CHECK(rejects("1 sec", quantity_kind::time));
    CHECK(rejects("1 mm", quantity_kind::dimensionless));
    CHECK(rejects("2 %", quantity_kind::dimensionless));
    CHECK_THROWS_AS(parse_number("1 mm"), unit_error);
    CHECK_THROWS_AS(parse_number(""), unit_error);
    CHECK_THROWS_AS(parse_number("nan"), unit_error);
}

TEST_CASE("units: temperatures below absolute zero are refused") {
    CHECK(rejects("-274 C", quantity_kind::temperature));
    CHECK(rejects("-273.16 degC", quantity_kind::temperature));
    CHECK(rejects("-1 K", quantity_kind::temperature));
    CHECK(rejects("-1", quantity_kind::temperature));
    CHECK_FALSE(rejects("-273 C", quantity_kind::temperature));
    CHECK(message_of("-300 C", quantity_kind::temperature).find("absolute zero") != std::string::npos);
}

TEST_CASE("units: infinity only where a key allows it") {
    parse_options allow;
    allow.allow_infinity = true;
    CHECK(parse_quantity("inf", quantity_kind::velocity, allow) == std::numeric_limits<double>::infinity());
    CHECK(parse_quantity("0.01 m/s", quantity_kind::velocity, allow) == 0.01);
    CHECK(rejects("inf", quantity_kind::velocity));
    CHECK(rejects("infinite", quantity_kind::velocity, allow));
    CHECK(rejects("nan", quantity_kind::velocity, allow));
}

TEST_CASE("units: messages name the accepted units of the expected kind") {
    const std::string wrong_kind = message_of("1 ppm", quantity_kind::length);
    CHECK(wrong_kind.find("concentration") != std::string::npos);
    CHECK(wrong_kind.find("m, mm, um, nm") != std::string::npos);
    const std::string unknown = message_of("3 psi", quantity_kind::pressure);
    CHECK(unknown.find("'psi'") != std::string::npos);
    CHECK(unknown.find("Pa, hPa, kPa, mbar, bar, atm") != std::string::npos);
    CHECK(message_of("5 kelvin", quantity_kind::temperature).find("K, C, degC") != std::string::npos);
    CHECK(counterflux::tool::accepted_units(quantity_kind::permeability) == "Barrer, mol/(m s Pa)");
}

TEST_CASE("units: from_si inverts the conversion for printing") {
    CHECK(counterflux::tool::from_si(298.15, "C") == doctest::Approx(25.0));
    CHECK(counterflux::tool::from_si(2e-5, "cm2/s") == doctest::Approx(0.2));
    CHECK(counterflux::tool::from_si(5e-4, "ppm") == doctest::Approx(500.0));
}

TEST_CASE("units: from_si refuses a unit it does not know") {
    CHECK_THROWS_AS(counterflux::tool::from_si(1.0, "furlong"), unit_error);
    CHECK_THROWS_AS(counterflux::tool::from_si(1.0, "MM"), unit_error);
}

TEST_CASE("units: a point needs a digit on one side only") {
    CHECK(parse_number("1.") == 1.0);
    CHECK(parse_number(".5") == 0.5);
    CHECK_THROWS_AS(parse_number("."), unit_error);
    CHECK_THROWS_AS(parse_number("1e"), unit_error);
}

TEST_CASE("units: messages read well") {
    // the article agrees with the kind
    CHECK(message_of("1 mm2", quantity_kind::length).find("'1 mm2' is an area,") != std::string::npos);
    CHECK(message_of("1 mm", quantity_kind::area).find("expected an area (") != std::string::npos);
    CHECK(message_of("1 m2", quantity_kind::length).find("is an area, expected a length (") != std::string::npos);
    CHECK(counterflux::tool::kind_with_article(quantity_kind::energy) == "a molar energy");
    CHECK(counterflux::tool::kind_with_article(quantity_kind::area) == "an area");
    // a plain number is said once
    const std::string plain = message_of("2 %", quantity_kind::dimensionless);
    CHECK(plain.find("expected a plain number (no unit)") != std::string::npos);
    CHECK(plain.find("a plain number (no unit; a plain number)") == std::string::npos);
}

TEST_CASE("units: a number too large for a double is out of range, not malformed") {
    CHECK_THROWS_AS(parse_number("1e999"), counterflux::tool::number_out_of_range);
    CHECK_THROWS_AS(parse_quantity("1e999 m", quantity_kind::length), counterflux::tool::number_out_of_range);
    CHECK_THROWS_AS(parse_quantity("1e308 bar", quantity_kind::pressure), counterflux::tool::number_out_of_range);
    CHECK(message_of("1e999 m", quantity_kind::length).find("out of range") != std::string::npos);
}

TEST_CASE("units: the plausible ranges are printed in units the parser accepts") {
    // Each end of a range's span ("100 Pa .. 10000 kPa") reads back, as a user
    // would type it, to the range's own limit: no unit in a message is one the
    // user could not write.
    struct range_case {
        const counterflux::tool::value_range* range;
        quantity_kind kind;
    };
    const range_case cases[] = {
        {&counterflux::tool::length_range, quantity_kind::length},
        {&counterflux::tool::area_range, quantity_kind::area},
        {&counterflux::tool::porosity_range, quantity_kind::dimensionless},
        {&counterflux::tool::temperature_range, quantity_kind::temperature},
        {&counterflux::tool::pressure_range, quantity_kind::pressure},
        {&counterflux::tool::permeability_range, quantity_kind::permeability},
        {&counterflux::tool::activation_energy_range, quantity_kind::energy},
        {&counterflux::tool::concentration_range, quantity_kind::concentration},
    };
    for (const auto& c : cases) {
        std::string span = c.range->span;
        CAPTURE(span);
        const auto comma = span.find(", ");
        if (comma != std::string::npos) span.resize(comma);  // ", both excluded"
        const auto dots = span.find(" .. ");
        REQUIRE(dots != std::string::npos);
        std::string low = span.substr(0, dots);
        const std::string high = span.substr(dots + 4);
        // "0 .. 100 %": a bare low end takes the high end's unit.
        const auto unit_at = high.find(' ');
        if (low.find(' ') == std::string::npos && unit_at != std::string::npos) low += high.substr(unit_at);
        CHECK(parse_quantity(low, c.kind) == doctest::Approx(c.range->low).epsilon(1e-12));
        CHECK(parse_quantity(high, c.kind) == doctest::Approx(c.range->high).epsilon(1e-12));
    }
    CHECK(std::string(counterflux::tool::pressure_range.rule) == "a pressure from 100 Pa to 10000 kPa");
}
