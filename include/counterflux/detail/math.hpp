// counterflux/detail/math.hpp - small numeric helpers shared by the headers.
// Internal: include the public headers instead.
#ifndef COUNTERFLUX_DETAIL_MATH_HPP
#define COUNTERFLUX_DETAIL_MATH_HPP

#include <cmath>
#include <limits>

#if defined(__FINITE_MATH_ONLY__) && __FINITE_MATH_ONLY__
#error "counterflux needs IEEE NaN and infinity checks: do not build it with -ffast-math / -ffinite-math-only"
#endif

namespace counterflux {
namespace detail {

/// True when x is neither NaN nor infinite.
template <class T>
constexpr bool finite(T x) noexcept {
    // NaN fails the first test, +-inf the others. (Not x - x == 0: inf - inf is
    // NaN, which is not a constant expression, so finite(inf) would not be constexpr.)
    return x == x && x != std::numeric_limits<T>::infinity() && x != -std::numeric_limits<T>::infinity();
}

/// log1p(x)/x, continuous at x = 0 (value 1); for x > -1.
template <class T>
inline T log1p_over_x(T x) noexcept {
    // Below 1e-5 the truncated series is exact to double rounding (next term x^3/4).
    if (std::fabs(x) < T(1.0e-5)) return T(1) - x * (T(0.5) - x * (T(1) / T(3)));
    return std::log1p(x) / x;
}

/// expm1(x)/x, continuous at x = 0 (value 1).
template <class T>
inline T expm1_over_x(T x) noexcept {
    if (std::fabs(x) < T(1.0e-5)) return T(1) + x * (T(0.5) + x * (T(1) / T(6)));
    return std::expm1(x) / x;
}

/// x limited to [lo, hi].
template <class T>
constexpr T clamp(T x, T lo, T hi) noexcept {
    return x < lo ? lo : (hi < x ? hi : x);
}

/// Largest argument passed to exp before a result is flagged (exp(80) ~ 5.5e34 fits float).
template <class T>
constexpr T max_exponent() noexcept { return T(80); }

/// ln of the precision of T (about -16.6 for float, -36.7 for double): below
/// it, exp(z) no longer changes 1 + exp(z).
template <class T>
constexpr T saturation_exponent() noexcept {
    return static_cast<T>(std::numeric_limits<T>::digits) * T(-0.6931471805599453);
}

/// Largest finite value of T.
template <class T>
constexpr T max_finite() noexcept { return std::numeric_limits<T>::max(); }

/// x when finite; an overflowed x as +-max_finite with its sign; NaN as 0.
template <class T>
constexpr T finite_or_max(T x) noexcept {
    if (finite(x)) return x;
    if (!(x == x)) return T(0);
    return x > T(0) ? max_finite<T>() : -max_finite<T>();
}

}  // namespace detail
}  // namespace counterflux

#endif  // COUNTERFLUX_DETAIL_MATH_HPP
