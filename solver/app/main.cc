// fickcast: the command-line entry point.
#include "app/command_line.h"
#include "app/exit_codes.h"
#include "app/verbs.h"

#include "case/input_error.h"
#include "numerics/run_size.h"
#include "results/summary.h"
#include "run/process_start.h"
#include "run/simulation.h"

#include <deal.II/base/mpi.h>

#include <csignal>
#include <filesystem>
#include <iostream>

namespace
{
  void on_signal(int)
  {
    fickcast::request_stop();
  }

  int dispatch(const fickcast::Invocation &invocation, MPI_Comm communicator, const bool root)
  {
    if (invocation.version)
      {
        if (root)
          std::cout << "fickcast " << fickcast::fickcast_version() << '\n';
        return fickcast::exit_success;
      }
    if (invocation.help)
      {
        if (root)
          std::cout << fickcast::help_text(invocation.verb);
        return fickcast::exit_success;
      }
    fickcast::set_size_limits(!invocation.allow_large);
    if (invocation.verb == "check")
      return fickcast::verb_check(invocation, communicator);
    if (invocation.verb == "sweep")
      return fickcast::verb_sweep(invocation, communicator);
    if (invocation.verb == "size")
      return fickcast::verb_size(invocation, communicator);
    if (invocation.verb == "verify")
      return fickcast::verb_verify(invocation, communicator);
    return fickcast::verb_run(invocation, communicator);
  }
} // namespace

int main(int argc, char **argv)
{
  // --version and --help need no MPI: starting it costs most of a second.
  if (!fickcast::started_by_launcher())
    try
      {
        const fickcast::Invocation invocation =
          fickcast::parse_command_line(std::vector<std::string>(argv + 1, argv + argc));
        if (invocation.version || invocation.help)
          return dispatch(invocation, MPI_COMM_NULL, true);
      }
    catch (const std::exception &)
      {
        // Reported below, once MPI runs (as every other error).
      }
  fickcast::prepare_single_process_mpi();
  dealii::Utilities::MPI::MPI_InitFinalize mpi(argc, argv, 1);
  const MPI_Comm communicator = MPI_COMM_WORLD;
  const bool root = dealii::Utilities::MPI::this_mpi_process(communicator) == 0;
  std::signal(SIGINT, on_signal);
  std::signal(SIGTERM, on_signal);
  try
    {
      const std::vector<std::string> arguments(argv + 1, argv + argc);
      const fickcast::Invocation invocation = fickcast::parse_command_line(arguments);
      return dispatch(invocation, communicator, root);
    }
  catch (const fickcast::InputError &error)
    {
      if (root)
        std::cerr << "fickcast: " << error.what() << '\n';
      return fickcast::exit_bad_input;
    }
  catch (const fickcast::IoError &error)
    {
      if (root)
        std::cerr << "fickcast: " << error.what() << '\n';
      return fickcast::exit_io_error;
    }
  catch (const std::filesystem::filesystem_error &error)
    {
      // A folder that cannot be made, read or renamed: the machine's doing, not ours.
      if (root)
        std::cerr << "fickcast: " << fickcast::printable(error.what(), 480) << '\n';
      return fickcast::exit_io_error;
    }
  catch (const fickcast::Interrupted &error)
    {
      if (root)
        std::cerr << "fickcast: " << error.what() << '\n';
      return fickcast::exit_interrupted;
    }
  catch (const fickcast::RunFailure &error)
    {
      if (root)
        std::cerr << "fickcast: run failed: " << error.what() << '\n';
      return fickcast::exit_run_failed;
    }
  catch (const std::exception &error)
    {
      if (root)
        std::cerr << "fickcast: internal error: " << error.what() << '\n';
      return fickcast::exit_run_failed;
    }
}
