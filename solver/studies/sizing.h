// Sizing: the value of one case parameter that brings a named result to a target.
#pragma once

#include "case/case_description.h"

#include <mpi.h>

#include <functional>
#include <string>
#include <vector>

namespace fickcast
{
  struct SizingOptions
  {
    std::string case_file;
    std::vector<std::string> base_overrides; ///< --set overrides of the base case
    std::string folder;                      ///< the sizing folder
    bool overwrite = false;
  };

  /// One run of the case during the search.
  struct SizingRun
  {
    unsigned int index = 0; ///< 1, 2, ...
    double parameter = 0;   ///< in `parameter_unit`
    std::string value;      ///< the parameter as written into the case
    double result = 0;      ///< the named result, in `result_unit` (NaN if absent or not reached)
    double difference = 0;  ///< result - target as the search saw it (an event not reached counts as at time.end)
    std::string status;     ///< completed, failed
    std::string message;
    std::string folder; ///< its results folder (final location)
  };

  struct SizingOutcome
  {
    std::string key, parameter_unit, result_name, result_unit;
    double target = 0;                        ///< in result_unit
    double low = 0, high = 0;                 ///< the range, in parameter_unit
    bool bracketed = false;                   ///< the target lies between the results at the two ends
    bool converged = false;                   ///< the bracket shrank to the tolerance
    double value = 0;                         ///< the answer, in parameter_unit
    double result = 0;                        ///< the result at the answer
    double bracket_low = 0, bracket_high = 0; ///< the final bracket
    std::vector<SizingRun> evaluations;
    std::string folder; ///< where the sizing folder is (after success)
  };

  /**
   * Finds the value of size.parameter within [size.from, size.to] for which the named result
   * size.result equals size.aim (collective over @p communicator; each evaluation
   * is a full run of the case on all ranks). The search is Alefeld, Potra and Shi's bracketing
   * method (ACM TOMS algorithm 748, as implemented by Boost.Math toms748_solve) on
   * f(p) = result(p) - target, stopped when the bracket is narrower than size.tolerance times the
   * parameter, or after size.max_runs runs. The answer is the secant point of the final
   * bracket, run once more so its result is a real run, not an interpolation.
   *
   * Each run writes FOLDER/runs/run_NN; FOLDER also gets size.csv (every evaluation) and
   * size_summary.json. The folder appears only complete. Throws InputError (exit 2) if the range
   * does not bracket the target (the message gives the result at both ends), if the named result
   * does not exist, or if the target's unit does not fit the result; RunFailure if a run inside
   * the range fails or the search does not converge within the allowed runs.
   */
  SizingOutcome run_sizing(const CaseDescription &base, const SizingOptions &options, MPI_Comm communicator,
                           const std::function<void(const SizingRun &)> &on_evaluation);

  /**
   * The checks run_sizing makes before its first run, without running: the sizing keys are all
   * there, the range has consistent units, the key names a parameter the case has, the result
   * exists and the target has its unit (and, for an event, lies before time.end). When
   * @p case_file is given, the case is also read with the parameter at both ends of the range,
   * so a value the case rejects shows now. Returns the outcome with key, range, result, unit and
   * target filled in. Throws InputError.
   */
  SizingOutcome prepare_sizing(const CaseDescription &base, const std::string &case_file = {},
                               const std::vector<std::string> &base_overrides = {});
} // namespace fickcast
