#include "run/series_layout.h"

#include <algorithm>

namespace fickcast
{
  SeriesLayout series_layout(const CaseDescription &c, const std::vector<std::string> &regions,
                             const std::vector<std::string> &boundaries, const bool dispersed, const bool nonlinear)
  {
    SeriesLayout layout;
    const std::size_t n_boundaries = boundaries.size();
    layout.active_boundary.assign(n_boundaries, false);
    layout.bath_boundary.assign(n_boundaries, false);
    for (const auto &stage : c.stages)
      for (std::size_t b = 0; b < n_boundaries; ++b)
        {
          const BoundarySpec *spec = stage.find_boundary(boundaries[b]);
          if (spec && spec->kind != BoundaryKind::sealed)
            layout.active_boundary[b] = true;
          if (spec && spec->kind == BoundaryKind::bath)
            layout.bath_boundary[b] = true;
        }
    for (const auto &r : c.regions)
      {
        layout.has_source = layout.has_source || !(r.source.is_constant() && r.source.value == 0);
        layout.has_decay = layout.has_decay || r.decay_rate > 0;
      }

    const std::string amount_unit = c.units.amount;
    const std::string rate_unit = c.units.amount + "/s";
    auto &columns = layout.columns;
    columns = {{"time", "s"}, {"step", ""}, {"dt", "s"}};
    if (c.stages.size() > 1)
      columns.push_back({"stage", ""});
    if (!c.temperature.empty())
      columns.push_back({"temperature", "K"});
    columns.push_back({"amount.total", amount_unit});
    for (const auto &r : regions)
      columns.push_back({"amount." + r, amount_unit});
    if (dispersed)
      columns.push_back({"undissolved.total", amount_unit});
    for (std::size_t b = 0; b < n_boundaries; ++b)
      if (layout.active_boundary[b])
        {
          columns.push_back({"flux_in." + boundaries[b], rate_unit});
          columns.push_back({"amount_in." + boundaries[b], amount_unit});
        }
    // With water flow: each face's inward rate split into the part the water carries and the
    // part dispersion and diffusion carry (run/flow_report.h).
    const bool flow = std::any_of(c.regions.begin(), c.regions.end(), [](const RegionSpec &r) { return r.has_flow(); });
    for (std::size_t b = 0; b < n_boundaries; ++b)
      if (flow && layout.active_boundary[b])
        {
          columns.push_back({"flux_in_advective." + boundaries[b], rate_unit});
          columns.push_back({"flux_in_dispersive." + boundaries[b], rate_unit});
        }
    for (std::size_t b = 0; b < n_boundaries; ++b)
      if (layout.bath_boundary[b])
        columns.push_back({"bath." + boundaries[b], c.units.concentration});
    if (layout.has_source)
      columns.push_back({"source.total", amount_unit});
    if (layout.has_decay)
      columns.push_back({"decayed.total", amount_unit});
    columns.push_back({"balance_error", amount_unit});
    columns.push_back({c.output.fraction_name(), ""});
    for (const auto &named_point : c.output.points)
      columns.push_back({"point." + named_point.name, c.units.concentration});
    columns.push_back({"linear_iterations", ""});
    if (nonlinear)
      columns.push_back({"nonlinear_iterations", ""});
    return layout;
  }
} // namespace fickcast
