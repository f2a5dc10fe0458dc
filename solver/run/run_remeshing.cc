#include "run/run_remeshing.h"

#include "case/input_error.h"

#include <deal.II/base/mpi.h>

#include <algorithm>
#include <cmath>
#include <limits>
#include <numeric>

namespace fickcast
{
  using namespace dealii;

  namespace
  {
    /// Refinement levels below the mesh as given that smallest_cell = auto allows: deep in 1-D,
    /// where cells are cheap, shallower in 2-D and 3-D, where each level multiplies the cells
    /// along a front by 2 and 4.
    constexpr unsigned int auto_levels[] = {0, 10, 6, 4};
  } // namespace

  template <int dim>
  RunRemeshing<dim>::RunRemeshing(DiffusionProblem<dim> &problem, const CaseDescription &c, const double scale,
                                  const double first_output)
    : problem_(problem)
    , active_(c.numerics.remesh)
    , every_(std::max(1u, c.numerics.remesh_every))
  {
    if (!active_)
      return;
    if (problem.has_dispersed_phase())
      throw InputError(c.file, "numerics.remesh",
                       "expected off for a case with undissolved content (a region with a solubility): the "
                       "remeshing does not carry the undissolved reserve yet, found on");
    // The largest cell, and the shortest diffusion length sqrt(D t) of the first output interval
    // over the regions (the guard of guards.cc judges the mesh against it).
    double largest = 0, shortest_length = std::numeric_limits<double>::max();
    for (const auto &cell : problem.dof_handler().active_cell_iterators())
      if (cell->is_locally_owned())
        {
          largest = std::max(largest, cell->diameter());
          const double d = problem.effective_diffusivity(cell->material_id(), cell->center(), 0.5 * first_output);
          if (d > 0)
            shortest_length = std::min(shortest_length, std::sqrt(d * first_output));
        }
    largest = Utilities::MPI::max(largest, problem.communicator());
    shortest_length = Utilities::MPI::min(shortest_length, problem.communicator());
    // auto: down to the levels of auto_levels, but no finer than a node spacing of an eighth of
    // that length. Finer cells would resolve the start's jump better than any output can show,
    // and would force time steps short enough to follow it (measured: the erfc run of the
    // remeshing tests took 4 times the steps of a uniform mesh of the same final error).
    const double by_length = shortest_length < std::numeric_limits<double>::max()
                               ? shortest_length / 8 * problem.degree() * std::sqrt(static_cast<double>(dim))
                               : 0.0;
    // With a floor (the accuracy check sets it from the smallest level or point value the case
    // reports) the error is judged against each cell's own values, as the step error is: a
    // value five decades under the scale gets the same relative accuracy as the scale itself.
    if (c.time.error_floor > 0)
      {
        limits_.floor = std::clamp(c.time.error_floor, 1e-8 * scale, scale);
        limits_.refine_above = c.numerics.remesh_error;
      }
    else
      limits_.refine_above = c.numerics.remesh_error * scale;
    limits_.coarsen_below = limits_.refine_above / 64;
    limits_.smallest =
      c.numerics.smallest_cell > 0
        ? c.numerics.smallest_cell
        : std::max(largest / std::pow(2.0, static_cast<double>(auto_levels[dim])), std::min(by_length, largest));
    limits_.largest = c.numerics.largest_cell;
    levels_ = static_cast<unsigned int>(std::ceil(std::log2(std::max(largest / limits_.smallest, 1.0)))) + 1;
    note_size();
  }

  template <int dim>
  void RunRemeshing<dim>::note_size()
  {
    cells_largest_ = std::max(cells_largest_, problem_.n_cells());
    unknowns_largest_ = std::max<unsigned long>(unknowns_largest_, problem_.n_dofs());
  }

  template <int dim>
  void RunRemeshing<dim>::fit_initial(Vector &u)
  {
    if (!active_)
      return;
    // The mesh must also hold the jump from the initial values to the boundary values that
    // start at t = 0: it is judged on the initial state with the fixed values imposed.
    for (unsigned int round = 0; round < levels_; ++round)
      {
        Vector probe = u;
        problem_.set_fixed_values(probe, 0.0);
        if (!problem_.adapt(probe, limits_, {&u}).changed)
          break;
        ++count_;
        note_size();
        problem_.initial_state(u); // the initial values themselves on the new mesh, not a transfer
      }
  }

  template <int dim>
  bool RunRemeshing<dim>::remesh(Vector &u, const std::vector<Vector *> &others)
  {
    const auto amounts_before = problem_.region_amounts(u);
    std::vector<Vector *> states{&u};
    states.insert(states.end(), others.begin(), others.end());
    if (!problem_.adapt(u, limits_, states).changed)
      return false;
    const auto amounts_after = problem_.region_amounts(u);
    amount_added_ += std::accumulate(amounts_after.begin(), amounts_after.end(), 0.0) -
                     std::accumulate(amounts_before.begin(), amounts_before.end(), 0.0);
    ++count_;
    note_size();
    return true;
  }

  template <int dim>
  void RunRemeshing<dim>::save(StateArchive &archive) const
  {
    const std::vector<std::string> cells = problem_.active_cells();
    archive.put_count(cells.size());
    for (const std::string &cell : cells)
      archive.put(cell);
    for (const std::uint64_t n :
         {std::uint64_t(count_), std::uint64_t(cells_largest_), std::uint64_t(unknowns_largest_)})
      archive.put_count(n);
    archive.put(amount_added_);
  }

  template <int dim>
  void RunRemeshing<dim>::resume(StateArchive &archive)
  {
    const std::uint64_t n = archive.get_count();
    if (n == 0)
      throw IoError("the checkpoint's mesh is damaged (no cells)");
    std::vector<std::string> cells;
    for (std::uint64_t k = 0; k < n; ++k) // a damaged count ends at the end of the file (IoError)
      cells.push_back(archive.get_text());
    problem_.rebuild(cells);
    count_ = static_cast<unsigned int>(archive.get_count());
    cells_largest_ = archive.get_count();
    unknowns_largest_ = archive.get_count();
    amount_added_ = archive.get();
  }

  template <int dim>
  void RunRemeshing<dim>::report(RunRecord &record) const
  {
    if (!active_)
      return;
    record.remeshings = count_;
    record.cells_largest = cells_largest_;
    record.unknowns_largest = unknowns_largest_;
    record.remeshed_amount = amount_added_;
  }

  template class RunRemeshing<1>;
  template class RunRemeshing<2>;
  template class RunRemeshing<3>;
} // namespace fickcast
