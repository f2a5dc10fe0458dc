// StepMultigrid: geometric multigrid for the step operator without matrices (see step_multigrid.h).
#include "numerics/step_multigrid.h"

#include <deal.II/dofs/dof_tools.h>
#include <deal.II/fe/fe_q.h>
#include <deal.II/lac/diagonal_matrix.h>
#include <deal.II/lac/solver_cg.h>
#include <deal.II/lac/solver_control.h>
#include <deal.II/lac/trilinos_precondition.h>
#include <deal.II/lac/trilinos_solver.h>
#include <deal.II/lac/trilinos_sparsity_pattern.h>
#include <deal.II/multigrid/mg_coarse.h>
#include <deal.II/multigrid/mg_matrix.h>
#include <deal.II/multigrid/mg_smoother.h>
#include <deal.II/multigrid/mg_transfer_global_coarsening.h>
#include <deal.II/multigrid/mg_transfer_global_coarsening.templates.h>
#include <deal.II/multigrid/multigrid.h>

#include <algorithm>

namespace fickcast
{
  using namespace dealii;

  namespace
  {
    /**
     * The coarse problem (the linear element on the coarse mesh), assembled for each key: sparse
     * LU (KLU through Trilinos Amesos) up to 30 000 unknowns, else CG with algebraic multigrid to
     * a relative residual of 1e-10. Either is close enough to the exact inverse for the cycle to
     * stay a fixed linear operator, which CG needs of a preconditioner.
     */
    class CoarseSolve : public MGCoarseGridBase<LinearAlgebra::distributed::Vector<double>>
    {
    public:
      using Distributed = LinearAlgebra::distributed::Vector<double>;
      TrilinosWrappers::SparseMatrix matrix;

      void factorise()
      {
        direct_.reset();
        multigrid_.reset();
        if (matrix.m() <= 30000)
          {
            direct_ = std::make_unique<TrilinosWrappers::SolverDirect>(
              control_, TrilinosWrappers::SolverDirect::AdditionalData(false, "Amesos_Klu"));
            direct_->initialize(matrix);
          }
        else
          {
            TrilinosWrappers::PreconditionAMG::AdditionalData data;
            data.elliptic = true;
            data.smoother_sweeps = 2;
            multigrid_ = std::make_unique<TrilinosWrappers::PreconditionAMG>();
            multigrid_->initialize(matrix, data);
          }
      }

      void operator()(const unsigned int, Distributed &dst, const Distributed &src) const override
      {
        if (direct_)
          {
            direct_->solve(dst, src);
            return;
          }
        dst = 0;
        const double norm = src.l2_norm();
        if (norm == 0)
          return;
        SolverControl control(2000, 1e-10 * norm, false, false);
        SolverCG<Distributed> cg(control);
        cg.solve(matrix, dst, src, *multigrid_);
      }

    private:
      mutable SolverControl control_{1, 0};
      mutable std::unique_ptr<TrilinosWrappers::SolverDirect> direct_;
      std::unique_ptr<TrilinosWrappers::PreconditionAMG> multigrid_;
    };
  } // namespace

  template <int dim>
  struct StepMultigrid<dim>::Machinery
  {
    using Level = LevelStep<dim>;
    using Diagonal = DiagonalMatrix<Distributed>;
    using Smoother = PreconditionChebyshev<Level, Distributed, Diagonal>;
    using Transfer = MGTransferGlobalCoarsening<dim, Distributed>;

    MGLevelObject<AffineConstraints<double>> constraints; ///< hanging nodes and held unknowns (zero)
    MGLevelObject<MGTwoLevelTransfer<dim, Distributed>> transfers;
    std::unique_ptr<Transfer> transfer;
    MGLevelObject<Level> levels;
    MGLevelObject<std::shared_ptr<Diagonal>> diagonals;
    mg::Matrix<Distributed> matrix;
    MGSmootherPrecondition<Level, Smoother, Distributed> smoother;
    CoarseSolve coarse;
    std::unique_ptr<Multigrid<Distributed>> multigrid;
    std::unique_ptr<PreconditionMG<dim, Distributed, Transfer>> preconditioner;
  };

  template <int dim>
  StepMultigrid<dim>::StepMultigrid() = default;
  template <int dim>
  StepMultigrid<dim>::~StepMultigrid() = default;

  namespace
  {
    /// Hanging-node constraints of @p dofs, and (in @p full) those plus zero on the held boundaries.
    template <int dim>
    void make_level_constraints(const DoFHandler<dim> &dofs, const std::set<types::boundary_id> &held_boundaries,
                                AffineConstraints<double> &hanging, AffineConstraints<double> &full)
    {
      IndexSet relevant;
      DoFTools::extract_locally_relevant_dofs(dofs, relevant);
      hanging.clear();
      hanging.reinit(relevant);
      DoFTools::make_hanging_node_constraints(dofs, hanging);
      hanging.close();
      full.clear();
      full.reinit(relevant);
      full.merge(hanging);
      if (!held_boundaries.empty())
        {
          const IndexSet boundary = DoFTools::extract_boundary_dofs(dofs, ComponentMask(), held_boundaries);
          for (const auto dof : boundary)
            if (relevant.is_element(dof) && !hanging.is_constrained(dof))
              full.add_line(dof);
        }
      full.close();
    }

    /// Owned rows (indices among the owned unknowns) held in @p full but not hanging.
    template <int dim>
    std::vector<unsigned int> held_rows(const DoFHandler<dim> &dofs, const AffineConstraints<double> &hanging,
                                        const AffineConstraints<double> &full)
    {
      std::vector<unsigned int> rows;
      const IndexSet &owned = dofs.locally_owned_dofs();
      for (unsigned int i = 0; i < owned.n_elements(); ++i)
        {
          const auto dof = owned.nth_index_in_set(i);
          if (full.is_constrained(dof) && !hanging.is_constrained(dof))
            rows.push_back(i);
        }
      return rows;
    }
  } // namespace

  template <int dim>
  bool StepMultigrid<dim>::build(const MatrixFreeStep<dim> &finest, const DoFHandler<dim> &dof_handler,
                                 const Coefficients &coefficients, const types::global_dof_index coarse_limit)
  {
    machinery_.reset();
    steps_.clear();
    dof_handlers_.clear();
    operators_.clear();
    held_.clear();
    meshes_ = MGTransferGlobalCoarseningTools::create_geometric_coarsening_sequence(dof_handler.get_triangulation());
    const FiniteElement<dim> &fe = dof_handler.get_fe();
    const unsigned int degree = fe.degree;
    // Meshes coarse to fine; on the coarsest, first the linear element (p-coarsening), so that the
    // coarse solve works on as few unknowns as the coarse mesh allows.
    const unsigned int n_h = static_cast<unsigned int>(meshes_.size());
    const unsigned int n_levels = n_h + 1;
    auto machinery = std::make_unique<Machinery>();
    machinery->constraints.resize(0, n_levels - 1);
    std::vector<AffineConstraints<double>> hanging(n_levels);
    const FE_Q<dim> linear(1);
    for (unsigned int l = 0; l + 1 < n_levels; ++l)
      {
        const auto &mesh = *meshes_[l == 0 ? 0 : l - 1];
        auto dofs = std::make_unique<DoFHandler<dim>>(mesh);
        dofs->distribute_dofs(l == 0 ? static_cast<const FiniteElement<dim> &>(linear) : fe);
        if (!dofs->locally_owned_dofs().is_contiguous())
          return false;
        make_level_constraints(*dofs, coefficients.held_boundaries, hanging[l], machinery->constraints[l]);
        dof_handlers_.push_back(std::move(dofs));
      }
    if (dof_handlers_.front()->n_dofs() > coarse_limit)
      {
        dof_handlers_.clear();
        meshes_.clear();
        return false;
      }
    make_level_constraints(dof_handler, coefficients.held_boundaries, hanging.back(),
                           machinery->constraints[n_levels - 1]);

    for (unsigned int l = 0; l + 1 < n_levels; ++l)
      {
        const unsigned int level_degree = l == 0 ? 1 : degree;
        const unsigned int n_q = std::max(2u, coefficients.n_q_1d + level_degree - degree);
        auto step = std::make_unique<MatrixFreeStep<dim>>();
        const auto held = held_rows(*dof_handlers_[l], hanging[l], machinery->constraints[l]);
        step->reinit(*coefficients.mapping, *dof_handlers_[l], hanging[l], held, coefficients.n_slots, n_q,
                     coefficients.cell, coefficients.with_faces, coefficients.face);
        operators_.push_back(step.get());
        held_.push_back(held);
        steps_.push_back(std::move(step));
      }
    operators_.push_back(&finest);
    held_.push_back(held_rows(dof_handler, hanging.back(), machinery->constraints[n_levels - 1]));
    finest_dofs_ = &dof_handler;

    machinery->transfers.resize(0, n_levels - 1);
    for (unsigned int l = 1; l < n_levels; ++l)
      {
        const DoFHandler<dim> &fine = l + 1 == n_levels ? dof_handler : *dof_handlers_[l];
        if (l == 1)
          machinery->transfers[l].reinit_polynomial_transfer(fine, *dof_handlers_[0], machinery->constraints[l],
                                                             machinery->constraints[0]);
        else
          machinery->transfers[l].reinit_geometric_transfer(fine, *dof_handlers_[l - 1], machinery->constraints[l],
                                                            machinery->constraints[l - 1]);
      }
    machinery->transfer = std::make_unique<typename Machinery::Transfer>(
      machinery->transfers, [this](const unsigned int l, Distributed &v) { operators_[l]->initialize_dof_vector(v); });

    machinery->levels.resize(0, n_levels - 1);
    machinery->diagonals.resize(0, n_levels - 1);
    for (unsigned int l = 0; l < n_levels; ++l)
      {
        machinery->levels[l].step = operators_[l];
        machinery->diagonals[l] = std::make_shared<typename Machinery::Diagonal>();
        operators_[l]->initialize_dof_vector(machinery->diagonals[l]->get_vector());
      }
    machinery->matrix.initialize(machinery->levels);
    {
      const DoFHandler<dim> &coarse = *dof_handlers_.front();
      IndexSet relevant;
      DoFTools::extract_locally_relevant_dofs(coarse, relevant);
      const MPI_Comm communicator = coarse.get_triangulation().get_communicator();
      TrilinosWrappers::SparsityPattern pattern(coarse.locally_owned_dofs(), coarse.locally_owned_dofs(), relevant,
                                                communicator);
      DoFTools::make_sparsity_pattern(coarse, pattern, machinery->constraints[0], false,
                                      Utilities::MPI::this_mpi_process(communicator));
      pattern.compress();
      machinery->coarse.matrix.reinit(pattern);
    }
    machinery_ = std::move(machinery);
    finest.initialize_dof_vector(in_);
    finest.initialize_dof_vector(out_);
    finest.initialize_dof_vector(top_inverse_diagonal_);
    return true;
  }

  template <int dim>
  types::global_dof_index StepMultigrid<dim>::coarse_unknowns() const
  {
    return operators_.empty() ? 0 : operators_.front()->size();
  }

  template <int dim>
  void StepMultigrid<dim>::set_weights(const std::vector<double> &key)
  {
    Assert(machinery_, ExcMessage("build() first"));
    Machinery &m = *machinery_;
    const unsigned int top = m.levels.max_level();
    MGLevelObject<typename Machinery::Smoother::AdditionalData> data(0, top);
    for (unsigned int l = 0; l <= top; ++l)
      {
        m.levels[l].key = key;
        operators_[l]->inverse_diagonal(key, m.diagonals[l]->get_vector());
        data[l].preconditioner = m.diagonals[l];
        data[l].smoothing_range = 15.;
        data[l].degree = 4;
        data[l].eig_cg_n_iterations = 10;
      }
    m.smoother.initialize(m.levels, data);
    operators_.front()->assemble(key, m.constraints[0], m.coarse.matrix);
    m.coarse.factorise();
    m.multigrid = std::make_unique<Multigrid<Distributed>>(m.matrix, m.coarse, *m.transfer, m.smoother, m.smoother);
    m.preconditioner = std::make_unique<PreconditionMG<dim, Distributed, typename Machinery::Transfer>>(
      *finest_dofs_, *m.multigrid, *m.transfer);
    operators_.back()->inverse_diagonal(key, top_inverse_diagonal_);
  }

  template <int dim>
  void StepMultigrid<dim>::vmult(Vector &dst, const Vector &src) const
  {
    Assert(machinery_ && machinery_->preconditioner, ExcMessage("set_weights() first"));
    const std::size_t n = in_.locally_owned_size();
    const double *from = src.trilinos_vector()[0];
    std::copy(from, from + n, in_.begin());
    for (const unsigned int i : held_.back())
      in_.local_element(i) = 0;
    machinery_->preconditioner->vmult(out_, in_);
    for (const unsigned int i : held_.back())
      out_.local_element(i) = from[i] * top_inverse_diagonal_.local_element(i);
    std::copy(out_.begin(), out_.begin() + n, dst.trilinos_vector()[0]);
  }

  template class StepMultigrid<1>;
  template class StepMultigrid<2>;
  template class StepMultigrid<3>;
} // namespace fickcast
