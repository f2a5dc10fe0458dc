#include "geometry/point_placement.h"

#include "case/input_error.h"

#include <deal.II/base/mpi.h>
#include <deal.II/fe/mapping_q1.h>
#include <deal.II/grid/grid_tools.h>

#include <cstdint>
#include <cstdio>

namespace fickcast
{
  namespace
  {
    template <int dim>
    std::string coordinates(const dealii::Point<dim> &p)
    {
      std::string text;
      for (int d = 0; d < dim; ++d)
        {
          char number[32];
          std::snprintf(number, sizeof number, "%.9g", p[d]);
          text += (d ? ", " : "") + std::string(number);
        }
      return "(" + text + ") m";
    }

    /// The regions (bit m for material id m) of the cells this rank sees that touch @p p (within a
    /// millionth of a cell: a mesh file's coordinates carry round-off); 0 if none.
    template <int dim>
    std::uint64_t regions_around(const dealii::Triangulation<dim> &triangulation, const dealii::Point<dim> &p)
    {
      const auto &mapping = dealii::StaticMappingQ1<dim>::mapping;
      std::uint64_t seen = 0;
      try
        {
          const auto first = dealii::GridTools::find_active_cell_around_point(mapping, triangulation, p);
          if (first.first.state() != dealii::IteratorState::valid)
            return 0;
          for (const auto &cell :
               dealii::GridTools::find_all_active_cells_around_point(mapping, triangulation, p, 1e-6, first))
            if (!cell.first->is_artificial() && cell.first->material_id() < 64)
              seen |= std::uint64_t(1) << cell.first->material_id();
        }
      catch (...)
        {
          // Not in this rank's part of the mesh (or in no part at all).
        }
      return seen;
    }
  } // namespace

  template <int dim>
  void check_point_placement(const dealii::Triangulation<dim> &triangulation, const CaseDescription &c,
                             const std::vector<std::string> &regions, MPI_Comm communicator)
  {
    for (const auto &named : c.output.points)
      {
        dealii::Point<dim> p;
        for (int d = 0; d < dim; ++d)
          p[d] = named.point[d];
        std::uint64_t seen = regions_around(triangulation, p);
        MPI_Allreduce(MPI_IN_PLACE, &seen, 1, MPI_UINT64_T, MPI_BOR, communicator);
        const std::string key = "output.point." + named.name;
        const std::string where = named.origin.empty() ? c.file : named.origin;
        if (seen == 0)
          throw InputError(where, key,
                           "expected a point inside the mesh, found " + coordinates(p) +
                             " in none of its cells (outside it, or in a hole of it)");
        std::vector<std::string> touching;
        for (std::size_t m = 0; m < regions.size() && m < 64; ++m)
          if (seen & (std::uint64_t(1) << m))
            touching.push_back(regions[m]);
        std::string list;
        for (const auto &r : touching)
          list += (list.empty() ? "" : " and ") + r;
        // Where the touching regions share a partition coefficient the field is continuous and
        // both sides read the same; where they do not, the side must be said.
        bool jumps = false;
        for (const auto &r : touching)
          {
            const RegionSpec *a = c.find_region(r), *b = c.find_region(touching.front());
            jumps = jumps || (a != nullptr && b != nullptr && a->partition != b->partition);
          }
        if (named.region.empty())
          {
            if (jumps)
              throw InputError(where, key,
                               "expected '... in REGION' for a point on the interface of " + list + " at " +
                                 coordinates(p) +
                                 ", found no region (the concentration jumps there: the regions differ in partition "
                                 "coefficient): add in " +
                                 touching.front() + " or in " + touching.back());
          }
        else if (std::find(touching.begin(), touching.end(), named.region) == touching.end())
          throw InputError(where, key,
                           "expected a point in or on region " + named.region + ", found " + coordinates(p) + " in " +
                             list);
      }
  }

  template void check_point_placement<1>(const dealii::Triangulation<1> &, const CaseDescription &,
                                         const std::vector<std::string> &, MPI_Comm);
  template void check_point_placement<2>(const dealii::Triangulation<2> &, const CaseDescription &,
                                         const std::vector<std::string> &, MPI_Comm);
  template void check_point_placement<3>(const dealii::Triangulation<3> &, const CaseDescription &,
                                         const std::vector<std::string> &, MPI_Comm);
} // namespace fickcast
