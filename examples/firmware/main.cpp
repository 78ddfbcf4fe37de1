// A firmware reading loop for a Cortex-M4F: a CO sensor behind one capillary, in air.
//
// Everything runs in float (the M4F's FPU is single precision). The board support is
// faked with volatile variables: a real board fills them from its ADC and its
// temperature and pressure sensors, and brings its own startup code and linker
// script. Built for the host too (COUNTERFLUX_BUILD_EXAMPLES), where it runs one
// reading and returns 0 when the reading is sane.
#include <counterflux/counterflux.hpp>

namespace cf = counterflux;

namespace {

using real = float;
constexpr std::size_t max_elements = 1;
using model_type = cf::sensor_model<real, max_elements>;

// The sensor design: CO consumed at the electrode (2 electrons), air around it,
// equimolar counter-diffusion through one 0.15 mm x 1.2 mm capillary, calibrated
// at 20 C and 101.325 kPa.
model_type make_model(cf::status& code) noexcept {
    const auto co = cf::find_gas("CO");
    const auto air = cf::find_gas("air");
    code = co.code | air.code;
    model_type m = cf::make_sensor<real, max_elements>(co.value, air.value, 2u, real(-1), real(293.15),
                                                       real(101325), cf::diffusivity_method::chapman_enskog);
    code |= cf::push(m.barriers, cf::make_capillary<real>(real(0.15e-3), real(1.2e-3)));
    return m;
}

}  // namespace

// Board stand-ins: inputs the ADC and the environment sensors would write, outputs a
// display or a radio would read. Plain (constant-initialised) globals, no constructors.
volatile real board_signal_A = real(1.0e-6);
volatile real board_temperature_K = real(298.15);
volatile real board_pressure_Pa = real(98000);
volatile real reading_mol_per_mol = real(0);
volatile real reading_ppm = real(0);
volatile unsigned reading_status = 0u;

int main() {
    cf::status code = cf::status::ok;
    const model_type model = make_model(code);

    for (;;) {
        const real current_A = board_signal_A;
        const real temperature_K = board_temperature_K;
        const real pressure_Pa = board_pressure_Pa;

        const auto y = cf::mole_fraction_from_current(model, temperature_K, pressure_Pa, current_A);
        reading_mol_per_mol = y.value;
        reading_ppm = y.value / cf::ppm<real>;
        reading_status = static_cast<unsigned>(code | y.code);

#if !defined(__arm__)
        // On the host: one reading, then report whether it is usable.
        const real ppm = reading_ppm;
        return (reading_status == 0u && ppm > real(0) && ppm < real(1e6)) ? 0 : 1;
#endif
    }
}
