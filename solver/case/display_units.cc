#include "case/display_units.h"

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

    /// Without layers: the length unit of the first geometry key, then of the first point or line
    /// of [output], written with one (a mesh case with points in um reads in um).
    std::string first_length_unit(const CaseDescription &c)
    {
      for (const std::string prefix : {"geometry.", "output.point.", "output.line."})
        for (const auto &record : c.settings)
          if (record.key.compare(0, prefix.size(), prefix) == 0 && record.origin != "default")
            {
              const auto items = split_list(record.written);
              if (items.empty())
                continue;
              try
                {
                  const std::string unit = split_quantity(items.front(), false).unit;
                  if (!unit.empty() && UnitSystem::instance().convertible(unit, "m"))
                    return unit;
                }
              catch (...)
                {
                  // Not a length: look further.
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
    const std::string layers = layer_unit(c);
    length_factor_ = factor(layers.empty() ? first_length_unit(c) : layers, "m", length_unit_);
    concentration_factor_ = factor(c.units.as_written == c.units.concentration ? "" : c.units.as_written,
                                   c.units.concentration, concentration_unit_);

    // Amounts: the numerator of the concentration as written, per the measure the case's amount
    // is taken over (area in 1-D, length in 2-D, none in 3-D), in the length of its volume unit
    // if it has one (1/cm3: 1/cm2), else in m.
    std::string written_amount;
    const std::string &as_written = c.units.as_written;
    const auto slash = as_written.find('/');
    const std::string &si_amount = c.units.amount;
    si_concentration_ = c.units.concentration;
    si_amount_ = si_amount;
    const unsigned int measure = si_amount.size() > 3 && si_amount.compare(si_amount.size() - 3, 3, "/m2") == 0  ? 2
                                 : si_amount.size() > 2 && si_amount.compare(si_amount.size() - 2, 2, "/m") == 0 ? 1
                                                                                                                 : 0;
    if (slash != std::string::npos && slash > 0 && c.units.as_written != c.units.concentration)
      {
        std::string numerator = as_written.substr(0, slash), volume = as_written.substr(slash + 1);
        std::string length = "m";
        if (volume.size() > 1 && volume.back() == '3' && units.convertible(volume.substr(0, volume.size() - 1), "m"))
          length = volume.substr(0, volume.size() - 1);
        written_amount = numerator == "1" ? "1" : numerator;
        if (measure == 2)
          written_amount += "/" + length + "2";
        else if (measure == 1)
          written_amount += "/" + length;
      }
    amount_factor_ = factor(written_amount, si_amount, amount_unit_);
    const std::string per = amount_unit_ == si_amount ? si_amount : written_amount;
    rate_factor_ =
      factor(time_unit_ == "s" && per == si_amount ? "" : per + "/" + time_unit_, si_amount + "/s", rate_unit_);
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

  DisplayUnits::Choice DisplayUnits::for_si_unit(const std::string &si_unit) const
  {
    if (si_unit == "s")
      return {time_unit_, time_factor_};
    if (si_unit == "m")
      return {length_unit_, length_factor_};
    if (!si_concentration_.empty() && si_unit == si_concentration_ && si_unit != "1")
      return {concentration_unit_, concentration_factor_};
    if (!si_amount_.empty() && si_unit == si_amount_ && si_unit != "1")
      return {amount_unit_, amount_factor_};
    if (!si_amount_.empty() && si_unit == si_amount_ + "/s")
      return {rate_unit_, rate_factor_};
    return {si_unit, 1.0};
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

  std::string DisplayUnits::amount(const double si) const
  {
    return format(si / amount_factor_, amount_unit_);
  }

  std::string DisplayUnits::rate(const double si) const
  {
    return format(si / rate_factor_, rate_unit_);
  }
} // namespace fickcast
