// make_study_report: the HTML report of a study (a sweep or an uncertainty study).
#include "html_page.h"
#include "output_file.h"
#include "report.h"
#include "run_summary.h"
#include "study_plots.h"
#include "time_units.h"

#include <algorithm>
#include <cmath>
#include <filesystem>

namespace fickcast::post
{

  namespace
  {
    /// The limit probabilities of an uncertainty study's summary: "P(below 15 yr) = 0.41 ..." per result.
    std::vector<StudyLimitMark> limit_marks(const Json::Value &summary)
    {
      std::vector<StudyLimitMark> marks;
      if (!summary.isObject() || !summary["results"].isObject())
        return marks;
      for (const auto &name : summary["results"].getMemberNames())
        {
          const Json::Value &entry = summary["results"][name];
          for (const auto &key : entry.getMemberNames())
            {
              const bool below = key.rfind("probability_below ", 0) == 0;
              if (!below && key.rfind("probability_above ", 0) != 0)
                continue;
              const Json::Value &p = entry[key];
              if (!p["level"].isNumeric())
                continue;
              const std::string level = key.substr(key.find(' ') + 1); // as written in the case
              std::string label = std::string("P(") + (below ? "below " : "above ") + level + ") = ";
              if (p["probability"].isNumeric())
                label += format_number(100 * p["probability"].asDouble(), 3) + " % (+- " +
                         format_number(100 * p["standard_error"].asDouble(), 2) +
                         " %, n = " + std::to_string(p["n"].asUInt()) + ")";
              else
                label += "undefined (no completed case)";
              marks.push_back({name, p["level"].asDouble(), label});
            }
        }
      return marks;
    }

    /// Rank correlations of each sampled input (rows) with each result (columns).
    std::string drivers_table(const StudyTable &study)
    {
      std::vector<std::string> header{"input"};
      for (const std::size_t r : study.results)
        header.push_back(study.table.names()[r]);
      std::vector<std::vector<std::string>> rows;
      for (const std::size_t p : study.parameters)
        {
          std::vector<std::string> row{study.table.names()[p]};
          for (const std::size_t r : study.results)
            {
              const double rho = rank_correlation(study.parameter_values(p), study.result_values(r));
              row.push_back(std::isfinite(rho) ? format_number(rho, 2) : "-");
            }
          rows.push_back(row);
        }
      return html_table(header, rows);
    }
  } // namespace

  bool is_study_folder(const std::string &folder)
  {
    return std::filesystem::is_regular_file(folder + "/sweep.csv");
  }

  ReportOutcome make_study_report(const std::string &study_folder, const ReportOptions &options)
  {
    if (!std::filesystem::is_directory(study_folder))
      throw PostInputError(study_folder, "a study folder with sweep.csv", "no such folder");
    const StudyTable study = read_study(study_folder);
    // The kind of study from its summary (a what-if grid writes one too, with kind "sweep").
    const std::string summary_path = study_folder + "/sweep_summary.json";
    Json::Value summary;
    if (std::filesystem::is_regular_file(summary_path))
      summary = read_json_file(summary_path, "the sweep_summary.json of a study");
    const bool uncertainty = summary.isObject() && summary["kind"].asString() == "uncertainty";
    const std::string folder = options.output_folder.empty() ? study_folder + "/report" : options.output_folder;
    PlotFormats formats = options.formats;
    formats.png = true;
    const std::string subject = summary.isObject() ? summary["title"].asString() : std::string();
    const std::vector<StudyLimitMark> limits = limit_marks(summary);
    const auto plots = make_study_plots(study, folder, uncertainty, formats, 36, subject, limits);

    const CsvTable &t = study.table;
    const std::string kind = uncertainty ? "Uncertainty study: " + std::to_string(t.n_rows()) + " samples"
                                         : "What-if study: " + std::to_string(t.n_rows()) + " cases";
    std::string body =
      "<h1>" + html_escape(subject.empty() ? std::filesystem::path(study_folder).filename().string() : subject) +
      "</h1>\n<p class=\"meta\">" + kind + " read from <code>" + html_escape(t.path()) +
      "</code>: " + std::to_string(t.n_rows()) + " cases, " + std::to_string(t.n_rows() - study.n_failed) +
      " completed" +
      (study.n_failed ? ", " + std::to_string(study.n_failed) + " not completed (left out of plots)" : std::string()) +
      ".</p>\n";
    body += html_cautions();

    body += "<h2>What was varied</h2>\n";
    std::vector<std::vector<std::string>> parameter_rows;
    for (const std::size_t p : study.parameters)
      {
        const auto v = study.parameter_values(p);
        parameter_rows.push_back({t.names()[p], t.units()[p].empty() ? study.parameter_unit(p) : t.units()[p],
                                  format_number(sample_quantile(v, 0)), format_number(sample_quantile(v, 1))});
      }
    body += parameter_rows.empty() ? "<p>No parameter columns.</p>\n"
                                   : html_table({"parameter", "unit", "smallest", "largest"}, parameter_rows);

    body += "<h2>Results over the completed cases</h2>\n";
    std::vector<std::vector<std::string>> stats, ranges;
    for (const std::size_t r : study.results)
      {
        auto v = study.result_values(r);
        std::size_t n = 0, not_reached = 0;
        double largest = 0;
        for (const double x : v)
          {
            n += std::isnan(x) ? 0 : 1;
            not_reached += std::isinf(x) ? 1 : 0;
            if (std::isfinite(x))
              largest = std::max(largest, std::abs(x));
          }
        // Times in a readable unit (years, days, hours), as in the plots.
        std::string unit = t.units()[r];
        if (unit == "s")
          {
            const TimeUnit readable = readable_time_unit(largest);
            for (double &x : v)
              x /= readable.seconds;
            unit = readable.symbol;
          }
        const auto show = [](const double x) {
          return std::isinf(x) ? std::string("not reached") : std::isnan(x) ? std::string("-") : format_number(x);
        };
        const std::string cases =
          std::to_string(n) + (not_reached ? " (" + std::to_string(not_reached) + " not reached)" : "");
        std::string probability;
        for (const auto &limit : limits)
          if (limit.result == t.names()[r])
            probability += (probability.empty() ? "" : "; ") + limit.label;
        stats.push_back({t.names()[r], unit, cases, show(finite_mean(v)), show(sample_quantile(v, 0.05)),
                         show(sample_quantile(v, 0.5)), show(sample_quantile(v, 0.95)), show(sample_quantile(v, 0)),
                         show(sample_quantile(v, 1)), probability.empty() ? "-" : probability});
        ranges.push_back({t.names()[r], unit, cases, show(sample_quantile(v, 0)), show(sample_quantile(v, 1))});
      }
    if (uncertainty)
      {
        body += html_table(
          {"result", "unit", "cases", "mean", "P5", "P50", "P95", "smallest", "largest", "limit probability"}, stats);
        body += "<p class=\"meta\">Percentiles by linear interpolation between order statistics (Hyndman and Fan "
                "1996, definition 7), computed here from sweep.csv. An event (threshold, release) not reached within "
                "the simulated time counts as later than any time: it enters the percentiles, and the mean is not "
                "defined. A limit probability is the fraction of completed cases beyond the limit (sweep.below.* or "
                "sweep.exceed.*), with its standard error sqrt(p (1 - p) / n) from the sample size alone.</p>\n";
        body += "<h3>Which inputs drive each result</h3>\n" + drivers_table(study) +
                "<p class=\"meta\">Spearman rank correlation of each sampled input with each result over the "
                "completed cases (events not reached rank last). With few samples (under about 30), values "
                "below 0.3 are within chance.</p>\n";
      }
    else
      body += html_table({"result", "unit", "cases", "smallest", "largest"}, ranges) +
              "<p class=\"meta\">A what-if grid: each case is a chosen combination, not a sample, so no mean or "
              "percentiles; see the table of cases and the plots of each result against each parameter.</p>\n";

    body += "<h2>Plots</h2>\n";
    ReportOutcome outcome;
    for (const auto &plot : plots)
      {
        const std::string png = folder + "/" + plot.stem + ".png";
        body += "<figure>" + html_embedded_png(png, plot.title) + "\n<figcaption>" + html_escape(plot.caption);
        if (options.formats.svg)
          body +=
            " Vector version: <a href=\"" + html_escape(plot.stem) + ".svg\">" + html_escape(plot.stem) + ".svg</a>.";
        body += "</figcaption></figure>\n";
        outcome.images.push_back(png);
        if (options.formats.svg)
          outcome.images.push_back(folder + "/" + plot.stem + ".svg");
      }
    if (plots.empty())
      body += "<p>Nothing to plot: no varied numeric parameter or no completed case.</p>\n";

    body += "<h2>Cases</h2>\n";
    std::vector<std::string> header;
    for (std::size_t c = 0; c < t.names().size(); ++c)
      header.push_back(t.names()[c] + (t.units()[c].empty() ? "" : " [" + t.units()[c] + "]"));
    body += t.n_rows() <= 200 ? html_table(header, t.rows(), "cases")
                              : "<p>" + std::to_string(t.n_rows()) + " cases: see sweep.csv.</p>\n";

    outcome.html = folder + "/index.html";
    write_file(outcome.html, html_document("Study report - fickcast", body));
    return outcome;
  }
} // namespace fickcast::post
