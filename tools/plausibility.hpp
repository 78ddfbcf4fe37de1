// tools/plausibility.hpp - the ranges of input values the command accepts
// before it hands them to the library, and the Chapman-Enskog fit-range check.
//
// The library takes any finite positive value and flags what it cannot compute;
// the command refuses implausible values earlier, at the key or flag that holds
// them, so that a message names the key and the range instead of reporting a
// non-finite intermediate somewhere in the model.
#ifndef COUNTERFLUX_TOOLS_PLAUSIBILITY_HPP
#define COUNTERFLUX_TOOLS_PLAUSIBILITY_HPP

#include <optional>
#include <string>

#include <counterflux/gases.hpp>

namespace counterflux::tool {

/// A range of accepted SI values with the words that describe it.
struct value_range {
    double low;            ///< SI
    double high;           ///< SI
    bool low_inclusive;    ///< low itself is accepted
    bool high_inclusive;   ///< high itself is accepted
    const char* rule;      ///< for sensor-file messages: "a length from 1 nm to 1 m"
    const char* span;      ///< for flag messages: "1 nm .. 1 m"
    const char* why;       ///< the reason, or "" ("the fit range of the diffusivity correlations")

    /// True when v (finite) lies in the range.
    bool contains(double v) const noexcept;

    /// "expected RULE (WHY)", for a sensor-file key.
    std::string expected() const;

    /// "outside SPAN (WHY)", for a flag.
    std::string outside() const;
};

// The ranges are common practice, not a published limit: they keep every
// value where the models of the library hold and far from overflow.

/// Lengths, diameters and thicknesses of barrier elements: 1 nm to 1 m.
extern const value_range length_range;
/// Areas of porous and membrane elements: 1e-12 m2 to 1 m2.
extern const value_range area_range;
/// Porosity of a porous element: 1e-4 to 1 (a subnormal porosity would pass a
/// plain "above zero" check and overflow the element's resistivity).
extern const value_range porosity_range;
/// Temperatures (reference, table axes, measured-value condition, --temperature):
/// 100 K to 1000 K, the range the Chapman-Enskog / Neufeld and Fuller fits were
/// made over and where the background stays a low-density gas.
extern const value_range temperature_range;
/// Pressures (reference, table axes, measured-value condition, --pressure):
/// 100 Pa to 10000 kPa (1e7 Pa; the messages print kPa, MPa is not an accepted
/// unit); the models are for a low-density gas (D ~ 1/P).
extern const value_range pressure_range;
/// Membrane permeability: from 1e-6 Barrer (3.3464e-22 mol/(m s Pa)) to below 1e-6 mol/(m s Pa) (some 3e9 Barrer).
extern const value_range permeability_range;
/// Membrane activation energy: magnitude below 500 kJ/mol.
extern const value_range activation_energy_range;
/// A target concentration (--concentration): 0 to 100 %.
extern const value_range concentration_range;

/// The Neufeld-Janzen-Aziz fit range of the collision integral, 0.3 <= T* <= 100.
inline constexpr double neufeld_fit_low = 0.3;
inline constexpr double neufeld_fit_high = 100.0;

/// T* = T / sqrt(eps_a eps_b) (eps as eps/k in K, from the gas table).
double reduced_temperature(const counterflux::gas_data& a, const counterflux::gas_data& b, double temperature_K);

/// When T* of the pair at temperature_K lies outside the Neufeld fit range, a
/// sentence that says so ("the reduced temperature T* = ... is outside ...");
/// otherwise nothing.
std::optional<std::string> chapman_enskog_fit_problem(const counterflux::gas_data& a,
                                                      const counterflux::gas_data& b, double temperature_K);

}  // namespace counterflux::tool

#endif  // COUNTERFLUX_TOOLS_PLAUSIBILITY_HPP
