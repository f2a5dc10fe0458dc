// GoogleTest main for tests that use deal.II (MPI must be initialised once per process).
#include "run/process_start.h"

#include <deal.II/base/mpi.h>

#include <gtest/gtest.h>

int main(int argc, char **argv)
{
  fickcast::prepare_single_process_mpi();
  dealii::Utilities::MPI::MPI_InitFinalize mpi(argc, argv, 1);
  ::testing::InitGoogleTest(&argc, argv);
  // Only rank 0 reports; every rank runs the same tests.
  if (dealii::Utilities::MPI::this_mpi_process(MPI_COMM_WORLD) != 0)
    {
      auto &listeners = ::testing::UnitTest::GetInstance()->listeners();
      delete listeners.Release(listeners.default_result_printer());
    }
  return RUN_ALL_TESTS();
}
