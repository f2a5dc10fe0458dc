#include "numerics/run_size.h"

#include "case/input_error.h"
#include "geometry/layer_spacing.h"
#include "geometry/msh_check.h"
#include "numerics/linear_solver.h"

#include <algorithm>
#include <cctype>
#include <cmath>
#include <cstdio>
#include <limits>
#include <string>

#include <unistd.h>

namespace fickcast
{
  namespace
  {
    bool limits_enabled = true;

    std::string count_text(const double value)
    {
      char buffer[32];
      std::snprintf(buffer, sizeof(buffer), value < 1e6 ? "%.0f" : "%.2g", value);
      return buffer;
    }

    /// Where @p key was set (file:line or --set), else the case file.
    std::string origin_of(const CaseDescription &c, const std::string &key)
    {
      for (const auto &record : c.settings)
        if (record.key == key && record.origin != "default")
          return record.origin;
      return c.file;
    }

    std::string bytes_text(const double bytes)
    {
      char buffer[32];
      std::snprintf(buffer, sizeof(buffer), "%.1f GiB", bytes / (1024.0 * 1024.0 * 1024.0));
      return buffer;
    }
    /// Whether @p name occurs in @p expression as a variable (not inside a longer name).
    bool uses_variable(const std::string &expression, const char name)
    {
      for (std::size_t i = 0; i < expression.size(); ++i)
        {
          if (expression[i] != name)
            continue;
          const auto part = [](const char ch) { return std::isalnum(static_cast<unsigned char>(ch)) || ch == '_'; };
          if ((i == 0 || !part(expression[i - 1])) && (i + 1 == expression.size() || !part(expression[i + 1])))
            return true;
        }
      return false;
    }

    /// Whether the steps of @p c will be applied without matrices (DiffusionProblem's
    /// matrix_free_applies, as far as the case text tells): 2-D or 3-D, degree 2 or more, an
    /// iterative solver that may use the diagonal, no undissolved content, no diffusivity of the
    /// concentration or of position and time together.
    bool steps_without_matrices(const CaseDescription &c, const double unknowns)
    {
      if (c.dimension < 2 || c.numerics.degree < 2 || !c.numerics.matrix_free ||
          c.numerics.linear_solver == LinearSolverKind::multigrid ||
          choose_direct_solver(c.numerics.linear_solver, c.dimension, static_cast<unsigned long>(unknowns), true))
        return false;
      for (const RegionSpec &region : c.regions)
        {
          const std::string &e = region.diffusivity.expression;
          const bool in_space = uses_variable(e, 'x') || uses_variable(e, 'y') || uses_variable(e, 'z');
          const bool in_time = uses_variable(e, 't') || uses_variable(e, 'T');
          if (region.has_dispersed_phase() || uses_variable(e, 'c') || (in_space && in_time))
            return false;
        }
      return true;
    }
  } // namespace

  void set_size_limits(const bool enabled)
  {
    limits_enabled = enabled;
  }

  bool size_limits_enabled()
  {
    return limits_enabled;
  }

  double installed_memory()
  {
    const long pages = ::sysconf(_SC_PHYS_PAGES), page = ::sysconf(_SC_PAGE_SIZE);
    return pages > 0 && page > 0 ? static_cast<double>(pages) * static_cast<double>(page) : 0.0;
  }

  RunSize estimate_run_size(const CaseDescription &c)
  {
    RunSize size;
    const unsigned int dim = c.dimension;
    const double p = c.numerics.degree;
    if (c.geometry.mesh_file.empty())
      {
        // As geometry/layered_mesh.cc: the stacking axis from the layer spacing, the lateral
        // axes uniform at the largest stack cell (at least the geometry's cell size).
        const StackEstimate stack = estimate_stack(c.geometry);
        const double lateral_size = std::max(stack.largest, c.geometry.cell_size);
        const bool axisymmetric = c.geometry.coordinates == Coordinates::axisymmetric;
        const double extents[2] = {axisymmetric ? c.geometry.radius - c.geometry.inner_radius : c.geometry.width,
                                   c.geometry.length};
        const double refine = std::pow(2.0, static_cast<double>(c.geometry.refine));
        std::vector<double> axis_cells{stack.cells * refine};
        for (unsigned int d = 0; d + 1 < dim; ++d)
          {
            double n = std::max(1.0, std::ceil(extents[d] / lateral_size - 1e-9));
            if (axisymmetric && d == 0 && c.geometry.side_coating.thickness > 0)
              n += std::max(1.0, std::ceil(c.geometry.side_coating.thickness /
                                             std::min(lateral_size, c.geometry.side_coating.thickness / 2) -
                                           1e-9));
            axis_cells.push_back(n * refine);
          }
        size.cells = 1;
        size.unknowns = 1;
        for (const double n : axis_cells)
          {
            size.cells *= n;
            size.unknowns *= n * p + 1;
          }
      }
    else
      {
        // A mesh file: its cells are the elements of the mesh's dimension, each split into 2^dim
        // per refinement; the unknowns as for a block of as many cells (a slight overestimate).
        double elements = 0;
        for (const MshElement &element : check_msh_structure(c.geometry.mesh_file))
          elements += element.dimension == static_cast<int>(dim) ? 1 : 0;
        size.cells = elements * std::pow(2.0, static_cast<double>(dim * c.geometry.refine));
        size.unknowns = std::pow(std::pow(size.cells, 1.0 / dim) * p + 1, static_cast<double>(dim));
      }
    if (steps_without_matrices(c, size.unknowns))
      {
        // Coefficients at the quadrature points ((p + 1)^dim per cell, about p^dim unknowns per
        // cell): four, and up to six cached weighted pairs, 8 bytes each; the coarser meshes of
        // geometric multigrid add 1/(2^dim - 1); vectors as below; mesh and unknown bookkeeping
        // about 600 bytes per unknown (the rest of the 1.30 GB measured for a 3-D Q2 run of
        // 912 673 unknowns on one rank, 2026-12-05).
        const double points = std::pow((p + 1) / p, static_cast<double>(dim));
        const double levels = 1 + 1 / (std::pow(2.0, static_cast<double>(dim)) - 1);
        size.memory = size.unknowns * (points * 16.0 * 8.0 * levels + 40.0 * 8.0 + 600.0);
      }
    else
      {
        // Sparse matrices: about (2p + 1)^dim entries per row, 12 bytes each (value and column),
        // about eight of them (mass, static, unit, dynamic and system parts, constrained copies);
        // vectors: about forty of 8 bytes per unknown (states, history, weights, solver work).
        const double per_row = std::pow(2 * p + 1, static_cast<double>(dim));
        size.memory = size.unknowns * (per_row * 12.0 * 8.0 + 40.0 * 8.0);
      }
    size.output_times = static_cast<double>(c.output.times.size()) + 1;
    if (c.output.fields_every > 0)
      size.output_times += c.time.end / c.output.fields_every;
    size.fixed_steps = c.time.adaptive || !(c.time.step > 0) ? 0.0 : c.time.end / c.time.step;
    return size;
  }

  void check_run_size(const CaseDescription &c, const RunSize &size, const double memory_limit)
  {
    if (!limits_enabled)
      return;
    const std::string remedy = "; or --allow-large to run it anyway";
    if (memory_limit > 0 && size.memory > 0.8 * memory_limit && !c.geometry.mesh_file.empty())
      throw InputError(origin_of(c, "geometry.refine"), "geometry.refine",
                       "the mesh of " + c.geometry.mesh_file + " would have about " + count_text(size.cells) +
                         " cells and " + count_text(size.unknowns) + " unknowns after " +
                         std::to_string(c.geometry.refine) + " refinement(s), needing about " +
                         bytes_text(size.memory) + " of memory where this machine has " + bytes_text(memory_limit) +
                         ": expected fewer refinements or a coarser mesh" + remedy);
    if (memory_limit > 0 && size.memory > 0.8 * memory_limit)
      throw InputError(origin_of(c, "geometry.cell_size"), "geometry.cell_size",
                       "the mesh would have about " + count_text(size.cells) + " cells and " +
                         count_text(size.unknowns) + " unknowns, needing about " + bytes_text(size.memory) +
                         " of memory where this machine has " + bytes_text(memory_limit) +
                         ": expected a larger cell_size (or region cell_size), grading toward the face that "
                         "needs small cells, or fewer refinements" +
                         remedy);
    if (size.fixed_steps > 1e8)
      throw InputError(origin_of(c, "time.step"), "time.step",
                       "expected at most 1e8 steps, found " + count_text(size.fixed_steps) +
                         " (time.end / time.step): a larger step, or step = auto" + remedy);
    if (size.output_times > 1e5)
      throw InputError(origin_of(c, "output.fields_every"), "output.fields_every",
                       "expected at most 1e5 output times, found " + count_text(size.output_times) +
                         " (each writes a field file and profile rows): a longer interval" + remedy);
  }
} // namespace fickcast
