// tools/sensor_file.hpp - the one sensor-file reader: TOML -> library types.
//
// Reads a sensor file (the keys of docs/sensor-file.md), checks every key for
// presence, type, unit kind and range, and builds the library's sensor_model.
// All problems found are reported together, each with FILE:LINE:COLUMN from the
// TOML source, as one input_error (exit status 2).
#ifndef COUNTERFLUX_TOOLS_SENSOR_FILE_HPP
#define COUNTERFLUX_TOOLS_SENSOR_FILE_HPP

#include <cstddef>
#include <filesystem>
#include <optional>
#include <string>
#include <string_view>
#include <vector>

#include <counterflux/counterflux.hpp>

#include "errors.hpp"

namespace counterflux::tool {

/// Most barrier elements a sensor file may list.
inline constexpr std::size_t max_elements = 8;

/// The library model the tool works with.
using model_type = counterflux::sensor_model<double, max_elements>;

/// One axis of [table]: from, to (SI) and the number of nodes.
struct axis_spec {
    double from = 0.0;
    double to = 0.0;
    unsigned points = 0;  ///< 0: not given, the table verb chooses (table.max_error is then given)
    source_place place;   ///< the axis's inline table
};

/// [table]: lookup-table axes, value type and the error bound to prove.
struct table_spec {
    axis_spec temperature;                     ///< K
    axis_spec pressure;                        ///< Pa
    std::string values = "float32";            ///< "float32" or "q15"
    double max_error = 1.0e-3;                 ///< relative interpolation error bound
    bool max_error_given = false;              ///< max_error was in the file (not the default)
    source_place max_error_place;              ///< the max_error value, when given
    source_place place;                        ///< the [table] header
};

/// [zero]: the zero (baseline) current I0(T) = current exp(per_K (T - T_ref)).
/// Without the section the zero current is 0 (the fit verb measures it per unit).
struct zero_spec {
    double current_A = 0.0;                    ///< at the reference temperature
    double per_K = 0.0;                        ///< temperature coefficient b, 1/K
    source_place place;                        ///< the [zero] header
};

/// [response]: optional parts of the step-response chain (SI).
struct response_spec {
    std::optional<double> front_volume_m3;     ///< flushed volume ahead of the barrier
    std::optional<double> sample_flow_m3_s;    ///< sample flow through it
    std::optional<double> cavity_volume_m3;    ///< gas space between barrier and electrode
    double electrode_rate_m_s = 0.0;           ///< first-order sink rate; +inf = perfect sink
    std::optional<double> electrode_area_m2;   ///< area the rate acts on (default: the innermost element's)
    std::optional<double> duration_s;          ///< simulated time
    source_place place;                        ///< the [response] header
};

/// Everything read from one sensor file.
struct sensor_file {
    std::string path;                          ///< as given (used in messages)
    std::string text;                          ///< the file's bytes (for hashing)
    std::string symbol;                        ///< C identifier prefix
    std::string flux_ratio_name;               ///< "equimolar", "stagnant" or "" for a number
    double full_scale_mol_mol = 0.0;           ///< full scale, mol/mol
    model_type model{};                        ///< the library model
    std::vector<source_place> element_places;  ///< the [[barrier]] header of each element
    source_place sensor_place;                 ///< the [sensor] header
    source_place full_scale_place;             ///< the full_scale value
    source_place reference_place;              ///< the [reference] header
    source_place reference_temperature_place;  ///< the reference.temperature value
    source_place diffusivity_place;            ///< the diffusivity.method value (else the [diffusivity] header)
    std::optional<zero_spec> zero;             ///< [zero], if present
    std::optional<table_spec> table;           ///< [table], if present
    std::optional<response_spec> response;     ///< [response], if present
};

/// Largest sensor file read_sensor_file accepts, in bytes (1 MiB).
inline constexpr std::size_t max_sensor_file_bytes = std::size_t(1) << 20;

/// Reads and checks the file at path, which must be a regular file (after
/// following symbolic links) of at most max_sensor_file_bytes. Throws input_error.
sensor_file read_sensor_file(const std::filesystem::path& path);

/// Why the file's model cannot be evaluated at (temperature_K, pressure_Pa),
/// pointing at the part of the file to blame: the diffusivity (at
/// diffusivity.method; for Chapman-Enskog outside its fit range, with the
/// reduced temperature), the mean free path of the background (at [sensor]) or
/// one [[barrier]] element (at its header, with the library's status text).
/// condition names the condition in the message ("the reference condition",
/// "--temperature 900 K"). Nothing when every part resolves.
std::optional<diagnostic> diagnose_condition(const sensor_file& file, double temperature_K, double pressure_Pa,
                                             const std::string& condition);

/// Why the library finds no finite current at mole fraction y outside the
/// barrier, when the cause can be read off the file: for alpha = 1 + flux_ratio
/// > 0 the log law is singular at y = 1/alpha, and only a resistance blind to
/// the flux ratio (Knudsen, membrane) in the outer element ([[barrier]] #1)
/// lifts that limit. The text says so, with 1/alpha and the flux ratio, and
/// what to change; knob names the value that set y ("full_scale",
/// "--concentration"). Nothing when y is below 1/alpha (or alpha <= 0): the
/// cause is then not the singularity. Call it only after the library failed.
std::optional<std::string> singular_log_law(const sensor_file& file, double mole_fraction, const std::string& knob);

/// Parses and checks text as a sensor file; path is only used in messages.
/// Throws input_error.
sensor_file parse_sensor_file(std::string_view text, const std::string& path);

/// Known gas formulas, comma-separated (for messages).
std::string known_gas_formulas();

/// What to say after "unknown gas 'name'": a formula that differs only in case
/// ("; did you mean 'CO'? formulas are case-sensitive"), then the known formulas.
std::string unknown_gas_hint(const std::string& name);

/// Edit distance (optimal string alignment: insert, delete, substitute, swap).
std::size_t edit_distance(std::string_view a, std::string_view b);

/// Longest word closest_match looks at; a longer one gets no suggestion.
inline constexpr std::size_t max_suggestion_length = 64;

/// The candidate closest to word, if it is close enough to be a likely typo
/// (never for a word longer than max_suggestion_length).
std::optional<std::string> closest_match(std::string_view word, const std::vector<std::string>& candidates);

}  // namespace counterflux::tool

#endif  // COUNTERFLUX_TOOLS_SENSOR_FILE_HPP
