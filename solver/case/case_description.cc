#include "case/case_description.h"

namespace fickcast
{
  const RegionSpec *CaseDescription::find_region(const std::string &name) const
  {
    for (const auto &region : regions)
      if (region.name == name)
        return &region;
    return nullptr;
  }

  const BoundarySpec *CaseDescription::find_boundary(const std::string &name) const
  {
    for (const auto &boundary : boundaries)
      if (boundary.name == name)
        return &boundary;
    return nullptr;
  }

  const BoundarySpec *StageSpec::find_boundary(const std::string &boundary) const
  {
    for (const auto &b : boundaries)
      if (b.name == boundary)
        return &b;
    return nullptr;
  }

  std::vector<std::string> builtin_face_names(const unsigned int dimension)
  {
    switch (dimension)
      {
        case 1:
          return {"top", "bottom"};
        case 2:
          return {"left", "right", "top", "bottom"};
        default:
          return {"left", "right", "front", "back", "top", "bottom"};
      }
  }
} // namespace fickcast
