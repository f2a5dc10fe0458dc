// Field values at points at any time of a run: at a stored state, or interpolated in time
// between the two stored states around it.
#pragma once

#include "field_sampler.h"
#include "field_series.h"

#include <limits>
#include <map>
#include <string>
#include <vector>

namespace fickcast::post
{
  /// The samples at one requested time.
  struct TimedSamples
  {
    double time = 0;
    Samples samples;
    bool interpolated = false; ///< false: a stored state
    double before = 0;         ///< the stored times around it (interpolated only)
    double after = 0;
    double third = std::numeric_limits<double>::quiet_NaN(); ///< the third state of the estimate
    /// Largest difference between the linear interpolation and the quadratic one through a third
    /// stored state, over points and fields: an estimate of the interpolation error (NaN with
    /// only two stored states).
    double difference = std::numeric_limits<double>::quiet_NaN();
    double largest = 0; ///< largest magnitude of the values of the two states around it
  };

  /**
   * The times @p spec names: `all` (every stored state), `last`, or a list of times with units
   * (`5 yr, 12.5 yr`; a bare number is seconds and adds a line to @p notes saying so), each from
   * the first to the last stored state. PostInputError naming the PVD file otherwise.
   */
  std::vector<double> requested_times(const FieldSeries &series, const std::string &spec,
                                      std::vector<std::string> &notes);

  /**
   * Samples @p fields at @p points at any time within the stored states. At a stored state
   * (within 1e-6 of the last time) the values are that state's; between two states, the linear
   * interpolation in time of the values sampled in each (the meshes may differ), with the
   * quadratic through a third state as an error estimate. Each state is loaded once.
   */
  class TimedSampler
  {
  public:
    TimedSampler(const FieldSeries &series, std::vector<Point> points, std::vector<std::string> fields,
                 unsigned int dimension, unsigned int degree);

    TimedSamples at(double time);

  private:
    const Samples &stored(std::size_t index);

    const FieldSeries &series_;
    std::vector<Point> points_;
    std::vector<std::string> fields_;
    unsigned int dimension_;
    unsigned int degree_;
    std::map<std::size_t, Samples> cache_;
  };
} // namespace fickcast::post
