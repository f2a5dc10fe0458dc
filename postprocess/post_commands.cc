#include "post_commands.h"

#include "case_unit_table.h"
#include "csv_table.h"
#include "field_sampler.h"
#include "output_file.h"
#include "post_error.h"
#include "region_integrator.h"
#include "report.h"
#include "results_comparison.h"
#include "results_folder.h"
#include "run_plots.h"
#include "study_table.h"

#include "results/csv_writer.h"
#include "time_units.h"
#include "timed_samples.h"

#include <algorithm>
#include <cmath>
#include <cstdio>
#include <filesystem>
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

    std::vector<std::string> field_list(const Flags &flags, const std::vector<std::string> &fallback)
    {
      std::vector<std::string> fields;
      for (const auto &value : flags.all("--field"))
        for (const auto &name : split_csv_line(value))
          if (!name.empty())
            fields.push_back(name);
      return fields.empty() ? fallback : fields;
    }

    /// The units a study or sizing folder's cases were written in: those of its first run.
    DisplayUnits units_of_first_run(const std::string &runs_folder)
    {
      std::vector<std::string> candidates;
      if (std::filesystem::is_directory(runs_folder))
        for (const auto &entry : std::filesystem::directory_iterator(runs_folder))
          if (std::filesystem::is_regular_file(entry.path() / "summary.json"))
            candidates.push_back(entry.path().string());
      if (candidates.empty())
        throw PostInputError(runs_folder, "the runs of the study (each with its summary.json) for the case's units",
                             "none");
      std::sort(candidates.begin(), candidates.end());
      return case_units(read_run_summary(candidates.front() + "/summary.json"));
    }

    /// --units case|si: whether a table is written in the case's units.
    bool in_case_units(const Flags &flags, const std::string &fallback)
    {
      const std::string units = flags.get("--units", fallback);
      if (units != "case" && units != "si")
        throw PostInputError("--units", "`case` (the units the case was written in) or `si`", "'" + units + "'");
      return units == "case";
    }

    int command_sample(const std::vector<std::string> &args)
    {
      const Flags flags = parse_flags(
        args, {"--from", "--to", "--points", "--at", "--time", "--field", "--output", "--units"}, {}, 1, "sample");
      const ResultsFolder results = open_results(flags.positional[0]);
      if (!results.fields)
        throw PostInputError(flags.positional[0] + "/fields/fields.pvd", "the fields of the run", "no such file");
      const bool case_units_wanted = in_case_units(flags, "si");
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
      std::vector<std::string> notes;
      const std::vector<double> times = requested_times(series, flags.get("--time", "all"), notes);
      TimedSampler sampler(series, points, fields, dim, results.summary.degree);
      // The interpolation estimate in the unit of the concentration when that is the only field.
      std::string difference_unit;
      double difference_scale = 1;
      if (fields.size() == 1 && fields[0] == "concentration")
        {
          const DisplayUnits::Choice choice =
            case_units_wanted ? case_units(results.summary).for_si_unit(results.summary.unit_concentration)
                              : DisplayUnits::Choice{results.summary.unit_concentration, 1.0};
          difference_unit = choice.symbol == "1" ? "" : " " + choice.symbol;
          difference_scale = choice.si_per_unit;
        }

      std::string csv;
      const char *axes[3] = {"x", "y", "z"};
      for (std::size_t n = 0; n < times.size(); ++n)
        {
          const TimedSamples at = sampler.at(times[n]);
          const Samples &samples = at.samples;
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
          if (at.interpolated)
            {
              std::string note = "t = " + format_time(at.time) + " is not a stored state: values interpolated " +
                                 "linearly in time between " + format_time(at.before) + " and " + format_time(at.after);
              if (std::isfinite(at.difference))
                note += "; the quadratic through " + format_time(at.third) + " differs by at most " +
                        format_number(at.difference / difference_scale, 2) + difference_unit +
                        (at.largest > 0
                           ? " (" + format_number(100 * at.difference / at.largest, 2) + " % of the largest value)"
                           : std::string());
              notes.push_back(note);
            }
          for (std::size_t i = 0; i < points.size(); ++i)
            {
              csv += cell(at.time) + "," + std::to_string(i) + "," + cell(samples.distance[i]);
              for (unsigned int d = 0; d < dim; ++d)
                csv += "," + cell(points[i][d]);
              for (const auto &values : samples.values)
                csv += "," + cell(values[i]);
              csv += "\n";
            }
        }
      if (case_units_wanted)
        csv = table_in_case_units(CsvTable::parse(csv, "samples"), case_units(results.summary));
      emit_csv(flags, csv);
      for (const auto &note : notes)
        std::cerr << "fickcast-post: sample: " << note << "\n";
      return 0;
    }

    int command_table(const std::vector<std::string> &args)
    {
      const Flags flags = parse_flags(args, {"--which", "--output", "--units"}, {}, 1, "table");
      const std::string &folder = flags.positional[0];
      require_folder(folder, "a results folder, a study folder or a sizing folder");
      const bool case_units_wanted = in_case_units(flags, "case");
      const std::string which = flags.get("--which", "");
      auto write = [&](const CsvTable &table, const DisplayUnits &units, const bool events) {
        emit_csv(flags, case_units_wanted ? table_in_case_units(table, units, events)
                                          : read_file(table.path(), "a CSV table"));
        return 0;
      };
      if (is_study_folder(folder) || is_size_folder(folder))
        {
          const bool study = is_study_folder(folder);
          if (!which.empty() && which != (study ? "study" : "size"))
            throw PostInputError(
              "--which", study ? "`study` (the table of a study folder)" : "`size` (the table of a sizing folder)",
              "'" + which + "'");
          const CsvTable table = study ? read_study(folder).table : CsvTable::read(folder + "/size.csv");
          return write(table, units_of_first_run(folder + (study ? "/cases" : "/runs")), study);
        }
      const ResultsFolder results = open_results(folder);
      const DisplayUnits units = case_units(results.summary);
      if (which.empty() || which == "series")
        return write(results.series, units, false);
      if (which == "profiles")
        {
          if (!results.profiles)
            throw PostInputError(folder + "/profiles.csv", "the profiles of the run (a line.NAME in [output])",
                                 "no such file");
          return write(*results.profiles, units, false);
        }
      throw PostInputError("--which", "`series` or `profiles` (the tables of a results folder)", "'" + which + "'");
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
                cell(series.times()[k].time) + "," + csv_field(integrals.regions[r]) + "," + cell(integrals.measure[r]);
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

    /// The --map-time values, joined into one list.
    std::string map_times_of(const Flags &flags)
    {
      std::string times;
      for (const auto &value : flags.all("--map-time"))
        times += (times.empty() ? "" : ", ") + value;
      return times;
    }

    int command_plots(const std::vector<std::string> &args)
    {
      const Flags flags =
        parse_flags(args, {"--output", "--map-time"}, {"--sqrt-time", "--png-only", "--svg-only"}, 1, "plots");
      const ResultsFolder results = open_results(flags.positional[0]);
      RunPlotOptions options;
      options.formats = formats_of(flags);
      options.sqrt_time = flags.has("--sqrt-time");
      options.map_times = map_times_of(flags);
      const std::string folder = flags.get("--output", flags.positional[0] + "/plots");
      const auto plots = make_run_plots(results, folder, options);
      for (const auto &plot : plots)
        std::cout << folder << "/" << plot.stem << (options.formats.png ? ".png" : ".svg") << "  " << plot.title
                  << '\n';
      return 0;
    }

    int command_report(const std::vector<std::string> &args)
    {
      const Flags flags =
        parse_flags(args, {"--output", "--verification", "--map-time"}, {"--sqrt-time", "--no-svg"}, 1, "report");
      ReportOptions options;
      options.output_folder = flags.get("--output", "");
      options.verification_report = flags.get("--verification", "");
      options.sqrt_time = flags.has("--sqrt-time");
      options.formats.svg = !flags.has("--no-svg");
      options.map_times = map_times_of(flags);
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
                 "         [--time T[,T...]|last|all] [--field NAME[,NAME]] [--units si|case] [--output FILE.csv]\n"
                 "  Field values along a straight line (N evenly spaced points, ends included) or at points,\n"
                 "  at the chosen times (default all stored states); empty cells outside the mesh. Coordinates\n"
                 "  in m or with a length unit (`--at \"50 cm\"`, `--at \"10, 4 mm\"`). A time between two\n"
                 "  stored states is interpolated linearly in time; stderr says so, with an error estimate.\n"
                 "  --units case writes times, lengths and concentrations in the units of the case (default si).\n"},
      {"table", "usage: fickcast-post table FOLDER [--which series|profiles] [--units case|si] [--output FILE.csv]\n"
                "  A results folder's series.csv (or profiles.csv), a study's sweep.csv or a sizing's size.csv\n"
                "  written in the units of the case: times as time.end, lengths as the layers, concentrations,\n"
                "  amounts and rates as the printout, fractions in %, events not reached named. The SI files\n"
                "  stay as they are for scripts.\n"},
      {"integrate", "usage: fickcast-post integrate RESULTS [--time T|last|all] [--field NAME[,NAME]] [--output "
                    "FILE.csv]\n"
                    "  Integrals of point fields (default amount_per_volume, concentration) over each region and in\n"
                    "  total, exact for the written finite-element function; amount_per_volume gives the amounts.\n"},
      {"compare", "usage: fickcast-post compare A B [--field NAME[,NAME]] [--tolerance REL] [--output FILE.csv]\n"
                  "  Largest difference per field and output time between results folders A and B, and relative to\n"
                  "  the largest magnitude in A. Exit 1 if a relative difference exceeds --tolerance.\n"},
      {"plots", "usage: fickcast-post plots RESULTS [--output DIR] [--sqrt-time] [--png-only|--svg-only] [--map-time "
                "T[,T...]]\n"
                "  Profiles, point histories, depths, released fraction, amounts, rates per face and (2-D, 3-D)\n"
                "  field maps as PNG and SVG (default RESULTS/plots). --map-time: when to draw the field maps\n"
                "  (any time within the stored states; default the middle and the last one).\n"},
      {"report", "usage: fickcast-post report RESULTS|STUDY [--output DIR] [--verification FILE] [--sqrt-time] "
                 "[--no-svg] [--map-time T[,T...]]\n"
                 "  Plots and a self-contained HTML report, RESULTS/report/index.html by default. A folder with\n"
                 "  sweep.csv gets a study report.\n"}};
    if (!command.empty() && commands.count(command))
      return commands.at(command);
    std::string text =
      "usage: fickcast-post COMMAND ARGUMENTS   (COMMAND --help for one command)\n"
      "Reads what `fickcast run` wrote. Times: with a unit (s, min, h, d, yr, ...); a bare number is s.\n"
      "Exit codes: 0 done, 1 compare beyond tolerance, 2 bad input, 3 I/O error.\n\n";
    for (const auto &[name, help] : commands)
      text += help;
    return text;
  }

  int run_command(const std::vector<std::string> &arguments)
  {
    if (arguments.empty())
      throw PostInputError("command line", "a command: sample, table, integrate, compare, plots or report", "none");
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
    if (command == "table")
      return command_table(rest);
    if (command == "integrate")
      return command_integrate(rest);
    if (command == "compare")
      return command_compare(rest);
    if (command == "plots")
      return command_plots(rest);
    if (command == "report")
      return command_report(rest);
    throw PostInputError("command line", "a command: sample, table, integrate, compare, plots or report",
                         "'" + command + "'");
  }
} // namespace fickcast::post
