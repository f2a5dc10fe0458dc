// The times a run's steps must land on exactly: output times and stage ends.
#pragma once

#include "case/case_description.h"

#include <vector>

namespace fickcast
{
  /// Output times: listed times, multiples of fields_every, and the end, sorted and unique.
  std::vector<double> output_schedule(const CaseDescription &c);

  /// Times a step must land on: @p outputs, the stage ends and the times asked of results through
  /// faces (output.flux.*, crossed.*), sorted and unique.
  std::vector<double> hard_times(const CaseDescription &c, const std::vector<double> &outputs);
} // namespace fickcast
