// The operators of a step applied cell by cell, without assembling their matrices (deal.II
// MatrixFree with sum factorisation), for the linear steps of 2-D and 3-D runs.
#pragma once

#include "numerics/linear_solver.h"

#include <deal.II/base/aligned_vector.h>
#include <deal.II/base/vectorization.h>
#include <deal.II/dofs/dof_handler.h>
#include <deal.II/fe/mapping.h>
#include <deal.II/lac/affine_constraints.h>
#include <deal.II/lac/la_parallel_vector.h>
#include <deal.II/lac/trilinos_sparse_matrix.h>
#include <deal.II/matrix_free/fe_evaluation.h>
#include <deal.II/matrix_free/matrix_free.h>

#include <functional>
#include <memory>
#include <vector>

namespace fickcast
{
  /**
   * Products with weighted sums of the operator's parts,
   *
   *   key[0] M + key[1] L_static + sum_s key[s] L_unit(s),
   *
   * the sums DiffusionProblem otherwise assembles (see its compose_system), evaluated on the fly
   * from coefficients kept at the quadrature points: capacity and reaction (values), conductance
   * (gradients), and transfer on boundary faces (values). Two forms, as the assembled matrices
   * come in two: unconstrained (hanging nodes condensed, their rows zero) and constrained (held
   * unknowns' rows and columns removed as well; constrained rows act as their diagonal times the
   * entry). The constrained sum of the step, with the inverse of its diagonal, is the operator
   * CG solves with (set_weights). On affine cells with cellwise constant coefficients the
   * products equal the assembled matrices' to round-off.
   *
   * Per product it reads each cell's unknowns once and the coefficients at the quadrature points,
   * where a matrix streams 125 (Q2) to 729 (Q4) entries per row in 3-D: measured on the
   * development machine at 227k unknowns in 3-D, 13 ms against 21 ms (Q2), 10 against 39 (Q3),
   * 8 against 67 ms (Q4), and no set-up beyond the geometry (0.01-0.03 s against 1-6 s of
   * assembly).
   */
  template <int dim>
  class MatrixFreeStep : public OperatorWithoutMatrix
  {
  public:
    using Vector = dealii::TrilinosWrappers::MPI::Vector;
    using Distributed = dealii::LinearAlgebra::distributed::Vector<double>;
    using CellIterator = typename dealii::DoFHandler<dim>::cell_iterator;

    /// The coefficients at one quadrature point of a cell, coordinate weight included.
    struct Coefficients
    {
      double capacity = 0;    ///< C, into M
      double reaction = 0;    ///< k, into L_static's value part
      double conductance = 0; ///< G of a static region, into L_static
      int slot = -1;          ///< key index of the region's unit part (D a function of time), or -1
      double unit_factor = 0; ///< G of that unit part at D = 1
    };
    using CellCoefficients = std::function<Coefficients(const CellIterator &, const dealii::Point<dim> &)>;
    /// Transfer coefficient h K at a point of a boundary face, coordinate weight included (0: none).
    using FaceCoefficient = std::function<double(const CellIterator &, unsigned int face, const dealii::Point<dim> &)>;

    /// Sets up the geometry, the coefficients and the parts' diagonals: @p hanging the
    /// hanging-node constraints, @p held the owned held unknowns (indices into the owned ones),
    /// @p n_slots the length of a key, @p n_q_1d Gauss points per axis on cells and faces,
    /// @p with_faces when some boundary carries a transfer term.
    void reinit(const dealii::Mapping<dim> &mapping, const dealii::DoFHandler<dim> &dof_handler,
                const dealii::AffineConstraints<double> &hanging, const std::vector<unsigned int> &held,
                unsigned int n_slots, unsigned int n_q_1d, const CellCoefficients &cell, bool with_faces,
                const FaceCoefficient &face);
    bool is_set_up() const { return set_up_; }

    /// The diagonal of each part (index = key index; owned rows, 0 on hanging rows).
    const std::vector<std::vector<double>> &part_diagonals() const { return part_diagonals_; }

    /// @p dst = (sum of the parts weighted by @p key) @p src, unconstrained or constrained.
    void apply(const std::vector<double> &key, const Vector &src, Vector &dst, bool constrained) const;
    /// The same on deal.II's distributed vectors (the owned rows are read and written).
    void apply(const std::vector<double> &key, const Distributed &src, Distributed &dst, bool constrained) const;
    /// A vector of this operator's unknowns, with the ghosts its products read.
    void initialize_dof_vector(Distributed &v) const { data_.initialize_dof_vector(v); }
    /// Number of unknowns (all ranks).
    dealii::types::global_dof_index size() const { return in_.size(); }

    /**
     * Assembles the sum with @p key into @p matrix (sized for this operator's unknowns with
     * @p constraints), the constrained rows as AffineConstraints leaves them (a diagonal entry):
     * the coarse matrix of geometric multigrid.
     */
    void assemble(const std::vector<double> &key, const dealii::AffineConstraints<double> &constraints,
                  dealii::TrilinosWrappers::SparseMatrix &matrix) const;

    /// The key of the step operator CG solves with (vmult, inverse_diagonal).
    void set_weights(const std::vector<double> &key);
    void vmult(Vector &dst, const Vector &src) const override { apply(key_, src, dst, true); }
    const Vector &inverse_diagonal() const override { return inverse_diagonal_; }
    /// 1 / the diagonal of the sum with @p key (1 where it is 0: hanging rows).
    void inverse_diagonal(const std::vector<double> &key, Vector &out) const;
    void inverse_diagonal(const std::vector<double> &key, Distributed &out) const;

  private:
    using Number = dealii::VectorizedArray<double>;

    /// The coefficients of one key, combined at the quadrature points.
    struct Weights
    {
      std::vector<double> key;
      dealii::AlignedVector<Number> value, gradient, face;
    };
    const Weights &weights_of(const std::vector<double> &key) const;

    void cell_product(const dealii::MatrixFree<dim, double> &data, Distributed &dst, const Distributed &src,
                      const std::pair<unsigned int, unsigned int> &range) const;
    void face_product(const dealii::MatrixFree<dim, double> &data, Distributed &dst, const Distributed &src,
                      const std::pair<unsigned int, unsigned int> &range) const;
    void boundary_product(const dealii::MatrixFree<dim, double> &data, Distributed &dst, const Distributed &src,
                          const std::pair<unsigned int, unsigned int> &range) const;
    void compute_part_diagonals(unsigned int n_slots);
    /// The cell integrand of @p w on the values of @p phi (evaluate, weigh, integrate).
    void cell_integrand(const Weights &w, dealii::FEEvaluation<dim, -1, 0, 1, double> &phi) const;
    /// The product on the owned rows: @p from and @p to hold them.
    void product(const std::vector<double> &key, const double *from, double *to, bool constrained) const;
    void inverse_diagonal(const std::vector<double> &key, double *inverse) const;

    dealii::MatrixFree<dim, double> data_;
    bool set_up_ = false, with_faces_ = false;
    unsigned int n_q_ = 0, n_face_q_ = 0;
    // Per cell batch and quadrature point (batch * n_q_ + q).
    dealii::AlignedVector<Number> capacity_, reaction_, conductance_, unit_factor_;
    std::vector<int> slot_;                  ///< per cell batch and lane
    dealii::AlignedVector<Number> transfer_; ///< per boundary face batch and face point
    std::vector<bool> face_batch_active_;    ///< per boundary face batch: carries a transfer term
    std::vector<unsigned int> held_;         ///< local indices of owned held unknowns
    std::vector<unsigned int> hanging_rows_; ///< local indices of owned hanging nodes
    std::vector<std::vector<double>> part_diagonals_;
    std::vector<double> key_;
    Vector inverse_diagonal_;
    mutable std::vector<std::unique_ptr<Weights>> cache_; ///< the keys used last (a few)
    mutable const Weights *current_ = nullptr;
    mutable Distributed in_, out_;
  };
} // namespace fickcast
