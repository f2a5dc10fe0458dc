#include "case/time_table.h"

#include "case/input_error.h"
#include "case/interpolation.h"
#include "case/quantity_text.h"
#include "case/units.h"

#include <algorithm>
#include <cmath>
#include <filesystem>
#include <fstream>
#include <regex>

namespace fickcast
{
  double TimeTable::at(const double t) const
  {
    if (times.empty())
      return 0;
    if (t <= times.front())
      return values.front();
    if (t >= times.back())
      return values.back();
    const auto upper = std::upper_bound(times.begin(), times.end(), t);
    const std::size_t k = static_cast<std::size_t>(upper - times.begin());
    return interpolate(times[k - 1], values[k - 1], times[k], values[k], t);
  }

  std::string time_table_value_unit(const std::string &path)
  {
    std::ifstream in(path);
    std::string line;
    static const std::regex column(R"(^\s*([^\[]*?)\s*\[([^\]]*)\]\s*$)");
    while (std::getline(in, line))
      {
        if (const auto hash = line.find('#'); hash != std::string::npos)
          line.erase(hash);
        if (line.find_first_not_of(" \t\r") == std::string::npos)
          continue;
        const auto cells = split_list(line);
        std::smatch match;
        if (cells.size() == 2 && std::regex_match(cells[1], match, column))
          return match[2].str();
        return "";
      }
    return "";
  }

  TimeTable read_time_table(const std::string &path, const std::string &si_unit)
  {
    std::error_code ignored;
    if (std::filesystem::is_directory(path, ignored))
      throw InputError(path, "", "expected a CSV table 'time [unit], value [unit]', found a folder");
    std::ifstream in(path);
    if (!in)
      throw InputError(path, "", "cannot open the table (expected a CSV file 'time [unit], value [unit]')");
    TimeTable table;
    table.file = path;
    std::string line;
    unsigned int number = 0;
    double time_scale = 1, time_offset = 0, value_scale = 1, value_offset = 0;
    bool header = false;
    static const std::regex column(R"(^\s*([^\[]*?)\s*\[([^\]]*)\]\s*$)");
    while (std::getline(in, line))
      {
        ++number;
        const std::string where = path + ":" + std::to_string(number);
        if (const auto hash = line.find('#'); hash != std::string::npos)
          line.erase(hash);
        if (line.find_first_not_of(" \t\r") == std::string::npos)
          continue;
        if (!line.empty() && line.back() == '\r')
          line.pop_back();
        const auto cells = split_list(line);
        if (cells.size() != 2)
          throw InputError(where, "", "expected two comma-separated columns, found " + std::to_string(cells.size()));
        if (!header)
          {
            std::smatch time_match, value_match;
            if (!std::regex_match(cells[0], time_match, column) || !std::regex_match(cells[1], value_match, column))
              throw InputError(where, "",
                               "expected a header 'time [unit], value [unit]' such as 'time [h], value [mg/L]' as "
                               "the first line of a CSV table; this line is not one (a file that is not a table is "
                               "not shown)");
            try
              {
                const UnitSystem &units = UnitSystem::instance();
                time_offset = units.to_si(0, time_match[2].str(), "s");
                time_scale = units.to_si(1, time_match[2].str(), "s") - time_offset;
                value_offset = units.to_si(0, value_match[2].str(), si_unit);
                value_scale = units.to_si(1, value_match[2].str(), si_unit) - value_offset;
              }
            catch (const UnitError &error)
              {
                throw InputError(where, "", error.what());
              }
            header = true;
            continue;
          }
        double t = 0, v = 0;
        try
          {
            const QuantityText qt = split_quantity(cells[0], false), qv = split_quantity(cells[1], false);
            if (!qt.unit.empty() || !qv.unit.empty())
              throw UnitError("expected plain numbers (units belong in the header), found '" + line + "'");
            t = qt.number * time_scale + time_offset;
            v = qv.number * value_scale + value_offset;
          }
        catch (const UnitError &error)
          {
            throw InputError(where, "", error.what());
          }
        if (!std::isfinite(t) || !std::isfinite(v))
          throw InputError(where, "",
                           std::string("expected a time and a value within the range of numbers once converted to s "
                                       "and ") +
                             si_unit + ", found a " + (std::isfinite(t) ? "value" : "time") +
                             " beyond 1.8e308 in SI ('" + (std::isfinite(t) ? cells[1] : cells[0]) + "')");
        if (!table.times.empty() && !(t > table.times.back()))
          throw InputError(where, "",
                           "expected times that increase from row to row, found " + std::to_string(t) + " s after " +
                             std::to_string(table.times.back()) + " s");
        table.times.push_back(t);
        table.values.push_back(v);
      }
    if (!header)
      throw InputError(path, "", "the table is empty: expected a header 'time [unit], value [unit]' and rows");
    if (table.times.size() < 2)
      throw InputError(path, "", "expected at least two rows, found " + std::to_string(table.times.size()));
    return table;
  }
} // namespace fickcast
