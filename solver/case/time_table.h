// Two-column tables of a value against time, read from CSV files with units in the header.
#pragma once

#include <string>
#include <vector>

namespace fickcast
{
  /// A value against time, SI, interpolated linearly; constant outside the table.
  struct TimeTable
  {
    std::string file;
    std::vector<double> times;  ///< s, strictly increasing
    std::vector<double> values; ///< SI

    bool empty() const { return times.empty(); }
    double at(double t) const;
  };

  /**
   * Reads @p path: a header `time [unit], value [unit]` (units in brackets, read by UDUNITS-2),
   * then rows of two numbers; `#` starts a comment. Times must increase strictly; at least two
   * rows. Values are converted to @p si_unit. Throws InputError naming `path:line`.
   */
  TimeTable read_time_table(const std::string &path, const std::string &si_unit);

  /// The unit of the value column written in the header of @p path, or empty if unreadable
  /// (used to decide a case's concentration family before the table is read in full).
  std::string time_table_value_unit(const std::string &path);
} // namespace fickcast
