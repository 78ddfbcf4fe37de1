// Every public function of the library instantiated for double (see instantiate_api.inc).
#define COUNTERFLUX_REAL double
#include "instantiate_api.inc"
