#include "app/exit_codes.h"
#include "app/verbs.h"

#include "run/results_folder.h"
#include "verify/verification_report.h"

#include <deal.II/base/mpi.h>

#include <cstdio>
#include <ctime>
#include <filesystem>
#include <iostream>

namespace fickcast
{
  int verb_verify(const Invocation &invocation, MPI_Comm communicator)
  {
    // The checks are small serial runs: rank 0 does them, the others wait.
    const bool root = dealii::Utilities::MPI::this_mpi_process(communicator) == 0;
    int code = exit_success;
    if (root)
      {
        std::string target = invocation.output;
        if (target.empty())
          {
            const std::time_t now = std::time(nullptr);
            char stamp[32];
            std::strftime(stamp, sizeof(stamp), "%Y%m%d-%H%M%S", std::gmtime(&now));
            target = std::string("verification-") + stamp;
          }
        ResultsFolder folder(target, invocation.overwrite);
        const std::string scratch = folder.path() + "/runs";
        std::filesystem::create_directories(scratch);
        if (!invocation.quiet)
          std::printf("fickcast verify: solving the built-in checks against published solutions\n");
        const auto results = run_verification(scratch, [&](const CheckResult &r) {
          if (!invocation.quiet)
            std::printf("  %-4s %-74s error %.2e (tolerance %.0e)\n", r.passed ? "pass" : "FAIL", r.name.c_str(),
                        r.error, r.tolerance);
          std::fflush(stdout);
        });
        std::filesystem::remove_all(scratch);
        write_verification_report(results, folder.path());
        folder.commit();
        unsigned int failed = 0;
        for (const auto &r : results)
          failed += r.passed ? 0 : 1;
        if (!invocation.quiet)
          std::printf("%s: %zu checks, %u failed; report in %s/verification_report.txt\n", failed ? "FAILED" : "passed",
                      results.size(), failed, folder.target().c_str());
        code = failed ? exit_run_failed : exit_success;
      }
    return dealii::Utilities::MPI::broadcast(communicator, code, 0);
  }
} // namespace fickcast
