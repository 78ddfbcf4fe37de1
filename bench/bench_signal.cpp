// Benchmarks of the per-reading paths: the limiting current, the sensitivity and the
// inverse (current -> mole fraction), for float and double. The sensor is the
// firmware example's: CO in air behind one 0.15 mm x 1.2 mm capillary.
#include <benchmark/benchmark.h>

#include <counterflux/counterflux.hpp>

namespace cf = counterflux;

namespace {

template <class T>
cf::sensor_model<T, 1> make_model() {
    cf::sensor_model<T, 1> m = cf::make_sensor<T, 1>(cf::find_gas("CO").value, cf::find_gas("air").value, 2u,
                                                     T(-1), T(293.15), T(101325),
                                                     cf::diffusivity_method::chapman_enskog);
    (void)cf::push(m.barriers, cf::make_capillary<T>(T(0.15e-3), T(1.2e-3)));
    return m;
}

// Conditions swept so the optimiser cannot fold the call away.
template <class T>
struct condition {
    T temperature_K;
    T pressure_Pa;
    T mole_fraction;
};

template <class T>
constexpr condition<T> conditions[] = {
    {T(253.15), T(70000), T(10e-6)},  {T(273.15), T(85000), T(100e-6)},
    {T(293.15), T(101325), T(1e-3)},  {T(308.15), T(95000), T(500e-6)},
    {T(323.15), T(110000), T(50e-6)},
};
constexpr std::size_t condition_count = 5;

template <class T>
void bm_limiting_current(benchmark::State& state) {
    const auto model = make_model<T>();
    std::size_t i = 0;
    for (auto _ : state) {
        const auto& c = conditions<T>[i];
        auto r = cf::limiting_current_A(model, c.temperature_K, c.pressure_Pa, c.mole_fraction);
        benchmark::DoNotOptimize(r);
        i = (i + 1u) % condition_count;
    }
}

template <class T>
void bm_sensitivity(benchmark::State& state) {
    const auto model = make_model<T>();
    std::size_t i = 0;
    for (auto _ : state) {
        const auto& c = conditions<T>[i];
        auto r = cf::sensitivity_A_per_mol_per_mol(model, c.temperature_K, c.pressure_Pa);
        benchmark::DoNotOptimize(r);
        i = (i + 1u) % condition_count;
    }
}

template <class T>
void bm_mole_fraction_from_current(benchmark::State& state) {
    const auto model = make_model<T>();
    // Currents the sensor would produce at each condition.
    T currents[condition_count] = {};
    for (std::size_t k = 0; k < condition_count; ++k) {
        const auto& c = conditions<T>[k];
        currents[k] = cf::limiting_current_A(model, c.temperature_K, c.pressure_Pa, c.mole_fraction).value;
    }
    std::size_t i = 0;
    for (auto _ : state) {
        const auto& c = conditions<T>[i];
        auto r = cf::mole_fraction_from_current(model, c.temperature_K, c.pressure_Pa, currents[i]);
        benchmark::DoNotOptimize(r);
        i = (i + 1u) % condition_count;
    }
}

}  // namespace

BENCHMARK_TEMPLATE(bm_limiting_current, float);
BENCHMARK_TEMPLATE(bm_limiting_current, double);
BENCHMARK_TEMPLATE(bm_sensitivity, float);
BENCHMARK_TEMPLATE(bm_sensitivity, double);
BENCHMARK_TEMPLATE(bm_mole_fraction_from_current, float);
BENCHMARK_TEMPLATE(bm_mole_fraction_from_current, double);

BENCHMARK_MAIN();
