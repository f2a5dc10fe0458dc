// Every case key fickcast knows: kind, dimension, default, bounds and help text.
#pragma once

#include <limits>
#include <string>
#include <vector>

namespace fickcast
{
  /// How a key's value is written.
  enum class ValueKind
  {
    text,          ///< free text
    choice,        ///< one word out of a list
    integer,       ///< whole number within bounds
    flag,          ///< true/false, yes/no, on/off
    quantity,      ///< number with unit (or `auto` where allowed)
    field,         ///< number with unit, or `{expression} unit`
    quantity_list, ///< comma-separated quantities of one dimension
    point,         ///< comma-separated coordinates, one per axis, each a length; `... in REGION`
    layers,        ///< `name thickness unit, name thickness unit, ...`
    schedule,      ///< temperature: `800 degC, ramp 10 degC/min to 1100 degC, hold 1 h`
    segment        ///< two points: `0 m, 0.5 m to 1 m, 0.5 m`
  };

  /// Physical dimension of a quantity key; concentration-derived ones follow the case's
  /// concentration units (mass, amount or number per volume, or a fraction).
  enum class Dim
  {
    none,
    dimensionless,
    length,
    time,
    diffusivity,
    velocity,
    temperature,
    rate,
    concentration,
    flux,
    source,
    density,           ///< kg/m3 (bulk density)
    specific_volume,   ///< m3/kg (distribution coefficient)
    activation_energy, ///< J (per particle, e.g. eV) or J/mol (e.g. kJ/mol)
    bath_volume,       ///< m3 in 3-D; per unit length (m2) in 2-D; per unit area (m) in 1-D
    amount,            ///< the case's amount unit (concentration times the measure of the domain)
    boundary_value     ///< concentration or flux, decided by the boundary type
  };

  struct KeySpec
  {
    std::string section; ///< `case`, `geometry`, ... or `region`, `boundary` for named sections
    std::string key;     ///< key, or a prefix ending in `.*` (for example `point.*`)
    ValueKind kind = ValueKind::text;
    Dim dim = Dim::none;
    std::string fallback; ///< default as it would be written; empty: none
    bool required = false;
    bool allow_auto = false; ///< the word `auto` is accepted (and is then the default)
    std::vector<std::string> choices;
    double lower = -std::numeric_limits<double>::infinity();
    bool lower_open = false; ///< lower bound excluded
    double upper = std::numeric_limits<double>::infinity();
    bool upper_open = false;            ///< upper bound excluded
    std::vector<std::string> variables; ///< expression variables (field kind)
    std::string help;

    bool is_pattern() const { return key.size() > 2 && key.compare(key.size() - 2, 2, ".*") == 0; }
    bool matches(const std::string &name) const;
  };

  /// All keys, in the order `fickcast check` prints them.
  const std::vector<KeySpec> &key_schema();

  /// Fixed section names, then the named-section kinds (`region`, `boundary`).
  const std::vector<std::string> &fixed_sections();
  const std::vector<std::string> &named_section_kinds();

  /// `region.clay` -> `region`; `time` -> `time`; unknown kinds returned unchanged.
  std::string section_kind(const std::string &section);

  /// The spec of @p key in a section of kind @p kind, or nullptr.
  const KeySpec *find_key(const std::string &kind, const std::string &key);

  /// Key names valid in a section of kind @p kind (patterns shown with their `*`).
  std::vector<std::string> keys_of(const std::string &kind);

  /// Words describing a dimension for messages ("a diffusivity such as 1e-9 m2/s").
  std::string describe_dim(Dim dim);
} // namespace fickcast
