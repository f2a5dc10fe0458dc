// The built-in verification set of `fickcast verify`: small runs compared with published
// analytic solutions, each with its source, error and tolerance.
#pragma once

#include <functional>
#include <string>
#include <vector>

namespace fickcast
{
  /// The outcome of one check.
  struct CheckResult
  {
    std::string name;     ///< what is checked
    std::string source;   ///< where the reference comes from (author, title, equation or section)
    std::string measure;  ///< what the error measures
    double error = 0;     ///< the error found
    double tolerance = 0; ///< the error allowed
    bool passed = false;
    std::string note;   ///< e.g. why it could not run
    double seconds = 0; ///< wall time of the check
  };

  /**
   * Runs every check in @p scratch (a folder that may be removed afterwards), one rank, and
   * returns the results in order. @p on_result is called after each check (progress output).
   * Reference values are computed with Boost.Math (erfc, Bessel zeros, TOMS 748 roots,
   * Gauss-Kronrod quadrature) and the standard library, never pasted.
   */
  std::vector<CheckResult> run_verification(const std::string &scratch,
                                            const std::function<void(const CheckResult &)> &on_result);
} // namespace fickcast
