// One case, start to finish: results folder, solve on the right ranks, summary.
#pragma once

#include "case/case_description.h"
#include "results/run_record.h"
#include "run/simulation.h"

#include <mpi.h>

#include <string>

namespace fickcast
{
  struct RunOptions
  {
    std::string folder;     ///< results folder; empty: the case's output.folder
    bool overwrite = false; ///< replace an existing results folder
    ProgressCallback progress;
  };

  struct RunOutcome
  {
    RunRecord record;
    std::string folder; ///< where the results are now
  };

  /**
   * Runs @p description (collective over @p communicator): checks the results folder first
   * (InputError if it exists without overwrite), writes into a partial folder, solves (2-D and
   * 3-D distributed over all ranks, 1-D on rank 0), writes summary.json and moves the folder
   * into place. InputError and IoError are thrown on every rank alike; a numerical failure
   * comes back as status "failed" with its results written.
   */
  RunOutcome run_case(const CaseDescription &description, const RunOptions &options, MPI_Comm communicator);
} // namespace fickcast
