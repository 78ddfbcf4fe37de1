// Compile-time checks: everything the library declares constexpr is evaluated
// here inside static_assert, so a regression that makes it non-constant (or
// wrong) breaks the build of the unit tests. The TEST_CASE at the end only
// repeats a few of them at run time so that the file shows up in the test
// report.
#include <doctest/doctest.h>

#include <cstddef>
#include <limits>

#include <counterflux/barrier.hpp>
#include <counterflux/constants.hpp>
#include <counterflux/diffusivity.hpp>
#include <counterflux/flux.hpp>
#include <counterflux/gases.hpp>
#include <counterflux/series.hpp>
#include <counterflux/signal.hpp>
#include <counterflux/status.hpp>
#include <counterflux/units.hpp>

namespace cf = counterflux;

namespace {

// |a - b| <= rel * |b|, usable in constant expressions.
constexpr bool close(double a, double b, double rel) {
    const double d = a - b;
    const double m = b < 0.0 ? -b : b;
    return (d < 0.0 ? -d : d) <= rel * m;
}

// Plain C-string equality, independent of the library's own helper.
constexpr bool same_text(const char* a, const char* b) {
    if (a == nullptr || b == nullptr) return a == b;
    std::size_t i = 0;
    while (a[i] != '\0' && a[i] == b[i])
        ++i;
    return a[i] == b[i];
}

constexpr double pi = 3.14159265358979323846;  // to 21 digits

// ---------------------------------------------------------------------------
// status: operators, has(), describe(), result
constexpr cf::status both = cf::status::out_of_domain | cf::status::not_finite;
static_assert(cf::has(both, cf::status::out_of_domain), "| keeps the left flag");
static_assert(cf::has(both, cf::status::not_finite), "| keeps the right flag");
static_assert(!cf::has(both, cf::status::unknown_gas), "| adds no other flag");
static_assert(!cf::has(both, cf::status::ok), "has(s, ok) is always false");
static_assert(!cf::has(cf::status::ok, cf::status::ok), "has(ok, ok) is false");
static_assert((cf::status::ok | cf::status::ok) == cf::status::ok, "ok is the identity of |");
static_assert((cf::status::below_range | cf::status::ok) == cf::status::below_range,
              "ok is the identity of |");
static_assert((cf::status::above_range | cf::status::above_range) == cf::status::above_range,
              "| is idempotent");
static_assert((cf::status::not_converged | cf::status::unknown_gas) ==
                  (cf::status::unknown_gas | cf::status::not_converged),
              "| commutes");

constexpr cf::status accumulate_flags() {
    cf::status s = cf::status::ok;
    s |= cf::status::below_range;
    s |= cf::status::not_converged;
    s |= cf::status::below_range;
    return s;
}
static_assert(accumulate_flags() == (cf::status::below_range | cf::status::not_converged),
              "|= accumulates");

// The flags are distinct single bits.
constexpr cf::status all_flags[] = {cf::status::out_of_domain, cf::status::not_finite,
                                    cf::status::not_converged, cf::status::unknown_gas,
                                    cf::status::below_range,   cf::status::above_range};
constexpr bool distinct_single_bits() {
    unsigned seen = 0u;
    for (const cf::status f : all_flags) {
        const unsigned bit = static_cast<unsigned>(f);
        if (bit == 0u || (bit & (bit - 1u)) != 0u || (seen & bit) != 0u) return false;
        seen |= bit;
    }
    return true;
}
static_assert(static_cast<unsigned>(cf::status::ok) == 0u, "ok has no bit set");
static_assert(distinct_single_bits(), "each flag is its own bit");

static_assert(same_text(cf::describe(cf::status::ok), "ok"), "describe(ok) is \"ok\"");
static_assert(!same_text(cf::describe(cf::status::unknown_gas), "ok"), "a flag has its own text");
// The lowest set flag wins.
static_assert(same_text(cf::describe(both), cf::describe(cf::status::out_of_domain)),
              "describe names the lowest flag");

static_assert(cf::make_result(2.5).ok(), "make_result defaults to ok");
static_assert(cf::make_result(2.5).value == 2.5, "make_result keeps the value");
static_assert(!cf::make_result(0.0, cf::status::below_range).ok(), "a flagged result is not ok");
static_assert(cf::result<int>{3, cf::status::ok}.ok(), "result<int> is a literal type");

// ---------------------------------------------------------------------------
// constants (BIPM SI Brochure, 9th ed., 2019: k_B = 1.380649e-23 J/K,
// N_A = 6.02214076e23 /mol, e = 1.602176634e-19 C, all exact; R = N_A k_B,
// F = N_A e)
static_assert(cf::boltzmann_J_K<double> == 1.380649e-23, "k_B exact (SI 2019)");
static_assert(cf::avogadro_per_mol<double> == 6.02214076e23, "N_A exact (SI 2019)");
static_assert(close(cf::gas_constant_J_mol_K<double>, 6.02214076e23 * 1.380649e-23, 1e-15),
              "R = N_A k_B");
static_assert(close(cf::faraday_C_mol<double>, 6.02214076e23 * 1.602176634e-19, 1e-15),
              "F = N_A e");
static_assert(close(cf::gas_constant_J_mol_K<double>, 8.314462618, 1e-9),
              "R as quoted to 10 digits (SI 2019; docs/models.md sec. 0)");
static_assert(close(cf::faraday_C_mol<double>, 96485.33212, 1e-10),
              "F as quoted to 10 digits (SI 2019; docs/models.md sec. 0)");
static_assert(cf::standard_atmosphere_Pa<double> == 101325.0, "standard atmosphere (ISO 2533)");
static_assert(cf::ice_point_K<double> == 273.15, "0 degC = 273.15 K by definition");
static_assert(close(cf::pi_v<double>, pi, 1e-16), "pi");
static_assert(cf::gas_constant_J_mol_K<float> == static_cast<float>(8.31446261815324),
              "float constants exist");

// ---------------------------------------------------------------------------
// units: degC <-> K (273.15 K offset by definition of the Celsius scale)
static_assert(cf::celsius_to_kelvin(25.0) == 298.15, "25 degC = 298.15 K");
static_assert(cf::celsius_to_kelvin(0.0) == 273.15, "0 degC = 273.15 K");
static_assert(cf::celsius_to_kelvin(20.0) == 293.15, "20 degC = 293.15 K");
static_assert(cf::celsius_to_kelvin(-273.15) == 0.0, "absolute zero");
static_assert(cf::kelvin_to_celsius(298.15) == 25.0, "298.15 K = 25 degC");
static_assert(cf::kelvin_to_celsius(273.15) == 0.0, "273.15 K = 0 degC");
static_assert(cf::celsius_to_kelvin(25.0f) == 298.15f, "float: 25 degC = 298.15 K");
static_assert(cf::atm_Pa<double> == 101325.0, "1 atm = 101325 Pa (definition)");
static_assert(cf::bar_Pa<double> == 1.0e5, "1 bar = 1e5 Pa (definition)");
static_assert(close(cf::cmHg_Pa<double> * 76.0, 101325.0, 1e-15), "76 cmHg = 1 atm (conventional)");
static_assert(cf::ppm<double> == 1.0e-6 && cf::ppb<double> == 1.0e-9, "ppm, ppb as mole fractions");
static_assert(cf::cm2_per_s_m2_per_s<double> == 1.0e-4, "1 cm2 = 1e-4 m2");
// 1 A per mol/mol = 1e9 nA per 1e6 ppm = 1000 nA/ppm.
static_assert(close(cf::to_nA_per_ppm(1.0), 1000.0, 1e-15), "1 A/(mol/mol) = 1000 nA/ppm");
static_assert(close(cf::to_nA_per_ppm(2.5e-3), 2.5, 1e-15), "2.5 mA/(mol/mol) = 2.5 nA/ppm");
// Molar volume of an ideal gas at 273.15 K, 101325 Pa: 22.413969... L/mol
// (CODATA 2018 recommended value 22.413 969 54 L/mol, from memory).
static_assert(close(1.0 / cf::mol_per_cm3_stp<double>, 22413.96954, 1e-9), "molar volume at STP");
// 1 Barrer = 3.346e-16 mol/(m s Pa) (from its definition 1e-10 cm3(STP) cm /
// (cm2 s cmHg); 4 significant digits).
static_assert(close(cf::barrer_mol_m_s_Pa<double>, 3.346e-16, 1e-3), "1 Barrer in SI");

// ---------------------------------------------------------------------------
// gases: find_gas at compile time
static_assert(cf::gas_count >= 16, "docs/models.md sec. 3 lists at least 16 gases");
static_assert(cf::find_gas("O2").ok(), "O2 is in the table");
static_assert(cf::find_gas("O2").value == cf::find_gas("oxygen").value,
              "formula and name find the same row");
static_assert(cf::find_gas("co").code == cf::status::unknown_gas, "formulas are case-sensitive");
static_assert(cf::find_gas("Co").value == nullptr, "Co (cobalt) is not CO");
static_assert(cf::find_gas("Carbon Monoxide").value == cf::find_gas("CO").value,
              "case-insensitive name");
static_assert(cf::find_gas("AIR").ok(), "air, any case");
static_assert(cf::find_gas("Xx").code == cf::status::unknown_gas, "unknown formula");
static_assert(cf::find_gas("Xx").value == nullptr, "unknown formula gives nullptr");
static_assert(cf::find_gas("").code == cf::status::unknown_gas, "empty name");
static_assert(cf::find_gas(nullptr).code == cf::status::unknown_gas, "null name");
static_assert(cf::find_gas(nullptr).value == nullptr, "null name gives nullptr");
static_assert(cf::find_gas("O").code == cf::status::unknown_gas, "a prefix is not a match");
static_assert(cf::find_gas("O2 ").code == cf::status::unknown_gas, "no trimming");
static_assert(same_text(cf::find_gas("NO").value->formula, "NO"), "NO is nitric oxide");
static_assert(cf::find_gas("no2").value == nullptr, "no2 is not a formula");
static_assert(same_text(cf::find_gas("Nitrogen Dioxide").value->formula, "NO2"), "names fold case");

// Every gas docs/models.md sec. 3 lists is present.
constexpr const char* required_gases[] = {"O2",  "N2", "air", "CO",  "CO2", "H2",  "H2O", "CH4",
                                          "H2S", "NO", "NO2", "SO2", "NH3", "Cl2", "He",  "Ar"};
constexpr bool all_required_present() {
    for (const char* g : required_gases)
        if (!cf::find_gas(g).ok()) return false;
    return true;
}
static_assert(all_required_present(),
              "O2, N2, air, CO, CO2, H2, H2O, CH4, H2S, NO, NO2, SO2, NH3, Cl2, He, Ar");

// Every row is found by its own formula and by its own name, and has
// positive data.
constexpr bool table_self_consistent() {
    for (std::size_t i = 0; i < cf::gas_count; ++i) {
        const cf::gas_data& g = cf::gas_table[i];
        if (cf::find_gas(g.formula).value != &cf::gas_table[i]) return false;
        if (cf::find_gas(g.name).value == nullptr) return false;
        if (!(g.molar_mass_g_mol > 0.0f && g.diffusion_volume > 0.0f && g.lj_sigma_angstrom > 0.0f &&
              g.lj_epsilon_over_k_K > 0.0f && g.kinetic_diameter_angstrom > 0.0f))
            return false;
    }
    return true;
}
static_assert(table_self_consistent(), "each row found by formula and name, all data positive");

// Molar masses against IUPAC standard atomic weights (conventional values:
// H 1.008, C 12.011, N 14.007, O 15.999; CIAAW 2013, from memory).
static_assert(close(static_cast<double>(cf::find_gas("O2").value->molar_mass_g_mol), 2 * 15.999, 1e-4), "M(O2)");
static_assert(close(static_cast<double>(cf::find_gas("CO").value->molar_mass_g_mol), 12.011 + 15.999, 1e-4), "M(CO)");
static_assert(close(static_cast<double>(cf::find_gas("CO2").value->molar_mass_g_mol), 12.011 + 2 * 15.999, 1e-4),
              "M(CO2)");
static_assert(close(static_cast<double>(cf::find_gas("H2O").value->molar_mass_g_mol), 2 * 1.008 + 15.999, 1e-4),
              "M(H2O)");
static_assert(close(static_cast<double>(cf::find_gas("CH4").value->molar_mass_g_mol), 12.011 + 4 * 1.008, 1e-4),
              "M(CH4)");
static_assert(close(static_cast<double>(cf::find_gas("N2").value->molar_mass_g_mol), 2 * 14.007, 1e-4), "M(N2)");
static_assert(close(cf::molar_mass_kg_mol<double>(*cf::find_gas("O2").value), 2 * 15.999e-3, 1e-4),
              "kg/mol");
static_assert(close(cf::kinetic_diameter_m<double>(*cf::find_gas("O2").value),
                    static_cast<double>(cf::find_gas("O2").value->kinetic_diameter_angstrom) * 1.0e-10, 1e-15),
              "angstrom to m");

// ---------------------------------------------------------------------------
// diffusivity: names
static_assert(same_text(cf::method_name(cf::diffusivity_method::fuller), "fuller"), "method name");
static_assert(same_text(cf::method_name(cf::diffusivity_method::chapman_enskog), "chapman-enskog"),
              "method name");
static_assert(same_text(cf::method_name(cf::diffusivity_method::measured), "measured"),
              "method name");
static_assert(cf::detail::check_condition(300.0, 1.0e5) == cf::status::ok, "a valid condition");
static_assert(cf::detail::check_condition(0.0, 1.0e5) == cf::status::out_of_domain, "T = 0");
static_assert(cf::detail::check_condition(300.0, -1.0) == cf::status::out_of_domain, "P < 0");
static_assert(cf::detail::check_condition(std::numeric_limits<double>::quiet_NaN(), 1.0e5) ==
                  cf::status::not_finite,
              "NaN T");
static_assert(cf::detail::check_condition(300.0, std::numeric_limits<double>::infinity()) ==
                  cf::status::not_finite,
              "inf P");
static_assert(cf::detail::finite(1.0) &&
                  !cf::detail::finite(std::numeric_limits<double>::infinity()) &&
                  !cf::detail::finite(-std::numeric_limits<double>::infinity()) &&
                  !cf::detail::finite(std::numeric_limits<double>::quiet_NaN()),
              "finite() at compile time");

// ---------------------------------------------------------------------------
// flux: flux ratio, Bosanquet, gas_element
static_assert(cf::alpha_from_flux_ratio(cf::equimolar_flux_ratio<double>) == 0.0,
              "equimolar: alpha = 0");
static_assert(cf::alpha_from_flux_ratio(cf::stagnant_flux_ratio<double>) == 1.0,
              "stagnant: alpha = 1");
static_assert(cf::alpha_from_flux_ratio(-2.0) == -1.0,
              "r = -2: alpha = -1 (docs/models.md sec. 1)");
// Bosanquet: 1/D = 1/D_AB + 1/D_K (Mason & Malinauskas 1983; docs/models.md sec. 1).
static_assert(cf::bosanquet_diffusivity(2.0, 2.0).value == 1.0, "two equal resistances in series");
static_assert(close(cf::bosanquet_diffusivity(1.0e-5, 4.0e-5).value, 1.0 / (1.0 / 1.0e-5 + 1.0 / 4.0e-5),
                    1e-15),
              "Bosanquet");
static_assert(close(cf::bosanquet_diffusivity(3.0e-5, std::numeric_limits<double>::infinity()).value,
                    3.0e-5, 1e-15),
              "D_K -> inf leaves D_AB");
static_assert(cf::bosanquet_diffusivity(-1.0, 2.0).code == cf::status::out_of_domain, "D must be > 0");

constexpr cf::element_transport<double> ge =
    cf::gas_element(2.0e-5, std::numeric_limits<double>::infinity(), 1.0e-3);
static_assert(ge.area_m2 == 1.0 && ge.length_m == 1.0e-3, "unit area, given length");
static_assert(ge.inv_molecular_s_m2 == 1.0 / 2.0e-5 && ge.inv_linear_s_m2 == 0.0,
              "r_m = 1/D, r_l = 1/inf = 0");
static_assert(cf::detail::check_element(ge) == cf::status::ok, "a valid element");
static_assert(cf::detail::check_element(cf::gas_element(2.0e-5, 1.0e-4, -1.0)) ==
                  cf::status::out_of_domain,
              "negative length");

// ---------------------------------------------------------------------------
// barrier: construction, validation, geometry
constexpr double bore = 0.15e-3;
constexpr double len = 1.2e-3;
constexpr cf::barrier<double> cap = cf::make_capillary(bore, len);
static_assert(cap.kind == cf::barrier_kind::capillary && cap.count == 1u && cap.end_correction &&
                  cap.knudsen,
              "defaults: one bore, end correction and Knudsen on");
static_assert(cf::validate(cap) == cf::status::ok, "a valid capillary");
// Area of n bores: n pi d^2 / 4 (docs/models.md sec. 2).
static_assert(close(cf::barrier_area_m2(cap), pi* bore* bore / 4.0, 1e-15), "capillary area");
static_assert(close(cf::barrier_area_m2(cf::make_capillary(bore, len, 7u)),
                    7.0 * pi * bore * bore / 4.0, 1e-15),
              "area of 7 bores");
// Effective length: L + pi d / 8 per open end, two ends (Brown & Escombe 1900;
// docs/models.md sec. 2).
static_assert(close(cf::effective_length_m(cap), len + 2.0 * pi * bore / 8.0, 1e-15),
              "end corrections");
static_assert(cf::effective_length_m(cf::make_capillary(bore, len, 1u, false)) == len,
              "no end correction");

constexpr cf::barrier<double> plug = cf::make_porous(2.0e-3, 3.0e-5, 0.4, 2.0, 1.0e-6);
static_assert(cf::validate(plug) == cf::status::ok, "a valid porous plug");
static_assert(cf::barrier_area_m2(plug) == 3.0e-5 && cf::effective_length_m(plug) == 2.0e-3,
              "porous geometry");
static_assert(cf::validate(cf::make_porous(2.0e-3, 3.0e-5, 0.0, 2.0, 1.0e-6)) ==
                  cf::status::out_of_domain,
              "porosity 0");
static_assert(cf::validate(cf::make_porous(2.0e-3, 3.0e-5, 1.5, 2.0, 1.0e-6)) ==
                  cf::status::out_of_domain,
              "porosity 1.5");
static_assert(cf::validate(cf::make_porous(2.0e-3, 3.0e-5, 0.4, 0.5, 1.0e-6)) ==
                  cf::status::out_of_domain,
              "tortuosity 0.5");
static_assert(cf::validate(cf::make_porous(2.0e-3, 3.0e-5, 0.4, 2.0, 0.0, false)) == cf::status::ok,
              "no pore diameter needed without Knudsen");

constexpr cf::barrier<double> film = cf::make_membrane(25.0e-6, 1.0e-5, 1.0e-15, 2.0e4, 298.15);
static_assert(cf::validate(film) == cf::status::ok, "a valid membrane");
static_assert(cf::barrier_area_m2(film) == 1.0e-5 && cf::effective_length_m(film) == 25.0e-6,
              "membrane geometry");
static_assert(cf::validate(cf::make_membrane(25.0e-6, 0.0, 1.0e-15, 2.0e4, 298.15)) ==
                  cf::status::out_of_domain,
              "zero area");

static_assert(cf::validate(cf::make_capillary(-1.0e-4, len)) == cf::status::out_of_domain,
              "negative diameter");
static_assert(cf::validate(cf::make_capillary(0.0, len)) == cf::status::out_of_domain,
              "zero diameter");
static_assert(cf::validate(cf::make_capillary(bore, -len)) == cf::status::out_of_domain,
              "negative length");
static_assert(cf::validate(cf::make_capillary(bore, len, 0u)) == cf::status::out_of_domain,
              "no bores");
static_assert(cf::validate(cf::make_capillary(std::numeric_limits<double>::quiet_NaN(), len)) ==
                  cf::status::not_finite,
              "NaN diameter");
// A bare orifice (L = 0) is its end corrections alone.
static_assert(cf::validate(cf::make_capillary(bore, 0.0)) == cf::status::ok,
              "orifice with end correction");
static_assert(cf::validate(cf::make_capillary(bore, 0.0, 1u, false)) == cf::status::out_of_domain,
              "orifice without end correction has no length");

static_assert(same_text(cf::kind_name(cf::barrier_kind::capillary), "capillary"), "kind name");
static_assert(same_text(cf::kind_name(cf::barrier_kind::porous), "porous"), "kind name");
static_assert(same_text(cf::kind_name(cf::barrier_kind::membrane), "membrane"), "kind name");

constexpr cf::barrier<float> cap_f = cf::make_capillary(1.0e-4f, 1.0e-3f);
static_assert(cf::validate(cap_f) == cf::status::ok, "float capillary");

// ---------------------------------------------------------------------------
// series: push at compile time
constexpr cf::series<double, 2> two_elements() {
    cf::series<double, 2> s{};
    s.count = 0;
    cf::push(s, plug);
    cf::push(s, cap);
    return s;
}
static_assert(two_elements().count == 2, "two pushes");
static_assert(two_elements().elements[0].kind == cf::barrier_kind::porous, "outside first");
static_assert(two_elements().elements[1].kind == cf::barrier_kind::capillary,
              "electrode side last");

constexpr cf::status push_onto_full() {
    cf::series<double, 2> s = two_elements();
    return cf::push(s, film);
}
static_assert(push_onto_full() == cf::status::out_of_domain, "push onto a full series");

constexpr std::size_t count_after_full_push() {
    cf::series<double, 2> s = two_elements();
    cf::push(s, film);
    return s.count;
}
static_assert(count_after_full_push() == 2, "a full series is unchanged");

// Dilute resistance L (r_m + r_l) / (c A), s/mol.
constexpr cf::element_transport<double> et{2.0e-6, 1.0e-3, 5.0e4, 1.0e4, 0.0};
static_assert(close(cf::dilute_resistance_s_per_mol(et, 40.0), 1.0e-3 * 6.0e4 / (40.0 * 2.0e-6),
                    1e-15),
              "dilute resistance");
constexpr cf::series_transport<double, 3> three() {
    cf::series_transport<double, 3> st{};
    st.elements[0] = et;
    st.elements[1] = et;
    st.elements[2] = et;
    st.count = 3;
    st.total_concentration_mol_m3 = 40.0;
    st.alpha = 0.0;
    return st;
}
static_assert(close(cf::dilute_resistance_s_per_mol(three()),
                    3.0 * 1.0e-3 * 6.0e4 / (40.0 * 2.0e-6), 1e-15),
              "resistances add in series");

// ---------------------------------------------------------------------------
// signal: make_sensor and model validation at compile time
constexpr const cf::gas_data* gas_co = cf::find_gas("CO").value;
constexpr const cf::gas_data* gas_air = cf::find_gas("air").value;

// make_sensor with its defaults: Fuller from the two gases, measured fields 0,
// no barrier, a mole-fraction reading.
constexpr cf::sensor_model<double, 2> fresh =
    cf::make_sensor<double, 2>(gas_co, gas_air, 2u, cf::equimolar_flux_ratio<double>, 293.15, 101325.0);
static_assert(fresh.target == gas_co && fresh.background == gas_air, "gases as given");
static_assert(fresh.diffusivity.method == cf::diffusivity_method::fuller, "Fuller by default");
static_assert(fresh.diffusivity.a == gas_co && fresh.diffusivity.b == gas_air,
              "the diffusivity model names the same two gases");
static_assert(fresh.diffusivity.measured_m2_s == 0.0 && fresh.diffusivity.measured_temperature_K == 0.0 &&
                  fresh.diffusivity.measured_pressure_Pa == 0.0 && fresh.diffusivity.measured_exponent == 0.0,
              "measured fields 0");
static_assert(fresh.barriers.count == 0, "no barrier yet");
static_assert(fresh.electrons == 2u && fresh.flux_ratio == -1.0, "electrons and flux ratio as given");
static_assert(fresh.reading == cf::reading_kind::mole_fraction, "mole fraction by default");
static_assert(fresh.reference_temperature_K == 293.15 && fresh.reference_pressure_Pa == 101325.0,
              "reference condition as given");
static_assert(cf::validate(fresh) == cf::status::out_of_domain, "not valid before a barrier is pushed");

// Every argument given, in float.
constexpr cf::sensor_model<float, 3> fresh_f = cf::make_sensor<float, 3>(
    cf::find_gas("O2").value, cf::find_gas("N2").value, 4u, cf::stagnant_flux_ratio<float>, 298.15f, 95000.0f,
    cf::diffusivity_method::chapman_enskog, cf::reading_kind::partial_pressure);
static_assert(fresh_f.diffusivity.method == cf::diffusivity_method::chapman_enskog, "method as given");
static_assert(fresh_f.diffusivity.a == cf::find_gas("O2").value && fresh_f.diffusivity.b == cf::find_gas("N2").value,
              "gases of the diffusivity model");
static_assert(fresh_f.reading == cf::reading_kind::partial_pressure, "reading as given");
static_assert(fresh_f.electrons == 4u && fresh_f.flux_ratio == 0.0f && fresh_f.barriers.count == 0,
              "electrons, flux ratio, no barrier");
static_assert(fresh_f.reference_temperature_K == 298.15f && fresh_f.reference_pressure_Pa == 95000.0f,
              "float reference condition");

constexpr cf::sensor_model<double, 2> co_sensor(const char* target, const char* background,
                                                unsigned electrons) {
    cf::sensor_model<double, 2> m = cf::make_sensor<double, 2>(
        cf::find_gas(target).value, cf::find_gas(background).value, electrons,
        cf::equimolar_flux_ratio<double>, 293.15, 101325.0);
    cf::push(m.barriers, cap);
    return m;
}
static_assert(cf::validate(co_sensor("CO", "air", 2u)) == cf::status::ok, "a valid sensor");
static_assert(cf::validate(co_sensor("CO", "CO", 2u)) == cf::status::out_of_domain,
              "target == background");
static_assert(cf::validate(co_sensor("Xx", "air", 2u)) == cf::status::unknown_gas,
              "unknown target");
static_assert(cf::validate(co_sensor("CO", "air", 0u)) == cf::status::out_of_domain,
              "no electrons");

}  // namespace

TEST_CASE("constexpr: the compile-time checks also hold at run time") {
    // The static_asserts above are the test; these repeat a sample at run
    // time (with values the optimiser cannot fold) so the file reports.
    volatile double celsius = 25.0;
    CHECK(cf::celsius_to_kelvin(static_cast<double>(celsius)) == 298.15);
    const char* volatile name = "oxygen";
    const auto g = cf::find_gas(name);
    REQUIRE(g.ok());
    CHECK(same_text(g.value->formula, "O2"));
    CHECK(cf::find_gas(static_cast<const char*>(nullptr)).code == cf::status::unknown_gas);
    cf::status s = cf::status::ok;
    s |= cf::status::above_range;
    CHECK(cf::has(s, cf::status::above_range));
    CHECK_FALSE(cf::has(s, cf::status::below_range));
    CHECK(two_elements().count == 2);
    // make_sensor at run time, from a gas looked up at run time.
    const cf::sensor_model<double, 2> m =
        cf::make_sensor<double, 2>(g.value, gas_air, 4u, cf::stagnant_flux_ratio<double>, 293.15, 101325.0);
    CHECK(m.diffusivity.a == g.value);
    CHECK(m.barriers.count == 0);
    CHECK(cf::validate(co_sensor("CO", "air", 2u)) == cf::status::ok);
}
