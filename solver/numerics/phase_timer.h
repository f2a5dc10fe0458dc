// Wall time spent per phase of a run (set-up, matrix set-ups, solves, output), for summaries
// and benchmarks.
#pragma once

#include <chrono>
#include <map>
#include <string>

namespace fickcast
{
  /// Accumulates wall seconds per named phase. Not thread-safe; one per run.
  class PhaseTimer
  {
  public:
    /// Measures the enclosing scope into phase @p name.
    class Scope
    {
    public:
      Scope(PhaseTimer &timer, const char *name)
        : timer_(timer)
        , name_(name)
        , start_(std::chrono::steady_clock::now())
      {
      }
      ~Scope() { timer_.add(name_, std::chrono::duration<double>(std::chrono::steady_clock::now() - start_).count()); }
      Scope(const Scope &) = delete;
      Scope &operator=(const Scope &) = delete;

    private:
      PhaseTimer &timer_;
      const char *name_;
      std::chrono::steady_clock::time_point start_;
    };

    void add(const std::string &name, double seconds) { seconds_[name] += seconds; }
    const std::map<std::string, double> &seconds() const { return seconds_; }

  private:
    std::map<std::string, double> seconds_;
  };
} // namespace fickcast
