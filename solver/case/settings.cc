#include "case/settings.h"

#include "case/key_schema.h"

#include <algorithm>
#include <cstdio>

namespace fickcast
{
  std::string format_si(const double value, const std::string &unit)
  {
    char buffer[64];
    std::snprintf(buffer, sizeof(buffer), "%.10g", value);
    return unit.empty() || unit == "1" ? std::string(buffer) : std::string(buffer) + " " + unit;
  }

  std::string SettingValue::si_text() const
  {
    if (spec == nullptr)
      return written;
    if (is_auto)
      return "auto";
    switch (spec->kind)
      {
        case ValueKind::quantity:
          return format_si(si, si_unit);
        case ValueKind::integer:
          return std::to_string(static_cast<long>(si));
        case ValueKind::field:
          if (!field.table.empty())
            return "table " + field.table.file + " (" + std::to_string(field.table.times.size()) + " rows, " + si_unit +
                   ")";
          if (field.is_constant())
            return format_si(field.value, si_unit);
          return "{" + field.expression + "}" +
                 (field.scale == 1 && field.offset == 0 ? std::string() : " x " + format_si(field.scale, "")) +
                 (field.offset == 0 ? std::string() : " + " + format_si(field.offset, "")) + " " + si_unit;
        case ValueKind::quantity_list:
        case ValueKind::segment:
        case ValueKind::point:
          {
            std::string joined;
            bool anchored = false;
            for (std::size_t i = 0; i < list.size(); ++i)
              {
                const bool anchor = i < anchors.size() && !anchors[i].empty();
                anchored = anchored || anchor;
                joined += (joined.empty() ? "" : ", ") + (anchor ? anchors[i] : format_si(list[i], ""));
              }
            // With a layer anchor, each number carries its unit: "0.1 m, end of clay".
            if (anchored)
              {
                joined.clear();
                for (std::size_t i = 0; i < list.size(); ++i)
                  joined += (joined.empty() ? "" : ", ") +
                            (i < anchors.size() && !anchors[i].empty() ? anchors[i] : format_si(list[i], si_unit));
                return joined + (text.empty() ? std::string() : " in " + text);
              }
            return joined + " " + si_unit + (text.empty() ? std::string() : " in " + text);
          }
        case ValueKind::layers:
          {
            std::string joined;
            for (const auto &layer : layers)
              joined += (joined.empty() ? "" : ", ") + layer.name + " " + format_si(layer.thickness, "m");
            return joined;
          }
        case ValueKind::flag:
          return flag ? "true" : "false";
        case ValueKind::schedule:
          {
            std::string joined;
            for (std::size_t i = 0; i < schedule.times.size(); ++i)
              joined += (joined.empty() ? "" : ", ") + format_si(schedule.times[i], "s") + " " +
                        format_si(schedule.temperatures[i], "K");
            return joined;
          }
        case ValueKind::text:
        case ValueKind::choice:
          return text;
      }
    return written;
  }

  const SettingValue *Settings::find(const std::string &section, const std::string &key) const
  {
    for (const auto &value : values_)
      if (value.section == section && value.key == key)
        return &value;
    return nullptr;
  }

  std::vector<std::string> Settings::names_of(const std::string &kind) const
  {
    std::vector<std::string> names;
    for (const auto &value : values_)
      if (section_kind(value.section) == kind && value.section.size() > kind.size())
        {
          const std::string name = value.section.substr(kind.size() + 1);
          if (std::find(names.begin(), names.end(), name) == names.end())
            names.push_back(name);
        }
    return names;
  }
} // namespace fickcast
