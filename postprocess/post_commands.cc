#include "post_commands.h"

#include "csv_table.h"
#include "field_sampler.h"
#include "output_file.h"
#include "post_error.h"
#include "region_integrator.h"
#include "report.h"
#include "results_comparison.h"
#include "results_folder.h"
#include "run_plots.h"
#include "time_units.h"

#include <cmath>
#include <cstdio>
#include <iostream>
#include <map>
#include <set>

#ifndef FICKCAST_POST_VERSION
#define FICKCAST_POST_VERSION "unknown"
#endif

namespace fickcast::post
{
  namespace
  {
    /// Flags of one command: positional arguments and `--name value` options (repeatable).
    struct Flags
    {
      std::vector<std::string> positional;
      std::multimap<std::string, std::string> options;

      bool has(const std::string &name) const { return options.count(name) > 0; }
      std::string get(const std::string &name, const std::string &fallback) const
      {
        const auto it = options.find(name);
        return it == options.end() ? fallback : it->second;
      }
      std::vector<std::string> all(const std::string &name) const
      {
        std::vector<std::string> values;
        for (auto [it, end] = options.equal_range(name); it != end; ++it)
          values.push_back(it->second);
        return values;
      }
    };

    Flags parse_flags(const std::vector<std::string> &args, const std::set<std::string> &with_value,
                      const std::set<std::string> &switches, const std::size_t n_positional, const std::string &command)
    {
      Flags flags;
      for (std::size_t i = 0; i < args.size(); ++i)
        {
          const std::string &a = args[i];
          if (a.rfind("--", 0) == 0)
            {
              std::string name = a, value;
              const auto equals = a.find('=');
              if (equals != std::string::npos)
                {
                  name = a.substr(0, equals);
                  value = a.substr(equals + 1);
                }
              if (switches.count(name))
                {
                  flags.options.emplace(name, "");
                  continue;
                }
              if (!with_value.count(name))
                {
                  std::string known;
                  for (const auto &k : with_value)
                    known += (known.empty() ? "" : ", ") + k;
                  for (const auto &k : switches)
                    known += (known.empty() ? "" : ", ") + k;
                  throw PostInputError("command line", "an option of `" + command + "` (" + known + ")",
                                       "'" + name + "'");
                }
              if (equals == std::string::npos)
                {
                  if (i + 1 >= args.size())
                    throw PostInputError("command line", "a value after " + name, "the end of the line");
                  value = args[++i];
                }
              flags.options.emplace(name, value);
            }
          else
            flags.positional.push_back(a);
        }
      if (flags.positional.size() != n_positional)
        throw PostInputError(
          "command line",
          std::to_string(n_positional) + " folder" + (n_positional > 1 ? "s" : "") + " after `" + command + "`",
          std::to_string(flags.positional.size()) + " (" + usage_text(command).substr(7, 60) + "...)");
      return flags;
    }

    /// Writes @p csv to the --output file (through a partial file) or to stdout.
    void emit_csv(const Flags &flags, const std::string &csv)
    {
      const std::string output = flags.get("--output", "");
      if (output.empty())
        {
          std::cout << csv << std::flush;
          if (!std::cout)
            throw PostIoError("writing to standard output failed");
        }
      else
        write_file(output, csv);
    }

    std::string cell(const double value)
    {
      if (!std::isfinite(value))
        return "";
      char buffer[40];
      std::snprintf(buffer, sizeof(buffer), "%.10g", value);
      return buffer;
    }

    std::string csv_text(const std::string &text)
    {
      if (text.find_first_of(",\"") == std::string::npos)
        return text;
      std::string out = "\"";
      for (const char c : text)
        out += c == '"' ? std::string("\"\"") : std::string(1, c);
      return out + "\"";
    }

    std::vector<std::string> field_list(const Flags &flags, const std::vector<std::string> &fallback)
    {
      std::vector<std::string> fields;
      for (const auto &value : flags.all("--field"))
        for (const auto &name : split_csv_line(value))
          if (!name.empty())
            fields.push_back(name);
      return fields.empty() ? fallback : fields;
    }

    int command_sample(const std::vector<std::string> &args)
    {
      const Flags flags =
        parse_flags(args, {"--from", "--to", "--points", "--at", "--time", "--field", "--output"}, {}, 1, "sample");
      const ResultsFolder results = open_results(flags.positional[0]);
      if (!results.fields)
        throw PostInputError(flags.positional[0] + "/fields/fields.pvd", "the fields of the run", "no such file");
      const unsigned int dim = results.summary.dimension;
      std::vector<Point> points;
      const bool line = flags.has("--from") || flags.has("--to");
      if (line == flags.has("--at"))
        throw PostInputError("command line", "either --from and --to (a line) or --at (points)",
                             line ? "both" : "neither");
      if (line)
        {
          if (!flags.has("--from") || !flags.has("--to"))
            throw PostInputError("command line", "both --from and --to", "only one of them");
          double n = 0;
          const std::string text = flags.get("--points", "101");
          if (!parse_number(text, n) || n < 2 || n > 1e7 || n != std::floor(n))
            throw PostInputError("command line", "--points a whole number from 2 to 10000000", "'" + text + "'");
          points = line_points(parse_point(flags.get("--from", ""), dim, "--from"),
                               parse_point(flags.get("--to", ""), dim, "--to"), static_cast<unsigned int>(n));
        }
      else
        for (const auto &at : flags.all("--at"))
          points.push_back(parse_point(at, dim, "--at"));
      const std::vector<std::string> fields = field_list(flags, {"concentration"});
      const FieldSeries &series = *results.fields;
      const auto indices = series.select(flags.get("--time", "all"));

      std::string csv;
      const char *axes[3] = {"x", "y", "z"};
      for (std::size_t n = 0; n < indices.size(); ++n)
        {
          const std::size_t k = indices[n];
          const auto grid = series.load(k);
          const Samples samples =
            sample_fields(grid, points, fields, dim, results.summary.degree, series.times()[k].file);
          if (n == 0)
            {
              csv = "time [s],point,distance [m]";
              for (unsigned int d = 0; d < dim; ++d)
                csv += std::string(",") + axes[d] + " [m]";
              for (const auto &column : samples.columns)
                {
                  const std::string base = column.substr(0, column.find('.'));
                  const std::string unit = field_unit(base, results.summary.unit_concentration);
                  csv += "," + column + (unit == "1" ? "" : " [" + unit + "]");
                }
              csv += "\n";
            }
          for (std::size_t i = 0; i < points.size(); ++i)
            {
              csv += cell(series.times()[k].time) + "," + std::to_string(i) + "," + cell(samples.distance[i]);
              for (unsigned int d = 0; d < dim; ++d)
                csv += "," + cell(points[i][d]);
              for (const auto &values : samples.values)
                csv += "," + cell(values[i]);
              csv += "\n";
            }
        }
      emit_csv(flags, csv);
      return 0;
    }

    int command_integrate(const std::vector<std::string> &args)
    {
      const Flags flags = parse_flags(args, {"--time", "--field", "--output"}, {}, 1, "integrate");
      const ResultsFolder results = open_results(flags.positional[0]);
      if (!results.fields)
        throw PostInputError(flags.positional[0] + "/fields/fields.pvd", "the fields of the run", "no such file");
      const std::vector<std::string> fields = field_list(flags, {"amount_per_volume", "concentration"});
      const FieldSeries &series = *results.fields;
      const RunSummary &s = results.summary;
      const bool radial = s.coordinates != "cartesian";
      const std::string measure_unit = radial ? (s.coordinates == "cylinder" ? "m2" : "m3")
                                              : (s.dimension == 1 ? "m" : "m" + std::to_string(s.dimension));
      std::string csv = "time [s],region,measure [" + measure_unit + "]";
      for (const auto &field : fields)
        {
          const std::string unit = field_unit(field, s.unit_concentration);
          csv += ",integral." + field + " [" +
                 (unit == s.unit_concentration ? s.unit_amount : unit + " " + measure_unit) + "]";
        }
      csv += "\n";
      for (const std::size_t k : series.select(flags.get("--time", "all")))
        {
          const auto grid = series.load(k);
          const RegionIntegrals integrals = integrate_regions(grid, s, fields, series.times()[k].file);
          std::vector<double> totals(fields.size(), 0.0);
          double measure = 0;
          for (std::size_t r = 0; r < integrals.regions.size(); ++r)
            {
              csv +=
                cell(series.times()[k].time) + "," + csv_text(integrals.regions[r]) + "," + cell(integrals.measure[r]);
              measure += integrals.measure[r];
              for (std::size_t f = 0; f < fields.size(); ++f)
                {
                  csv += "," + cell(integrals.values[f][r]);
                  totals[f] += integrals.values[f][r];
                }
              csv += "\n";
            }
          csv += cell(series.times()[k].time) + ",total," + cell(measure);
          for (const double t : totals)
            csv += "," + cell(t);
          csv += "\n";
        }
      emit_csv(flags, csv);
      return 0;
    }

    int command_compare(const std::vector<std::string> &args)
    {
      const Flags flags = parse_flags(args, {"--field", "--tolerance", "--output"}, {}, 2, "compare");
      double tolerance = -1;
      if (flags.has("--tolerance"))
        {
          const std::string text = flags.get("--tolerance", "");
          if (!parse_number(text, tolerance) || !(tolerance >= 0))
            throw PostInputError("command line", "--tolerance a number >= 0 (relative difference)", "'" + text + "'");
        }
      for (const auto &folder : flags.positional)
        require_folder(folder, "a results folder written by `fickcast run`");
      const Comparison comparison = compare_results(flags.positional[0], flags.positional[1], field_list(flags, {}));
      std::string csv = "time [s],field,largest_difference,unit,largest_magnitude_in_A,relative_difference,x [m],y "
                        "[m],z [m],compared\n";
      const FieldDifference *worst = nullptr;
      for (const auto &row : comparison.rows)
        {
          csv += cell(row.time) + "," + row.field + "," + cell(row.largest) + "," + row.unit + "," +
                 cell(row.magnitude) + "," + cell(row.relative) + "," + cell(row.where[0]) + "," + cell(row.where[1]) +
                 "," + cell(row.where[2]) + "," + std::to_string(row.compared) + "\n";
          if (worst == nullptr || row.relative > worst->relative)
            worst = &row;
        }
      emit_csv(flags, csv);
      if (worst != nullptr && flags.has("--output"))
        std::cout << "largest relative difference " << format_number(worst->relative, 3) << " (" << worst->field
                  << " at t = " << format_time(worst->time) << "; " << comparison.method << ")\n";
      if (tolerance >= 0 && worst != nullptr && worst->relative > tolerance)
        {
          std::cerr << "fickcast-post: compare: " << worst->field << " at t = " << format_time(worst->time)
                    << " differs by " << format_number(worst->relative, 3) << " (relative), more than the tolerance "
                    << format_number(tolerance, 3) << '\n';
          return 1;
        }
      return 0;
    }

    PlotFormats formats_of(const Flags &flags)
    {
      PlotFormats formats;
      if (flags.has("--png-only") && flags.has("--svg-only"))
        throw PostInputError("command line", "at most one of --png-only and --svg-only", "both");
      formats.png = !flags.has("--svg-only");
      formats.svg = !flags.has("--png-only");
      return formats;
    }

    int command_plots(const std::vector<std::string> &args)
    {
      const Flags flags = parse_flags(args, {"--output"}, {"--sqrt-time", "--png-only", "--svg-only"}, 1, "plots");
      const ResultsFolder results = open_results(flags.positional[0]);
      RunPlotOptions options;
      options.formats = formats_of(flags);
      options.sqrt_time = flags.has("--sqrt-time");
      const std::string folder = flags.get("--output", flags.positional[0] + "/plots");
      const auto plots = make_run_plots(results, folder, options);
      for (const auto &plot : plots)
        std::cout << folder << "/" << plot.stem << (options.formats.png ? ".png" : ".svg") << "  " << plot.title
                  << '\n';
      return 0;
    }

    int command_report(const std::vector<std::string> &args)
    {
      const Flags flags = parse_flags(args, {"--output", "--verification"}, {"--sqrt-time", "--no-svg"}, 1, "report");
      ReportOptions options;
      options.output_folder = flags.get("--output", "");
      options.verification_report = flags.get("--verification", "");
      options.sqrt_time = flags.has("--sqrt-time");
      options.formats.svg = !flags.has("--no-svg");
      const std::string &folder = flags.positional[0];
      const ReportOutcome outcome = make_any_report(folder, options);
      std::cout << outcome.html << '\n';
      return 0;
    }
  } // namespace

  std::string usage_text(const std::string &command)
  {
    const std::map<std::string, std::string> commands{
      {"sample", "usage: fickcast-post sample RESULTS (--from X[,Y[,Z]] --to X[,Y[,Z]] [--points N] | --at "
                 "X[,Y[,Z]] ...)\n"
                 "         [--time T|last|all] [--field NAME[,NAME]] [--output FILE.csv]\n"
                 "  Field values along a straight line (N evenly spaced points, ends included) or at points,\n"
                 "  at the chosen output times (default all); empty cells outside the mesh. Coordinates in m.\n"},
      {"integrate", "usage: fickcast-post integrate RESULTS [--time T|last|all] [--field NAME[,NAME]] [--output "
                    "FILE.csv]\n"
                    "  Integrals of point fields (default amount_per_volume, concentration) over each region and in\n"
                    "  total, exact for the written finite-element function; amount_per_volume gives the amounts.\n"},
      {"compare", "usage: fickcast-post compare A B [--field NAME[,NAME]] [--tolerance REL] [--output FILE.csv]\n"
                  "  Largest difference per field and output time between results folders A and B, and relative to\n"
                  "  the largest magnitude in A. Exit 1 if a relative difference exceeds --tolerance.\n"},
      {"plots", "usage: fickcast-post plots RESULTS [--output DIR] [--sqrt-time] [--png-only|--svg-only]\n"
                "  Profiles, point histories, depths, released fraction and amounts as PNG and SVG (default\n"
                "  RESULTS/plots).\n"},
      {"report", "usage: fickcast-post report RESULTS|STUDY [--output DIR] [--verification FILE] [--sqrt-time] "
                 "[--no-svg]\n"
                 "  Plots and a self-contained HTML report, RESULTS/report/index.html by default. A folder with\n"
                 "  sweep.csv gets a study report.\n"}};
    if (!command.empty() && commands.count(command))
      return commands.at(command);
    std::string text = "usage: fickcast-post COMMAND ARGUMENTS   (COMMAND --help for one command)\n"
                       "Reads what `fickcast run` wrote. Times: seconds or with a unit (s, min, h, d, yr).\n"
                       "Exit codes: 0 done, 1 compare beyond tolerance, 2 bad input, 3 I/O error.\n\n";
    for (const auto &[name, help] : commands)
      text += help;
    return text;
  }

  int run_command(const std::vector<std::string> &arguments)
  {
    if (arguments.empty())
      throw PostInputError("command line", "a command: sample, integrate, compare, plots or report", "none");
    const std::string &command = arguments[0];
    if (command == "--help" || command == "-h" || command == "help")
      {
        std::cout << usage_text();
        return 0;
      }
    if (command == "--version")
      {
        std::cout << "fickcast-post " << FICKCAST_POST_VERSION << '\n';
        return 0;
      }
    const std::vector<std::string> rest(arguments.begin() + 1, arguments.end());
    for (const auto &a : rest)
      if (a == "--help" || a == "-h")
        {
          std::cout << usage_text(command);
          return 0;
        }
    if (command == "sample")
      return command_sample(rest);
    if (command == "integrate")
      return command_integrate(rest);
    if (command == "compare")
      return command_compare(rest);
    if (command == "plots")
      return command_plots(rest);
    if (command == "report")
      return command_report(rest);
    throw PostInputError("command line", "a command: sample, integrate, compare, plots or report", "'" + command + "'");
  }
} // namespace fickcast::post
