#include "case/case_description.h"

#include <algorithm>

namespace fickcast
{
  std::string FaceResultSpec::prefix() const
  {
    switch (kind)
      {
        case Kind::flux:
          return "flux";
        case Kind::crossed:
          return "crossed";
        case Kind::peak_flux:
          return "peak_flux";
        case Kind::flux_limit:
          return "flux_limit";
        case Kind::crossed_limit:
          return "crossed_limit";
        case Kind::steady_flux:
          return "steady_flux";
      }
    return "flux";
  }

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

  std::vector<std::string> GeometrySpec::region_names() const
  {
    if (!mesh_file.empty())
      return mesh_regions;
    std::vector<std::string> names;
    for (const auto &layer : layers)
      if (std::find(names.begin(), names.end(), layer.name) == names.end())
        names.push_back(layer.name);
    if (side_coating.thickness > 0 && std::find(names.begin(), names.end(), side_coating.name) == names.end())
      names.push_back(side_coating.name);
    return names;
  }

  std::vector<std::string> GeometrySpec::face_names(const unsigned int dimension) const
  {
    if (!mesh_file.empty())
      {
        std::vector<std::string> names = mesh_boundaries;
        names.push_back("unnamed"); // boundary faces in no named group
        return names;
      }
    switch (coordinates)
      {
        case Coordinates::cylinder:
        case Coordinates::sphere:
          return {inner_radius > 0 ? "inner" : "centre", "outer"};
        case Coordinates::axisymmetric:
          return {inner_radius > 0 ? "inner" : "axis", "side", "top", "bottom"};
        case Coordinates::cartesian:
          break;
      }
    return builtin_face_names(dimension);
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
