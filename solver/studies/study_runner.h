// Running the cases of a study over MPI ranks, resumably, and tabulating them.
#pragma once

#include "studies/study_plan.h"

#include <mpi.h>

#include <functional>
#include <map>
#include <string>
#include <vector>

namespace fickcast
{
  struct StudyOptions
  {
    std::string case_file;
    std::vector<std::string> base_overrides; ///< --set overrides of the base case
    std::string folder;                      ///< the study folder
    bool overwrite = false;                  ///< start afresh instead of resuming
  };

  /// What happened to one case in this invocation.
  struct CaseEvent
  {
    std::string id;
    std::string status; ///< completed, failed, input error, already done
    std::string message;
    double wall_time = 0;
    unsigned int rank = 0;
  };

  /// The probability that a result crosses a stated limit (uncertainty studies).
  struct LimitProbability
  {
    std::string level_text; ///< as written
    bool above = true;      ///< exceeding (true) or falling below
    double level = 0;       ///< in the result's unit
    std::size_t n = 0;      ///< completed cases counted
    double probability = 0, standard_error = 0;
  };

  /// Sample statistics of one named result over the completed cases (uncertainty studies).
  struct ResultStatistics
  {
    std::string name, unit;
    std::size_t n = 0;
    double mean = 0, standard_deviation = 0, standard_error_of_mean = 0, p5 = 0, p50 = 0, p95 = 0;
    std::size_t not_reached = 0; ///< events (threshold, release) not reached within time.end: +inf
    std::vector<LimitProbability> limits;
  };

  /// What tabulate_study found over all cases.
  struct StudyTable
  {
    std::map<std::string, unsigned int> statuses; ///< number of cases per status
    std::vector<ResultStatistics> statistics;     ///< uncertainty studies only
  };

  struct StudyTotals
  {
    std::size_t cases = 0, computed = 0, reused = 0, failed = 0;
    bool interrupted = false;
    StudyTable table; ///< over all cases, rank 0 only
  };

  /**
   * Runs @p cases of the study (collective over @p communicator). Cases are handed out one at a
   * time from a shared counter (MPI one-sided fetch-and-add on rank 0), so ranks take new cases as
   * they finish, and each case is solved on one rank. Each case writes a complete results folder
   * under FOLDER/cases/ID; a case whose folder already holds a summary is kept, not recomputed,
   * when the same study (same plan) is run again into the same folder. A failing case is
   * recorded with its message and the study goes on. On SIGINT/SIGTERM the ranks stop after
   * removing the case they were solving. Rank 0 then writes FOLDER/sweep.csv (and, for uncertainty
   * studies, sweep_summary.json). Throws InputError if FOLDER holds something else.
   */
  StudyTotals run_study(const CaseDescription &base, const std::vector<StudyCase> &cases, const StudyOptions &options,
                        MPI_Comm communicator, const std::function<void(const CaseEvent &)> &on_case);

  /// Writes FOLDER/sweep.csv (one row per case: parameters, named results, status, message,
  /// wall time) and FOLDER/sweep_summary.json (status counts; for an uncertainty study the mean,
  /// P5, P50, P95 of each result and the probabilities of crossing the stated limits). Rank 0
  /// only.
  StudyTable tabulate_study(const CaseDescription &base, const std::vector<StudyCase> &cases,
                            const std::string &folder);
} // namespace fickcast
