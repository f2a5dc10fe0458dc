// The report of `fickcast verify`: something a regulated user can file.
#pragma once

#include "verify/verification_suite.h"

#include <string>
#include <vector>

namespace fickcast
{
  /// Facts about this installation for the report header (version, date, host, libraries).
  std::vector<std::pair<std::string, std::string>> installation_facts();

  /// The report as plain text (fixed-width, printable).
  std::string verification_report_text(const std::vector<CheckResult> &results);

  /// Writes verification_report.txt and verification_report.json into @p folder. Throws IoError.
  void write_verification_report(const std::vector<CheckResult> &results, const std::string &folder);
} // namespace fickcast
