// summary.json: every scalar result of a run, the case echoed in SI, and the run facts.
#pragma once

#include "case/case_description.h"
#include "results/json_file.h"
#include "results/run_record.h"

#include <string>

namespace fickcast
{
  /// The version of this build (from the project version).
  std::string fickcast_version();

  /// The summary of a run as JSON (see the README's results-folder section for the layout);
  /// write_json() writes it.
  Json::Value make_summary(const CaseDescription &description, const RunRecord &record);
} // namespace fickcast
