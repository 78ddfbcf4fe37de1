// counterflux/detail/checked.hpp - the last step of a public function: a
// value that overflowed is saturated and flagged. Internal.
#ifndef COUNTERFLUX_DETAIL_CHECKED_HPP
#define COUNTERFLUX_DETAIL_CHECKED_HPP

#include "../status.hpp"
#include "math.hpp"

namespace counterflux {
namespace detail {

/// {value, s} when value is finite; else {+-max (0 for NaN), s | out_of_domain}.
template <class T>
constexpr result<T> checked(T value, status s = status::ok) noexcept {
    if (finite(value)) return {value, s};
    return {finite_or_max(value), s | status::out_of_domain};
}

}  // namespace detail
}  // namespace counterflux

#endif  // COUNTERFLUX_DETAIL_CHECKED_HPP
