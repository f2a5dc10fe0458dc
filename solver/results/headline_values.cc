#include "results/headline_values.h"

#include <cmath>

namespace fickcast
{
  double final_total_amount(const RunRecord &r)
  {
    double total = r.final_undissolved;
    for (const double amount : r.final_region_amounts)
      total += amount;
    return total;
  }

  std::vector<std::pair<std::string, double>> headline_values(const RunRecord &r)
  {
    std::vector<std::pair<std::string, double>> values{{"amount.final_total", final_total_amount(r)}};
    for (const auto &point : r.points)
      {
        values.emplace_back("point." + point.name + ".final", point.final_value);
        if (std::isfinite(point.threshold))
          values.emplace_back("threshold." + point.name, point.threshold_time);
      }
    if (std::isfinite(r.released_final))
      values.emplace_back(std::string(r.uptake ? "uptake_fraction" : "released_fraction") + ".final", r.released_final);
    for (const auto &release : r.releases)
      values.emplace_back(std::string(r.uptake ? "uptake." : "release.") + release.name, release.time);
    for (const auto &lag : r.time_lags)
      values.emplace_back("time_lag." + lag.name, lag.time_lag);
    for (std::size_t b = 0; b < r.bath_final.size() && b < r.boundaries.size(); ++b)
      if (std::isfinite(r.bath_final[b]))
        values.emplace_back("bath." + r.boundaries[b] + ".final", r.bath_final[b]);
    for (const auto &face : r.face_results)
      {
        values.emplace_back(face.full_name(), face.value);
        if (face.prefix == "peak_flux")
          values.emplace_back(face.full_name() + ".time", face.when);
      }
    for (const auto &depth : r.depths)
      values.emplace_back("depth." + depth.name, depth.depths.empty() ? not_a_number : depth.depths.back());
    return values;
  }
} // namespace fickcast
