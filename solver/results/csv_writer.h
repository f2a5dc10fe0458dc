// A CSV table written row by row: header with units, SI values, nothing else.
#pragma once

#include <cstdint>
#include <fstream>
#include <string>
#include <vector>

namespace fickcast
{
  /// @p text as one CSV cell: quoted (quotes doubled) if it holds a comma, a quote or a line break.
  std::string csv_field(const std::string &text);

  /// One column: name and SI unit (printed as `name [unit]`; no brackets for pure numbers).
  struct Column
  {
    std::string name;
    std::string unit;
  };

  /**
   * Writes a comma-separated table: one header line `name [unit],...`, then rows of numbers
   * with 12 significant digits. NaN is written as an empty field (no value at that row).
   */
  class CsvWriter
  {
  public:
    CsvWriter() = default;
    /// Opens @p path and writes the header. Throws IoError.
    void open(const std::string &path, const std::vector<Column> &columns);
    /// Writes one row; must have as many values as there are columns.
    void write(const std::vector<double> &values);
    /// Writes one row of cells already formatted (text columns such as a line's name).
    void write_cells(const std::vector<std::string> &cells);
    /// A number as write() formats it (12 significant digits; empty for NaN).
    static std::string format(double value);
    void close();
    /// Flushes the rows written so far and returns the file's size in bytes: the point a resumed
    /// run continues from (reopen). Throws IoError.
    std::uint64_t flush();
    /// Opens @p path, cut to @p size bytes (what flush() returned), for appending rows of
    /// @p n_columns: a run resumed from a checkpoint. Throws IoError.
    void reopen(const std::string &path, std::size_t n_columns, std::uint64_t size);
    bool is_open() const { return stream_.is_open(); }
    std::size_t n_columns() const { return n_columns_; }

  private:
    std::ofstream stream_;
    std::string path_;
    std::size_t n_columns_ = 0;
    std::string row_; ///< the row being formatted (kept for its capacity)
  };
} // namespace fickcast
