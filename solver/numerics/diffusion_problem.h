// The finite-element discretisation of C du/dt = div(G grad u) - k u + s on one mesh.
#pragma once

#include "case/case_description.h"
#include "geometry/layered_mesh.h"
#include "model/boundary_condition.h"
#include "model/material.h"
#include "numerics/linear_solver.h"
#include "numerics/phase_timer.h"

#include <deal.II/base/index_set.h>
#include <deal.II/dofs/dof_handler.h>
#include <deal.II/fe/fe_q.h>
#include <deal.II/fe/fe_values.h>
#include <deal.II/fe/mapping_q.h>
#include <deal.II/grid/tria.h>
#include <deal.II/lac/affine_constraints.h>
#include <deal.II/lac/full_matrix.h>
#include <deal.II/lac/trilinos_sparse_matrix.h>
#include <deal.II/lac/trilinos_vector.h>
#include <deal.II/lac/vector.h>

#include <memory>
#include <string>
#include <vector>

namespace fickcast
{
  template <int dim>
  class MatrixFreeStep;
  template <int dim>
  class StepMultigrid;

  /**
   * One step written as
   *
   *   M (a0 u1 + a1 u0 + a2 u_prev) + w1 (L1 u1 - F1) + w0 (L0 u0 - F0) = R
   *
   * with L the operator and F the forcing at the two ends of the step and R the reactions of
   * fixed unknowns (amounts entering through concentration boundaries and baths). Implicit Euler:
   * a = (1, -1, 0), w1 = dt; Crank-Nicolson: w1 = w0 = dt/2; BDF2: a from the step ratio, w1 = dt,
   * w0 = 0. With a clock tau (temperature schedules) dt is the clock step divided by its rate.
   */
  struct StepPlan
  {
    double t0 = 0, t1 = 0;
    double a0 = 1, a1 = -1, a2 = 0;
    double w1 = 0, w0 = 0;
  };

  /// What a step gives besides the new state.
  struct StepResult
  {
    /// Per boundary id: R summed over its fixed unknowns (concentration and bath boundaries).
    std::vector<double> reactions;
    unsigned int linear_iterations = 0;
    unsigned int nonlinear_iterations = 0;
    unsigned int active_set_iterations = 0;
    bool converged = true; ///< the nonlinear iteration met its tolerance
  };

  /// Instantaneous rates (amount per time) of the terms that are not reactions.
  struct TermRates
  {
    std::vector<double> boundary_inflow; ///< per boundary id: flux and transfer boundaries
    double source = 0;                   ///< volumetric sources
    double decay = 0;                    ///< first-order decay (a loss)
  };

  /// Where a remeshing may refine and coarsen (DiffusionProblem::adapt).
  struct AdaptLimits
  {
    double refine_above = 0;  ///< refine a cell whose error estimate (units of u) exceeds this
    double coarsen_below = 0; ///< coarsen cells (with their siblings) whose estimates lie below this
    double smallest = 0;      ///< no cell is refined below this diameter (m)
    double largest = 0;       ///< no cell is coarsened above this diameter (m; 0: no bound)
    /// 0: the two error limits are in units of u. Otherwise they are relative to the largest |u|
    /// in each cell, but to no less than this floor (units of u): values far below the scale are
    /// then resolved as well as those near it, down to the floor.
    double floor = 0;
  };

  /// What one remeshing did (collective numbers).
  struct AdaptResult
  {
    unsigned long cells_before = 0, cells_after = 0;
    unsigned long marked_refine = 0, marked_coarsen = 0;
    bool changed = false;
  };

  /// How strongly water flow dominates the cells (collective; zeros without flow).
  struct FlowNumbers
  {
    double peclet = 0;         ///< largest cell Peclet number |q K| h / (G along the flow), D at t = 0
    std::string peclet_region; ///< the region of that cell
    double crossing_rate = 0;  ///< largest |q K / C| / h (1/s): times a step, its Courant number
  };

  /// What a checkpoint keeps of the problem besides the state u (plain data, this rank's part).
  struct ProblemState
  {
    unsigned int stage = 0;
    std::vector<double> bath_value, bath_value_prev, bath_trial; ///< per boundary id
    std::vector<double> reserve;                                 ///< owned entries of the reserve
    std::vector<double> preconditioner_key; ///< coefficients of the matrix the preconditioner was built on
    unsigned int matrix_setups = 0;
    std::vector<double> system_key;        ///< coefficients of the step matrix in use
    std::vector<double> solver_statistics; ///< LinearSolver::statistics()
  };

  /**
   * Owns the mesh, the finite element space and the operators of the model of DESIGN.md
   * section 2 in the capacity/conductance form. The unknown u is the reference-phase
   * concentration (continuous across interfaces); each region's phase concentration is c = K u.
   *
   *   M = int C phi_i phi_j,   C = theta R K
   *   L = int G grad phi_i . grad phi_j + int k phi_i phi_j + sum_transfer int h K phi_i phi_j,
   *   G = theta tau K D,  k = lambda theta K (R if sorbed amounts decay too)
   *
   * L is kept in parts: a static part (constant coefficients, decay, transfer), one unit-D matrix
   * per region whose D depends on time only (rescaled per step instead of reassembled), and a
   * dynamic part reassembled when D depends on position and time or on the concentration.
   * Concentration and bath boundaries are fixed unknowns imposed by lifting; the unconstrained
   * residual at them gives the reactions (boundary fluxes). A bath's value follows from its mass
   * balance by superposition. Undissolved content (loading above solubility) sits in a nodal
   * reserve; nodes holding reserve stay at saturation (an active set).
   * Distributed over MPI ranks in 2-D and 3-D (p4est); 1-D runs on one rank. On a locally
   * refined mesh the operators are condensed with the hanging-node constraints (their rows carry
   * only a diagonal) and every state is distributed after a solve.
   */
  template <int dim>
  class DiffusionProblem
  {
  public:
    using Vector = dealii::TrilinosWrappers::MPI::Vector;

    DiffusionProblem(const CaseDescription &description, MPI_Comm communicator);
    ~DiffusionProblem();

    /// Builds the mesh (refined next to open faces) and the models of the regions.
    void build_mesh();
    /// build_mesh(), then the space and the operators; applies the first stage.
    void setup();
    /// Applies the boundary conditions of stage @p stage (rebuilds constraints and operators).
    void set_stage(unsigned int stage);
    unsigned int stage() const { return stage_; }

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
    /// The linear solver and preconditioners used so far and why (summary.json, printout).
    std::string linear_solver_description() const;
    PhaseTimer &timer() const { return timer_; }
    unsigned int n_matrix_setups() const { return (solver_ ? solver_->n_setups() : 0) + setups_before_; }

    // --- the model
    /// The material of each region (index = material id).
    const Material &material(dealii::types::material_id region) const { return materials_[region]; }
    double partition(dealii::types::material_id region) const { return materials_[region].partition(); }
    double capacity(dealii::types::material_id region) const { return materials_[region].capacity(); }
    /// Effective diffusivity tau D at a point, time and phase concentration.
    double effective_diffusivity(dealii::types::material_id region, const dealii::Point<dim> &point, double t,
                                 double c = 0) const;
    /// Conductance G = theta tau K D.
    double conductance(dealii::types::material_id region, const dealii::Point<dim> &point, double t,
                       double c = 0) const;
    /// Weight of the coordinate system at a point (1 for Cartesian).
    double coordinate_weight(const dealii::Point<dim> &point) const;
    /// Throws InputError on every rank if any rank met a non-physical coefficient (collective).
    void check_coefficients() const;
    /// The first value that was not finite of an expression asked during the run (a boundary
    /// value, flux or ambient, a source), as "KEY: message" from the lowest rank that met one, on
    /// every rank; empty if none (collective). A numerical failure, not an input error.
    std::string non_finite_expression() const;
    /// The first boundary concentration (value or ambient) an expression or table gave below zero,
    /// "" if none (collective: the lowest rank that saw one).
    std::string negative_boundary_value() const;
    /// The rate of the integration clock: the relative diffusivity of the region whose D changes
    /// in time only (1 if none), so that stepping in tau = int rate dt is exact for it.
    double clock_rate(double t) const;
    bool has_clock() const { return clock_region_ >= 0; }
    bool is_nonlinear() const { return nonlinear_; }
    /// Whether water flows through some region (advection: the step operator is unsymmetric).
    bool has_flow() const { return flow_; }
    /// Cell Peclet and crossing rate of the flow on this mesh (flow_checks.cc; collective).
    FlowNumbers flow_numbers() const;
    /// Faces where water crosses a sealed face, as one warning ("" if none; set by build_mesh).
    const std::string &flow_warning() const { return flow_warning_; }
    bool has_dispersed_phase() const { return dispersed_; }
    /// What the refinement next to open faces did ("" if none), and a warning if it stopped at
    /// the size limit before reaching its target ("" if not).
    const std::string &refinement_note() const { return refinement_note_; }
    const std::string &refinement_warning() const { return refinement_warning_; }

    // --- state
    /**
     * A zero work vector of the owned unknowns, borrowed for a scope from a pool the problem
     * keeps: constructing a Trilinos vector builds an Epetra map (twice: an empty one first),
     * which at a few hundred unknowns costs as much as the step's solve.
     */
    class WorkVector
    {
    public:
      explicit WorkVector(const DiffusionProblem &problem)
        : problem_(problem)
        , vector_(problem.borrow_vector())
      {
      }
      ~WorkVector() { problem_.return_vector(std::move(vector_)); }
      WorkVector(const WorkVector &) = delete;
      WorkVector &operator=(const WorkVector &) = delete;
      Vector &operator*() { return *vector_; }

    private:
      const DiffusionProblem &problem_;
      std::unique_ptr<Vector> vector_;
    };
    std::unique_ptr<Vector> borrow_vector() const
    {
      if (spare_vectors_.empty())
        return std::make_unique<Vector>(owned_template_);
      std::unique_ptr<Vector> vector = std::move(spare_vectors_.back());
      spare_vectors_.pop_back();
      *vector = 0;
      return vector;
    }
    void return_vector(std::unique_ptr<Vector> vector) const
    {
      // (A vector of the unknowns before a remeshing does not come back.)
      if (vector && vector->locally_owned_size() == owned_template_.locally_owned_size() &&
          vector->size() == owned_template_.size() && spare_vectors_.size() < 32)
        spare_vectors_.push_back(std::move(vector));
    }

    /// A zero vector of the owned unknowns (a copy of a template: it shares the template's map,
    /// where building a map costs a collective).
    Vector make_vector() const { return owned_template_; }
    /// @p owned with the ghost entries of the locally relevant unknowns.
    Vector make_ghosted(const Vector &owned) const
    {
      Vector ghosted(ghosted_template_);
      ghosted = owned;
      return ghosted;
    }
    /// u at t = 0: the initial phase concentration over the partition (saturation where a loading
    /// exceeds the solubility); fills the undissolved reserve and the bath values.
    void initial_state(Vector &u);
    /// A scale for u: the largest initial and boundary value magnitude, boundary values taken at
    /// @p t in the current stage (collective, > 0 if any).
    double concentration_scale(double t = 0) const;
    /// Sets the fixed unknowns of @p v to their values at @p t (concentration boundaries; baths
    /// at their current value): what the state holds after a step to t.
    void set_fixed_values(Vector &v, double t) const;
    /// Zeroes the fixed unknowns of @p v (concentration boundaries and baths).
    void zero_fixed(Vector &v) const;
    /// Zeroes the nodes whose undissolved reserve ran out in the last step: their history has a
    /// kink there, which a local error estimate from extrapolation would mistake for error.
    void zero_depleted(Vector &v) const;
    /// Whether every entry of @p u, and the last step's bath values and reserves, are finite
    /// (collective).
    bool is_finite(const Vector &u) const;
    /// Whether some node's reserve ran out in the last step (collective).
    bool depleted_in_last_step() const;

    /// Takes one step from @p u0 (and @p u_prev for BDF2); @p u1 holds an initial guess.
    /// Updates bath values and reserves; keeps the previous ones for accept_step / reject_step.
    StepResult advance(const StepPlan &plan, const Vector &u0, const Vector *u_prev, Vector &u1);
    /// Carries an error of the state through the step just taken by advance() (same plan, same
    /// system matrix and preconditioner): solves the step's homogeneous equation for @p e1 from
    /// @p e0 (and @p e_prev for BDF2). Fixed unknowns (concentration and bath faces, saturated
    /// reserve) carry no error. @p e1 holds an initial guess. Returns the linear iterations.
    unsigned int propagate_error(const StepPlan &plan, const Vector &e0, const Vector *e_prev, Vector &e1);
    /// The rate du/dt at @p t of the free unknowns, M^-1 (F - L u) (0 at fixed unknowns; hanging
    /// nodes from their parents): CG with the diagonal on the mass matrix. Not with an undissolved
    /// reserve (its saturated nodes are not free). Collective.
    Vector rate_of_change(const Vector &u, double t) const;
    /// Makes the last step's bath values and reserves the current ones.
    void accept_step();
    /// The stage, baths, reserve and preconditioner basis after the last accepted step.
    ProblemState saved_state() const;
    /// Continues from @p state (saved_state() of the same case on the same rank): sets the stage,
    /// the baths and the reserve, and rebuilds the preconditioner on the matrix it was built on,
    /// so that the following steps repeat the uninterrupted run's arithmetic. Call after
    /// initial_state(). Throws IoError if the state does not fit this problem.
    void restore(const ProblemState &state);

    // --- runtime mesh adaptivity (mesh_adaptation.cc)
    /// An estimate of the interpolation error of @p u on each locally owned active cell, in the
    /// units of u (indexed by active cell index; 0 on other cells): h times the jump of the normal
    /// derivative across the cell's faces (Kelly, Gago, Zienkiewicz and Babuska, Int. J. Numer.
    /// Meth. Eng. 19 (1983), from memory), scaled to the size of a nodal interpolation error.
    /// Collective.
    dealii::Vector<float> cell_error_estimates(const Vector &u) const;
    /// Refines the cells whose estimate exceeds @p limits.refine_above and coarsens those below
    /// @p limits.coarsen_below, within the smallest and largest cell size; carries each vector of
    /// @p states to the new mesh by interpolation (exact where cells are refined: the coarse
    /// function lies in the finer space; where cells are coarsened, what the coarser space cannot
    /// hold is lost, which the caller measures as a change of amount); then rebuilds the space,
    /// hanging-node constraints, fixed unknowns and operators of the current stage. The
    /// preconditioner is rebuilt on the next step. Region interfaces stay on cell faces (cells
    /// keep their region). Not with an undissolved reserve (throws). Collective.
    AdaptResult adapt(const Vector &u, const AdaptLimits &limits, const std::vector<Vector *> &states);
    /// Every active cell of the mesh, of all ranks (deal.II CellId text, sorted): with the mesh
    /// as set up, what rebuild() needs to make this mesh again (a checkpoint). Collective.
    std::vector<std::string> active_cells() const;
    /// Refines and coarsens the mesh until its active cells are @p cells (from active_cells() of
    /// a mesh grown from the same mesh as set up), then rebuilds the space and operators as
    /// adapt() does. States are not carried: the caller sets them. Throws IoError if the cells
    /// cannot be reached (another mesh). Collective.
    void rebuild(const std::vector<std::string> &cells);

    // --- observables (collective)
    /// Dissolved and sorbed amount in each region (index = material id), int C u.
    std::vector<double> region_amounts(const Vector &u) const;
    /// Undissolved amount (reserve) in total.
    double undissolved_amount() const;
    /// Rates of the non-reaction terms at @p u and @p t.
    TermRates rates(const Vector &u, double t) const;
    /// Per boundary id: the amount per time the water carries in through the face at @p u,
    /// -int q.n K u (0 without flow).
    std::vector<double> advective_inflow(const Vector &u) const;
    BoundaryKind boundary_kind(unsigned int boundary) const { return boundaries_[boundary].kind(); }
    /// Concentration in the bath on boundary @p boundary (bath phase; NaN if not a bath).
    double bath_concentration(unsigned int boundary) const;
    /// Amount held by the bath on @p boundary (0 if not a bath).
    double bath_amount(unsigned int boundary) const;

  private:
    struct MatrixPair
    {
      dealii::TrilinosWrappers::SparseMatrix full;        ///< unconstrained
      dealii::TrilinosWrappers::SparseMatrix constrained; ///< fixed rows and columns removed
    };

    // Set-up (diffusion_problem.cc).
    void make_mesh();
    /// Refines the cells in a band next to the faces where the species enters or leaves
    /// (geometry.open_face_*; open_face_refinement.cc).
    void refine_near_open_faces();
    /// Sets the hanging-node values of @p v from their parents (a no-op on a conforming mesh).
    void distribute(Vector &v) const;
    /// Zeroes the rows of hanging nodes in @p v (residuals: those rows carry no equation).
    void zero_hanging(Vector &v) const;
    /// Numbers the unknowns (attached to the mesh first unless @p attach is false: after a
    /// remeshing the handler stays attached) and makes the hanging-node constraints.
    void setup_dofs(bool attach = true);
    /// Sizes the operators for the current unknowns and makes the linear solver (direct or
    /// iterative by numerics.linear_solver and the number of unknowns).
    void make_operators();
    /// After the mesh changed and the space was set up: the operators, fixed unknowns and
    /// constant parts of the current stage; the next step builds its system anew.
    void remake_operators();
    void setup_fixed_unknowns();
    void reinit(MatrixPair &pair);

    // Water flow (flow_checks.cc).
    /// Checks the Darcy fluxes against the mesh: the normal component continuous across region
    /// interfaces, inflow faces where water enters and outflow faces where it leaves (throws
    /// InputError on every rank); notes sealed faces that water crosses (flow_warning()).
    /// Collective.
    void check_flow();
    /// Adds the advection, dispersion and streamline-upwind terms of @p cell's region to its
    /// local mass, operator and source weights.
    void add_flow_terms(const typename dealii::DoFHandler<dim>::active_cell_iterator &cell,
                        const dealii::FEValues<dim> &fe_values, dealii::FullMatrix<double> &mass,
                        dealii::FullMatrix<double> &stiffness, dealii::Vector<double> &load) const;

    // Assembly (operator_assembly.cc).
    unsigned int quadrature_points_per_axis() const;
    /// The constant parts (assemble_parts), then the matrix-free operator where it applies.
    void assemble_constant_parts();
    /// Mass, static and unit parts (the matrices only where they are sized), loads and weights.
    void assemble_parts();
    void assemble_dynamic(double t, const Vector *u_ghosted, bool with_jacobian);
    void apply_operator(double t, const Vector &u, Vector &out) const;
    void apply_dynamic(double t, const Vector &u_ghosted, Vector &out) const;
    void forcing(double t, Vector &f) const;
    void sources(double t, Vector &f) const;
    double boundary_forcing(unsigned int b, double t, Vector *f) const;

    // Steps (step_solve.cc).
    void build_system(const StepPlan &plan, bool jacobian);
    /// system_ = key[0] M + key[1] L_static + key[2 + j] L_unit_j (the key build_system makes).
    void compose_system(const std::vector<double> &key);
    /// The diffusion number of system_ composed with @p key: the largest ratio, over
    /// unconstrained rows, of the diagonal's stiffness part to its mass part. From the diagonals
    /// of the parts (kept until they are assembled again), or of system_ with a dynamic part.
    double diffusion_number(const std::vector<double> &key);
    void apply_frozen(double t, const Vector &x, Vector &out) const;
    /// The assembled matrices whose weighted sum is the step's a0 M + w1 L, with their weights:
    /// with @p frozen the coefficients as last assembled (apply_frozen), else the operator at t1
    /// (apply_operator), empty when that is not assembled (nonlinear, or reassembled at t1).
    std::vector<std::pair<const dealii::TrilinosWrappers::SparseMatrix *, double>> operator_terms(const StepPlan &plan,
                                                                                                  bool frozen) const;
    /// The owned rows that couple to a fixed unknown (found on first use after the fixed unknowns
    /// or the operators were made).
    const std::vector<dealii::types::global_dof_index> &rows_next_to_fixed();
    void solve_fixed(const StepPlan &plan, const Vector &rhs, Vector &u1, Vector &rhs_used, StepResult &result);
    void newton(const StepPlan &plan, const Vector &rhs, Vector &u1, StepResult &result);
    void solve_linear(const dealii::TrilinosWrappers::SparseMatrix *modified, Vector &x, const Vector &b,
                      StepResult &result);
    // The step operator without a matrix (matrix_free_use.cc).
    /// Whether the steps can be solved without assembling the step matrix: 2-D or 3-D, degree 2
    /// or more, linear
    /// (no concentration- or position-and-time-dependent diffusivity, no undissolved reserve), an
    /// iterative solver that may use the diagonal, and numerics.matrix_free not off.
    bool matrix_free_applies() const;
    /// Sets up the matrix-free step operator for the current space, stage and coefficients (or
    /// drops it where it does not apply). After assemble_constant_parts().
    void make_matrix_free();
    /// Hands the solver the matrix-free operator for @p key if it takes it: CG with the diagonal
    /// at this diffusion number, else with geometric multigrid where the mesh has coarser meshes
    /// (built on first need); false: compose the matrix.
    bool use_matrix_free(const std::vector<double> &key);
    /// Whether the operators' products are evaluated without matrices (then the matrices are
    /// assembled only when a step needs multigrid: ensure_matrices()).
    bool products_without_matrix() const;
    /// The key of the unconstrained sum a M + w L(t) (unit parts at D(t)), in build_system's order.
    std::vector<double> operator_key(double a, double w, double t) const;
    /// out = (sum of the parts with @p key) x without a matrix, unconstrained or constrained.
    void product_without_matrix(const std::vector<double> &key, const Vector &x, Vector &out, bool constrained) const;
    /// 1 / the diagonal of the constrained sum with @p key, without a matrix.
    void inverse_diagonal_without_matrix(const std::vector<double> &key, Vector &out) const;
    /// out = M x (unconstrained), from the matrix or without it.
    void mass_product(const Vector &x, Vector &out) const;
    /// Rows @p rows (owned) of the unconstrained sum with @p key times @p x, without a matrix.
    std::vector<double> rows_of_product(const std::vector<double> &key,
                                        const std::vector<dealii::types::global_dof_index> &rows,
                                        const Vector &x) const;
    /// The owned rows coupled to a held unknown, from the cells (no matrix pattern).
    std::vector<dealii::types::global_dof_index> rows_next_to_fixed_by_cells() const;
    /// Sizes the operator matrices (their sparsity) for the current unknowns.
    void size_matrices();
    /// Sizes and assembles the operator matrices if a matrix-free run has not yet.
    void ensure_matrices();

    const CaseDescription &description_;
    MPI_Comm communicator_;
    std::unique_ptr<dealii::Triangulation<dim>> triangulation_;
    MeshNames names_;
    dealii::FE_Q<dim> fe_;
    dealii::MappingQ<dim> mapping_;
    dealii::DoFHandler<dim> dof_handler_;
    dealii::IndexSet owned_, relevant_;
    mutable std::vector<std::unique_ptr<Vector>> spare_vectors_; ///< WorkVector's pool (of the current unknowns)
    Vector owned_template_, ghosted_template_;      ///< zero vectors whose copies make_vector() and make_ghosted() give
    dealii::AffineConstraints<double> hanging_;     ///< hanging-node constraints of a locally refined mesh
    dealii::AffineConstraints<double> constraints_; ///< hanging nodes and fixed unknowns
    bool has_hanging_ = false;                      ///< on any rank
    std::string refinement_note_, refinement_warning_;
    unsigned int stage_ = 0;

    // Model by material id and boundary id.
    std::vector<Material> materials_;
    int n_unit_ = 0;
    std::vector<int> unit_index_; ///< per region: index into unit_ (D uniform, time-dependent), or -1
    std::vector<bool> dynamic_;   ///< per region: assembled per time or iterate
    int clock_region_ = -1;
    double clock_reference_ = 1;
    bool nonlinear_ = false, dispersed_ = false, flow_ = false;
    std::string flow_warning_;
    std::vector<BoundaryCondition> boundaries_; ///< this stage's, by boundary id
    std::vector<double> boundary_partition_;    ///< K of the region touching each boundary
    bool source_depends_on_space_ = false;

    // Operators and weights.
    MatrixPair mass_, static_, dynamic_matrices_;
    std::vector<MatrixPair> unit_;
    dealii::TrilinosWrappers::SparseMatrix system_, modified_;
    std::vector<double> system_key_;    ///< coefficients the system matrix was built with
    std::vector<double> hierarchy_key_; ///< coefficients of the matrix the preconditioner was built on
    double dynamic_time_ = -1;
    bool dynamic_valid_ = false;
    bool dynamic_is_jacobian_ = false;
    std::vector<std::vector<double>> part_diagonals_; ///< of M, L_static, L_unit_j (owned rows), or empty
    std::vector<dealii::types::global_dof_index> rows_next_to_fixed_;
    bool rows_next_to_fixed_valid_ = false;
    unsigned long dynamic_version_ = 0;
    std::vector<Vector> region_mass_; ///< M_r 1 per region
    std::vector<Vector> region_load_; ///< int phi w per region
    std::vector<double> region_load_total_;
    Vector decay_weights_;                  ///< (k-part of L) 1
    std::vector<Vector> transfer_rowsum_;   ///< B_b 1 per boundary
    std::vector<Vector> advective_weights_; ///< int q.n K phi_i over boundary b (empty without flow)
    std::vector<Vector> boundary_load_;     ///< int phi w over boundary b (times h K for transfer)
    std::vector<double> boundary_load_total_;

    // Fixed unknowns: concentration boundaries and baths (owned entries).
    std::vector<std::pair<dealii::types::global_dof_index, unsigned int>> fixed_dofs_;
    std::vector<dealii::Point<dim>> fixed_points_;
    std::vector<unsigned int> baths_; ///< boundary ids of baths in this stage
    /// u on each bath (per boundary id): accepted, the one before (BDF2), and the trial step's.
    std::vector<double> bath_value_, bath_value_prev_, bath_trial_;

    // Undissolved reserve (amount per node): accepted and trial; saturation value of u per node.
    Vector reserve_, reserve_trial_, saturation_;
    std::vector<bool> dispersed_node_; ///< per owned dof (local index): in a region with a solubility
    std::vector<dealii::types::global_dof_index> depleted_; ///< reserve ran out in the last step

    std::unique_ptr<LinearSolver> solver_;
    std::unique_ptr<MatrixFreeStep<dim>> matrix_free_;
    std::unique_ptr<StepMultigrid<dim>> step_multigrid_; ///< for stiff steps without a matrix, built on need
    bool step_multigrid_failed_ = false;                 ///< this mesh has no usable hierarchy
    bool matrices_sized_ = false;    ///< the operator matrices have their sparsity (else left empty)
    bool matrices_ready_ = false;    ///< and hold the current stage's parts
    unsigned int setups_before_ = 0; ///< matrix setups of the run before a resume
    mutable std::string bad_coefficient_;
    mutable std::string non_finite_;        ///< first non-finite expression value (Material, BoundaryCondition)
    mutable std::string negative_boundary_; ///< first boundary concentration below zero (a warning)
    mutable PhaseTimer timer_;
  };
} // namespace fickcast
