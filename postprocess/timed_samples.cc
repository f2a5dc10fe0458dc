#include "timed_samples.h"

#include "csv_table.h"
#include "post_error.h"
#include "time_units.h"

#include <algorithm>
#include <cmath>

namespace fickcast::post
{
  std::vector<double> requested_times(const FieldSeries &series, const std::string &spec,
                                      std::vector<std::string> &notes)
  {
    const auto &stored = series.times();
    std::vector<double> times;
    if (spec == "all")
      {
        for (const auto &state : stored)
          times.push_back(state.time);
        return times;
      }
    if (spec == "last" || spec == "end")
      return {stored.back().time};
    const double first = stored.front().time, last = stored.back().time;
    const double slack = 1e-6 * std::max(std::abs(last), 1e-300);
    for (const auto &item : split_csv_line(spec))
      {
        if (item.empty())
          continue;
        const double t = parse_time(item, "--time");
        if (item.find_first_not_of("0123456789.eE+- ") == std::string::npos)
          notes.push_back("--time " + item + " has no unit: read as " + format_number(t, 10) + " s");
        if (t < first - slack || t > last + slack)
          throw PostInputError(series.pvd_path(),
                               "a time from " + format_time(first) + " to " + format_time(last) +
                                 " (the stored states), `last` or `all`",
                               "'" + item + "' (" + format_time(t) + ")");
        times.push_back(std::clamp(t, first, last));
      }
    if (times.empty())
      throw PostInputError("--time", "a time such as `2 h`, a list `1 h, 2 h`, `last` or `all`", "'" + spec + "'");
    return times;
  }

  TimedSampler::TimedSampler(const FieldSeries &series, std::vector<Point> points, std::vector<std::string> fields,
                             const unsigned int dimension, const unsigned int degree)
    : series_(series)
    , points_(std::move(points))
    , fields_(std::move(fields))
    , dimension_(dimension)
    , degree_(degree)
  {
  }

  const Samples &TimedSampler::stored(const std::size_t index)
  {
    auto it = cache_.find(index);
    if (it == cache_.end())
      {
        const auto grid = series_.load(index);
        it =
          cache_.emplace(index, sample_fields(grid, points_, fields_, dimension_, degree_, series_.times()[index].file))
            .first;
      }
    return it->second;
  }

  TimedSamples TimedSampler::at(const double time)
  {
    TimedSamples result;
    result.time = time;
    const auto &states = series_.times();
    const std::size_t exact = series_.find(time);
    if (exact != FieldSeries::npos)
      {
        result.samples = stored(exact);
        result.time = states[exact].time;
        return result;
      }
    std::size_t after = 1;
    while (after + 1 < states.size() && states[after].time < time)
      ++after;
    const std::size_t before = after - 1;
    const double t0 = states[before].time, t1 = states[after].time;
    const double w = (time - t0) / (t1 - t0);
    const Samples &s0 = stored(before);
    const Samples &s1 = stored(after);
    result.interpolated = true;
    result.before = t0;
    result.after = t1;
    result.samples = s0;
    for (std::size_t c = 0; c < s0.values.size(); ++c)
      for (std::size_t i = 0; i < s0.values[c].size(); ++i)
        {
          result.samples.values[c][i] = (1 - w) * s0.values[c][i] + w * s1.values[c][i];
          result.samples.inside[i] = s0.inside[i] && s1.inside[i];
          for (const double v : {s0.values[c][i], s1.values[c][i]})
            if (std::isfinite(v))
              result.largest = std::max(result.largest, std::abs(v));
        }
    // The third state nearest after (else before) the interval: Lagrange quadratic through all three.
    const std::size_t third = after + 1 < states.size() ? after + 1 : (before > 0 ? before - 1 : FieldSeries::npos);
    if (third != FieldSeries::npos)
      {
        const Samples &s2 = stored(third);
        const double t2 = states[third].time;
        result.third = t2;
        const double l0 = (time - t1) * (time - t2) / ((t0 - t1) * (t0 - t2));
        const double l1 = (time - t0) * (time - t2) / ((t1 - t0) * (t1 - t2));
        const double l2 = (time - t0) * (time - t1) / ((t2 - t0) * (t2 - t1));
        double difference = 0;
        for (std::size_t c = 0; c < s0.values.size(); ++c)
          for (std::size_t i = 0; i < s0.values[c].size(); ++i)
            {
              const double quadratic = l0 * s0.values[c][i] + l1 * s1.values[c][i] + l2 * s2.values[c][i];
              const double d = std::abs(quadratic - result.samples.values[c][i]);
              if (std::isfinite(d))
                difference = std::max(difference, d);
            }
        result.difference = difference;
      }
    return result;
  }
} // namespace fickcast::post
