// counterflux/crc32.hpp - CRC-32 with the ISO-HDLC parameters (the CRC of
// IEEE 802.3, zlib and PNG), the check of the calibration record.
//
// Parameters (G. Cook, "Catalogue of parametrised CRC algorithms", CRC RevEng,
// entry CRC-32/ISO-HDLC): width 32, polynomial 0x04C11DB7, reflected input and
// output (so the shift register runs right with the reflected polynomial
// 0xEDB88320), init 0xFFFFFFFF, final XOR 0xFFFFFFFF, check value of the ASCII
// string "123456789" 0xCBF43926. Byte-wise table algorithm: R. N. Williams, "A
// painless guide to CRC error detection algorithms" (1993), sec. 10-12 (the
// reflected table-driven form).
#ifndef COUNTERFLUX_CRC32_HPP
#define COUNTERFLUX_CRC32_HPP

#include <array>
#include <cstddef>
#include <cstdint>

namespace counterflux {
namespace detail {

/// The reflected polynomial of CRC-32/ISO-HDLC.
inline constexpr std::uint32_t crc32_polynomial_reflected = 0xEDB88320u;

/// The 256-entry table of the byte-wise reflected algorithm: entry b is the
/// register after shifting the byte b through eight bit steps.
constexpr std::array<std::uint32_t, 256> make_crc32_table() noexcept {
    std::array<std::uint32_t, 256> table{};
    for (std::uint32_t b = 0; b < 256u; ++b) {
        std::uint32_t r = b;
        for (int k = 0; k < 8; ++k) r = (r & 1u) != 0u ? (r >> 1) ^ crc32_polynomial_reflected : r >> 1;
        table[b] = r;
    }
    return table;
}

/// The table, computed at compile time (1 KiB of constant data: flash on a microcontroller).
inline constexpr std::array<std::uint32_t, 256> crc32_table = make_crc32_table();

}  // namespace detail

/// CRC-32/ISO-HDLC of size bytes at data. Chainable: crc is the CRC of the bytes
/// before these (0 for none), so crc32(b, nb, crc32(a, na)) is the CRC of a then b.
/// data may be nullptr when size is 0.
constexpr std::uint32_t crc32(const std::uint8_t* data, std::size_t size, std::uint32_t crc = 0) noexcept {
    std::uint32_t r = crc ^ 0xFFFFFFFFu;  // undo the final XOR of the previous part (init when crc = 0)
    for (std::size_t i = 0; i < size; ++i) r = (r >> 8) ^ detail::crc32_table[(r ^ data[i]) & 0xFFu];
    return r ^ 0xFFFFFFFFu;
}

}  // namespace counterflux

#endif  // COUNTERFLUX_CRC32_HPP
