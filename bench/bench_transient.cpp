// Benchmark of the step-response solver (transient.hpp): a 100-cell layer
// simulated over 10 t90, with the time step chosen (once, before timing) as
// the largest of a doubling sequence that gives t90 to 0.1 % of Crank's value
// 0.30352 L^2/D (The Mathematics of Diffusion, 2nd ed., 1975, ch. 4). The
// reference is an explicit (FTCS, forward-time centred-space) scheme on the
// same 100 finite volumes, also run for the rise and the fall, at the largest
// stable time step that meets the same accuracy (searched in 5 % steps). Counters: steps, seconds per
// step, t90 error, and the explicit / implicit ratios of run time and steps.
#include <benchmark/benchmark.h>

#include <array>
#include <chrono>
#include <cmath>
#include <cstddef>

#include <counterflux/transient.hpp>

namespace cf = counterflux;

namespace {

constexpr std::size_t cells = 100;
constexpr double diffusivity = 2e-5;  // m2/s
constexpr double length = 1.2e-3;     // m
constexpr double area = 1.8e-8;       // m2
constexpr double scale = length * length / diffusivity;
constexpr double crank_t90 = 0.30352;  // L^2/D, Crank (1975) ch. 4
constexpr double duration = 10.0 * crank_t90 * scale;

cf::transient_chain<double, 1> chain() {
    auto c = cf::make_chain<double, 1>();
    (void)cf::push(c, cf::make_layer(diffusivity, area, length));
    return c;
}

double cn_t90(std::size_t steps) { return cf::step_response<double, cells, 1>(chain(), duration, steps).value.t90_s; }

// FTCS on the same finite volumes: C du/dt = G (u_left - u) + G (u_right - u),
// the faces at the sample (u = 1 for the rise, 0 for the fall) and at the sink
// (u = 0) half a cell away (conductance 2 G). Returns t90 of the rise (linear
// interpolation, as the library) and keeps the fall's t90 in fall_t90.
double ftcs_t90(std::size_t steps, double& fall_t90) {
    const double h = length / static_cast<double>(cells);
    const double dt = duration / static_cast<double>(steps);
    const double r = diffusivity * dt / (h * h);
    std::array<double, cells> rise{}, fall{}, next_rise{}, next_fall{};
    const double u_last_ss = h / (2.0 * length);  // steady u of the last cell
    for (std::size_t i = 0; i < cells; ++i) fall[i] = (1.0 - (static_cast<double>(i) + 0.5) / cells);  // linear
    double t90 = duration, prev = 0.0, prev_fall = 1.0;
    fall_t90 = duration;
    bool found = false, found_fall = false;
    for (std::size_t k = 1; k <= steps; ++k) {
        for (std::size_t i = 0; i < cells; ++i) {
            const double left_r = i == 0 ? 2.0 * (1.0 - rise[0]) : rise[i - 1] - rise[i];
            const double right_r = i + 1 == cells ? -2.0 * rise[i] : rise[i + 1] - rise[i];
            next_rise[i] = rise[i] + r * (left_r + right_r);
            const double left_f = i == 0 ? -2.0 * fall[0] : fall[i - 1] - fall[i];
            const double right_f = i + 1 == cells ? -2.0 * fall[i] : fall[i + 1] - fall[i];
            next_fall[i] = fall[i] + r * (left_f + right_f);
        }
        rise = next_rise;
        fall = next_fall;
        const double y = rise[cells - 1] / u_last_ss, yf = fall[cells - 1] / u_last_ss;
        const double t = dt * static_cast<double>(k);
        if (!found && y >= 0.9) {
            t90 = t - dt + dt * (0.9 - prev) / (y - prev);
            found = true;
        }
        if (!found_fall && yf <= 0.1) {
            fall_t90 = t - dt + dt * (0.1 - prev_fall) / (yf - prev_fall);
            found_fall = true;
        }
        prev = y;
        prev_fall = yf;
    }
    return t90;
}

double rel_error(double t90) { return std::fabs(t90 / scale - crank_t90) / crank_t90; }

// The next step count of the search: 5 % more.
std::size_t more(std::size_t steps) { return steps + steps / 20 + 1; }

// Fewest steps (growing by 5 %) that give t90 to 0.1 %, and with twice and
// four times as many steps too (not a lucky cancellation of the time and space errors).
std::size_t cn_steps() {
    std::size_t steps = 10;
    const auto good = [](std::size_t n) { return rel_error(cn_t90(n)) <= 1e-3; };
    while (!(good(steps) && good(2 * steps) && good(4 * steps)) && steps < (std::size_t(1) << 22)) steps = more(steps);
    return steps;
}

// FTCS: from just inside the stability limit dt < h^2 / (2 D) (the largest
// eigenvalue of the ladder is below 4 D / h^2), 5 % more steps at a time until
// t90 is to 0.1 %.
std::size_t ftcs_steps() {
    const double h = length / static_cast<double>(cells);
    auto steps = static_cast<std::size_t>(std::ceil(duration / (h * h / (2.0 * diffusivity)))) + 1;
    double fall = 0.0;
    while (rel_error(ftcs_t90(steps, fall)) > 1e-3 && steps < (std::size_t(1) << 26)) steps = more(steps);
    return steps;
}

template <class F>
double seconds_per_run(F&& f, int runs) {
    const auto start = std::chrono::steady_clock::now();
    for (int i = 0; i < runs; ++i) f();
    const std::chrono::duration<double> elapsed = std::chrono::steady_clock::now() - start;
    return elapsed.count() / runs;
}

void bm_step_response_100_cells(benchmark::State& state) {
    static const std::size_t steps = cn_steps();
    const auto c = chain();
    double t90 = 0.0;
    for (auto _ : state) {
        const auto r = cf::step_response<double, cells, 1>(c, duration, steps);
        benchmark::DoNotOptimize(r);
        t90 = r.value.t90_s;
    }
    state.counters["steps"] = static_cast<double>(steps);
    state.counters["s_per_step"] =
        benchmark::Counter(static_cast<double>(steps), benchmark::Counter::kIsIterationInvariantRate |
                                                           benchmark::Counter::kInvert);
    state.counters["t90_rel_error"] = rel_error(t90);
}
BENCHMARK(bm_step_response_100_cells)->Unit(benchmark::kMicrosecond);

void bm_ftcs_reference_100_cells(benchmark::State& state) {
    static const std::size_t steps = ftcs_steps();
    double t90 = 0.0, fall = 0.0;
    for (auto _ : state) {
        t90 = ftcs_t90(steps, fall);
        benchmark::DoNotOptimize(t90);
        benchmark::DoNotOptimize(fall);
    }
    state.counters["steps"] = static_cast<double>(steps);
    state.counters["s_per_step"] =
        benchmark::Counter(static_cast<double>(steps), benchmark::Counter::kIsIterationInvariantRate |
                                                           benchmark::Counter::kInvert);
    state.counters["t90_rel_error"] = rel_error(t90);
}
BENCHMARK(bm_ftcs_reference_100_cells)->Unit(benchmark::kMicrosecond);

// Both schemes at 0.1 % on t90, timed side by side: the explicit / implicit ratios.
void bm_explicit_over_implicit(benchmark::State& state) {
    static const std::size_t cn = cn_steps();
    static const std::size_t ftcs = ftcs_steps();
    const auto c = chain();
    double ratio = 0.0;
    for (auto _ : state) {
        double fall = 0.0;
        const double t_cn = seconds_per_run([&] { benchmark::DoNotOptimize(cf::step_response<double, cells, 1>(c, duration, cn)); }, 3);
        const double t_ftcs = seconds_per_run([&] { benchmark::DoNotOptimize(ftcs_t90(ftcs, fall)); }, 1);
        ratio = t_ftcs / t_cn;
    }
    state.counters["time_ratio"] = ratio;
    state.counters["steps_ratio"] = static_cast<double>(ftcs) / static_cast<double>(cn);
}
BENCHMARK(bm_explicit_over_implicit)->Unit(benchmark::kMillisecond)->Iterations(3);

}  // namespace
