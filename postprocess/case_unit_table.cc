#include "case_unit_table.h"

#include "study_table.h"

#include "results/csv_writer.h"

#include <cmath>
#include <cstdio>

namespace fickcast::post
{
  namespace
  {
    bool is_fraction(const std::string &name, const std::string &unit)
    {
      const std::string tail = "fraction";
      const bool named = name.size() >= tail.size() && name.compare(name.size() - tail.size(), tail.size(), tail) == 0;
      return named && (unit.empty() || unit == "1");
    }

    std::string number_text(const double value)
    {
      char buffer[40];
      std::snprintf(buffer, sizeof(buffer), "%.10g", value);
      return buffer;
    }
  } // namespace

  std::string table_in_case_units(const CsvTable &table, const DisplayUnits &units, const bool event_columns)
  {
    const std::size_t n = table.names().size();
    std::vector<DisplayUnits::Choice> choice(n);
    std::vector<bool> convert(n, false), event(n, false);
    const std::size_t status = table.find("status");
    std::string csv;
    for (std::size_t c = 0; c < n; ++c)
      {
        const std::string &name = table.names()[c];
        const std::string &unit = table.units()[c];
        if (name == "wall_time")
          choice[c] = {unit, 1.0}; // the computer's time, not the case's
        else if (is_fraction(name, unit))
          choice[c] = {"%", 0.01};
        else if (!unit.empty())
          choice[c] = units.for_si_unit(unit);
        else
          choice[c] = {"", 1.0};
        convert[c] = choice[c].si_per_unit != 1.0 || choice[c].symbol != unit;
        event[c] = event_columns && is_event_result(name);
        csv += (c ? "," : "") +
               csv_field(name + (choice[c].symbol.empty() || choice[c].symbol == "1" ? std::string()
                                                                                     : " [" + choice[c].symbol + "]"));
      }
    csv += "\n";
    for (const auto &row : table.rows())
      {
        const bool completed = status == CsvTable::npos || row[status] == "completed";
        for (std::size_t c = 0; c < n; ++c)
          {
            std::string cell = row[c];
            double value = 0;
            if (cell.empty() && event[c] && completed)
              cell = "not reached";
            else if (convert[c] && parse_number(cell, value) && std::isfinite(value))
              cell = number_text(value / choice[c].si_per_unit);
            csv += (c ? "," : "") + csv_field(cell);
          }
        csv += "\n";
      }
    return csv;
  }
} // namespace fickcast::post
