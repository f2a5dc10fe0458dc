// A study's table (sweep.csv) read generically, and the statistics drawn from its results.
#pragma once

#include "csv_table.h"

#include <string>
#include <vector>

namespace fickcast::post
{
  /**
   * sweep.csv: first column `case`, then the varied parameters (names that start with a case
   * section: region., boundary., time., ...), then the named results, then `status` and
   * `wall_time [s]` (and `message`). Result cells must be numbers or empty; parameter cells may
   * carry a unit after the number (`2e-10 m2/s`, `72 cm`): a column's values are converted to the
   * unit of its first cell that has one.
   */
  struct StudyTable
  {
    CsvTable table;
    std::vector<std::size_t> parameters; ///< column indices of varied parameters
    std::vector<std::size_t> results;    ///< column indices of results
    std::vector<bool> usable;            ///< per row: status completed (or no status column)
    std::size_t n_failed = 0;            ///< rows whose status is not `completed`

    /// Parameter values of column @p index as numbers in parameter_unit(index) (NaN for a cell
    /// that does not start with a number, such as a layer list).
    std::vector<double> parameter_values(std::size_t index) const;
    /// The unit the values of parameter column @p index are given in (empty: none, or SI).
    std::string parameter_unit(std::size_t index) const;
    /// Result values of column @p index for usable rows, NaN elsewhere. An event result
    /// (is_event_result) left empty in a completed case was not reached within the run: +infinity,
    /// as the solver's sweep_summary.json counts it.
    std::vector<double> result_values(std::size_t index) const;
  };

  /// Reads FOLDER/sweep.csv; PostInputError naming the file (and line) if it is not one.
  StudyTable read_study(const std::string &folder);

  /// True for results that are times of events (threshold.NAME, release.NAME, flux_limit.NAME,
  /// crossed_limit.NAME): empty when the
  /// event did not happen within the run.
  bool is_event_result(const std::string &name);

  /// True if @p name is a case key (its first part is a case section such as region or boundary).
  bool is_case_key(const std::string &name);

  /**
   * Sample quantile of @p values (finite ones) at probability @p p in [0, 1], by linear
   * interpolation between order statistics: Hyndman and Fan (1996), definition 7 (the default
   * of R and of NumPy). NaN values are left out; +infinity (an event not reached) takes part and
   * gives +infinity where the quantile reaches it. NaN if nothing is left.
   */
  double sample_quantile(std::vector<double> values, double p);

  /// Empirical exceedance curve: sorted finite values v(i) and P(X > v(i)) = 1 - i / (n + 1), n
  /// counting the +infinite values too (they exceed every level). NaN values are left out.
  void exceedance_curve(std::vector<double> values, std::vector<double> &levels, std::vector<double> &probability);

  /// Mean of the values, NaN values left out; NaN if none is left or if one is infinite (an
  /// event not reached has no mean).
  double finite_mean(const std::vector<double> &values);
} // namespace fickcast::post
