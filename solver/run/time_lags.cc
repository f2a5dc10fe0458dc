#include "run/time_lags.h"

#include <algorithm>
#include <cmath>

namespace fickcast
{
  std::vector<TimeLagRecord> time_lag_records(const std::vector<std::pair<std::string, std::string>> &specs,
                                              const std::vector<FluxHistory> &histories,
                                              const std::vector<double> &entered, const double t)
  {
    std::vector<TimeLagRecord> records;
    for (std::size_t k = 0; k < specs.size(); ++k)
      {
        TimeLagRecord lag;
        lag.name = specs[k].first;
        lag.boundary = specs[k].second;
        const auto &history_of = histories[k].second;
        const unsigned int b = histories[k].first;
        if (!history_of.empty() && history_of.back().second != 0)
          {
            const double flux = history_of.back().second;
            lag.final_flux = flux;
            lag.time_lag = t - entered[b] / flux;
            const double early = 0.8 * t;
            const auto it =
              std::lower_bound(history_of.begin(), history_of.end(), early,
                               [](const std::pair<double, double> &p, double when) { return p.first < when; });
            lag.steady = it != history_of.end() && std::abs(flux - it->second) <= 1e-3 * std::abs(flux);
          }
        records.push_back(lag);
      }
    return records;
  }
} // namespace fickcast
