/* Board glue for counterflux's emulated-MCU images (QEMU mps2-an386 and microbit):
 * semihosting output and exit, and stack painting. C99 and C++17. */
#ifndef COUNTERFLUX_MCU_H
#define COUNTERFLUX_MCU_H

#include <stddef.h>
#include <stdint.h>

#ifdef __cplusplus
extern "C" {
#endif

/* Writes a NUL-terminated string to the host's standard output (SYS_WRITE0). */
void cf_mcu_write(const char* text);
/* Writes an unsigned decimal number. */
void cf_mcu_write_unsigned(uint32_t value);
/* Writes a signed number in units of 10^-decimals as a decimal fraction, e.g.
 * (12345, 3) -> "12.345". */
void cf_mcu_write_fixed(int32_t value, unsigned decimals);
/* Ends the emulation with this exit status on the host (SYS_EXIT_EXTENDED). */
void cf_mcu_exit(int status) __attribute__((noreturn));

/* Calls fn(context) on a painted stack and returns the bytes of stack it used,
 * measured from this function's stack pointer at the call (so the callee's own
 * frame, return address and saved registers included), at most max_bytes. */
size_t cf_mcu_stack_used(void (*fn)(void*), void* context, size_t max_bytes);

#ifdef __cplusplus
}
#endif

#endif
