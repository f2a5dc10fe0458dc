#include "app/display_units.h"

#include "case/quantity_text.h"
#include "case/units.h"

#include <cmath>
#include <cstdio>

namespace fickcast
{
  namespace
  {
    std::string written_unit(const CaseDescription &c, const std::string &key)
    {
      for (const auto &record : c.settings)
        if (record.key == key)
          {
            try
              {
                return split_quantity(record.written, false).unit;
              }
            catch (...)
              {
                return "";
              }
          }
      return "";
    }

    std::string layer_unit(const CaseDescription &c)
    {
      for (const auto &record : c.settings)
        if (record.key == "geometry.layers")
          {
            // "clay 0.9 m, sand 0.3 m": the token after the first number.
            const auto items = split_list(record.written);
            if (!items.empty())
              {
                const auto space = items.front().find(' ');
                if (space != std::string::npos)
                  {
                    try
                      {
                        return split_quantity(items.front().substr(space + 1), false).unit;
                      }
                    catch (...)
                      {
                      }
                  }
              }
          }
      return "";
    }
  } // namespace

  DisplayUnits::DisplayUnits(const CaseDescription &c, const int digits)
    : digits_(digits)
  {
    const UnitSystem &units = UnitSystem::instance();
    auto factor = [&](const std::string &unit, const std::string &si, std::string &chosen) {
      if (unit.empty())
        {
          chosen = si;
          return 1.0;
        }
      try
        {
          const double f = units.to_si(1.0, unit, si) - units.to_si(0.0, unit, si);
          chosen = unit;
          return f;
        }
      catch (...)
        {
          chosen = si;
          return 1.0;
        }
    };
    time_factor_ = factor(written_unit(c, "time.end"), "s", time_unit_);
    length_factor_ = factor(layer_unit(c), "m", length_unit_);
    concentration_factor_ = factor(c.units.as_written == c.units.concentration ? "" : c.units.as_written,
                                   c.units.concentration, concentration_unit_);
  }

  std::string DisplayUnits::format(const double value, const std::string &unit) const
  {
    if (!std::isfinite(value))
      return "not reached";
    char buffer[64];
    std::snprintf(buffer, sizeof(buffer), "%.*g", digits_, value);
    return unit.empty() || unit == "1" ? std::string(buffer) : std::string(buffer) + " " + unit;
  }

  std::string DisplayUnits::result(const double value, const std::string &si_unit, const bool event) const
  {
    if (std::isinf(value) || (event && std::isnan(value)))
      return "not reached";
    if (std::isnan(value))
      return "-";
    if (si_unit == "s")
      return time(value);
    if (si_unit == "m")
      return length(value);
    if (si_unit == "kg/m3" || si_unit == "mol/m3" || si_unit == "1/m3")
      return concentration(value);
    char buffer[64];
    if (si_unit == "1")
      std::snprintf(buffer, sizeof(buffer), "%.*g %%", digits_, 100 * value);
    else
      std::snprintf(buffer, sizeof(buffer), "%.*g %s", digits_, value, si_unit.c_str());
    return buffer;
  }

  std::string DisplayUnits::time(const double seconds) const
  {
    return format(seconds / time_factor_, time_unit_);
  }

  std::string DisplayUnits::length(const double metres) const
  {
    return format(metres / length_factor_, length_unit_);
  }

  std::string DisplayUnits::concentration(const double si) const
  {
    return format(si / concentration_factor_, concentration_unit_);
  }
} // namespace fickcast
