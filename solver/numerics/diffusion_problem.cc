#include "numerics/diffusion_problem.h"

#include "case/input_error.h"

#include <deal.II/base/quadrature_lib.h>
#include <deal.II/base/utilities.h>
#include <deal.II/distributed/tria.h>
#include <deal.II/dofs/dof_tools.h>
#include <deal.II/fe/fe_values.h>
#include <deal.II/lac/dynamic_sparsity_pattern.h>
#include <deal.II/lac/sparsity_tools.h>
#include <deal.II/numerics/vector_tools.h>

#include <algorithm>
#include <cmath>
#include <map>

namespace fickcast
{
  using namespace dealii;

  namespace
  {
    std::string describe_point(const double x, const double y, const double z, const int dim)
    {
      char buffer[128];
      if (dim == 1)
        std::snprintf(buffer, sizeof(buffer), "x = %.6g m", x);
      else if (dim == 2)
        std::snprintf(buffer, sizeof(buffer), "(x, y) = (%.6g, %.6g) m", x, y);
      else
        std::snprintf(buffer, sizeof(buffer), "(x, y, z) = (%.6g, %.6g, %.6g) m", x, y, z);
      return buffer;
    }
  } // namespace

  template <int dim>
  DiffusionProblem<dim>::DiffusionProblem(const CaseDescription &description, MPI_Comm communicator)
    : description_(description)
    , communicator_(communicator)
    , fe_(description.numerics.degree)
    , mapping_(1)
  {
  }

  template <int dim>
  DiffusionProblem<dim>::~DiffusionProblem()
  {
    dof_handler_.clear();
  }

  template <int dim>
  unsigned long DiffusionProblem<dim>::n_cells() const
  {
    return triangulation_->n_global_active_cells();
  }

  template <int dim>
  bool DiffusionProblem<dim>::uses_direct_solver() const
  {
    return solver_ && solver_->is_direct();
  }

  template <int dim>
  void DiffusionProblem<dim>::make_mesh()
  {
    if constexpr (dim == 1)
      triangulation_ = std::make_unique<Triangulation<dim>>();
    else
      triangulation_ = std::make_unique<parallel::distributed::Triangulation<dim>>(communicator_);
    build_layered_mesh<dim>(*triangulation_, description_.geometry);
    names_ = layered_mesh_names(description_.geometry, dim);
  }

  template <int dim>
  void DiffusionProblem<dim>::setup()
  {
    PhaseTimer::Scope scope(timer_, "setup");
    make_mesh();

    // Model coefficients by material id and boundary id.
    for (const auto &name : names_.regions)
      {
        const RegionSpec *region = description_.find_region(name);
        AssertThrow(region != nullptr, ExcMessage("region without description: " + name));
        diffusivity_.emplace_back(region->diffusivity);
        source_.emplace_back(region->source);
        operator_depends_on_time_ = operator_depends_on_time_ || diffusivity_.back().depends_on_time();
        source_depends_on_space_ = source_depends_on_space_ || source_.back().depends_on_space();
      }
    for (const auto &name : names_.boundaries)
      {
        const BoundarySpec *boundary = description_.find_boundary(name);
        static const BoundarySpec sealed;
        boundary_specs_.push_back(boundary ? boundary : &sealed);
        boundary_kinds_.push_back(boundary_specs_.back()->kind);
        boundary_value_.emplace_back(boundary_specs_.back()->value);
        boundary_ambient_.emplace_back(boundary_specs_.back()->ambient);
      }
    boundary_partition_.assign(names_.boundaries.size(), 1.0);
    {
      std::vector<double> found(names_.boundaries.size(), -1.0);
      for (const auto &cell : triangulation_->active_cell_iterators())
        if (cell->is_locally_owned())
          for (const unsigned int f : cell->face_indices())
            if (cell->face(f)->at_boundary())
              found[cell->face(f)->boundary_id()] = partition(cell->material_id());
      for (std::size_t b = 0; b < found.size(); ++b)
        {
          // Any rank that sees the boundary reports K; the builder made sure it is unique
          // wherever a value is given inside the material.
          boundary_partition_[b] = Utilities::MPI::max(found[b], communicator_);
          if (boundary_partition_[b] < 0)
            boundary_partition_[b] = 1.0;
        }
    }

    setup_dofs();
    assemble_constant_parts();

    const bool serial = Utilities::MPI::n_mpi_processes(communicator_) == 1;
    bool direct = false;
    switch (description_.numerics.linear_solver)
      {
        case LinearSolverKind::direct:
          direct = true;
          break;
        case LinearSolverKind::iterative:
          direct = false;
          break;
        case LinearSolverKind::automatic:
          direct = serial && (dim == 1 || (dim == 2 && n_dofs() <= 60000) || (dim == 3 && n_dofs() <= 15000));
          break;
      }
    solver_ = std::make_unique<LinearSolver>(direct, description_.numerics.solver_tolerance, fe_.degree > 1);
  }

  template <int dim>
  void DiffusionProblem<dim>::setup_dofs()
  {
    dof_handler_.reinit(*triangulation_);
    dof_handler_.distribute_dofs(fe_);
    owned_ = dof_handler_.locally_owned_dofs();
    DoFTools::extract_locally_relevant_dofs(dof_handler_, relevant_);

    // Fixed unknowns: concentration boundaries, the first boundary (by id) wins at corners.
    constraints_.clear();
    constraints_.reinit(relevant_);
    fixed_dofs_.clear();
    std::map<types::global_dof_index, unsigned int> owner_boundary;
    for (unsigned int b = 0; b < boundary_kinds_.size(); ++b)
      {
        if (boundary_kinds_[b] != BoundaryKind::concentration)
          continue;
        std::map<types::global_dof_index, double> values;
        VectorTools::interpolate_boundary_values(mapping_, dof_handler_, static_cast<types::boundary_id>(b),
                                                 Functions::ZeroFunction<dim>(), values);
        for (const auto &[dof, value] : values)
          {
            (void)value;
            if (owner_boundary.count(dof) == 0)
              owner_boundary[dof] = b;
          }
      }
    std::map<types::global_dof_index, Point<dim>> support_points;
    if (!owner_boundary.empty())
      DoFTools::map_dofs_to_support_points(mapping_, dof_handler_, support_points);
    fixed_points_.clear();
    for (const auto &[dof, b] : owner_boundary)
      {
        if (relevant_.is_element(dof))
          constraints_.add_line(dof);
        if (owned_.is_element(dof))
          {
            fixed_dofs_.emplace_back(dof, b);
            fixed_points_.push_back(support_points.at(dof));
          }
      }
    constraints_.close();

    DynamicSparsityPattern pattern(relevant_);
    DoFTools::make_sparsity_pattern(dof_handler_, pattern);
    SparsityTools::distribute_sparsity_pattern(pattern, owned_, communicator_, relevant_);
    mass_.reinit(owned_, owned_, pattern, communicator_);
    mass_constrained_.reinit(owned_, owned_, pattern, communicator_);
    system_.reinit(owned_, owned_, pattern, communicator_);
    // The trial operator (at the end of a step) exists only when the operator changes in time.
    for (Operator *op : {&current_, &trial_})
      {
        if (op == &trial_ && !operator_depends_on_time_)
          continue;
        op->full.reinit(owned_, owned_, pattern, communicator_);
        op->constrained.reinit(owned_, owned_, pattern, communicator_);
        op->time = -1;
      }
  }

  template <int dim>
  double DiffusionProblem<dim>::partition(const types::material_id region) const
  {
    return description_.find_region(names_.regions[region])->partition;
  }

  template <int dim>
  double DiffusionProblem<dim>::capacity(const types::material_id region) const
  {
    return description_.find_region(names_.regions[region])->capacity();
  }

  template <int dim>
  double DiffusionProblem<dim>::effective_diffusivity(const types::material_id region, const Point<dim> &point,
                                                      const double t) const
  {
    const RegionSpec &spec = *description_.find_region(names_.regions[region]);
    const double x = point[0], y = dim > 1 ? point[1] : 0.0, z = dim > 2 ? point[2] : 0.0;
    const double d = diffusivity_[region](x, y, z, t);
    if ((!(d > 0) || !std::isfinite(d)) && bad_coefficient_.empty())
      bad_coefficient_ = "region." + spec.name + ".diffusivity: expected a diffusivity > 0 everywhere, found " +
                         std::to_string(d) + " m2/s at " + describe_point(x, y, z, dim) + ", t = " + std::to_string(t) +
                         " s";
    return spec.tortuosity * d;
  }

  template <int dim>
  void DiffusionProblem<dim>::check_coefficients() const
  {
    const unsigned int rank = Utilities::MPI::this_mpi_process(communicator_);
    const unsigned int n_ranks = Utilities::MPI::n_mpi_processes(communicator_);
    const unsigned int reporter = Utilities::MPI::min(bad_coefficient_.empty() ? n_ranks : rank, communicator_);
    if (reporter == n_ranks)
      return;
    const std::string message = Utilities::MPI::broadcast(communicator_, bad_coefficient_, reporter);
    const auto colon = message.find(": ");
    throw InputError(description_.file, message.substr(0, colon), message.substr(colon + 2));
  }

  template <int dim>
  double DiffusionProblem<dim>::conductance(const types::material_id region, const Point<dim> &point,
                                            const double t) const
  {
    const RegionSpec &spec = *description_.find_region(names_.regions[region]);
    return spec.porosity * spec.partition * effective_diffusivity(region, point, t);
  }

  template <int dim>
  double DiffusionProblem<dim>::coordinate_weight(const Point<dim> &) const
  {
    return 1.0;
  }

  template <int dim>
  unsigned int DiffusionProblem<dim>::quadrature_points_per_axis() const
  {
    // Gauss with p + 1 points integrates the mass and stiffness integrands of cellwise-constant
    // coefficients on affine cells exactly; expressions get one more.
    bool varying = false;
    for (const auto &d : diffusivity_)
      varying = varying || !d.is_constant();
    for (const auto &s : source_)
      varying = varying || !s.is_constant();
    return fe_.degree + (varying ? 2 : 1);
  }

  template <int dim>
  void DiffusionProblem<dim>::assemble_constant_parts()
  {
    const unsigned int n_regions = names_.regions.size();
    const unsigned int n_boundaries = names_.boundaries.size();
    region_mass_.assign(n_regions, make_vector());
    region_load_.assign(n_regions, make_vector());
    transfer_rowsum_.assign(n_boundaries, make_vector());
    boundary_load_.assign(n_boundaries, make_vector());
    decay_weights_ = make_vector();
    mass_ = 0;
    mass_constrained_ = 0;

    const QGauss<dim> quadrature(quadrature_points_per_axis());
    const QGauss<dim - 1> face_quadrature(fe_.degree + 2);
    FEValues<dim> fe_values(mapping_, fe_, quadrature, update_values | update_quadrature_points | update_JxW_values);
    FEFaceValues<dim> fe_face_values(mapping_, fe_, face_quadrature,
                                     update_values | update_quadrature_points | update_JxW_values);
    const unsigned int n = fe_.n_dofs_per_cell();
    FullMatrix<double> local_mass(n, n);
    dealii::Vector<double> local_rowsum(n), local_load(n), local_decay(n);
    std::vector<types::global_dof_index> dofs(n);

    for (const auto &cell : dof_handler_.active_cell_iterators())
      {
        if (!cell->is_locally_owned())
          continue;
        fe_values.reinit(cell);
        cell->get_dof_indices(dofs);
        const auto region = cell->material_id();
        const RegionSpec &spec = *description_.find_region(names_.regions[region]);
        const double c = spec.capacity();
        local_mass = 0;
        local_load = 0;
        for (unsigned int q = 0; q < quadrature.size(); ++q)
          {
            const double w = coordinate_weight(fe_values.quadrature_point(q)) * fe_values.JxW(q);
            for (unsigned int i = 0; i < n; ++i)
              {
                const double phi_i = fe_values.shape_value(i, q);
                local_load(i) += phi_i * w;
                for (unsigned int j = 0; j < n; ++j)
                  local_mass(i, j) += c * phi_i * fe_values.shape_value(j, q) * w;
              }
          }
        for (unsigned int i = 0; i < n; ++i)
          {
            local_rowsum(i) = 0;
            for (unsigned int j = 0; j < n; ++j)
              local_rowsum(i) += local_mass(i, j);
            local_decay(i) = spec.decay_rate * local_rowsum(i);
          }
        mass_.add(dofs, local_mass);
        constraints_.distribute_local_to_global(local_mass, dofs, mass_constrained_);
        region_mass_[region].add(dofs, local_rowsum);
        region_load_[region].add(dofs, local_load);
        decay_weights_.add(dofs, local_decay);

        for (const unsigned int f : cell->face_indices())
          {
            if (!cell->face(f)->at_boundary())
              continue;
            const unsigned int b = cell->face(f)->boundary_id();
            if (boundary_kinds_[b] != BoundaryKind::flux && boundary_kinds_[b] != BoundaryKind::transfer)
              continue;
            fe_face_values.reinit(cell, f);
            const double factor =
              boundary_kinds_[b] == BoundaryKind::transfer ? boundary_specs_[b]->coefficient * spec.partition : 1.0;
            local_load = 0;
            for (unsigned int q = 0; q < face_quadrature.size(); ++q)
              {
                const double w = coordinate_weight(fe_face_values.quadrature_point(q)) * fe_face_values.JxW(q);
                for (unsigned int i = 0; i < n; ++i)
                  local_load(i) += factor * fe_face_values.shape_value(i, q) * w;
              }
            boundary_load_[b].add(dofs, local_load);
            // For transfer boundaries the boundary mass matrix B_b has row sums equal to the load.
            if (boundary_kinds_[b] == BoundaryKind::transfer)
              transfer_rowsum_[b].add(dofs, local_load);
          }
      }
    mass_.compress(VectorOperation::add);
    mass_constrained_.compress(VectorOperation::add);
    for (auto &v : region_mass_)
      v.compress(VectorOperation::add);
    for (auto &v : region_load_)
      v.compress(VectorOperation::add);
    for (auto &v : transfer_rowsum_)
      v.compress(VectorOperation::add);
    for (auto &v : boundary_load_)
      v.compress(VectorOperation::add);
    decay_weights_.compress(VectorOperation::add);
    for (const auto &v : boundary_load_)
      boundary_load_total_.push_back(v.mean_value() * static_cast<double>(v.size()));
    for (const auto &v : region_load_)
      region_load_total_.push_back(v.mean_value() * static_cast<double>(v.size()));

    assemble_operator(0.0, current_);
  }

  template <int dim>
  void DiffusionProblem<dim>::assemble_operator(const double t, Operator &op)
  {
    PhaseTimer::Scope scope(timer_, "assembly");
    op.full = 0;
    op.constrained = 0;
    const QGauss<dim> quadrature(quadrature_points_per_axis());
    const QGauss<dim - 1> face_quadrature(fe_.degree + 2);
    FEValues<dim> fe_values(mapping_, fe_, quadrature,
                            update_values | update_gradients | update_quadrature_points | update_JxW_values);
    FEFaceValues<dim> fe_face_values(mapping_, fe_, face_quadrature,
                                     update_values | update_quadrature_points | update_JxW_values);
    const unsigned int n = fe_.n_dofs_per_cell();
    FullMatrix<double> local(n, n);
    std::vector<types::global_dof_index> dofs(n);
    for (const auto &cell : dof_handler_.active_cell_iterators())
      {
        if (!cell->is_locally_owned())
          continue;
        fe_values.reinit(cell);
        cell->get_dof_indices(dofs);
        const auto region = cell->material_id();
        const RegionSpec &spec = *description_.find_region(names_.regions[region]);
        const double reaction = spec.decay_rate * spec.capacity();
        local = 0;
        for (unsigned int q = 0; q < quadrature.size(); ++q)
          {
            const auto &point = fe_values.quadrature_point(q);
            const double w = coordinate_weight(point) * fe_values.JxW(q);
            const double g = conductance(region, point, t);
            for (unsigned int i = 0; i < n; ++i)
              {
                const auto grad_i = fe_values.shape_grad(i, q);
                const double phi_i = fe_values.shape_value(i, q);
                for (unsigned int j = 0; j < n; ++j)
                  local(i, j) +=
                    (g * (grad_i * fe_values.shape_grad(j, q)) + reaction * phi_i * fe_values.shape_value(j, q)) * w;
              }
          }
        for (const unsigned int f : cell->face_indices())
          {
            if (!cell->face(f)->at_boundary())
              continue;
            const unsigned int b = cell->face(f)->boundary_id();
            if (boundary_kinds_[b] != BoundaryKind::transfer)
              continue;
            fe_face_values.reinit(cell, f);
            const double h = boundary_specs_[b]->coefficient * spec.partition;
            for (unsigned int q = 0; q < face_quadrature.size(); ++q)
              {
                const double w = coordinate_weight(fe_face_values.quadrature_point(q)) * fe_face_values.JxW(q);
                for (unsigned int i = 0; i < n; ++i)
                  for (unsigned int j = 0; j < n; ++j)
                    local(i, j) += h * fe_face_values.shape_value(i, q) * fe_face_values.shape_value(j, q) * w;
              }
          }
        op.full.add(dofs, local);
        constraints_.distribute_local_to_global(local, dofs, op.constrained);
      }
    op.full.compress(VectorOperation::add);
    op.constrained.compress(VectorOperation::add);
    check_coefficients();
    op.time = t;
    op.version = ++operator_versions_;
  }

  template <int dim>
  const typename DiffusionProblem<dim>::Operator &DiffusionProblem<dim>::operator_at(const double t, const bool trial)
  {
    if (!operator_depends_on_time_)
      return current_;
    if (!trial)
      {
        if (current_.time != t)
          assemble_operator(t, current_);
        return current_;
      }
    if (trial_.time != t)
      assemble_operator(t, trial_);
    return trial_;
  }

  template <int dim>
  void DiffusionProblem<dim>::forcing(const double t, Vector &f) const
  {
    sources(t, f);
    for (unsigned int b = 0; b < boundary_kinds_.size(); ++b)
      if (boundary_kinds_[b] == BoundaryKind::flux || boundary_kinds_[b] == BoundaryKind::transfer)
        boundary_forcing(b, t, &f);
  }

  template <int dim>
  double DiffusionProblem<dim>::boundary_forcing(const unsigned int b, const double t, Vector *f) const
  {
    const ScalarFunction &given = boundary_kinds_[b] == BoundaryKind::flux ? boundary_value_[b] : boundary_ambient_[b];
    if (!given.depends_on_space())
      {
        const double value = given.at_time(t);
        if (f != nullptr && value != 0)
          f->add(value, boundary_load_[b]);
        return value * boundary_load_total_[b];
      }
    // Spatially varying: integrate value(x, t) phi_i over the boundary (times h K for transfer).
    Vector load = make_vector();
    const QGauss<dim - 1> face_quadrature(fe_.degree + 2);
    FEFaceValues<dim> fe_face_values(mapping_, fe_, face_quadrature,
                                     update_values | update_quadrature_points | update_JxW_values);
    const unsigned int n = fe_.n_dofs_per_cell();
    dealii::Vector<double> local(n);
    std::vector<types::global_dof_index> dofs(n);
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
            const double factor = boundary_kinds_[b] == BoundaryKind::transfer
                                    ? boundary_specs_[b]->coefficient * partition(cell->material_id())
                                    : 1.0;
            local = 0;
            for (unsigned int q = 0; q < face_quadrature.size(); ++q)
              {
                const auto &p = fe_face_values.quadrature_point(q);
                const double value = given(p[0], dim > 1 ? p[1] : 0.0, dim > 2 ? p[2] : 0.0, t);
                const double w = coordinate_weight(p) * fe_face_values.JxW(q);
                for (unsigned int i = 0; i < n; ++i)
                  local(i) += factor * value * fe_face_values.shape_value(i, q) * w;
              }
            load.add(dofs, local);
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
        for (unsigned int r = 0; r < source_.size(); ++r)
          if (const double s = source_[r](0, 0, 0, t); s != 0)
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
        const auto &source = source_[cell->material_id()];
        local = 0;
        for (unsigned int q = 0; q < quadrature.size(); ++q)
          {
            const auto &p = fe_values.quadrature_point(q);
            const double s = source(p[0], dim > 1 ? p[1] : 0.0, dim > 2 ? p[2] : 0.0, t);
            const double w = coordinate_weight(p) * fe_values.JxW(q);
            for (unsigned int i = 0; i < n; ++i)
              local(i) += s * fe_values.shape_value(i, q) * w;
          }
        f.add(dofs, local);
      }
    f.compress(VectorOperation::add);
  }

  template <int dim>
  typename DiffusionProblem<dim>::Vector DiffusionProblem<dim>::make_vector() const
  {
    return Vector(owned_, communicator_);
  }

  template <int dim>
  typename DiffusionProblem<dim>::Vector DiffusionProblem<dim>::make_ghosted(const Vector &owned) const
  {
    Vector ghosted(owned_, relevant_, communicator_);
    ghosted = owned;
    return ghosted;
  }

  template <int dim>
  double DiffusionProblem<dim>::dirichlet_value(const unsigned int b, const Point<dim> &p, const double t) const
  {
    const BoundarySpec &spec = *boundary_specs_[b];
    const double x = p[0], y = dim > 1 ? p[1] : 0.0, z = dim > 2 ? p[2] : 0.0;
    if (spec.value_is_ambient)
      return boundary_ambient_[b](x, y, z, t);
    return boundary_value_[b](x, y, z, t) / boundary_partition_[b];
  }

  template <int dim>
  double DiffusionProblem<dim>::concentration_scale() const
  {
    double scale = std::abs(description_.initial.value) * (description_.initial.is_constant() ? 1 : 0);
    for (const auto &region : description_.regions)
      if (region.initial && region.initial->is_constant())
        scale = std::max(scale, std::abs(region.initial->value) / region.partition);
    for (std::size_t k = 0; k < fixed_dofs_.size(); ++k)
      scale = std::max(scale, std::abs(dirichlet_value(fixed_dofs_[k].second, fixed_points_[k], 0.0)));
    for (unsigned int b = 0; b < boundary_kinds_.size(); ++b)
      if (boundary_kinds_[b] == BoundaryKind::transfer && !boundary_ambient_[b].depends_on_space())
        scale = std::max(scale, std::abs(boundary_ambient_[b].at_time(0.0)));
    return Utilities::MPI::max(scale, communicator_);
  }

  template <int dim>
  void DiffusionProblem<dim>::initial_state(Vector &u) const
  {
    u = make_vector();
    const Quadrature<dim> support(fe_.get_unit_support_points());
    FEValues<dim> fe_values(mapping_, fe_, support, update_quadrature_points);
    std::vector<types::global_dof_index> dofs(fe_.n_dofs_per_cell());
    std::vector<ScalarFunction> initial;
    for (const auto &name : names_.regions)
      {
        const RegionSpec *region = description_.find_region(name);
        initial.emplace_back(region->initial ? *region->initial : description_.initial);
      }
    for (const auto &cell : dof_handler_.active_cell_iterators())
      {
        if (!cell->is_locally_owned())
          continue;
        fe_values.reinit(cell);
        cell->get_dof_indices(dofs);
        const double k = partition(cell->material_id());
        for (unsigned int i = 0; i < dofs.size(); ++i)
          if (owned_.is_element(dofs[i]))
            {
              const auto &p = fe_values.quadrature_point(i);
              u[dofs[i]] = initial[cell->material_id()](p[0], dim > 1 ? p[1] : 0.0, dim > 2 ? p[2] : 0.0, 0.0) / k;
            }
      }
    u.compress(VectorOperation::insert);
  }

  template <int dim>
  StepResult DiffusionProblem<dim>::advance(const StepPlan &plan, const Vector &u0, const Vector *u_prev, Vector &u1)
  {
    const double dt = plan.dt();
    const double a = plan.bdf2 ? plan.alpha0 : 1.0;
    const double b = plan.bdf2 ? dt : plan.theta * dt;

    const Operator &old_op = operator_at(plan.t0, false);
    const Operator &new_op = operator_at(plan.t1, true);

    // Right-hand side of the unconstrained step equation (amount form).
    Vector rhs = make_vector(), tmp = make_vector(), f = make_vector();
    forcing(plan.t1, f);
    if (plan.bdf2)
      {
        Assert(u_prev != nullptr, ExcMessage("BDF2 needs the previous state"));
        tmp.equ(-plan.alpha1, u0);
        tmp.add(-plan.alpha2, *u_prev);
        mass_.vmult(rhs, tmp);
        rhs.add(dt, f);
      }
    else
      {
        mass_.vmult(rhs, u0);
        rhs.add(plan.theta * dt, f);
        if (plan.theta < 1)
          {
            old_op.full.vmult(tmp, u0);
            rhs.add(-(1 - plan.theta) * dt, tmp);
            Vector f0 = make_vector();
            forcing(plan.t0, f0);
            rhs.add((1 - plan.theta) * dt, f0);
          }
      }

    StepResult result;
    if (a != system_a_ || b != system_b_ || new_op.version != system_version_)
      {
        PhaseTimer::Scope scope(timer_, "matrix setup");
        system_.copy_from(mass_constrained_);
        system_ *= a;
        system_.add(b, new_op.constrained);
        const double ratio = b / a;
        const bool same_operator = new_op.version == system_version_;
        const double change = same_operator && hierarchy_b_over_a_ > 0 ? ratio / hierarchy_b_over_a_ : 0.0;
        const unsigned int setups_before = solver_->n_setups();
        solver_->set_matrix(system_, change);
        if (solver_->n_setups() != setups_before)
          hierarchy_b_over_a_ = ratio;
        system_a_ = a;
        system_b_ = b;
        system_version_ = new_op.version;
        result.matrix_rebuilt = true;
      }

    // Lifting: u1 = w + g, g holding the fixed values; solve for w with zero fixed rows.
    Vector lifted = make_vector();
    for (std::size_t k = 0; k < fixed_dofs_.size(); ++k)
      lifted[fixed_dofs_[k].first] = dirichlet_value(fixed_dofs_[k].second, fixed_points_[k], plan.t1);
    lifted.compress(VectorOperation::insert);
    Vector system_times_lifted = make_vector();
    mass_.vmult(system_times_lifted, lifted);
    system_times_lifted *= a;
    new_op.full.vmult(tmp, lifted);
    system_times_lifted.add(b, tmp);
    Vector reduced = rhs;
    reduced -= system_times_lifted;
    for (const auto &[dof, boundary] : fixed_dofs_)
      {
        (void)boundary;
        reduced[dof] = 0;
      }
    reduced.compress(VectorOperation::insert);

    for (const auto &[dof, boundary] : fixed_dofs_)
      {
        (void)boundary;
        u1[dof] = 0;
      }
    u1.compress(VectorOperation::insert);
    {
      PhaseTimer::Scope scope(timer_, "linear solve");
      result.linear_iterations = solver_->solve(u1, reduced);
    }
    for (const auto &[dof, boundary] : fixed_dofs_)
      u1[dof] = lifted[dof];
    u1.compress(VectorOperation::insert);

    // Reactions: residual of the unconstrained equations at the fixed rows.
    Vector residual = make_vector();
    mass_.vmult(residual, u1);
    residual *= a;
    new_op.full.vmult(tmp, u1);
    residual.add(b, tmp);
    residual -= rhs;
    result.dirichlet_terms.assign(boundary_kinds_.size(), 0.0);
    for (const auto &[dof, boundary] : fixed_dofs_)
      result.dirichlet_terms[boundary] += residual[dof];
    Utilities::MPI::sum(result.dirichlet_terms, communicator_, result.dirichlet_terms);
    return result;
  }

  template <int dim>
  void DiffusionProblem<dim>::zero_fixed(Vector &v) const
  {
    for (const auto &[dof, boundary] : fixed_dofs_)
      {
        (void)boundary;
        v[dof] = 0;
      }
    v.compress(VectorOperation::insert);
  }

  template <int dim>
  std::vector<double> DiffusionProblem<dim>::region_amounts(const Vector &u) const
  {
    std::vector<double> amounts;
    for (const auto &m : region_mass_)
      amounts.push_back(m * u);
    return amounts;
  }

  template <int dim>
  TermRates DiffusionProblem<dim>::rates(const Vector &u, const double t) const
  {
    TermRates rates;
    rates.boundary_inflow.assign(boundary_kinds_.size(), 0.0);
    for (unsigned int b = 0; b < boundary_kinds_.size(); ++b)
      {
        if (boundary_kinds_[b] == BoundaryKind::flux)
          rates.boundary_inflow[b] = boundary_forcing(b, t, nullptr);
        else if (boundary_kinds_[b] == BoundaryKind::transfer)
          rates.boundary_inflow[b] = boundary_forcing(b, t, nullptr) - transfer_rowsum_[b] * u;
      }
    if (!source_depends_on_space_)
      {
        for (unsigned int r = 0; r < source_.size(); ++r)
          rates.source += source_[r](0, 0, 0, t) * region_load_total_[r];
      }
    else
      {
        Vector f = make_vector();
        sources(t, f);
        rates.source = f.mean_value() * static_cast<double>(f.size());
      }
    rates.decay = decay_weights_ * u;
    return rates;
  }

  template class DiffusionProblem<1>;
  template class DiffusionProblem<2>;
  template class DiffusionProblem<3>;
} // namespace fickcast
