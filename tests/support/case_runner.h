// Running a case written inline in a test, into a fresh results folder.
#pragma once

#include "case/case_description.h"
#include "results/run_record.h"

#include <mpi.h>

#include <string>

namespace fickcast::testing
{
  /**
   * Whether the environment variable FICKCAST_TEST_ASSEMBLED is 1 (ctest's assembled.* copies of
   * the verification tests): every case that does not set numerics.matrix_free then assembles
   * its matrices, so that each check also holds on the assembled path, and scratch folders lie
   * apart from the default copies'.
   */
  bool assembled_steps_forced();

  /// A fresh, empty folder under the build tree for one test (removed and re-created by rank 0
  /// of @p communicator, collective over it).
  std::string scratch_folder(const std::string &name, MPI_Comm communicator = MPI_COMM_WORLD);

  /// Reads @p case_text (INI) as if it were the file `<name>.ini`, with the results folder
  /// set to scratch_folder(name)/results; numerics.accuracy is off unless the text sets it, and
  /// numerics.matrix_free off under assembled_steps_forced() unless the text sets it.
  CaseDescription describe(const std::string &case_text, const std::string &name,
                           MPI_Comm communicator = MPI_COMM_WORLD);

  /// Writes @p case_text to scratch_folder(name)/case.ini (rank 0, collective) and returns its path;
  /// for code that reads the case file itself (studies).
  std::string write_case(const std::string &case_text, const std::string &name, MPI_Comm communicator = MPI_COMM_WORLD);

  /// Absolute path of @p relative in the source tree (for meshes and cases in tests).
  std::string source_path(const std::string &relative);

  /// Runs @p description on MPI_COMM_WORLD into its output folder (overwriting); returns the record.
  RunRecord run(const CaseDescription &description);
} // namespace fickcast::testing
