// Reading the CSV tables of a results folder or a study (series.csv, profiles.csv, sweep.csv).
#pragma once

#include <cstddef>
#include <string>
#include <vector>

namespace fickcast::post
{
  /**
   * A CSV table with a header line `name [unit],...`: names and units apart, cells as text with
   * the line each row came from, so every complaint can name `file:line`.
   */
  class CsvTable
  {
  public:
    /// Reads @p path; PostInputError if missing, empty, or a row has the wrong number of cells.
    static CsvTable read(const std::string &path);
    /// Reads the text @p content as the file @p path would be read (for tables made in memory).
    static CsvTable parse(const std::string &content, const std::string &path);

    /// Column index of @p name (without unit), or npos.
    std::size_t find(const std::string &name) const;
    /// True if the table has column @p name.
    bool has(const std::string &name) const { return find(name) != npos; }
    /// Column index of @p name; PostInputError naming the file if absent.
    std::size_t require(const std::string &name) const;
    /// Values of column @p index as numbers (NaN for empty cells); PostInputError on text.
    std::vector<double> numbers(std::size_t index) const;
    /// Values of column @p name as numbers (NaN for empty cells).
    std::vector<double> numbers(const std::string &name) const { return numbers(require(name)); }
    /// Checks that every cell of every column except @p text_columns is a number or empty.
    void require_numbers(const std::vector<std::string> &text_columns = {}) const;

    const std::string &path() const { return path_; }
    const std::vector<std::string> &names() const { return names_; }
    const std::vector<std::string> &units() const { return units_; }
    const std::vector<std::vector<std::string>> &rows() const { return rows_; }
    std::size_t n_rows() const { return rows_.size(); }
    /// The line number (1-based) in the file of row @p row.
    std::size_t line_of(std::size_t row) const { return lines_[row]; }

    static constexpr std::size_t npos = static_cast<std::size_t>(-1);

  private:
    std::string path_;
    std::vector<std::string> names_;
    std::vector<std::string> units_;
    std::vector<std::vector<std::string>> rows_;
    std::vector<std::size_t> lines_;
  };

  /// Splits one CSV line into cells (double quotes group, `""` inside quotes is a quote).
  std::vector<std::string> split_csv_line(const std::string &line);

  /// Parses @p text as a whole number in C locale; false if it is not one (or is empty).
  bool parse_number(const std::string &text, double &value);
} // namespace fickcast::post
