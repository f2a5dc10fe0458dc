// DiffusionProblem: refinement of the cells next to the faces where the species enters or
// leaves, sized by the diffusion length of the run. A species entering through a face builds a
// profile a few diffusion lengths deep; the values deep in its tail (a junction depth, a point
// five decades under the surface value) need cells of a fraction of that length there, not
// everywhere (common practice: boundary-layer grading).
#include "numerics/diffusion_problem.h"

#include "model/open_faces.h"
#include "model/value_text.h"

#include <cstdio>

#include <deal.II/base/mpi.h>
#include <deal.II/boost_adaptors/point.h>
#include <deal.II/numerics/rtree.h>

#include <boost/geometry/index/rtree.hpp>

#include <algorithm>
#include <cmath>
#include <limits>

namespace fickcast
{
  using namespace dealii;

  namespace
  {
    /// Largest number of unknowns the refinement may create (a 2-core machine's reach).
    constexpr double max_unknowns = 2.0e6;
    /// Largest factor on the cells of the mesh as given when the refinement is automatic.
    constexpr double max_growth = 16;

    std::string length_text(const double metres)
    {
      char text[32];
      std::snprintf(text, sizeof text, "%.3g m", metres);
      return text;
    }
  } // namespace

  template <int dim>
  void DiffusionProblem<dim>::refine_near_open_faces()
  {
    const GeometrySpec &g = description_.geometry;
    const bool on = g.open_face_refinement == OpenFaceRefinement::on ||
                    (g.open_face_refinement == OpenFaceRefinement::automatic && description_.numerics.accuracy > 0);
    if (!on || !(description_.time.end > 0))
      return;
    const std::size_t n_boundaries = names_.boundaries.size();
    const std::vector<bool> open = open_faces(description_, names_.boundaries);

    // Diffusion length of the run in each region: L^2 = int (G / C) dt over the run (the apparent
    // diffusivity, with sorption and partition), the largest over the region (sampled at up to
    // 500 cell centres of each rank; one when D is uniform in space).
    constexpr unsigned int n_times = 64;
    const double end = description_.time.end;
    const std::size_t n_regions = materials_.size();
    std::vector<double> length_squared(n_regions, 0.0);
    std::vector<unsigned long> region_cells(n_regions, 0), seen(n_regions, 0);
    for (const auto &cell : triangulation_->active_cell_iterators())
      if (cell->is_locally_owned())
        ++region_cells[cell->material_id()];
    for (const auto &cell : triangulation_->active_cell_iterators())
      {
        if (!cell->is_locally_owned())
          continue;
        const auto region = cell->material_id();
        const bool uniform = materials_[region].diffusivity_shape().uniform_in_space();
        const unsigned long stride = uniform ? region_cells[region] : std::max(1ul, region_cells[region] / 500);
        if (seen[region]++ % stride != 0)
          continue;
        const double capacity = materials_[region].capacity();
        double sum = 0;
        for (unsigned int i = 0; i < n_times; ++i)
          {
            const double t = (i + 0.5) * end / n_times;
            sum += capacity > 0 ? conductance(region, cell->center(), t) / capacity
                                : effective_diffusivity(region, cell->center(), t);
          }
        length_squared[region] = std::max(length_squared[region], sum * end / n_times);
      }
    check_coefficients();
    Utilities::MPI::max(length_squared, communicator_, length_squared);

    // Per region: cells within the band of an open face are refined to the target size.
    struct Band
    {
      double depth = 0, cell = 0;
    };
    std::vector<Band> bands(n_regions);
    bool any = false;
    for (std::size_t r = 0; r < n_regions; ++r)
      {
        const double length = std::sqrt(length_squared[r]);
        if (!(length > 0))
          continue;
        bands[r].cell = g.open_face_scale * (g.open_face_cell > 0 ? g.open_face_cell : fe_.degree * length / 4);
        bands[r].depth = g.open_face_band > 0 ? g.open_face_band : 8 * length;
        any = true;
      }
    std::string faces;
    for (std::size_t b = 0; b < n_boundaries; ++b)
      if (open[b])
        faces += (faces.empty() ? "'" : ", '") + names_.boundaries[b] + "'";
    if (!any || faces.empty())
      return;

    const unsigned long before = triangulation_->n_global_active_cells();
    // By default (automatic) the band may multiply the cells by 16 at most: a 3-D case with a thin
    // layer would otherwise grow by hundreds (the accuracy check still measures the error).
    const bool automatic = g.open_face_refinement == OpenFaceRefinement::automatic;
    const double cells_allowed =
      std::min(max_unknowns / std::pow(static_cast<double>(fe_.degree), dim),
               automatic ? max_growth * static_cast<double>(before) : std::numeric_limits<double>::max());
    const double size_factor = 1.0 / std::sqrt(static_cast<double>(dim));
    unsigned int passes = 0;
    bool capped = false;
    for (; passes < 40; ++passes)
      {
        // Sample points of each open face (vertices and centres of its cell faces), all ranks.
        std::vector<double> local;
        for (const auto &cell : triangulation_->active_cell_iterators())
          {
            if (!cell->is_locally_owned())
              continue;
            for (const unsigned int f : cell->face_indices())
              {
                if (!cell->at_boundary(f))
                  continue;
                const unsigned int b = cell->face(f)->boundary_id();
                if (b >= n_boundaries || !open[b])
                  continue;
                const auto face = cell->face(f);
                auto add = [&](const Point<dim> &p) {
                  for (unsigned int d = 0; d < dim; ++d)
                    local.push_back(p[d]);
                };
                add(face->center());
                for (const unsigned int v : face->vertex_indices())
                  add(face->vertex(v));
              }
          }
        std::vector<Point<dim>> points;
        for (const auto &part : Utilities::MPI::all_gather(communicator_, local))
          for (std::size_t i = 0; i + dim <= part.size(); i += dim)
            {
              Point<dim> p;
              for (unsigned int d = 0; d < dim; ++d)
                p[d] = part[i + d];
              points.push_back(p);
            }
        if (points.empty())
          break;
        const RTree<Point<dim>> tree = pack_rtree(points);

        unsigned long marked = 0;
        for (const auto &cell : triangulation_->active_cell_iterators())
          {
            if (!cell->is_locally_owned())
              continue;
            const double diameter = cell->diameter();
            const Band &band = bands[cell->material_id()];
            // Up to 30 % over the target is kept: the next halving would cost 2^dim cells for a
            // gain the target's own rule (a quarter of a diffusion length) cannot tell.
            if (band.cell == 0 || diameter * size_factor <= band.cell * 1.3)
              continue;
            std::vector<Point<dim>> nearest;
            tree.query(boost::geometry::index::nearest(cell->center(), 1), std::back_inserter(nearest));
            if (!nearest.empty() && nearest[0].distance(cell->center()) - 0.5 * diameter < band.depth)
              {
                cell->set_refine_flag();
                ++marked;
              }
          }
        marked = Utilities::MPI::sum(marked, communicator_);
        if (marked == 0)
          break;
        const double after = static_cast<double>(triangulation_->n_global_active_cells()) +
                             static_cast<double>(marked) * (std::pow(2.0, dim) - 1);
        if (after > cells_allowed)
          {
            for (const auto &cell : triangulation_->active_cell_iterators())
              if (cell->is_locally_owned())
                cell->clear_refine_flag();
            capped = true;
            break;
          }
        triangulation_->execute_coarsening_and_refinement();
      }
    if (passes == 0 && !capped)
      return;
    const unsigned long cells = triangulation_->n_global_active_cells();
    std::string sizes;
    for (std::size_t r = 0; r < n_regions; ++r)
      if (bands[r].cell > 0)
        sizes += (sizes.empty() ? "" : "; ") + names_.regions[r] + ": within " + length_text(bands[r].depth) +
                 " to about " + length_text(bands[r].cell);
    refinement_note_ = "cells near " + faces + " refined (" + sizes + "; at most 1.3 times that; " +
                       std::to_string(passes) + " passes, " + std::to_string(before) + " -> " + std::to_string(cells) +
                       " cells)";
    if (capped)
      refinement_warning_ = "the cells next to " + faces + " were refined only to " + std::to_string(cells) +
                            " cells, short of the target sizes (" + sizes + ")" +
                            (automatic ? std::string(" (by default the band may multiply the cells by 16 at most)")
                                       : " (the mesh would pass " + number_text(max_unknowns) + " unknowns)") +
                            ": values near those faces may be poor; set geometry.open_face_refinement = on "
                            "(with open_face_cell or open_face_band), or give a finer mesh there";
  }

  template void DiffusionProblem<1>::refine_near_open_faces();
  template void DiffusionProblem<2>::refine_near_open_faces();
  template void DiffusionProblem<3>::refine_near_open_faces();
} // namespace fickcast
