#include "run/landing_times.h"

#include <algorithm>
#include <utility>

namespace fickcast
{
  namespace
  {
    /// @p times sorted, positive and without repeats closer than 1e-12 of the run.
    std::vector<double> sorted_unique(std::vector<double> times, const double end)
    {
      std::sort(times.begin(), times.end());
      std::vector<double> unique;
      for (const double t : times)
        if (t > 0 && (unique.empty() || t - unique.back() > 1e-12 * end))
          unique.push_back(t);
      return unique;
    }
  } // namespace

  /// Output times: listed times, multiples of fields_every, and the end, sorted and unique.
  std::vector<double> output_schedule(const CaseDescription &c)
  {
    std::vector<double> times = c.output.times;
    if (c.output.fields_every > 0)
      for (double t = c.output.fields_every; t < c.time.end * (1 - 1e-12); t += c.output.fields_every)
        times.push_back(t);
    times.push_back(c.time.end);
    return sorted_unique(std::move(times), c.time.end);
  }

  /// Times a step must land on: output times, stage ends and the times of results through faces.
  std::vector<double> hard_times(const CaseDescription &c, const std::vector<double> &outputs)
  {
    std::vector<double> times = outputs;
    for (const auto &stage : c.stages)
      times.push_back(stage.end());
    // A rate or an amount through a face asked at a time is read there, not interpolated.
    for (const auto &face : c.output.face_results)
      if (face.time > 0)
        times.push_back(face.time);
    return sorted_unique(std::move(times), c.time.end);
  }
} // namespace fickcast
