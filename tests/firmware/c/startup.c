/*
 * Reset handler and vector table of the C-firmware test: enable the FPU before any
 * floating-point instruction, copy .data from flash, zero .bss, then hand over to
 * newlib's C start-up (_start, from rdimon-crt0), which calls main. Every fault stops the
 * run through semihosting with a failure status, so QEMU exits instead of hanging.
 */
#include <stdint.h>

extern uint32_t __data_start__, __data_end__, __data_load__, __bss_start__, __bss_end__, __StackTop;
extern void _start(void);
void semihosting_exit(int success);

void reset_handler(void) {
    volatile uint32_t *cpacr = (volatile uint32_t *)0xE000ED88u;
    uint32_t *src = &__data_load__;
    uint32_t *dst;
    *cpacr |= 0xFu << 20; /* CP10 and CP11: full access to the FPU */
    __asm__ volatile("dsb\n\tisb" ::: "memory");
    for (dst = &__data_start__; dst < &__data_end__;) {
        *dst++ = *src++;
    }
    for (dst = &__bss_start__; dst < &__bss_end__;) {
        *dst++ = 0;
    }
    _start();
    semihosting_exit(0);
}

static void fault_handler(void) {
    semihosting_exit(0);
}

__attribute__((section(".vectors"), used)) static void (*const vectors[16])(void) = {
    (void (*)(void))(&__StackTop), reset_handler, fault_handler, fault_handler, fault_handler, fault_handler,
    fault_handler, 0, 0, 0, 0, fault_handler, fault_handler, 0, fault_handler, fault_handler,
};
