#include "numerics/run_case.h"

#include "case/input_error.h"
#include "results/results_folder.h"
#include "results/summary.h"

#include <deal.II/base/mpi.h>

#include <filesystem>
#include <memory>

namespace fickcast
{
  using namespace dealii;

  namespace
  {
    enum class ErrorKind : int
    {
      none = 0,
      input = 1,
      io = 2,
      other = 3
    };

    /// Runs @p work on every rank; if any rank throws, every rank throws the first error seen.
    template <typename Work>
    void collectively(MPI_Comm communicator, Work &&work)
    {
      ErrorKind kind = ErrorKind::none;
      std::string where, key, message, text;
      try
        {
          work();
        }
      catch (const InputError &error)
        {
          kind = ErrorKind::input;
          where = error.where();
          key = error.key();
          message = error.message();
        }
      catch (const IoError &error)
        {
          kind = ErrorKind::io;
          text = error.what();
        }
      catch (const std::exception &error)
        {
          kind = ErrorKind::other;
          text = error.what();
        }
      const unsigned int rank = Utilities::MPI::this_mpi_process(communicator);
      const unsigned int n_ranks = Utilities::MPI::n_mpi_processes(communicator);
      const unsigned int reporter = Utilities::MPI::min(kind == ErrorKind::none ? n_ranks : rank, communicator);
      if (reporter == n_ranks)
        return;
      const int code = Utilities::MPI::broadcast(communicator, static_cast<int>(kind), reporter);
      where = Utilities::MPI::broadcast(communicator, where, reporter);
      key = Utilities::MPI::broadcast(communicator, key, reporter);
      message = Utilities::MPI::broadcast(communicator, message, reporter);
      text = Utilities::MPI::broadcast(communicator, text, reporter);
      switch (static_cast<ErrorKind>(code))
        {
          case ErrorKind::input:
            throw InputError(where, key, message);
          case ErrorKind::io:
            throw IoError(text);
          default:
            throw std::runtime_error(text);
        }
    }
  } // namespace

  RunOutcome run_case(const CaseDescription &description, const RunOptions &options, MPI_Comm communicator)
  {
    const unsigned int rank = Utilities::MPI::this_mpi_process(communicator);
    const std::string target = options.folder.empty() ? description.output.folder : options.folder;
    std::unique_ptr<ResultsFolder> folder;
    std::string path;
    collectively(communicator, [&] {
      if (rank == 0)
        {
          folder = std::make_unique<ResultsFolder>(target, options.overwrite);
          std::filesystem::create_directories(folder->path() + "/fields");
          path = folder->path();
        }
    });
    path = Utilities::MPI::broadcast(communicator, path, 0);

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
            outcome.record = simulate<1>(description, solve_communicator, path, progress);
            break;
          case 2:
            outcome.record = simulate<2>(description, solve_communicator, path, progress);
            break;
          default:
            outcome.record = simulate<3>(description, solve_communicator, path, progress);
            break;
        }
    });
    if (split != MPI_COMM_NULL)
      MPI_Comm_free(&split);

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
