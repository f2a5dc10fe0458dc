// How a fickcast process starts MPI: as one rank of a launcher's job, or alone (a singleton).
#pragma once

namespace fickcast
{
  /// Whether a launcher started this process as one of several ranks (Open MPI, MPICH, Slurm).
  bool started_by_launcher();

  /**
   * Before MPI_Init of a process that no launcher started: settings that let Open MPI start a
   * lone rank quickly, without overriding any the user set: no supporting daemon (fickcast never
   * spawns processes), the ob1 messaging layer over the self transport (the only peer is itself)
   * instead of probing the network stacks. Measured on the development machine (Open MPI 4.1.4):
   * `fickcast check` of the main demo 0.62 s -> 0.30 s, of which 0.26 s is loading the libraries.
   * Other MPI implementations ignore these variables.
   */
  void prepare_single_process_mpi();
} // namespace fickcast
