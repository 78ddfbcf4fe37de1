// Firmware example for a Cortex-M4F (single-precision FPU): a CO cell for a garage
// ventilation monitor (examples/garage_co.toml), read in float.
//
// The main loop reads a simulated current, temperature and pressure (a sweep across
// the table's range and a little beyond, where the flags say so), and prints the
// compensated reading two ways:
//   - garage_co_reading(), from the header `counterflux table` generates from the
//     sensor file at build time (examples/firmware/CMakeLists.txt);
//   - counterflux::reading() of compensation.hpp on a 15 x 9 span-correction table and
//     a 15-point zero table held as constexpr data (invented, linearised numbers).
// Then it measures the stack each reading call takes (painted and scanned) and ends
// the run. No heap: the build wraps every allocation function, so a call to one fails
// the link. Built for the host too, where it runs once as a test.
#include <counterflux/compensation.hpp>

#include <cstddef>
#include <cstdint>

#include "board.hpp"
#include "garage_co.h"

namespace cf = counterflux;

namespace {

constexpr std::size_t nt = 15;  // -20 .. 50 C
constexpr std::size_t np = 9;   // 70 .. 110 kPa
constexpr float t_ref_K = 293.15f;

// Span correction c = 1/s with s = 1 + 0.75 (T - T_ref)/T_ref (a capillary's
// (T/T_ref)^0.75 to first order; pressure-independent for a mole fraction).
constexpr cf::compensation<float, nt, np> make_tables() noexcept {
    float correction[nt * np] = {};
    float zero[nt] = {};
    for (std::size_t i = 0; i < nt; ++i) {
        const float t = 253.15f + 5.0f * static_cast<float>(i);
        for (std::size_t j = 0; j < np; ++j) correction[i * np + j] = 1.0f / (1.0f + 0.75f * (t - t_ref_K) / t_ref_K);
        zero[i] = 1.0e-9f + 0.1e-9f * static_cast<float>(i);
    }
    return cf::make_compensation<float, nt, np>(253.15f, 323.15f, 70000.0f, 110000.0f, correction, zero,
                                                1.0f / 1.7e-3f);
}

}  // namespace

/// The library's compensation tables (flash: constant-initialised).
constexpr cf::compensation<float, nt, np> counterflux_example_tables = make_tables();

struct reading_call {
    float signal_A, temperature_K, pressure_Pa;
    float value;
    unsigned code;
};

/// The library reading path: zero, span correction, law; mol/mol.
extern "C" __attribute__((noinline)) void counterflux_example_library_reading(void* context) {
    auto* r = static_cast<reading_call*>(context);
    const auto y = cf::reading(counterflux_example_tables, r->signal_A, r->temperature_K, r->pressure_Pa);
    r->value = y.value;
    r->code = static_cast<unsigned>(y.code);
}

/// The generated header's reading; mol/mol.
extern "C" __attribute__((noinline)) void counterflux_example_table_reading(void* context) {
    auto* r = static_cast<reading_call*>(context);
    r->value = garage_co_reading(r->signal_A, r->temperature_K, r->pressure_Pa, &r->code);
}

// Board stand-ins: what the ADC and the environment sensors would write.
volatile float board_signal_A = 0.0f;
volatile float board_temperature_K = 0.0f;
volatile float board_pressure_Pa = 0.0f;

int main() {
    bool sane = true;
    board::write("garage_co: T [K]  P [kPa]  I [nA]  -> header ppm (status) | library ppm (status)\n");
    for (int step = 0; step < 8; ++step) {
        // The simulated sweep: 258 .. 328 K (past the 323 K edge at the end),
        // 91 .. 105 kPa, 20 .. 860 nA.
        board_temperature_K = 258.15f + 10.0f * static_cast<float>(step);
        board_pressure_Pa = 91000.0f + 2000.0f * static_cast<float>(step);
        board_signal_A = (20.0f + 120.0f * static_cast<float>(step)) * 1.0e-9f;

        reading_call table{board_signal_A, board_temperature_K, board_pressure_Pa, 0.0f, 0u};
        reading_call library = table;
        counterflux_example_table_reading(&table);
        counterflux_example_library_reading(&library);

        board::write_fixed(static_cast<std::int32_t>(table.temperature_K * 100.0f), 2);
        board::write("  ");
        board::write_fixed(static_cast<std::int32_t>(table.pressure_Pa / 10.0f), 2);
        board::write("  ");
        board::write_fixed(static_cast<std::int32_t>(table.signal_A * 1.0e10f + 0.5f), 1);
        board::write("  -> ");
        board::write_fixed(static_cast<std::int32_t>(table.value * 1.0e9f), 3);
        board::write(" (");
        board::write_unsigned(table.code);
        board::write(") | ");
        board::write_fixed(static_cast<std::int32_t>(library.value * 1.0e9f), 3);
        board::write(" (");
        board::write_unsigned(library.code);
        board::write(")\n");
        sane = sane && table.value == table.value && library.value == library.value && library.value >= 0.0f &&
               library.value < 1.0f;
    }

    reading_call probe{500.0e-9f, 300.0f, 95000.0f, 0.0f, 0u};
    board::write("stack counterflux::reading ");
    board::write_unsigned(static_cast<std::uint32_t>(board::stack_used(counterflux_example_library_reading, &probe, 1024u)));
    board::write(" bytes\nstack garage_co_reading ");
    board::write_unsigned(static_cast<std::uint32_t>(board::stack_used(counterflux_example_table_reading, &probe, 1024u)));
    // The edge paths: temperature below, pressure above the grid.
    reading_call edge{500.0e-9f, 200.0f, 200000.0f, 0.0f, 0u};
    board::write(" bytes\nstack counterflux::reading(edge) ");
    board::write_unsigned(static_cast<std::uint32_t>(board::stack_used(counterflux_example_library_reading, &edge, 1024u)));
    board::write(" bytes\nstack garage_co_reading(edge) ");
    board::write_unsigned(static_cast<std::uint32_t>(board::stack_used(counterflux_example_table_reading, &edge, 1024u)));
    board::write(" bytes\n");
    return sane ? 0 : 1;
}
