// `--report` on run and sweep: the plots and HTML report of what was just written, made by the
// post-processing library from the files alone (as fickcast-post report would).
#pragma once

#include <string>

namespace fickcast
{
  /**
   * Writes FOLDER/report/index.html and its plots for a results folder or a study folder.
   * Returns exit_success, or prints one line on stderr and returns exit_io_error (writing
   * failed) or exit_run_failed (the folder could not be reported on). Call on one rank only.
   */
  int write_report(const std::string &folder, bool quiet);
} // namespace fickcast
