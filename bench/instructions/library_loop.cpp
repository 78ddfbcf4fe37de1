// bench/instructions/library_loop.cpp - the library's C++ reading()
// (compensation.hpp) over the generated garage tables, and the full model for
// the same readings (reading_from_current on the garage design read from
// examples/garage_co.toml, zero current subtracted), in the same minimal loop as
// reading_loop.c, for the instruction counts of scripts/count-instructions.sh.
#include <cstddef>
#include <cstdio>
#include <cstdlib>

#include <counterflux/ambient.hpp>
#include <counterflux/compensation.hpp>
#include <counterflux/signal.hpp>

#include "sensor_file.hpp"

#include "garage_co.h"

namespace {

float in_s[64], in_t[64], in_p[64];

counterflux::compensation_ref<float> view() {
    counterflux::compensation_ref<float> c{};
    c.temperature = counterflux::make_uniform_axis(GARAGE_CO_TEMPERATURE_FROM_K, GARAGE_CO_TEMPERATURE_TO_K,
                                                   std::size_t(GARAGE_CO_TEMPERATURE_COUNT));
    c.pressure = counterflux::make_uniform_axis(GARAGE_CO_PRESSURE_FROM_PA, GARAGE_CO_PRESSURE_TO_PA,
                                                std::size_t(GARAGE_CO_PRESSURE_COUNT));
    c.correction = garage_co_gain_table;  // GAIN * c, so the view's gain is 1
    c.gain = 1.0f;
    c.zero = garage_co_zero_current;
    c.shape_axis = counterflux::make_uniform_axis(0.0f, 1.0f, std::size_t(2));
    return c;
}

}  // namespace

extern "C" __attribute__((noinline)) float loop_library(const counterflux::compensation_ref<float>* c, int n) {
    float acc = 0.0f;
    unsigned flags = 0u;
    for (int k = 0; k < n; ++k) {
        const int j = k & 63;
        const counterflux::result<float> r = counterflux::reading(*c, in_s[j], in_t[j], in_p[j]);
        acc += r.value;
        flags |= static_cast<unsigned>(r.code);
    }
    return acc + static_cast<float>(flags);
}

extern "C" __attribute__((noinline)) double loop_model(const counterflux::tool::sensor_file* f, int n) {
    double acc = 0.0;
    unsigned flags = 0u;
    const auto& m = f->model;
    for (int k = 0; k < n; ++k) {
        const int j = k & 63;
        const double t = static_cast<double>(in_t[j]);
        const double i0 = counterflux::zero_current_A(f->zero->current_A, f->zero->per_K,
                                                      m.reference_temperature_K, t).value;
        const auto r = counterflux::reading_from_current(m, t, static_cast<double>(in_p[j]),
                                                         static_cast<double>(in_s[j]) - i0);
        acc += r.value;
        flags |= static_cast<unsigned>(r.code);
    }
    return acc + static_cast<double>(flags);
}

int main(int argc, char** argv) {
    const int n = argc > 1 ? std::atoi(argv[1]) : 100000;
    for (int j = 0; j < 64; ++j) {
        in_t[j] = GARAGE_CO_TEMPERATURE_FROM_K + 1.0f + 1.05f * static_cast<float>(j);
        in_p[j] = GARAGE_CO_PRESSURE_FROM_PA + 100.0f + static_cast<float>((j * 37) % 64) * 245.0f;
        in_s[j] = 1.0e-7f * static_cast<float>(j % 17);
    }
    const counterflux::compensation_ref<float> c = view();
    const auto f = counterflux::tool::read_sensor_file(COUNTERFLUX_SOURCE_DIR "/examples/garage_co.toml");
    if (!f.zero) return 1;
    std::printf("%g %g\n", static_cast<double>(loop_library(&c, n)), loop_model(&f, n / 100 + 1));
    return 0;
}
