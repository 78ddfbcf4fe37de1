/* Start-up code for counterflux's emulated-MCU images: the vector table, a reset
 * handler and a fault handler. newlib's own crt0 does not boot under QEMU's
 * mps2-an386 or microbit, so these images link with -nostartfiles and this file.
 *
 * Reset: enable the FPU (Cortex-M4F: CPACR CP10/CP11 full access, Armv7-M
 * Architecture Reference Manual B3.2.20), copy .data from flash, zero .bss, open the
 * semihosting standard streams when newlib's stdio is used, run the C++ constructors
 * (__libc_init_array), then exit(main()) (without stdio: cf_mcu_exit(main())). A fault ends the run with status 70 and
 * says which fault and where, instead of hanging. */
#include <stdint.h>
#include <stdlib.h>

#include "counterflux_mcu.h"

extern uint32_t __data_start__[], __data_end__[], __data_load__[];
extern uint32_t __bss_start__[], __bss_end__[];
extern uint32_t __stack_top__[];

extern void __libc_init_array(void);
extern int main(int argc, char** argv);
#if defined(COUNTERFLUX_MCU_STDIO)
extern void initialise_monitor_handles(void);
#endif

/* The C++ ABI's handle of this module (normally from crtbegin.o, left out here). */
void* __dso_handle = &__dso_handle;
/* __libc_init_array calls _init (normally crti.o): nothing to do. */
void _init(void) {}
void _fini(void) {}

void cf_reset_handler(void) __attribute__((noreturn));
void cf_reset_handler(void) {
#if defined(__ARM_FP)
    volatile uint32_t* const cpacr = (volatile uint32_t*)0xE000ED88u;
    *cpacr |= 0xFu << 20;
    __asm__ volatile("dsb\n\tisb" ::: "memory");
#endif
    const uint32_t* from = __data_load__;
    for (uint32_t* to = __data_start__; to < __data_end__;) *to++ = *from++;
    for (uint32_t* to = __bss_start__; to < __bss_end__;) *to++ = 0u;
#if defined(COUNTERFLUX_MCU_STDIO)
    initialise_monitor_handles();
#endif
    __libc_init_array();
    static char name[] = "counterflux_mcu";
    static char* argv[] = {name, 0};
#if defined(COUNTERFLUX_MCU_STDIO)
    /* newlib's exit flushes stdio and reaches the host through rdimon's _exit. */
    exit(main(1, argv));
#else
    /* No stdio to flush; rdimon's _exit passes the status on only once its
     * semihosting handles are open, so report it directly. */
    cf_mcu_exit(main(1, argv));
#endif
}

/* Called with the exception frame (r0-r3, r12, lr, pc, xpsr) the core pushed. */
void cf_fault_report(const uint32_t* frame, uint32_t ipsr) __attribute__((noreturn, used));
void cf_fault_report(const uint32_t* frame, uint32_t ipsr) {
    static const char* const names[] = {"thread", "reset", "NMI", "HardFault", "MemManage",
                                        "BusFault", "UsageFault"};
    cf_mcu_write("\ncounterflux mcu: ");
    cf_mcu_write(ipsr < 7u ? names[ipsr] : "unexpected exception");
    cf_mcu_write(" (exception ");
    cf_mcu_write_unsigned(ipsr);
    cf_mcu_write(") at pc ");
    cf_mcu_write_unsigned(frame[6]);
    cf_mcu_write(", lr ");
    cf_mcu_write_unsigned(frame[5]);
    cf_mcu_write(" (decimal addresses)\n");
    cf_mcu_exit(70);
}

/* Every exception but reset: hand the frame and the exception number over. */
void cf_fault_handler(void) __attribute__((naked));
void cf_fault_handler(void) {
    __asm__ volatile(
        "mov r0, sp\n\t"
        "mrs r1, ipsr\n\t"
        "ldr r2, =cf_fault_report\n\t"
        "bx r2\n\t");
}

typedef void (*cf_vector)(void);

__attribute__((section(".isr_vector"), used)) const cf_vector cf_vector_table[16] = {
    (cf_vector)(uintptr_t)__stack_top__,
    cf_reset_handler,
    cf_fault_handler, /* NMI */
    cf_fault_handler, /* HardFault */
    cf_fault_handler, /* MemManage */
    cf_fault_handler, /* BusFault */
    cf_fault_handler, /* UsageFault */
    0, 0, 0, 0,
    cf_fault_handler, /* SVCall */
    cf_fault_handler, /* DebugMonitor */
    0,
    cf_fault_handler, /* PendSV */
    cf_fault_handler, /* SysTick */
};
