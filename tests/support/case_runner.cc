#include "case_runner.h"

#include "case/case_reader.h"
#include "run/run_case.h"

#include <deal.II/base/mpi.h>

#include <cstdlib>
#include <filesystem>
#include <fstream>
#include <string>
#include <vector>

#ifndef FICKCAST_SOURCE_DIR
#define FICKCAST_SOURCE_DIR "."
#endif
#ifndef FICKCAST_TEST_SCRATCH
#define FICKCAST_TEST_SCRATCH "/tmp/fickcast-tests"
#endif

namespace fickcast::testing
{
  std::string scratch_folder(const std::string &name, MPI_Comm communicator)
  {
    // The assembled.* copies of the tests run beside the others (ctest -j): folders of their own.
    const std::string folder =
      std::string(FICKCAST_TEST_SCRATCH) + (assembled_steps_forced() ? "/assembled/" : "/") + name;
    if (dealii::Utilities::MPI::this_mpi_process(communicator) == 0)
      {
        std::filesystem::remove_all(folder);
        std::filesystem::create_directories(folder);
      }
    MPI_Barrier(communicator);
    return folder;
  }

  std::string write_case(const std::string &case_text, const std::string &name, MPI_Comm communicator)
  {
    const std::string path = scratch_folder(name, communicator) + "/case.ini";
    if (dealii::Utilities::MPI::this_mpi_process(communicator) == 0)
      std::ofstream(path) << case_text;
    MPI_Barrier(communicator);
    return path;
  }

  std::string source_path(const std::string &relative)
  {
    return std::string(FICKCAST_SOURCE_DIR) + "/" + relative;
  }

  bool assembled_steps_forced()
  {
    const char *value = std::getenv("FICKCAST_TEST_ASSEMBLED");
    return value != nullptr && std::string(value) == "1";
  }

  CaseDescription describe(const std::string &case_text, const std::string &name, MPI_Comm communicator)
  {
    const std::string folder = scratch_folder(name, communicator);
    // A test of some feature checks one solve against its reference; the accuracy check
    // (numerics.accuracy, on by default in a case file) is tested where a case asks for it.
    std::vector<std::string> overrides;
    if (case_text.find("accuracy") == std::string::npos)
      overrides.push_back("numerics.accuracy=off");
    // The assembled path for every case that does not choose one (ctest's assembled.* copies).
    if (assembled_steps_forced() && case_text.find("matrix_free") == std::string::npos)
      overrides.push_back("numerics.matrix_free=off");
    CaseDescription description = read_case_text(case_text, name + ".ini", overrides);
    description.output.folder = folder + "/results";
    return description;
  }

  RunRecord run(const CaseDescription &description)
  {
    RunOptions options;
    options.overwrite = true;
    return run_case(description, options, MPI_COMM_WORLD).record;
  }
} // namespace fickcast::testing
