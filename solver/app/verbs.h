// The verbs of the fickcast command; each returns an exit code.
#pragma once

#include "app/command_line.h"

#include <mpi.h>

namespace fickcast
{
  int verb_check(const Invocation &invocation, MPI_Comm communicator);
  int verb_run(const Invocation &invocation, MPI_Comm communicator);
  int verb_sweep(const Invocation &invocation, MPI_Comm communicator);
  int verb_size(const Invocation &invocation, MPI_Comm communicator);
  int verb_verify(const Invocation &invocation, MPI_Comm communicator);
} // namespace fickcast
