// Reading back what a finished case wrote in its summary.json (for studies).
#pragma once

#include <string>
#include <vector>

namespace fickcast
{
  /// One named scalar result of a case.
  struct NamedResult
  {
    std::string name; ///< e.g. threshold.base, depth.front (its final value), point.base.final
    double value = 0; ///< SI; NaN if absent or not reached
    std::string unit;
  };

  struct CaseSummary
  {
    std::string status; ///< completed, failed, input error
    std::string message;
    double wall_time = 0;
    std::vector<NamedResult> results;

    /// The result named @p name, or nullptr.
    const NamedResult *find(const std::string &name) const;
  };

  /**
   * Reads @p path (a summary.json written by fickcast). The results come in the order of
   * @p order (result_order() of the case), then any others by name: sweep.csv takes its columns
   * from here. Throws IoError if unreadable.
   */
  CaseSummary read_case_summary(const std::string &path, const std::vector<std::string> &order);
} // namespace fickcast
