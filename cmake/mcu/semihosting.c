/* Semihosting glue: the calls go to the debugger, here QEMU with
 * -semihosting-config enable=on,target=native (Arm, "Semihosting for AArch32 and
 * AArch64", version 2.0: SYS_WRITE0 = 0x04, SYS_EXIT = 0x18,
 * SYS_EXIT_EXTENDED = 0x20, ADP_Stopped_ApplicationExit = 0x20026). */
#include "counterflux_mcu.h"

enum {
    sys_write0 = 0x04,
    sys_exit = 0x18,
    sys_exit_extended = 0x20,
    adp_stopped_application_exit = 0x20026
};

static uintptr_t semihost_call(uintptr_t op, const void* arg) {
    register uintptr_t r0 __asm__("r0") = op;
    register const void* r1 __asm__("r1") = arg;
    __asm__ volatile("bkpt 0xab" : "+r"(r0) : "r"(r1) : "memory");
    return r0;
}

void cf_mcu_write(const char* text) { (void)semihost_call(sys_write0, text); }

void cf_mcu_write_unsigned(uint32_t value) {
    char digits[11];
    unsigned n = sizeof digits - 1u;
    digits[n] = '\0';
    do {
        digits[--n] = (char)('0' + value % 10u);
        value /= 10u;
    } while (value != 0u && n > 0u);
    cf_mcu_write(&digits[n]);
}

void cf_mcu_write_fixed(int32_t value, unsigned decimals) {
    uint32_t magnitude = value < 0 ? 0u - (uint32_t)value : (uint32_t)value;
    uint32_t scale = 1u;
    for (unsigned i = 0u; i < decimals; ++i) scale *= 10u;
    if (value < 0) cf_mcu_write("-");
    cf_mcu_write_unsigned(magnitude / scale);
    if (decimals == 0u) return;
    char fraction[12];
    uint32_t rest = magnitude % scale;
    fraction[0] = '.';
    for (unsigned i = decimals; i > 0u; --i) {
        fraction[i] = (char)('0' + rest % 10u);
        rest /= 10u;
    }
    fraction[decimals + 1u] = '\0';
    cf_mcu_write(fraction);
}

void cf_mcu_exit(int status) {
    const uintptr_t block[2] = {adp_stopped_application_exit, (uintptr_t)status};
    (void)semihost_call(sys_exit_extended, block);
    /* A host without SYS_EXIT_EXTENDED: plain SYS_EXIT (status 0 or 1 only). */
    (void)semihost_call(sys_exit, (const void*)(uintptr_t)(status == 0 ? adp_stopped_application_exit : 0x20023));
    for (;;) {
    }
}

#define CF_PAINT 0xC0FFEE5Au

size_t cf_mcu_stack_used(void (*fn)(void*), void* context, size_t max_bytes) {
    uintptr_t sp;
    __asm__ volatile("mov %0, sp" : "=r"(sp));
    sp &= ~(uintptr_t)3u;
    volatile uint32_t* const low = (volatile uint32_t*)(sp - max_bytes);
    volatile uint32_t* const high = (volatile uint32_t*)sp;
    for (volatile uint32_t* p = low; p < high; ++p) *p = CF_PAINT;
    fn(context);
    volatile uint32_t* p = low;
    while (p < high && *p == CF_PAINT) ++p;
    return (size_t)(sp - (uintptr_t)p);
}
