// counterflux/record.hpp - the binary calibration record: the compensation
// tables of one sensor design or one calibrated unit, for an EEPROM or a flash
// sector, written by the desktop command and read in place by firmware.
//
// The layout, byte by byte, is in docs/record-format.md: a fixed little-endian
// header of 164 bytes (magic, version, value type, report, total size, source
// hash, symbol, unit identifier, reference condition, gain, full scale, three
// axes, four scales), the tables (correction, zero, curvature, shape, in that
// order; IEEE-754 binary32 or int16, little-endian), zero padding to a multiple
// of 4 bytes, and a CRC-32/ISO-HDLC trailer over every byte before it
// (crc32.hpp). Every multi-byte field is assembled from its bytes by shifts, so
// a record is read in place from any address (no alignment needed) on a host of
// either byte order; binary32 values are converted from their bits with
// std::ldexp (IEEE 754-2008 sec. 3.4, binary32: 1 sign bit, 8 exponent bits
// with bias 127, 23 fraction bits), which is exact and needs no <cstring>.
//
// Validation never allocates and never copies: validate_record() returns a
// record_view into the caller's bytes, or the reason it refused them.
#ifndef COUNTERFLUX_RECORD_HPP
#define COUNTERFLUX_RECORD_HPP

#include <cmath>
#include <cstddef>
#include <cstdint>
#include <limits>

#include "crc32.hpp"
#include "status.hpp"

namespace counterflux {

/// The record's magic number: the bytes "CFLX" at offset 0 (read as a little-endian uint32).
inline constexpr std::uint32_t record_magic = 0x584C4643u;

/// The format version this library writes and reads.
inline constexpr std::uint16_t record_version = 1;

/// Bytes of the fixed header (a multiple of 4); the tables start here.
inline constexpr std::size_t record_header_size = 164;

/// Bytes of each string field (symbol, unit identifier), NUL terminator included.
inline constexpr std::size_t record_string_size = 32;

/// Largest record, in bytes, the library writes or accepts (1 MiB).
inline constexpr std::size_t record_max_size = std::size_t(1) << 20;

/// Why a record was refused; none for a valid one.
enum class record_fault : std::uint8_t {
    none,             ///< valid
    truncated,        ///< shorter than the header or than its declared size
    wrong_magic,      ///< the first four bytes are not record_magic
    unknown_version,  ///< a format version this library does not read
    size_mismatch,    ///< longer than its declared size
    crc_mismatch,     ///< the CRC-32 trailer does not match the bytes before it
    bad_contents,     ///< a field out of its allowed range (see docs/record-format.md)
};

/// Short English text of a fault ("no fault" for none).
constexpr const char* describe(record_fault f) noexcept {
    switch (f) {
        case record_fault::none: return "no fault";
        case record_fault::truncated: return "truncated (shorter than its header or its declared size)";
        case record_fault::wrong_magic: return "wrong magic number (not a counterflux calibration record)";
        case record_fault::unknown_version: return "unknown format version";
        case record_fault::size_mismatch: return "size mismatch (longer than its declared size)";
        case record_fault::crc_mismatch: return "CRC-32 mismatch (damaged or altered)";
        case record_fault::bad_contents: return "bad contents (a field outside its allowed range)";
    }
    return "unknown fault";
}

/// status::ok for record_fault::none, status::invalid_record for any fault.
constexpr status record_status(record_fault f) noexcept {
    return f == record_fault::none ? status::ok : status::invalid_record;
}

/// How the table values are stored.
enum class record_values : std::uint8_t {
    float32 = 1,  ///< IEEE-754 binary32, little-endian
    q15 = 2,      ///< int16 little-endian, value = offset + scale * q / 32768
};

/// What the reading is.
enum class record_report : std::uint8_t {
    mole_fraction = 0,     ///< mol/mol
    partial_pressure = 1,  ///< Pa
};

/// The four tables a record can hold, in their order in the record.
enum class record_table : std::uint8_t {
    correction,  ///< span correction c(T, P) = 1/s, dimensionless, on the temperature x pressure grid
    zero,        ///< zero current I0(T) in A, on the temperature axis
    curvature,   ///< linearity-law coefficient gamma(T, P) (1/(mol/mol) or 1/Pa), same grid as correction
    shape,       ///< shape function h(z), dimensionless, on the shape axis
};

/// Number of record_table values.
inline constexpr std::size_t record_table_count = 4;

/// A uniform axis: node i = from + i * step (SI: K, Pa, or dimensionless z).
struct record_axis {
    float from;           ///< first node
    float step;           ///< node spacing, > 0
    std::uint16_t count;  ///< nodes (>= 2; the shape axis 0 for a linear law)
};

/// The decoding of a q15 table: value = offset + scale * q / 32768; {1, 0} in float32 records.
struct record_scale {
    float scale;   ///< value units per full-scale q15 step (q = 32768)
    float offset;  ///< value at q = 0
};

/// What write_record serialises (every pointer is borrowed, none is kept).
struct record_contents {
    const char* symbol;              ///< C identifier, 1 to 31 characters
    const char* unit_id;             ///< serial number, <= 31 printable ASCII; "" or nullptr: a design table
    record_values values;            ///< how the tables are stored
    record_report report;            ///< what the reading is
    float reference_temperature_K;   ///< calibration temperature, K (> 0)
    float reference_pressure_Pa;     ///< calibration pressure, Pa (> 0)
    float gain;                      ///< reading per ampere at the reference ((mol/mol)/A or Pa/A, > 0)
    float full_scale;                ///< full scale in reading units (mol/mol or Pa, > 0)
    std::uint32_t source_hash;       ///< e.g. CRC-32 of the sensor file, for traceability
    record_axis temperature;         ///< K; the correction and curvature grids are [it * pressure.count + ip]
    record_axis pressure;            ///< Pa
    record_axis shape;               ///< z (dimensionless); count == 0: linear law, no curvature and no shape table
    record_scale scales[4];          ///< per record_table (q15 records; written as {1, 0} in float32 records)
    const float* data_f32[4];        ///< per record_table (float32 records), nullptr when absent
    const std::int16_t* data_q15[4]; ///< per record_table (q15 records), nullptr when absent
};

namespace detail {

// Byte offsets of the header fields (docs/record-format.md).
inline constexpr std::size_t rec_magic = 0;
inline constexpr std::size_t rec_version = 4;
inline constexpr std::size_t rec_values = 6;
inline constexpr std::size_t rec_report = 7;
inline constexpr std::size_t rec_total_size = 8;
inline constexpr std::size_t rec_source_hash = 12;
inline constexpr std::size_t rec_symbol = 16;
inline constexpr std::size_t rec_unit_id = 48;
inline constexpr std::size_t rec_reference_temperature = 80;
inline constexpr std::size_t rec_reference_pressure = 84;
inline constexpr std::size_t rec_gain = 88;
inline constexpr std::size_t rec_full_scale = 92;
inline constexpr std::size_t rec_axes = 96;    // temperature, pressure, shape: 12 bytes each
inline constexpr std::size_t rec_axis_size = 12;
inline constexpr std::size_t rec_scales = 132;  // four {scale, offset}: 8 bytes each
inline constexpr std::size_t rec_scale_size = 8;
inline constexpr std::size_t rec_crc_size = 4;
static_assert(rec_scales + 4 * rec_scale_size == record_header_size, "header layout");
static_assert(record_header_size % 4 == 0, "the header is a multiple of 4 bytes");

/// Little-endian uint16 at p (any alignment).
constexpr std::uint16_t load_u16(const std::uint8_t* p) noexcept {
    return static_cast<std::uint16_t>(static_cast<unsigned>(p[0]) | (static_cast<unsigned>(p[1]) << 8));
}

/// Little-endian uint32 at p (any alignment).
constexpr std::uint32_t load_u32(const std::uint8_t* p) noexcept {
    return static_cast<std::uint32_t>(p[0]) | (static_cast<std::uint32_t>(p[1]) << 8) |
           (static_cast<std::uint32_t>(p[2]) << 16) | (static_cast<std::uint32_t>(p[3]) << 24);
}

/// Stores v little-endian at p.
constexpr void store_u16(std::uint8_t* p, std::uint16_t v) noexcept {
    p[0] = static_cast<std::uint8_t>(v & 0xFFu);
    p[1] = static_cast<std::uint8_t>((v >> 8) & 0xFFu);
}

/// Stores v little-endian at p.
constexpr void store_u32(std::uint8_t* p, std::uint32_t v) noexcept {
    for (int k = 0; k < 4; ++k) p[k] = static_cast<std::uint8_t>((v >> (8 * k)) & 0xFFu);
}

/// True when the binary32 bit pattern is a finite number (its exponent is not all ones).
constexpr bool f32_bits_finite(std::uint32_t bits) noexcept { return ((bits >> 23) & 0xFFu) != 0xFFu; }

/// The float whose IEEE-754 binary32 bit pattern is bits (exact; NaN payloads are not kept).
inline float f32_from_bits(std::uint32_t bits) noexcept {
    const bool negative = (bits >> 31) != 0u;
    const std::uint32_t exponent = (bits >> 23) & 0xFFu;
    const std::uint32_t fraction = bits & 0x7FFFFFu;
    float magnitude;
    if (exponent == 0xFFu) {
        magnitude = fraction == 0u ? std::numeric_limits<float>::infinity() : std::numeric_limits<float>::quiet_NaN();
    } else if (exponent == 0u) {
        // Subnormal (or zero): fraction * 2^-149; fraction < 2^23 converts exactly.
        magnitude = std::ldexp(static_cast<float>(fraction), -149);
    } else {
        // Normal: (2^23 + fraction) * 2^(exponent - 127 - 23); the integer < 2^24 converts exactly.
        magnitude = std::ldexp(static_cast<float>(fraction | 0x800000u), static_cast<int>(exponent) - 150);
    }
    return negative ? -magnitude : magnitude;
}

/// The IEEE-754 binary32 bit pattern of x (exact; every NaN becomes the quiet NaN 0x7FC00000).
inline std::uint32_t f32_to_bits(float x) noexcept {
    const std::uint32_t sign = std::signbit(x) ? 0x80000000u : 0u;
    if (x != x) return 0x7FC00000u;
    const float a = std::fabs(x);
    if (a == std::numeric_limits<float>::infinity()) return sign | 0x7F800000u;
    if (a == 0.0f) return sign;
    if (a < std::numeric_limits<float>::min()) {
        // Subnormal: a = m * 2^-149 with m < 2^23 an integer.
        return sign | static_cast<std::uint32_t>(std::ldexp(a, 149));
    }
    int e = 0;
    const float m = std::frexp(a, &e);  // a = m * 2^e, m in [0.5, 1): biased exponent e + 126
    const auto significand = static_cast<std::uint32_t>(std::ldexp(m, 24));  // 2^23 .. 2^24 - 1, exact
    return sign | (static_cast<std::uint32_t>(e + 126) << 23) | (significand & 0x7FFFFFu);
}

/// Bytes per stored value.
constexpr std::size_t record_value_bytes(record_values v) noexcept { return v == record_values::q15 ? 2u : 4u; }

/// True for a value type this version stores.
constexpr bool known_values(std::uint8_t v) noexcept {
    return v == static_cast<std::uint8_t>(record_values::float32) || v == static_cast<std::uint8_t>(record_values::q15);
}

/// True for a report this version knows.
constexpr bool known_report(std::uint8_t r) noexcept {
    return r == static_cast<std::uint8_t>(record_report::mole_fraction) ||
           r == static_cast<std::uint8_t>(record_report::partial_pressure);
}

/// Values in table t for the axis counts nt, np, nh (nh = 0: linear law, no curvature or shape).
constexpr std::uint64_t record_table_values(record_table t, std::uint64_t nt, std::uint64_t np,
                                            std::uint64_t nh) noexcept {
    switch (t) {
        case record_table::correction: return nt * np;
        case record_table::zero: return nt;
        case record_table::curvature: return nh == 0u ? 0u : nt * np;
        case record_table::shape: return nh;
    }
    return 0u;
}

/// Total bytes of a record with these counts and value type (header, tables, padding, CRC); no cap applied.
constexpr std::uint64_t record_bytes(record_values v, std::uint64_t nt, std::uint64_t np, std::uint64_t nh) noexcept {
    std::uint64_t values = 0;
    for (std::size_t t = 0; t < record_table_count; ++t)
        values += record_table_values(static_cast<record_table>(t), nt, np, nh);
    std::uint64_t data = values * record_value_bytes(v);
    data = (data + 3u) & ~std::uint64_t(3u);  // zero padding to a multiple of 4
    return record_header_size + data + rec_crc_size;
}

/// True when a is a usable axis: count >= 2, from and step finite, step > 0, last node finite.
/// allow_empty also accepts {0, 0, 0} (the shape axis of a linear law).
inline bool record_axis_ok(const record_axis& a, bool allow_empty) noexcept {
    if (a.count == 0u) return allow_empty && f32_to_bits(a.from) == 0u && f32_to_bits(a.step) == 0u;
    if (a.count < 2u) return false;
    if (!(std::isfinite(a.from) && std::isfinite(a.step) && a.step > 0.0f)) return false;
    return std::isfinite(a.from + static_cast<float>(a.count - 1u) * a.step);
}

/// True when s is a C identifier of 1 to 31 characters (a NUL within the first 32 bytes).
constexpr bool record_symbol_ok(const char* s) noexcept {
    if (s == nullptr) return false;
    std::size_t n = 0;
    for (; n < record_string_size && s[n] != '\0'; ++n) {
        const char c = s[n];
        const bool alpha = (c >= 'a' && c <= 'z') || (c >= 'A' && c <= 'Z') || c == '_';
        const bool digit = c >= '0' && c <= '9';
        if (!alpha && !(digit && n > 0)) return false;
    }
    return n > 0 && n < record_string_size;
}

/// True when s is at most 31 printable ASCII characters (space to '~'); nullptr counts as "".
constexpr bool record_unit_id_ok(const char* s) noexcept {
    if (s == nullptr) return true;
    std::size_t n = 0;
    for (; n < record_string_size && s[n] != '\0'; ++n)
        if (s[n] < ' ' || s[n] > '~') return false;
    return n < record_string_size;
}

/// True when a header number that must be positive is finite and > 0.
inline bool record_positive(float x) noexcept { return std::isfinite(x) && x > 0.0f; }

}  // namespace detail

/// Bytes write_record writes for c (header, tables, padding, CRC-32); 0 when c
/// has an unknown value type or would exceed record_max_size. The counts of the
/// axes decide the size; the rest of c is checked by write_record.
constexpr std::size_t record_size(const record_contents& c) noexcept {
    if (!detail::known_values(static_cast<std::uint8_t>(c.values))) return 0;
    const std::uint64_t n = detail::record_bytes(c.values, c.temperature.count, c.pressure.count, c.shape.count);
    return n > record_max_size ? 0u : static_cast<std::size_t>(n);
}

namespace detail {

/// Why c cannot be written (bad_contents), or none.
inline record_fault contents_fault(const record_contents& c) noexcept {
    const auto bad = record_fault::bad_contents;
    if (!known_values(static_cast<std::uint8_t>(c.values))) return bad;
    if (!known_report(static_cast<std::uint8_t>(c.report))) return bad;
    if (!record_symbol_ok(c.symbol) || !record_unit_id_ok(c.unit_id)) return bad;
    if (!record_positive(c.reference_temperature_K) || !record_positive(c.reference_pressure_Pa) ||
        !record_positive(c.gain) || !record_positive(c.full_scale))
        return bad;
    if (!record_axis_ok(c.temperature, false) || !record_axis_ok(c.pressure, false)) return bad;
    if (c.shape.count != 0u && !record_axis_ok(c.shape, false)) return bad;  // a linear law's from/step are ignored
    if (record_size(c) == 0u) return bad;
    for (std::size_t t = 0; t < record_table_count; ++t) {
        const std::uint64_t n =
            record_table_values(static_cast<record_table>(t), c.temperature.count, c.pressure.count, c.shape.count);
        if (n == 0u) continue;
        if (c.values == record_values::float32) {
            const float* d = c.data_f32[t];
            if (d == nullptr) return bad;
            for (std::uint64_t i = 0; i < n; ++i)
                if (!std::isfinite(d[i])) return bad;
        } else {
            if (c.data_q15[t] == nullptr) return bad;
            if (!std::isfinite(c.scales[t].scale) || !std::isfinite(c.scales[t].offset)) return bad;
        }
    }
    return record_fault::none;
}

/// Writes a string field: the characters, then NULs up to record_string_size.
constexpr void store_string(std::uint8_t* p, const char* s) noexcept {
    std::size_t n = 0;
    if (s != nullptr)
        for (; n + 1 < record_string_size && s[n] != '\0'; ++n) p[n] = static_cast<std::uint8_t>(s[n]);
    for (; n < record_string_size; ++n) p[n] = 0u;
}

/// Writes an axis (count, from, step; reserved 0). An empty axis is written as {0, 0, 0}.
inline void store_axis(std::uint8_t* p, const record_axis& a) noexcept {
    const bool empty = a.count == 0u;
    store_u32(p, empty ? 0u : f32_to_bits(a.from));
    store_u32(p + 4, empty ? 0u : f32_to_bits(a.step));
    store_u16(p + 8, a.count);
    store_u16(p + 10, 0u);
}

/// The axis stored at p.
inline record_axis load_axis(const std::uint8_t* p) noexcept {
    return record_axis{f32_from_bits(load_u32(p)), f32_from_bits(load_u32(p + 4)), load_u16(p + 8)};
}

/// True when every byte in [p, p + n) is zero.
constexpr bool all_zero(const std::uint8_t* p, std::size_t n) noexcept {
    for (std::size_t i = 0; i < n; ++i)
        if (p[i] != 0u) return false;
    return true;
}

/// True when the string field at p holds a NUL and only NULs after it.
constexpr bool string_field_ok(const std::uint8_t* p) noexcept {
    std::size_t n = 0;
    while (n < record_string_size && p[n] != 0u) ++n;
    return n < record_string_size && all_zero(p + n, record_string_size - n);
}

}  // namespace detail

/// Serialises c into out[0, capacity): returns none and sets written to
/// record_size(c); bad_contents when c is not a valid record (symbol, strings,
/// reference, gain, full scale, axes, a missing or non-finite table), truncated
/// when capacity < record_size(c). On a fault written is 0 and out is untouched;
/// nothing beyond written is ever touched.
inline record_fault write_record(const record_contents& c, std::uint8_t* out, std::size_t capacity,
                                 std::size_t& written) noexcept {
    using namespace detail;
    written = 0;
    const record_fault fault = contents_fault(c);
    if (fault != record_fault::none) return fault;
    const std::size_t size = record_size(c);
    if (capacity < size) return record_fault::truncated;
    if (out == nullptr) return record_fault::bad_contents;

    store_u32(out + rec_magic, record_magic);
    store_u16(out + rec_version, record_version);
    out[rec_values] = static_cast<std::uint8_t>(c.values);
    out[rec_report] = static_cast<std::uint8_t>(c.report);
    store_u32(out + rec_total_size, static_cast<std::uint32_t>(size));
    store_u32(out + rec_source_hash, c.source_hash);
    store_string(out + rec_symbol, c.symbol);
    store_string(out + rec_unit_id, c.unit_id);
    store_u32(out + rec_reference_temperature, f32_to_bits(c.reference_temperature_K));
    store_u32(out + rec_reference_pressure, f32_to_bits(c.reference_pressure_Pa));
    store_u32(out + rec_gain, f32_to_bits(c.gain));
    store_u32(out + rec_full_scale, f32_to_bits(c.full_scale));
    store_axis(out + rec_axes, c.temperature);
    store_axis(out + rec_axes + rec_axis_size, c.pressure);
    store_axis(out + rec_axes + 2 * rec_axis_size, c.shape);

    std::size_t at = record_header_size;
    for (std::size_t t = 0; t < record_table_count; ++t) {
        const auto n = static_cast<std::size_t>(
            record_table_values(static_cast<record_table>(t), c.temperature.count, c.pressure.count, c.shape.count));
        // float32 records and absent tables store the identity scale {1, 0}.
        const bool scaled = c.values == record_values::q15 && n != 0u;
        std::uint8_t* s = out + rec_scales + t * rec_scale_size;
        store_u32(s, f32_to_bits(scaled ? c.scales[t].scale : 1.0f));
        store_u32(s + 4, f32_to_bits(scaled ? c.scales[t].offset : 0.0f));
        for (std::size_t i = 0; i < n; ++i) {
            if (c.values == record_values::float32) {
                store_u32(out + at, f32_to_bits(c.data_f32[t][i]));
                at += 4;
            } else {
                store_u16(out + at, static_cast<std::uint16_t>(c.data_q15[t][i]));
                at += 2;
            }
        }
    }
    while (at < size - rec_crc_size) out[at++] = 0u;  // padding to a multiple of 4
    store_u32(out + at, crc32(out, at));
    written = size;
    return record_fault::none;
}

class record_view;
struct record_check;
record_check validate_record(const std::uint8_t* bytes, std::size_t size) noexcept;

/// A validated view of a record, read in place (no copy, no allocation). Only
/// validate_record() builds a non-empty one; an empty view (default, or from a
/// refused record) answers "" / 0 / {0, 0, 0} everywhere. The bytes must
/// outlive the view.
class record_view {
public:
    /// An empty view.
    constexpr record_view() noexcept = default;

    /// True for a view of a validated record.
    constexpr bool valid() const noexcept { return data_ != nullptr; }

    /// The C identifier of the tables ("" for an empty view).
    const char* symbol() const noexcept { return string_at(detail::rec_symbol); }
    /// The unit identifier ("" for a design table or an empty view).
    const char* unit_id() const noexcept { return string_at(detail::rec_unit_id); }
    /// How the tables are stored (float32 for an empty view).
    record_values values() const noexcept {
        return valid() && data_[detail::rec_values] == static_cast<std::uint8_t>(record_values::q15)
                   ? record_values::q15
                   : record_values::float32;
    }
    /// What the reading is (mole_fraction for an empty view).
    record_report report() const noexcept {
        return valid() && data_[detail::rec_report] == static_cast<std::uint8_t>(record_report::partial_pressure)
                   ? record_report::partial_pressure
                   : record_report::mole_fraction;
    }
    /// Calibration temperature, K.
    float reference_temperature_K() const noexcept { return f32_at(detail::rec_reference_temperature); }
    /// Calibration pressure, Pa.
    float reference_pressure_Pa() const noexcept { return f32_at(detail::rec_reference_pressure); }
    /// Reading per ampere at the reference, (mol/mol)/A or Pa/A.
    float gain() const noexcept { return f32_at(detail::rec_gain); }
    /// Full scale in reading units, mol/mol or Pa.
    float full_scale() const noexcept { return f32_at(detail::rec_full_scale); }
    /// The traceability hash the writer stored (e.g. CRC-32 of the sensor file).
    std::uint32_t source_hash() const noexcept { return u32_at(detail::rec_source_hash); }
    /// The CRC-32 trailer (of every byte before it).
    std::uint32_t crc32() const noexcept {
        return valid() ? detail::load_u32(data_ + size_ - detail::rec_crc_size) : 0u;
    }
    /// Temperature axis, K.
    record_axis temperature() const noexcept { return axis_at(0); }
    /// Pressure axis, Pa.
    record_axis pressure() const noexcept { return axis_at(1); }
    /// Shape axis (z, dimensionless); count 0 for a linear law.
    record_axis shape() const noexcept { return axis_at(2); }
    /// True when the record has no curvature and no shape table (the linear law).
    bool linear() const noexcept { return shape().count == 0u; }
    /// Decoding of table t: value = offset + scale * q / 32768 ({1, 0} for float32 records and absent tables).
    record_scale scale(record_table t) const noexcept {
        if (!valid()) return record_scale{1.0f, 0.0f};
        const std::uint8_t* s = data_ + detail::rec_scales + static_cast<std::size_t>(t) * detail::rec_scale_size;
        return record_scale{detail::f32_from_bits(detail::load_u32(s)), detail::f32_from_bits(detail::load_u32(s + 4))};
    }
    /// Values in table t (0 when absent or for an empty view).
    std::size_t count(record_table t) const noexcept {
        if (!valid()) return 0;
        return static_cast<std::size_t>(
            detail::record_table_values(t, temperature().count, pressure().count, shape().count));
    }
    /// Value i of table t, decoded (q15 through its scale; saturated to the largest
    /// finite float should offset + scale * q overflow); 0 for i out of range.
    float value(record_table t, std::size_t i) const noexcept {
        if (i >= count(t)) return 0.0f;
        const std::uint8_t* p = table_at(t);
        if (values() == record_values::float32) return detail::f32_from_bits(detail::load_u32(p + 4 * i));
        const auto q = static_cast<std::int16_t>(detail::load_u16(p + 2 * i));
        const record_scale s = scale(t);
        const float v = s.offset + s.scale * (static_cast<float>(q) * (1.0f / 32768.0f));
        if (std::isfinite(v)) return v;
        return v > 0.0f ? std::numeric_limits<float>::max() : -std::numeric_limits<float>::max();
    }
    /// Stored int16 i of table t (q15 records only; 0 for float32 records or i out of range).
    std::int16_t raw_q15(record_table t, std::size_t i) const noexcept {
        if (values() != record_values::q15 || i >= count(t)) return 0;
        return static_cast<std::int16_t>(detail::load_u16(table_at(t) + 2 * i));
    }
    /// The record's first byte (nullptr for an empty view).
    const std::uint8_t* data() const noexcept { return data_; }
    /// The record's size in bytes, CRC trailer included (0 for an empty view).
    std::size_t size() const noexcept { return size_; }

private:
    constexpr record_view(const std::uint8_t* data, std::size_t size) noexcept : data_(data), size_(size) {}
    friend record_check validate_record(const std::uint8_t* bytes, std::size_t size) noexcept;

    const char* string_at(std::size_t offset) const noexcept {
        return valid() ? reinterpret_cast<const char*>(data_ + offset) : "";
    }
    std::uint32_t u32_at(std::size_t offset) const noexcept { return valid() ? detail::load_u32(data_ + offset) : 0u; }
    float f32_at(std::size_t offset) const noexcept { return detail::f32_from_bits(u32_at(offset)); }
    record_axis axis_at(std::size_t k) const noexcept {
        if (!valid()) return record_axis{0.0f, 0.0f, 0u};
        return detail::load_axis(data_ + detail::rec_axes + k * detail::rec_axis_size);
    }
    const std::uint8_t* table_at(record_table t) const noexcept {
        std::size_t at = record_header_size;
        for (std::size_t k = 0; k < static_cast<std::size_t>(t); ++k)
            at += count(static_cast<record_table>(k)) * detail::record_value_bytes(values());
        return data_ + at;
    }

    const std::uint8_t* data_ = nullptr;
    std::size_t size_ = 0;
};

/// The outcome of validate_record: a usable view when fault is none, else an empty view.
struct record_check {
    record_view view;    ///< the validated record (empty unless fault is none)
    record_fault fault;  ///< why the bytes were refused; none when valid
};

/// Validates size bytes at bytes as a record, in place. Checks, in order:
/// size >= header + CRC (else truncated); magic (wrong_magic); version
/// (unknown_version); declared total size against size (truncated when size is
/// shorter, size_mismatch when longer); the CRC-32 trailer (crc_mismatch); then
/// the contents (bad_contents): value type and report known, strings
/// NUL-terminated and NUL-padded, symbol a C identifier, unit identifier
/// printable, reference, gain and full scale finite and > 0, axes with counts
/// >= 2 (shape: 0 or >= 2), finite from and step, step > 0, reserved bytes
/// zero, declared size equal to the size the counts give, scales {1, 0} in
/// float32 records and for absent tables and finite otherwise, float32 values
/// finite, padding zero, total size at most record_max_size.
inline record_check validate_record(const std::uint8_t* bytes, std::size_t size) noexcept {
    using namespace detail;
    const auto refuse = [](record_fault f) { return record_check{record_view{}, f}; };
    if (bytes == nullptr || size < record_header_size + rec_crc_size) return refuse(record_fault::truncated);
    if (load_u32(bytes + rec_magic) != record_magic) return refuse(record_fault::wrong_magic);
    if (load_u16(bytes + rec_version) != record_version) return refuse(record_fault::unknown_version);
    const std::uint32_t total = load_u32(bytes + rec_total_size);
    if (size < total) return refuse(record_fault::truncated);
    if (size > total) return refuse(record_fault::size_mismatch);
    if (crc32(bytes, size - rec_crc_size) != load_u32(bytes + size - rec_crc_size))
        return refuse(record_fault::crc_mismatch);
    if (total > record_max_size) return refuse(record_fault::bad_contents);

    // Contents.
    const auto bad = refuse(record_fault::bad_contents);
    const std::uint8_t values_byte = bytes[rec_values];
    if (!known_values(values_byte) || !known_report(bytes[rec_report])) return bad;
    if (!string_field_ok(bytes + rec_symbol) || !string_field_ok(bytes + rec_unit_id)) return bad;
    if (!record_symbol_ok(reinterpret_cast<const char*>(bytes + rec_symbol)) ||
        !record_unit_id_ok(reinterpret_cast<const char*>(bytes + rec_unit_id)))
        return bad;
    for (std::size_t offset = rec_reference_temperature; offset <= rec_full_scale; offset += 4) {
        const std::uint32_t bits = load_u32(bytes + offset);
        if (!f32_bits_finite(bits) || !record_positive(f32_from_bits(bits))) return bad;
    }
    for (std::size_t k = 0; k < 3; ++k) {
        const std::uint8_t* a = bytes + rec_axes + k * rec_axis_size;
        if (load_u16(a + 10) != 0u) return bad;
        if (!f32_bits_finite(load_u32(a)) || !f32_bits_finite(load_u32(a + 4))) return bad;
        if (!record_axis_ok(load_axis(a), k == 2)) return bad;
    }
    const record_values v = static_cast<record_values>(values_byte);
    const std::uint16_t nt = load_u16(bytes + rec_axes + 8);
    const std::uint16_t np = load_u16(bytes + rec_axes + rec_axis_size + 8);
    const std::uint16_t nh = load_u16(bytes + rec_axes + 2 * rec_axis_size + 8);
    if (record_bytes(v, nt, np, nh) != total) return bad;

    std::size_t at = record_header_size;
    for (std::size_t t = 0; t < record_table_count; ++t) {
        const auto n = static_cast<std::size_t>(record_table_values(static_cast<record_table>(t), nt, np, nh));
        const std::uint8_t* s = bytes + rec_scales + t * rec_scale_size;
        const std::uint32_t scale = load_u32(s);
        const std::uint32_t offset = load_u32(s + 4);
        if (v == record_values::float32 || n == 0u) {
            if (scale != 0x3F800000u || offset != 0u) return bad;  // exactly {1.0f, +0.0f}
        } else if (!f32_bits_finite(scale) || !f32_bits_finite(offset)) {
            return bad;
        }
        if (v == record_values::float32) {
            for (std::size_t i = 0; i < n; ++i)
                if (!f32_bits_finite(load_u32(bytes + at + 4 * i))) return bad;
        }
        at += n * record_value_bytes(v);
    }
    if (!all_zero(bytes + at, size - rec_crc_size - at)) return bad;
    return record_check{record_view{bytes, size}, record_fault::none};
}

}  // namespace counterflux

#endif  // COUNTERFLUX_RECORD_HPP
