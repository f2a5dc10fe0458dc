#include "time_units.h"

#include "csv_table.h"
#include "post_error.h"

#include "case/units.h"

#include <cmath>
#include <cstdio>
#include <vector>

namespace fickcast::post
{
  namespace
  {
    const std::vector<TimeUnit> &time_units()
    {
      static const std::vector<TimeUnit> units{
        {"s", 1}, {"min", 60}, {"h", 3600}, {"d", 86400}, {"yr", 365.25 * 86400}};
      return units;
    }
  } // namespace

  TimeUnit readable_time_unit(const double span_seconds)
  {
    TimeUnit chosen = time_units().front();
    for (const auto &unit : time_units())
      if (std::abs(span_seconds) >= 2 * unit.seconds)
        chosen = unit;
    return chosen;
  }

  std::string format_number(const double value, const int digits)
  {
    char buffer[40];
    std::snprintf(buffer, sizeof(buffer), "%.*g", digits, value);
    return buffer;
  }

  std::string format_time(const double seconds)
  {
    const TimeUnit unit = readable_time_unit(seconds);
    return format_number(seconds / unit.seconds) + " " + unit.symbol;
  }

  double parse_time(const std::string &text, const std::string &where)
  {
    std::string number = text, symbol;
    const auto split = text.find_first_not_of("0123456789.eE+-");
    if (split != std::string::npos)
      {
        number = text.substr(0, split);
        symbol = text.substr(split);
        while (!symbol.empty() && symbol.front() == ' ')
          symbol.erase(symbol.begin());
      }
    while (!number.empty() && number.back() == ' ')
      number.pop_back();
    double value = 0;
    if (!parse_number(number, value) || !std::isfinite(value))
      throw PostInputError(where, "a time such as `3600`, `2 h` or `all`", "'" + text + "'");
    if (symbol.empty())
      return value;
    for (const auto &unit : time_units())
      if (unit.symbol == symbol)
        return value * unit.seconds;
    try
      {
        return UnitSystem::instance().to_si(value, symbol, "s");
      }
    catch (const UnitError &)
      {
        throw PostInputError(where, "a time unit (s, min, h, d, yr, ...)", "'" + symbol + "'");
      }
  }
} // namespace fickcast::post
