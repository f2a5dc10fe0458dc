// Exit codes of the fickcast command (DESIGN.md section 4).
#pragma once

namespace fickcast
{
  enum ExitCode : int
  {
    exit_success = 0,    ///< done
    exit_run_failed = 1, ///< numerical failure (no convergence, step underflow), or a failed check
    exit_bad_input = 2,  ///< case file, mesh, table or flag
    exit_io_error = 3,   ///< reading or writing files failed
    exit_interrupted = 4 ///< stopped by a signal; `run --resume` (or the same sweep) continues it
  };
} // namespace fickcast
