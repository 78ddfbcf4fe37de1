/* C99 translation unit of the generated garage_co.h (q15). */
#include "garage_co.h"
#include "wrappers.h"

float q15_span(float t, float p, unsigned *s) { return garage_co_span(t, p, s); }
float q15_zero(float t, unsigned *s) { return garage_co_zero(t, s); }
float q15_reading(float i, float t, float p, unsigned *s) { return garage_co_reading(i, t, p, s); }
int32_t q15_reading_fixed(int32_t i, int32_t t, int32_t p, unsigned *s) { return garage_co_reading_fixed(i, t, p, s); }
float q15_proven_error(void) { return GARAGE_CO_PROVEN_ERROR; }
float q15_fixed_proven_error(void) { return GARAGE_CO_FIXED_PROVEN_ERROR; }
