// Geometric multigrid for the step operator applied without a matrix (2-D and 3-D, degree 2 or
// more), for the steps whose stiffness term the diagonal cannot handle.
#pragma once

#include "numerics/linear_solver.h"
#include "numerics/matrix_free_step.h"

#include <deal.II/base/mg_level_object.h>
#include <deal.II/base/subscriptor.h>
#include <deal.II/fe/fe.h>
#include <deal.II/grid/tria.h>
#include <deal.II/lac/precondition.h>

#include <memory>
#include <set>
#include <vector>

namespace fickcast
{
  /// The step operator on one mesh of the sequence, in the form deal.II's multigrid takes.
  template <int dim>
  class LevelStep : public dealii::Subscriptor
  {
  public:
    using Distributed = dealii::LinearAlgebra::distributed::Vector<double>;
    const MatrixFreeStep<dim> *step = nullptr;
    std::vector<double> key;

    dealii::types::global_dof_index m() const { return step->size(); }
    dealii::types::global_dof_index n() const { return step->size(); }
    void vmult(Distributed &dst, const Distributed &src) const { step->apply(key, src, dst, true); }
    void Tvmult(Distributed &dst, const Distributed &src) const { vmult(dst, src); }
    void initialize_dof_vector(Distributed &v) const { step->initialize_dof_vector(v); }
    /// Not used: the smoothers get the diagonal's inverse ready (Chebyshev only asks for entries
    /// when it has none).
    double el(dealii::types::global_dof_index, dealii::types::global_dof_index) const
    {
      AssertThrow(false, dealii::ExcInternalError());
      return 1;
    }
  };

  /**
   * A V-cycle over the meshes of global coarsening: the run's mesh, then each coarser mesh
   * p4est gives by coarsening every family of children once, down to the coarse mesh the run
   * started from (deal.II MGTransferGlobalCoarsening, which takes hanging nodes on every mesh, so
   * adaptive meshes need no special treatment). On every mesh the step operator is applied
   * without a matrix (MatrixFreeStep, coefficients at the quadrature points of that mesh's
   * cells); smoothing is Chebyshev iteration on the diagonal (degree 4, over the upper 1/15 of
   * the spectrum, bounds from 10 CG steps). Below the coarse mesh at the run's degree comes the
   * linear element on it (p-coarsening), whose matrix is assembled for each key (from the same
   * coefficients) and solved exactly, so that the cycle is one fixed linear operator, fit for CG,
   * and meshes that were never refined still get a two-level cycle.
   * Held unknowns are zero on every mesh; their rows of the result are the residual over the
   * diagonal, as the operator CG solves with has them.
   *
   * The sequence, its operators and the transfers are built once per mesh (build); a new step
   * size re-weighs the operators and re-estimates the smoothers' spectra (set_weights), which
   * costs about as much as two cycles.
   */
  template <int dim>
  class StepMultigrid : public PreconditionerWithoutMatrix
  {
  public:
    using Vector = dealii::TrilinosWrappers::MPI::Vector;
    using Distributed = dealii::LinearAlgebra::distributed::Vector<double>;

    /// What each mesh's operator needs besides its mesh (as MatrixFreeStep::reinit takes it).
    struct Coefficients
    {
      const dealii::Mapping<dim> *mapping = nullptr;
      unsigned int n_slots = 2, n_q_1d = 2;
      typename MatrixFreeStep<dim>::CellCoefficients cell;
      bool with_faces = false;
      typename MatrixFreeStep<dim>::FaceCoefficient face;
      std::set<dealii::types::boundary_id> held_boundaries; ///< boundaries whose unknowns are held
    };

    StepMultigrid();
    ~StepMultigrid() override;

    /**
     * Builds the coarser meshes below @p dof_handler's (whose step operator is @p finest) with
     * their operators and the transfers. False, with nothing built, where the coarse mesh with
     * the linear element has more than @p coarse_limit unknowns (its solve would cost more than
     * algebraic multigrid on the whole) or a mesh's unknowns are not contiguous per rank.
     */
    bool build(const MatrixFreeStep<dim> &finest, const dealii::DoFHandler<dim> &dof_handler,
               const Coefficients &coefficients, dealii::types::global_dof_index coarse_limit = 200000);

    /// The step operator's key (see MatrixFreeStep): re-weighs every mesh and the smoothers.
    void set_weights(const std::vector<double> &key);

    /// One V-cycle: @p dst = (approximate inverse of the step operator) @p src.
    void vmult(Vector &dst, const Vector &src) const override;

    unsigned int n_meshes() const { return static_cast<unsigned int>(operators_.size()); }
    dealii::types::global_dof_index coarse_unknowns() const;

  private:
    struct Machinery; ///< deal.II's multigrid objects, which refer to each other
    std::vector<std::shared_ptr<const dealii::Triangulation<dim>>> meshes_;
    std::vector<std::unique_ptr<dealii::DoFHandler<dim>>> dof_handlers_; ///< coarser meshes only
    std::vector<std::unique_ptr<MatrixFreeStep<dim>>> steps_;            ///< coarser meshes only
    std::vector<const MatrixFreeStep<dim> *> operators_;                 ///< every mesh, coarse first
    std::vector<std::vector<unsigned int>> held_;                        ///< per mesh: owned held rows
    const dealii::DoFHandler<dim> *finest_dofs_ = nullptr;
    std::unique_ptr<Machinery> machinery_;
    Distributed top_inverse_diagonal_;
    mutable Distributed in_, out_;
  };
} // namespace fickcast
