// make_seek_report: the HTML report of a sizing search (fickcast seek): what was sought, the
// answer, every evaluation, and the result against the parameter with the target marked.
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
  bool is_seek_folder(const std::string &folder)
  {
    return std::filesystem::is_regular_file(folder + "/seek.csv") &&
           std::filesystem::is_regular_file(folder + "/seek_summary.json");
  }

  ReportOutcome make_seek_report(const std::string &seek_folder, const ReportOptions &options)
  {
    if (!is_seek_folder(seek_folder))
      throw PostInputError(seek_folder, "a seek folder with seek.csv and seek_summary.json", "neither or only one");
    const Json::Value summary = read_json_file(seek_folder + "/seek_summary.json", "the seek_summary.json of a seek");
    const CsvTable table = CsvTable::read(seek_folder + "/seek.csv");
    const std::string key = summary["key"].asString(), result = summary["result_name"].asString();
    const std::string unit = summary["unit"].asString(), result_unit = summary["result_unit"].asString();
    if (key.empty() || result.empty() || !summary["target"].isNumeric())
      throw PostInputError(seek_folder + "/seek_summary.json", "key, result_name and target", "some missing");
    const std::vector<double> x = table.numbers(table.require(key)), y = table.numbers(table.require(result));

    // Times in a readable unit; other results in the unit the seek wrote.
    double scale = 1;
    std::string shown_unit = result_unit;
    if (result_unit == "s")
      {
        const TimeUnit readable = readable_time_unit(std::abs(summary["target"].asDouble()));
        scale = readable.seconds;
        shown_unit = readable.symbol;
      }
    const double target = summary["target"].asDouble() / scale;

    const std::string folder = options.output_folder.empty() ? seek_folder + "/report" : options.output_folder;
    make_folder(folder);
    PlotFormats formats = options.formats;
    formats.png = true;
    std::vector<std::size_t> order(x.size());
    std::iota(order.begin(), order.end(), 0);
    std::sort(order.begin(), order.end(), [&](std::size_t a, std::size_t b) { return x[a] < x[b]; });
    PlotCurve runs{"evaluations", {}, {}};
    double low = INFINITY, high = -INFINITY;
    for (const std::size_t i : order)
      if (std::isfinite(x[i]) && std::isfinite(y[i]))
        {
          runs.x.push_back(x[i]);
          runs.y.push_back(y[i] / scale);
          low = std::min(low, x[i]);
          high = std::max(high, x[i]);
        }
    PlotCurve goal{"target " + format_number(target) + " " + shown_unit, {low, high}, {target, target}};
    goal.reference = true;
    PlotSpec spec{result + " against " + key,
                  key + (unit.empty() ? "" : " [" + unit + "]"),
                  result + (shown_unit.empty() ? "" : " [" + shown_unit + "]"),
                  {runs, goal}};
    const bool plotted = write_plot(spec, folder + "/seek_evaluations", formats);

    std::string body = "<h1>Sizing search: " + html_escape(key) + "</h1>\n<p class=\"meta\">Read from <code>" +
                       html_escape(seek_folder) + "</code> (seek.csv, seek_summary.json).</p>\n";
    body += html_cautions();
    body += "<p><strong>A sizing answer is the value at which the model meets the target exactly. It carries the "
            "uncertainty of every input and no safety margin.</strong></p>\n";
    body += "<h2>What was sought</h2>\n";
    body +=
      html_table({"item", "value"},
                 {{"parameter", key + (unit.empty() ? "" : " [" + unit + "]")},
                  {"range", format_number(summary["range"][0].asDouble(), 6) + " to " +
                              format_number(summary["range"][1].asDouble(), 6) + " " + unit},
                  {"result", result},
                  {"target", format_number(target, 7) + " " + shown_unit},
                  {"tolerance (relative, on the parameter)", format_number(summary["tolerance_relative"].asDouble())},
                  {"method", summary["method"].asString()}});
    body += "<h2>Answer</h2>\n";
    body += html_table({"item", "value"},
                       {{key, summary["value_text"].asString()},
                        {result + " there", format_number(summary["result"].asDouble() / scale, 7) + " " + shown_unit},
                        {"final bracket", format_number(summary["bracket"][0].asDouble(), 9) + " to " +
                                            format_number(summary["bracket"][1].asDouble(), 9) + " " + unit},
                        {"evaluations", std::to_string(summary["evaluations"].asInt())},
                        {"results folder of the answer", summary["answer_folder"].asString()}});
    ReportOutcome outcome;
    if (plotted)
      {
        body += "<h2>Plot</h2>\n<figure>" + html_embedded_png(folder + "/seek_evaluations.png", spec.title) +
                "\n<figcaption>Each evaluation (a full run) and the target; an evaluation whose event was not reached "
                "within the run has no point.</figcaption></figure>\n";
        outcome.images.push_back(folder + "/seek_evaluations.png");
        if (options.formats.svg)
          outcome.images.push_back(folder + "/seek_evaluations.svg");
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
    if (is_seek_folder(folder))
      return make_seek_report(folder, options);
    return make_report(folder, options);
  }
} // namespace fickcast::post
