// tools/plausibility.cpp - see plausibility.hpp.
#include "plausibility.hpp"

#include <cmath>
#include <cstdio>

namespace counterflux::tool {

bool value_range::contains(double v) const noexcept {
    if (!std::isfinite(v)) return false;
    const bool above_low = low_inclusive ? v >= low : v > low;
    const bool below_high = high_inclusive ? v <= high : v < high;
    return above_low && below_high;
}

std::string value_range::expected() const {
    std::string out = std::string("expected ") + rule;
    if (why[0] != '\0') out += std::string(" (") + why + ")";
    return out;
}

std::string value_range::outside() const {
    std::string out = std::string("outside ") + span;
    if (why[0] != '\0') out += std::string(" (") + why + ")";
    return out;
}

// Common practice, not a published limit (see the header).
const value_range length_range{1.0e-9, 1.0, true, true, "a length from 1 nm to 1 m", "1 nm .. 1 m", ""};
const value_range area_range{1.0e-12, 1.0, true, true, "an area from 1e-12 m2 to 1 m2", "1e-12 m2 .. 1 m2", ""};
const value_range porosity_range{1.0e-4, 1.0, true, true, "a porosity from 1e-4 to 1", "1e-4 .. 1", ""};
const value_range temperature_range{100.0, 1000.0, true, true, "a temperature from 100 K to 1000 K", "100 K .. 1000 K",
                                    "the range of the diffusivity correlations"};
const value_range pressure_range{100.0, 1.0e7, true, true, "a pressure from 100 Pa to 10000 kPa", "100 Pa .. 10000 kPa",
                                 "a low-density gas, D ~ 1/P"};
// 1e-6 Barrer (3.3e-22 mol/(m s Pa)) is far below any gas-separation film;
// 1e-6 mol/(m s Pa) (some 3e9 Barrer) far above (common practice, no source).
const value_range permeability_range{3.3464e-22, 1.0e-6, true, false,
                                     "a permeability from 1e-6 Barrer (3.3464e-22 mol/(m s Pa)) to below 1e-6 mol/(m s Pa)",
                                     "3.3464e-22 .. 1e-6 mol/(m s Pa), the upper end excluded", ""};
const value_range activation_energy_range{-5.0e5, 5.0e5, false, false, "a molar energy of magnitude below 500 kJ/mol",
                                          "-500 kJ/mol .. 500 kJ/mol, both excluded", ""};
const value_range concentration_range{0.0, 1.0, true, true, "a concentration from 0 to 100 %", "0 .. 100 %", ""};

double reduced_temperature(const counterflux::gas_data& a, const counterflux::gas_data& b, double temperature_K) {
    const double eps = std::sqrt(static_cast<double>(a.lj_epsilon_over_k_K) * static_cast<double>(b.lj_epsilon_over_k_K));
    return temperature_K / eps;
}

std::optional<std::string> chapman_enskog_fit_problem(const counterflux::gas_data& a,
                                                      const counterflux::gas_data& b, double temperature_K) {
    const double t_star = reduced_temperature(a, b, temperature_K);
    if (t_star >= neufeld_fit_low && t_star <= neufeld_fit_high) return std::nullopt;
    char text[320];
    std::snprintf(text, sizeof text,
                  "the reduced temperature T* = T / sqrt(eps_%s eps_%s) = %.6g K / sqrt(%.6g K * %.6g K) = %.3g is "
                  "outside the Neufeld fit range 0.3 .. 100 of the Chapman-Enskog collision integral",
                  a.formula, b.formula, temperature_K, static_cast<double>(a.lj_epsilon_over_k_K),
                  static_cast<double>(b.lj_epsilon_over_k_K), t_star);
    return std::string(text);
}

}  // namespace counterflux::tool
