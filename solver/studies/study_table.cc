// sweep.csv and sweep_summary.json from the case folders of a study.
#include "case/input_error.h"
#include "case/quantity_text.h"
#include "case/units.h"
#include "results/csv_writer.h"
#include "results/json_file.h"
#include "results/summary.h"
#include "studies/case_summary.h"
#include "studies/result_names.h"
#include "studies/study_runner.h"

#include <algorithm>
#include <cmath>
#include <cstdio>
#include <filesystem>
#include <fstream>

namespace fickcast
{
  namespace
  {
    std::string number(const double value)
    {
      if (!std::isfinite(value))
        return "";
      char buffer[32];
      std::snprintf(buffer, sizeof(buffer), "%.12g", value);
      return buffer;
    }

    /// Sample quantile, linear interpolation between order statistics at (n - 1) p (Hyndman &
    /// Fan 1996, definition 7).
    double quantile(std::vector<double> sorted, const double p)
    {
      if (sorted.empty())
        return std::nan("");
      std::sort(sorted.begin(), sorted.end());
      const double h = (sorted.size() - 1) * p;
      const std::size_t low = static_cast<std::size_t>(std::floor(h));
      const std::size_t high = std::min(low + 1, sorted.size() - 1);
      if (std::isinf(sorted[low]) || (h > low && std::isinf(sorted[high])))
        return INFINITY; // among the events not reached
      return sorted[low] + (h - low) * (sorted[high] - sorted[low]);
    }
  } // namespace

  StudyTable tabulate_study(const CaseDescription &base, const std::vector<StudyCase> &cases, const std::string &folder)
  {
    std::vector<CaseSummary> summaries;
    std::vector<std::pair<std::string, std::string>> columns; // result name, unit
    StudyTable table;
    std::map<std::string, unsigned int> &statuses = table.statuses;
    const std::vector<std::string> order = result_order(base);
    for (const auto &c : cases)
      {
        const std::string path = folder + "/cases/" + c.id + "/summary.json";
        CaseSummary s;
        if (std::filesystem::exists(path))
          s = read_case_summary(path, order);
        else
          s.status = "not run";
        for (const auto &r : s.results)
          if (std::none_of(columns.begin(), columns.end(), [&](const auto &col) { return col.first == r.name; }))
            columns.emplace_back(r.name, r.unit);
        ++statuses[s.status];
        summaries.push_back(s);
      }

    const std::string table_path = folder + "/sweep.csv";
    {
      std::ofstream out(table_path + ".partial");
      out << "case";
      if (!cases.empty())
        for (const auto &[key, value] : cases.front().parameters)
          {
            (void)value;
            out << ',' << csv_field(key);
          }
      for (const auto &[name, unit] : columns)
        out << ',' << csv_field(name + (unit.empty() || unit == "1" ? std::string() : " [" + unit + "]"));
      out << ",status,message,wall_time [s]\n";
      for (std::size_t i = 0; i < cases.size(); ++i)
        {
          out << cases[i].id;
          for (const auto &[key, value] : cases[i].parameters)
            {
              (void)key;
              out << ',' << csv_field(value);
            }
          for (const auto &[name, unit] : columns)
            {
              (void)unit;
              const NamedResult *r = summaries[i].find(name);
              out << ',' << (r ? number(r->value) : std::string());
            }
          out << ',' << csv_field(summaries[i].status) << ',' << csv_field(summaries[i].message) << ','
              << number(summaries[i].wall_time) << '\n';
        }
      if (!out)
        throw IoError("cannot write " + table_path);
    }
    std::filesystem::rename(table_path + ".partial", table_path);

    Json::Value summary(Json::objectValue);
    summary["program"] = "fickcast";
    summary["title"] = base.title;
    summary["kind"] = base.sweep.sample.empty() ? "sweep" : "uncertainty";
    summary["cases"] = static_cast<unsigned long>(cases.size());
    Json::Value counts(Json::objectValue);
    for (const auto &[status, count] : statuses)
      counts[status] = count;
    summary["status_counts"] = counts;
    if (!base.sweep.sample.empty())
      {
        summary["samples"] = base.sweep.samples;
        summary["seed"] = base.sweep.seed;
        summary["sampling"] = "Latin hypercube, one point per stratum, strata paired by random permutations";
        summary["percentiles"] = "linear interpolation between order statistics (Hyndman and Fan 1996, type 7)";
        Json::Value results(Json::objectValue);
        for (const auto &[name, unit] : columns)
          {
            // An event never reached within time.end (threshold, release) counts as later than
            // any time: it enters the percentiles as +infinity and leaves the mean undefined.
            const bool event = is_event_result(name);
            std::vector<double> values;
            std::size_t not_reached = 0;
            for (const auto &s : summaries)
              if (s.status == "completed")
                {
                  const NamedResult *r = s.find(name);
                  const double v = r ? r->value : std::nan("");
                  if (std::isfinite(v))
                    values.push_back(v);
                  else if (event)
                    {
                      values.push_back(INFINITY);
                      ++not_reached;
                    }
                }
            Json::Value entry(Json::objectValue);
            entry["unit"] = unit;
            entry["n"] = static_cast<unsigned long>(values.size());
            if (event)
              entry["not_reached"] = static_cast<unsigned long>(not_reached);
            double mean = 0, square = 0;
            for (const double v : values)
              mean += v;
            mean = values.empty() || not_reached > 0 ? std::nan("") : mean / values.size();
            for (const double v : values)
              square += (v - mean) * (v - mean);
            const double sd =
              values.size() > 1 && not_reached == 0 ? std::sqrt(square / (values.size() - 1)) : std::nan("");
            entry["mean"] = mean;
            entry["standard_deviation"] = sd;
            entry["standard_error_of_mean"] = values.empty() ? std::nan("") : sd / std::sqrt(values.size());
            const auto percentile = [&values](const double p) {
              const double q = quantile(values, p);
              return std::isinf(q) ? Json::Value("not reached within time.end") : Json::Value(q);
            };
            entry["p5"] = percentile(0.05);
            entry["p50"] = percentile(0.5);
            entry["p95"] = percentile(0.95);
            ResultStatistics statistics{name,
                                        unit,
                                        values.size(),
                                        mean,
                                        sd,
                                        values.empty() ? std::nan("") : sd / std::sqrt(values.size()),
                                        quantile(values, 0.05),
                                        quantile(values, 0.5),
                                        quantile(values, 0.95),
                                        not_reached,
                                        {}};
            for (const auto &limit : base.sweep.limits)
              {
                if (limit.result != name)
                  continue;
                double level = 0;
                try
                  {
                    const QuantityText q = split_quantity(limit.level, false);
                    level = q.unit.empty() ? q.number : UnitSystem::instance().to_si(q.number, q.unit, unit);
                  }
                catch (const UnitError &error)
                  {
                    throw InputError(limit.origin, std::string("sweep.") + (limit.above ? "exceed." : "below.") + name,
                                     error.what());
                  }
                // An event never reached (threshold, release) counts as later than any limit.
                std::size_t crossing = 0, counted = 0;
                for (const auto &s : summaries)
                  {
                    if (s.status != "completed")
                      continue;
                    const NamedResult *r = s.find(name);
                    double v = r ? r->value : std::nan("");
                    if (!std::isfinite(v) && event)
                      v = INFINITY;
                    if (std::isnan(v))
                      continue;
                    ++counted;
                    crossing += limit.above ? (v > level ? 1 : 0) : (v < level ? 1 : 0);
                  }
                const double p = counted == 0 ? std::nan("") : static_cast<double>(crossing) / counted;
                Json::Value probability(Json::objectValue);
                probability["level"] = level;
                probability["n"] = static_cast<unsigned long>(counted);
                probability["probability"] = p;
                probability["standard_error"] = counted == 0 ? std::nan("") : std::sqrt(p * (1 - p) / counted);
                statistics.limits.push_back(
                  LimitProbability{limit.level, limit.above, level, counted, p,
                                   counted == 0 ? std::nan("") : std::sqrt(p * (1 - p) / counted)});
                entry[std::string(limit.above ? "probability_above " : "probability_below ") + limit.level] =
                  probability;
              }
            results[name] = entry;
            table.statistics.push_back(statistics);
          }
        summary["results"] = results;
      }
    for (const auto &limit : base.sweep.limits)
      if (std::none_of(columns.begin(), columns.end(), [&](const auto &col) { return col.first == limit.result; }))
        throw InputError(limit.origin, "sweep." + std::string(limit.above ? "exceed." : "below.") + limit.result,
                         "expected a named result of the cases, found none called '" + limit.result + "'");
    write_json(summary, folder + "/sweep_summary.json");
    return table;
  }
} // namespace fickcast
