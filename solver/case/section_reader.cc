// SectionReader: settings access, schema defaults and the InputErrors of the section builders.
#include "case/section_reader.h"

#include "case/input_error.h"

#include <stdexcept>

namespace fickcast
{
  SectionReader::SectionReader(const Settings &settings_in, const unsigned int dimension_in)
    : settings(settings_in)
    , dimension(dimension_in)
  {
  }

  const SettingValue *SectionReader::get(const std::string &section, const std::string &key) const
  {
    return settings.find(section, key);
  }

  std::string SectionReader::where(const std::string &section) const
  {
    const auto it = settings.section_origins.find(section);
    if (it != settings.section_origins.end())
      return it->second;
    return settings.file;
  }

  void SectionReader::missing(const std::string &section, const std::string &key, const std::string &expected) const
  {
    const bool has_section = settings.section_origins.count(section) != 0;
    throw InputError(where(section), section + "." + key,
                     "missing required key: expected " + expected +
                       (has_section ? "" : " (there is no [" + section + "] section)"));
  }

  const KeySpec &SectionReader::spec(const std::string &section, const std::string &key) const
  {
    const KeySpec *s = find_key(section_kind(section), key);
    if (s == nullptr)
      throw std::logic_error("fickcast: key not in schema: " + section + "." + key);
    return *s;
  }

  std::string SectionReader::text(const std::string &section, const std::string &key) const
  {
    if (const auto *v = get(section, key))
      return v->text;
    return spec(section, key).fallback;
  }

  double SectionReader::quantity(const std::string &section, const std::string &key, const double fallback) const
  {
    if (const auto *v = get(section, key); v && !v->is_auto)
      return v->si;
    return fallback;
  }

  bool SectionReader::is_set(const std::string &section, const std::string &key) const
  {
    const auto *v = get(section, key);
    return v != nullptr && !v->is_auto;
  }

  ScalarField SectionReader::field(const std::string &section, const std::string &key) const
  {
    if (const auto *v = get(section, key))
      return v->field;
    const std::string fallback = spec(section, key).fallback;
    return ScalarField::constant(fallback.empty() ? 0.0 : std::stod(fallback));
  }

  void SectionReader::fail(const SettingValue &value, const std::string &message) const
  {
    throw InputError(value.origin, value.full_key(), message);
  }
} // namespace fickcast
