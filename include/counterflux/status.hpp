// counterflux/status.hpp - status flags carried next to every value that can fail.
//
// Errors are values: a result<T> holds the value and a set of status flags. A
// function that cannot produce a meaningful value still returns a finite one
// (clamped or zero) and says why in the flags; it never throws, never sets
// errno and never returns NaN for finite input.
#ifndef COUNTERFLUX_STATUS_HPP
#define COUNTERFLUX_STATUS_HPP

#include <cstdint>

namespace counterflux {

/// Bit flags describing what went wrong; status::ok (no bit set) means success.
enum class status : std::uint16_t {
    ok = 0,
    out_of_domain = 1u << 0,  ///< an input is outside the model's domain (negative length, T <= 0, ...)
    not_finite = 1u << 1,     ///< an input or intermediate was NaN or infinite
    not_converged = 1u << 2,  ///< an iterative solve hit its iteration cap
    unknown_gas = 1u << 3,    ///< a gas name is not in the table
    below_range = 1u << 4,    ///< an input was below an axis or range; the edge value was used
    above_range = 1u << 5,    ///< an input was above an axis or range; the edge value was used
    first_axis_below = 1u << 6,   ///< table lookup: the first axis (temperature) input was below its range
    first_axis_above = 1u << 7,   ///< table lookup: the first axis (temperature) input was above its range
    second_axis_below = 1u << 8,  ///< table lookup: the second axis (pressure) input was below its range
    second_axis_above = 1u << 9,  ///< table lookup: the second axis (pressure) input was above its range
    invalid_record = 1u << 10,    ///< a calibration record failed validation (see record.hpp for why)
};

/// Union of two flag sets.
constexpr status operator|(status a, status b) noexcept {
    return static_cast<status>(static_cast<std::uint16_t>(static_cast<std::uint16_t>(a) |
                                                          static_cast<std::uint16_t>(b)));
}

/// Adds the flags of b to a; returns a.
constexpr status& operator|=(status& a, status b) noexcept {
    a = a | b;
    return a;
}

/// True when any bit of flag is set in s (has(s, status::ok) is always false).
constexpr bool has(status s, status flag) noexcept {
    return (static_cast<std::uint16_t>(s) & static_cast<std::uint16_t>(flag)) != 0u;
}

/// Short English text of the lowest set flag of s; "ok" when none is set.
constexpr const char* describe(status s) noexcept {
    if (has(s, status::out_of_domain)) return "input out of domain";
    if (has(s, status::not_finite)) return "non-finite value";
    if (has(s, status::not_converged)) return "solver did not converge";
    if (has(s, status::unknown_gas)) return "unknown gas";
    if (has(s, status::below_range)) return "input below range, edge value used";
    if (has(s, status::above_range)) return "input above range, edge value used";
    if (has(s, status::first_axis_below)) return "first table axis below range, edge value used";
    if (has(s, status::first_axis_above)) return "first table axis above range, edge value used";
    if (has(s, status::second_axis_below)) return "second table axis below range, edge value used";
    if (has(s, status::second_axis_above)) return "second table axis above range, edge value used";
    if (has(s, status::invalid_record)) return "invalid calibration record";
    return "ok";
}

/// A value together with the status flags of the computation that made it.
template <class T>
struct result {
    T value;      ///< the value; finite even when code is not ok
    status code;  ///< status::ok on success

    /// True when no flag is set.
    constexpr bool ok() const noexcept { return code == status::ok; }
};

/// Builds a result from a value and a status (status::ok by default).
template <class T>
constexpr result<T> make_result(T value, status code = status::ok) noexcept {
    return result<T>{value, code};
}

}  // namespace counterflux

#endif  // COUNTERFLUX_STATUS_HPP
