// tools/sensor_file.cpp - see sensor_file.hpp. The keys and their rules are
// documented in docs/sensor-file.md; keep the two in step.
#include "sensor_file.hpp"

#include <algorithm>
#include <cerrno>
#include <cmath>
#include <cstdlib>
#include <cstring>
#include <fstream>
#include <limits>
#include <sstream>

#include <toml++/toml.h>

#include "plausibility.hpp"
#include "report.hpp"
#include "units_parse.hpp"

namespace counterflux::tool {

namespace {

using kind = quantity_kind;

// A value read from the file together with where it was and how it was written.
template <class V>
struct located {
    V value;
    source_place place;
    std::string text;  // as written, for messages
};

const char* type_name(toml::node_type t) noexcept {
    switch (t) {
        case toml::node_type::table: return "a table";
        case toml::node_type::array: return "an array";
        case toml::node_type::string: return "a string";
        case toml::node_type::integer: return "an integer";
        case toml::node_type::floating_point: return "a floating-point number";
        case toml::node_type::boolean: return "a boolean";
        case toml::node_type::date: return "a date";
        case toml::node_type::time: return "a time";
        case toml::node_type::date_time: return "a date-time";
        case toml::node_type::none: break;
    }
    return "nothing";
}

// Keys and values are echoed abbreviated (errors.hpp): a message stays one short line.
std::string in_quotes(std::string_view s) { return "'" + abbreviate(s) + "'"; }
std::string in_double_quotes(std::string_view s) { return "\"" + abbreviate(s) + "\""; }

// A TOML number as the file wrote it, as near as a double allows: the shortest
// text that reads back to v (1e-310 stays "1e-310", 0.1 "0.1", 10 "10").
std::string number_as_written(double v) {
    std::string best;
    for (int digits = 1; digits <= 17; ++digits) {
        std::ostringstream os;
        os.precision(digits);
        os << v;
        const std::string text = os.str();
        if (!std::isfinite(v)) return text;
        if (std::strtod(text.c_str(), nullptr) != v) continue;
        if (best.empty() || text.size() < best.size()) best = text;
    }
    return best;
}

bool is_c_identifier(std::string_view s) noexcept {
    if (s.empty()) return false;
    const auto alpha = [](char c) { return (c >= 'a' && c <= 'z') || (c >= 'A' && c <= 'Z') || c == '_'; };
    const auto digit = [](char c) { return c >= '0' && c <= '9'; };
    if (!alpha(s.front())) return false;
    return std::all_of(s.begin(), s.end(), [&](char c) { return alpha(c) || digit(c); });
}

bool is_c_keyword(std::string_view s) noexcept {
    static const char* const keywords[] = {
        "auto", "break", "case", "char", "const", "continue", "default", "do", "double", "else", "enum",
        "extern", "float", "for", "goto", "if", "inline", "int", "long", "register", "restrict", "return",
        "short", "signed", "sizeof", "static", "struct", "switch", "typedef", "union", "unsigned", "void",
        "volatile", "while", "_Bool", "_Complex", "_Imaginary", "bool", "true", "false", "class", "namespace",
        "template", "typename", "this", "new", "delete", "operator", "public", "private", "protected",
        "virtual", "friend", "using", "try", "catch", "throw", "nullptr", "constexpr", "noexcept", "decltype",
        "static_assert", "alignas", "alignof", "char16_t", "char32_t", "explicit", "export", "mutable",
        "thread_local", "typeid", "dynamic_cast", "static_cast", "const_cast", "reinterpret_cast", "and",
        "or", "not", "xor", "bitand", "bitor", "compl", "and_eq", "or_eq", "xor_eq", "not_eq", "asm"};
    for (const char* k : keywords)
        if (s == k) return true;
    return false;
}

class reader {
public:
    explicit reader(std::string path) : path_(std::move(path)) {}

    std::vector<diagnostic> diagnostics;
    std::string full_scale_text;  // as written, for the model check

    source_place at(const toml::source_region& r) const {
        source_place p;
        p.file = path_;
        p.line = static_cast<long>(r.begin.line);
        p.column = static_cast<long>(r.begin.column);
        if (p.line <= 0) p.line = 1;
        if (p.column <= 0) p.column = 1;
        return p;
    }
    source_place at(const toml::node& n) const { return at(n.source()); }

    void error(const source_place& p, std::string message) { diagnostics.push_back({p, std::move(message)}); }

    // Reports every key of t not in allowed; a key listed in foreign (key ->
    // explanation) gets that explanation instead of a suggestion.
    void check_keys(const toml::table& t, const std::string& where, const std::vector<std::string>& allowed,
                    const std::vector<std::pair<std::string, std::string>>& foreign = {}) {
        for (auto&& [k, v] : t) {
            const std::string name(k.str());
            if (std::find(allowed.begin(), allowed.end(), name) != allowed.end()) continue;
            const auto f = std::find_if(foreign.begin(), foreign.end(), [&](const auto& e) { return e.first == name; });
            // A [table] header is pointed at by its '['; anything else by its key.
            const bool header_table = v.is_table() && !v.as_table()->is_inline();
            source_place p = header_table ? at(v) : at(k.source());
            if (f != foreign.end()) {
                error(p, "key " + in_quotes(name) + " in " + where + " " + f->second);
                continue;
            }
            std::string message = (v.is_table() ? "unknown table " + in_quotes(name) : "unknown key " + in_quotes(name)) +
                                  " in " + where;
            if (const auto m = closest_match(name, allowed)) {
                message += "; did you mean " + in_quotes(*m) + "?";
                if (!t.contains(*m)) suggested_.emplace_back(&t, *m);
            }
            else {
                message += "; expected one of: ";
                for (std::size_t i = 0; i < allowed.size(); ++i) message += (i ? ", " : "") + allowed[i];
            }
            error(p, message);
        }
    }

    // The node at key, or nullptr (reporting a missing required key at the header).
    const toml::node* get(const toml::table& t, std::string_view key, bool required, const source_place& header,
                          const std::string& where, const std::string& expected) {
        const toml::node* n = t.get(key);
        if (n == nullptr && required && !explained(t, key))
            error(header, "missing required key " + in_quotes(key) + " in " + where + " (" + expected + ")");
        return n;
    }

    std::optional<located<double>> quantity(const toml::table& t, std::string_view key, kind k, bool required,
                                            const source_place& header, const std::string& where,
                                            const std::string& dotted, parse_options options = {}) {
        const std::string expected = kind_with_article(k) +
                                     (k == kind::dimensionless ? std::string(" (no unit)")
                                                               : ": " + accepted_units(k) + ", or a bare number in " +
                                                                     si_unit(k));
        const toml::node* n = get(t, key, required, header, where, expected);
        if (n == nullptr) return std::nullopt;
        const source_place p = at(*n);
        try {
            if (const auto* s = n->as_string()) {
                const double v = parse_quantity(s->get(), k, options);
                return located<double>{v, p, in_double_quotes(s->get())};
            }
            double v = 0.0;
            std::string text;
            if (const auto* i = n->as_integer()) {
                v = static_cast<double>(i->get());
                text = std::to_string(i->get());
            } else if (const auto* f = n->as_floating_point()) {
                v = f->get();
                text = number_as_written(v);
                if (std::isnan(v)) throw unit_error("nan is not a number");
                if (std::isinf(v) && !(options.allow_infinity && v > 0))
                    throw unit_error(text + " is not a finite number");
            } else {
                error(p, in_quotes(dotted) + " must be " + expected + " (a string such as \"1.5 " +
                             (k == kind::dimensionless ? std::string("") : std::string(si_unit(k))) +
                             "\" or a number), got " + type_name(n->type()));
                return std::nullopt;
            }
            if (k == kind::temperature && v < 0.0) throw unit_error(text + " K is below absolute zero");
            return located<double>{v, p, text};
        } catch (const unit_error& e) {
            error(p, in_quotes(dotted) + ": " + e.what());
            return std::nullopt;
        }
    }

    std::optional<located<long long>> integer(const toml::table& t, std::string_view key, bool required,
                                              const source_place& header, const std::string& where,
                                              const std::string& dotted, long long min, long long max) {
        const toml::node* n = get(t, key, required, header, where, "an integer");
        if (n == nullptr) return std::nullopt;
        const source_place p = at(*n);
        const auto* i = n->as_integer();
        if (i == nullptr) {
            error(p, in_quotes(dotted) + " must be an integer, got " + type_name(n->type()));
            return std::nullopt;
        }
        const long long v = i->get();
        if (v < min || v > max) {
            error(p, in_quotes(dotted) + " = " + std::to_string(v) + " is out of range; expected an integer from " +
                         std::to_string(min) + " to " + std::to_string(max));
            return std::nullopt;
        }
        return located<long long>{v, p, std::to_string(v)};
    }

    std::optional<located<bool>> boolean(const toml::table& t, std::string_view key, const source_place& header,
                                         const std::string& where, const std::string& dotted) {
        const toml::node* n = get(t, key, false, header, where, "true or false");
        if (n == nullptr) return std::nullopt;
        const auto* b = n->as_boolean();
        if (b == nullptr) {
            error(at(*n), in_quotes(dotted) + " must be true or false, got " + type_name(n->type()));
            return std::nullopt;
        }
        return located<bool>{b->get(), at(*n), b->get() ? "true" : "false"};
    }

    std::optional<located<std::string>> string(const toml::table& t, std::string_view key, bool required,
                                               const source_place& header, const std::string& where,
                                               const std::string& dotted, const std::string& expected) {
        const toml::node* n = get(t, key, required, header, where, expected);
        if (n == nullptr) return std::nullopt;
        const auto* s = n->as_string();
        if (s == nullptr) {
            error(at(*n), in_quotes(dotted) + " must be a string (" + expected + "), got " + type_name(n->type()));
            return std::nullopt;
        }
        return located<std::string>{s->get(), at(*n), in_double_quotes(s->get())};
    }

    // The sub-table at key: nullptr when absent (reported if required) or of the wrong type.
    const toml::table* table(const toml::table& t, std::string_view key, bool required, const source_place& header,
                             const std::string& what) {
        const toml::node* n = t.get(key);
        if (n == nullptr) {
            if (required && !explained(t, key)) error(header, "missing required table [" + std::string(key) + "] (" + what + ")");
            return nullptr;
        }
        const auto* tt = n->as_table();
        if (tt == nullptr) error(at(*n), in_quotes(key) + " must be a table [" + std::string(key) + "], got " +
                                             type_name(n->type()));
        return tt;
    }

    // Range check helper: reports message at v's place when ok is false.
    bool require_that(bool ok, const located<double>& v, const std::string& dotted, const std::string& rule) {
        if (!ok) error(v.place, in_quotes(dotted) + " = " + v.text + " is out of range; " + rule);
        return ok;
    }

    // Plausibility check: v must lie in range (false, reported, when it does not
    // or when v is absent).
    bool in_range(const std::optional<located<double>>& v, const std::string& dotted, const value_range& range) {
        if (!v) return false;
        return require_that(range.contains(v->value), *v, dotted, range.expected());
    }

    const std::string& path() const noexcept { return path_; }

private:
    // A missing key already explained by a "did you mean" on a misspelt one is
    // not reported twice.
    bool explained(const toml::table& t, std::string_view key) const {
        return std::any_of(suggested_.begin(), suggested_.end(),
                           [&](const auto& e) { return e.first == &t && e.second == key; });
    }

    std::string path_;
    std::vector<std::pair<const toml::table*, std::string>> suggested_;
};

// Positive-quantity check (the most common rule).
bool positive(reader& r, const std::optional<located<double>>& v, const std::string& dotted) {
    if (!v) return false;
    return r.require_that(v->value > 0.0, *v, dotted, "it must be greater than zero");
}

struct sensor_keys {
    const gas_data* target = nullptr;
    const gas_data* background = nullptr;
};

void read_sensor(reader& r, const toml::table& t, sensor_file& out, const source_place& header) {
    const std::string where = "[sensor]";
    out.sensor_place = header;
    r.check_keys(t, where, {"symbol", "target", "background", "electrons", "flux_ratio", "report", "full_scale"});

    if (auto s = r.string(t, "symbol", true, header, where, "sensor.symbol", "a C identifier such as \"garage_co\"")) {
        if (!is_c_identifier(s->value))
            r.error(s->place, "'sensor.symbol' = " + s->text +
                                  " is not a C identifier (letters, digits and '_', not starting with a digit)");
        else if (is_c_keyword(s->value))
            r.error(s->place, "'sensor.symbol' = " + s->text + " is a C or C++ keyword");
        else if (s->value.size() > 31)
            r.error(s->place, "'sensor.symbol' = " + s->text + " is longer than 31 characters");
        else if (s->value.front() == '_' || s->value.find("__") != std::string::npos)
            r.error(s->place, "'sensor.symbol' = " + s->text +
                                  " starts with '_' or holds '__': such names are reserved to the C and C++ "
                                  "implementation; start with a letter");
        else
            out.symbol = s->value;
    }

    const auto gas = [&](const char* key, const char* example) -> located<const gas_data*> {
        const std::string dotted = std::string("sensor.") + key;
        auto s = r.string(t, key, true, header, where, dotted, std::string("a gas formula such as \"") + example + "\"");
        if (!s) return {nullptr, {}, {}};
        const auto found = counterflux::find_gas(s->value.c_str());
        if (!found.ok() || found.value == nullptr) {
            r.error(s->place, "unknown gas " + s->text + " for " + in_quotes(dotted) + unknown_gas_hint(s->value));
            return {nullptr, s->place, s->text};
        }
        return {found.value, s->place, s->text};
    };
    const auto target = gas("target", "CO");
    const auto background = gas("background", "air");
    if (target.value != nullptr && background.value != nullptr && target.value == background.value)
        r.error(background.place, "'sensor.background' = " + background.text +
                                      " is the same gas as 'sensor.target'; they must differ");
    out.model.target = target.value;
    out.model.background = background.value;

    if (auto e = r.integer(t, "electrons", true, header, where, "sensor.electrons", 1, 100))
        out.model.electrons = static_cast<unsigned>(e->value);

    // flux_ratio: a name or a number N_B / N_A.
    const std::string flux_expected = "\"equimolar\" (-1), \"stagnant\" (0), or a number N_B/N_A";
    if (const toml::node* n = r.get(t, "flux_ratio", true, header, where, flux_expected)) {
        const source_place p = r.at(*n);
        std::optional<double> ratio;
        if (const auto* s = n->as_string()) {
            if (s->get() == "equimolar") {
                ratio = -1.0;
                out.flux_ratio_name = "equimolar";
            } else if (s->get() == "stagnant") {
                ratio = 0.0;
                out.flux_ratio_name = "stagnant";
            } else {
                try {
                    ratio = parse_number(s->get());
                } catch (const number_out_of_range&) {
                    r.error(p, "'sensor.flux_ratio' = " + in_double_quotes(s->get()) +
                                   " is out of range; expected a value from -10 to 10");
                } catch (const unit_error&) {
                    std::string message =
                        "'sensor.flux_ratio' = " + in_double_quotes(s->get()) + " is not " + flux_expected;
                    if (const auto m = closest_match(s->get(), {"equimolar", "stagnant"}))
                        message += "; did you mean \"" + *m + "\"?";
                    r.error(p, message);
                }
            }
        } else if (const auto* i = n->as_integer()) {
            ratio = static_cast<double>(i->get());
        } else if (const auto* f = n->as_floating_point()) {
            if (std::isfinite(f->get())) ratio = f->get();
            else if (std::isnan(f->get())) r.error(p, "'sensor.flux_ratio' = nan is not a number; expected " + flux_expected);
            else r.error(p, "'sensor.flux_ratio' = " + number_as_written(f->get()) +
                                " is out of range; expected a value from -10 to 10");
        } else {
            r.error(p, "'sensor.flux_ratio' must be " + flux_expected + ", got " + type_name(n->type()));
        }
        if (ratio) {
            if (*ratio < -10.0 || *ratio > 10.0)
                r.error(p, "'sensor.flux_ratio' = " + number_as_written(*ratio) +
                               " is out of range; expected a value from -10 to 10");
            else
                out.model.flux_ratio = *ratio;
        }
    }

    out.model.reading = counterflux::reading_kind::mole_fraction;
    if (auto s = r.string(t, "report", false, header, where, "sensor.report", "\"fraction\" or \"partial-pressure\"")) {
        if (s->value == "fraction") out.model.reading = counterflux::reading_kind::mole_fraction;
        else if (s->value == "partial-pressure") out.model.reading = counterflux::reading_kind::partial_pressure;
        else {
            std::string message = "'sensor.report' = " + s->text + " is not \"fraction\" or \"partial-pressure\"";
            if (const auto m = closest_match(s->value, {"fraction", "partial-pressure"}))
                message += "; did you mean \"" + *m + "\"?";
            r.error(s->place, message);
        }
    }

    if (auto fs = r.quantity(t, "full_scale", kind::concentration, true, header, where, "sensor.full_scale")) {
        out.full_scale_place = fs->place;
        r.full_scale_text = fs->text;
        if (r.require_that(fs->value > 0.0 && fs->value <= 1.0, *fs, "sensor.full_scale",
                           "it must be above zero and at most 100 %"))
            out.full_scale_mol_mol = fs->value;
    }
}

void read_reference(reader& r, const toml::table& t, sensor_file& out, const source_place& header) {
    const std::string where = "[reference]";
    r.check_keys(t, where, {"temperature", "pressure"});
    out.reference_place = header;
    if (auto v = r.quantity(t, "temperature", kind::temperature, true, header, where, "reference.temperature")) {
        out.reference_temperature_place = v->place;
        if (r.in_range(v, "reference.temperature", temperature_range)) out.model.reference_temperature_K = v->value;
    }
    if (auto v = r.quantity(t, "pressure", kind::pressure, true, header, where, "reference.pressure"))
        if (r.in_range(v, "reference.pressure", pressure_range)) out.model.reference_pressure_Pa = v->value;
}

void read_diffusivity(reader& r, const toml::table& t, sensor_file& out, const source_place& header) {
    const std::string where = "[diffusivity]";
    out.diffusivity_place = header;
    const std::vector<std::string> measured_keys = {"value", "at_temperature", "at_pressure", "exponent"};
    auto& d = out.model.diffusivity;
    d.a = out.model.target;
    d.b = out.model.background;
    d.method = counterflux::diffusivity_method::fuller;

    const std::vector<std::string> all_keys = {"method", "value", "at_temperature", "at_pressure", "exponent"};
    if (!t.contains("method")) r.check_keys(t, where, all_keys);  // first, so a misspelt 'method' is explained
    auto m = r.string(t, "method", true, header, where, "diffusivity.method",
                      "\"fuller\", \"chapman-enskog\" or \"measured\"");
    if (m) out.diffusivity_place = m->place;
    bool measured = false;
    if (m) {
        if (m->value == "fuller") d.method = counterflux::diffusivity_method::fuller;
        else if (m->value == "chapman-enskog") d.method = counterflux::diffusivity_method::chapman_enskog;
        else if (m->value == "measured") {
            d.method = counterflux::diffusivity_method::measured;
            measured = true;
        } else {
            std::string message = "'diffusivity.method' = " + m->text +
                                  " is not \"fuller\", \"chapman-enskog\" or \"measured\"";
            if (const auto s = closest_match(m->value, {"fuller", "chapman-enskog", "measured"}))
                message += "; did you mean \"" + *s + "\"?";
            r.error(m->place, message);
            r.check_keys(t, where, {"method", "value", "at_temperature", "at_pressure", "exponent"});
            return;
        }
    }
    if (!m) {
        if (t.contains("method")) r.check_keys(t, where, all_keys);
        return;
    }
    if (!measured) {
        std::vector<std::pair<std::string, std::string>> foreign;
        for (const auto& k : measured_keys) foreign.emplace_back(k, "applies only to method = \"measured\"");
        r.check_keys(t, where, {"method"}, foreign);
        return;
    }
    r.check_keys(t, where, {"method", "value", "at_temperature", "at_pressure", "exponent"});
    if (auto v = r.quantity(t, "value", kind::diffusivity, true, header, where, "diffusivity.value"))
        if (positive(r, v, "diffusivity.value")) d.measured_m2_s = v->value;
    if (auto v = r.quantity(t, "at_temperature", kind::temperature, true, header, where, "diffusivity.at_temperature"))
        if (r.in_range(v, "diffusivity.at_temperature", temperature_range)) d.measured_temperature_K = v->value;
    if (auto v = r.quantity(t, "at_pressure", kind::pressure, true, header, where, "diffusivity.at_pressure"))
        if (r.in_range(v, "diffusivity.at_pressure", pressure_range)) d.measured_pressure_Pa = v->value;
    d.measured_exponent = 1.75;
    if (auto v = r.quantity(t, "exponent", kind::dimensionless, false, header, where, "diffusivity.exponent"))
        if (r.require_that(v->value >= 0.0 && v->value <= 3.0, *v, "diffusivity.exponent",
                           "expected a temperature exponent from 0 to 3"))
            d.measured_exponent = v->value;
}

const std::vector<std::string> capillary_keys = {"type", "diameter", "length", "count", "end_correction", "knudsen"};
const std::vector<std::string> porous_keys = {"type", "thickness", "area", "porosity", "tortuosity", "pore_diameter",
                                              "knudsen"};
const std::vector<std::string> membrane_keys = {"type", "thickness", "area", "permeability", "activation_energy",
                                                "diffusivity", "partition"};

// Keys of the other two kinds, each with the kind it belongs to.
std::vector<std::pair<std::string, std::string>> foreign_keys(const std::string& type) {
    std::vector<std::pair<std::string, std::string>> out;
    const auto add = [&](const std::vector<std::string>& keys, const std::vector<std::string>& mine, const char* owner) {
        for (const auto& k : keys)
            if (std::find(mine.begin(), mine.end(), k) == mine.end() &&
                std::none_of(out.begin(), out.end(), [&](const auto& e) { return e.first == k; }))
                out.emplace_back(k, std::string("does not apply to a ") + type + " barrier (it is a key of " + owner +
                                        " barriers)");
    };
    const auto& mine = type == "capillary" ? capillary_keys : type == "porous" ? porous_keys : membrane_keys;
    if (type != "capillary") add(capillary_keys, mine, "capillary");
    if (type != "porous") add(porous_keys, mine, "porous");
    if (type != "membrane") add(membrane_keys, mine, "membrane");
    return out;
}

void read_barrier(reader& r, const toml::table& t, std::size_t index, sensor_file& out) {
    const source_place header = r.at(t);
    const std::string where = "[[barrier]] #" + std::to_string(index + 1);
    const std::string prefix = "barrier[" + std::to_string(index + 1) + "].";
    out.element_places.push_back(header);

    std::vector<std::string> all = capillary_keys;
    for (const auto& k : porous_keys) if (std::find(all.begin(), all.end(), k) == all.end()) all.push_back(k);
    for (const auto& k : membrane_keys) if (std::find(all.begin(), all.end(), k) == all.end()) all.push_back(k);
    if (!t.contains("type")) r.check_keys(t, where, all);  // first, so a misspelt 'type' is explained
    auto type = r.string(t, "type", true, header, where, prefix + "type", "\"capillary\", \"porous\" or \"membrane\"");
    if (!type) {
        if (t.contains("type")) r.check_keys(t, where, all);
        return;
    }
    const std::string& ty = type->value;
    if (ty != "capillary" && ty != "porous" && ty != "membrane") {
        std::string message = in_quotes(prefix + "type") + " = " + type->text +
                              " is not \"capillary\", \"porous\" or \"membrane\"";
        if (const auto m = closest_match(ty, {"capillary", "porous", "membrane"}))
            message += "; did you mean \"" + *m + "\"?";
        r.error(type->place, message);
        return;
    }
    const auto& keys = ty == "capillary" ? capillary_keys : ty == "porous" ? porous_keys : membrane_keys;
    r.check_keys(t, where, keys, foreign_keys(ty));

    const auto q = [&](const char* key, kind k, bool required) {
        return r.quantity(t, key, k, required, header, where, prefix + key);
    };
    const auto pos = [&](const std::optional<located<double>>& v, const char* key) {
        return positive(r, v, prefix + key);
    };
    const auto ranged = [&](const std::optional<located<double>>& v, const char* key, const value_range& range) {
        return r.in_range(v, prefix + key, range);
    };
    bool ok = true;
    counterflux::barrier<double> b{};
    if (ty == "capillary") {
        const auto diameter = q("diameter", kind::length, true);
        const auto length = q("length", kind::length, true);
        ok &= ranged(diameter, "diameter", length_range);
        ok &= ranged(length, "length", length_range);
        long long count = 1;
        if (t.contains("count")) {
            const auto c = r.integer(t, "count", false, header, where, prefix + "count", 1, 1000000);
            ok &= c.has_value();
            if (c) count = c->value;
        }
        bool end_correction = true;
        if (const auto e = r.boolean(t, "end_correction", header, where, prefix + "end_correction")) end_correction = e->value;
        else ok &= !t.contains("end_correction");
        bool knudsen = true;
        if (const auto k = r.boolean(t, "knudsen", header, where, prefix + "knudsen")) knudsen = k->value;
        else ok &= !t.contains("knudsen");
        if (ok)
            b = counterflux::make_capillary<double>(diameter->value, length->value, static_cast<unsigned>(count),
                                                    end_correction, knudsen);
    } else if (ty == "porous") {
        bool knudsen = true;
        if (const auto k = r.boolean(t, "knudsen", header, where, prefix + "knudsen")) knudsen = k->value;
        else ok &= !t.contains("knudsen");
        const auto thickness = q("thickness", kind::length, true);
        const auto area = q("area", kind::area, true);
        const auto porosity = q("porosity", kind::dimensionless, true);
        const auto tortuosity = q("tortuosity", kind::dimensionless, true);
        const auto pore = q("pore_diameter", kind::length, knudsen);
        ok &= ranged(thickness, "thickness", length_range);
        ok &= ranged(area, "area", area_range);
        ok &= ranged(porosity, "porosity", porosity_range);
        ok &= tortuosity && r.require_that(tortuosity->value >= 1.0 && tortuosity->value <= 100.0, *tortuosity,
                                           prefix + "tortuosity", "expected 1 <= tortuosity <= 100");
        if (pore) ok &= ranged(pore, "pore_diameter", length_range);
        else ok &= !t.contains("pore_diameter") && !knudsen;
        if (ok)
            b = counterflux::make_porous<double>(thickness->value, area->value, porosity->value, tortuosity->value,
                                                 pore ? pore->value : 0.0, knudsen);
    } else {
        if (!(out.model.reference_temperature_K > 0.0)) return;  // [reference] is bad; already reported
        const auto thickness = q("thickness", kind::length, true);
        const auto area = q("area", kind::area, true);
        const auto permeability = q("permeability", kind::permeability, true);
        const auto energy = q("activation_energy", kind::energy, false);
        const auto diffusivity = q("diffusivity", kind::diffusivity, false);
        ok &= ranged(thickness, "thickness", length_range);
        ok &= ranged(area, "area", area_range);
        ok &= ranged(permeability, "permeability", permeability_range);
        if (energy) ok &= ranged(energy, "activation_energy", activation_energy_range);
        else ok &= !t.contains("activation_energy");
        if (diffusivity) ok &= pos(diffusivity, "diffusivity");
        else ok &= !t.contains("diffusivity");
        // The step response needs the film's diffusivity D or its partition
        // coefficient K = c_film / c_gas: the permeability fixes the other
        // (Pi = D S, K = S R T), so a file gives one of them, not both.
        const auto partition = q("partition", kind::dimensionless, false);
        if (partition) {
            ok &= r.require_that(partition->value >= 1e-6 && partition->value <= 1e6, *partition,
                                 prefix + "partition", "expected 1e-06 <= partition <= 1e+06 (c in the film / c in the gas)");
            if (diffusivity) {
                r.error(partition->place, in_quotes(prefix + "partition") +
                                              " and 'diffusivity' are both given; expected one of them: the "
                                              "permeability fixes the other (partition = permeability R T / diffusivity)");
                ok = false;
            }
        } else ok &= !t.contains("partition");
        double film_diffusivity = diffusivity ? diffusivity->value : 0.0;
        // From K at the reference temperature: D = Pi_ref R T_ref / K.
        if (ok && partition)
            film_diffusivity = permeability->value * counterflux::gas_constant_J_mol_K<double> *
                               out.model.reference_temperature_K / partition->value;
        if (ok)
            b = counterflux::make_membrane<double>(thickness->value, area->value, permeability->value,
                                                   energy ? energy->value : 0.0, out.model.reference_temperature_K,
                                                   film_diffusivity);
    }
    if (!ok) return;
    if (counterflux::validate(b) != counterflux::status::ok) {
        r.error(header, where + " (" + ty + ") is not a physical element: " +
                            counterflux::describe(counterflux::validate(b)));
        return;
    }
    if (counterflux::push(out.model.barriers, b) != counterflux::status::ok)
        r.error(header, where + ": too many barrier elements (at most " + std::to_string(max_elements) + ")");
}

std::optional<axis_spec> read_axis(reader& r, const toml::table& parent, const char* key, kind k,
                                   const source_place& header, const value_range& range) {
    const std::string dotted = std::string("table.") + key;
    const toml::node* n = r.get(parent, key, true, header, "[table]",
                                std::string("an inline table { from = ..., to = ..., points = ... } of ") + kind_name(k));
    if (n == nullptr) return std::nullopt;
    const auto* t = n->as_table();
    if (t == nullptr) {
        r.error(r.at(*n), in_quotes(dotted) + " must be an inline table { from = ..., to = ..., points = ... }, got " +
                              type_name(n->type()));
        return std::nullopt;
    }
    const source_place place = r.at(*t);
    const std::string where = in_quotes(dotted);
    r.check_keys(*t, where, {"from", "to", "points"});
    const auto from = r.quantity(*t, "from", k, true, place, where, dotted + ".from");
    const auto to = r.quantity(*t, "to", k, true, place, where, dotted + ".to");
    // points may be left out: the table verb then chooses the smallest grid
    // that meets table.max_error (which must then be given).
    const auto points = r.integer(*t, "points", false, place, where, dotted + ".points", 2, 4096);
    if (!from || !to || (!points && t->contains("points"))) return std::nullopt;
    const bool from_ok = r.in_range(from, dotted + ".from", range);
    const bool to_ok = r.in_range(to, dotted + ".to", range);
    if (!from_ok || !to_ok) return std::nullopt;
    if (!r.require_that(to->value > from->value, *to, dotted + ".to", "it must be greater than 'from'"))
        return std::nullopt;
    return axis_spec{from->value, to->value, points ? static_cast<unsigned>(points->value) : 0u, place};
}

void read_table(reader& r, const toml::table& t, sensor_file& out, const source_place& header) {
    r.check_keys(t, "[table]", {"temperature", "pressure", "values", "max_error"});
    table_spec spec;
    spec.place = header;
    bool ok = true;
    const auto temperature = read_axis(r, t, "temperature", kind::temperature, header, temperature_range);
    const auto pressure = read_axis(r, t, "pressure", kind::pressure, header, pressure_range);
    ok &= temperature.has_value() && pressure.has_value();
    if (temperature) spec.temperature = *temperature;
    if (pressure) spec.pressure = *pressure;
    if (auto v = r.string(t, "values", false, header, "[table]", "table.values", "\"float32\" or \"q15\"")) {
        if (v->value == "float32" || v->value == "q15") spec.values = v->value;
        else {
            r.error(v->place, "'table.values' = " + v->text + " is not \"float32\" or \"q15\"");
            ok = false;
        }
    } else ok &= !t.contains("values");
    if (auto v = r.quantity(t, "max_error", kind::concentration, false, header, "[table]", "table.max_error")) {
        if (r.require_that(v->value > 0.0 && v->value < 0.5, *v, "table.max_error",
                           "expected a relative error above zero and below 50 %"))
            spec.max_error = v->value;
        else ok = false;
        spec.max_error_given = true;
        spec.max_error_place = v->place;
    } else ok &= !t.contains("max_error");
    // Most nodes a table may have (common practice: a compensation table is a few
    // hundred nodes in flash; 16384 floats are 64 KiB, and the proof evaluates the
    // model about 1200 times per node).
    constexpr unsigned long max_nodes = 16384;
    if (ok && static_cast<unsigned long>(spec.temperature.points) * spec.pressure.points > max_nodes) {
        r.error(spec.pressure.place, "'table.temperature.points' x 'table.pressure.points' = " +
                                         std::to_string(spec.temperature.points) + " x " +
                                         std::to_string(spec.pressure.points) + " is more than " +
                                         std::to_string(max_nodes) + " nodes; use fewer points");
        ok = false;
    }
    if (ok && !spec.max_error_given) {
        for (const axis_spec* a : {&spec.temperature, &spec.pressure})
            if (a->points == 0) {
                r.error(a->place, std::string("'table.") + (a == &spec.temperature ? "temperature" : "pressure") +
                                      "' has no 'points'; give the number of nodes, or give 'table.max_error' "
                                      "and the grid is chosen to meet it");
                ok = false;
            }
    }
    if (ok) out.table = spec;
}

void read_zero(reader& r, const toml::table& t, sensor_file& out, const source_place& header) {
    const std::string where = "[zero]";
    r.check_keys(t, where, {"current", "temperature_coefficient"});
    zero_spec spec;
    spec.place = header;
    bool ok = true;
    if (auto v = r.quantity(t, "current", kind::current, true, header, where, "zero.current")) {
        if (r.require_that(std::fabs(v->value) <= 1.0e-3, *v, "zero.current",
                           "expected a zero current of at most 1 mA in magnitude"))
            spec.current_A = v->value;
        else ok = false;
    } else ok = false;
    if (auto v = r.quantity(t, "temperature_coefficient", kind::dimensionless, false, header, where,
                            "zero.temperature_coefficient")) {
        if (r.require_that(std::fabs(v->value) <= 0.5, *v, "zero.temperature_coefficient",
                           "expected a coefficient per kelvin from -0.5 to 0.5 (a bare number, 1/K)"))
            spec.per_K = v->value;
        else ok = false;
    } else ok &= !t.contains("temperature_coefficient");
    if (ok) out.zero = spec;
}

void read_response(reader& r, const toml::table& t, sensor_file& out, const source_place& header) {
    const std::string where = "[response]";
    r.check_keys(t, where,
                 {"front_volume", "sample_flow", "cavity_volume", "electrode_rate", "electrode_area", "duration"});
    response_spec spec;
    spec.place = header;
    spec.electrode_rate_m_s = std::numeric_limits<double>::infinity();
    bool ok = true;
    const auto opt = [&](const char* key, kind k, std::optional<double>& into, parse_options o = {}) {
        const std::string dotted = std::string("response.") + key;
        if (const auto v = r.quantity(t, key, k, false, header, where, dotted, o)) {
            if (positive(r, v, dotted)) into = v->value;
            else ok = false;
        } else ok &= !t.contains(key);
    };
    opt("front_volume", kind::volume, spec.front_volume_m3);
    opt("sample_flow", kind::flow, spec.sample_flow_m3_s);
    opt("cavity_volume", kind::volume, spec.cavity_volume_m3);
    std::optional<double> rate;
    parse_options infinite;
    infinite.allow_infinity = true;
    opt("electrode_rate", kind::velocity, rate, infinite);
    if (rate) spec.electrode_rate_m_s = *rate;
    opt("electrode_area", kind::area, spec.electrode_area_m2);
    opt("duration", kind::time, spec.duration_s);
    if (ok && spec.front_volume_m3.has_value() != spec.sample_flow_m3_s.has_value()) {
        r.error(header, spec.front_volume_m3 ? "'response.front_volume' needs 'sample_flow' in [response]"
                                             : "'response.sample_flow' needs 'front_volume' in [response]");
        ok = false;
    }
    if (ok) out.response = spec;
}

// Checks the model as a whole with the library at the reference condition:
// first each part on its own (so that a failure points at the part), then the
// sensitivity and the current at full scale.
void check_model(reader& r, sensor_file& out) {
    const auto& m = out.model;
    const double t = m.reference_temperature_K;
    const double p = m.reference_pressure_Pa;
    const std::string condition = "the reference condition (" + format_temperature(t) + ", " + format_pressure(p) + ")";
    if (const auto d = diagnose_condition(out, t, p, condition)) {
        r.error(d->place, d->message);
        return;
    }
    const auto s = counterflux::sensitivity_A_per_mol_per_mol(m, t, p);
    if (!s.ok()) {
        r.error(out.sensor_place, "the sensitivity of this sensor cannot be computed at " + condition + ": " +
                                      counterflux::describe(s.code));
        return;
    }
    const auto i = counterflux::limiting_current_A(m, t, p, out.full_scale_mol_mol);
    if (i.ok()) return;
    const std::string head = "'sensor.full_scale' = " + r.full_scale_text + ": ";
    if (const auto why = singular_log_law(out, out.full_scale_mol_mol, "full_scale"))
        r.error(out.full_scale_place, head + *why);
    else
        r.error(out.full_scale_place, head + "the current at " + format_concentration(out.full_scale_mol_mol) +
                                          " cannot be computed at " + condition + ": " +
                                          counterflux::describe(i.code) +
                                          "; expected a full scale at which the current is finite");
}

}  // namespace

std::optional<diagnostic> diagnose_condition(const sensor_file& f, double t, double p, const std::string& condition) {
    const auto& m = f.model;
    if (m.target == nullptr || m.background == nullptr) return std::nullopt;  // reported by the reader
    const auto d = counterflux::evaluate(m.diffusivity, t, p);
    if (!d.ok() || !(d.value > 0.0)) {
        std::string message = std::string("the diffusivity of ") + m.target->formula + " in " + m.background->formula +
                              " (" + counterflux::method_name(m.diffusivity.method) + ") cannot be computed at " +
                              condition + ": " + counterflux::describe(d.code);
        if (m.diffusivity.method == counterflux::diffusivity_method::chapman_enskog)
            if (const auto fit = chapman_enskog_fit_problem(*m.target, *m.background, t))
                message += "; " + *fit + "; use method = \"fuller\" or \"measured\"";
        return diagnostic{f.diffusivity_place, message};
    }
    const auto lambda = counterflux::mean_free_path(counterflux::kinetic_diameter_m<double>(*m.background), t, p);
    if (!lambda.ok() || !(lambda.value > 0.0))
        return diagnostic{f.sensor_place, std::string("the mean free path of ") + m.background->formula +
                                              " cannot be computed at " + condition + ": " +
                                              counterflux::describe(lambda.code)};
    const counterflux::gas_environment<double> env{t, p, d.value, counterflux::molar_mass_kg_mol<double>(*m.target),
                                                   lambda.value};
    for (std::size_t i = 0; i < m.barriers.count; ++i) {
        const auto& b = m.barriers.elements[i];
        const auto e = counterflux::resolve(b, env);
        if (e.ok()) continue;
        source_place place = i < f.element_places.size() ? f.element_places[i] : f.sensor_place;
        return diagnostic{place, "[[barrier]] #" + std::to_string(i + 1) + " (" + counterflux::kind_name(b.kind) +
                                     ") cannot be resolved at " + condition + ": " + counterflux::describe(e.code)};
    }
    return std::nullopt;
}

std::optional<std::string> singular_log_law(const sensor_file& f, double y, const std::string& knob) {
    const auto& m = f.model;
    if (m.barriers.count == 0) return std::nullopt;
    // alpha = 1 + N_B/N_A and 1/alpha: arithmetic on the file's flux ratio.
    const double alpha = 1.0 + m.flux_ratio;
    if (!(alpha > 0.0)) return std::nullopt;  // q(y) = r_m (1 - alpha y) + r_l grows with y: never singular
    const double y_singular = 1.0 / alpha;
    const auto& outer = m.barriers.elements[0];
    const bool blind_resistance = outer.kind == counterflux::barrier_kind::membrane || outer.knudsen;
    // A fraction a rounding below 1/alpha already meets the library's floor of q.
    if (!(y >= y_singular * (1.0 - 1e-9))) return std::nullopt;
    if (blind_resistance && !(y > y_singular)) return std::nullopt;

    const bool stagnant = m.flux_ratio == 0.0;
    const std::string law = stagnant ? std::string("the stagnant-film log law")
                                     : "with 'sensor.flux_ratio' = " + number_as_written(m.flux_ratio) +
                                           " (alpha = 1 + N_B/N_A = " + format_number(alpha, 6) + ") the log law";
    const std::string at_y = format_concentration(y);
    const std::string singular =
        alpha == 1.0 ? std::string("y = 1/alpha = 1")
                     : "y = 1/alpha = 1/" + format_number(alpha, 6) + " = " + format_concentration(y_singular);
    const bool series = m.barriers.count > 1;
    const std::string element = series ? std::string("the outer element ([[barrier]] #1)") : std::string("the barrier");
    const std::string lower = "lower " + knob + " below " + format_concentration(y_singular) +
                              (stagnant ? std::string("") : std::string(", lower the flux ratio"));
    if (!blind_resistance) {
        const std::string knudsen = outer.kind == counterflux::barrier_kind::porous
                                        ? "knudsen = true, with a pore_diameter"
                                        : "knudsen = true";
        return law + " has no finite current at " + at_y + " (singular at " + singular + "); " + lower + " or " +
               (series ? "give " + element + " a Knudsen resistance (" + knudsen + ") or put a membrane first"
                       : "give " + element + " a Knudsen (" + knudsen + ") or membrane resistance");
    }
    // The outer element's Knudsen resistance lifts the limit above 1/alpha, but not up to y.
    return law + " has no finite current at " + at_y + ": it is singular at " + singular + " and the Knudsen " +
           "resistance of " + element + " lifts that limit, but not up to " + at_y + "; lower " + knob +
           " (below " + format_concentration(y_singular) + " the current is always finite), lower the flux ratio" +
           " or put a membrane first";
}

namespace {

bool same_ignoring_case(std::string_view a, std::string_view b) noexcept {
    const auto lower = [](char c) { return (c >= 'A' && c <= 'Z') ? static_cast<char>(c - 'A' + 'a') : c; };
    if (a.size() != b.size()) return false;
    for (std::size_t i = 0; i < a.size(); ++i)
        if (lower(a[i]) != lower(b[i])) return false;
    return true;
}

}  // namespace

std::string unknown_gas_hint(const std::string& name) {
    std::string out;
    for (std::size_t i = 0; i < counterflux::gas_count; ++i)
        if (same_ignoring_case(counterflux::gas_table[i].formula, name)) {
            out = std::string("; did you mean '") + counterflux::gas_table[i].formula +
                  "'? (formulas are case-sensitive)";
            break;
        }
    return out + "; known formulas: " + known_gas_formulas() + " (or their English names, in any case)";
}

std::string known_gas_formulas() {
    std::string out;
    for (std::size_t i = 0; i < counterflux::gas_count; ++i) {
        if (i) out += ", ";
        out += counterflux::gas_table[i].formula;
    }
    return out;
}

std::size_t edit_distance(std::string_view a, std::string_view b) {
    const std::size_t n = a.size(), m = b.size();
    std::vector<std::vector<std::size_t>> d(n + 1, std::vector<std::size_t>(m + 1));
    for (std::size_t i = 0; i <= n; ++i) d[i][0] = i;
    for (std::size_t j = 0; j <= m; ++j) d[0][j] = j;
    for (std::size_t i = 1; i <= n; ++i)
        for (std::size_t j = 1; j <= m; ++j) {
            const std::size_t cost = a[i - 1] == b[j - 1] ? 0 : 1;
            d[i][j] = std::min({d[i - 1][j] + 1, d[i][j - 1] + 1, d[i - 1][j - 1] + cost});
            if (i > 1 && j > 1 && a[i - 1] == b[j - 2] && a[i - 2] == b[j - 1])
                d[i][j] = std::min(d[i][j], d[i - 2][j - 2] + 1);
        }
    return d[n][m];
}

std::optional<std::string> closest_match(std::string_view word, const std::vector<std::string>& candidates) {
    // The distance table is word.size() x candidate.size(): a long word is no typo of a short name.
    if (word.size() > max_suggestion_length) return std::nullopt;
    std::optional<std::string> best;
    std::size_t best_distance = std::numeric_limits<std::size_t>::max();
    for (const auto& c : candidates) {
        const std::size_t dist = edit_distance(word, c);
        if (dist < best_distance) {
            best_distance = dist;
            best = c;
        }
    }
    const std::size_t limit = std::max<std::size_t>(2, word.size() / 3);
    if (!best || best_distance > limit || best_distance >= std::max(word.size(), best->size())) return std::nullopt;
    return best;
}

sensor_file parse_sensor_file(std::string_view text, const std::string& path) {
    reader r(path);
    sensor_file out;
    out.path = path;
    out.text = std::string(text);

    toml::table root;
    try {
        root = toml::parse(text, path);
    } catch (const toml::parse_error& e) {
        source_place p = r.at(e.source());
        throw input_error(p, std::string("TOML syntax error: ") + std::string(e.description()));
    }

    source_place file_start;
    file_start.file = path;
    file_start.line = 1;
    file_start.column = 1;

    r.check_keys(root, "the file", {"sensor", "reference", "diffusivity", "barrier", "zero", "table", "response"});

    const toml::table* sensor = r.table(root, "sensor", true, file_start, "symbol, target, background, ...");
    if (sensor) read_sensor(r, *sensor, out, r.at(*sensor));
    const toml::table* reference = r.table(root, "reference", true, file_start, "the calibration temperature and pressure");
    if (reference) read_reference(r, *reference, out, r.at(*reference));
    const toml::table* diffusivity = r.table(root, "diffusivity", true, file_start, "method = \"fuller\", \"chapman-enskog\" or \"measured\"");
    if (diffusivity) read_diffusivity(r, *diffusivity, out, r.at(*diffusivity));

    const toml::node* barriers = root.get("barrier");
    if (barriers == nullptr) {
        r.error(file_start, "missing required [[barrier]]: at least one barrier element (capillary, porous or membrane)");
    } else if (!barriers->is_array_of_tables()) {
        r.error(r.at(*barriers), "'barrier' must be an array of tables written [[barrier]], got " +
                                     std::string(type_name(barriers->type())));
    } else {
        const auto& array = *barriers->as_array();
        if (array.empty()) r.error(r.at(*barriers), "at least one [[barrier]] element is required");
        if (array.size() > max_elements)
            r.error(r.at(*array.get(max_elements)), "too many [[barrier]] elements: at most " +
                                                         std::to_string(max_elements));
        else
            for (std::size_t i = 0; i < array.size(); ++i) read_barrier(r, *array.get(i)->as_table(), i, out);
    }

    if (const toml::table* t = r.table(root, "zero", false, file_start, "")) read_zero(r, *t, out, r.at(*t));
    if (const toml::table* t = r.table(root, "table", false, file_start, "")) read_table(r, *t, out, r.at(*t));
    if (const toml::table* t = r.table(root, "response", false, file_start, "")) read_response(r, *t, out, r.at(*t));

    if (r.diagnostics.empty() && sensor != nullptr) check_model(r, out);

    if (!r.diagnostics.empty()) {
        std::stable_sort(r.diagnostics.begin(), r.diagnostics.end(), [](const diagnostic& a, const diagnostic& b) {
            return a.place.line != b.place.line ? a.place.line < b.place.line : a.place.column < b.place.column;
        });
        throw input_error(std::move(r.diagnostics));
    }
    return out;
}

sensor_file read_sensor_file(const std::filesystem::path& path) {
    const std::string name = path.string();
    source_place whole;
    whole.file = name;
    // Only a regular file (symbolic links followed): a FIFO would block the
    // read, a device such as /dev/zero would never end.
    std::error_code ec;
    const auto st = std::filesystem::status(path, ec);
    if (ec || !std::filesystem::exists(st)) {
        const int e = ec ? ec.value() : ENOENT;
        throw input_error(whole, std::string("cannot open the sensor file: ") + std::strerror(e));
    }
    const auto type = st.type();
    if (type == std::filesystem::file_type::directory)
        throw input_error(whole, "is a directory, expected a sensor file (a regular file)");
    if (type != std::filesystem::file_type::regular) {
        const char* what = type == std::filesystem::file_type::fifo        ? "a FIFO"
                           : type == std::filesystem::file_type::socket    ? "a socket"
                           : type == std::filesystem::file_type::character ? "a character device"
                           : type == std::filesystem::file_type::block     ? "a block device"
                                                                            : "not a regular file";
        throw input_error(whole, std::string("is ") + what + ", expected a sensor file (a regular file)");
    }
    const auto too_big = [&] {
        return input_error(whole, "is larger than " + std::to_string(max_sensor_file_bytes / 1024) +
                                      " KiB (1 MiB), too large for a sensor file");
    };
    const auto size = std::filesystem::file_size(path, ec);
    if (!ec && size > max_sensor_file_bytes) throw too_big();
    std::ifstream in(path, std::ios::binary);
    if (!in) throw input_error(whole, std::string("cannot open the sensor file: ") + std::strerror(errno));
    // Read at most one byte past the cap, so a file that grows is still bounded.
    std::string text(max_sensor_file_bytes + 1, '\0');
    in.read(text.data(), static_cast<std::streamsize>(text.size()));
    if (in.bad()) throw input_error(whole, "cannot read the sensor file");
    text.resize(static_cast<std::size_t>(in.gcount()));
    if (text.size() > max_sensor_file_bytes) throw too_big();
    return parse_sensor_file(text, name);
}

}  // namespace counterflux::tool
