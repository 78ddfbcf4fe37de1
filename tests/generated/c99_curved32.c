/* C99 translation unit of the generated flue_o2.h (stagnant law, float32). */
#include "flue_o2.h"
#include "wrappers.h"

float curved32_reading(float i, float t, float p, unsigned *s) { return flue_o2_reading(i, t, p, s); }
float curved32_proven_error(void) { return FLUE_O2_PROVEN_ERROR; }
