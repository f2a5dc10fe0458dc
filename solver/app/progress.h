// Progress of a run on stderr: the mesh of each solve before it starts, then a self-overwriting
// line on a terminal, or one plain line per minute of wall time into a log.
#pragma once

#include "case/display_units.h"
#include "run/simulation.h"

#include <chrono>

namespace fickcast
{
  /**
   * Before each solve: one line with its cells and unknowns (and which solve of the accuracy
   * check it is). During it: on a terminal, simulated time, percentage, step count and an
   * estimate of the time left, at most five times a second, on one self-overwriting line;
   * otherwise the same as a plain line once per minute of wall time (FICKCAST_PROGRESS_SECONDS
   * sets another interval, for tests). Nothing when not @p enabled.
   */
  class ProgressLine
  {
  public:
    ProgressLine(const DisplayUnits &units, bool enabled);
    ~ProgressLine();
    void update(const ProgressReport &report);
    void clear();

  private:
    const DisplayUnits &units_;
    bool enabled_;
    bool terminal_;
    double interval_ = 60; ///< s between plain lines (not on a terminal)
    bool shown_ = false;
    unsigned int solves_ = 0;
    std::chrono::steady_clock::time_point start_, last_;
  };
} // namespace fickcast
