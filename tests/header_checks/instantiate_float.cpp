// Every public function of the library instantiated for float (see instantiate_api.inc).
#define COUNTERFLUX_REAL float
#include "instantiate_api.inc"
