// The firmware reading from a 15 x 9 float compensation table against the full
// model for the same reading (reading_from_current after subtracting the zero),
// side by side in one run, for two sensors: the firmware example's (CO in air
// behind one 0.15 mm x 1.2 mm capillary, Chapman-Enskog diffusivity: the
// simplest model, with a closed-form inverse) and the bundled garage design
// (examples/garage_co.toml: a porous dust filter in series with the capillary,
// whose inverse is a bounded solve over the series).
//
// bm_speedup / bm_speedup_garage time both paths over the same inputs inside each
// iteration and report model_ns, table_ns and their ratio as counters (goal:
// ratio >= 20).
#include <benchmark/benchmark.h>

#include <chrono>
#include <cstddef>

#include <counterflux/counterflux.hpp>

namespace cf = counterflux;

namespace {

constexpr std::size_t nt = 15, np = 9;

// The numbers of examples/garage_co.toml (porous PTFE filter, then the
// capillary; reference 20 C, 101.325 kPa; zero 0.4 nA, 0.045 /K).
cf::sensor_model<float, 2> make_garage_model() {
    cf::sensor_model<float, 2> m = cf::make_sensor<float, 2>(cf::find_gas("CO").value, cf::find_gas("air").value, 2u,
                                                             -1.0f, 293.15f, 101325.0f,
                                                             cf::diffusivity_method::chapman_enskog);
    (void)cf::push(m.barriers, cf::make_porous<float>(0.25e-3f, 19.6e-6f, 0.45f, 2.2f, 5e-6f));
    (void)cf::push(m.barriers, cf::make_capillary<float>(0.15e-3f, 1.5e-3f));
    return m;
}
float garage_zero_A(float t_K) { return cf::zero_current_A(0.4e-9f, 0.045f, 293.15f, t_K).value; }

cf::sensor_model<float, 1> make_model() {
    cf::sensor_model<float, 1> m = cf::make_sensor<float, 1>(cf::find_gas("CO").value, cf::find_gas("air").value, 2u,
                                                             -1.0f, 293.15f, 101325.0f,
                                                             cf::diffusivity_method::chapman_enskog);
    (void)cf::push(m.barriers, cf::make_capillary<float>(0.15e-3f, 1.2e-3f));
    return m;
}

// Zero current of the example: 2 nA at 20 degC, doubling about every 10 K.
float zero_A(float t_K) { return cf::zero_current_A(2e-9f, 0.07f, 293.15f, t_K).value; }

template <std::size_t N, class Zero>
cf::compensation<float, nt, np> make_table(const cf::sensor_model<float, N>& m, Zero zero_of) {
    float correction[nt * np];
    float zero[nt];
    const cf::uniform_axis<float> at = cf::make_uniform_axis(253.15f, 323.15f, nt);
    const cf::uniform_axis<float> ap = cf::make_uniform_axis(70000.0f, 110000.0f, np);
    for (std::size_t i = 0; i < nt; ++i) {
        zero[i] = zero_of(cf::axis_node(at, i));
        for (std::size_t j = 0; j < np; ++j)
            correction[i * np + j] = 1.0f / cf::span_factor(m, cf::axis_node(at, i), cf::axis_node(ap, j)).value;
    }
    const float gain = 1.0f / cf::sensitivity_A_per_mol_per_mol(m, 293.15f, 101325.0f).value;
    return cf::make_compensation<float, nt, np>(253.15f, 323.15f, 70000.0f, 110000.0f, correction, zero, gain);
}

// Inputs varied per iteration: 64 conditions spread over the grid, each with the
// current the sensor gives there (zero included).
struct input {
    float signal_A, temperature_K, pressure_Pa;
};
constexpr std::size_t input_count = 64;

struct inputs {
    input v[input_count];
};

template <std::size_t N, class Zero>
inputs make_inputs(const cf::sensor_model<float, N>& m, Zero zero_of) {
    inputs in{};
    for (std::size_t k = 0; k < input_count; ++k) {
        const float t = 253.15f + 70.0f * static_cast<float>((k * 37u) % input_count) / float(input_count);
        const float p = 70000.0f + 40000.0f * static_cast<float>((k * 23u) % input_count) / float(input_count);
        const float y = 1e-4f + 9e-4f * static_cast<float>((k * 11u) % input_count) / float(input_count);
        in.v[k] = input{zero_of(t) + cf::limiting_current_A(m, t, p, y).value, t, p};
    }
    return in;
}

void bm_table_reading(benchmark::State& state) {
    const auto model = make_model();
    const auto table = make_table(model, zero_A);
    const inputs in = make_inputs(model, zero_A);
    std::size_t i = 0;
    for (auto _ : state) {
        const input& x = in.v[i];
        auto r = cf::reading(table, x.signal_A, x.temperature_K, x.pressure_Pa);
        benchmark::DoNotOptimize(r);
        i = (i + 1u) % input_count;
    }
}

void bm_model_reading(benchmark::State& state) {
    const auto model = make_model();
    const inputs in = make_inputs(model, zero_A);
    std::size_t i = 0;
    for (auto _ : state) {
        const input& x = in.v[i];
        auto r = cf::reading_from_current(model, x.temperature_K, x.pressure_Pa, x.signal_A - zero_A(x.temperature_K));
        benchmark::DoNotOptimize(r);
        i = (i + 1u) % input_count;
    }
}

// Both paths over the same 64 inputs per iteration, each timed with steady_clock;
// the iteration time reported is the table's (manual time).
template <std::size_t N, class Zero>
void speedup(benchmark::State& state, const cf::sensor_model<float, N>& model, Zero zero_of) {
    using clock = std::chrono::steady_clock;
    const auto table = make_table(model, zero_of);
    const inputs in = make_inputs(model, zero_of);
    double table_s = 0.0, model_s = 0.0;
    std::size_t calls = 0;
    for (auto _ : state) {
        const auto t0 = clock::now();
        for (const input& x : in.v) {
            auto r = cf::reading(table, x.signal_A, x.temperature_K, x.pressure_Pa);
            benchmark::DoNotOptimize(r);
        }
        const auto t1 = clock::now();
        for (const input& x : in.v) {
            auto r = cf::reading_from_current(model, x.temperature_K, x.pressure_Pa, x.signal_A - zero_of(x.temperature_K));
            benchmark::DoNotOptimize(r);
        }
        const auto t2 = clock::now();
        const double dt_table = std::chrono::duration<double>(t1 - t0).count();
        table_s += dt_table;
        model_s += std::chrono::duration<double>(t2 - t1).count();
        calls += input_count;
        state.SetIterationTime(dt_table);
    }
    if (calls > 0 && table_s > 0.0) {
        state.counters["table_ns"] = 1e9 * table_s / static_cast<double>(calls);
        state.counters["model_ns"] = 1e9 * model_s / static_cast<double>(calls);
        state.counters["ratio"] = model_s / table_s;
    }
}

void bm_speedup(benchmark::State& state) { speedup(state, make_model(), zero_A); }
void bm_speedup_garage(benchmark::State& state) { speedup(state, make_garage_model(), garage_zero_A); }

}  // namespace

BENCHMARK(bm_table_reading);
BENCHMARK(bm_model_reading);
BENCHMARK(bm_speedup)->UseManualTime();
BENCHMARK(bm_speedup_garage)->UseManualTime();
