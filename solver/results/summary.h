// summary.json: every scalar result of a run, the case echoed in SI, and the run facts.
#pragma once

#include "case/case_description.h"
#include "results/json.h"
#include "results/run_record.h"

#include <string>

namespace fickcast
{
  /// The version of this build (from the project version).
  std::string fickcast_version();

  /// The summary of a run as JSON (see the README's results-folder section for the layout).
  Json make_summary(const CaseDescription &description, const RunRecord &record);

  /// Writes @p summary to @p path. Throws IoError.
  void write_json(const Json &summary, const std::string &path);
} // namespace fickcast
