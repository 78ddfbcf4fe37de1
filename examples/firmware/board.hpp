// Board stand-in for the firmware examples: text out, a stack probe, the end of a run.
// On arm-none-eabi these go to the emulator through semihosting (cmake/mcu/); on the
// host to standard output. A real board writes to its display or radio instead.
#ifndef COUNTERFLUX_EXAMPLES_BOARD_HPP
#define COUNTERFLUX_EXAMPLES_BOARD_HPP

#include <cstddef>
#include <cstdint>

#if defined(__arm__)
#include "counterflux_mcu.h"
#else
#include <cstdio>
#endif

namespace board {

#if defined(__arm__)
inline void write(const char* text) { cf_mcu_write(text); }
inline void write_fixed(std::int32_t value, unsigned decimals) { cf_mcu_write_fixed(value, decimals); }
inline void write_unsigned(std::uint32_t value) { cf_mcu_write_unsigned(value); }
/// Stack bytes fn(context) used (painted and scanned), at most max_bytes.
inline std::size_t stack_used(void (*fn)(void*), void* context, std::size_t max_bytes) {
    return cf_mcu_stack_used(fn, context, max_bytes);
}
#else
inline void write(const char* text) { std::fputs(text, stdout); }
inline void write_unsigned(std::uint32_t value) { std::printf("%lu", static_cast<unsigned long>(value)); }
inline void write_fixed(std::int32_t value, unsigned decimals) {
    std::int32_t scale = 1;
    for (unsigned i = 0; i < decimals; ++i) scale *= 10;
    const long whole = static_cast<long>(value / scale);
    const long part = static_cast<long>(value < 0 ? -(value % scale) : value % scale);
    std::printf("%s%ld.%0*ld", (value < 0 && whole == 0) ? "-" : "", whole, static_cast<int>(decimals), part);
}
/// On the host: runs fn and reports 0 (no stack painting there).
inline std::size_t stack_used(void (*fn)(void*), void* context, std::size_t) {
    fn(context);
    return 0u;
}
#endif

}  // namespace board

#endif
