#include "geometry/mesh_import.h"

#include "case/input_error.h"
#include "geometry/layered_mesh.h"
#include "geometry/mesh_quality.h"
#include "geometry/msh_check.h"

#include <deal.II/distributed/tria.h>
#include <deal.II/grid/grid_in.h>

#include <algorithm>
#include <fstream>
#include <map>

namespace fickcast
{
  template <int dim>
  void read_mesh_file(dealii::Triangulation<dim> &triangulation, const GeometrySpec &geometry)
  {
    const std::string &file = geometry.mesh_file;
    const std::vector<MshElement> elements = check_msh_structure(file); // deal.II's reader trusts counts
    dealii::Triangulation<dim> serial;
    try
      {
        dealii::GridIn<dim> reader;
        reader.attach_triangulation(serial);
        std::ifstream in(file);
        if (!in)
          throw InputError(file, "geometry.mesh", "cannot open the mesh file");
        reader.read_msh(in);
      }
    catch (const InputError &)
      {
        throw;
      }
    catch (const std::exception &error)
      {
        std::string reason = error.what();
        // deal.II messages span several lines; keep the one that says what went wrong.
        const auto additional = reason.find("Additional information:");
        if (additional != std::string::npos)
          reason = reason.substr(additional + 23);
        const auto trace = reason.find("Stacktrace");
        if (trace != std::string::npos)
          reason = reason.substr(0, trace);
        reason.erase(std::remove(reason.begin(), reason.end(), '\n'), reason.end());
        while (reason.find("  ") != std::string::npos)
          reason.replace(reason.find("  "), 2, " ");
        if (reason.size() > 200)
          reason = reason.substr(0, 200) + "...";
        throw InputError(file, "geometry.mesh", "cannot read the mesh:" + reason);
      }
    if (!serial.all_reference_cells_are_hyper_cube())
      throw InputError(file, "geometry.mesh", "expected quadrilateral or hexahedral cells (Recombine in Gmsh)");

    // Every cell a valid map, checked before anything moves: the n-th coarse cell is the n-th
    // element of the mesh's dimension in the file, so a bad one is named as the user knows it.
    std::vector<MshElement> cells_in_file;
    for (const auto &element : elements)
      if (element.dimension == dim)
        cells_in_file.push_back(element);
    const auto where_is = [&](const unsigned int index) -> std::string {
      if (cells_in_file.size() != serial.n_cells(0) || index >= cells_in_file.size())
        return "";
      const MshElement &e = cells_in_file[index];
      return file + ":" + std::to_string(e.line) + " (element " + std::to_string(e.tag) + ")";
    };
    check_mesh_quality(serial, geometry, MPI_COMM_SELF, where_is);

    std::map<unsigned int, dealii::types::material_id> region_id;
    for (std::size_t i = 0; i < geometry.mesh_region_tags.size(); ++i)
      region_id[static_cast<unsigned int>(geometry.mesh_region_tags[i])] = static_cast<dealii::types::material_id>(i);
    std::map<unsigned int, dealii::types::boundary_id> boundary_id;
    for (std::size_t i = 0; i < geometry.mesh_boundary_tags.size(); ++i)
      boundary_id[static_cast<unsigned int>(geometry.mesh_boundary_tags[i])] =
        static_cast<dealii::types::boundary_id>(i);
    const auto unnamed = static_cast<dealii::types::boundary_id>(geometry.mesh_boundary_tags.size());
    for (const auto &cell : serial.active_cell_iterators())
      {
        const auto found = region_id.find(cell->material_id());
        if (found == region_id.end())
          throw InputError(file, "geometry.mesh",
                           "expected every cell in a named physical group of dimension " + std::to_string(dim) +
                             ", found cells with physical tag " + std::to_string(cell->material_id()) + " and no name");
        cell->set_material_id(found->second);
        for (const unsigned int f : cell->face_indices())
          if (cell->face(f)->at_boundary())
            {
              const auto b = boundary_id.find(cell->face(f)->boundary_id());
              cell->face(f)->set_boundary_id(b == boundary_id.end() ? unnamed : b->second);
            }
      }

    if (auto *distributed = dynamic_cast<dealii::parallel::distributed::Triangulation<dim> *>(&triangulation))
      distributed->copy_triangulation(serial);
    else
      triangulation.copy_triangulation(serial);
    if (geometry.refine > 0)
      triangulation.refine_global(geometry.refine);
  }

  template <int dim>
  void make_mesh(dealii::Triangulation<dim> &triangulation, const GeometrySpec &geometry)
  {
    if constexpr (dim > 1)
      if (!geometry.mesh_file.empty())
        {
          read_mesh_file<dim>(triangulation, geometry);
          check_mesh_quality(triangulation, geometry, triangulation.get_communicator());
          return;
        }
    build_layered_mesh<dim>(triangulation, geometry);
    check_mesh_quality(triangulation, geometry, triangulation.get_communicator());
  }

  template void make_mesh<1>(dealii::Triangulation<1> &, const GeometrySpec &);
  template void make_mesh<2>(dealii::Triangulation<2> &, const GeometrySpec &);
  template void make_mesh<3>(dealii::Triangulation<3> &, const GeometrySpec &);
  template void read_mesh_file<2>(dealii::Triangulation<2> &, const GeometrySpec &);
  template void read_mesh_file<3>(dealii::Triangulation<3> &, const GeometrySpec &);
} // namespace fickcast
