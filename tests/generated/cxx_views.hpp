// tests/generated/cxx_views.hpp - what cxx17_f32.cpp (the generated header
// compiled as C++17) exposes to the test.
#ifndef COUNTERFLUX_TESTS_GENERATED_CXX_VIEWS_HPP
#define COUNTERFLUX_TESTS_GENERATED_CXX_VIEWS_HPP

#include <cstddef>

#include <counterflux/compensation.hpp>

namespace generated_test {

/// The header's arrays and axes as the library's size-erased compensation view.
counterflux::compensation_ref<float> garage_f32_view();
/// The header's reading, compiled as C++17.
float garage_f32_reading_cxx(float signal_A, float temperature_K, float pressure_Pa, unsigned* status);
std::size_t garage_f32_temperature_count();
std::size_t garage_f32_pressure_count();
const float* garage_f32_gain_table();  ///< GAIN * c(T, P), row-major
float garage_f32_gain();                ///< GAIN, reading units per A at the reference

}  // namespace generated_test

#endif
