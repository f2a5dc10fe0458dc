#include "app/exit_codes.h"
#include "app/report_request.h"
#include "app/verbs.h"
#include "case/display_units.h"

#include "case/case_reader.h"
#include "case/input_error.h"
#include "numerics/collective.h"
#include "studies/case_summary.h"
#include "studies/result_names.h"
#include "studies/study_plan.h"
#include "studies/study_runner.h"

#include <deal.II/base/mpi.h>

#include <cmath>
#include <cstdio>

namespace fickcast
{
  namespace
  {
    /// A sweep's cases with their parameters and results in the case's units, read back from
    /// each case's summary.json (the same numbers as sweep.csv). Long sweeps: see sweep.csv.
    void print_case_results(const std::vector<StudyCase> &cases, const std::vector<std::string> &order,
                            const std::string &folder, const DisplayUnits &units)
    {
      constexpr std::size_t most = 40;
      if (cases.size() > most)
        {
          std::printf("  (%zu cases: each one's parameters and results are in sweep.csv)\n", cases.size());
          return;
        }
      for (const auto &c : cases)
        {
          std::string line = "  " + c.id + ":";
          for (const auto &[key, value] : c.parameters)
            line += " " + key + " = " + value + ";";
          std::printf("%s\n", line.c_str());
          CaseSummary summary;
          try
            {
              summary = read_case_summary(folder + "/cases/" + c.id + "/summary.json", order);
            }
          catch (const std::exception &)
            {
              std::printf("      no results (see sweep.csv)\n");
              continue;
            }
          if (summary.status != "completed")
            {
              std::printf("      %s: %s\n", summary.status.c_str(), summary.message.c_str());
              continue;
            }
          line = "     ";
          for (const auto &r : summary.results)
            {
              line += " " + r.name + " " + units.result(r.value, r.unit, is_event_result(r.name)) + ";";
            }
          std::printf("%s\n", line.c_str());
        }
    }

    /**
     * An error in a `--vary KEY=values` named as the user wrote it: the command line turns it into
     * the override `sweep.vary.KEY=values`, which the case reader reports as a `--set`.
     */
    InputError as_vary_error(const InputError &error, const Invocation &invocation)
    {
      const std::string prefix = "sweep.vary.";
      if (error.where() != "--set" || error.key().rfind(prefix, 0) != 0)
        return error;
      const auto key_of = [](const std::string &text) { return text.substr(0, text.find('=')); };
      for (const auto &o : invocation.overrides)
        if (key_of(o) == error.key())
          return error; // written as --set sweep.vary.KEY=...: that is where it is
      for (const auto &v : invocation.vary)
        if (key_of(v) == error.key())
          return InputError("--vary", error.key().substr(prefix.size()), error.message());
      return error;
    }
  } // namespace

  int verb_sweep(const Invocation &invocation, MPI_Comm communicator)
  {
    const unsigned int rank = dealii::Utilities::MPI::this_mpi_process(communicator);
    const unsigned int n_ranks = dealii::Utilities::MPI::n_mpi_processes(communicator);
    std::vector<std::string> overrides = invocation.overrides;
    overrides.insert(overrides.end(), invocation.vary.begin(), invocation.vary.end());
    CaseDescription base;
    std::vector<StudyCase> cases;
    try
      {
        base = read_case(invocation.case_file, overrides);
        if (!base.sweep.given())
          throw InputError(base.file, "sweep",
                           "expected a [sweep] section with vary.KEY = values (a sweep) or sample.KEY = "
                           "distribution (an uncertainty study), or --vary KEY=values; found neither");
        for (const auto &limit : base.sweep.limits)
          result_level(base, limit.result, limit.level, limit.origin,
                       std::string("sweep.") + (limit.above ? "exceed." : "below.") + limit.result);
        cases = plan_study(base);
        collectively(communicator, [&] {
          if (rank == 0)
            check_study_values(base, invocation.case_file, overrides);
        });
      }
    catch (const InputError &error)
      {
        throw as_vary_error(error, invocation);
      }
    const SweepSpec &sweep = base.sweep;

    StudyOptions options;
    options.case_file = invocation.case_file;
    options.base_overrides = overrides;
    options.folder = invocation.output.empty() ? base.output.folder + "_sweep" : invocation.output;
    options.overwrite = invocation.overwrite;

    const bool talk = !invocation.quiet;
    if (talk && rank == 0)
      {
        std::string keys;
        for (const auto &p : sweep.sample.empty() ? sweep.vary : sweep.sample)
          keys += (keys.empty() ? "" : ", ") + p.key;
        std::printf("%s: %s\n", base.file.c_str(), base.title.c_str());
        if (sweep.sample.empty())
          std::printf("  sweep of %zu cases (%s over %s) on %u rank%s\n", cases.size(),
                      sweep.zip ? "lists zipped" : "every combination", keys.c_str(), n_ranks, n_ranks > 1 ? "s" : "");
        else
          std::printf("  uncertainty study: %zu Latin hypercube samples (seed %lu) of %s on %u rank%s\n", cases.size(),
                      sweep.seed, keys.c_str(), n_ranks, n_ranks > 1 ? "s" : "");
        std::fflush(stdout);
      }
    const StudyTotals totals = run_study(base, cases, options, communicator, [&](const CaseEvent &event) {
      if (!talk || event.status == "already done")
        return;
      std::printf("  %s %-9s %7.2f s (rank %u)%s%s\n", event.id.c_str(), event.status.c_str(), event.wall_time,
                  event.rank, event.message.empty() ? "" : ": ", event.message.c_str());
      std::fflush(stdout);
    });

    if (totals.interrupted)
      {
        if (rank == 0)
          std::fprintf(stderr,
                       "fickcast: sweep interrupted: %zu cases finished in this run; run the same command again to "
                       "compute the rest (finished cases are kept)\n",
                       totals.computed);
        return exit_interrupted;
      }
    std::size_t not_completed = 0;
    for (const auto &[status, count] : totals.table.statuses)
      not_completed += status == "completed" ? 0 : count;
    not_completed = dealii::Utilities::MPI::broadcast(communicator, not_completed, 0);
    const int study_code = not_completed == 0 ? exit_success : exit_run_failed;
    if (rank != 0)
      return study_code;
    if (!talk)
      {
        const int report_code = invocation.report ? write_report(options.folder, true) : exit_success;
        return study_code != exit_success ? study_code : report_code;
      }

    std::printf("  %zu cases: %zu run now, %zu kept from an earlier run;", totals.cases, totals.computed,
                totals.reused);
    for (const auto &[status, count] : totals.table.statuses)
      std::printf(" %u %s", count, status.c_str());
    std::printf("\n");
    const DisplayUnits units(base);
    if (sweep.sample.empty())
      print_case_results(cases, result_order(base), options.folder, units);
    for (const auto &s : totals.table.statistics)
      {
        std::printf("  %s (%zu cases): mean %s, P5 %s, P50 %s, P95 %s\n", s.name.c_str(), s.n,
                    units.result(s.mean, s.unit).c_str(), units.result(s.p5, s.unit).c_str(),
                    units.result(s.p50, s.unit).c_str(), units.result(s.p95, s.unit).c_str());
        if (s.not_reached > 0)
          std::printf("    not reached within time.end in %zu of %zu cases (no mean)\n", s.not_reached, s.n);
        for (const auto &limit : s.limits)
          std::printf("    probability %s %s: %.3g (standard error %.2g)\n", limit.above ? "above" : "below",
                      limit.level_text.c_str(), limit.probability, limit.standard_error);
      }
    std::printf("results: %s/sweep.csv\n", options.folder.c_str());
    std::printf("  Model predictions support, but do not replace, testing and engineering judgement; see the\n"
                "  README's cautions before using them for medical, containment or safety decisions.\n");
    if (not_completed > 0)
      std::fprintf(stderr, "fickcast: %zu of %zu cases did not complete; sweep.csv gives each one's message\n",
                   not_completed, totals.cases);
    std::fflush(stdout);
    const int report_code = invocation.report ? write_report(options.folder, false) : exit_success;
    return study_code != exit_success ? study_code : report_code;
  }
} // namespace fickcast
