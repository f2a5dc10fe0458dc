#include "app/exit_codes.h"
#include "app/report_request.h"
#include "app/verbs.h"
#include "case/display_units.h"

#include "case/case_reader.h"
#include "studies/result_names.h"
#include "studies/sizing.h"

#include <deal.II/base/mpi.h>

#include <algorithm>
#include <cmath>
#include <cstdio>

namespace fickcast
{
  int verb_size(const Invocation &invocation, MPI_Comm communicator)
  {
    const bool root = dealii::Utilities::MPI::this_mpi_process(communicator) == 0;
    const CaseDescription base = read_case(invocation.case_file, invocation.overrides);
    const DisplayUnits units(base, 7);
    const bool talk = root && !invocation.quiet;

    SizingOptions options;
    options.case_file = invocation.case_file;
    options.base_overrides = invocation.overrides;
    options.folder = invocation.output.empty() ? base.output.folder + "_size" : invocation.output;
    options.overwrite = invocation.overwrite;

    prepare_sizing(base, invocation.case_file, invocation.overrides); // every check before the first run
    if (talk)
      {
        std::printf("%s: %s\n", base.file.c_str(), base.title.c_str());
        std::printf("  size %s from %s to %s so that %s = %s\n", base.size.parameter.key.c_str(),
                    base.size.parameter.values.at(0).c_str(), base.size.parameter.values.at(1).c_str(),
                    base.size.result.c_str(), base.size.aim.c_str());
        std::fflush(stdout);
      }
    std::string result_unit;
    for (const auto &r : expected_results(base))
      if (r.name == base.size.result)
        result_unit = r.unit;
    const SizingOutcome outcome = run_sizing(base, options, communicator, [&](const SizingRun &e) {
      if (!talk)
        return;
      if (e.status == "completed")
        std::printf("  run %2u: %s = %-20s %s = %s\n", e.index, base.size.parameter.key.c_str(), e.value.c_str(),
                    base.size.result.c_str(), units.result(e.result, result_unit, true).c_str());
      else
        std::printf("  run %2u: %s = %-20s %s: %s\n", e.index, base.size.parameter.key.c_str(), e.value.c_str(),
                    e.status.c_str(), e.message.c_str());
      std::fflush(stdout);
    });
    if (!talk)
      return invocation.report && root ? write_report(outcome.folder, true) : exit_success;
    // The digits the tolerance supports (a relative tolerance of 1e-3 gives 4), and the half
    // width of the final bracket.
    const int digits = std::clamp(static_cast<int>(std::ceil(-std::log10(base.size.tolerance))) + 1, 3, 12);
    const DisplayUnits answer_units(base, digits);
    std::printf("  answer: %s = %.*g %s (+- %.2g %s: the final bracket, after %zu runs)\n", outcome.key.c_str(), digits,
                outcome.value, outcome.parameter_unit.c_str(),
                0.5 * std::abs(outcome.bracket_high - outcome.bracket_low), outcome.parameter_unit.c_str(),
                outcome.evaluations.size());
    std::printf("          %s = %s at the answer (aim %s)\n", outcome.result_name.c_str(),
                answer_units.result(outcome.result, result_unit, true).c_str(),
                answer_units.result(outcome.target, result_unit, true).c_str());
    std::printf("results: %s (size.csv, size_summary.json, runs/)\n", outcome.folder.c_str());
    std::printf("  Model predictions support, but do not replace, testing and engineering judgement; see the\n"
                "  README's cautions before using them for medical, containment or safety decisions.\n");
    std::fflush(stdout);
    return invocation.report ? write_report(outcome.folder, false) : exit_success;
  }
} // namespace fickcast
