/* tests/generated/wrappers.h - the generated headers' functions behind
 * distinct external names, so that one C++ test can call the functions of
 * several generated headers (each compiled in its own C99 translation unit). */
#ifndef COUNTERFLUX_TESTS_GENERATED_WRAPPERS_H
#define COUNTERFLUX_TESTS_GENERATED_WRAPPERS_H

#include <stdint.h>

#ifdef __cplusplus
extern "C" {
#endif

/* garage_co, float32 values */
float f32_span(float temperature_K, float pressure_Pa, unsigned *status);
float f32_zero(float temperature_K, unsigned *status);
float f32_reading(float signal_A, float temperature_K, float pressure_Pa, unsigned *status);
float f32_proven_error(void);

/* garage_co, q15 values, with the integer-only path */
float q15_span(float temperature_K, float pressure_Pa, unsigned *status);
float q15_zero(float temperature_K, unsigned *status);
float q15_reading(float signal_A, float temperature_K, float pressure_Pa, unsigned *status);
int32_t q15_reading_fixed(int32_t signal_pA, int32_t temperature_mK, int32_t pressure_Pa, unsigned *status);
float q15_proven_error(void);
float q15_fixed_proven_error(void);

/* flue_o2: a stagnant (curved) law, q15 values as the file asks */
float curved_span(float temperature_K, float pressure_Pa, unsigned *status);
float curved_zero(float temperature_K, unsigned *status);
float curved_reading(float signal_A, float temperature_K, float pressure_Pa, unsigned *status);
float curved_proven_error(void);

/* the same curved sensor with float32 values */
float curved32_reading(float signal_A, float temperature_K, float pressure_Pa, unsigned *status);
float curved32_proven_error(void);

#ifdef __cplusplus
}
#endif

#endif
