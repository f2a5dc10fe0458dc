// Gmsh meshes with named physical groups as deal.II triangulations.
#pragma once

#include "case/case_description.h"

#include <deal.II/grid/tria.h>

namespace fickcast
{
  /**
   * Reads geometry.mesh_file (ASCII Gmsh 2.2 or 4.1, quadrilaterals or hexahedra) into
   * @p triangulation (serial or p4est-distributed), renumbering material ids to the order of
   * geometry.mesh_regions and boundary ids to geometry.mesh_boundaries; boundary faces in no
   * named group get the id of "unnamed" (sealed unless the case says otherwise). Then refines
   * globally geometry.refine times. Throws InputError (key geometry.mesh) if the file cannot be
   * read as such a mesh.
   */
  template <int dim>
  void read_mesh_file(dealii::Triangulation<dim> &triangulation, const GeometrySpec &geometry);

  /// The mesh of @p geometry: the Gmsh file if one is named, else the built-in layered geometry.
  template <int dim>
  void make_mesh(dealii::Triangulation<dim> &triangulation, const GeometrySpec &geometry);
} // namespace fickcast
