// make_size_report: the HTML report of a sizing search (fickcast size): what was sought, the
// answer, every evaluation, and the result against the parameter with the aim marked.
#include "csv_table.h"
#include "html_page.h"
#include "output_file.h"
#include "plot_writer.h"
#include "report.h"
#include "run_summary.h"
#include "time_units.h"

#include <algorithm>
#include <cmath>
#include <filesystem>
#include <numeric>

namespace fickcast::post
{
  bool is_size_folder(const std::string &folder)
  {
    return std::filesystem::is_regular_file(folder + "/size.csv") &&
           std::filesystem::is_regular_file(folder + "/size_summary.json");
  }

  ReportOutcome make_size_report(const std::string &size_folder, const ReportOptions &options)
  {
    if (!is_size_folder(size_folder))
      throw PostInputError(size_folder, "a sizing folder with size.csv and size_summary.json", "neither or only one");
    const Json::Value summary = read_json_file(size_folder + "/size_summary.json", "the size_summary.json of a sizing");
    const CsvTable table = CsvTable::read(size_folder + "/size.csv");
    const std::string key = summary["parameter"].asString(), result = summary["result_name"].asString();
    const std::string unit = summary["unit"].asString(), result_unit = summary["result_unit"].asString();
    if (key.empty() || result.empty() || !summary["aim"].isNumeric())
      throw PostInputError(size_folder + "/size_summary.json", "parameter, result_name and aim", "some missing");
    const std::vector<double> x = table.numbers(table.require(key)), y = table.numbers(table.require(result));

    // Times in a readable unit; other results in the unit the sizing wrote.
    double scale = 1;
    std::string shown_unit = result_unit;
    if (result_unit == "s")
      {
        const TimeUnit readable = readable_time_unit(std::abs(summary["aim"].asDouble()));
        scale = readable.seconds;
        shown_unit = readable.symbol;
      }
    const double target = summary["aim"].asDouble() / scale;

    const std::string folder = options.output_folder.empty() ? size_folder + "/report" : options.output_folder;
    make_folder(folder);
    PlotFormats formats = options.formats;
    formats.png = true;
    std::vector<std::size_t> order(x.size());
    std::iota(order.begin(), order.end(), 0);
    std::sort(order.begin(), order.end(), [&](std::size_t a, std::size_t b) { return x[a] < x[b]; });
    PlotCurve runs{"runs", {}, {}};
    double low = INFINITY, high = -INFINITY;
    for (const std::size_t i : order)
      if (std::isfinite(x[i]) && std::isfinite(y[i]))
        {
          runs.x.push_back(x[i]);
          runs.y.push_back(y[i] / scale);
          low = std::min(low, x[i]);
          high = std::max(high, x[i]);
        }
    PlotCurve goal{"aim " + format_number(target) + " " + shown_unit, {low, high}, {target, target}};
    goal.reference = true;
    PlotSpec spec{result + " against " + key,
                  key + (unit.empty() ? "" : " [" + unit + "]"),
                  result + (shown_unit.empty() ? "" : " [" + shown_unit + "]"),
                  {runs, goal},
                  false,
                  summary["title"].asString(),
                  false};
    const bool plotted = write_plot(spec, folder + "/size_runs", formats);

    std::string body = "<h1>Sizing search: " + html_escape(key) + "</h1>\n<p class=\"meta\">Read from <code>" +
                       html_escape(size_folder) + "</code> (size.csv, size_summary.json).</p>\n";
    body += html_cautions();
    body += "<p><strong>A sizing answer is the value at which the model meets the aim exactly. It carries the "
            "uncertainty of every input and no safety margin.</strong></p>\n";
    body += "<h2>What was sought</h2>\n";
    body +=
      html_table({"item", "value"},
                 {{"parameter", key + (unit.empty() ? "" : " [" + unit + "]")},
                  {"range", format_number(summary["range"][0].asDouble(), 6) + " to " +
                              format_number(summary["range"][1].asDouble(), 6) + " " + unit},
                  {"result", result},
                  {"aim", format_number(target, 7) + " " + shown_unit},
                  {"tolerance (relative, on the parameter)", format_number(summary["tolerance_relative"].asDouble())},
                  {"method", summary["method"].asString()}});
    body += "<h2>Answer</h2>\n";
    body += html_table({"item", "value"},
                       {{key, summary["value_text"].asString()},
                        {result + " there", format_number(summary["result"].asDouble() / scale, 7) + " " + shown_unit},
                        {"final bracket", format_number(summary["bracket"][0].asDouble(), 9) + " to " +
                                            format_number(summary["bracket"][1].asDouble(), 9) + " " + unit},
                        {"runs", std::to_string(summary["runs"].asInt())},
                        {"results folder of the answer", summary["answer_folder"].asString()}});
    ReportOutcome outcome;
    if (plotted)
      {
        body += "<h2>Plot</h2>\n<figure>" + html_embedded_png(folder + "/size_runs.png", spec.title) +
                "\n<figcaption>Each evaluation (a full run) and the aim; an evaluation whose event was not reached "
                "within the run has no point.</figcaption></figure>\n";
        outcome.images.push_back(folder + "/size_runs.png");
        if (options.formats.svg)
          outcome.images.push_back(folder + "/size_runs.svg");
      }
    body += "<h2>Evaluations</h2>\n";
    std::vector<std::string> header;
    for (std::size_t c = 0; c < table.names().size(); ++c)
      header.push_back(table.names()[c] + (table.units()[c].empty() ? "" : " [" + table.units()[c] + "]"));
    body += html_table(header, table.rows(), "cases");
    outcome.html = folder + "/index.html";
    write_file(outcome.html, html_document("Sizing search report - fickcast", body));
    return outcome;
  }

  ReportOutcome make_any_report(const std::string &folder, const ReportOptions &options)
  {
    if (is_study_folder(folder))
      return make_study_report(folder, options);
    if (is_size_folder(folder))
      return make_size_report(folder, options);
    return make_report(folder, options);
  }
} // namespace fickcast::post
