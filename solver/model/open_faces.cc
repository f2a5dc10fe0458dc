#include "model/open_faces.h"

namespace fickcast
{
  std::vector<bool> open_faces(const CaseDescription &c, const std::vector<std::string> &boundary_names)
  {
    std::vector<bool> open(boundary_names.size(), false);
    for (const auto &stage : c.stages)
      for (std::size_t b = 0; b < boundary_names.size(); ++b)
        if (const BoundarySpec *spec = stage.find_boundary(boundary_names[b]))
          open[b] = open[b] || spec->kind == BoundaryKind::concentration || spec->kind == BoundaryKind::transfer ||
                    spec->kind == BoundaryKind::bath || spec->kind == BoundaryKind::inflow;
    return open;
  }
} // namespace fickcast
