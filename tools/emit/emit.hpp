// tools/emit/emit.hpp - the four outputs of a table set: C header, CSV, JSON
// and the binary calibration record. Each returns the file's content; the verb
// writes it through the atomic writer.
#ifndef COUNTERFLUX_TOOLS_EMIT_HPP
#define COUNTERFLUX_TOOLS_EMIT_HPP

#include <cstdint>
#include <string>
#include <vector>

#include <nlohmann/json.hpp>

#include "../tables.hpp"

namespace counterflux::tool {

/// Where a generated file came from, written at its top.
struct provenance {
    std::string generator;     ///< "counterflux 0.1.0"
    std::string input;         ///< the sensor file as given
    std::string recipe;        ///< the command line that made it
    std::string unit_id;       ///< unit identifier ("" for a design table)
};

/// The self-contained C99 / C++17 header: data static const, functions static
/// inline, only <stdint.h> (see docs/generated-header.md).
std::string c_header_text(const table_set& t, const provenance& p);

/// One row per (T, P) node: the span, its correction, the zero current and
/// (for a curved law) the curvature, with units in the column names.
std::string csv_text(const table_set& t);

/// The whole table set and its proof as JSON (SI numbers).
nlohmann::json json_document(const table_set& t, const provenance& p);

/// The binary calibration record (record.hpp layout).
std::vector<std::uint8_t> record_bytes(const table_set& t, const provenance& p);

}  // namespace counterflux::tool

#endif  // COUNTERFLUX_TOOLS_EMIT_HPP
