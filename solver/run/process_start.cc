#include "run/process_start.h"

#include <cstdlib>
#include <initializer_list>

namespace fickcast
{
  bool started_by_launcher()
  {
    for (const char *name : {"OMPI_COMM_WORLD_SIZE", "PMI_SIZE", "PMIX_RANK", "SLURM_NTASKS"})
      if (std::getenv(name) != nullptr)
        return true;
    return false;
  }

  void prepare_single_process_mpi()
  {
    if (started_by_launcher())
      return;
    // setenv with 0: a value the user set stays.
    ::setenv("OMPI_MCA_ess_singleton_isolated", "1", 0);
    ::setenv("OMPI_MCA_pml", "ob1", 0);
    ::setenv("OMPI_MCA_btl", "self", 0);
  }
} // namespace fickcast
