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
    std::string folder;       ///< results folder; empty: the case's output.folder
    bool overwrite = false;   ///< replace an existing results folder
    bool checkpoints = false; ///< write checkpoints (output.checkpoint_every); keep an interrupted run
    bool resume = false;      ///< continue an interrupted run from its newest checkpoint
    ProgressCallback progress;
  };

  struct RunOutcome
  {
    RunRecord record;
    std::string folder; ///< where the results are now (an interrupted run: its partial folder)
  };

  /**
   * Runs @p description (collective over @p communicator): checks the results folder first
   * (InputError if it exists without overwrite), writes into a partial folder, solves (2-D and
   * 3-D distributed over all ranks, 1-D on rank 0), writes summary.json and moves the folder
   * into place. InputError and IoError are thrown on every rank alike; a numerical failure
   * comes back as status "failed" with its results written. An interrupted run (status
   * "interrupted") writes no summary and is not moved into place; with checkpoints its partial
   * folder is kept for a resume, otherwise removed.
   */
  RunOutcome run_case(const CaseDescription &description, const RunOptions &options, MPI_Comm communicator);
} // namespace fickcast
