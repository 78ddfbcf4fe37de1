// tools/report.hpp - shared output helpers: number formatting for the human
// reports and JSON text, and the one place that decides where output goes
// (standard output, or a file through the atomic writer).
#ifndef COUNTERFLUX_TOOLS_REPORT_HPP
#define COUNTERFLUX_TOOLS_REPORT_HPP

#include <iosfwd>
#include <optional>
#include <string>

#include <nlohmann/json.hpp>

namespace counterflux::tool {

/// v with the given significant digits ("%.*g").
std::string format_number(double v, int digits = 4);

/// v with a sign always shown ("+0.256").
std::string format_signed(double v, int digits = 3);

/// A mole fraction in the most readable of ppb, ppm, % ("500 ppm", "20.9 %").
std::string format_concentration(double mol_mol, int digits = 4);

/// A current in the most readable of nA, uA, mA, A.
std::string format_current(double ampere, int digits = 4);

/// A temperature as "20 C (293.15 K)".
std::string format_temperature(double kelvin);

/// A pressure as "101.325 kPa".
std::string format_pressure(double pascal);

/// A length in the most readable of nm, um, mm, m.
std::string format_length(double metre, int digits = 3);

/// JSON document text, indented, with a final newline. Non-finite numbers are
/// a programming error here (JSON has none); they throw run_error.
std::string json_text(const nlohmann::json& document);

/// Sends content to out_path through atomic_write when given, else to stdout.
void emit(const std::string& content, const std::optional<std::string>& out_path, std::ostream& stdout_stream);

}  // namespace counterflux::tool

#endif  // COUNTERFLUX_TOOLS_REPORT_HPP
