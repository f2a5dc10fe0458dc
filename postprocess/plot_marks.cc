#include "plot_marks.h"

#include "csv_table.h"

#include <cmath>
#include <limits>

namespace fickcast::post
{
  std::vector<LayerInterface> layer_interfaces(const RunSummary &summary)
  {
    std::vector<LayerInterface> interfaces;
    const EchoedSetting *layers = summary.setting("geometry.layers");
    if (summary.dimension != 1 || layers == nullptr || layers->si.empty())
      return interfaces;
    double position = 0;
    if (const EchoedSetting *inner = summary.setting("geometry.inner_radius"))
      {
        double r = 0;
        if (parse_number(inner->si.substr(0, inner->si.find(' ')), r) && std::isfinite(r))
          position = r;
      }
    // The SI echo: `silt 0.4 m, sand 1.6 m`.
    std::string previous;
    for (const auto &item : split_csv_line(layers->si))
      {
        const auto first = item.find(' ');
        if (first == std::string::npos)
          return {};
        const std::string name = item.substr(0, first);
        std::string rest = item.substr(first + 1);
        double thickness = 0;
        if (!parse_number(rest.substr(0, rest.find(' ')), thickness) || !(thickness > 0))
          return {};
        if (!previous.empty() && name != previous)
          interfaces.push_back({position, previous + " | " + name});
        previous = name;
        position += thickness;
      }
    return interfaces;
  }

  bool value_extent(const PlotSpec &spec, double &low, double &high)
  {
    low = std::numeric_limits<double>::infinity();
    high = -low;
    for (const auto &curve : spec.curves)
      if (!curve.reference)
        for (const double v : curve.y)
          if (std::isfinite(v) && (!spec.log_y || v > 0))
            {
              low = std::min(low, v);
              high = std::max(high, v);
            }
    if (spec.log_y && std::isfinite(high))
      low = std::max(low, high * 1e-6); // the six decades the plot shows
    return std::isfinite(low) && std::isfinite(high);
  }

  void add_vertical_marks(PlotSpec &spec, const std::vector<double> &positions, const std::string &label)
  {
    double low = 0, high = 0;
    if (positions.empty() || !value_extent(spec, low, high))
      return;
    if (low == high)
      {
        low = spec.log_y ? low / 10 : low - 1;
        high = spec.log_y ? high * 10 : high + 1;
      }
    PlotCurve marks;
    marks.label = label;
    marks.reference = true;
    for (const double x : positions)
      {
        if (!marks.x.empty())
          {
            marks.x.push_back(std::nan(""));
            marks.y.push_back(std::nan(""));
          }
        marks.x.insert(marks.x.end(), {x, x});
        marks.y.insert(marks.y.end(), {low, high});
      }
    spec.curves.push_back(marks);
  }

  bool add_stage_marks(PlotSpec &spec, const RunSummary &summary, const double time_unit_seconds)
  {
    if (summary.stages.size() < 2)
      return false;
    std::vector<double> starts;
    std::string names;
    for (std::size_t s = 1; s < summary.stages.size(); ++s)
      {
        starts.push_back(summary.stages[s].start / time_unit_seconds);
        names += (names.empty() ? "" : ", ") + summary.stages[s].name;
      }
    const std::size_t before = spec.curves.size();
    add_vertical_marks(spec, starts, "start of " + (names.size() > 40 ? "each stage" : names));
    return spec.curves.size() > before;
  }
} // namespace fickcast::post
