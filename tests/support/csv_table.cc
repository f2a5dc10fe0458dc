#include "csv_table.h"

#include <cmath>
#include <cstdlib>
#include <fstream>
#include <sstream>
#include <stdexcept>

namespace fickcast::testing
{
  const std::vector<double> &CsvTable::column(const std::string &name) const
  {
    const auto it = columns.find(name);
    if (it == columns.end())
      throw std::runtime_error("no column '" + name + "' in the table");
    return it->second;
  }

  CsvTable read_csv(const std::string &path)
  {
    std::ifstream in(path);
    if (!in)
      throw std::runtime_error("cannot open " + path);
    CsvTable table;
    std::string line;
    std::getline(in, line);
    std::stringstream header(line);
    std::string cell;
    while (std::getline(header, cell, ','))
      {
        const auto bracket = cell.find(" [");
        table.names.push_back(bracket == std::string::npos ? cell : cell.substr(0, bracket));
        table.units.push_back(bracket == std::string::npos ? "" : cell.substr(bracket + 2, cell.size() - bracket - 3));
        table.columns[table.names.back()];
      }
    while (std::getline(in, line))
      {
        std::vector<std::string> cells;
        std::string current;
        for (const char c : line)
          if (c == ',')
            {
              cells.push_back(current);
              current.clear();
            }
          else
            current += c;
        cells.push_back(current);
        if (cells.size() != table.names.size())
          throw std::runtime_error(path + ": row with " + std::to_string(cells.size()) + " cells, header has " +
                                   std::to_string(table.names.size()));
        for (std::size_t i = 0; i < cells.size(); ++i)
          {
            // Text columns (a line's name in profiles.csv) read as NaN.
            char *end = nullptr;
            const double v = std::strtod(cells[i].c_str(), &end);
            const bool number = !cells[i].empty() && end != cells[i].c_str() && *end == '\0';
            table.columns[table.names[i]].push_back(number ? v : std::nan(""));
          }
      }
    return table;
  }
} // namespace fickcast::testing
