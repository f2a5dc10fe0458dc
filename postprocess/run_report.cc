// make_report: the HTML report of one run.
#include "html_page.h"
#include "output_file.h"
#include "report.h"
#include "results_folder.h"
#include "run_plots.h"
#include "time_units.h"

#include <cmath>
#include <cstdio>
#include <filesystem>
#include <map>

#ifndef FICKCAST_POST_VERSION
#define FICKCAST_POST_VERSION "unknown"
#endif

namespace fickcast::post
{
  namespace
  {
    std::string quantity(const double value, const std::string &unit)
    {
      if (!std::isfinite(value))
        return "none";
      if (unit == "s")
        return format_time(value) + (std::abs(value) >= 120 ? " (" + format_number(value, 6) + " s)" : "");
      return format_number(value, 5) + (unit.empty() || unit == "1" ? "" : " " + unit);
    }

    /// The estimated error of a named result as the accuracy check wrote it, in the value's unit.
    std::string estimate_text(const RunSummary &s, const std::string &name, const Json::Value &r, const DisplayUnit &c)
    {
      const bool checked = s.accuracy.isObject() && s.accuracy["checked"].asBool();
      if (!checked)
        return s.accuracy.isObject() ? "unchecked" : "";
      if (r.isMember("error_note"))
        return r["error_note"].asString();
      if (!r.isMember("error_estimate") || !r["error_estimate"].isNumeric())
        return "";
      const double e = r["error_estimate"].asDouble();
      if (name.rfind("point.", 0) == 0 || name.rfind("bath.", 0) == 0)
        return "+- " + format_number(e / c.si_per_unit, 2) + " " + c.symbol;
      if (name.rfind("depth.", 0) == 0)
        return "+- " + format_number(e, 2) + " m";
      if (name == "released_fraction.final" || name == "uptake_fraction.final")
        return "+- " + format_number(100 * e, 2) + " %";
      const std::string unit = r["unit"].isString() ? r["unit"].asString() : "";
      if (unit == "s")
        return "+- " + format_time(e);
      return "+- " + format_number(e, 2) + (unit.empty() || unit == "1" ? "" : " " + unit);
    }

    /// Headline results of summary.json, one row each: name, value, estimated error, note.
    std::vector<std::vector<std::string>> headline_rows(const RunSummary &s, const DisplayUnit &c)
    {
      std::vector<std::vector<std::string>> rows;
      const auto in_display = [&](const double si) { return format_number(si / c.si_per_unit, 5) + " " + c.symbol; };
      for (const auto &name : s.results.getMemberNames())
        {
          const Json::Value &r = s.results[name];
          const std::size_t before = rows.size();
          const double value = r["value"].isNumeric() ? r["value"].asDouble() : std::nan("");
          const std::string unit = r["unit"].isString() ? r["unit"].asString() : "";
          if (name.rfind("threshold.", 0) == 0)
            rows.push_back({name, r["reached"].asBool() ? quantity(value, "s") : "not reached by the end",
                            "first time point " + name.substr(10) + " reaches " + in_display(r["level"].asDouble())});
          else if (name.rfind("point.", 0) == 0)
            rows.push_back({name, in_display(value), "at the end of the run"});
          else if (name.rfind("depth.", 0) == 0)
            rows.push_back({name, r["final"].isNumeric() ? quantity(r["final"].asDouble(), "m") : "none",
                            "depth of the " + in_display(r["level"].asDouble()) + " level at the last output time"});
          else if (name.rfind("release.", 0) == 0 || name.rfind("uptake.", 0) == 0)
            rows.push_back({name, r["reached"].asBool() ? quantity(value, "s") : "not reached by the end",
                            std::string("time the ") + (name[0] == 'u' ? "uptake" : "released") + " fraction reaches " +
                              format_number(100 * r["level"].asDouble()) + " %"});
          else if (name.rfind("time_lag.", 0) == 0)
            rows.push_back({name, quantity(value, "s"),
                            "through " + r["boundary"].asString() +
                              (r["steady"].asBool() ? "" : "; the flux was not yet steady at the end")});
          else if (name.rfind("bath.", 0) == 0)
            rows.push_back(
              {name, in_display(value), "in the bath liquid on " + r["boundary"].asString() + " at the end"});
          else if (r.isObject() && r.isMember("direction") && r.isMember("boundary"))
            {
              // A result through a face: its direction and face, and the time or limit it refers to.
              std::string meaning = r["direction"].asString() + " through " + r["boundary"].asString();
              if (r.isMember("at"))
                meaning += " at " + quantity(r["at"]["value"].asDouble(), "s");
              if (r.isMember("by"))
                meaning += " by " + quantity(r["by"]["value"].asDouble(), "s");
              if (r.isMember("limit"))
                meaning = "first time the " + std::string(name.rfind("flux_limit.", 0) == 0 ? "rate " : "amount ") +
                          meaning + " reaches " +
                          quantity(r["limit"]["value"].asDouble(), r["limit"]["unit"].asString());
              if (name.size() > 5 && name.compare(name.size() - 5, 5, ".time") == 0)
                meaning = "when the largest rate " + meaning + " came";
              else if (name.rfind("peak_flux.", 0) == 0)
                meaning = "largest rate " + meaning;
              else if (name.rfind("steady_flux.", 0) == 0)
                meaning = "rate " + meaning + " at the end" + (r["steady"].asBool() ? ", steady" : "");
              if (r.isMember("note"))
                meaning += "; " + r["note"].asString();
              const bool missing = r.isMember("reached") && !r["reached"].asBool();
              rows.push_back({name, missing ? "not reached by the end" : quantity(value, unit), meaning});
            }
          else if (name == "released_fraction.final")
            rows.push_back({name, format_number(100 * value, 5) + " %", "of the reference content"});
          else if (name == "uptake_fraction.final")
            rows.push_back({name, format_number(100 * value, 5) + " %",
                            "taken up, of what equilibrium with the open faces would bring"});
          else if (name == "amount.final_total")
            rows.push_back({name, quantity(value, unit), "in the body at the end"});
          else if (name == "moments")
            rows.push_back({name, std::to_string(r["times"].size()) + " output times",
                            "amount, mean position and variance in summary.json"});
          else if (r.isObject() && r["value"].isNumeric())
            rows.push_back({name, quantity(value, unit), ""});
          if (rows.size() > before)
            rows.back().insert(rows.back().begin() + 2, name == "moments" ? "" : estimate_text(s, name, r, c));
        }
      return rows;
    }

    /// The time error global control carried, for the "time" row (empty without it).
    std::string carried_error_text(const RunSummary &s)
    {
      if (!std::isfinite(s.carried_error_final))
        return "";
      char text[200];
      std::snprintf(text, sizeof text,
                    "; global time error control: carried error %.2g at the end, %.2g at most, tolerance %.2g "
                    "(relative to the concentration scale)",
                    s.carried_error_final, s.carried_error_largest, s.time_tolerance);
      return text;
    }

    /// What the remeshing did, for the "mesh" row (empty for a run that did not remesh).
    std::string remeshing_text(const RunSummary &s)
    {
      if (s.remeshings < 0)
        return "";
      return " at the end; remeshed " + std::to_string(s.remeshings) + " times during the run (numerics.remesh), " +
             "at most " + std::to_string(s.cells_largest) + " cells and " + std::to_string(s.unknowns_largest) +
             " unknowns; amount the remeshings added " + format_number(s.remeshed_amount, 3) + " " + s.unit_amount +
             " (a term of the mass balance)";
    }

    /// How the accuracy check went, and the warnings of the run.
    std::string accuracy_section(const RunSummary &s)
    {
      std::string html;
      const Json::Value &a = s.accuracy;
      if (a.isObject())
        {
          if (!a["checked"].asBool() && a["requested"].isString())
            html += "<p>numerics.accuracy = off: one solve, <strong>the numbers are unchecked</strong> (no error "
                    "estimate).</p>\n";
          else
            {
              std::vector<std::vector<std::string>> rows;
              for (const auto &solve : a["solves"])
                rows.push_back({std::to_string(solve["refine"].asUInt()),
                                solve.isMember("time_tolerance") ? format_number(solve["time_tolerance"].asDouble(), 3)
                                                                 : format_time(solve["time_step_s"].asDouble()),
                                std::to_string(solve["cells"].asUInt64()), std::to_string(solve["unknowns"].asUInt64()),
                                std::to_string(solve["steps"].asUInt()),
                                format_number(solve["wall_time_s"].asDouble(), 3)});
              html +=
                "<p>Accuracy asked of each named result: " +
                html_escape(a["requested"].isNumeric() ? format_number(a["requested"].asDouble(), 3)
                                                       : a["requested"].asString()) +
                " relative to the result itself; " +
                (a["met"].asBool() ? std::string("<strong>met</strong>") : std::string("<strong>not met</strong>")) +
                ". Each estimate comes from the change of the result between solves one refinement apart "
                "in space and time (the results shown are the last solve's).</p>\n";
              if (!a["note"].asString().empty())
                html += "<p>" + html_escape(a["note"].asString()) + "</p>\n";
              html += html_table({"refine", "time tolerance or step", "cells", "unknowns", "steps", "wall time (s)"},
                                 rows, "solves");
            }
        }
      if (!s.warnings.empty())
        {
          html += "<h3>Warnings</h3>\n<ul class=\"warnings\">\n";
          for (const auto &warning : s.warnings)
            html += "<li>" + html_escape(warning) + "</li>\n";
          html += "</ul>\n";
        }
      return html;
    }

    std::string settings_table(const RunSummary &s, const bool defaults)
    {
      std::vector<std::vector<std::string>> rows;
      for (const auto &item : s.settings)
        if ((item.origin == "default") == defaults)
          rows.push_back({item.key, item.written, item.si == item.written ? "" : item.si, item.origin});
      if (rows.empty())
        return "<p>None.</p>\n";
      return html_table({"setting", "as written", "SI", "from"}, rows, "settings");
    }

    std::string verification_section(const std::string &results_folder, const std::string &given)
    {
      std::string path = given;
      if (path.empty())
        for (const auto &candidate :
             {results_folder + "/verification_report.json",
              (std::filesystem::path(results_folder).parent_path() / "verification_report.json").string()})
          if (std::filesystem::is_regular_file(candidate))
            {
              path = candidate;
              break;
            }
      std::string html = "<h2>Verification</h2>\n";
      if (path.empty())
        return html + "<p>No verification report was found next to these results. <code>fickcast verify</code> "
                      "writes one (verification_report.json); pass it with <code>--verification FILE</code>.</p>\n";
      const Json::Value report = read_json_file(path, "a verification_report.json written by `fickcast verify`");
      if (!report["checks"].isArray() || !report["passed"].isBool())
        throw PostInputError(path, "`checks` (array) and `passed` (true or false)", "neither or another type");
      unsigned int passed = 0;
      std::vector<std::vector<std::string>> failed;
      for (const auto &check : report["checks"])
        {
          if (check["passed"].asBool())
            ++passed;
          else
            failed.push_back({check["name"].asString(), format_number(check["error"].asDouble()),
                              format_number(check["tolerance"].asDouble()), check["source"].asString()});
        }
      const unsigned int total = report["checks"].size();
      html += std::string("<p class=\"") + (report["passed"].asBool() ? "status-ok" : "status-bad") + "\">" +
              (report["passed"].asBool() ? "Passed" : "FAILED") + ": " + std::to_string(passed) + " of " +
              std::to_string(total) + " checks against published solutions within tolerance (" + html_escape(path) +
              ").</p>\n";
      std::vector<std::vector<std::string>> facts;
      for (const auto &key : report["installation"].getMemberNames())
        if (report["installation"][key].isString())
          facts.push_back({key, report["installation"][key].asString()});
      if (!facts.empty())
        html += html_table({"installation", ""}, facts);
      if (!failed.empty())
        html += html_table({"failed check", "error", "tolerance", "source"}, failed);
      return html;
    }
  } // namespace

  ReportOutcome make_report(const std::string &results_folder, const ReportOptions &options)
  {
    const ResultsFolder results = open_results(results_folder);
    const RunSummary &s = results.summary;
    const std::string folder = options.output_folder.empty() ? results_folder + "/report" : options.output_folder;
    const std::string verification = verification_section(results_folder, options.verification_report);
    RunPlotOptions plot_options;
    plot_options.formats = options.formats;
    plot_options.formats.png = true; // the report embeds PNGs
    plot_options.sqrt_time = options.sqrt_time;
    plot_options.map_times = options.map_times;
    const auto plots = make_run_plots(results, folder, plot_options);
    const DisplayUnit c = concentration_display(s);

    std::string body = "<h1>" + html_escape(s.title) + "</h1>\n<p class=\"meta\">Results report for <code>" +
                       html_escape(results_folder) + "</code>, case <code>" + html_escape(s.case_file) +
                       "</code>. Run status: <strong>" + html_escape(s.status) + "</strong>" +
                       (s.message.empty() ? "" : " (" + html_escape(s.message) + ")") + ".</p>\n";
    body += html_cautions();

    // The answers first, then what was solved (a reader on a small screen sees them without
    // scrolling past the settings).
    body += "<h2>Headline results</h2>\n";
    const auto rows = headline_rows(s, c);
    body += rows.empty() ? "<p>The case asked for no named results.</p>\n"
                         : html_table({"result", "value", "estimated error", "meaning"}, rows, "results");
    body += accuracy_section(s);

    body += "<h2>What was solved</h2>\n";
    const auto *layers = s.setting("geometry.layers");
    const auto *mesh = s.setting("geometry.mesh");
    std::vector<std::vector<std::string>> what{
      {"equation",
       s.cell_peclet > 0
         ? "Fick's second law with advection by a Darcy flux and mechanical dispersion, with the case's "
           "porosity, sorption, partition and decay"
         : "Fick's second law (transient diffusion) with the case's porosity, sorption, partition and decay"},
      {"dimension and coordinates", std::to_string(s.dimension) + "-D, " + s.coordinates},
      {"geometry", layers ? "layers " + layers->written
                   : mesh ? "mesh " + mesh->written
                          : "see settings"},
      {"regions (material id: name)", ""},
      {"boundaries", ""},
      {"mesh", std::to_string(s.cells) + " cells, " + std::to_string(s.unknowns) + " unknowns, degree " +
                 std::to_string(s.degree) + " elements" + remeshing_text(s)},
      {"time", "to " + format_time(s.end_time) + ", " + s.scheme + (s.adaptive ? ", error-controlled steps" : "") +
                 "; " + std::to_string(s.steps_accepted) + " steps accepted, " + std::to_string(s.steps_rejected) +
                 " rejected" + carried_error_text(s)},
      {"units", "concentration " + c.symbol + " in plots (SI " + s.unit_concentration + " in files), amounts " +
                  s.unit_amount + ", flux " + s.unit_flux}};
    for (std::size_t r = 0; r < s.regions.size(); ++r)
      what[3][1] += (r ? ", " : "") + std::to_string(r) + ": " + s.regions[r];
    for (std::size_t b = 0; b < s.boundaries.size(); ++b)
      what[4][1] += (b ? ", " : "") + s.boundaries[b];
    if (s.cell_peclet > 0)
      {
        char flow[200];
        std::snprintf(flow, sizeof(flow),
                      "cell Peclet number up to %.3g (%s), Courant number of the longest step %.3g; streamline "
                      "upwinding (Brooks and Hughes 1982)",
                      s.cell_peclet, s.cell_peclet_region.c_str(), s.courant);
        what.push_back({"water flow", flow});
      }
    for (const auto &stage : s.stages)
      what.push_back({"stage " + stage.name, "from " + format_time(stage.start) + " to " + format_time(stage.end)});
    body += html_table({}, what, "facts");
    body += "<h3>Settings given in the case</h3>\n" + settings_table(s, false);
    body += "<details><summary>Settings left at their defaults</summary>\n" + settings_table(s, true) + "</details>\n";

    body += "<h2>Mass balance</h2>\n";
    const bool closed = std::isfinite(s.balance_relative) && std::abs(s.balance_relative) <= 1e-6;
    body += std::string("<p class=\"") + (closed ? "status-ok" : "status-bad") + "\">" +
            (closed ? "Closed" : "Not closed to 1e-6") + ": storage change minus net inflow is " +
            html_escape(quantity(s.balance_error, s.unit_amount)) + ", " +
            html_escape(format_number(s.balance_relative, 3)) + " of the amounts involved (criterion: 1e-6).</p>\n";
    if (s.remeshings > 0)
      body += "<p>The balance above leaves out what the " + std::to_string(s.remeshings) +
              " remeshings added, a term of its own: " + html_escape(quantity(s.remeshed_amount, s.unit_amount)) +
              " (merging cells loses what the coarser mesh cannot hold; splitting keeps every amount).</p>\n";
    body += verification;

    body += "<h2>Plots</h2>\n";
    if (plots.empty())
      body += "<p>No plottable data in this folder.</p>\n";
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

    body += "<h2>Run facts</h2>\n";
    std::vector<std::vector<std::string>> facts{
      {"program", s.program + " " + s.version},
      {"date (UTC)", s.date},
      {"host", s.host},
      {"wall time", quantity(s.wall_time, "s")},
      {"ranks", std::to_string(s.ranks)},
      {"linear solver", s.linear_solver},
      {"report made by", "fickcast-post " + std::string(FICKCAST_POST_VERSION)}};
    body += html_table({}, facts, "facts");
    body += "<p class=\"meta\">Read from summary.json, series.csv" +
            std::string(results.profiles ? ", profiles.csv" : "") + (results.fields ? " and the VTU fields" : "") +
            " of this folder; nothing was recomputed.</p>\n";

    outcome.html = folder + "/index.html";
    write_file(outcome.html, html_document(s.title + " - fickcast results", body));
    return outcome;
  }
} // namespace fickcast::post
