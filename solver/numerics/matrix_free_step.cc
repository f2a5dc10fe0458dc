// MatrixFreeStep: the step matrix applied cell by cell (see matrix_free_step.h).
#include "numerics/matrix_free_step.h"

#include <deal.II/base/quadrature_lib.h>
#include <deal.II/lac/full_matrix.h>
#include <deal.II/matrix_free/fe_evaluation.h>
#include <deal.II/matrix_free/tools.h>

#include <algorithm>

namespace fickcast
{
  using namespace dealii;

  template <int dim>
  void MatrixFreeStep<dim>::reinit(const Mapping<dim> &mapping, const DoFHandler<dim> &dof_handler,
                                   const AffineConstraints<double> &hanging, const std::vector<unsigned int> &held,
                                   const unsigned int n_slots, const unsigned int n_q_1d, const CellCoefficients &cell,
                                   const bool with_faces, const FaceCoefficient &face)
  {
    const IndexSet &owned = dof_handler.locally_owned_dofs();
    AssertThrow(owned.is_contiguous(), ExcMessage("matrix-free products need each rank's unknowns contiguous"));
    typename MatrixFree<dim, double>::AdditionalData settings;
    settings.tasks_parallel_scheme = MatrixFree<dim, double>::AdditionalData::none;
    settings.mapping_update_flags = update_values | update_gradients | update_JxW_values | update_quadrature_points;
    if (with_faces)
      settings.mapping_update_flags_boundary_faces = update_values | update_JxW_values | update_quadrature_points;
    data_.reinit(mapping, dof_handler, hanging, QGauss<1>(n_q_1d), settings);
    with_faces_ = with_faces;
    key_.clear();
    cache_.clear();
    current_ = nullptr;

    // Coefficients at the quadrature points, lane by lane (cells of a batch may lie in
    // different regions).
    const unsigned int n_lanes = Number::size();
    const unsigned int n_batches = data_.n_cell_batches();
    FEEvaluation<dim, -1, 0, 1, double> phi(data_);
    n_q_ = phi.n_q_points;
    for (auto *field : {&capacity_, &reaction_, &conductance_, &unit_factor_})
      field->resize_fast(static_cast<std::size_t>(n_batches) * n_q_);
    slot_.assign(static_cast<std::size_t>(n_batches) * n_lanes, -1);
    for (unsigned int batch = 0; batch < n_batches; ++batch)
      {
        phi.reinit(batch);
        const std::size_t start = static_cast<std::size_t>(batch) * n_q_;
        for (unsigned int q = 0; q < n_q_; ++q)
          for (auto *field : {&capacity_, &reaction_, &conductance_, &unit_factor_})
            (*field)[start + q] = Number(0.0);
        for (unsigned int v = 0; v < data_.n_active_entries_per_cell_batch(batch); ++v)
          {
            const auto cell_iterator = data_.get_cell_iterator(batch, v);
            for (unsigned int q = 0; q < n_q_; ++q)
              {
                Point<dim> point;
                const auto at = phi.quadrature_point(q);
                for (unsigned int d = 0; d < dim; ++d)
                  point[d] = at[d][v];
                const Coefficients c = cell(cell_iterator, point);
                AssertThrow(c.slot < static_cast<int>(n_slots), ExcInternalError());
                capacity_[start + q][v] = c.capacity;
                reaction_[start + q][v] = c.reaction;
                conductance_[start + q][v] = c.conductance;
                unit_factor_[start + q][v] = c.unit_factor;
                slot_[static_cast<std::size_t>(batch) * n_lanes + v] = c.slot;
              }
          }
      }

    transfer_.clear();
    face_batch_active_.clear();
    n_face_q_ = 0;
    if (with_faces)
      {
        const unsigned int first = data_.n_inner_face_batches();
        const unsigned int n_faces = data_.n_boundary_face_batches();
        FEFaceEvaluation<dim, -1, 0, 1, double> face_phi(data_, true);
        n_face_q_ = face_phi.n_q_points;
        transfer_.resize_fast(static_cast<std::size_t>(n_faces) * n_face_q_);
        face_batch_active_.assign(n_faces, false);
        for (unsigned int f = 0; f < n_faces; ++f)
          {
            face_phi.reinit(first + f);
            const std::size_t start = static_cast<std::size_t>(f) * n_face_q_;
            for (unsigned int q = 0; q < n_face_q_; ++q)
              transfer_[start + q] = Number(0.0);
            for (unsigned int v = 0; v < data_.n_active_entries_per_face_batch(first + f); ++v)
              {
                const auto [cell_iterator, face_no] = data_.get_face_iterator(first + f, v, true);
                for (unsigned int q = 0; q < n_face_q_; ++q)
                  {
                    Point<dim> point;
                    const auto at = face_phi.quadrature_point(q);
                    for (unsigned int d = 0; d < dim; ++d)
                      point[d] = at[d][v];
                    const double h = face(cell_iterator, face_no, point);
                    transfer_[start + q][v] = h;
                    if (h != 0)
                      face_batch_active_[f] = true;
                  }
              }
          }
      }

    held_ = held;
    hanging_rows_.clear();
    for (unsigned int i = 0; i < owned.n_elements(); ++i)
      if (hanging.is_constrained(owned.nth_index_in_set(i)))
        hanging_rows_.push_back(i);
    data_.initialize_dof_vector(in_);
    data_.initialize_dof_vector(out_);
    AssertThrow(in_.locally_owned_size() == owned.n_elements(), ExcInternalError());
    inverse_diagonal_.reinit(owned, dof_handler.get_triangulation().get_communicator());
    set_up_ = true;
    compute_part_diagonals(n_slots);
  }

  template <int dim>
  const typename MatrixFreeStep<dim>::Weights &MatrixFreeStep<dim>::weights_of(const std::vector<double> &key) const
  {
    for (const auto &w : cache_)
      if (w->key == key)
        return *w;
    auto w = std::make_unique<Weights>();
    w->key = key;
    const unsigned int n_lanes = Number::size();
    const std::size_t n = capacity_.size();
    const double k0 = key.empty() ? 0.0 : key[0], k1 = key.size() > 1 ? key[1] : 0.0;
    w->value.resize_fast(n);
    w->gradient.resize_fast(n);
    for (std::size_t i = 0; i < n; ++i)
      {
        w->value[i] = k0 * capacity_[i] + k1 * reaction_[i];
        Number unit(0.0);
        const std::size_t batch = i / n_q_;
        for (unsigned int v = 0; v < n_lanes; ++v)
          {
            const int slot = slot_[batch * n_lanes + v];
            if (slot >= 0 && static_cast<std::size_t>(slot) < key.size())
              unit[v] = key[static_cast<std::size_t>(slot)] * unit_factor_[i][v];
          }
        w->gradient[i] = k1 * conductance_[i] + unit;
      }
    w->face.resize_fast(transfer_.size());
    for (std::size_t i = 0; i < transfer_.size(); ++i)
      w->face[i] = k1 * transfer_[i];
    if (cache_.size() >= 6)
      cache_.erase(cache_.begin());
    cache_.push_back(std::move(w));
    return *cache_.back();
  }

  template <int dim>
  void MatrixFreeStep<dim>::cell_integrand(const Weights &w, FEEvaluation<dim, -1, 0, 1, double> &phi) const
  {
    const std::size_t start = static_cast<std::size_t>(phi.get_current_cell_index()) * n_q_;
    phi.evaluate(EvaluationFlags::values | EvaluationFlags::gradients);
    for (unsigned int q = 0; q < n_q_; ++q)
      {
        phi.submit_value(w.value[start + q] * phi.get_value(q), q);
        phi.submit_gradient(w.gradient[start + q] * phi.get_gradient(q), q);
      }
    phi.integrate(EvaluationFlags::values | EvaluationFlags::gradients);
  }

  template <int dim>
  void MatrixFreeStep<dim>::assemble(const std::vector<double> &key, const AffineConstraints<double> &constraints,
                                     TrilinosWrappers::SparseMatrix &matrix) const
  {
    const Weights &w = weights_of(key);
    matrix = 0;
    const std::function<void(FEEvaluation<dim, -1, 0, 1, double> &)> local =
      [&](FEEvaluation<dim, -1, 0, 1, double> &phi) { cell_integrand(w, phi); };
    MatrixFreeTools::compute_matrix<dim, -1, 0, 1, double, Number>(data_, constraints, matrix, local);
    if (with_faces_)
      {
        // The transfer term face by face, column by column (FEFaceEvaluation numbers the cell's
        // unknowns lexicographically).
        FEFaceEvaluation<dim, -1, 0, 1, double> phi(data_, true);
        const unsigned int first = data_.n_inner_face_batches();
        const auto &lexicographic = data_.get_shape_info().lexicographic_numbering;
        const unsigned int n = phi.dofs_per_cell;
        FullMatrix<double> local_matrix(n, n);
        std::vector<types::global_dof_index> indices(n), ordered(n);
        for (unsigned int f = 0; f < face_batch_active_.size(); ++f)
          {
            if (!face_batch_active_[f])
              continue;
            phi.reinit(first + f);
            for (unsigned int v = 0; v < data_.n_active_entries_per_face_batch(first + f); ++v)
              {
                for (unsigned int j = 0; j < n; ++j)
                  {
                    for (unsigned int i = 0; i < n; ++i)
                      phi.begin_dof_values()[i] = Number(i == j ? 1.0 : 0.0);
                    phi.evaluate(EvaluationFlags::values);
                    for (unsigned int q = 0; q < n_face_q_; ++q)
                      phi.submit_value(w.face[static_cast<std::size_t>(f) * n_face_q_ + q] * phi.get_value(q), q);
                    phi.integrate(EvaluationFlags::values);
                    for (unsigned int i = 0; i < n; ++i)
                      local_matrix(i, j) = phi.begin_dof_values()[i][v];
                  }
                const auto cell = data_.get_face_iterator(first + f, v, true).first;
                cell->get_dof_indices(indices);
                for (unsigned int i = 0; i < n; ++i)
                  ordered[i] = indices[lexicographic[i]];
                constraints.distribute_local_to_global(local_matrix, ordered, matrix);
              }
          }
        matrix.compress(VectorOperation::add);
      }
  }

  template <int dim>
  void MatrixFreeStep<dim>::compute_part_diagonals(const unsigned int n_slots)
  {
    part_diagonals_.assign(n_slots, std::vector<double>());
    Distributed diagonal, faces;
    data_.initialize_dof_vector(diagonal);
    for (unsigned int p = 0; p < n_slots; ++p)
      {
        std::vector<double> unit_key(n_slots, 0.0);
        unit_key[p] = 1.0;
        current_ = &weights_of(unit_key);
        const Weights &w = *current_;
        const std::function<void(FEEvaluation<dim, -1, 0, 1, double> &)> local =
          [&](FEEvaluation<dim, -1, 0, 1, double> &phi) { cell_integrand(w, phi); };
        diagonal = 0; // compute_diagonal adds to what the vector holds
        MatrixFreeTools::compute_diagonal<dim, -1, 0, 1, double, Number, Distributed>(data_, diagonal, local);
        if (with_faces_ && p == 1)
          {
            // The transfer term's share, face by face (through the hanging-node constraints as a
            // load is, which is the diagonal exactly where no hanging node lies on the face).
            data_.initialize_dof_vector(faces);
            FEFaceEvaluation<dim, -1, 0, 1, double> phi(data_, true);
            const unsigned int first = data_.n_inner_face_batches();
            AlignedVector<Number> local_diagonal(phi.dofs_per_cell);
            for (unsigned int f = 0; f < face_batch_active_.size(); ++f)
              {
                if (!face_batch_active_[f])
                  continue;
                phi.reinit(first + f);
                for (unsigned int i = 0; i < phi.dofs_per_cell; ++i)
                  {
                    for (unsigned int j = 0; j < phi.dofs_per_cell; ++j)
                      phi.begin_dof_values()[j] = Number(i == j ? 1.0 : 0.0);
                    phi.evaluate(EvaluationFlags::values);
                    for (unsigned int q = 0; q < n_face_q_; ++q)
                      phi.submit_value(w.face[static_cast<std::size_t>(f) * n_face_q_ + q] * phi.get_value(q), q);
                    phi.integrate(EvaluationFlags::values);
                    local_diagonal[i] = phi.begin_dof_values()[i];
                  }
                for (unsigned int i = 0; i < phi.dofs_per_cell; ++i)
                  phi.begin_dof_values()[i] = local_diagonal[i];
                phi.distribute_local_to_global(faces);
              }
            faces.compress(VectorOperation::add);
            diagonal += faces;
          }
        part_diagonals_[p].assign(diagonal.begin(), diagonal.begin() + diagonal.locally_owned_size());
        for (const unsigned int i : hanging_rows_)
          part_diagonals_[p][i] = 0;
      }
    current_ = nullptr;
  }

  template <int dim>
  void MatrixFreeStep<dim>::inverse_diagonal(const std::vector<double> &key, double *inverse) const
  {
    const std::size_t n = in_.locally_owned_size();
    for (std::size_t i = 0; i < n; ++i)
      {
        double d = 0;
        for (std::size_t p = 0; p < part_diagonals_.size() && p < key.size(); ++p)
          d += key[p] * part_diagonals_[p][i];
        inverse[i] = d != 0 ? 1.0 / d : 1.0;
      }
  }

  template <int dim>
  void MatrixFreeStep<dim>::inverse_diagonal(const std::vector<double> &key, Vector &out) const
  {
    inverse_diagonal(key, out.trilinos_vector()[0]);
  }

  template <int dim>
  void MatrixFreeStep<dim>::inverse_diagonal(const std::vector<double> &key, Distributed &out) const
  {
    if (out.locally_owned_size() != in_.locally_owned_size())
      initialize_dof_vector(out);
    inverse_diagonal(key, out.begin());
  }

  template <int dim>
  void MatrixFreeStep<dim>::set_weights(const std::vector<double> &key)
  {
    Assert(set_up_ && key.size() >= 2, ExcInternalError());
    key_ = key;
    inverse_diagonal(key, inverse_diagonal_);
  }

  template <int dim>
  void MatrixFreeStep<dim>::cell_product(const MatrixFree<dim, double> &data, Distributed &dst, const Distributed &src,
                                         const std::pair<unsigned int, unsigned int> &range) const
  {
    FEEvaluation<dim, -1, 0, 1, double> phi(data);
    for (unsigned int batch = range.first; batch < range.second; ++batch)
      {
        phi.reinit(batch);
        phi.gather_evaluate(src, EvaluationFlags::values | EvaluationFlags::gradients);
        const Number *value = &current_->value[static_cast<std::size_t>(batch) * n_q_];
        const Number *gradient = &current_->gradient[static_cast<std::size_t>(batch) * n_q_];
        for (unsigned int q = 0; q < n_q_; ++q)
          {
            phi.submit_value(value[q] * phi.get_value(q), q);
            phi.submit_gradient(gradient[q] * phi.get_gradient(q), q);
          }
        phi.integrate_scatter(EvaluationFlags::values | EvaluationFlags::gradients, dst);
      }
  }

  template <int dim>
  void MatrixFreeStep<dim>::face_product(const MatrixFree<dim, double> &, Distributed &, const Distributed &,
                                         const std::pair<unsigned int, unsigned int> &) const
  {
    // Interior faces carry no term (continuous elements).
  }

  template <int dim>
  void MatrixFreeStep<dim>::boundary_product(const MatrixFree<dim, double> &data, Distributed &dst,
                                             const Distributed &src,
                                             const std::pair<unsigned int, unsigned int> &range) const
  {
    FEFaceEvaluation<dim, -1, 0, 1, double> phi(data, true);
    const unsigned int first = data.n_inner_face_batches();
    for (unsigned int face = range.first; face < range.second; ++face)
      {
        const unsigned int f = face - first;
        if (!face_batch_active_[f])
          continue;
        phi.reinit(face);
        phi.gather_evaluate(src, EvaluationFlags::values);
        const Number *weight = &current_->face[static_cast<std::size_t>(f) * n_face_q_];
        for (unsigned int q = 0; q < n_face_q_; ++q)
          phi.submit_value(weight[q] * phi.get_value(q), q);
        phi.integrate_scatter(EvaluationFlags::values, dst);
      }
  }

  template <int dim>
  void MatrixFreeStep<dim>::product(const std::vector<double> &key, const double *from, double *to,
                                    const bool constrained) const
  {
    Assert(set_up_, ExcMessage("reinit() first"));
    current_ = &weights_of(key);
    const std::size_t n = in_.locally_owned_size();
    std::copy(from, from + n, in_.begin());
    if (constrained)
      for (const unsigned int i : held_)
        in_.local_element(i) = 0; // held columns removed (other ranks' held ghosts arrive as 0)
    if (with_faces_)
      data_.loop(&MatrixFreeStep::cell_product, &MatrixFreeStep::face_product, &MatrixFreeStep::boundary_product, this,
                 out_, in_, true);
    else
      data_.cell_loop(&MatrixFreeStep::cell_product, this, out_, in_, true);
    if (constrained)
      {
        // Held rows: their diagonal times the entry; hanging rows: the entry.
        for (const unsigned int i : held_)
          {
            double d = 0;
            for (std::size_t p = 0; p < part_diagonals_.size() && p < key.size(); ++p)
              d += key[p] * part_diagonals_[p][i];
            out_.local_element(i) = d * from[i];
          }
        for (const unsigned int i : hanging_rows_)
          out_.local_element(i) = from[i];
      }
    std::copy(out_.begin(), out_.begin() + n, to);
  }

  template <int dim>
  void MatrixFreeStep<dim>::apply(const std::vector<double> &key, const Vector &src, Vector &dst,
                                  const bool constrained) const
  {
    product(key, src.trilinos_vector()[0], dst.trilinos_vector()[0], constrained);
  }

  template <int dim>
  void MatrixFreeStep<dim>::apply(const std::vector<double> &key, const Distributed &src, Distributed &dst,
                                  const bool constrained) const
  {
    AssertDimension(src.locally_owned_size(), in_.locally_owned_size());
    AssertDimension(dst.locally_owned_size(), in_.locally_owned_size());
    product(key, src.begin(), dst.begin(), constrained);
  }

  template class MatrixFreeStep<1>;
  template class MatrixFreeStep<2>;
  template class MatrixFreeStep<3>;
} // namespace fickcast
