#include "run/run_case.h"

#include "case/input_error.h"
#include "numerics/collective.h"
#include "numerics/run_size.h"
#include "results/summary.h"
#include "run/accuracy_check.h"
#include "run/checkpoint.h"
#include "run/results_folder.h"

#include <deal.II/base/mpi.h>

#include <filesystem>
#include <memory>

namespace fickcast
{
  using namespace dealii;

  RunOutcome run_case(const CaseDescription &description, const RunOptions &options, MPI_Comm communicator)
  {
    const unsigned int rank = Utilities::MPI::this_mpi_process(communicator);
    const std::string target = options.folder.empty() ? description.output.folder : options.folder;
    // Before anything is allocated or written (the same on every rank).
    check_run_size(description, estimate_run_size(description), installed_memory());
    std::unique_ptr<ResultsFolder> folder;
    std::string path;
    bool resumed = false;
    collectively(communicator, [&] {
      if (rank == 0)
        {
          folder = std::make_unique<ResultsFolder>(target, options.overwrite,
                                                   options.resume ? ResultsFolder::Progress(accuracy_progress)
                                                                  : ResultsFolder::Progress());
          path = folder->path();
          resumed = folder->resumed();
        }
    });
    path = Utilities::MPI::broadcast(communicator, path, 0);
    resumed = Utilities::MPI::broadcast(communicator, resumed, 0);
    CheckpointPolicy checkpoints;
    checkpoints.write = options.checkpoints;
    checkpoints.every = description.output.checkpoint_every;
    checkpoints.resume = resumed;

    // One solve (collective; the status on every rank). 1-D: rank 0 alone; 2-D and 3-D: everybody.
    const SolveOnce solve = [&](const CaseDescription &c, const std::string &into, const CheckpointPolicy &policy) {
      MPI_Comm solve_communicator = communicator;
      MPI_Comm split = MPI_COMM_NULL;
      if (c.dimension == 1 && Utilities::MPI::n_mpi_processes(communicator) > 1)
        {
          MPI_Comm_split(communicator, rank == 0 ? 0 : MPI_UNDEFINED, 0, &split);
          solve_communicator = split;
        }
      RunRecord record;
      collectively(communicator, [&] {
        if (solve_communicator == MPI_COMM_NULL)
          return;
        const ProgressCallback progress = rank == 0 ? options.progress : ProgressCallback();
        switch (c.dimension)
          {
            case 1:
              record = simulate<1>(c, solve_communicator, into, progress, {}, policy);
              break;
            case 2:
              record = simulate<2>(c, solve_communicator, into, progress, {}, policy);
              break;
            default:
              record = simulate<3>(c, solve_communicator, into, progress, {}, policy);
              break;
          }
      });
      if (split != MPI_COMM_NULL)
        MPI_Comm_free(&split);
      record.status = Utilities::MPI::broadcast(communicator, record.status, 0);
      return record;
    };

    RunOutcome outcome;
    if (description.numerics.accuracy > 0)
      outcome.record = check_accuracy(description, path, checkpoints, solve, communicator);
    else
      {
        collectively(communicator, [&] {
          if (rank == 0)
            std::filesystem::create_directories(path + "/fields");
        });
        outcome.record = solve(description, path, checkpoints);
        outcome.record.accuracy.solves.push_back(facts_of(description, outcome.record));
      }

    if (outcome.record.status == "interrupted")
      {
        if (rank == 0 && options.checkpoints)
          folder->keep();
        outcome.folder = path;
        return outcome;
      }
    collectively(communicator, [&] {
      if (rank != 0)
        return;
      write_json(make_summary(description, outcome.record), path + "/summary.json");
      folder->commit();
    });
    outcome.folder = target;
    return outcome;
  }
} // namespace fickcast
