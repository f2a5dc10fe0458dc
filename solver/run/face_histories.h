// The rate and the amount through each boundary a named result asks about, step by step, and the
// results read from them at the end (flux, crossed, peak_flux, flux_limit, crossed_limit,
// steady_flux, time_lag).
#pragma once

#include "case/case_description.h"
#include "results/run_record.h"
#include "run/checkpoint.h"

#include <string>
#include <vector>

namespace fickcast
{
  class FaceHistories
  {
  public:
    /// Follows the boundaries that @p c's time lags and results through faces name (@p names:
    /// the boundary names by id).
    FaceHistories(const CaseDescription &c, const std::vector<std::string> &names);

    /// After an accepted step to @p t: the inward rate per boundary id (@p rates_in, amount per
    /// time, consistent with the scheme) and the amount entered so far (@p entered).
    void record(double t, const std::vector<double> &rates_in, const std::vector<double> &entered);

    void save(StateArchive &archive) const;
    /// Takes up what save() wrote; throws IoError naming @p folder if it does not fit.
    void load(StateArchive &archive, const std::string &folder);

    /// One record per output.time_lag.* (the amount entered at the end @p t: @p entered).
    std::vector<TimeLagRecord> time_lags(const CaseDescription &c, const std::vector<double> &entered, double t) const;
    /// One record per result through a face, in the case's order; the run ended at @p t.
    std::vector<FaceResultRecord> results(const CaseDescription &c, double t) const;

  private:
    struct History
    {
      unsigned int boundary = 0;
      std::vector<double> times, rates, amounts; ///< rates: NaN at t = 0 (unknown before a step)
    };
    const History &of(const std::string &boundary) const;
    std::vector<std::string> names_;
    std::vector<History> histories_;
  };
} // namespace fickcast
