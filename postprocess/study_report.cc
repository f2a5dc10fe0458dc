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
    /// Numbers and strings of a JSON value, flattened to `path = value` rows.
    void flatten(const Json::Value &value, const std::string &path, std::vector<std::vector<std::string>> &rows)
    {
      if (value.isObject())
        for (const auto &key : value.getMemberNames())
          flatten(value[key], path.empty() ? key : path + "." + key, rows);
      else if (value.isArray())
        for (Json::ArrayIndex i = 0; i < value.size(); ++i)
          flatten(value[i], path + "[" + std::to_string(i) + "]", rows);
      else if (value.isNumeric())
        rows.push_back({path, format_number(value.asDouble(), 6)});
      else if (value.isString() || value.isBool())
        rows.push_back({path, value.asString()});
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
    const std::string summary_path = study_folder + "/sweep_summary.json";
    const bool uncertainty = std::filesystem::is_regular_file(summary_path);
    Json::Value summary;
    if (uncertainty)
      summary = read_json_file(summary_path, "the sweep_summary.json of an uncertainty study");
    const std::string folder = options.output_folder.empty() ? study_folder + "/report" : options.output_folder;
    PlotFormats formats = options.formats;
    formats.png = true;
    std::string subject;
    if (std::filesystem::is_regular_file(summary_path))
      subject = read_json_file(summary_path, "the sweep_summary.json of a sweep")["title"].asString();
    const auto plots = make_study_plots(study, folder, uncertainty, formats, 24, subject);

    const CsvTable &t = study.table;
    std::string body =
      "<h1>Study: " + html_escape(std::filesystem::path(study_folder).filename().string()) +
      "</h1>\n<p class=\"meta\">" + (uncertainty ? "Uncertainty study" : "Parameter study") + " read from <code>" +
      html_escape(t.path()) + "</code>: " + std::to_string(t.n_rows()) + " cases, " +
      std::to_string(t.n_rows() - study.n_failed) + " completed" +
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
    std::vector<std::vector<std::string>> stats;
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
        stats.push_back({t.names()[r], unit,
                         std::to_string(n) + (not_reached ? " (" + std::to_string(not_reached) + " not reached)" : ""),
                         show(finite_mean(v)), show(sample_quantile(v, 0.05)), show(sample_quantile(v, 0.5)),
                         show(sample_quantile(v, 0.95)), show(sample_quantile(v, 0)), show(sample_quantile(v, 1))});
      }
    body += html_table({"result", "unit", "cases", "mean", "P5", "P50", "P95", "smallest", "largest"}, stats);
    body += "<p class=\"meta\">Percentiles by linear interpolation between order statistics (Hyndman and Fan 1996, "
            "definition 7), computed here from sweep.csv. An event (threshold, release) not reached within the "
            "simulated time counts as later than any time: it enters the percentiles, and the mean is not "
            "defined.</p>\n";
    if (uncertainty)
      {
        std::vector<std::vector<std::string>> rows;
        flatten(summary, "", rows);
        body += "<h3>As the study wrote them (sweep_summary.json)</h3>\n" + html_table({"entry", "value"}, rows);
      }

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
