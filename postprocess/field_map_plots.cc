#include "field_map_plots.h"

#include "field_map.h"
#include "time_units.h"
#include "timed_samples.h"

#include <algorithm>
#include <cmath>

namespace fickcast::post
{
  namespace
  {
    std::string bracket(const std::string &unit)
    {
      return unit.empty() || unit == "1" ? "" : " [" + unit + "]";
    }

    /// A plane to draw: its two axes (across, down the picture's y) and, in 3-D, the fixed one.
    struct Plane
    {
      unsigned int across = 0;
      unsigned int up = 1;
      int fixed = -1;
      double at = 0;
      bool last_time_only = false;
    };
  } // namespace

  void write_field_maps(const ResultsFolder &results, const std::string &folder, const RunPlotOptions &options,
                        const DisplayUnit &concentration, const bool log_values, std::vector<PlotFile> &written)
  {
    const RunSummary &summary = results.summary;
    const unsigned int dim = summary.dimension;
    if ((dim != 2 && dim != 3) || !results.fields || results.fields->times().empty())
      return;
    const FieldSeries &series = *results.fields;
    double bounds[6];
    series.load(series.times().size() - 1)->GetBounds(bounds);
    std::vector<Plane> planes;
    if (dim == 2)
      planes.push_back({0, 1, -1, 0, false});
    else
      {
        planes.push_back({0, 2, 1, 0.5 * (bounds[2] + bounds[3]), false});
        planes.push_back({1, 2, 0, 0.5 * (bounds[0] + bounds[1]), true});
      }

    std::vector<std::string> notes;
    std::vector<double> times;
    if (!options.map_times.empty())
      times = requested_times(series, options.map_times, notes);
    else
      {
        if (series.times().size() > 2)
          times.push_back(series.times()[series.times().size() / 2].time);
        times.push_back(series.times().back().time);
      }

    const bool axisymmetric = summary.coordinates == "axisymmetric";
    // Built-in layers stack from the top face inward: drawn downward, as a section is.
    const bool layered = std::any_of(summary.settings.begin(), summary.settings.end(),
                                     [](const EchoedSetting &s) { return s.key == "geometry.layers"; });
    const char *names[3] = {"x", "y", "z"};
    const std::size_t longest = 160;
    for (std::size_t p = 0; p < planes.size(); ++p)
      {
        const Plane &plane = planes[p];
        const double wide = bounds[2 * plane.across + 1] - bounds[2 * plane.across],
                     tall = bounds[2 * plane.up + 1] - bounds[2 * plane.up];
        if (!(wide > 0) || !(tall > 0))
          continue;
        const DisplayUnit length = length_display(std::max(wide, tall));
        // At least 40 points across a narrow side (drawn stretched, map_stretch).
        const std::size_t nx =
          std::max<std::size_t>(40, static_cast<std::size_t>(longest * wide / std::max(wide, tall)));
        const std::size_t ny =
          std::max<std::size_t>(40, static_cast<std::size_t>(longest * tall / std::max(wide, tall)));
        FieldMap map;
        for (std::size_t i = 0; i < nx; ++i)
          map.x.push_back((bounds[2 * plane.across] + wide * static_cast<double>(i) / static_cast<double>(nx - 1)) /
                          length.si_per_unit);
        for (std::size_t j = 0; j < ny; ++j)
          map.y.push_back((bounds[2 * plane.up] + tall * static_cast<double>(j) / static_cast<double>(ny - 1)) /
                          length.si_per_unit);
        std::vector<Point> points;
        for (std::size_t i = 0; i < nx; ++i)
          for (std::size_t j = 0; j < ny; ++j)
            {
              Point point{0, 0, 0};
              point[plane.across] = map.x[i] * length.si_per_unit;
              point[plane.up] = map.y[j] * length.si_per_unit;
              if (plane.fixed >= 0)
                point[static_cast<unsigned int>(plane.fixed)] = plane.at;
              points.push_back(point);
            }
        const std::string across = axisymmetric ? "r" : names[plane.across], up = axisymmetric ? "z" : names[plane.up];
        map.downward = layered;
        map.x_label = across + bracket(length.symbol);
        map.y_label = (layered ? "depth " + up + " from the top face" : up) + bracket(length.symbol);
        map.value_label =
          std::string(log_values ? "log#d10#u concentration" : "concentration") + bracket(concentration.symbol);
        map.log_values = log_values;
        map.subject = summary.title;
        const std::string where = plane.fixed < 0
                                    ? std::string()
                                    : " on the plane " + std::string(names[plane.fixed]) + " = " +
                                        format_number(plane.at / length.si_per_unit) + " " + length.symbol;

        TimedSampler sampler(series, points, {"concentration"}, dim, summary.degree);
        for (std::size_t n = 0; n < times.size(); ++n)
          {
            if (plane.last_time_only && n + 1 != times.size())
              continue;
            const TimedSamples at = sampler.at(times[n]);
            map.values = at.samples.values[0];
            for (double &v : map.values)
              v /= concentration.si_per_unit;
            map.title = "Concentration at t = " + format_time(at.time) + where;
            std::string stem = "field_map_" + std::to_string(n);
            if (plane.fixed >= 0)
              stem += std::string("_") + names[plane.fixed];
            std::string interpolated;
            if (at.interpolated)
              interpolated = " Not a stored state: interpolated linearly in time between " + format_time(at.before) +
                             " and " + format_time(at.after) +
                             (std::isfinite(at.difference) && at.largest > 0
                                ? " (the quadratic through a third state differs by up to " +
                                    format_number(100 * at.difference / at.largest, 2) + " % of the largest value)."
                                : ".");
            const double stretch = map_stretch(map);
            const std::string scale =
              stretch == 1 ? std::string(", drawn to scale")
                           : ", drawn with its narrow side stretched " + format_number(stretch, 2) + " times";
            if (write_field_map(map, folder + "/" + stem, options.formats))
              written.push_back(
                {stem, map.title,
                 "Concentration over the " + std::string(plane.fixed < 0 ? "section" : "plane" + where) +
                   " at t = " + format_time(at.time) + ", the finite-element field sampled on a " + std::to_string(nx) +
                   " x " + std::to_string(ny) + " grid, drawn to scale in twelve equal bands" +
                   (log_values ? " of log10 concentration, over six decades below the largest value" : "") +
                   "; white: outside the body" + (log_values ? " or below the lowest band" : "") + "." + interpolated});
          }
      }
  }
} // namespace fickcast::post
