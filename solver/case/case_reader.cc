#include "case/case_reader.h"
#include "case/renamed_spellings.h"

#include "case/case_builder.h"
#include "case/expression.h"
#include "case/ini_document.h"
#include "case/input_error.h"
#include "case/quantity_text.h"
#include "case/settings.h"
#include "case/temperature_schedule.h"
#include "case/time_table.h"
#include "case/units.h"

#include <algorithm>
#include <cmath>
#include <cstdio>
#include <cstdlib>
#include <filesystem>
#include <fstream>
#include <regex>
#include <set>
#include <sstream>

namespace fickcast
{
  namespace
  {
    const std::vector<std::string> concentration_bases = {"kg/m3", "mol/m3", "1/m3", "1"};
    const std::vector<std::string> flux_bases = {"kg/(m2 s)", "mol/(m2 s)", "1/(m2 s)", "m/s"};
    const std::vector<std::string> source_bases = {"kg/(m3 s)", "mol/(m3 s)", "1/(m3 s)", "1/s"};

    /// The measure a bath volume is written in: that of the amounts (whole in 3-D, for a sphere
    /// and for axisymmetric cases; per unit length in 2-D Cartesian cases and for a cylinder; per
    /// unit area in 1-D Cartesian cases), as the solver books the bath's content against them.
    unsigned int bath_measure(const unsigned int dimension, const std::string &coordinates)
    {
      if (coordinates == "sphere" || coordinates == "axisymmetric")
        return 3;
      if (coordinates == "cylinder")
        return 2;
      return dimension;
    }

    std::string si_unit_of(const Dim dim, const ConcentrationUnits &units, const unsigned int dimension = 1,
                           const std::string &coordinates = "cartesian")
    {
      switch (dim)
        {
          case Dim::density:
            return "kg/m3";
          case Dim::specific_volume:
            return "m3/kg";
          case Dim::activation_energy:
            return "J";
          case Dim::bath_volume:
            {
              const unsigned int measure = bath_measure(dimension, coordinates);
              return measure == 1 ? "m" : measure == 2 ? "m2" : "m3";
            }
          case Dim::amount:
            return units.amount;
          case Dim::dimensionless:
            return "1";
          case Dim::length:
            return "m";
          case Dim::time:
            return "s";
          case Dim::diffusivity:
            return "m2/s";
          case Dim::velocity:
            return "m/s";
          case Dim::temperature:
            return "K";
          case Dim::rate:
            return "1/s";
          case Dim::concentration:
            return units.concentration;
          case Dim::flux:
            return units.flux;
          case Dim::source:
            return units.source;
          case Dim::boundary_value:
          case Dim::none:
            break;
        }
      return "1";
    }

    /// Splits `region.clay.diffusivity=2e-9 m2/s` into section, key and value.
    IniEntry parse_override(const std::string &text)
    {
      const auto equals = text.find('=');
      const std::string name = equals == std::string::npos ? text : text.substr(0, equals);
      if (equals == std::string::npos || name.find('.') == std::string::npos)
        throw InputError("--set", text, "expected 'section.key=value', found '" + text + "'");
      const std::string value = text.substr(equals + 1);
      const auto first_dot = name.find('.');
      const std::string first = name.substr(0, first_dot);
      std::string section = first;
      std::string key = name.substr(first_dot + 1);
      const auto &named = named_section_kinds();
      if (std::find(named.begin(), named.end(), first) != named.end())
        {
          const auto second_dot = name.find('.', first_dot + 1);
          if (second_dot == std::string::npos)
            throw InputError("--set", name, "expected '" + first + ".NAME.key=value', found '" + text + "'");
          section = name.substr(0, second_dot);
          key = name.substr(second_dot + 1);
        }
      auto trim = [](const std::string &s) {
        const auto a = s.find_first_not_of(" \t");
        if (a == std::string::npos)
          return std::string();
        return s.substr(a, s.find_last_not_of(" \t") - a + 1);
      };
      return IniEntry{trim(section), trim(key), trim(value), "--set", 0};
    }

    void check_section_known(const std::string &section, const std::string &where)
    {
      const std::string kind = section_kind(section);
      const auto &fixed = fixed_sections();
      const auto &named = named_section_kinds();
      if (std::find(fixed.begin(), fixed.end(), section) != fixed.end())
        return;
      if (std::find(named.begin(), named.end(), kind) != named.end() && section.size() > kind.size() + 1)
        return;
      std::vector<std::string> candidates = fixed;
      for (const auto &n : named)
        candidates.push_back(n + ".NAME");
      std::string list;
      for (const auto &c : candidates)
        list += (list.empty() ? "" : ", ") + std::string("[") + c + "]";
      const std::string suggestion = nearest(section, candidates);
      throw InputError(where, "",
                       "unknown section [" + section + "]; expected one of " + list +
                         (suggestion.empty() ? "" : " (did you mean [" + suggestion + "]?)"));
    }

    /// The key spec of a stage's `boundary.NAME.KEY`: that of KEY in [boundary.NAME].
    const KeySpec *stage_boundary_key(const std::string &key)
    {
      if (key.rfind("boundary.", 0) != 0)
        return nullptr;
      const auto dot = key.find('.', 9);
      if (dot == std::string::npos || dot == 9)
        return nullptr;
      return find_key("boundary", key.substr(dot + 1));
    }

    /// Section and key of the boundary a key refers to: [boundary.top] itself, or a stage's
    /// boundary.top.KEY.
    std::pair<std::string, std::string> boundary_of(const IniEntry &entry)
    {
      if (section_kind(entry.section) == "stage")
        {
          const auto dot = entry.key.find('.', 9);
          return {entry.key.substr(0, dot), entry.key.substr(dot + 1)};
        }
      return {entry.section, entry.key};
    }

    const KeySpec &lookup_key(const IniEntry &entry)
    {
      const std::string kind = section_kind(entry.section);
      if (kind == "stage" && entry.key.rfind("boundary.", 0) == 0)
        {
          if (const KeySpec *spec = stage_boundary_key(entry.key))
            return *spec;
          std::string suggestion;
          const auto dot = entry.key.find('.', 9);
          if (dot != std::string::npos)
            suggestion = nearest(entry.key.substr(dot + 1), keys_of("boundary"));
          throw InputError(entry.origin(), entry.full_key(),
                           "expected boundary.NAME.KEY with a key of [boundary.NAME] (type, value, ambient, "
                           "coefficient, volume, partition, initial)" +
                             (suggestion.empty() ? "" : "; did you mean '" + suggestion + "'?"));
        }
      if (const KeySpec *spec = find_key(kind, entry.key))
        return *spec;
      const auto keys = keys_of(kind);
      std::vector<std::string> plain;
      for (const auto &k : keys)
        plain.push_back(k.back() == '*' ? k.substr(0, k.size() - 1) + "NAME" : k);
      std::string suggestion = nearest(entry.key, plain);
      // point.x / threshold.x typed with another prefix: suggest by the prefix alone.
      if (suggestion.empty() && entry.key.find('.') != std::string::npos)
        suggestion = nearest(entry.key.substr(0, entry.key.find('.')) + ".NAME", plain);
      std::string list;
      for (const auto &k : plain)
        list += (list.empty() ? "" : ", ") + k;
      throw InputError(entry.origin(), entry.full_key(),
                       "unknown key in [" + entry.section + "]" +
                         (suggestion.empty() ? "" : " (did you mean '" + suggestion + "'?)") +
                         "; keys of this section: " + list);
    }

    double parse_integer(const IniEntry &entry)
    {
      static const std::regex integer(R"(^[+-]?\d{1,9}$)");
      if (!std::regex_match(entry.value, integer))
        throw InputError(entry.origin(), entry.full_key(), "expected a whole number, found '" + entry.value + "'");
      return std::stod(entry.value);
    }

    void check_bounds(const KeySpec &spec, const double value, const IniEntry &entry, const std::string &unit)
    {
      const bool below = spec.lower_open ? !(value > spec.lower) : !(value >= spec.lower);
      const bool above = spec.upper_open ? !(value < spec.upper) : !(value <= spec.upper);
      if (!below && !above)
        return;
      std::string expected;
      const bool has_lower = std::isfinite(spec.lower);
      const bool has_upper = std::isfinite(spec.upper);
      if (has_lower && has_upper)
        expected = std::string("a value in ") + (spec.lower_open ? "(" : "[") + format_si(spec.lower, "") + ", " +
                   format_si(spec.upper, "") + (spec.upper_open ? ")" : "]");
      else if (has_lower)
        expected = std::string("a value ") + (spec.lower_open ? "> " : ">= ") + format_si(spec.lower, "");
      else
        expected = std::string("a value ") + (spec.upper_open ? "< " : "<= ") + format_si(spec.upper, "");
      throw InputError(entry.origin(), entry.full_key(),
                       "expected " + expected + (unit.empty() || unit == "1" ? "" : " " + unit) + ", found '" +
                         entry.value + "' (" + format_si(value, unit) + ")");
    }

    std::string family_note(const Dim dim, const ConcentrationUnits *units)
    {
      if (units == nullptr || units->decided_by.empty() ||
          (dim != Dim::concentration && dim != Dim::flux && dim != Dim::source))
        return "";
      return " (this case's concentrations are in " + units->concentration + ", as set by " + units->decided_by + ")";
    }

    double to_si_or_throw(const IniEntry &entry, double number, const std::string &unit, const std::string &si_unit,
                          const Dim dim, const ConcentrationUnits *units = nullptr)
    {
      try
        {
          return UnitSystem::instance().to_si(number, unit, si_unit);
        }
      catch (const UnitError &error)
        {
          throw InputError(entry.origin(), entry.full_key(),
                           std::string(error.what()) + "; expected " + describe_dim(dim) + family_note(dim, units));
        }
    }

    /// Avogadro constant, exact (SI Brochure, 9th ed., 2019).
    constexpr double avogadro = 6.02214076e23;

    /// Whether a temperature schedule holds a number without its unit (a number followed by
    /// nothing, a comma, `to` or `in`).
    bool has_bare_number(const std::string &text)
    {
      std::string spaced;
      for (const char ch : text)
        spaced += ch == ',' ? std::string(" , ") : std::string(1, ch);
      std::istringstream words(spaced);
      std::vector<std::string> tokens;
      for (std::string word; words >> word;)
        tokens.push_back(word);
      for (std::size_t k = 0; k < tokens.size(); ++k)
        {
          char *end = nullptr;
          std::strtod(tokens[k].c_str(), &end);
          const bool number = end != tokens[k].c_str() && *end == '\0';
          if (number &&
              (k + 1 == tokens.size() || tokens[k + 1] == "," || tokens[k + 1] == "to" || tokens[k + 1] == "in"))
            return true;
        }
      return false;
    }

    struct Parser
    {
      Settings &settings;
      unsigned int dimension = 1;
      std::string coordinate_system = "cartesian"; ///< case.coordinates, for the bath volume's measure

      /// A time or a temperature written without its unit is read in SI, which is rarely meant
      /// (20 for 20 s, 1000 for 1000 K): one warning naming the reading.
      void warn_bare(const IniEntry &entry, const Dim dim, const std::string &text)
      {
        if (dim != Dim::time && dim != Dim::temperature)
          return;
        settings.warnings.push_back(
          entry.origin() + ": " + entry.full_key() + ": '" + printable(text, 80) + "' has no unit and is read as " +
          (dim == Dim::time ? "seconds" : "kelvin") + "; write the unit (for example " +
          (dim == Dim::time ? "'20 min', '3 d' or '10 yr'" : "'1000 degC' or '1273 K'") + ") to say what you mean");
      }

      /// A path in the case file, relative to the case file's folder.
      std::string resolve_path(const std::string &path) const
      {
        const std::filesystem::path p(path);
        if (p.is_absolute())
          return path;
        return (std::filesystem::path(settings.file).parent_path() / p).lexically_normal().string();
      }

      Dim effective_dim(const KeySpec &spec, const IniEntry &entry, const std::vector<IniEntry> &entries) const
      {
        if (spec.dim != Dim::boundary_value)
          return spec.dim;
        return boundary_type_of(entry, entries) == "flux" ? Dim::flux : Dim::concentration;
      }

      /// The type of the boundary @p entry belongs to: the stage's own, else the base section's.
      static std::string boundary_type_of(const IniEntry &entry, const std::vector<IniEntry> &entries)
      {
        const auto [boundary_section, key] = boundary_of(entry);
        (void)key;
        if (section_kind(entry.section) == "stage")
          for (const auto &other : entries)
            if (other.section == entry.section && other.key == boundary_section + ".type")
              return other.value;
        for (const auto &other : entries)
          if (other.section == boundary_section && other.key == "type")
            return other.value;
        return "";
      }

      SettingValue parse(const IniEntry &entry, const KeySpec &spec, const Dim dim)
      {
        SettingValue value;
        value.spec = &spec;
        value.section = entry.section;
        value.key = entry.key;
        value.written = entry.value;
        value.origin = entry.origin();
        value.si_unit = si_unit_of(dim, settings.units, dimension, coordinate_system);
        const std::string &text = entry.value;
        if (text.empty() && spec.kind != ValueKind::text)
          throw InputError(entry.origin(), entry.full_key(),
                           "expected " + (spec.dim == Dim::none ? std::string("a value") : describe_dim(dim)) +
                             ", found an empty value");
        if (spec.allow_auto && text == "auto")
          {
            value.is_auto = true;
            return value;
          }
        try
          {
            switch (spec.kind)
              {
                case ValueKind::text:
                  value.text = text;
                  break;
                case ValueKind::choice:
                  if (std::find(spec.choices.begin(), spec.choices.end(), text) == spec.choices.end())
                    {
                      std::string list;
                      for (const auto &c : spec.choices)
                        list += (list.empty() ? "" : ", ") + c;
                      const std::string suggestion = nearest(text, spec.choices);
                      throw InputError(entry.origin(), entry.full_key(),
                                       "expected one of " + list + ", found '" + text + "'" +
                                         (suggestion.empty() ? "" : " (did you mean '" + suggestion + "'?)"));
                    }
                  value.text = text;
                  break;
                case ValueKind::integer:
                  value.si = parse_integer(entry);
                  check_bounds(spec, value.si, entry, "");
                  break;
                case ValueKind::flag:
                  if (text == "true" || text == "yes" || text == "on" || text == "1")
                    value.flag = true;
                  else if (text == "false" || text == "no" || text == "off" || text == "0")
                    value.flag = false;
                  else
                    throw InputError(entry.origin(), entry.full_key(), "expected true or false, found '" + text + "'");
                  break;
                case ValueKind::quantity:
                  {
                    const QuantityText q = split_quantity(text, false);
                    if (q.unit.empty() && q.number != 0)
                      warn_bare(entry, dim, text);
                    if (dim == Dim::activation_energy && !q.unit.empty() &&
                        UnitSystem::instance().convertible(q.unit, "J/mol"))
                      value.si = UnitSystem::instance().to_si(q.number, q.unit, "J/mol") / avogadro;
                    else
                      value.si = to_si_or_throw(entry, q.number, q.unit, value.si_unit, dim, &settings.units);
                    check_bounds(spec, value.si, entry, value.si_unit);
                    break;
                  }
                case ValueKind::schedule:
                  value.schedule = parse_temperature_schedule(text);
                  if (has_bare_number(text))
                    settings.warnings.push_back(entry.origin() + ": " + entry.full_key() + ": '" + printable(text, 80) +
                                                "' holds a number without its unit, read in SI (kelvin, seconds, "
                                                "K/s); write each unit (for example '1000 degC, hold 2 h') to say "
                                                "what you mean");
                  break;
                case ValueKind::field:
                  {
                    if (text.rfind("file:", 0) == 0)
                      {
                        if (std::find(spec.variables.begin(), spec.variables.end(), "t") == spec.variables.end())
                          throw InputError(entry.origin(), entry.full_key(),
                                           "expected a value or an expression here; a table against time "
                                           "(file:NAME.csv) is not allowed for this key");
                        try
                          {
                            value.field.table = read_time_table(resolve_path(text.substr(5)), value.si_unit);
                          }
                        catch (const InputError &error)
                          {
                            throw InputError(error.where(), entry.full_key() + " (" + entry.origin() + ")",
                                             error.message());
                          }
                        break;
                      }
                    const QuantityText q = split_quantity(text, true);
                    if (!q.is_expression())
                      {
                        value.field.value =
                          to_si_or_throw(entry, q.number, q.unit, value.si_unit, dim, &settings.units);
                        check_bounds(spec, value.field.value, entry, value.si_unit);
                        break;
                      }
                    try
                      {
                        Expression check(q.expression, spec.variables);
                        (void)check;
                      }
                    catch (const ExpressionError &error)
                      {
                        throw InputError(entry.origin(), entry.full_key(), error.what());
                      }
                    value.field.expression = q.expression;
                    value.field.offset = to_si_or_throw(entry, 0, q.unit, value.si_unit, dim, &settings.units);
                    value.field.scale =
                      to_si_or_throw(entry, 1, q.unit, value.si_unit, dim, &settings.units) - value.field.offset;
                    break;
                  }
                case ValueKind::quantity_list:
                  for (const auto &item : split_list(text))
                    {
                      const QuantityText q = split_quantity(item, false);
                      if (q.unit.empty() && q.number != 0)
                        warn_bare(entry, dim, item);
                      value.list.push_back(
                        to_si_or_throw(entry, q.number, q.unit, value.si_unit, dim, &settings.units));
                      check_bounds(spec, value.list.back(), entry, value.si_unit);
                    }
                  break;
                case ValueKind::point:
                  {
                    std::string coordinates = text;
                    if (const auto in = text.rfind(" in "); in != std::string::npos)
                      {
                        value.text = text.substr(in + 4);
                        value.text.erase(0, value.text.find_first_not_of(' '));
                        coordinates = text.substr(0, in);
                      }
                    value.list = parse_point(entry, coordinates, value.anchors);
                    break;
                  }
                case ValueKind::segment:
                  {
                    const auto to = text.find(" to ");
                    if (to == std::string::npos)
                      throw InputError(entry.origin(), entry.full_key(),
                                       "expected 'FROM to TO' (two points, each one coordinate per axis), found '" +
                                         text + "'");
                    value.list = parse_point(entry, text.substr(0, to), value.anchors);
                    const auto end = parse_point(entry, text.substr(to + 4), value.anchors);
                    value.list.insert(value.list.end(), end.begin(), end.end());
                    break;
                  }
                case ValueKind::layers:
                  value.layers = parse_layers(entry);
                  break;
              }
          }
        catch (const UnitError &error)
          {
            throw InputError(entry.origin(), entry.full_key(),
                             std::string(error.what()) +
                               (spec.dim == Dim::none ? std::string() : "; expected " + describe_dim(dim)));
          }
        return value;
      }

      /// Coordinates of a point: one per axis, each with its unit (or all bare, in metres), or
      /// `start of LAYER` / `end of LAYER` (NaN here, the text appended to @p anchors; the case
      /// builder resolves it once the layers are known).
      std::vector<double> parse_point(const IniEntry &entry, const std::string &text,
                                      std::vector<std::string> &anchors) const
      {
        const auto items = split_list(text);
        if (items.size() != dimension)
          throw InputError(entry.origin(), entry.full_key(),
                           "expected " + std::to_string(dimension) + " coordinate" + (dimension > 1 ? "s" : "") +
                             " (one per axis of this " + std::to_string(dimension) + "-D case), found " +
                             std::to_string(items.size()) + " in '" + text + "'");
        std::size_t with_unit = 0;
        std::vector<double> coordinates;
        std::size_t anchored = 0;
        for (const auto &item : items)
          {
            if (item.rfind("start of ", 0) == 0 || item.rfind("end of ", 0) == 0)
              {
                anchors.push_back(item);
                coordinates.push_back(std::nan(""));
                ++anchored;
                continue;
              }
            anchors.emplace_back();
            const QuantityText q = split_quantity(item, false);
            with_unit += q.unit.empty() ? 0 : 1;
            coordinates.push_back(to_si_or_throw(entry, q.number, q.unit, "m", Dim::length));
          }
        if (with_unit != 0 && with_unit + anchored != items.size())
          throw InputError(entry.origin(), entry.full_key(),
                           "expected a unit on every coordinate (a bare number is metres), found '" + text + "'");
        return coordinates;
      }

      std::vector<LayerSpec> parse_layers(const IniEntry &entry) const
      {
        // Tokens: name number [unit], separated by commas and/or spaces.
        std::vector<std::vector<std::string>> groups;
        const bool has_commas = entry.value.find(',') != std::string::npos;
        auto tokenize = [](const std::string &text) {
          std::vector<std::string> tokens;
          std::string token;
          for (const char c : text + " ")
            if (c == ' ' || c == '\t' || c == ',')
              {
                if (!token.empty())
                  tokens.push_back(token);
                token.clear();
              }
            else
              token += c;
          return tokens;
        };
        static const std::regex number(R"(^[+-]?(\d+\.?\d*|\.\d+)([eE][+-]?\d+)?$)");
        auto is_number = [](const std::string &t) { return std::regex_match(t, number); };
        if (has_commas)
          for (const auto &item : split_list(entry.value))
            groups.push_back(tokenize(item));
        else
          {
            const auto tokens = tokenize(entry.value);
            std::size_t i = 0;
            while (i < tokens.size())
              {
                std::vector<std::string> group{tokens[i++]};
                if (i < tokens.size())
                  group.push_back(tokens[i++]);
                if (i < tokens.size() && !is_number(tokens[i]) && (i + 1 >= tokens.size() || !is_number(tokens[i + 1])))
                  group.push_back(tokens[i++]);
                groups.push_back(group);
              }
          }
        std::vector<LayerSpec> layers;
        for (const auto &group : groups)
          {
            std::string joined;
            for (const auto &t : group)
              joined += (joined.empty() ? "" : " ") + t;
            if (group.size() < 2 || group.size() > 3 || !is_number(group[1]))
              throw InputError(entry.origin(), entry.full_key(),
                               "expected 'name thickness unit' for each layer (for example 'clay 0.9 m, sand 0.3 m'), "
                               "found '" +
                                 joined + "'");
            static const std::regex name(R"(^[A-Za-z_][A-Za-z0-9_\-]*$)");
            if (!std::regex_match(group[0], name))
              throw InputError(entry.origin(), entry.full_key(),
                               "expected a layer name of letters, digits, '_' and '-' starting with a letter, found '" +
                                 group[0] + "'");
            LayerSpec layer;
            layer.name = group[0];
            const QuantityText q = split_quantity(group[1] + (group.size() == 3 ? " " + group[2] : ""), false);
            layer.thickness = to_si_or_throw(entry, q.number, q.unit, "m", Dim::length);
            if (!(layer.thickness > 0))
              throw InputError(entry.origin(), entry.full_key(),
                               "expected a layer thickness > 0, found '" + joined + "' (" +
                                 (layer.thickness < 0 ? "a negative thickness" : "a zero-thickness layer") + ")");
            layers.push_back(layer);
          }
        if (layers.empty())
          throw InputError(entry.origin(), entry.full_key(), "expected at least one layer, found none");
        return layers;
      }
    };

    /// Decides the case's concentration family from the first concentration, flux or source
    /// written with a unit; later ones must agree with it.
    ConcentrationUnits decide_units(const std::vector<IniEntry> &entries, const unsigned int dimension,
                                    const std::string &coordinates)
    {
      const UnitSystem &units = UnitSystem::instance();
      std::size_t basis = concentration_bases.size();
      std::string first_origin, first_key, first_written;
      for (int pass = 0; pass < 3 && basis == concentration_bases.size(); ++pass)
        for (const auto &entry : entries)
          {
            const KeySpec *spec = section_kind(entry.section) == "stage"
                                    ? stage_boundary_key(entry.key)
                                    : find_key(section_kind(entry.section), entry.key);
            if (spec == nullptr || (spec->kind != ValueKind::quantity && spec->kind != ValueKind::field))
              continue;
            Dim dim = spec->dim;
            if (dim == Dim::boundary_value)
              dim = Parser::boundary_type_of(entry, entries) == "flux" ? Dim::flux : Dim::concentration;
            const std::vector<std::string> *candidates = nullptr;
            if (pass == 0 && dim == Dim::concentration)
              candidates = &concentration_bases;
            else if (pass == 1 && dim == Dim::flux)
              candidates = &flux_bases;
            else if (pass == 2 && dim == Dim::source)
              candidates = &source_bases;
            if (candidates == nullptr)
              continue;
            QuantityText q;
            try
              {
                if (entry.value.rfind("file:", 0) == 0)
                  {
                    std::filesystem::path table(entry.value.substr(5));
                    if (table.is_relative() && entry.line != 0)
                      table = std::filesystem::path(entry.file).parent_path() / table;
                    q.unit = time_table_value_unit(table.string());
                  }
                else
                  q = split_quantity(entry.value, true);
              }
            catch (const UnitError &)
              {
                continue; // reported with its key when the value is parsed
              }
            if (q.unit.empty())
              continue;
            const std::string match = units.first_convertible(q.unit, *candidates);
            if (match.empty())
              throw InputError(entry.origin(), entry.full_key(),
                               "expected " + describe_dim(dim) +
                                 " (mass, amount or number per volume, or a fraction), found '" + entry.value + "' (" +
                                 units.describe(q.unit) + ")");
            basis =
              static_cast<std::size_t>(std::find(candidates->begin(), candidates->end(), match) - candidates->begin());
            first_written = q.unit;
            first_key = entry.full_key() + " at " + entry.origin();
            break;
          }
      if (basis == concentration_bases.size())
        basis = 3; // no units anywhere: a pure number (fraction)
      static const char *numerator[] = {"kg", "mol", "1", ""};
      ConcentrationUnits result;
      result.concentration = concentration_bases[basis];
      result.flux = flux_bases[basis];
      result.source = source_bases[basis];
      const std::string n = numerator[basis];
      // Amounts: per unit area in 1-D, per unit length in 2-D (and for a radial cylinder), whole
      // amounts in 3-D, for a sphere and for axisymmetric cases (full revolution).
      unsigned int measure = dimension; // the dimension the amount is integrated over
      if (coordinates == "cylinder")
        measure = 2;
      else if (coordinates == "sphere" || coordinates == "axisymmetric")
        measure = 3;
      const char *per_length[] = {"", "/m2", "/m", ""};
      if (basis == 3)
        result.amount = measure == 1 ? "m" : measure == 2 ? "m2" : "m3";
      else if (measure == 3)
        result.amount = n;
      else
        result.amount = n + per_length[measure];
      result.as_written = first_written.empty() ? result.concentration : first_written;
      result.decided_by = first_key;
      return result;
    }
  } // namespace

  CaseDescription read_case_text(const std::string &text, const std::string &name,
                                 const std::vector<std::string> &overrides)
  {
    const IniDocument document = IniDocument::parse(text, name);
    std::vector<IniEntry> entries = document.entries();
    for (const auto &override_text : overrides)
      {
        IniEntry entry = parse_override(override_text);
        auto existing = std::find_if(entries.begin(), entries.end(),
                                     [&](const IniEntry &e) { return e.full_key() == entry.full_key(); });
        if (existing != entries.end())
          *existing = entry;
        else
          entries.push_back(entry);
      }

    Settings settings;
    settings.file = name;
    for (const auto &entry : entries)
      {
        const std::string replacement = renamed_spelling(entry.section, entry.key);
        if (!replacement.empty())
          throw InputError(entry.origin(), entry.full_key(), renamed_message(entry.section, entry.key, replacement));
      }
    for (const auto &section : document.sections())
      {
        const std::string where = name + ":" + std::to_string(document.section_line(section));
        const std::string replacement = renamed_spelling(section, "");
        if (!replacement.empty())
          throw InputError(where, "", renamed_message(section, "", replacement));
        check_section_known(section, where);
        // An empty named section would be silently ignored (a stage without keys, a region or a
        // boundary that names nothing): say so instead. Empty fixed sections keep their defaults.
        const auto &named = named_section_kinds();
        if (std::find(named.begin(), named.end(), section_kind(section)) != named.end() &&
            std::none_of(entries.begin(), entries.end(), [&](const IniEntry &e) { return e.section == section; }))
          throw InputError(where, "",
                           "expected keys in [" + section + "], found an empty section (give its keys or remove it)");
        settings.section_origins[section] = where;
      }
    for (const auto &entry : entries)
      {
        check_section_known(entry.section, entry.origin());
        if (settings.section_origins.count(entry.section) == 0)
          settings.section_origins[entry.section] = entry.origin();
        (void)lookup_key(entry);
      }

    // The coordinates and the dimension first: points depend on them (axisymmetric cases are 2-D).
    Parser parser{settings};
    std::string coordinates = "cartesian";
    bool dimension_given = false;
    for (const auto &entry : entries)
      {
        if (entry.section == "case" && entry.key == "dimension")
          {
            parser.dimension = static_cast<unsigned int>(parser.parse(entry, lookup_key(entry), Dim::none).si);
            dimension_given = true;
          }
        if (entry.section == "case" && entry.key == "coordinates")
          coordinates = parser.parse(entry, lookup_key(entry), Dim::none).text;
      }
    if (!dimension_given && coordinates == "axisymmetric")
      parser.dimension = 2;

    parser.coordinate_system = coordinates;
    settings.units = decide_units(entries, parser.dimension, coordinates);
    for (const auto &entry : entries)
      {
        const KeySpec &spec = lookup_key(entry);
        settings.add(parser.parse(entry, spec, parser.effective_dim(spec, entry, entries)));
      }
    CaseDescription description = build_case(settings, parser.dimension);
    description.fingerprint = fingerprint(entries, {"output.folder", "output.checkpoint_every"});
    return description;
  }

  CaseDescription read_case(const std::string &path, const std::vector<std::string> &overrides)
  {
    std::error_code ignored;
    if (std::filesystem::is_directory(path, ignored))
      throw InputError(path, "", "expected an INI-style case file, found a folder");
    std::ifstream in(path, std::ios::binary);
    if (!in)
      throw InputError(path, "", "cannot open the case file (expected a readable INI-style text file)");
    std::ostringstream buffer;
    buffer << in.rdbuf();
    return read_case_text(buffer.str(), path, overrides);
  }
} // namespace fickcast
