// Runtime remeshing inside a run (numerics.remesh): when, how fine, and what it did.
#pragma once

#include "case/case_description.h"
#include "numerics/diffusion_problem.h"
#include "results/run_record.h"
#include "run/checkpoint.h"

#include <vector>

namespace fickcast
{
  /**
   * Refines the mesh where the concentration needs it and coarsens it where it no longer does,
   * every numerics.remesh_every accepted steps: a cell is refined when its estimated
   * interpolation error (DiffusionProblem::cell_error_estimates) exceeds numerics.remesh_error
   * times the concentration scale, and coarsened when it lies below 1/64 of that (a refinement
   * divides the error of a quadratic element by about 8; the gap keeps a cell from flipping).
   * Cells stay between numerics.smallest_cell and numerics.largest_cell. The amount each
   * remeshing adds (refinement: nothing, the spaces are nested; coarsening: what the coarser
   * space cannot hold) is summed as a term of the mass balance.
   */
  template <int dim>
  class RunRemeshing
  {
  public:
    using Vector = typename DiffusionProblem<dim>::Vector;

    /// Inactive unless @p c asks for remeshing. Throws InputError for what it cannot carry.
    /// @p first_output (s) bounds the automatic smallest cell: see numerics.smallest_cell.
    RunRemeshing(DiffusionProblem<dim> &problem, const CaseDescription &c, double scale, double first_output);
    bool active() const { return active_; }

    /// The initial state on a mesh fitted to it: remeshes and evaluates the initial state anew
    /// on each new mesh until the mesh settles (at most as many times as refinement levels are
    /// allowed). @p u is the initial state on entry and on exit.
    void fit_initial(Vector &u);
    /// Whether a remeshing is due after @p steps accepted steps.
    bool due(unsigned int steps) const { return active_ && steps % every_ == 0; }
    /// Remeshes by @p u and carries @p u and @p others; returns whether the mesh changed.
    bool remesh(Vector &u, const std::vector<Vector *> &others);
    /// Writes the mesh (its active cells) and the counts to @p archive (collective).
    void save(StateArchive &archive) const;
    /// Reads what save() wrote and makes that mesh again from the mesh as set up (collective).
    /// Throws IoError if the archive does not hold a mesh of this case.
    void resume(StateArchive &archive);
    /// Adds @p amount to the remeshing term of the balance (what a step booked from a remeshing).
    void book(const double amount) { amount_added_ += amount; }
    /// Puts the counts, the largest mesh and the amount added into @p record.
    void report(RunRecord &record) const;

  private:
    void note_size();

    DiffusionProblem<dim> &problem_;
    bool active_ = false;
    unsigned int every_ = 1;
    unsigned int levels_ = 0;
    AdaptLimits limits_;
    unsigned int count_ = 0;
    unsigned long cells_largest_ = 0, unknowns_largest_ = 0;
    double amount_added_ = 0;
  };
} // namespace fickcast
