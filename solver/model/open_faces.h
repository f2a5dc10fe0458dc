// Which faces let the species in or out in some stage of a case.
#pragma once

#include "case/case_description.h"

#include <string>
#include <vector>

namespace fickcast
{
  /// Per boundary name (in the order given): whether some stage makes it a concentration,
  /// transfer or bath face.
  std::vector<bool> open_faces(const CaseDescription &c, const std::vector<std::string> &boundary_names);
} // namespace fickcast
