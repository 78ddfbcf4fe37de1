/* bench/instructions/reading_loop.c - the generated reading in a minimal loop,
 * for an instruction count under callgrind (scripts/count-instructions.sh).
 *
 * Two loops over the same 64 inputs (signal, temperature, pressure spread over
 * the table, varied every call): one calls the generated garage_co_reading()
 * with a status pointer, the other a plain bilinear kernel of the same table
 * with no clamping, no flags, no zero table and no inverse, for scale. Each loop
 * is its own noinline function, so callgrind --toggle-collect counts it alone,
 * loop overhead included. Compiled at -O2 whatever the build type. */
#include <stdio.h>
#include <stdlib.h>

#include "garage_co.h"

static float in_s[64], in_t[64], in_p[64];

static inline float plain_bilinear(float t, float p)
{
    const float tt = (t - GARAGE_CO_TEMPERATURE_FROM_K) * GARAGE_CO_TEMPERATURE_INV_STEP;
    const float tp = (p - GARAGE_CO_PRESSURE_FROM_PA) * GARAGE_CO_PRESSURE_INV_STEP;
    const int it = (int)tt, ip = (int)tp;
    const float ft = tt - (float)it, fp = tp - (float)ip;
    const float *v = garage_co_gain_table + it * GARAGE_CO_PRESSURE_COUNT + ip;
    const float a = v[0] + fp * (v[1] - v[0]);
    const float b = v[GARAGE_CO_PRESSURE_COUNT] + fp * (v[GARAGE_CO_PRESSURE_COUNT + 1] - v[GARAGE_CO_PRESSURE_COUNT]);
    return a + ft * (b - a);
}

__attribute__((noinline)) float loop_reading(int n)
{
    float acc = 0.0f;
    unsigned flags = 0u;
    int k;
    for (k = 0; k < n; ++k) {
        unsigned st;
        const int j = k & 63;
        acc += garage_co_reading(in_s[j], in_t[j], in_p[j], &st);
        flags |= st;
    }
    return acc + (float)flags;
}

__attribute__((noinline)) float loop_plain(int n)
{
    float acc = 0.0f;
    int k;
    for (k = 0; k < n; ++k) {
        const int j = k & 63;
        acc += plain_bilinear(in_t[j], in_p[j]) * in_s[j];
    }
    return acc;
}

int main(int argc, char **argv)
{
    const int n = argc > 1 ? atoi(argv[1]) : 100000;
    int j;
    /* inside the table, away from its last node: the common case the goal is about */
    for (j = 0; j < 64; ++j) {
        in_t[j] = GARAGE_CO_TEMPERATURE_FROM_K + 1.0f + 1.05f * (float)j;
        in_p[j] = GARAGE_CO_PRESSURE_FROM_PA + 100.0f + (float)((j * 37) % 64) * 245.0f;
        in_s[j] = 1.0e-7f * (float)(j % 17);
    }
    printf("%g %g\n", (double)loop_reading(n), (double)loop_plain(n));
    return 0;
}
