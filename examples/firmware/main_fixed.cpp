// Firmware example for a Cortex-M0+ (no FPU): the garage CO cell of main.cpp read on
// the integer-only path of a q15 table, garage_co_reading_fixed() from the header
// `counterflux table --values q15` generates at build time. Inputs in pA, mK and Pa,
// the reading in ppb of mole fraction; not one floating-point operation, so the image
// links no software float helper (scripts/test.sh checks it with nm). No heap either:
// every allocation function is wrapped, a call to one fails the link.
#include <cstddef>
#include <cstdint>

#include "board.hpp"
#include "garage_co.h"

struct fixed_call {
    std::int32_t signal_pA, temperature_mK, pressure_Pa;
    std::int32_t ppb;
    unsigned code;
};

/// The generated integer reading; ppb of mole fraction.
extern "C" __attribute__((noinline)) void counterflux_example_fixed_reading(void* context) {
    auto* r = static_cast<fixed_call*>(context);
    r->ppb = garage_co_reading_fixed(r->signal_pA, r->temperature_mK, r->pressure_Pa, &r->code);
}

// Board stand-ins: what the ADC and the environment sensors would write.
volatile std::int32_t board_signal_pA = 0;
volatile std::int32_t board_temperature_mK = 0;
volatile std::int32_t board_pressure_Pa = 0;

int main() {
    bool sane = true;
    board::write("garage_co (q15): T [K]  P [kPa]  I [nA]  -> ppm (status)\n");
    for (std::int32_t step = 0; step < 8; ++step) {
        // The same sweep as main.cpp: 258 .. 328 K, 91 .. 105 kPa, 20 .. 860 nA.
        board_temperature_mK = 258150 + 10000 * step;
        board_pressure_Pa = 91000 + 2000 * step;
        board_signal_pA = 20000 + 120000 * step;
        fixed_call r{board_signal_pA, board_temperature_mK, board_pressure_Pa, 0, 0u};
        counterflux_example_fixed_reading(&r);
        board::write_fixed(r.temperature_mK / 10, 2);
        board::write("  ");
        board::write_fixed(r.pressure_Pa / 10, 2);
        board::write("  ");
        board::write_fixed(r.signal_pA / 100, 1);
        board::write("  -> ");
        board::write_fixed(r.ppb, 3);
        board::write(" (");
        board::write_unsigned(r.code);
        board::write(")\n");
        sane = sane && r.ppb >= 0 && r.ppb < 1000000000;
    }
    fixed_call probe{500000, 300000, 95000, 0, 0u};
    board::write("stack garage_co_reading_fixed ");
    board::write_unsigned(static_cast<std::uint32_t>(board::stack_used(counterflux_example_fixed_reading, &probe, 1024u)));
    board::write(" bytes\n");
    return sane ? 0 : 1;
}
