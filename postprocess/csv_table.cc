#include "csv_table.h"

#include "output_file.h"
#include "post_error.h"

#include <cmath>
#include <cstdlib>
#include <limits>
#include <sstream>

namespace fickcast::post
{
  namespace
  {
    std::string trim(const std::string &text)
    {
      const auto first = text.find_first_not_of(" \t\r");
      if (first == std::string::npos)
        return "";
      const auto last = text.find_last_not_of(" \t\r");
      return text.substr(first, last - first + 1);
    }
  } // namespace

  std::vector<std::string> split_csv_line(const std::string &line)
  {
    std::vector<std::string> cells;
    std::string cell;
    bool quoted = false;
    for (std::size_t i = 0; i < line.size(); ++i)
      {
        const char c = line[i];
        if (quoted)
          {
            if (c == '"' && i + 1 < line.size() && line[i + 1] == '"')
              {
                cell += '"';
                ++i;
              }
            else if (c == '"')
              quoted = false;
            else
              cell += c;
          }
        else if (c == '"')
          quoted = true;
        else if (c == ',')
          {
            cells.push_back(trim(cell));
            cell.clear();
          }
        else
          cell += c;
      }
    cells.push_back(trim(cell));
    return cells;
  }

  bool parse_number(const std::string &text, double &value)
  {
    if (text.empty())
      return false;
    const char *begin = text.c_str();
    char *end = nullptr;
    value = std::strtod(begin, &end);
    return end == begin + text.size();
  }

  CsvTable CsvTable::read(const std::string &path)
  {
    return parse(read_file(path, "a CSV table"), path);
  }

  CsvTable CsvTable::parse(const std::string &content, const std::string &path)
  {
    CsvTable table;
    table.path_ = path;
    std::istringstream in(content);
    std::string line;
    std::size_t number = 0;
    while (std::getline(in, line))
      {
        ++number;
        if (!line.empty() && line.back() == '\r')
          line.pop_back();
        if (table.names_.empty())
          {
            if (trim(line).empty())
              throw PostInputError(path + ":" + std::to_string(number), "a header line `name [unit],...`",
                                   "an empty line");
            for (const auto &cell : split_csv_line(line))
              {
                const auto open = cell.find(" [");
                if (open != std::string::npos && cell.back() == ']')
                  {
                    table.names_.push_back(trim(cell.substr(0, open)));
                    table.units_.push_back(cell.substr(open + 2, cell.size() - open - 3));
                  }
                else
                  {
                    table.names_.push_back(cell);
                    table.units_.emplace_back();
                  }
                if (table.names_.back().empty())
                  throw PostInputError(path + ":" + std::to_string(number), "a name in every header cell",
                                       "an empty one in column " + std::to_string(table.names_.size()));
              }
            continue;
          }
        if (trim(line).empty())
          continue;
        auto cells = split_csv_line(line);
        if (cells.size() != table.names_.size())
          throw PostInputError(path + ":" + std::to_string(number),
                               std::to_string(table.names_.size()) + " cells as in the header",
                               std::to_string(cells.size()));
        table.rows_.push_back(std::move(cells));
        table.lines_.push_back(number);
      }
    if (table.names_.empty())
      throw PostInputError(path, "a header line `name [unit],...`", "an empty file");
    return table;
  }

  std::size_t CsvTable::find(const std::string &name) const
  {
    for (std::size_t i = 0; i < names_.size(); ++i)
      if (names_[i] == name)
        return i;
    return npos;
  }

  std::size_t CsvTable::require(const std::string &name) const
  {
    const std::size_t index = find(name);
    if (index == npos)
      throw PostInputError(path_, "a column `" + name + "`", "none in the header");
    return index;
  }

  std::vector<double> CsvTable::numbers(const std::size_t index) const
  {
    std::vector<double> values(rows_.size(), std::numeric_limits<double>::quiet_NaN());
    for (std::size_t r = 0; r < rows_.size(); ++r)
      {
        const std::string &cell = rows_[r][index];
        if (cell.empty())
          continue;
        if (!parse_number(cell, values[r]))
          throw PostInputError(path_ + ":" + std::to_string(lines_[r]), "a number in column `" + names_[index] + "`",
                               "'" + cell + "'");
      }
    return values;
  }

  void CsvTable::require_numbers(const std::vector<std::string> &text_columns) const
  {
    for (std::size_t c = 0; c < names_.size(); ++c)
      {
        bool text = false;
        for (const auto &name : text_columns)
          text = text || names_[c] == name;
        if (!text)
          numbers(c);
      }
  }
} // namespace fickcast::post
