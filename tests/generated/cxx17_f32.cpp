// The generated garage_co.h (float32) compiled as C++17, and its data handed
// to the library's table types: the same arrays serve C firmware and C++.
#include "garage_co.h"

#include <cstddef>

#include <counterflux/compensation.hpp>

#include "cxx_views.hpp"

namespace generated_test {

counterflux::compensation_ref<float> garage_f32_view() {
    counterflux::compensation_ref<float> c{};
    c.temperature = counterflux::make_uniform_axis(GARAGE_CO_TEMPERATURE_FROM_K, GARAGE_CO_TEMPERATURE_TO_K,
                                                   std::size_t(GARAGE_CO_TEMPERATURE_COUNT));
    c.pressure = counterflux::make_uniform_axis(GARAGE_CO_PRESSURE_FROM_PA, GARAGE_CO_PRESSURE_TO_PA,
                                                std::size_t(GARAGE_CO_PRESSURE_COUNT));
    c.correction = garage_co_gain_table;  // GAIN * c: the view's gain is then 1
    c.zero = garage_co_zero_current;
    c.gain = 1.0f;
    c.shape_axis = counterflux::make_uniform_axis(0.0f, 1.0f, std::size_t(2));
    c.curvature = nullptr;
    c.shape = nullptr;
    return c;
}

float garage_f32_reading_cxx(float signal_A, float temperature_K, float pressure_Pa, unsigned* status) {
    return garage_co_reading(signal_A, temperature_K, pressure_Pa, status);
}

std::size_t garage_f32_temperature_count() { return GARAGE_CO_TEMPERATURE_COUNT; }
std::size_t garage_f32_pressure_count() { return GARAGE_CO_PRESSURE_COUNT; }
const float* garage_f32_gain_table() { return garage_co_gain_table; }
float garage_f32_gain() { return GARAGE_CO_GAIN; }

}  // namespace generated_test
