/* C99 translation unit of the generated flue_o2.h (stagnant law, q15). */
#include "flue_o2.h"
#include "wrappers.h"

float curved_span(float t, float p, unsigned *s) { return flue_o2_span(t, p, s); }
float curved_zero(float t, unsigned *s) { return flue_o2_zero(t, s); }
float curved_reading(float i, float t, float p, unsigned *s) { return flue_o2_reading(i, t, p, s); }
float curved_proven_error(void) { return FLUE_O2_PROVEN_ERROR; }
