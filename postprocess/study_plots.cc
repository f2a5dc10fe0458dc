#include "study_plots.h"

#include "output_file.h"
#include "time_units.h"

#include <algorithm>
#include <cmath>
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
        }
      s.label = s.label + (s.unit.empty() ? "" : " [" + s.unit + "]");
      return s;
    }

    std::string safe(const std::string &name)
    {
      std::string out;
      for (const char c : name)
        out += std::isalnum(static_cast<unsigned char>(c)) || c == '_' || c == '-' ? c : '_';
      return out;
    }
  } // namespace

  std::vector<PlotFile> make_study_plots(const StudyTable &study, const std::string &folder, const bool uncertainty,
                                         const PlotFormats &formats, const std::size_t max_plots,
                                         const std::string &subject)
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
            PlotSpec distribution{
              "Distribution of " + study.table.names()[r], result.label, "number of cases", {histogram}};
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
                                {{"cases (Weibull plotting position)", levels, probability}}};
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
            emit(exceedance, "exceedance_" + safe(study.table.names()[r]),
                 "Probability that " + study.table.names()[r] +
                   " exceeds a level: 1 - i/(n+1) at the i-th smallest of n cases; grey lines mark P5, P50 and P95 "
                   "(Hyndman and Fan 1996, definition 7)" +
                   beyond +
                   (not_reached
                      ? ": they exceed every level shown, and percentiles beyond the simulated time have no line"
                      : "") +
                   ".");
          }
        for (const std::size_t p : varied)
          {
            const auto x = study.parameter_values(p);
            std::vector<std::size_t> order(x.size());
            std::iota(order.begin(), order.end(), 0);
            std::sort(order.begin(), order.end(), [&](std::size_t a, std::size_t b) { return x[a] < x[b]; });
            PlotCurve curve{"cases", {}, {}};
            for (const std::size_t i : order)
              {
                curve.x.push_back(x[i]);
                curve.y.push_back(result.values[i]);
              }
            curve.markers_only = uncertainty || varied.size() > 1;
            const std::string &pname = study.table.names()[p];
            const std::string punit = study.table.units()[p].empty() ? study.parameter_unit(p) : study.table.units()[p];
            PlotSpec spec{study.table.names()[r] + " against " + pname,
                          pname + (punit.empty() ? "" : " [" + punit + "]"),
                          result.label,
                          {curve}};
            emit(spec, "result_" + safe(study.table.names()[r]) + "_vs_" + safe(pname),
                 study.table.names()[r] + " of each completed case against " + pname + ", from sweep.csv.");
          }
      }
    return written;
  }
} // namespace fickcast::post
