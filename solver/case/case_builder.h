// Assembling parsed settings into a CaseDescription, with the checks that span several keys.
#pragma once

#include "case/case_description.h"
#include "case/settings.h"

namespace fickcast
{
  /// Builds the description from @p settings of a @p dimension-D case. Throws InputError for
  /// missing keys, inconsistent keys, unknown region or boundary names and points outside.
  CaseDescription build_case(const Settings &settings, unsigned int dimension);
} // namespace fickcast
