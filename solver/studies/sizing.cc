#include "studies/sizing.h"

#include "case/case_reader.h"
#include "case/input_error.h"
#include "case/quantity_text.h"
#include "case/units.h"
#include "numerics/collective.h"
#include "results/json_file.h"
#include "results/summary.h"
#include "run/results_folder.h"
#include "run/run_case.h"
#include "studies/case_summary.h"
#include "studies/result_names.h"
#include "studies/study_plan.h"

#include <boost/math/tools/toms748_solve.hpp>

#include <algorithm>
#include <cmath>
#include <cstdio>
#include <fstream>
#include <memory>

namespace fickcast
{
  namespace
  {
    std::string format_value(const double value, const std::string &unit)
    {
      char buffer[64];
      std::snprintf(buffer, sizeof(buffer), "%.12g", value);
      return unit.empty() ? std::string(buffer) : std::string(buffer) + " " + unit;
    }

    std::string csv_number(const double value)
    {
      if (!std::isfinite(value))
        return "";
      char buffer[32];
      std::snprintf(buffer, sizeof(buffer), "%.12g", value);
      return buffer;
    }

    /// The range ends in the unit of size.from.
    void read_range(const CaseDescription &base, SizingOutcome &outcome)
    {
      const SizeSpec &s = base.size;
      QuantityText low, high;
      try
        {
          low = split_quantity(s.parameter.values.at(0), false);
        }
      catch (const UnitError &error)
        {
          throw InputError(s.parameter.origin, "size.from", error.what());
        }
      try
        {
          high = split_quantity(s.parameter.values.at(1), false);
        }
      catch (const UnitError &error)
        {
          throw InputError(s.parameter.origin, "size.to", error.what());
        }
      outcome.parameter_unit = low.unit;
      outcome.low = low.number;
      if (low.unit.empty() != high.unit.empty())
        throw InputError(s.parameter.origin, "size.to",
                         "expected size.from and size.to both with units or both without, found '" +
                           s.parameter.values[0] + "' and '" + s.parameter.values[1] + "'");
      try
        {
          outcome.high =
            high.unit.empty() ? high.number : UnitSystem::instance().to_si(high.number, high.unit, low.unit);
        }
      catch (const UnitError &error)
        {
          throw InputError(s.parameter.origin, "size.to",
                           "expected the same kind of unit as size.from ('" + low.unit + "'): " + error.what());
        }
      if (!(outcome.low != outcome.high))
        throw InputError(s.parameter.origin, "size.to",
                         "expected a range, found both ends at " + format_value(outcome.low, low.unit));
      if (outcome.low > outcome.high)
        std::swap(outcome.low, outcome.high);
    }
  } // namespace

  SizingOutcome prepare_sizing(const CaseDescription &base, const std::string &case_file,
                               const std::vector<std::string> &base_overrides)
  {
    const SizeSpec &spec = base.size;
    if (!spec.given())
      throw InputError(base.file, "size.parameter",
                       "expected a [size] section with parameter, from, to, result and aim, "
                       "found no size.parameter");
    SizingOutcome outcome;
    outcome.key = spec.parameter.key;
    outcome.result_name = spec.result;
    read_range(base, outcome);
    // Checks the key before any run: a layer the case lacks fails here.
    parameter_overrides(base, outcome.key, format_value(outcome.low, outcome.parameter_unit), spec.parameter.origin);

    // An unknown result name is the fault of size.result (where it is written); a bad level, of size.aim.
    result_level(base, outcome.result_name, "0", spec.result_origin, "size.result");
    outcome.target = result_level(base, outcome.result_name, spec.aim, spec.aim_origin, "size.aim");
    for (const auto &r : expected_results(base))
      if (r.name == outcome.result_name)
        outcome.result_unit = r.unit;

    // Events (a threshold or release level reached) may not happen within time.end; such a run
    // counts as "later than time.end", which brackets a target before time.end.
    const bool event = is_event_result(outcome.result_name);
    if (event && !(outcome.target < base.time.end))
      {
        const QuantityText target_text = split_quantity(spec.aim, false);
        const double end = target_text.unit.empty()
                             ? base.time.end
                             : base.time.end / UnitSystem::instance().to_si(1.0, target_text.unit, outcome.result_unit);
        throw InputError(spec.aim_origin, "size.aim",
                         "expected a time before time.end (" + format_value(end, target_text.unit) + ") for " +
                           outcome.result_name + ", found '" + spec.aim + "': lengthen time.end");
      }

    if (!case_file.empty())
      for (const double end : {outcome.low, outcome.high})
        {
          const std::string value = format_value(end, outcome.parameter_unit);
          std::vector<std::string> overrides = base_overrides;
          for (const auto &o : parameter_overrides(base, outcome.key, value, spec.parameter.origin))
            overrides.push_back(o);
          try
            {
              read_case(case_file, overrides);
            }
          catch (const InputError &error)
            {
              throw InputError(spec.parameter.origin, "size.parameter",
                               "the case rejects " + outcome.key + " = '" + value + "': " + rejection_reason(error));
            }
        }
    return outcome;
  }

  SizingOutcome run_sizing(const CaseDescription &base, const SizingOptions &options, MPI_Comm communicator,
                           const std::function<void(const SizingRun &)> &on_evaluation)
  {
    const SizeSpec &spec = base.size;
    const unsigned int rank = dealii::Utilities::MPI::this_mpi_process(communicator);
    SizingOutcome outcome = prepare_sizing(base);
    const bool event = is_event_result(outcome.result_name);
    // Results in the target's unit as written, for messages.
    const QuantityText target_text = split_quantity(spec.aim, false);
    const auto shown = [&](const double value) {
      if (!std::isfinite(value))
        return std::string(event ? "not reached" : "missing");
      if (target_text.unit.empty())
        return format_value(value, outcome.result_unit == "1" ? "" : outcome.result_unit);
      return format_value(value / UnitSystem::instance().to_si(1.0, target_text.unit, outcome.result_unit),
                          target_text.unit);
    };

    // The sizing folder, complete or absent; rank 0 owns it, every rank learns its path.
    std::unique_ptr<ResultsFolder> folder;

    std::string path;
    collectively(communicator, [&] {
      if (rank == 0)
        {
          folder = std::make_unique<ResultsFolder>(options.folder, options.overwrite);
          path = folder->path();
        }
    });
    path = dealii::Utilities::MPI::broadcast(communicator, path, 0);

    auto evaluate = [&](const double p) -> double {
      SizingRun e;
      e.index = static_cast<unsigned int>(outcome.evaluations.size() + 1);
      e.parameter = p;
      e.value = format_value(p, outcome.parameter_unit);
      char name[32];
      std::snprintf(name, sizeof(name), "run_%02u", e.index);
      std::vector<std::string> overrides = options.base_overrides;
      for (const auto &o : parameter_overrides(base, outcome.key, e.value, spec.parameter.origin))
        overrides.push_back(o);
      const CaseDescription description = read_case(options.case_file, overrides);
      RunOptions run;
      run.folder = path + "/runs/" + name;
      run.overwrite = true;
      const RunOutcome ran = run_case(description, run, communicator);
      if (ran.record.status == "interrupted")
        throw Interrupted("sizing interrupted after " + std::to_string(outcome.evaluations.size()) +
                          " run(s): run the same command again to start it over");
      e.status = ran.record.status;
      e.message = ran.record.message;
      e.folder = options.folder + "/runs/" + name;

      double value = std::nan("");
      collectively(communicator, [&] {
        if (rank != 0)
          return;
        const CaseSummary summary = read_case_summary(ran.folder + "/summary.json", result_order(description));
        const NamedResult *r = summary.find(outcome.result_name);
        if (r == nullptr)
          {
            std::string names;
            for (const auto &n : summary.results)
              names += (names.empty() ? "" : ", ") + n.name;
            throw InputError(spec.result_origin, "size.result",
                             "expected a named result of the case (" + names + "), found '" + outcome.result_name +
                               "'");
          }
        value = r->value;
      });
      value = dealii::Utilities::MPI::broadcast(communicator, value, 0);
      e.result = value;
      e.difference = std::isnan(value) && event ? std::max(description.time.end, outcome.target) - outcome.target
                                                : value - outcome.target;
      outcome.evaluations.push_back(e);
      if (on_evaluation)
        on_evaluation(e);
      if (e.status != "completed")
        throw RunFailure("sizing: the run at " + outcome.key + " = " + e.value + " failed: " + e.message);
      return e.difference;
    };

    const double f_low = evaluate(outcome.low);
    const double f_high = evaluate(outcome.high);
    const auto &first = outcome.evaluations[0], &second = outcome.evaluations[1];
    const std::string ends = "at " + outcome.key + " = " + first.value + ", " + outcome.result_name + " = " +
                             shown(first.result) + "; at " + second.value + ", " + shown(second.result);
    if (!std::isfinite(f_low) || !std::isfinite(f_high))
      throw InputError(spec.result_origin, "size.result",
                       "expected " + outcome.result_name + " at both ends of the range, found it missing (" + ends +
                         ")");
    if ((f_low > 0 && f_high > 0) || (f_low < 0 && f_high < 0))
      throw InputError(spec.aim_origin, "size.aim",
                       "expected a range whose ends give results on either side of the aim " + shown(outcome.target) +
                         ", found " + ends + ": widen or move the range");
    outcome.bracketed = true;

    double a = outcome.low, b = outcome.high, fa = f_low, fb = f_high;
    if (f_low == 0 || f_high == 0)
      {
        a = b = f_low == 0 ? outcome.low : outcome.high;
        fa = fb = 0;
        outcome.converged = true;
      }
    else
      {
        const double tolerance = spec.tolerance;
        boost::uintmax_t allowed = spec.max_runs > 3 ? spec.max_runs - 3 : 1;
        const auto narrow_enough = [tolerance](const double x, const double y) {
          return std::abs(y - x) <= tolerance * std::min(std::abs(x), std::abs(y));
        };
        const auto bracket =
          boost::math::tools::toms748_solve(evaluate, outcome.low, outcome.high, f_low, f_high, narrow_enough, allowed);
        a = bracket.first;
        b = bracket.second;
        outcome.converged = narrow_enough(a, b) || a == b;
        // The function values at the bracket ends, from the runs made there.
        for (const auto &e : outcome.evaluations)
          {
            if (e.parameter == a)
              fa = e.difference;
            if (e.parameter == b)
              fb = e.difference;
          }
      }
    outcome.bracket_low = a;
    outcome.bracket_high = b;
    if (!outcome.converged)
      throw RunFailure("sizing: no convergence in " + std::to_string(outcome.evaluations.size()) +
                       " runs (size.max_runs); the answer lies between " + outcome.key + " = " +
                       format_value(a, outcome.parameter_unit) + " and " + format_value(b, outcome.parameter_unit));

    // The answer: the secant point of the final bracket, run once more (unless it is an end).
    double answer = a;
    if (a != b)
      answer = fb != fa ? std::clamp(a - fa * (b - a) / (fb - fa), a, b) : 0.5 * (a + b);
    const auto existing = std::find_if(outcome.evaluations.begin(), outcome.evaluations.end(),
                                       [answer](const SizingRun &e) { return e.parameter == answer; });
    if (existing == outcome.evaluations.end())
      evaluate(answer);
    const auto final = std::find_if(outcome.evaluations.begin(), outcome.evaluations.end(),
                                    [answer](const SizingRun &e) { return e.parameter == answer; });
    outcome.value = answer;
    outcome.result = final->result;

    collectively(communicator, [&] {
      if (rank != 0)
        return;
      const std::string unit_p = outcome.parameter_unit.empty() ? "" : " [" + outcome.parameter_unit + "]";
      const std::string unit_r =
        outcome.result_unit.empty() || outcome.result_unit == "1" ? "" : " [" + outcome.result_unit + "]";
      {
        std::ofstream out(path + "/size.csv");
        out << "run," << outcome.key << unit_p << ',' << outcome.result_name << unit_r << ",status,answer,folder\n";
        for (const auto &e : outcome.evaluations)
          out << e.index << ',' << csv_number(e.parameter) << ',' << csv_number(e.result) << ',' << e.status << ','
              << (e.index == final->index ? "yes" : "no") << ",runs/run_" << (e.index < 10 ? "0" : "") << e.index
              << '\n';
        if (!out)
          throw IoError("cannot write " + path + "/size.csv");
      }
      Json::Value summary(Json::objectValue);
      summary["program"] = "fickcast";
      summary["version"] = fickcast_version();
      summary["kind"] = "size";
      summary["title"] = base.title;
      summary["method"] = "bracketing root finder of Alefeld, Potra and Shi (ACM TOMS algorithm 748), "
                          "Boost.Math toms748_solve; answer at the secant point of the final bracket";
      summary["parameter"] = outcome.key;
      summary["unit"] = outcome.parameter_unit;
      Json::Value range(Json::arrayValue);
      range.append(outcome.low);
      range.append(outcome.high);
      summary["range"] = range;
      summary["result_name"] = outcome.result_name;
      summary["result_unit"] = outcome.result_unit;
      summary["aim"] = outcome.target;
      summary["tolerance_relative"] = spec.tolerance;
      summary["value"] = outcome.value;
      summary["value_text"] = format_value(outcome.value, outcome.parameter_unit);
      summary["result"] = outcome.result;
      Json::Value bracket(Json::arrayValue);
      bracket.append(outcome.bracket_low);
      bracket.append(outcome.bracket_high);
      summary["bracket"] = bracket;
      summary["runs"] = static_cast<unsigned long>(outcome.evaluations.size());
      summary["answer_folder"] = final->folder;
      write_json(summary, path + "/size_summary.json");
      folder->commit();
    });
    outcome.folder = options.folder;
    return outcome;
  }
} // namespace fickcast
