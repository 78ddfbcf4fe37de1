// counterflux/counterflux.hpp - umbrella header: the whole firmware library.
// Every header also works on its own.
#ifndef COUNTERFLUX_COUNTERFLUX_HPP
#define COUNTERFLUX_COUNTERFLUX_HPP

#include "ambient.hpp"
#include "barrier.hpp"
#include "compensation.hpp"
#include "constants.hpp"
#include "crc32.hpp"
#include "diffusivity.hpp"
#include "flux.hpp"
#include "gases.hpp"
#include "record.hpp"
#include "series.hpp"
#include "signal.hpp"
#include "status.hpp"
#include "table.hpp"
#include "transient.hpp"
#include "units.hpp"

#endif  // COUNTERFLUX_COUNTERFLUX_HPP
