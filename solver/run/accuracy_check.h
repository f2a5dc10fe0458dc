// Accuracy as an input: solve, solve finer, compare each named result, repeat until it holds.
#pragma once

#include "case/case_description.h"
#include "results/run_record.h"
#include "run/simulation.h"

#include <mpi.h>

#include <functional>
#include <string>

namespace fickcast
{
  /// Solves @p description into @p folder (collective; the record's status on every rank).
  using SolveOnce =
    std::function<RunRecord(const CaseDescription &description, const std::string &folder, const CheckpointPolicy &)>;

  /**
   * The case one check finer than @p description, @p level times over: every cell split once
   * more per level (geometry.refine + level) and the time error cut with it (adaptive steps:
   * time.tolerance / 8 per level: steps chosen for a local error of order dt^3 then halve, and
   * a second-order scheme's global error falls fourfold; fixed steps: time.step / 2, likewise
   * the first and largest steps).
   */
  /// What one solve of @p c used and cost, from its record.
  SolveFacts facts_of(const CaseDescription &c, const RunRecord &record);

  CaseDescription refined_case(const CaseDescription &description, unsigned int level);

  /**
   * Runs the accuracy check of numerics.accuracy (> 0) in the partial results folder @p folder:
   * solve k (k = 0, 1, ...) runs refined_case(k) in FOLDER/solve-k, its step error measured
   * relative to each node's own value down to half the smallest level or point value the case
   * reports (time.error_floor); from the second solve on, each named result's error is
   * estimated from its changes between solves, and the check ends when every estimate is
   * within the request relative to its result, after numerics.accuracy_solves solves, or when
   * the next solve would not fit the machine (the record's note says which). The last solve's
   * files are moved into @p folder and the solve-k folders removed; the returned record is the
   * last solve's, with the estimates in record.accuracy. A solve that fails or is interrupted
   * ends the check with its record. With checkpoints.resume, finished solves are read back from
   * FOLDER/solve-k/solve.json and the unfinished one continues from its checkpoint.
   */
  RunRecord check_accuracy(const CaseDescription &description, const std::string &folder,
                           const CheckpointPolicy &checkpoints, const SolveOnce &solve, MPI_Comm communicator);

  /// The step of the newest checkpoint in @p folder or in its unfinished accuracy solve (the
  /// progress of an interrupted run, for ResultsFolder): solves count before steps.
  long accuracy_progress(const std::string &folder);
} // namespace fickcast
