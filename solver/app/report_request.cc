#include "app/report_request.h"

#include "app/exit_codes.h"

#include "report.h"

#include <cstdio>
#include <exception>

namespace fickcast
{
  int write_report(const std::string &folder, const bool quiet)
  {
    try
      {
        const post::ReportOutcome outcome = post::make_any_report(folder);
        if (!quiet)
          std::printf("report: %s (%zu images)\n", outcome.html.c_str(), outcome.images.size());
        return exit_success;
      }
    catch (const post::PostIoError &error)
      {
        std::fprintf(stderr, "fickcast: report: %s\n", error.what());
        return exit_io_error;
      }
    catch (const std::exception &error)
      {
        std::fprintf(stderr, "fickcast: report: %s (the results themselves are complete)\n", error.what());
        return exit_run_failed;
      }
  }
} // namespace fickcast
