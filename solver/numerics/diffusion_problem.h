// The finite-element discretisation of C du/dt = div(G grad u) - lambda C u + s on one mesh.
#pragma once

#include "case/case_description.h"
#include "geometry/layered_mesh.h"
#include "model/scalar_function.h"
#include "numerics/linear_solver.h"
#include "numerics/phase_timer.h"

#include <deal.II/base/index_set.h>
#include <deal.II/dofs/dof_handler.h>
#include <deal.II/fe/fe_q.h>
#include <deal.II/fe/mapping_q.h>
#include <deal.II/grid/tria.h>
#include <deal.II/lac/affine_constraints.h>
#include <deal.II/lac/trilinos_sparse_matrix.h>
#include <deal.II/lac/trilinos_vector.h>

#include <memory>
#include <string>
#include <vector>

namespace fickcast
{
  /// How one step is taken: the theta scheme (implicit Euler theta = 1, Crank-Nicolson 1/2) or
  /// variable-step BDF2 with coefficients alpha (alpha0 u1 + alpha1 u0 + alpha2 u_prev).
  struct StepPlan
  {
    double t0 = 0;
    double t1 = 0;
    bool bdf2 = false;
    double theta = 1;
    double alpha0 = 1, alpha1 = -1, alpha2 = 0;
    double dt() const { return t1 - t0; }
  };

  /// What a step gives besides the new state.
  struct StepResult
  {
    /// Per boundary (index = boundary id): the amount entering through it in the step
    /// (theta scheme), or dt times the inward rate at t1 (BDF2); nonzero only on
    /// concentration boundaries, from the residual of the discrete equations.
    std::vector<double> dirichlet_terms;
    unsigned int linear_iterations = 0;
    bool matrix_rebuilt = false;
  };

  /// Instantaneous rates of the terms that are not reactions (SI amount per time).
  struct TermRates
  {
    std::vector<double> boundary_inflow; ///< per boundary id: flux and transfer boundaries
    double source = 0;                   ///< volumetric sources
    double decay = 0;                    ///< first-order decay (a loss)
  };

  /**
   * Owns the mesh, the finite element space, and the operators of the model of DESIGN.md
   * section 2, in the capacity/conductance form with u the reference-phase concentration
   * (continuous) and c = K u the phase concentration of each region:
   *
   *   M = int C phi_i phi_j,  L = int G grad phi_i . grad phi_j + int lambda C phi_i phi_j
   *       + sum_transfer int h K phi_i phi_j,  C = theta R K,  G = theta tau K D.
   *
   * Concentration boundaries are imposed by lifting: the constrained copies of M and L (rows
   * and columns of the fixed unknowns removed) form the symmetric step matrix; the unconstrained
   * ones give the residual whose rows at fixed unknowns are the boundary reactions (fluxes).
   * Operators are assembled once and reassembled only when D depends on time.
   * Distributed over MPI ranks in 2-D and 3-D (p4est); 1-D runs on one rank.
   */
  template <int dim>
  class DiffusionProblem
  {
  public:
    using Vector = dealii::TrilinosWrappers::MPI::Vector;

    DiffusionProblem(const CaseDescription &description, MPI_Comm communicator);
    ~DiffusionProblem();

    /// Builds the mesh and the space, assembles the time-independent operators.
    void setup();
    /// Wall time per phase so far (set-up, assembly, matrix set-up, solve).
    PhaseTimer &timer() const { return timer_; }

    // --- the discretisation
    const dealii::DoFHandler<dim> &dof_handler() const { return dof_handler_; }
    const dealii::Mapping<dim> &mapping() const { return mapping_; }
    const dealii::Triangulation<dim> &triangulation() const { return *triangulation_; }
    MPI_Comm communicator() const { return communicator_; }
    const MeshNames &names() const { return names_; }
    const CaseDescription &description() const { return description_; }
    unsigned long n_cells() const;
    dealii::types::global_dof_index n_dofs() const { return dof_handler_.n_dofs(); }
    unsigned int degree() const { return fe_.degree; }
    bool uses_direct_solver() const;

    // --- coefficients
    double partition(dealii::types::material_id region) const;
    double capacity(dealii::types::material_id region) const;
    /// Conductance G = theta tau K D at a point and time.
    double conductance(dealii::types::material_id region, const dealii::Point<dim> &point, double t) const;
    /// Effective diffusivity tau D at a point and time.
    double effective_diffusivity(dealii::types::material_id region, const dealii::Point<dim> &point, double t) const;
    /// Throws InputError on every rank if any rank met a non-physical coefficient (collective).
    void check_coefficients() const;
    /// Weight of the coordinate system at a point (1 for Cartesian).
    double coordinate_weight(const dealii::Point<dim> &point) const;

    // --- state
    Vector make_vector() const;
    Vector make_ghosted(const Vector &owned) const;
    /// u at t = 0: the initial phase concentration divided by each region's partition.
    void initial_state(Vector &u) const;

    /// Takes one step; @p u_prev is the state before u0 (BDF2 only). @p u1 holds an initial
    /// guess on entry (iterative solver). Throws RunFailure.
    StepResult advance(const StepPlan &plan, const Vector &u0, const Vector *u_prev, Vector &u1);

    // --- observables (collective)
    /// Amount in each region (index = material id): int C u, dissolved and sorbed.
    std::vector<double> region_amounts(const Vector &u) const;
    /// Rates of the non-reaction terms at state @p u and time @p t.
    TermRates rates(const Vector &u, double t) const;
    /// Kind of each boundary (index = boundary id).
    BoundaryKind boundary_kind(unsigned int boundary) const { return boundary_kinds_[boundary]; }
    /// A scale for the concentration u: the largest initial and boundary value magnitude (> 0).
    double concentration_scale() const;
    /// Sets the entries of fixed (concentration-boundary) unknowns of @p v to zero.
    void zero_fixed(Vector &v) const;
    /// Factorisations or multigrid set-ups so far.
    unsigned int n_matrix_setups() const { return solver_ ? solver_->n_setups() : 0; }
    /// Unknown (reference-phase) value imposed on concentration boundary @p boundary at a point.
    double dirichlet_value(unsigned int boundary, const dealii::Point<dim> &point, double t) const;

  private:
    struct Operator
    {
      dealii::TrilinosWrappers::SparseMatrix full;        ///< L, unconstrained
      dealii::TrilinosWrappers::SparseMatrix constrained; ///< L with fixed rows/columns removed
      double time = -1;
      unsigned long version = 0;
    };

    void make_mesh();
    void setup_dofs();
    void assemble_constant_parts();
    unsigned int quadrature_points_per_axis() const;
    void assemble_operator(double t, Operator &op);
    void forcing(double t, Vector &f) const;
    void sources(double t, Vector &f) const;
    /// Inward rate through flux or transfer boundary @p b from its given value (flux) or ambient
    /// (transfer) at time t; adds the load vector to @p f when given.
    double boundary_forcing(unsigned int b, double t, Vector *f) const;
    const Operator &operator_at(double t, bool trial);

    const CaseDescription &description_;
    MPI_Comm communicator_;
    std::unique_ptr<dealii::Triangulation<dim>> triangulation_;
    MeshNames names_;
    dealii::FE_Q<dim> fe_;
    dealii::MappingQ<dim> mapping_;
    dealii::DoFHandler<dim> dof_handler_;
    dealii::IndexSet owned_, relevant_;
    dealii::AffineConstraints<double> constraints_;

    // Model, indexed by material id and boundary id.
    std::vector<ScalarFunction> diffusivity_, source_;
    std::vector<BoundaryKind> boundary_kinds_;
    std::vector<const BoundarySpec *> boundary_specs_;
    std::vector<ScalarFunction> boundary_value_, boundary_ambient_;
    std::vector<double> boundary_partition_; ///< K of the region touching each boundary
    bool operator_depends_on_time_ = false;
    bool source_depends_on_space_ = false;

    // Operators and weights.
    dealii::TrilinosWrappers::SparseMatrix mass_, mass_constrained_, system_;
    Operator current_, trial_;
    unsigned long operator_versions_ = 0;
    std::vector<Vector> region_mass_;         ///< M_r 1 per region
    std::vector<Vector> region_load_;         ///< int phi w per region (constant sources)
    Vector decay_weights_;                    ///< R 1
    std::vector<double> boundary_load_total_; ///< sum of boundary_load_ entries
    std::vector<double> region_load_total_;   ///< sum of region_load_ entries (region measure)
    std::vector<Vector> transfer_rowsum_;     ///< B_b 1 per boundary
    std::vector<Vector> boundary_load_;       ///< int phi w over boundary b (times h K for transfer)
    std::vector<std::pair<dealii::types::global_dof_index, unsigned int>> fixed_dofs_; ///< owned
    std::vector<dealii::Point<dim>> fixed_points_; ///< support point of each entry of fixed_dofs_
    double system_a_ = -1, system_b_ = -1;
    double hierarchy_b_over_a_ = -1; ///< b / a of the matrix the preconditioner was built for
    unsigned long system_version_ = 0;
    std::unique_ptr<LinearSolver> solver_;
    mutable std::string bad_coefficient_; ///< first non-physical coefficient met on this rank
    mutable PhaseTimer timer_;
  };
} // namespace fickcast
