// DiffusionProblem: assembling the mass matrix, the parts of the operator, loads and weights.
#include "numerics/diffusion_problem.h"
#include "numerics/flow_terms.h"

#include <deal.II/base/quadrature_lib.h>
#include <deal.II/fe/fe_values.h>
#include <deal.II/lac/full_matrix.h>

namespace fickcast
{
  using namespace dealii;

  template <int dim>
  unsigned int DiffusionProblem<dim>::quadrature_points_per_axis() const
  {
    // Gauss with p + 1 points integrates the mass and stiffness integrands of cellwise-constant
    // coefficients on affine cells exactly; varying coefficients get one more.
    bool varying = false;
    for (const Material &material : materials_)
      varying = varying || !material.diffusivity_shape().uniform_in_space() ||
                material.diffusivity_shape().depends_on_concentration() ||
                material.source_function().depends_on_space();
    return fe_.degree + (varying ? 2 : 1);
  }

  template <int dim>
  void DiffusionProblem<dim>::assemble_constant_parts()
  {
    assemble_parts();
    PhaseTimer::Scope scope(timer_, "assembly");
    make_matrix_free();
  }

  template <int dim>
  void DiffusionProblem<dim>::assemble_parts()
  {
    PhaseTimer::Scope scope(timer_, "assembly");
    const bool matrices = matrices_sized_;
    const bool flow = has_flow();
    part_diagonals_.clear();
    const unsigned int n_regions = names_.regions.size();
    const unsigned int n_boundaries = names_.boundaries.size();
    // Fresh vectors (an assignment to the old ones would keep their last write mode).
    for (auto *list : {&region_mass_, &region_load_, &transfer_rowsum_, &boundary_load_, &advective_weights_})
      list->clear();
    if (flow)
      advective_weights_.resize(n_boundaries, make_vector());
    region_mass_.resize(n_regions, make_vector());
    region_load_.resize(n_regions, make_vector());
    transfer_rowsum_.resize(n_boundaries, make_vector());
    boundary_load_.resize(n_boundaries, make_vector());
    decay_weights_ = make_vector();
    if (matrices)
      {
        mass_.full = 0;
        mass_.constrained = 0;
        static_.full = 0;
        static_.constrained = 0;
        for (auto &pair : unit_)
          {
            pair.full = 0;
            pair.constrained = 0;
          }
      }

    const QGauss<dim> quadrature(quadrature_points_per_axis());
    const QGauss<dim - 1> face_quadrature(fe_.degree + 2);
    FEValues<dim> fe_values(mapping_, fe_, quadrature,
                            update_values | update_gradients | update_quadrature_points | update_JxW_values |
                              (flow && fe_.degree > 1 ? update_hessians : update_default));
    FEFaceValues<dim> fe_face_values(mapping_, fe_, face_quadrature,
                                     update_values | update_quadrature_points | update_JxW_values |
                                       update_normal_vectors);
    const unsigned int n = fe_.n_dofs_per_cell();
    FullMatrix<double> local_mass(n, n), local_static(n, n), local_unit(n, n);
    dealii::Vector<double> local_rowsum(n), local_load(n), local_decay(n);
    std::vector<types::global_dof_index> dofs(n);

    for (const auto &cell : dof_handler_.active_cell_iterators())
      {
        if (!cell->is_locally_owned())
          continue;
        fe_values.reinit(cell);
        cell->get_dof_indices(dofs);
        const auto region = cell->material_id();
        const Material &material = materials_[region];
        const double c = material.capacity();
        const double k = material.reaction();
        const int unit = unit_index_[region];
        const bool in_static = unit < 0 && !dynamic_[region];
        local_mass = 0;
        local_static = 0;
        local_unit = 0;
        local_load = 0;
        local_decay = 0;
        for (unsigned int q = 0; q < quadrature.size(); ++q)
          {
            const auto &point = fe_values.quadrature_point(q);
            const double w = coordinate_weight(point) * fe_values.JxW(q);
            // Static regions: D at t = 0 (constant or varying in space only); unit regions: D = 1.
            const double g = in_static ? conductance(region, point, 0.0) : 0.0;
            for (unsigned int i = 0; i < n; ++i)
              {
                const double phi_i = fe_values.shape_value(i, q);
                const auto &grad_i = fe_values.shape_grad(i, q);
                local_load(i) += phi_i * w;
                if (!matrices)
                  {
                    // The mass row sum: the shape functions sum to 1.
                    local_mass(i, i) += c * phi_i * w;
                    continue;
                  }
                for (unsigned int j = 0; j < n; ++j)
                  {
                    const double phi_j = fe_values.shape_value(j, q);
                    local_mass(i, j) += c * phi_i * phi_j * w;
                    local_static(i, j) += k * phi_i * phi_j * w;
                    const double stiffness = (grad_i * fe_values.shape_grad(j, q)) * w;
                    if (in_static)
                      local_static(i, j) += g * stiffness;
                    else if (unit >= 0)
                      local_unit(i, j) += material.conductance_factor() * stiffness;
                  }
              }
          }
        for (unsigned int i = 0; i < n; ++i)
          {
            local_rowsum(i) = 0;
            for (unsigned int j = 0; j < n; ++j)
              local_rowsum(i) += local_mass(i, j);
            local_decay(i) = c > 0 ? k / c * local_rowsum(i) : 0.0;
          }
        // Water flow: after the row sums, which stay those of the Galerkin mass (the amounts).
        const Tensor<1, dim> q_cell = darcy_flux_vector<dim>(material);
        if (material.has_flow())
          {
            AssertThrow(matrices, ExcMessage("internal: water flow needs the assembled operators"));
            add_flow_terms(cell, fe_values, local_mass, local_static, local_load);
          }

        for (const unsigned int f : cell->face_indices())
          {
            if (!cell->face(f)->at_boundary())
              continue;
            const unsigned int b = cell->face(f)->boundary_id();
            const BoundaryKind kind = boundaries_[b].kind();
            const bool outflow = kind == BoundaryKind::outflow;
            if (!boundaries_[b].has_load() && !outflow && !material.has_flow())
              continue;
            fe_face_values.reinit(cell, f);
            if (material.has_flow())
              {
                // What the water carries out through the face, per unit u at each node.
                dealii::Vector<double> carried(n);
                for (unsigned int q = 0; q < face_quadrature.size(); ++q)
                  for (unsigned int i = 0; i < n; ++i)
                    carried(i) += (q_cell * fe_face_values.normal_vector(q)) * material.partition() *
                                  fe_face_values.shape_value(i, q) *
                                  coordinate_weight(fe_face_values.quadrature_point(q)) * fe_face_values.JxW(q);
                hanging_.distribute_local_to_global(carried, dofs, advective_weights_[b]);
              }
            if (!boundaries_[b].has_load() && !outflow)
              continue;
            dealii::Vector<double> face_load(n);
            for (unsigned int q = 0; q < face_quadrature.size(); ++q)
              {
                const double w = coordinate_weight(fe_face_values.quadrature_point(q)) * fe_face_values.JxW(q);
                // Transfer: h K; a given flux: 1; entering water: -q.n; leaving water: q.n K.
                const double qn = q_cell * fe_face_values.normal_vector(q);
                const double h = kind == BoundaryKind::inflow ? -qn
                                 : outflow                    ? qn * material.partition()
                                                              : boundaries_[b].load_factor(material.partition());
                for (unsigned int i = 0; i < n; ++i)
                  {
                    face_load(i) += h * fe_face_values.shape_value(i, q) * w;
                    if ((kind == BoundaryKind::transfer || outflow) && matrices)
                      for (unsigned int j = 0; j < n; ++j)
                        local_static(i, j) +=
                          h * fe_face_values.shape_value(i, q) * fe_face_values.shape_value(j, q) * w;
                  }
              }
            if (!outflow)
              hanging_.distribute_local_to_global(face_load, dofs, boundary_load_[b]);
            if (kind == BoundaryKind::transfer)
              hanging_.distribute_local_to_global(face_load, dofs, transfer_rowsum_[b]); // boundary mass row sums
          }

        if (!matrices)
          {
            hanging_.distribute_local_to_global(local_rowsum, dofs, region_mass_[region]);
            hanging_.distribute_local_to_global(local_load, dofs, region_load_[region]);
            hanging_.distribute_local_to_global(local_decay, dofs, decay_weights_);
            continue;
          }
        hanging_.distribute_local_to_global(local_mass, dofs, mass_.full);
        constraints_.distribute_local_to_global(local_mass, dofs, mass_.constrained);
        hanging_.distribute_local_to_global(local_static, dofs, static_.full);
        constraints_.distribute_local_to_global(local_static, dofs, static_.constrained);
        if (unit >= 0)
          {
            hanging_.distribute_local_to_global(local_unit, dofs, unit_[static_cast<std::size_t>(unit)].full);
            constraints_.distribute_local_to_global(local_unit, dofs,
                                                    unit_[static_cast<std::size_t>(unit)].constrained);
          }
        hanging_.distribute_local_to_global(local_rowsum, dofs, region_mass_[region]);
        hanging_.distribute_local_to_global(local_load, dofs, region_load_[region]);
        hanging_.distribute_local_to_global(local_decay, dofs, decay_weights_);
      }
    if (matrices)
      {
        for (MatrixPair *pair : {&mass_, &static_})
          {
            pair->full.compress(VectorOperation::add);
            pair->constrained.compress(VectorOperation::add);
          }
        for (auto &pair : unit_)
          {
            pair.full.compress(VectorOperation::add);
            pair.constrained.compress(VectorOperation::add);
          }
      }
    matrices_ready_ = matrices;
    for (auto *list : {&region_mass_, &region_load_, &transfer_rowsum_, &boundary_load_, &advective_weights_})
      for (auto &v : *list)
        v.compress(VectorOperation::add);
    decay_weights_.compress(VectorOperation::add);
    boundary_load_total_.clear();
    for (const auto &v : boundary_load_)
      boundary_load_total_.push_back(v.mean_value() * static_cast<double>(v.size()));
    region_load_total_.clear();
    for (const auto &v : region_load_)
      region_load_total_.push_back(v.mean_value() * static_cast<double>(v.size()));
    check_coefficients();
  }

  template <int dim>
  void DiffusionProblem<dim>::assemble_dynamic(const double t, const Vector *u_ghosted, const bool with_jacobian)
  {
    PhaseTimer::Scope scope(timer_, "assembly");
    dynamic_matrices_.full = 0;
    dynamic_matrices_.constrained = 0;
    const QGauss<dim> quadrature(quadrature_points_per_axis());
    FEValues<dim> fe_values(mapping_, fe_, quadrature,
                            update_values | update_gradients | update_quadrature_points | update_JxW_values);
    const unsigned int n = fe_.n_dofs_per_cell();
    FullMatrix<double> local(n, n);
    std::vector<types::global_dof_index> dofs(n);
    std::vector<double> u_values(quadrature.size());
    std::vector<Tensor<1, dim>> u_gradients(quadrature.size());
    for (const auto &cell : dof_handler_.active_cell_iterators())
      {
        if (!cell->is_locally_owned() || !dynamic_[cell->material_id()])
          continue;
        fe_values.reinit(cell);
        cell->get_dof_indices(dofs);
        const auto region = cell->material_id();
        const Material &material = materials_[region];
        const bool nonlinear = material.diffusivity_shape().depends_on_concentration();
        if (nonlinear)
          {
            Assert(u_ghosted != nullptr, ExcMessage("a concentration-dependent operator needs a state"));
            fe_values.get_function_values(*u_ghosted, u_values);
            fe_values.get_function_gradients(*u_ghosted, u_gradients);
          }
        local = 0;
        for (unsigned int q = 0; q < quadrature.size(); ++q)
          {
            const auto &p = fe_values.quadrature_point(q);
            const double w = coordinate_weight(p) * fe_values.JxW(q);
            const double c = nonlinear ? material.partition() * u_values[q] : 0.0;
            const double g = conductance(region, p, t, c);
            // d G / d u = theta tau K dD/dc K (Newton's extra term).
            const double dg = with_jacobian && nonlinear ? material.conductance_derivative(p[0], dim > 1 ? p[1] : 0.0,
                                                                                           dim > 2 ? p[2] : 0.0, t, c)
                                                         : 0.0;
            for (unsigned int i = 0; i < n; ++i)
              {
                const auto &grad_i = fe_values.shape_grad(i, q);
                const double grad_u_dot_i = dg != 0 ? u_gradients[q] * grad_i : 0.0;
                for (unsigned int j = 0; j < n; ++j)
                  local(i, j) +=
                    (g * (grad_i * fe_values.shape_grad(j, q)) + dg * fe_values.shape_value(j, q) * grad_u_dot_i) * w;
              }
          }
        hanging_.distribute_local_to_global(local, dofs, dynamic_matrices_.full);
        constraints_.distribute_local_to_global(local, dofs, dynamic_matrices_.constrained);
      }
    dynamic_matrices_.full.compress(VectorOperation::add);
    dynamic_matrices_.constrained.compress(VectorOperation::add);
    check_coefficients();
    dynamic_time_ = t;
    dynamic_valid_ = true;
    dynamic_is_jacobian_ = with_jacobian;
    ++dynamic_version_;
  }

  template <int dim>
  void DiffusionProblem<dim>::apply_dynamic(const double t, const Vector &u_ghosted, Vector &out) const
  {
    // out += int G(x, t, c(u)) grad u . grad phi_i over the dynamic regions (no matrix).
    const QGauss<dim> quadrature(quadrature_points_per_axis());
    FEValues<dim> fe_values(mapping_, fe_, quadrature,
                            update_values | update_gradients | update_quadrature_points | update_JxW_values);
    const unsigned int n = fe_.n_dofs_per_cell();
    dealii::Vector<double> local(n);
    std::vector<types::global_dof_index> dofs(n);
    std::vector<double> u_values(quadrature.size());
    std::vector<Tensor<1, dim>> u_gradients(quadrature.size());
    Vector contribution = make_vector();
    for (const auto &cell : dof_handler_.active_cell_iterators())
      {
        if (!cell->is_locally_owned() || !dynamic_[cell->material_id()])
          continue;
        fe_values.reinit(cell);
        cell->get_dof_indices(dofs);
        const auto region = cell->material_id();
        const double partition = materials_[region].partition();
        fe_values.get_function_values(u_ghosted, u_values);
        fe_values.get_function_gradients(u_ghosted, u_gradients);
        local = 0;
        for (unsigned int q = 0; q < quadrature.size(); ++q)
          {
            const auto &p = fe_values.quadrature_point(q);
            const double g = conductance(region, p, t, partition * u_values[q]);
            const double w = coordinate_weight(p) * fe_values.JxW(q);
            for (unsigned int i = 0; i < n; ++i)
              local(i) += g * (u_gradients[q] * fe_values.shape_grad(i, q)) * w;
          }
        hanging_.distribute_local_to_global(local, dofs, contribution);
      }
    contribution.compress(VectorOperation::add);
    out += contribution;
  }

  template <int dim>
  void DiffusionProblem<dim>::apply_operator(const double t, const Vector &u, Vector &out) const
  {
    if (products_without_matrix())
      {
        product_without_matrix(operator_key(0, 1, t), u, out, false);
        return;
      }
    static_.full.vmult(out, u);
    if (!unit_.empty())
      {
        Vector tmp = make_vector();
        for (unsigned int r = 0; r < unit_index_.size(); ++r)
          if (unit_index_[r] >= 0)
            {
              unit_[static_cast<std::size_t>(unit_index_[r])].full.vmult(tmp, u);
              out.add(materials_[r].diffusivity(0, 0, 0, t, 0), tmp);
            }
      }
    if (dynamic_matrices_.full.m() == 0)
      return;
    if (!nonlinear_ && dynamic_valid_ && !dynamic_is_jacobian_ && dynamic_time_ == t)
      {
        Vector tmp = make_vector();
        dynamic_matrices_.full.vmult(tmp, u);
        out += tmp;
        return;
      }
    apply_dynamic(t, make_ghosted(u), out);
  }

  template <int dim>
  void DiffusionProblem<dim>::forcing(const double t, Vector &f) const
  {
    sources(t, f);
    for (unsigned int b = 0; b < boundaries_.size(); ++b)
      if (boundaries_[b].has_load())
        boundary_forcing(b, t, &f);
  }

  template <int dim>
  double DiffusionProblem<dim>::boundary_forcing(const unsigned int b, const double t, Vector *f) const
  {
    const ScalarFunction &given = boundaries_[b].driving_function();
    if (!given.depends_on_space())
      {
        const double value = boundaries_[b].driving_at_time(t);
        if (f != nullptr && value != 0)
          f->add(value, boundary_load_[b]);
        return value * boundary_load_total_[b];
      }
    // Spatially varying: integrate value(x, t) phi_i over the boundary (times h K for transfer).
    Vector load = make_vector();
    const QGauss<dim - 1> face_quadrature(fe_.degree + 2);
    FEFaceValues<dim> fe_face_values(mapping_, fe_, face_quadrature,
                                     update_values | update_quadrature_points | update_JxW_values |
                                       update_normal_vectors);
    const unsigned int n = fe_.n_dofs_per_cell();
    dealii::Vector<double> local(n);
    std::vector<types::global_dof_index> dofs(n);
    const bool inflow = boundaries_[b].kind() == BoundaryKind::inflow;
    for (const auto &cell : dof_handler_.active_cell_iterators())
      {
        if (!cell->is_locally_owned())
          continue;
        for (const unsigned int face : cell->face_indices())
          {
            if (!cell->face(face)->at_boundary() || cell->face(face)->boundary_id() != b)
              continue;
            fe_face_values.reinit(cell, face);
            cell->get_dof_indices(dofs);
            const double factor = boundaries_[b].load_factor(partition(cell->material_id()));
            const Tensor<1, dim> q_cell = darcy_flux_vector<dim>(materials_[cell->material_id()]);
            local = 0;
            for (unsigned int q = 0; q < face_quadrature.size(); ++q)
              {
                const auto &p = fe_face_values.quadrature_point(q);
                const double value = boundaries_[b].driving_value(p[0], dim > 1 ? p[1] : 0.0, dim > 2 ? p[2] : 0.0, t);
                const double w = coordinate_weight(p) * fe_face_values.JxW(q);
                const double weight = inflow ? -(q_cell * fe_face_values.normal_vector(q)) : factor;
                for (unsigned int i = 0; i < n; ++i)
                  local(i) += weight * value * fe_face_values.shape_value(i, q) * w;
              }
            hanging_.distribute_local_to_global(local, dofs, load);
          }
      }
    load.compress(VectorOperation::add);
    if (f != nullptr)
      *f += load;
    return load.mean_value() * static_cast<double>(load.size());
  }

  template <int dim>
  void DiffusionProblem<dim>::sources(const double t, Vector &f) const
  {
    f = 0;
    if (!source_depends_on_space_)
      {
        for (unsigned int r = 0; r < materials_.size(); ++r)
          if (const double s = materials_[r].source(0, 0, 0, t); s != 0)
            f.add(s, region_load_[r]);
        return;
      }
    const QGauss<dim> quadrature(fe_.degree + 2);
    FEValues<dim> fe_values(mapping_, fe_, quadrature, update_values | update_quadrature_points | update_JxW_values);
    const unsigned int n = fe_.n_dofs_per_cell();
    dealii::Vector<double> local(n);
    std::vector<types::global_dof_index> dofs(n);
    for (const auto &cell : dof_handler_.active_cell_iterators())
      {
        if (!cell->is_locally_owned())
          continue;
        fe_values.reinit(cell);
        cell->get_dof_indices(dofs);
        const Material &material = materials_[cell->material_id()];
        local = 0;
        for (unsigned int q = 0; q < quadrature.size(); ++q)
          {
            const auto &p = fe_values.quadrature_point(q);
            const double s = material.source(p[0], dim > 1 ? p[1] : 0.0, dim > 2 ? p[2] : 0.0, t);
            const double w = coordinate_weight(p) * fe_values.JxW(q);
            for (unsigned int i = 0; i < n; ++i)
              local(i) += s * fe_values.shape_value(i, q) * w;
          }
        hanging_.distribute_local_to_global(local, dofs, f);
      }
    f.compress(VectorOperation::add);
  }

  template unsigned int DiffusionProblem<1>::quadrature_points_per_axis() const;
  template void DiffusionProblem<1>::assemble_constant_parts();
  template void DiffusionProblem<1>::assemble_parts();
  template void DiffusionProblem<1>::assemble_dynamic(double, const DiffusionProblem<1>::Vector *, bool);
  template void DiffusionProblem<1>::apply_dynamic(double, const DiffusionProblem<1>::Vector &,
                                                   DiffusionProblem<1>::Vector &) const;
  template void DiffusionProblem<1>::apply_operator(double, const DiffusionProblem<1>::Vector &,
                                                    DiffusionProblem<1>::Vector &) const;
  template void DiffusionProblem<1>::forcing(double, DiffusionProblem<1>::Vector &) const;
  template double DiffusionProblem<1>::boundary_forcing(unsigned int, double, DiffusionProblem<1>::Vector *) const;
  template void DiffusionProblem<1>::sources(double, DiffusionProblem<1>::Vector &) const;
  template unsigned int DiffusionProblem<2>::quadrature_points_per_axis() const;
  template void DiffusionProblem<2>::assemble_constant_parts();
  template void DiffusionProblem<2>::assemble_parts();
  template void DiffusionProblem<2>::assemble_dynamic(double, const DiffusionProblem<2>::Vector *, bool);
  template void DiffusionProblem<2>::apply_dynamic(double, const DiffusionProblem<2>::Vector &,
                                                   DiffusionProblem<2>::Vector &) const;
  template void DiffusionProblem<2>::apply_operator(double, const DiffusionProblem<2>::Vector &,
                                                    DiffusionProblem<2>::Vector &) const;
  template void DiffusionProblem<2>::forcing(double, DiffusionProblem<2>::Vector &) const;
  template double DiffusionProblem<2>::boundary_forcing(unsigned int, double, DiffusionProblem<2>::Vector *) const;
  template void DiffusionProblem<2>::sources(double, DiffusionProblem<2>::Vector &) const;
  template unsigned int DiffusionProblem<3>::quadrature_points_per_axis() const;
  template void DiffusionProblem<3>::assemble_constant_parts();
  template void DiffusionProblem<3>::assemble_parts();
  template void DiffusionProblem<3>::assemble_dynamic(double, const DiffusionProblem<3>::Vector *, bool);
  template void DiffusionProblem<3>::apply_dynamic(double, const DiffusionProblem<3>::Vector &,
                                                   DiffusionProblem<3>::Vector &) const;
  template void DiffusionProblem<3>::apply_operator(double, const DiffusionProblem<3>::Vector &,
                                                    DiffusionProblem<3>::Vector &) const;
  template void DiffusionProblem<3>::forcing(double, DiffusionProblem<3>::Vector &) const;
  template double DiffusionProblem<3>::boundary_forcing(unsigned int, double, DiffusionProblem<3>::Vector *) const;
  template void DiffusionProblem<3>::sources(double, DiffusionProblem<3>::Vector &) const;
} // namespace fickcast
