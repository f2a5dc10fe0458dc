// What a case will cost before anything is allocated: cells, unknowns, memory, steps, outputs.
#pragma once

#include "case/case_description.h"

namespace fickcast
{
  /// Estimates of the size of a run (NaN where not known before the mesh is read).
  struct RunSize
  {
    double cells = 0;
    double unknowns = 0;
    double memory = 0; ///< bytes: the sparse matrices (or the coefficients of matrix-free steps) and vectors, about
    double output_times = 0; ///< rows of profiles, field files
    double fixed_steps = 0;  ///< steps of a fixed time step (0 with error control)
  };

  /// Estimates the size of @p c: exact cell counts for the built-in geometry (the same spacing
  /// laws as the mesh); for a mesh file its elements times 2^(dim refine), unknowns as for a block
  /// of that many cells. Throws InputError for a mesh file that is not a Gmsh mesh.
  RunSize estimate_run_size(const CaseDescription &c);

  /// Installed memory of this machine in bytes (0 if unknown).
  double installed_memory();

  /**
   * Throws InputError (exit 2) when @p size cannot fit: memory above 80 % of @p memory_limit
   * (bytes; 0: no memory check), more than 10^8 fixed steps or 10^5 output times. The message
   * gives the numbers and the remedy; `--allow-large` (set_size_limits(false)) lets it through.
   */
  void check_run_size(const CaseDescription &c, const RunSize &size, double memory_limit);

  /// Whether check_run_size refuses anything (the command line's --allow-large turns it off).
  void set_size_limits(bool enabled);
  bool size_limits_enabled();
} // namespace fickcast
