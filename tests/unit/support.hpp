// Helpers shared by the unit tests: tolerances per type, relative difference,
// gas look-up, exact constants and whole-sensor builders. Header only; the
// tests/unit/*.cpp glob does not compile it on its own. Include it as
// "support.hpp" and bring the names in with using namespace counterflux_test.
#ifndef COUNTERFLUX_TESTS_UNIT_SUPPORT_HPP
#define COUNTERFLUX_TESTS_UNIT_SUPPORT_HPP

#include <doctest/doctest.h>

#include <cmath>
#include <cstddef>
#include <type_traits>

#include <counterflux/barrier.hpp>
#include <counterflux/gases.hpp>
#include <counterflux/series.hpp>
#include <counterflux/signal.hpp>
#include <counterflux/status.hpp>

namespace cf = counterflux;

namespace counterflux_test {

// Tolerance for type T: d for double, f for float.
template <class T>
constexpr T pick(double d, float f) noexcept {
    if constexpr (std::is_same<T, float>::value) {
        (void)d;
        return f;
    } else {
        (void)f;
        return static_cast<T>(d);
    }
}

// |a - b| / |b|.
template <class T>
T rel_diff(T a, T b) {
    return std::fabs(a - b) / std::fabs(b);
}

// The table row of a gas, by formula or name; the test stops if it is unknown.
inline const cf::gas_data& gas(const char* name) {
    const auto r = cf::find_gas(name);
    REQUIRE(r.ok());
    return *r.value;
}

// R = N_A k_B and F = N_A e, exact (SI 2019, BIPM 9th ed.; docs/models.md sec. 0).
inline constexpr double r_exact = 6.02214076e23 * 1.380649e-23;
inline constexpr double f_exact = 6.02214076e23 * 1.602176634e-19;
inline constexpr double pi_d = 3.14159265358979323846;

// A sensor of up to four elements with no barrier yet: Fuller diffusivity,
// a mole-fraction reading, calibrated at 20 degC and 1 atm.
template <class T>
cf::sensor_model<T, 4> sensor(const char* target, const char* background, unsigned electrons,
                              T flux_ratio) {
    return cf::make_sensor<T, 4>(&gas(target), &gas(background), electrons, flux_ratio, T(293.15),
                                 T(101325));
}

// m with element b pushed onto its series; the test stops if the series is full.
template <class T>
cf::sensor_model<T, 4> add(cf::sensor_model<T, 4> m, const cf::barrier<T>& b) {
    REQUIRE(cf::push(m.barriers, b) == cf::status::ok);
    return m;
}

}  // namespace counterflux_test

#endif  // COUNTERFLUX_TESTS_UNIT_SUPPORT_HPP
