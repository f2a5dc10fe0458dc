#include "app/progress.h"

#include <cstdio>

#include <unistd.h>

namespace fickcast
{
  ProgressLine::ProgressLine(const DisplayUnits &units, const bool enabled)
    : units_(units)
    , enabled_(enabled && ::isatty(STDERR_FILENO) == 1)
    , start_(std::chrono::steady_clock::now())
    , last_(start_)
  {
  }

  ProgressLine::~ProgressLine()
  {
    clear();
  }

  void ProgressLine::update(const double t, const double end, const unsigned int step)
  {
    if (!enabled_)
      return;
    const auto now = std::chrono::steady_clock::now();
    const double since_last = std::chrono::duration<double>(now - last_).count();
    const double elapsed = std::chrono::duration<double>(now - start_).count();
    if (since_last < 0.2 || elapsed < 1.0)
      return;
    last_ = now;
    const double fraction = end > 0 ? t / end : 1.0;
    const double left = fraction > 0 ? elapsed * (1 - fraction) / fraction : 0.0;
    std::fprintf(stderr, "\r  t = %s (%3.0f %%), step %u, about %.0f s left   ", units_.time(t).c_str(), 100 * fraction,
                 step, left);
    std::fflush(stderr);
    shown_ = true;
  }

  void ProgressLine::clear()
  {
    if (shown_)
      {
        std::fprintf(stderr, "\r%80s\r", "");
        std::fflush(stderr);
        shown_ = false;
      }
  }
} // namespace fickcast
