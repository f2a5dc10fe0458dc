// The built-in layered geometries as deal.II triangulations.
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
   * Fills @p triangulation with the built-in geometry of @p geometry:
   * - Cartesian: layers stacked along the last axis from the top face (coordinate 0) inward,
   *   lateral extent width (x) and length (y);
   * - radial (cylinder, sphere): layers along r from the centre (or inner_radius) outward;
   * - axisymmetric: x = r from the axis (or inner_radius) to radius, plus an optional side
   *   coating band, y = z through the layers.
   * Material id = index of the region name in geometry.region_names(); boundary ids follow
   * geometry.face_names(dim). In 2-D and 3-D the coarse mesh holds at most a few thousand cells
   * and is refined globally to the requested cell size, which suits a p4est-distributed
   * triangulation; geometry.refine adds global refinements.
   */
  template <int dim>
  void build_layered_mesh(dealii::Triangulation<dim> &triangulation, const GeometrySpec &geometry);

  /// The names build_layered_mesh() or read_mesh_file() give.
  MeshNames mesh_names(const GeometrySpec &geometry, unsigned int dimension);
} // namespace fickcast
