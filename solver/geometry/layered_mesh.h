// The built-in layered geometry as a deal.II triangulation.
#pragma once

#include "case/case_description.h"

#include <deal.II/grid/tria.h>

#include <string>
#include <vector>

namespace fickcast
{
  /// Names of regions (by material id) and boundaries (by boundary id) of a mesh.
  struct MeshNames
  {
    std::vector<std::string> regions;    ///< index = material id
    std::vector<std::string> boundaries; ///< index = boundary id
  };

  /**
   * Fills @p triangulation with the layered box of @p geometry: layers stacked along the last
   * axis from the top face (coordinate 0) inward, lateral extent width (x) and length (y).
   * Material id = layer index; boundary ids follow builtin_face_names(dim). In 2-D and 3-D the
   * coarse mesh holds at most a few thousand cells and is refined globally to the requested
   * cell size, so it suits a p4est-distributed triangulation.
   */
  template <int dim>
  void build_layered_mesh(dealii::Triangulation<dim> &triangulation, const GeometrySpec &geometry);

  /// The names build_layered_mesh() gives.
  MeshNames layered_mesh_names(const GeometrySpec &geometry, unsigned int dimension);
} // namespace fickcast
