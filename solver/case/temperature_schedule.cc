#include "case/temperature_schedule.h"

#include "case/interpolation.h"
#include "case/quantity_text.h"
#include "case/units.h"

#include <algorithm>
#include <cmath>
#include <sstream>

namespace fickcast
{
  double TemperatureSchedule::at(const double t) const
  {
    if (times.empty())
      return 0;
    if (t <= times.front())
      return temperatures.front();
    if (t >= times.back())
      return temperatures.back();
    const auto upper = std::upper_bound(times.begin(), times.end(), t);
    const std::size_t k = static_cast<std::size_t>(upper - times.begin());
    return interpolate(times[k - 1], temperatures[k - 1], times[k], temperatures[k], t);
  }

  void TemperatureSchedule::append(const TemperatureSchedule &other, const double offset)
  {
    for (std::size_t i = 0; i < other.times.size(); ++i)
      {
        const double t = other.times[i] + offset;
        if (!times.empty() && t <= times.back())
          {
            // The same instant: the later stage's temperature takes over (a jump is allowed).
            if (t == times.back())
              {
                times.push_back(t);
                temperatures.push_back(other.temperatures[i]);
              }
            continue;
          }
        times.push_back(t);
        temperatures.push_back(other.temperatures[i]);
      }
  }

  namespace
  {
    std::string trim(const std::string &text)
    {
      const auto a = text.find_first_not_of(" \t");
      if (a == std::string::npos)
        return "";
      return text.substr(a, text.find_last_not_of(" \t") - a + 1);
    }

    double quantity(const std::string &text, const std::string &si_unit, const std::string &item)
    {
      try
        {
          const QuantityText q = split_quantity(text, false);
          return UnitSystem::instance().to_si(q.number, q.unit, si_unit);
        }
      catch (const UnitError &error)
        {
          throw UnitError("in '" + item + "': " + error.what());
        }
    }

    [[noreturn]] void bad_item(const std::string &item, const std::size_t index)
    {
      throw UnitError("item " + std::to_string(index + 1) + " '" + item +
                      "': expected 'hold DURATION', 'ramp RATE to TEMPERATURE' or 'ramp to TEMPERATURE in "
                      "DURATION' (for example 'ramp 10 degC/min to 1100 degC')");
    }

    /// The end of item @p index lasting @p duration from @p t0: finite and after t0.
    double end_of_item(const double t0, const double duration, const std::string &item, const std::size_t index)
    {
      const double t = t0 + duration;
      if (!std::isfinite(t))
        throw UnitError("item " + std::to_string(index + 1) + " '" + item +
                        "': expected a schedule that ends within the range of numbers, found one beyond 1.8e308 s");
      if (!(t > t0))
        throw UnitError("item " + std::to_string(index + 1) + " '" + item +
                        "': expected a duration that counts after the items before it, found one lost in rounding "
                        "after " +
                        std::to_string(t0) + " s");
      return t;
    }
  } // namespace

  TemperatureSchedule parse_temperature_schedule(const std::string &text)
  {
    const auto items = split_list(text);
    if (items.empty())
      throw UnitError("expected a temperature such as 1050 degC, found an empty value");
    TemperatureSchedule schedule;
    std::string first = items.front();
    if (first.rfind("start ", 0) == 0)
      first = trim(first.substr(6));
    const double start = quantity(first, "K", items.front());
    if (!(start > 0))
      throw UnitError("expected a start temperature above absolute zero, found '" + items.front() + "'");
    schedule.times.push_back(0);
    schedule.temperatures.push_back(start);
    for (std::size_t i = 1; i < items.size(); ++i)
      {
        const std::string item = items[i];
        std::istringstream words(item);
        std::string verb;
        words >> verb;
        const std::string rest = trim(item.substr(verb.size()));
        const double t0 = schedule.times.back(), temperature0 = schedule.temperatures.back();
        if (verb == "hold")
          {
            const double duration = quantity(rest, "s", item);
            if (!(duration > 0))
              throw UnitError("item " + std::to_string(i + 1) + " '" + item + "': expected a duration > 0");
            schedule.times.push_back(end_of_item(t0, duration, item, i));
            schedule.temperatures.push_back(temperature0);
            continue;
          }
        if (verb != "ramp")
          bad_item(item, i);
        const auto to = rest.find("to ");
        if (to == std::string::npos)
          bad_item(item, i);
        const std::string before = trim(rest.substr(0, to));
        std::string after = trim(rest.substr(to + 3));
        double duration = 0;
        double target = 0;
        if (const auto in = after.find(" in "); in != std::string::npos)
          {
            if (!before.empty())
              bad_item(item, i);
            target = quantity(trim(after.substr(0, in)), "K", item);
            duration = quantity(trim(after.substr(in + 4)), "s", item);
          }
        else
          {
            if (before.empty())
              bad_item(item, i);
            const double rate = std::abs(quantity(before, "K/s", item));
            target = quantity(after, "K", item);
            if (!(rate > 0))
              throw UnitError("item " + std::to_string(i + 1) + " '" + item + "': expected a ramp rate > 0");
            duration = std::abs(target - temperature0) / rate;
          }
        if (!(target > 0))
          throw UnitError("item " + std::to_string(i + 1) + " '" + item +
                          "': expected a temperature above absolute zero");
        if (!(duration > 0))
          throw UnitError("item " + std::to_string(i + 1) + " '" + item +
                          "': the ramp takes no time (target equals the current temperature)");
        schedule.times.push_back(end_of_item(t0, duration, item, i));
        schedule.temperatures.push_back(target);
      }
    return schedule;
  }
} // namespace fickcast
