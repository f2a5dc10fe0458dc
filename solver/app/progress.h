// A one-line progress display on stderr for long runs, only when stderr is a terminal.
#pragma once

#include "app/display_units.h"

#include <chrono>

namespace fickcast
{
  /// Shows simulated time, percentage, step count and an estimate of the time left, at most
  /// five times a second, on one self-overwriting line. Silent when stderr is not a terminal.
  class ProgressLine
  {
  public:
    ProgressLine(const DisplayUnits &units, bool enabled);
    ~ProgressLine();
    void update(double t, double end, unsigned int step);
    void clear();

  private:
    const DisplayUnits &units_;
    bool enabled_;
    bool shown_ = false;
    std::chrono::steady_clock::time_point start_, last_;
  };
} // namespace fickcast
