#include "app/progress.h"

#include <cstdio>
#include <cstdlib>

#include <unistd.h>

namespace fickcast
{
  ProgressLine::ProgressLine(const DisplayUnits &units, const bool enabled)
    : units_(units)
    , enabled_(enabled)
    , terminal_(::isatty(STDERR_FILENO) == 1)
    , start_(std::chrono::steady_clock::now())
    , last_(start_)
  {
    if (const char *seconds = std::getenv("FICKCAST_PROGRESS_SECONDS"))
      {
        char *end = nullptr;
        const double value = std::strtod(seconds, &end);
        if (end != seconds && value > 0)
          interval_ = value;
      }
  }

  ProgressLine::~ProgressLine()
  {
    clear();
  }

  void ProgressLine::update(const ProgressReport &r)
  {
    if (!enabled_)
      return;
    const auto now = std::chrono::steady_clock::now();
    if (r.starting)
      {
        clear();
        ++solves_;
        start_ = last_ = now;
        std::fprintf(stderr, "fickcast: solve %u: %lu cells, %lu unknowns, to t = %s\n", solves_, r.cells, r.unknowns,
                     units_.time(r.end).c_str());
        std::fflush(stderr);
        return;
      }
    const double since_last = std::chrono::duration<double>(now - last_).count();
    const double elapsed = std::chrono::duration<double>(now - start_).count();
    if (terminal_ ? since_last < 0.2 || elapsed < 1.0 : since_last < interval_)
      return;
    last_ = now;
    const double fraction = r.end > 0 ? r.t / r.end : 1.0;
    const double left = fraction > 0 ? elapsed * (1 - fraction) / fraction : 0.0;
    if (terminal_)
      {
        std::fprintf(stderr, "\r  t = %s (%3.0f %%), step %u, about %.0f s left   ", units_.time(r.t).c_str(),
                     100 * fraction, r.step, left);
        shown_ = true;
      }
    else
      std::fprintf(stderr, "fickcast: solve %u: t = %s (%.0f %%), step %u, %.0f s so far, about %.0f s left\n", solves_,
                   units_.time(r.t).c_str(), 100 * fraction, r.step, elapsed, left);
    std::fflush(stderr);
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
