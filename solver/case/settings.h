// Parsed, unit-converted case settings, before they are assembled into a CaseDescription.
#pragma once

#include "case/case_description.h"
#include "case/key_schema.h"

#include <map>
#include <string>
#include <vector>

namespace fickcast
{
  /// One key with its value parsed according to its KeySpec, SI.
  struct SettingValue
  {
    const KeySpec *spec = nullptr;
    std::string section;              ///< `time`, `region.clay`
    std::string key;                  ///< `end`, `point.base`
    std::string written;              ///< as written in the file or on the command line
    std::string origin;               ///< file:line or --set
    bool is_auto = false;             ///< the word auto
    double si = 0;                    ///< quantity or integer value, SI
    std::string si_unit;              ///< SI unit of si / list / field
    ScalarField field;                ///< field kind
    std::vector<double> list;         ///< quantity_list and point kinds, SI
    std::vector<std::string> anchors; ///< point kinds: per coordinate, `start of NAME` / `end of NAME` or empty
    std::vector<LayerSpec> layers;    ///< layers kind
    std::string text;                 ///< text and choice kinds
    bool flag = false;                ///< flag kind
    TemperatureSchedule schedule;     ///< schedule kind

    std::string full_key() const { return section + "." + key; }
    /// The SI reading for `fickcast check`: `1.9e-09 m2/s`, `{expr} x 0.001 kg/m3`, ...
    std::string si_text() const;
  };

  /// All settings of one case, in file order, with the sections they came in.
  class Settings
  {
  public:
    void add(SettingValue value) { values_.push_back(std::move(value)); }
    const SettingValue *find(const std::string &section, const std::string &key) const;
    const std::vector<SettingValue> &all() const { return values_; }
    /// Named sections of kind @p kind (`region`), in order of first appearance: their names.
    std::vector<std::string> names_of(const std::string &kind) const;

    std::string file;
    std::map<std::string, std::string> section_origins; ///< section -> file:line of its header
    ConcentrationUnits units;
    std::vector<std::string> warnings; ///< readings a person should confirm (a time without its unit)

  private:
    std::vector<SettingValue> values_;
  };

  /// Formats an SI number for people: up to 10 significant digits.
  std::string format_si(double value, const std::string &unit);
} // namespace fickcast
