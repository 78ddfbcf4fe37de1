// Shared by both consumer projects: uses the library as a client would, through the
// umbrella header, and checks a plausible reading comes back.
#include <counterflux/counterflux.hpp>

namespace cf = counterflux;

template <class T>
static int check() {
    cf::sensor_model<T, 2> m{};
    const auto co = cf::find_gas("CO");
    const auto air = cf::find_gas("air");
    if (!co.ok() || !air.ok()) return 1;
    m.target = co.value;
    m.background = air.value;
    m.diffusivity.method = cf::diffusivity_method::fuller;
    m.diffusivity.a = co.value;
    m.diffusivity.b = air.value;
    if (cf::push(m.barriers, cf::make_capillary<T>(T(0.15e-3), T(1.2e-3))) != cf::status::ok) return 2;
    m.electrons = 2u;
    m.flux_ratio = T(-1);
    m.reading = cf::reading_kind::mole_fraction;
    m.reference_temperature_K = T(293.15);
    m.reference_pressure_Pa = T(101325);

    const auto current = cf::limiting_current_A(m, T(293.15), T(101325), T(1e-3));
    if (!current.ok() || !(current.value > T(0))) return 3;
    const auto back = cf::mole_fraction_from_current(m, T(293.15), T(101325), current.value);
    if (!back.ok()) return 4;
    const T error = back.value > T(1e-3) ? back.value - T(1e-3) : T(1e-3) - back.value;
    return error < T(1e-5) ? 0 : 5;
}

int main() {
    const int f = check<float>();
    const int d = check<double>();
    return f != 0 ? 10 + f : (d != 0 ? 20 + d : 0);
}
