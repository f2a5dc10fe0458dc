#include "run_plots.h"

#include "field_map_plots.h"

#include "field_sampler.h"
#include "output_file.h"
#include "plot_marks.h"
#include "time_units.h"
#include "timed_samples.h"

#include <algorithm>
#include <cmath>
#include <cstdlib>
#include <limits>
#include <map>
#include <set>

namespace fickcast::post
{
  namespace
  {
    constexpr double nan = std::numeric_limits<double>::quiet_NaN();

    std::string bracket(const std::string &unit)
    {
      return unit.empty() || unit == "1" ? "" : " [" + unit + "]";
    }

    std::vector<double> scaled(const std::vector<double> &values, const double divisor)
    {
      std::vector<double> out(values.size());
      for (std::size_t i = 0; i < values.size(); ++i)
        out[i] = values[i] / divisor;
      return out;
    }

    bool has_finite(const std::vector<double> &values, const bool nonzero = false)
    {
      for (const double v : values)
        if (std::isfinite(v) && (!nonzero || v != 0))
          return true;
      return false;
    }

    struct Context
    {
      const ResultsFolder &results;
      const std::string &folder;
      const RunPlotOptions &options;
      std::vector<PlotFile> &written;
      TimeUnit time_unit;
      DisplayUnit concentration;

      void emit(const PlotSpec &spec, const std::string &stem, const std::string &caption)
      {
        PlotSpec named = spec;
        named.subject = results.summary.title;
        if (write_plot(named, folder + "/" + stem, options.formats))
          written.push_back({stem, spec.title, caption});
      }

      /// Number densities (dopants) span decades: their profiles are drawn on a logarithmic axis,
      /// as the trade draws them.
      bool log_profiles() const { return results.summary.unit_concentration == "1/m3" || partition_jump(); }

      /// Partition coefficients of the regions more than ten times apart: the concentration jumps
      /// by that factor at their interfaces, and a linear axis would flatten the low side.
      bool partition_jump() const
      {
        double low = 1, high = 1;
        partition_range(low, high);
        return high > 10 * low;
      }

      /// Some region has a partition coefficient other than 1: its phase concentration differs
      /// from the reference phase's.
      bool any_partition() const
      {
        double low = 1, high = 1;
        partition_range(low, high);
        return low != 1 || high != 1;
      }

      void partition_range(double &low, double &high) const
      {
        for (const auto &s : results.summary.settings)
          {
            const std::string suffix = ".partition";
            if (s.key.rfind("region.", 0) != 0 || s.key.size() <= suffix.size() ||
                s.key.compare(s.key.size() - suffix.size(), suffix.size(), suffix) != 0)
              continue;
            const double k = std::strtod(s.si.c_str(), nullptr);
            if (k > 0)
              {
                low = std::min(low, k);
                high = std::max(high, k);
              }
          }
      }

      /// What a profile caption says of a logarithmic axis chosen for a partition jump.
      std::string log_note() const
      {
        return partition_jump() && results.summary.unit_concentration != "1/m3"
                 ? " Logarithmic axis: the regions' partition coefficients differ more than tenfold, so the "
                   "concentration jumps by that factor at their interfaces."
                 : "";
      }

      /// Marks on a 1-D depth profile (x in units of @p length): the layer interfaces and, for the
      /// phase concentration, each depth.NAME level with its crossings at the @p times drawn.
      /// Returns what the caption should add.
      std::string mark_profile(PlotSpec &spec, const DisplayUnit &length, const std::vector<double> &times,
                               const bool levels, const double origin = 0) const
      {
        const RunSummary &summary = results.summary;
        std::string caption;
        std::vector<double> positions;
        std::string between;
        for (const auto &interface : layer_interfaces(summary))
          {
            positions.push_back((interface.position - origin) / length.si_per_unit);
            between += (between.empty() ? "" : ", ") + interface.between;
          }
        double x_low = 0, x_high = 0;
        bool any = false;
        for (const auto &curve : spec.curves)
          for (const double x : curve.x)
            if (std::isfinite(x))
              {
                x_low = any ? std::min(x_low, x) : x;
                x_high = any ? std::max(x_high, x) : x;
                any = true;
              }
        if (!positions.empty())
          {
            add_vertical_marks(spec, positions, "interface" + std::string(positions.size() > 1 ? "s " : " ") + between);
            caption += " Grey vertical lines: the layer interfaces.";
          }
        if (!levels || !any)
          return caption;
        const Json::Value &all = summary.results;
        for (const auto &name : all.getMemberNames())
          {
            const Json::Value &d = all[name];
            if (name.rfind("depth.", 0) != 0 || !d.isObject() || !d["level"].isNumeric())
              continue;
            const double level = d["level"].asDouble() / concentration.si_per_unit;
            PlotCurve line{
              name + " level " + format_number(level) + " " + concentration.symbol, {x_low, x_high}, {level, level}};
            line.reference = true;
            spec.curves.push_back(line);
            PlotCurve crossings{name + " at the times drawn", {}, {}};
            crossings.markers_only = true;
            if (summary.coordinates == "cartesian")
              for (Json::ArrayIndex i = 0; i < d["times"].size() && i < d["depths"].size(); ++i)
                {
                  const double t = d["times"][i].asDouble(), depth = d["depths"][i].asDouble();
                  const bool drawn = std::any_of(times.begin(), times.end(), [&](const double shown) {
                    return std::abs(shown - t) <= 1e-9 * std::max(std::abs(t), 1.0);
                  });
                  if (drawn && t > 0 && d["depths"][i].isNumeric() && std::isfinite(depth))
                    {
                      crossings.x.push_back((depth - origin) / length.si_per_unit);
                      crossings.y.push_back(level);
                    }
                }
            if (!crossings.x.empty())
              spec.curves.push_back(crossings);
            caption += " The dashed level of " + name + " and, marked, its depth at the times drawn.";
          }
        return caption;
      }

      /// Time axis values and label (plain or square root of time).
      std::pair<std::vector<double>, std::string> time_axis(const bool root) const
      {
        std::vector<double> t = scaled(results.series.numbers("time"), time_unit.seconds);
        if (!root)
          return {t, "time [" + time_unit.symbol + "]"};
        for (double &v : t)
          v = std::sqrt(std::max(v, 0.0));
        return {t, "square root of time, √t [" + time_unit.symbol + "#u1/2#d]"};
      }
    };

    void profiles_from_table(Context &context)
    {
      const CsvTable &table = *context.results.profiles;
      const auto time = table.numbers("time"), distance = table.numbers("distance"),
                 value = table.numbers("concentration");
      const std::vector<double> x = table.has("x") ? table.numbers("x") : std::vector<double>{};
      const std::size_t line_column = table.require("line");
      std::vector<std::string> lines;
      for (const auto &row : table.rows())
        if (std::find(lines.begin(), lines.end(), row[line_column]) == lines.end())
          lines.push_back(row[line_column]);
      for (const auto &line : lines)
        {
          std::vector<double> times;
          double span = 0;
          for (std::size_t r = 0; r < table.n_rows(); ++r)
            if (table.rows()[r][line_column] == line)
              {
                if (std::find(times.begin(), times.end(), time[r]) == times.end())
                  times.push_back(time[r]);
                span = std::max(span, std::abs(distance[r]));
              }
          const DisplayUnit length = length_display(span);
          PlotSpec spec;
          spec.title = "Concentration along line " + line;
          spec.x_label = "distance along the line" + bracket(length.symbol);
          spec.y_label = "concentration" + bracket(context.concentration.symbol);
          spec.log_y = context.log_profiles();
          std::vector<double> drawn;
          double origin = nan, direction = 1;
          for (const std::size_t k : spread_indices(times.size(), context.options.max_times))
            {
              PlotCurve curve;
              curve.label = "t = " + format_time(times[k]);
              drawn.push_back(times[k]);
              for (std::size_t r = 0; r < table.n_rows(); ++r)
                if (table.rows()[r][line_column] == line && time[r] == times[k])
                  {
                    curve.x.push_back(distance[r] / length.si_per_unit);
                    curve.y.push_back(value[r] / context.concentration.si_per_unit);
                    if (std::isnan(origin) && x.size() == time.size())
                      origin = x[r];
                    if (x.size() == time.size() && distance[r] > 0)
                      direction = x[r] >= origin ? 1 : -1;
                  }
              spec.curves.push_back(curve);
            }
          // A 1-D line that runs down from its start: interfaces and depth levels at their distance.
          std::string marks;
          if (context.results.summary.dimension == 1 && std::isfinite(origin) && direction > 0)
            marks = context.mark_profile(spec, length, drawn, origin == 0, origin);
          context.emit(spec, "profile_" + line,
                       "Concentration (in each region's own phase) along sampling line " + line +
                         " at output times, from profiles.csv." + context.log_note() + marks);
        }
    }

    void profiles_from_fields(Context &context, const std::string &field = "concentration")
    {
      const FieldSeries &series = *context.results.fields;
      const RunSummary &summary = context.results.summary;
      const auto first = series.load(0);
      double bounds[6];
      first->GetBounds(bounds);
      const unsigned int axis = summary.dimension - 1;
      Point from{0.5 * (bounds[0] + bounds[1]), 0.5 * (bounds[2] + bounds[3]), 0.5 * (bounds[4] + bounds[5])};
      if (summary.coordinates == "axisymmetric")
        from[0] = bounds[0];
      Point to = from;
      from[axis] = bounds[2 * axis];
      to[axis] = bounds[2 * axis + 1];
      const DisplayUnit length = length_display(to[axis] - from[axis]);
      const char *names[3] = {"x", "y", "z"};
      const bool radial = summary.coordinates == "cylinder" || summary.coordinates == "sphere";
      const bool reference = field == "reference_concentration";
      PlotSpec spec;
      spec.title = reference ? "Reference-phase concentration profiles" : "Concentration profiles through the mesh";
      std::string where;
      if (summary.dimension == 1)
        spec.x_label =
          radial ? "radius r" + bracket(length.symbol) : "depth from the top face x" + bracket(length.symbol);
      else
        {
          spec.x_label =
            std::string(summary.coordinates == "axisymmetric" ? "z" : names[axis]) + bracket(length.symbol);
          for (unsigned int d = 0; d < summary.dimension; ++d)
            if (d != axis)
              where += std::string(where.empty() ? "" : ", ") +
                       (summary.coordinates == "axisymmetric" ? "r" : names[d]) + " = " +
                       format_number(from[d] / length.si_per_unit) + " " + length.symbol;
          spec.title += " (" + where + ")";
        }
      spec.y_label =
        (reference ? "reference-phase concentration" : "concentration") + bracket(context.concentration.symbol);
      spec.log_y = reference ? summary.unit_concentration == "1/m3" : context.log_profiles();
      std::vector<double> drawn;
      const auto points = line_points(from, to, context.options.n_samples);
      for (const std::size_t k : spread_indices(series.times().size(), context.options.max_times))
        {
          const auto grid = k == 0 ? first : series.load(k);
          const Samples samples =
            sample_fields(grid, points, {field}, summary.dimension, summary.degree, series.times()[k].file);
          drawn.push_back(series.times()[k].time);
          PlotCurve curve;
          curve.label = "t = " + format_time(series.times()[k].time);
          for (std::size_t i = 0; i < points.size(); ++i)
            {
              curve.x.push_back(points[i][axis] / length.si_per_unit);
              curve.y.push_back(samples.values[0][i] / context.concentration.si_per_unit);
            }
          spec.curves.push_back(curve);
        }
      const std::string marks =
        summary.dimension == 1 ? context.mark_profile(spec, length, drawn, !reference && !radial) : std::string();
      if (reference)
        context.emit(spec, "profile_reference",
                     "Concentration in the reference phase (each region's own concentration divided by its "
                     "partition coefficient), continuous across interfaces where the partitions make the phase "
                     "concentration jump, sampled from the written fields along the " +
                       std::string(summary.dimension == 1 ? "mesh" : "line " + where) + " at output times." + marks);
      else
        context.emit(spec, "profile_fields",
                     "Concentration (in each region's own phase) sampled from the written fields along the " +
                       std::string(summary.dimension == 1 ? "mesh" : "line " + where) +
                       " at output times (linear between the nodes of each cell's output patch)." + context.log_note() +
                       marks);
    }

    void point_histories(Context &context)
    {
      const CsvTable &series = context.results.series;
      const auto [t, label] = context.time_axis(false);
      PlotSpec spec;
      spec.title = "Point histories";
      spec.x_label = label;
      spec.y_label = "concentration" + bracket(context.concentration.symbol);
      for (std::size_t c = 0; c < series.names().size(); ++c)
        if (series.names()[c].rfind("point.", 0) == 0)
          {
            const std::string name = series.names()[c].substr(6);
            spec.curves.push_back({"point " + name, t, scaled(series.numbers(c), context.concentration.si_per_unit)});
            const Json::Value &threshold = context.results.summary.results["threshold." + name];
            if (threshold.isObject() && threshold["level"].isNumeric())
              {
                const double level = threshold["level"].asDouble() / context.concentration.si_per_unit;
                PlotCurve line{"threshold " + name + " = " + format_number(level) + " " + context.concentration.symbol,
                               {t.front(), t.back()},
                               {level, level}};
                line.reference = true;
                spec.curves.push_back(line);
                if (threshold["value"].isNumeric() && std::isfinite(threshold["value"].asDouble()))
                  {
                    const double when = threshold["value"].asDouble() / context.time_unit.seconds;
                    PlotCurve crossing{"threshold." + name + " reached at " +
                                         format_time(threshold["value"].asDouble()),
                                       {when},
                                       {level}};
                    crossing.markers_only = true;
                    spec.curves.push_back(crossing);
                  }
              }
          }
      const bool stages = add_stage_marks(spec, context.results.summary, context.time_unit.seconds);
      context.emit(spec, "points",
                   "Concentration at each named point against time, from series.csv; dashed grey "
                   "lines are the threshold levels of summary.json, a mark where each is reached" +
                     std::string(stages ? " and the vertical ones the stage changes." : "."));
    }

    void release(Context &context, const bool root)
    {
      const CsvTable &series = context.results.series;
      // A release, or an uptake (case/content_fraction.h in the solver): the column says which.
      const bool uptake = series.has("uptake_fraction");
      const std::string column = uptake ? "uptake_fraction" : "released_fraction";
      if (!series.has(column))
        return;
      const auto fraction = series.numbers(column);
      if (!has_finite(fraction, true))
        return;
      const auto [t, label] = context.time_axis(root);
      const std::string what = uptake ? "uptake fraction" : "released fraction";
      PlotSpec spec;
      spec.title = std::string(uptake ? "Uptake fraction" : "Released fraction") +
                   (root ? " against the square root of time" : "");
      spec.x_label = label;
      spec.y_label = what + " [%]";
      spec.curves.push_back({what, t, scaled(fraction, 0.01)});
      for (const auto &name : context.results.summary.results.getMemberNames())
        if (name.rfind(uptake ? "uptake." : "release.", 0) == 0)
          {
            const Json::Value &event = context.results.summary.results[name];
            if (event["level"].isNumeric())
              {
                const double level = 100 * event["level"].asDouble();
                PlotCurve line{name + " = " + format_number(level) + " %", {t.front(), t.back()}, {level, level}};
                line.reference = true;
                spec.curves.push_back(line);
              }
          }
      const bool stages = !root && add_stage_marks(spec, context.results.summary, context.time_unit.seconds);
      context.emit(spec, column + (root ? "_sqrt" : ""),
                   (uptake ? "Fraction of the equilibrium uptake that has entered the body, from series.csv"
                           : "Fraction of the reference content that has left the body, from series.csv") +
                     std::string(root ? "; against the square root of time, where the early part for a slab is a "
                                        "straight line."
                                      : ".") +
                     (stages ? " Grey vertical lines: the stage changes." : ""));
    }

    void amounts(Context &context, const bool root)
    {
      const CsvTable &series = context.results.series;
      const auto [t, label] = context.time_axis(root);
      PlotSpec spec;
      spec.title = std::string("Amounts") + (root ? " against the square root of time" : " against time");
      spec.x_label = label;
      const std::string unit = context.results.summary.unit_amount;
      spec.y_label = "amount" + bracket(unit);
      for (std::size_t c = 0; c < series.names().size(); ++c)
        {
          const std::string &name = series.names()[c];
          std::string text;
          if (name == "amount.total")
            text = "in the body, total";
          else if (name.rfind("amount.", 0) == 0)
            text = "in " + name.substr(7);
          else if (name.rfind("amount_in.", 0) == 0)
            text = "entered through " + name.substr(10);
          else if (name == "undissolved.total" || name == "decayed.total" || name == "source.total")
            text = name.substr(0, name.find('.'));
          else
            continue;
          const auto values = series.numbers(c);
          if (has_finite(values, true))
            spec.curves.push_back({text, t, values});
        }
      const bool stages = !root && add_stage_marks(spec, context.results.summary, context.time_unit.seconds);
      context.emit(spec, root ? "amounts_sqrt" : "amounts",
                   "Amounts in the body and per region, and cumulative amounts entered through each face (inward "
                   "positive), from series.csv, in " +
                     unit + "." + (stages ? " Grey vertical lines: the stage changes." : ""));
    }

    /// One plot per open face: the rate through it (inward positive) against time, in the amount
    /// unit per displayed time unit, with the limits and the peak the case asked of that face.
    void face_fluxes(Context &context)
    {
      const CsvTable &series = context.results.series;
      const auto [t, label] = context.time_axis(false);
      const Json::Value &results = context.results.summary.results;
      const std::string unit = context.results.summary.unit_amount + "/" + context.time_unit.symbol;
      for (std::size_t c = 0; c < series.names().size(); ++c)
        {
          const std::string &name = series.names()[c];
          if (name.rfind("flux_in.", 0) != 0)
            continue;
          const std::string face = name.substr(8);
          std::vector<double> rate = series.numbers(c);
          for (double &v : rate)
            v *= context.time_unit.seconds;
          if (!has_finite(rate, false))
            continue;
          PlotSpec spec;
          spec.title = "Rate through " + face;
          spec.x_label = label;
          spec.y_label = "rate in through " + face + bracket(unit);
          spec.curves.push_back({"into the body (out is negative)", t, rate});
          // A held face's rate falls as 1/sqrt(t) from a singular start: where the rate in its
          // main direction (that of the net amount crossed) spans more than a decade, a
          // logarithmic axis of its size (the few steps against it, start-up wiggles, left out).
          double net = 0, largest = 0, at_end = 0;
          for (std::size_t i = 1; i < rate.size() && i < t.size(); ++i)
            if (std::isfinite(rate[i]) && std::isfinite(rate[i - 1]))
              net += 0.5 * (rate[i] + rate[i - 1]) * (t[i] - t[i - 1]);
          const bool inward = net > 0, outward = net < 0;
          // The singular start (the first thousandth of the run) would set the axis alone.
          const double from = t.empty() ? 0 : 1e-3 * t.back();
          for (std::size_t i = 0; i < rate.size() && i < t.size(); ++i)
            if (const double v = rate[i]; std::isfinite(v) && (inward ? v > 0 : v < 0) && t[i] >= from)
              {
                largest = std::max(largest, std::abs(v));
                at_end = std::abs(v);
              }
          if (largest > 0 && (inward || outward) && largest > 10 * at_end)
            {
              spec.log_y = true;
              auto &y = spec.curves.back().y;
              for (std::size_t i = 0; i < y.size(); ++i)
                y[i] = (inward ? y[i] > 0 : y[i] < 0) && t[i] >= from ? std::abs(y[i]) : std::nan("");
              spec.curves.back().label = inward ? "into the body" : "out of the body";
              spec.y_label = "rate " + std::string(inward ? "in" : "out") + " through " + face + bracket(unit);
            }
          for (const auto &result : results.getMemberNames())
            {
              const Json::Value &r = results[result];
              if (!r.isObject() || r["boundary"].asString() != face)
                continue;
              const double sign = r["direction"].asString() == "out" ? -1.0 : 1.0;
              if (result.rfind("flux_limit.", 0) == 0 && r["limit"]["value"].isNumeric())
                {
                  const double level = sign * r["limit"]["value"].asDouble() * context.time_unit.seconds;
                  PlotCurve line{result + " (limit)", {t.front(), t.back()}, {level, level}};
                  line.reference = true;
                  spec.curves.push_back(line);
                }
              if (result.rfind("peak_flux.", 0) == 0 && result.find(".time") == std::string::npos &&
                  r["value"].isNumeric() && results.isMember(result + ".time") &&
                  results[result + ".time"]["value"].isNumeric())
                {
                  PlotCurve peak{result,
                                 {results[result + ".time"]["value"].asDouble() / context.time_unit.seconds},
                                 {sign * r["value"].asDouble() * context.time_unit.seconds}};
                  peak.markers_only = true;
                  spec.curves.push_back(peak);
                }
            }
          const bool stages = add_stage_marks(spec, context.results.summary, context.time_unit.seconds);
          context.emit(spec, "rate_" + face,
                       "Rate at which the species crosses " + face +
                         " (into the body positive, out of it negative), "
                         "from series.csv, in " +
                         unit +
                         "; the amount crossed so far is in the amounts plot. Grey "
                         "lines: rate limits asked of this face; a mark: its largest rate." +
                         std::string(spec.log_y ? " Logarithmic axis: the rate falls by more than tenfold "
                                                  "over the run (drawn from the first thousandth of it on)."
                                                : "") +
                         (stages ? " Grey vertical lines: the stage changes." : ""));
        }
    }

    void depths(Context &context)
    {
      const Json::Value &results = context.results.summary.results;
      for (const auto &name : results.getMemberNames())
        if (name.rfind("depth.", 0) == 0 && results[name]["times"].isArray())
          {
            const Json::Value &d = results[name];
            std::vector<double> t, depth;
            double span = 0;
            for (Json::ArrayIndex i = 0; i < d["times"].size() && i < d["depths"].size(); ++i)
              {
                t.push_back(d["times"][i].asDouble() / context.time_unit.seconds);
                depth.push_back(d["depths"][i].isNumeric() ? d["depths"][i].asDouble() : nan);
                if (std::isfinite(depth.back()))
                  span = std::max(span, std::abs(depth.back()));
              }
            const DisplayUnit length = length_display(span);
            PlotSpec spec;
            const double level = d["level"].asDouble() / context.concentration.si_per_unit;
            spec.title = "Depth of the " + format_number(level) + " " + context.concentration.symbol + " level";
            spec.x_label = "time [" + context.time_unit.symbol + "]";
            spec.y_label = "depth" + bracket(length.symbol);
            spec.curves.push_back({name, t, scaled(depth, length.si_per_unit)});
            spec.downward = true;
            // The layer interfaces the front has reached, as horizontal lines.
            std::string crossed;
            for (const auto &interface : layer_interfaces(context.results.summary))
              if (interface.position <= span && !t.empty())
                {
                  const double y = interface.position / length.si_per_unit;
                  PlotCurve line{"interface " + interface.between, {t.front(), t.back()}, {y, y}};
                  line.reference = true;
                  spec.curves.push_back(line);
                  crossed = " Grey horizontal lines: the layer interfaces it has reached.";
                }
            const bool stages = add_stage_marks(spec, context.results.summary, context.time_unit.seconds);
            context.emit(spec, "depth_" + name.substr(6),
                         "Depth where the concentration falls below " + format_number(level) + " " +
                           context.concentration.symbol +
                           " at each output time, from summary.json; depth grows downward, as in a section." + crossed +
                           (stages ? " Grey vertical lines: the stage changes." : ""));
          }
    }
  } // namespace

  std::vector<std::size_t> spread_indices(const std::size_t count, const std::size_t n)
  {
    std::vector<std::size_t> indices;
    if (count == 0 || n == 0)
      return indices;
    if (count <= n)
      {
        for (std::size_t i = 0; i < count; ++i)
          indices.push_back(i);
        return indices;
      }
    std::set<std::size_t> chosen;
    for (std::size_t i = 0; i < n; ++i)
      chosen.insert(n == 1 ? count - 1 : static_cast<std::size_t>(std::lround(i * (count - 1.0) / (n - 1.0))));
    return {chosen.begin(), chosen.end()};
  }

  std::vector<PlotFile> make_run_plots(const ResultsFolder &results, const std::string &folder,
                                       const RunPlotOptions &options)
  {
    if (!options.map_times.empty() && results.fields)
      {
        std::vector<std::string> notes;
        requested_times(*results.fields, options.map_times, notes); // PostInputError before anything is written
      }
    make_folder(folder);
    std::vector<PlotFile> written;
    const double span = std::max(results.summary.reached_time, results.summary.end_time);
    Context context{
      results, folder, options, written, readable_time_unit(span), concentration_display(results.summary)};
    if (results.profiles && results.profiles->n_rows() > 0)
      profiles_from_table(context);
    else if (results.fields)
      profiles_from_fields(context);
    if (results.fields && context.any_partition())
      profiles_from_fields(context, "reference_concentration");
    point_histories(context);
    depths(context);
    release(context, false);
    amounts(context, false);
    face_fluxes(context);
    write_field_maps(results, folder, options, context.concentration, context.log_profiles(), written);
    if (options.sqrt_time)
      {
        release(context, true);
        amounts(context, true);
      }
    return written;
  }
} // namespace fickcast::post
