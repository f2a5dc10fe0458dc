// The settings as the case builder's sections read them: values, defaults, origins, errors.
#pragma once

#include "case/case_description.h"
#include "case/settings.h"

#include <string>
#include <vector>

namespace fickcast
{
  /**
   * The parsed settings of a @p dimension-D case, read one key at a time by the section builders
   * (section_builders.h): a key's value or its schema default, where a section was written, and
   * InputErrors that name the key.
   *
   * It also carries what one section learns for later ones: the boundary names of the geometry
   * and the mesh file as written.
   */
  class SectionReader
  {
  public:
    SectionReader(const Settings &settings, unsigned int dimension);

    /// The value of @p section.@p key as given, or nullptr.
    const SettingValue *get(const std::string &section, const std::string &key) const;
    /// file:line of the [@p section] header, or the case file if the section is not written.
    std::string where(const std::string &section) const;
    /// Throws the InputError for a missing @p section.@p key, saying what was @p expected.
    [[noreturn]] void missing(const std::string &section, const std::string &key, const std::string &expected) const;
    /// The schema entry of @p section.@p key (a logic error if the schema has none).
    const KeySpec &spec(const std::string &section, const std::string &key) const;
    /// The text of @p section.@p key, or its schema default.
    std::string text(const std::string &section, const std::string &key) const;
    /// The SI value of @p section.@p key, or @p fallback if it is not given or auto.
    double quantity(const std::string &section, const std::string &key, double fallback) const;
    /// Whether @p section.@p key is given and not auto.
    bool is_set(const std::string &section, const std::string &key) const;
    /// The field of @p section.@p key, or the constant of its schema default (0 if none).
    ScalarField field(const std::string &section, const std::string &key) const;
    /// Throws an InputError at @p value (its origin and key) with @p message.
    [[noreturn]] void fail(const SettingValue &value, const std::string &message) const;

    const Settings &settings;
    const unsigned int dimension;
    std::vector<std::string> faces; ///< boundary names of the geometry, by id (set by build_boundaries)
    std::string mesh;               ///< the mesh file as written, if any (set by build_geometry, for messages)
  };
} // namespace fickcast
