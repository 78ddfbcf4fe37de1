/* C99 translation unit of the generated garage_co.h (float32). */
#include "garage_co.h"
#include "wrappers.h"

float f32_span(float t, float p, unsigned *s) { return garage_co_span(t, p, s); }
float f32_zero(float t, unsigned *s) { return garage_co_zero(t, s); }
float f32_reading(float i, float t, float p, unsigned *s) { return garage_co_reading(i, t, p, s); }
float f32_proven_error(void) { return GARAGE_CO_PROVEN_ERROR; }
