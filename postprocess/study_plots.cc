#include "study_plots.h"

#include "output_file.h"
#include "time_units.h"

#include <algorithm>
#include <cmath>
#include <map>
#include <numeric>
#include <set>

namespace fickcast::post
{
  namespace
  {
    /// A result column's values for display and its axis label (times in a readable unit).
    struct Shown
    {
      std::vector<double> values;
      std::string label;
      std::string unit;
      double seconds = 0; ///< seconds per display unit, for a time; 0 otherwise
    };

    Shown shown(const StudyTable &study, const std::size_t column)
    {
      Shown s{study.result_values(column), study.table.names()[column], study.table.units()[column]};
      if (s.unit == "s")
        {
          double largest = 0;
          for (const double v : s.values)
            if (std::isfinite(v))
              largest = std::max(largest, std::abs(v));
          const TimeUnit unit = readable_time_unit(largest);
          for (double &v : s.values)
            v /= unit.seconds;
          s.unit = unit.symbol;
          s.seconds = unit.seconds;
        }
      s.label = s.label + (s.unit.empty() ? "" : " [" + s.unit + "]");
      return s;
    }

    /// Ranks of @p v (1-based, ties averaged; NaN entries must be removed before).
    std::vector<double> ranks(const std::vector<double> &v)
    {
      std::vector<std::size_t> order(v.size());
      std::iota(order.begin(), order.end(), 0);
      std::sort(order.begin(), order.end(), [&](std::size_t a, std::size_t b) { return v[a] < v[b]; });
      std::vector<double> r(v.size());
      for (std::size_t i = 0; i < order.size();)
        {
          std::size_t j = i;
          while (j + 1 < order.size() && v[order[j + 1]] == v[order[i]])
            ++j;
          const double mean_rank = 0.5 * static_cast<double>(i + j) + 1;
          for (std::size_t k = i; k <= j; ++k)
            r[order[k]] = mean_rank;
          i = j + 1;
        }
      return r;
    }

    std::string safe(const std::string &name)
    {
      std::string out;
      for (const char c : name)
        out += std::isalnum(static_cast<unsigned char>(c)) || c == '_' || c == '-' ? c : '_';
      return out;
    }
  } // namespace

  double rank_correlation(const std::vector<double> &x, const std::vector<double> &y)
  {
    std::vector<double> a, b;
    for (std::size_t i = 0; i < x.size() && i < y.size(); ++i)
      if (!std::isnan(x[i]) && !std::isnan(y[i]))
        {
          a.push_back(x[i]);
          b.push_back(y[i]);
        }
    if (a.size() < 3)
      return std::nan("");
    const auto ra = ranks(a), rb = ranks(b);
    const double n = static_cast<double>(a.size()), mean = (n + 1) / 2;
    double sab = 0, saa = 0, sbb = 0;
    for (std::size_t i = 0; i < ra.size(); ++i)
      {
        sab += (ra[i] - mean) * (rb[i] - mean);
        saa += (ra[i] - mean) * (ra[i] - mean);
        sbb += (rb[i] - mean) * (rb[i] - mean);
      }
    return saa > 0 && sbb > 0 ? sab / std::sqrt(saa * sbb) : std::nan("");
  }

  std::vector<PlotFile> make_study_plots(const StudyTable &study, const std::string &folder, const bool uncertainty,
                                         const PlotFormats &formats, const std::size_t max_plots,
                                         const std::string &subject, const std::vector<StudyLimitMark> &limits)
  {
    make_folder(folder);
    std::vector<PlotFile> written;
    const auto emit = [&](const PlotSpec &spec, const std::string &stem, const std::string &caption) {
      PlotSpec named = spec;
      named.subject = subject;
      if (written.size() < max_plots && write_plot(named, folder + "/" + stem, formats))
        written.push_back({stem, spec.title, caption});
    };

    std::vector<std::size_t> varied;
    for (const std::size_t p : study.parameters)
      {
        std::set<double> distinct;
        for (const double v : study.parameter_values(p))
          if (std::isfinite(v))
            distinct.insert(v);
        if (distinct.size() > 1)
          varied.push_back(p);
      }

    for (const std::size_t r : study.results)
      {
        const Shown result = shown(study, r);
        if (uncertainty)
          {
            std::vector<double> finite, all; // all: with events not reached (+infinity)
            for (const double v : result.values)
              {
                if (std::isfinite(v))
                  finite.push_back(v);
                if (!std::isnan(v))
                  all.push_back(v);
              }
            const std::size_t not_reached = all.size() - finite.size();
            const std::string beyond = not_reached
                                         ? "; " + std::to_string(not_reached) + " of " + std::to_string(all.size()) +
                                             " cases did not reach it within the simulated time"
                                         : std::string();
            if (finite.size() < 2)
              continue;
            const double lo = *std::min_element(finite.begin(), finite.end());
            const double hi = *std::max_element(finite.begin(), finite.end());
            const std::size_t bins = std::clamp<std::size_t>(
              static_cast<std::size_t>(std::ceil(std::sqrt(static_cast<double>(finite.size())))), 5, 30);
            const double width = hi > lo ? (hi - lo) / static_cast<double>(bins) : 1.0;
            std::vector<double> counts(bins, 0);
            for (const double v : finite)
              counts[std::min(bins - 1, static_cast<std::size_t>((v - lo) / width))] += 1;
            PlotCurve histogram{"cases per bin", {}, {}};
            for (std::size_t b = 0; b < bins; ++b)
              {
                const double left = lo + static_cast<double>(b) * width;
                histogram.x.insert(histogram.x.end(), {left, left, left + width, left + width});
                histogram.y.insert(histogram.y.end(), {0, counts[b], counts[b], 0});
              }
            PlotSpec distribution{"Distribution of " + study.table.names()[r],
                                  result.label,
                                  "number of cases",
                                  {histogram},
                                  false,
                                  {},
                                  false};
            emit(distribution, "distribution_" + safe(study.table.names()[r]),
                 "Histogram of " + study.table.names()[r] + " over the " + std::to_string(finite.size()) +
                   " completed cases where it has a value (" + std::to_string(bins) + " equal bins)" + beyond + ".");

            std::vector<double> levels, probability;
            exceedance_curve(all, levels, probability);
            for (double &p : probability)
              p *= 100;
            PlotSpec exceedance{"Exceedance of " + study.table.names()[r],
                                result.label,
                                "probability of exceeding [%]",
                                {{"cases (Weibull plotting position)", levels, probability}},
                                false,
                                {},
                                false};
            for (const auto &[name, p] : {std::pair<const char *, double>{"P5", 0.05}, {"P50", 0.5}, {"P95", 0.95}})
              {
                const double q = sample_quantile(all, p);
                if (!std::isfinite(q))
                  continue; // beyond the simulated time: no line to draw (the caption says so)
                PlotCurve line{std::string(name) + " = " + format_number(q) +
                                 (result.unit.empty() ? "" : " " + result.unit),
                               {q, q},
                               {0, 100}};
                line.reference = true;
                exceedance.curves.push_back(line);
              }
            std::string limit_text;
            for (const auto &limit : limits)
              if (limit.result == study.table.names()[r])
                {
                  const double x = result.seconds > 0 ? limit.level / result.seconds : limit.level;
                  exceedance.curves.push_back({"limit: " + limit.label, {x, x}, {0, 100}});
                  limit_text += (limit_text.empty() ? " The solid line marks the limit: " : "; ") + limit.label;
                }
            emit(exceedance, "exceedance_" + safe(study.table.names()[r]),
                 "Probability that " + study.table.names()[r] +
                   " exceeds a level: 1 - i/(n+1) at the i-th smallest of n cases; grey lines mark P5, P50 and P95 "
                   "(Hyndman and Fan 1996, definition 7)" +
                   beyond +
                   (not_reached
                      ? ": they exceed every level shown, and percentiles beyond the simulated time have no line"
                      : "") +
                   "." + limit_text + (limit_text.empty() ? "" : "."));

            // Which inputs drive the result: rank correlations, as horizontal bars.
            PlotSpec drivers{"What drives " + study.table.names()[r],
                             "rank correlation with " + study.table.names()[r],
                             "input (see the legend)",
                             {},
                             false,
                             {},
                             false};
            // Largest |correlation| on top, as in a tornado chart.
            std::vector<std::pair<double, std::size_t>> bars;
            for (const std::size_t p : study.parameters)
              {
                const double rho = rank_correlation(study.parameter_values(p), study.result_values(r));
                if (std::isfinite(rho))
                  bars.emplace_back(rho, p);
              }
            std::sort(bars.begin(), bars.end(),
                      [](const auto &a, const auto &b) { return std::abs(a.first) < std::abs(b.first); });
            double row = 1;
            for (const auto &[rho, p] : bars)
              {
                PlotCurve bar{study.table.names()[p] + ": " + format_number(rho, 2),
                              {0, 0, rho, rho, 0},
                              {row - 0.3, row + 0.3, row + 0.3, row - 0.3, row - 0.3}};
                bar.filled = true;
                drivers.curves.push_back(bar);
                row += 1;
              }
            if (!drivers.curves.empty())
              {
                drivers.curves.push_back({"no correlation", {0, 0}, {0.3, row - 0.7}});
                drivers.curves.back().reference = true;
                emit(drivers, "drivers_" + safe(study.table.names()[r]),
                     "Spearman rank correlation of each sampled input with " + study.table.names()[r] +
                       " over the completed cases (events not reached rank last): a bar towards +1 means larger "
                       "values of the input go with larger values of the result, towards -1 with smaller; bars "
                       "near 0 mark inputs that hardly matter here. Correlations, not causes: with few samples "
                       "(under about 30) bars below 0.3 are within chance.");
              }
          }
        // Where an event was not reached, its marks go above the highest reached value.
        double low = INFINITY, high = -INFINITY;
        for (const double v : result.values)
          if (std::isfinite(v))
            {
              low = std::min(low, v);
              high = std::max(high, v);
            }
        const double above = std::isfinite(high) ? high + 0.1 * std::max(high - low, std::abs(high) * 0.1) : 0;
        for (const std::size_t p : varied)
          {
            const auto x = study.parameter_values(p);
            const std::string &pname = study.table.names()[p];
            const std::string punit = study.table.units()[p].empty() ? study.parameter_unit(p) : study.table.units()[p];
            PlotSpec spec{study.table.names()[r] + " against " + pname,
                          pname + (punit.empty() ? "" : " [" + punit + "]"),
                          result.label,
                          {},
                          false,
                          {},
                          false};
            // A grid: one line per combination of the other varied parameters' values.
            std::map<std::string, std::vector<std::size_t>> series;
            for (std::size_t i = 0; i < x.size(); ++i)
              {
                std::string key;
                if (!uncertainty)
                  for (const std::size_t q : varied)
                    if (q != p)
                      {
                        const std::string unit =
                          study.table.units()[q].empty() ? study.parameter_unit(q) : study.table.units()[q];
                        key += (key.empty() ? "" : ", ") + study.table.names()[q] + " = " +
                               format_number(study.parameter_values(q)[i]) + (unit.empty() ? "" : " " + unit);
                      }
                series[key].push_back(i);
              }
            PlotCurve missing{"not reached by the end (drawn above the others)", {}, {}};
            missing.markers_only = true;
            for (auto &[key, cases] : series)
              {
                std::sort(cases.begin(), cases.end(), [&](std::size_t a, std::size_t b) { return x[a] < x[b]; });
                PlotCurve curve{key.empty() ? "cases" : key, {}, {}};
                for (const std::size_t i : cases)
                  {
                    if (std::isinf(result.values[i]))
                      {
                        missing.x.push_back(x[i]);
                        missing.y.push_back(above);
                      }
                    curve.x.push_back(x[i]);
                    curve.y.push_back(std::isfinite(result.values[i]) ? result.values[i] : std::nan(""));
                  }
                curve.markers_only = uncertainty;
                spec.curves.push_back(curve);
              }
            if (!missing.x.empty())
              spec.curves.push_back(missing);
            emit(spec, "result_" + safe(study.table.names()[r]) + "_vs_" + safe(pname),
                 study.table.names()[r] + " of each completed case against " + pname +
                   (series.size() > 1 ? ", one line per value of the other varied parameters" : std::string()) +
                   ", from sweep.csv" +
                   (missing.x.empty() ? std::string(".")
                                      : "; " + std::to_string(missing.x.size()) +
                                          " cases did not reach it within the simulated time and are drawn as "
                                          "separate marks above the highest value reached."));
          }
      }
    return written;
  }
} // namespace fickcast::post
