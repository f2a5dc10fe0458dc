#include "run/run_case.h"

#include "case/input_error.h"
#include "numerics/collective.h"
#include "numerics/run_size.h"
#include "results/summary.h"
#include "run/checkpoint.h"
#include "run/results_folder.h"

#include <deal.II/base/mpi.h>

#include <filesystem>
#include <memory>

namespace fickcast
{
  using namespace dealii;

  namespace
  {
  } // namespace

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
                                                   options.resume ? ResultsFolder::Progress(latest_checkpoint_step)
                                                                  : ResultsFolder::Progress());
          std::filesystem::create_directories(folder->path() + "/fields");
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

    // 1-D: rank 0 alone; 2-D and 3-D: everybody.
    MPI_Comm solve_communicator = communicator;
    MPI_Comm split = MPI_COMM_NULL;
    if (description.dimension == 1 && Utilities::MPI::n_mpi_processes(communicator) > 1)
      {
        MPI_Comm_split(communicator, rank == 0 ? 0 : MPI_UNDEFINED, 0, &split);
        solve_communicator = split;
      }

    RunOutcome outcome;
    collectively(communicator, [&] {
      if (solve_communicator == MPI_COMM_NULL)
        return;
      const ProgressCallback progress = rank == 0 ? options.progress : ProgressCallback();
      switch (description.dimension)
        {
          case 1:
            outcome.record = simulate<1>(description, solve_communicator, path, progress, {}, checkpoints);
            break;
          case 2:
            outcome.record = simulate<2>(description, solve_communicator, path, progress, {}, checkpoints);
            break;
          default:
            outcome.record = simulate<3>(description, solve_communicator, path, progress, {}, checkpoints);
            break;
        }
    });
    if (split != MPI_COMM_NULL)
      MPI_Comm_free(&split);

    // 1-D: the other ranks learn the status from rank 0.
    outcome.record.status = Utilities::MPI::broadcast(communicator, outcome.record.status, 0);
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
