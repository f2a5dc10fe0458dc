// Reading the CSV tables fickcast writes (series.csv, profiles.csv), for tests.
#pragma once

#include <map>
#include <string>
#include <vector>

namespace fickcast::testing
{
  /// Columns by name (the header name without its `[unit]`), values as numbers (NaN if empty or
  /// text).
  struct CsvTable
  {
    std::vector<std::string> names;
    std::vector<std::string> units;
    std::map<std::string, std::vector<double>> columns;

    const std::vector<double> &column(const std::string &name) const;
    std::size_t rows() const { return columns.empty() ? 0 : columns.begin()->second.size(); }
  };

  /// Reads @p path; throws std::runtime_error if missing or malformed.
  CsvTable read_csv(const std::string &path);
} // namespace fickcast::testing
