// The calibration record (record.hpp) and its CRC-32 (crc32.hpp): published
// CRC check values, IEEE-754 binary32 bit patterns, the byte layout of
// docs/record-format.md, round trips of every field and value, and detection
// of every single-bit flip, every truncation, a wrong magic or version,
// trailing bytes and contents out of range.
#include <doctest/doctest.h>

#include <array>
#include <cmath>
#include <cstddef>
#include <cstdint>
#include <cstring>
#include <initializer_list>
#include <ios>
#include <limits>
#include <utility>

#include <counterflux/crc32.hpp>
#include <counterflux/record.hpp>

namespace cf = counterflux;

namespace {

// The nine ASCII bytes "123456789", the input of every catalogue check value.
constexpr std::uint8_t check_input[9] = {'1', '2', '3', '4', '5', '6', '7', '8', '9'};

// CRC-32/ISO-HDLC check value: G. Cook, "Catalogue of parametrised CRC
// algorithms" (CRC RevEng), entry CRC-32/ISO-HDLC, check = 0xcbf43926.
static_assert(cf::crc32(check_input, 9) == 0xCBF43926u, "CRC-32/ISO-HDLC check value");
static_assert(cf::crc32(nullptr, 0) == 0u, "CRC of no bytes");
static_assert(cf::crc32(check_input + 4, 5, cf::crc32(check_input, 4)) == 0xCBF43926u, "chained");

// Reference bit patterns from the definition of binary32 (IEEE 754-2008
// sec. 3.4: sign, 8-bit exponent with bias 127, 23 fraction bits); each
// pattern below is derived by hand from that definition in its comment.
struct bits_case {
    std::uint32_t bits;
    float value;
};
const bits_case binary32_cases[] = {
    {0x3F800000u, 1.0f},             // exponent 127, fraction 0
    {0xC0000000u, -2.0f},            // sign 1, exponent 128
    {0x3F000000u, 0.5f},             // exponent 126
    {0x40490FDBu, 3.14159274f},      // pi rounded to binary32: 1.5707964 * 2^1
    {0x3DCCCCCDu, 0.1f},             // 0.1 rounded to nearest: 1.6 * 2^-4, fraction 0x4CCCCD
    {0x00800000u, 1.17549435e-38f},  // smallest normal, 2^-126
    {0x00000001u, 1.40129846e-45f},  // smallest subnormal, 2^-149
    {0x007FFFFFu, 1.17549421e-38f},  // largest subnormal, (2^23 - 1) * 2^-149
    {0x7F7FFFFFu, 3.40282347e+38f},  // largest finite, (2 - 2^-23) * 2^127
    {0x80000000u, -0.0f},            // negative zero
    {0x00000000u, 0.0f},
    {0x4B800000u, 16777216.0f},      // 2^24
};

std::uint32_t host_bits(float x) {
    std::uint32_t b = 0;
    std::memcpy(&b, &x, sizeof b);
    return b;
}

// Little-endian fields read by hand from bytes, independently of record.hpp.
std::uint32_t le32(const std::uint8_t* p) {
    return std::uint32_t(p[0]) | std::uint32_t(p[1]) << 8 | std::uint32_t(p[2]) << 16 | std::uint32_t(p[3]) << 24;
}
std::uint16_t le16(const std::uint8_t* p) { return static_cast<std::uint16_t>(p[0] | p[1] << 8); }

// The CRC trailer recomputed after a deliberate edit, so that the contents
// checks (not the CRC) are what refuses the record.
void reseal(std::uint8_t* bytes, std::size_t size) {
    const std::uint32_t c = cf::crc32(bytes, size - 4);
    for (int k = 0; k < 4; ++k) bytes[size - 4 + std::size_t(k)] = static_cast<std::uint8_t>(c >> (8 * k));
}

void put32(std::uint8_t* p, std::uint32_t v) {
    for (int k = 0; k < 4; ++k) p[k] = static_cast<std::uint8_t>(v >> (8 * k));
}

// An invented sensor's tables: 3 temperatures x 2 pressures, optionally a
// 4-node shape axis. Values are arbitrary but distinct.
struct sample {
    std::array<float, 6> correction{};
    std::array<float, 3> zero{};
    std::array<float, 6> curvature{};
    std::array<float, 4> shape{};
    std::array<std::int16_t, 6> q_correction{};
    std::array<std::int16_t, 3> q_zero{};
    std::array<std::int16_t, 6> q_curvature{};
    std::array<std::int16_t, 4> q_shape{};
    cf::record_contents contents{};
};

sample make_sample(cf::record_values values, bool curved) {
    sample s;
    for (std::size_t i = 0; i < 6; ++i) {
        s.correction[i] = 1.0f + 0.0125f * float(i) - 0.003f * float(i * i);
        s.curvature[i] = 0.25f + 0.01f * float(i);
        s.q_correction[i] = static_cast<std::int16_t>(-32768 + 13107 * int(i));
        s.q_curvature[i] = static_cast<std::int16_t>(32767 - 9000 * int(i));
    }
    for (std::size_t i = 0; i < 3; ++i) {
        s.zero[i] = 1.0e-9f * float(i + 1);
        s.q_zero[i] = static_cast<std::int16_t>(-1 - 1000 * int(i));
    }
    for (std::size_t i = 0; i < 4; ++i) {
        s.shape[i] = 1.0f - 0.15f * float(i);
        s.q_shape[i] = static_cast<std::int16_t>(12345 - 7 * int(i));
    }
    cf::record_contents& c = s.contents;
    c.symbol = "demo_cell";
    c.unit_id = "SN-0042";
    c.values = values;
    c.report = curved ? cf::record_report::partial_pressure : cf::record_report::mole_fraction;
    c.reference_temperature_K = 293.15f;
    c.reference_pressure_Pa = 101325.0f;
    c.gain = 2000.0f;
    c.full_scale = 1.0e-3f;
    c.source_hash = 0x1234ABCDu;
    c.temperature = cf::record_axis{253.15f, 35.0f, 3};
    c.pressure = cf::record_axis{70000.0f, 40000.0f, 2};
    c.shape = curved ? cf::record_axis{0.0f, 0.5f, 4} : cf::record_axis{0.0f, 0.0f, 0};
    c.scales[0] = cf::record_scale{0.5f, 1.0f};
    c.scales[1] = cf::record_scale{4.0e-9f, -1.0e-10f};
    c.scales[2] = cf::record_scale{2.0f, 0.0f};
    c.scales[3] = cf::record_scale{1.0f, 0.5f};
    c.data_f32[0] = s.correction.data();
    c.data_f32[1] = s.zero.data();
    c.data_f32[2] = s.curvature.data();
    c.data_f32[3] = s.shape.data();
    c.data_q15[0] = s.q_correction.data();
    c.data_q15[1] = s.q_zero.data();
    c.data_q15[2] = s.q_curvature.data();
    c.data_q15[3] = s.q_shape.data();
    return s;
}

constexpr std::size_t buffer_size = 512;
using buffer = std::array<std::uint8_t, buffer_size>;

// Writes the sample into b; returns its size (the test stops on a fault).
std::size_t write(const sample& s, buffer& b) {
    std::size_t written = 0;
    REQUIRE(cf::write_record(s.contents, b.data(), b.size(), written) == cf::record_fault::none);
    REQUIRE(written == cf::record_size(s.contents));
    return written;
}

const float* f32_table(const sample& s, std::size_t t) { return s.contents.data_f32[t]; }
const std::int16_t* q15_table(const sample& s, std::size_t t) { return s.contents.data_q15[t]; }

void check_round_trip(const sample& s) {
    buffer b{};
    const std::size_t n = write(s, b);
    const cf::record_check r = cf::validate_record(b.data(), n);
    REQUIRE(r.fault == cf::record_fault::none);
    const cf::record_view& v = r.view;
    const cf::record_contents& c = s.contents;
    CHECK(v.valid());
    CHECK(std::strcmp(v.symbol(), c.symbol) == 0);
    CHECK(std::strcmp(v.unit_id(), c.unit_id) == 0);
    CHECK(v.values() == c.values);
    CHECK(v.report() == c.report);
    CHECK(host_bits(v.reference_temperature_K()) == host_bits(c.reference_temperature_K));
    CHECK(host_bits(v.reference_pressure_Pa()) == host_bits(c.reference_pressure_Pa));
    CHECK(host_bits(v.gain()) == host_bits(c.gain));
    CHECK(host_bits(v.full_scale()) == host_bits(c.full_scale));
    CHECK(v.source_hash() == c.source_hash);
    CHECK(v.crc32() == le32(b.data() + n - 4));
    CHECK(v.crc32() == cf::crc32(b.data(), n - 4));
    CHECK(v.data() == b.data());
    CHECK(v.size() == n);
    const cf::record_axis axes_in[3] = {c.temperature, c.pressure, c.shape};
    const cf::record_axis axes_out[3] = {v.temperature(), v.pressure(), v.shape()};
    for (int k = 0; k < 3; ++k) {
        CHECK(axes_out[k].count == axes_in[k].count);
        CHECK(host_bits(axes_out[k].from) == host_bits(axes_in[k].from));
        CHECK(host_bits(axes_out[k].step) == host_bits(axes_in[k].step));
    }
    const bool curved = c.shape.count != 0;
    CHECK(v.linear() == !curved);
    const std::size_t expected_counts[4] = {6, 3, curved ? 6u : 0u, curved ? 4u : 0u};
    for (std::size_t t = 0; t < 4; ++t) {
        const auto table = static_cast<cf::record_table>(t);
        REQUIRE(v.count(table) == expected_counts[t]);
        const cf::record_scale sc = v.scale(table);
        const bool q15 = c.values == cf::record_values::q15;
        if (q15 && expected_counts[t] != 0) {
            CHECK(host_bits(sc.scale) == host_bits(c.scales[t].scale));
            CHECK(host_bits(sc.offset) == host_bits(c.scales[t].offset));
        } else {
            CHECK(sc.scale == 1.0f);  // the identity scale of float32 records and absent tables
            CHECK(host_bits(sc.offset) == 0u);
        }
        for (std::size_t i = 0; i < expected_counts[t]; ++i) {
            if (q15) {
                const std::int16_t q = q15_table(s, t)[i];
                CHECK(v.raw_q15(table, i) == q);
                // value = offset + scale * q / 32768 (docs/record-format.md), in double.
                const double expected = double(sc.offset) + double(sc.scale) * double(q) / 32768.0;
                const double tol = 2.0 * double(std::numeric_limits<float>::epsilon()) *
                                   (std::fabs(double(sc.offset)) + std::fabs(double(sc.scale)));
                CHECK(std::fabs(double(v.value(table, i)) - expected) <= tol);
            } else {
                CHECK(host_bits(v.value(table, i)) == host_bits(f32_table(s, t)[i]));
                CHECK(v.raw_q15(table, i) == 0);
            }
        }
        CHECK(v.value(table, expected_counts[t]) == 0.0f);  // out of range
        CHECK(v.raw_q15(table, expected_counts[t]) == 0);
    }
}

// Every single-bit flip of the record in b[0, n) must be refused.
void check_every_bit_flip(buffer b, std::size_t n) {
    REQUIRE(cf::validate_record(b.data(), n).fault == cf::record_fault::none);
    std::size_t accepted = 0;
    for (std::size_t i = 0; i < n; ++i) {
        for (int bit = 0; bit < 8; ++bit) {
            b[i] = static_cast<std::uint8_t>(b[i] ^ (1u << bit));
            const cf::record_check r = cf::validate_record(b.data(), n);
            if (r.fault == cf::record_fault::none || r.view.valid()) {
                ++accepted;
                INFO("byte " << i << " bit " << bit);
                CHECK(r.fault != cf::record_fault::none);
            }
            b[i] = static_cast<std::uint8_t>(b[i] ^ (1u << bit));
        }
    }
    CHECK(accepted == 0);
    REQUIRE(cf::validate_record(b.data(), n).fault == cf::record_fault::none);
}

}  // namespace

TEST_CASE("crc32: the published CRC-32/ISO-HDLC check value and the empty string") {
    // CRC RevEng catalogue, CRC-32/ISO-HDLC: check = 0xcbf43926 for "123456789".
    CHECK(cf::crc32(check_input, sizeof check_input) == 0xCBF43926u);
    // No bytes: init 0xFFFFFFFF XOR final 0xFFFFFFFF = 0 (follows from the parameters).
    CHECK(cf::crc32(nullptr, 0) == 0u);
    CHECK(cf::crc32(check_input, 0) == 0u);
    CHECK(cf::crc32(check_input, 0, 0x12345678u) == 0x12345678u);
}

TEST_CASE("crc32: chaining over every split point equals one pass") {
    for (std::size_t k = 0; k <= sizeof check_input; ++k) {
        INFO("split at " << k);
        CHECK(cf::crc32(check_input + k, sizeof check_input - k, cf::crc32(check_input, k)) == 0xCBF43926u);
    }
    // Three parts.
    CHECK(cf::crc32(check_input + 7, 2, cf::crc32(check_input + 3, 4, cf::crc32(check_input, 3))) == 0xCBF43926u);
}

TEST_CASE("crc32: the catalogue residue and the zlib table entries") {
    // CRC RevEng catalogue, CRC-32/ISO-HDLC: residue = 0xdebb20e3, the register
    // after a message followed by its own CRC (little-endian, reflected); with the
    // final XOR applied the CRC of message + CRC is 0xdebb20e3 ^ 0xffffffff.
    std::array<std::uint8_t, 13> m{};
    for (std::size_t i = 0; i < 9; ++i) m[i] = check_input[i];
    put32(m.data() + 9, 0xCBF43926u);
    CHECK(cf::crc32(m.data(), m.size()) == (0xDEBB20E3u ^ 0xFFFFFFFFu));
    // Entries of the byte-wise table as printed in zlib's crc32.h and in
    // Williams' guide (quoted from memory): table[1], [128], [255].
    CHECK(cf::detail::crc32_table[0] == 0u);
    CHECK(cf::detail::crc32_table[1] == 0x77073096u);
    CHECK(cf::detail::crc32_table[128] == 0xEDB88320u);
    CHECK(cf::detail::crc32_table[255] == 0x2D02EF8Du);
}

TEST_CASE("record: binary32 bits are converted exactly both ways") {
    for (const bits_case& k : binary32_cases) {
        INFO("bits 0x" << std::hex << k.bits);
        CHECK(host_bits(k.value) == k.bits);  // the reference table itself, against the host
        CHECK(cf::detail::f32_to_bits(k.value) == k.bits);
        CHECK(host_bits(cf::detail::f32_from_bits(k.bits)) == k.bits);
    }
    CHECK(cf::detail::f32_to_bits(std::numeric_limits<float>::infinity()) == 0x7F800000u);
    CHECK(cf::detail::f32_to_bits(-std::numeric_limits<float>::infinity()) == 0xFF800000u);
    CHECK(std::isnan(cf::detail::f32_from_bits(0x7FC00000u)));
    CHECK(std::isinf(cf::detail::f32_from_bits(0xFF800000u)));
    // Every finite pattern of a sweep (a prime stride covers all exponents and
    // signs) against the host's own representation.
    std::size_t mismatches = 0;
    for (std::uint64_t b = 0; b <= 0xFFFFFFFFu; b += 65521u) {
        const auto bits = static_cast<std::uint32_t>(b);
        if (((bits >> 23) & 0xFFu) == 0xFFu) continue;
        float x = 0.0f;
        std::memcpy(&x, &bits, sizeof x);
        if (cf::detail::f32_to_bits(x) != bits || host_bits(cf::detail::f32_from_bits(bits)) != bits) ++mismatches;
    }
    CHECK(mismatches == 0);
}

TEST_CASE("record: the layout is the one docs/record-format.md describes") {
    const sample s = make_sample(cf::record_values::float32, false);
    buffer b{};
    const std::size_t n = write(s, b);
    // 164-byte header + (6 + 3) float32 values + CRC.
    REQUIRE(n == 164 + 9 * 4 + 4);
    const std::uint8_t* p = b.data();
    CHECK(p[0] == 'C');
    CHECK(p[1] == 'F');
    CHECK(p[2] == 'L');
    CHECK(p[3] == 'X');
    CHECK(le16(p + 4) == 1);                                   // version
    CHECK(p[6] == 1);                                          // float32
    CHECK(p[7] == 0);                                          // mole fraction
    CHECK(le32(p + 8) == n);                                   // total size
    CHECK(le32(p + 12) == 0x1234ABCDu);                        // source hash
    CHECK(std::memcmp(p + 16, "demo_cell\0\0\0", 12) == 0);   // symbol, NUL padded
    CHECK(std::memcmp(p + 48, "SN-0042\0\0\0", 10) == 0);     // unit identifier
    CHECK(le32(p + 80) == host_bits(293.15f));
    CHECK(le32(p + 84) == host_bits(101325.0f));
    CHECK(le32(p + 88) == host_bits(2000.0f));
    CHECK(le32(p + 92) == host_bits(1.0e-3f));
    CHECK(le32(p + 96) == host_bits(253.15f));                 // temperature axis
    CHECK(le32(p + 100) == host_bits(35.0f));
    CHECK(le16(p + 104) == 3);
    CHECK(le16(p + 106) == 0);
    CHECK(le32(p + 108) == host_bits(70000.0f));               // pressure axis
    CHECK(le32(p + 112) == host_bits(40000.0f));
    CHECK(le16(p + 116) == 2);
    for (std::size_t i = 120; i < 132; ++i) CHECK(p[i] == 0);  // no shape axis
    for (std::size_t t = 0; t < 4; ++t) {                      // identity scales
        CHECK(le32(p + 132 + 8 * t) == 0x3F800000u);
        CHECK(le32(p + 136 + 8 * t) == 0u);
    }
    for (std::size_t i = 0; i < 6; ++i) CHECK(le32(p + 164 + 4 * i) == host_bits(s.correction[i]));
    for (std::size_t i = 0; i < 3; ++i) CHECK(le32(p + 188 + 4 * i) == host_bits(s.zero[i]));
    CHECK(le32(p + 200) == cf::crc32(p, 200));
}

TEST_CASE("record: q15 values are int16 little-endian, padded to a multiple of 4") {
    const sample s = make_sample(cf::record_values::q15, true);
    buffer b{};
    const std::size_t n = write(s, b);
    // 6 + 3 + 6 + 4 = 19 int16 = 38 bytes, 2 bytes of padding.
    REQUIRE(n == 164 + 38 + 2 + 4);
    CHECK(n % 4 == 0);
    CHECK(b[6] == 2);
    CHECK(b[7] == 1);  // partial pressure
    CHECK(le16(b.data() + 164) == static_cast<std::uint16_t>(s.q_correction[0]));
    CHECK(le16(b.data() + 164) == 0x8000u);  // -32768 in two's complement
    CHECK(b[202] == 0);
    CHECK(b[203] == 0);
    CHECK(le32(b.data() + 132) == host_bits(0.5f));  // correction scale
    CHECK(le32(b.data() + 136) == host_bits(1.0f));  // correction offset
}

TEST_CASE("record: every field and value survives the round trip") {
    SUBCASE("float32, linear") { check_round_trip(make_sample(cf::record_values::float32, false)); }
    SUBCASE("float32, curved") { check_round_trip(make_sample(cf::record_values::float32, true)); }
    SUBCASE("q15, linear") { check_round_trip(make_sample(cf::record_values::q15, false)); }
    SUBCASE("q15, curved") { check_round_trip(make_sample(cf::record_values::q15, true)); }
    SUBCASE("empty unit identifier (a design table)") {
        sample s = make_sample(cf::record_values::float32, true);
        s.contents.unit_id = "";
        check_round_trip(s);
        s.contents.unit_id = nullptr;  // the same
        buffer b{};
        const std::size_t n = write(s, b);
        CHECK(std::strcmp(cf::validate_record(b.data(), n).view.unit_id(), "") == 0);
    }
    SUBCASE("longest strings") {
        sample s = make_sample(cf::record_values::q15, true);
        s.contents.symbol = "a234567890123456789012345678901";   // 31 characters
        s.contents.unit_id = "~ !\"#$%&'()*+,-./0123456789:;<=";  // 31 printable
        check_round_trip(s);
    }
}

TEST_CASE("record: every single-bit flip is detected") {
    SUBCASE("float32, curved") {
        buffer b{};
        const std::size_t n = write(make_sample(cf::record_values::float32, true), b);
        check_every_bit_flip(b, n);
    }
    SUBCASE("q15, curved (with padding)") {
        buffer b{};
        const std::size_t n = write(make_sample(cf::record_values::q15, true), b);
        check_every_bit_flip(b, n);
    }
}

TEST_CASE("record: truncation at every length is detected") {
    for (const auto values : {cf::record_values::float32, cf::record_values::q15}) {
        buffer b{};
        const std::size_t n = write(make_sample(values, true), b);
        std::size_t missed = 0;
        for (std::size_t len = 0; len < n; ++len) {
            const cf::record_check r = cf::validate_record(b.data(), len);
            if (r.fault != cf::record_fault::truncated || r.view.valid()) ++missed;
        }
        CHECK(missed == 0);
        CHECK(cf::validate_record(nullptr, n).fault == cf::record_fault::truncated);
    }
}

TEST_CASE("record: wrong magic, unknown version and trailing bytes are refused") {
    buffer b{};
    const std::size_t n = write(make_sample(cf::record_values::float32, true), b);
    SUBCASE("wrong magic, even with a matching CRC") {
        b[0] = 'X';
        reseal(b.data(), n);
        CHECK(cf::validate_record(b.data(), n).fault == cf::record_fault::wrong_magic);
    }
    SUBCASE("byte-swapped magic (a big-endian writer)") {
        std::swap(b[0], b[3]);
        std::swap(b[1], b[2]);
        CHECK(cf::validate_record(b.data(), n).fault == cf::record_fault::wrong_magic);
    }
    SUBCASE("versions 0, 2 and 0xFFFF, even with a matching CRC") {
        for (const std::uint16_t version : {std::uint16_t(0), std::uint16_t(2), std::uint16_t(0xFFFF)}) {
            b[4] = static_cast<std::uint8_t>(version & 0xFF);
            b[5] = static_cast<std::uint8_t>(version >> 8);
            reseal(b.data(), n);
            const cf::record_check r = cf::validate_record(b.data(), n);
            CHECK(r.fault == cf::record_fault::unknown_version);
            CHECK_FALSE(r.view.valid());
        }
    }
    SUBCASE("trailing bytes") {
        for (std::size_t extra = 1; extra <= 8; ++extra) {
            const cf::record_check r = cf::validate_record(b.data(), n + extra);
            CHECK(r.fault == cf::record_fault::size_mismatch);
            CHECK_FALSE(r.view.valid());
        }
    }
    SUBCASE("a damaged value") {
        b[170] = static_cast<std::uint8_t>(b[170] + 1);
        CHECK(cf::validate_record(b.data(), n).fault == cf::record_fault::crc_mismatch);
    }
}

TEST_CASE("record: contents out of range are refused by the validator, with a matching CRC") {
    const sample s = make_sample(cf::record_values::q15, true);
    buffer good{};
    const std::size_t n = write(s, good);
    // Each edit is resealed, so only the contents checks can catch it.
    const auto refused = [&](std::size_t offset, std::uint8_t value) {
        buffer b = good;
        b[offset] = value;
        reseal(b.data(), n);
        return cf::validate_record(b.data(), n).fault == cf::record_fault::bad_contents;
    };
    CHECK(refused(6, 0));        // value type 0
    CHECK(refused(6, 3));        // value type 3
    CHECK(refused(7, 2));        // report 2
    CHECK(refused(16, '7'));     // symbol starting with a digit
    CHECK(refused(16, 0));       // empty symbol (and bytes after the NUL)
    CHECK(refused(47, 'x'));     // symbol field: a byte after the NUL
    CHECK(refused(48, '\n'));    // control character in the unit identifier
    CHECK(refused(79, 'x'));     // unit field: a byte after the NUL
    CHECK(refused(83, 0xFF));    // reference temperature: a NaN
    CHECK(refused(83, 0xBF));    // reference temperature negative
    CHECK(refused(91, 0x80 | good[91]));  // gain negative
    CHECK(refused(104, 1));      // temperature count 1
    CHECK(refused(106, 1));      // axis reserved byte
    CHECK(refused(103, 0xBF));   // temperature step negative
    CHECK(refused(128, 1));      // shape count 1
    CHECK(refused(164 + 38, 1)); // padding not zero
    {
        buffer b = good;         // symbol field without any NUL
        for (std::size_t i = 16; i < 48; ++i) b[i] = 'a';
        reseal(b.data(), n);
        CHECK(cf::validate_record(b.data(), n).fault == cf::record_fault::bad_contents);
    }
    {
        buffer b = good;         // more temperatures than the bytes hold
        b[104] = 4;
        reseal(b.data(), n);
        CHECK(cf::validate_record(b.data(), n).fault == cf::record_fault::bad_contents);
    }
    {
        buffer b = good;         // scale infinite
        put32(b.data() + 132, 0x7F800000u);
        reseal(b.data(), n);
        CHECK(cf::validate_record(b.data(), n).fault == cf::record_fault::bad_contents);
    }
    {
        buffer f{};              // a float32 record with a NaN value or a non-identity scale
        const std::size_t m = write(make_sample(cf::record_values::float32, true), f);
        buffer b = f;
        put32(b.data() + 168, 0x7FC00000u);
        reseal(b.data(), m);
        CHECK(cf::validate_record(b.data(), m).fault == cf::record_fault::bad_contents);
        b = f;
        put32(b.data() + 132, host_bits(2.0f));
        reseal(b.data(), m);
        CHECK(cf::validate_record(b.data(), m).fault == cf::record_fault::bad_contents);
    }
    CHECK_FALSE(refused(20, good[20]));  // the unchanged record passes (the helper can say no)
}

TEST_CASE("record: the writer refuses bad contents and short buffers and touches nothing") {
    const auto untouched_after = [](const sample& s, std::size_t capacity, cf::record_fault expected) {
        buffer b{};
        b.fill(0xA5);
        std::size_t written = 12345;
        const cf::record_fault f = cf::write_record(s.contents, b.data(), capacity, written);
        CHECK(f == expected);
        CHECK(written == 0);
        std::size_t touched = 0;
        for (const std::uint8_t x : b) touched += x != 0xA5 ? 1u : 0u;
        CHECK(touched == 0);
    };
    const sample good = make_sample(cf::record_values::float32, true);
    const std::size_t need = cf::record_size(good.contents);
    untouched_after(good, need - 1, cf::record_fault::truncated);
    untouched_after(good, 0, cf::record_fault::truncated);

    const auto bad = cf::record_fault::bad_contents;
    const auto with = [&good](auto edit) {
        sample s = good;
        edit(s.contents);
        return s;
    };
    untouched_after(with([](cf::record_contents& c) { c.symbol = nullptr; }), buffer_size, bad);
    untouched_after(with([](cf::record_contents& c) { c.symbol = ""; }), buffer_size, bad);
    untouched_after(with([](cf::record_contents& c) { c.symbol = "9lives"; }), buffer_size, bad);
    untouched_after(with([](cf::record_contents& c) { c.symbol = "has space"; }), buffer_size, bad);
    untouched_after(with([](cf::record_contents& c) { c.symbol = "a2345678901234567890123456789012"; }),
                    buffer_size, bad);  // 32 characters
    untouched_after(with([](cf::record_contents& c) { c.unit_id = "tab\there"; }), buffer_size, bad);
    untouched_after(with([](cf::record_contents& c) { c.values = static_cast<cf::record_values>(0); }),
                    buffer_size, bad);
    untouched_after(with([](cf::record_contents& c) { c.report = static_cast<cf::record_report>(7); }),
                    buffer_size, bad);
    untouched_after(with([](cf::record_contents& c) { c.temperature.count = 1; }), buffer_size, bad);
    untouched_after(with([](cf::record_contents& c) { c.pressure.step = 0.0f; }), buffer_size, bad);
    untouched_after(with([](cf::record_contents& c) { c.pressure.step = -1.0f; }), buffer_size, bad);
    untouched_after(with([](cf::record_contents& c) { c.temperature.from = std::nanf(""); }), buffer_size, bad);
    untouched_after(with([](cf::record_contents& c) { c.temperature.step = 2.0e38f; }), buffer_size, bad);  // last node 4e38: inf
    untouched_after(with([](cf::record_contents& c) { c.shape.count = 1; }), buffer_size, bad);
    untouched_after(with([](cf::record_contents& c) { c.gain = 0.0f; }), buffer_size, bad);
    untouched_after(with([](cf::record_contents& c) { c.full_scale = std::numeric_limits<float>::infinity(); }),
                    buffer_size, bad);
    untouched_after(with([](cf::record_contents& c) { c.reference_pressure_Pa = -1.0f; }), buffer_size, bad);
    untouched_after(with([](cf::record_contents& c) { c.data_f32[2] = nullptr; }), buffer_size, bad);
    sample nan_value = good;
    nan_value.correction[3] = std::numeric_limits<float>::quiet_NaN();
    nan_value.contents.data_f32[0] = nan_value.correction.data();
    untouched_after(nan_value, buffer_size, bad);
    sample q = make_sample(cf::record_values::q15, true);
    q.contents.data_q15[1] = nullptr;
    untouched_after(q, buffer_size, bad);
    q = make_sample(cf::record_values::q15, true);
    q.contents.scales[0].scale = std::numeric_limits<float>::infinity();
    untouched_after(q, buffer_size, bad);
    // An oversized grid (255 x 255 x 4 x 2 tables > 1 MiB is not reached; 65535 x 65535 is).
    CHECK(cf::record_size(with([](cf::record_contents& c) {
              c.temperature.count = 65535;
              c.pressure.count = 65535;
          }).contents) == 0u);

    // A linear law ignores the tables it does not have.
    sample linear = make_sample(cf::record_values::float32, false);
    linear.contents.data_f32[2] = nullptr;
    linear.contents.data_f32[3] = nullptr;
    linear.contents.shape = cf::record_axis{7.0f, -1.0f, 0};  // from/step ignored when count is 0
    buffer b{};
    std::size_t written = 0;
    CHECK(cf::write_record(linear.contents, b.data(), b.size(), written) == cf::record_fault::none);
    CHECK(cf::validate_record(b.data(), written).fault == cf::record_fault::none);
    CHECK(cf::validate_record(b.data(), written).view.shape().from == 0.0f);
}

TEST_CASE("record: validated in place at an odd address") {
    const sample s = make_sample(cf::record_values::q15, true);
    std::array<std::uint8_t, buffer_size + 8> raw{};
    for (std::size_t shift = 1; shift < 4; ++shift) {
        std::size_t written = 0;
        std::uint8_t* at = raw.data() + shift;
        REQUIRE(cf::write_record(s.contents, at, buffer_size, written) == cf::record_fault::none);
        const cf::record_check r = cf::validate_record(at, written);
        REQUIRE(r.fault == cf::record_fault::none);
        CHECK(r.view.data() == at);
        CHECK(std::strcmp(r.view.symbol(), "demo_cell") == 0);
        CHECK(r.view.raw_q15(cf::record_table::shape, 3) == s.q_shape[3]);
        CHECK(host_bits(r.view.gain()) == host_bits(2000.0f));
    }
}

TEST_CASE("record: an empty view and the fault texts") {
    const cf::record_view v{};
    CHECK_FALSE(v.valid());
    CHECK(std::strcmp(v.symbol(), "") == 0);
    CHECK(std::strcmp(v.unit_id(), "") == 0);
    CHECK(v.gain() == 0.0f);
    CHECK(v.crc32() == 0u);
    CHECK(v.temperature().count == 0);
    CHECK(v.count(cf::record_table::correction) == 0);
    CHECK(v.value(cf::record_table::correction, 0) == 0.0f);
    CHECK(v.data() == nullptr);
    CHECK(v.size() == 0);
    const cf::record_fault all[] = {cf::record_fault::none,          cf::record_fault::truncated,
                                    cf::record_fault::wrong_magic,   cf::record_fault::unknown_version,
                                    cf::record_fault::size_mismatch, cf::record_fault::crc_mismatch,
                                    cf::record_fault::bad_contents};
    for (std::size_t i = 0; i < 7; ++i)
        for (std::size_t j = i + 1; j < 7; ++j) CHECK(std::strcmp(cf::describe(all[i]), cf::describe(all[j])) != 0);
    CHECK(cf::record_status(cf::record_fault::none) == cf::status::ok);
    CHECK(cf::record_status(cf::record_fault::crc_mismatch) == cf::status::invalid_record);
}
