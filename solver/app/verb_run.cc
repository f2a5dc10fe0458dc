#include "app/exit_codes.h"
#include "app/progress.h"
#include "app/report_request.h"
#include "app/verbs.h"
#include "case/display_units.h"

#include "case/case_reader.h"
#include "run/run_case.h"

#include <deal.II/base/mpi.h>

#include <cmath>
#include <cstdio>
#include <functional>
#include <iostream>
#include <string>

namespace fickcast
{
  namespace
  {
    /// "120 -> 240 cells, 310 -> 650 steps": the solves of an accuracy check.
    std::string solves_text(const AccuracyRecord &a)
    {
      std::string cells, steps;
      for (const auto &solve : a.solves)
        {
          cells += (cells.empty() ? "" : " -> ") + std::to_string(solve.cells);
          steps += (steps.empty() ? "" : " -> ") + std::to_string(solve.steps);
        }
      return cells + " cells, " + steps + " steps";
    }
  } // namespace

  int verb_run(const Invocation &invocation, MPI_Comm communicator)
  {
    const bool root = dealii::Utilities::MPI::this_mpi_process(communicator) == 0;
    const CaseDescription description = read_case(invocation.case_file, invocation.overrides);
    const DisplayUnits units(description);
    ProgressLine progress(units, root && !invocation.quiet);

    RunOptions options;
    options.folder = invocation.output;
    options.overwrite = invocation.overwrite;
    options.checkpoints = true;
    options.resume = invocation.resume;
    options.progress = [&progress](const ProgressReport &report) { progress.update(report); };
    const RunOutcome outcome = run_case(description, options, communicator);
    progress.clear();
    const RunRecord &r = outcome.record;
    if (r.status == "interrupted")
      {
        // No numbers: an interrupted run has no results, only a state to continue from.
        if (root)
          std::cerr << "fickcast: interrupted at t = " << units.time(r.end_time) << " (step " << r.steps_accepted
                    << "); no results written\n"
                    << "  its state is kept in " << outcome.folder
                    << "; the same command with --resume continues it (the same --set values, --output and "
                       "number of ranks)\n";
        return exit_interrupted;
      }
    const int run_code = r.status == "completed" ? exit_success : exit_run_failed;
    if (!root)
      return run_code;
    if (r.status != "completed")
      {
        std::cerr << "fickcast: run failed: " << r.message << '\n';
        if (r.state_written)
          std::cerr << "  last good state (t = " << units.time(r.end_time) << ") written to " << outcome.folder << '\n';
        else
          std::cerr << "  it failed at the start: no state was good enough to write; " << outcome.folder
                    << " holds the settings and the message\n";
      }
    const auto warn = [&r] {
      std::fflush(stdout);
      for (const auto &warning : r.warnings)
        std::cerr << "fickcast: warning: " << warning << '\n';
    };
    if (invocation.quiet)
      {
        warn();
        const int report_code = invocation.report ? write_report(outcome.folder, true) : exit_success;
        return run_code != exit_success ? run_code : report_code;
      }

    std::printf("%s: %s\n", description.file.c_str(), description.title.c_str());
    std::printf("  %u-D, %lu cells, %lu unknowns (degree %u), %s, %u rank%s\n", r.dimension, r.cells, r.unknowns,
                r.degree, r.linear_solver.c_str(), r.ranks, r.ranks > 1 ? "s" : "");
    std::printf("  %u steps (%u rejected) to t = %s in %.2f s\n", r.steps_accepted, r.steps_rejected,
                units.time(r.end_time).c_str(), r.wall_time);
    if (r.remeshings > 0)
      std::printf("  remeshed %u times (cells above: the last mesh; at most %lu cells, %lu unknowns); amount added by "
                  "remeshing %.3g %s\n",
                  r.remeshings, r.cells_largest, r.unknowns_largest, r.remeshed_amount,
                  description.units.amount.c_str());
    if (r.carried_time_error >= 0)
      std::printf("  time error carried by the state (relative to the concentration scale): %.2g at the end, %.2g "
                  "at most (t = %s), time.tolerance %.2g%s\n",
                  r.carried_time_error, r.carried_time_error_largest,
                  units.time(r.carried_time_error_largest_at).c_str(), description.time.tolerance,
                  r.steps_at_floor > 0 ? " (more where steps were kept at a tenth of the time diffusion takes to cross "
                                         "the smallest cell: finer steps would not help that mesh)"
                                       : "");
    if (std::isfinite(r.resumed_at))
      std::printf("  resumed from its checkpoint at t = %s (the time above is this part's)\n",
                  units.time(r.resumed_at).c_str());
    // Each named result with its estimated error (numerics.accuracy), in the unit it is shown in.
    const AccuracyRecord &accuracy = r.accuracy;
    const auto estimate = [&](const std::string &name, const std::function<std::string(double)> &show) {
      const auto found = accuracy.estimates.find(name);
      if (found == accuracy.estimates.end())
        return std::string();
      if (!std::isfinite(found->second))
        return std::string(" (not confirmed: reached in one solve of the check only)");
      return " +- " + show(found->second) + " (estimated)";
    };
    const DisplayUnits brief(description, 2); // estimates: two significant digits
    const auto time = [&](double v) { return brief.time(v); };
    const auto concentration = [&](double v) { return brief.concentration(v); };
    const auto length = [&](double v) { return brief.length(v); };
    for (const auto &named_point : r.points)
      {
        if (std::isfinite(named_point.threshold))
          std::printf("  threshold.%s: %s%s (point %s reaches %s)\n", named_point.name.c_str(),
                      units.time(named_point.threshold_time).c_str(),
                      estimate("threshold." + named_point.name, time).c_str(), named_point.name.c_str(),
                      units.concentration(named_point.threshold).c_str());
        std::printf("  point.%s at the end: %s%s\n", named_point.name.c_str(),
                    units.concentration(named_point.final_value).c_str(),
                    estimate("point." + named_point.name + ".final", concentration).c_str());
      }
    for (const auto &depth : r.depths)
      if (!depth.depths.empty())
        std::printf("  depth.%s at the end: %s%s (where c falls below %s)\n", depth.name.c_str(),
                    std::isfinite(depth.depths.back()) ? units.length(depth.depths.back()).c_str()
                                                       : "below the whole domain",
                    estimate("depth." + depth.name, length).c_str(), units.concentration(depth.level).c_str());
    const std::string event_prefix = r.uptake ? "uptake." : "release.";
    for (const auto &release : r.releases)
      std::printf("  %s%s: %s%s (%.0f %% %s)\n", event_prefix.c_str(), release.name.c_str(),
                  units.time(release.time).c_str(), estimate(event_prefix + release.name, time).c_str(),
                  100 * release.level, r.uptake ? "taken up" : "released");
    for (std::size_t b = 0; b < r.boundaries.size() && b < r.bath_final.size(); ++b)
      if (std::isfinite(r.bath_final[b]))
        std::printf("  bath.%s.final: %s%s (the bath liquid on %s at the end)\n", r.boundaries[b].c_str(),
                    units.concentration(r.bath_final[b]).c_str(),
                    estimate("bath." + r.boundaries[b] + ".final", concentration).c_str(), r.boundaries[b].c_str());
    // The content fraction: released, or taken up (of what equilibrium with the faces would bring).
    if (std::isfinite(r.released_final) && (r.uptake || r.released_final >= 0))
      std::printf("  %s at the end: %.4g %%%s%s\n", r.uptake ? "uptake_fraction" : "released", 100 * r.released_final,
                  estimate(r.uptake ? "uptake_fraction.final" : "released_fraction.final",
                           [](double v) {
                             char text[32];
                             std::snprintf(text, sizeof text, "%.2g %%", 100 * v);
                             return std::string(text);
                           })
                    .c_str(),
                  r.uptake ? " (taken up, of what equilibrium with the open faces would bring)" : "");
    for (const auto &lag : r.time_lags)
      std::printf("  time_lag.%s: %s%s through %s%s\n", lag.name.c_str(), units.time(lag.time_lag).c_str(),
                  estimate("time_lag." + lag.name, time).c_str(), lag.boundary.c_str(),
                  lag.steady ? "" : " (flux not yet steady: the run may be too short)");
    const auto rate = [&](double v) { return brief.rate(v); };
    const auto amount = [&](double v) { return brief.amount(v); };
    for (const auto &face : r.face_results)
      {
        const std::string name = face.full_name();
        const std::string way = std::string(face.outward ? "out through " : "in through ") + face.boundary;
        std::string shown, context = way;
        if (face.prefix == "flux" || face.prefix == "steady_flux")
          shown = units.rate(face.value) + estimate(name, rate);
        else if (face.prefix == "crossed")
          shown = units.amount(face.value) + estimate(name, amount);
        else if (face.prefix == "peak_flux")
          shown = units.rate(face.value) + estimate(name, rate) + " at " + units.time(face.when) +
                  estimate(name + ".time", time);
        else
          shown = units.time(face.value) + estimate(name, time);
        if (face.prefix == "flux")
          context += " at " + units.time(face.asked_time);
        else if (face.prefix == "crossed")
          context += " by " + units.time(face.asked_time);
        else if (face.prefix == "flux_limit")
          context += " reaches " + units.rate(face.limit);
        else if (face.prefix == "crossed_limit")
          context += " reaches " + units.amount(face.limit);
        if (!face.note.empty())
          context += "; " + face.note;
        std::printf("  %s: %s (%s)\n", name.c_str(), shown.c_str(), context.c_str());
      }
    if (accuracy.requested <= 0)
      std::printf("  accuracy: off; these numbers are unchecked (one solve, no error estimate)\n");
    else
      {
        std::printf("  accuracy %.2g asked of each named result: %s after %zu solves (%s)\n", accuracy.requested,
                    accuracy.met ? "met" : "NOT MET", accuracy.solves.size(), solves_text(accuracy).c_str());
        if (!accuracy.note.empty())
          std::printf("  %s\n", accuracy.note.c_str());
      }
    std::printf("  mass balance error: %.2e of the amounts moved\n", r.balance_error_relative);
    warn();
    std::printf("results: %s\n", outcome.folder.c_str());
    std::printf("  Model predictions support, but do not replace, testing and engineering judgement; see the\n"
                "  README's cautions before using them for medical, containment or safety decisions.\n");
    std::fflush(stdout);
    const int report_code = invocation.report ? write_report(outcome.folder, false) : exit_success;
    return run_code != exit_success ? run_code : report_code;
  }
} // namespace fickcast
