// DiffusionProblem: set-up, stages, fixed unknowns, state and observables. Assembly lives in
// operator_assembly.cc, the step in step_solve.cc.
#include "numerics/diffusion_problem.h"
#include "numerics/step_multigrid.h"

#include "case/input_error.h"
#include "geometry/mesh_import.h"
#include "geometry/point_placement.h"
#include "model/value_text.h"

#include <deal.II/base/quadrature_lib.h>
#include <deal.II/base/utilities.h>
#include <deal.II/distributed/tria.h>
#include <deal.II/dofs/dof_renumbering.h>
#include <deal.II/dofs/dof_tools.h>
#include <deal.II/fe/fe_values.h>
#include <deal.II/lac/dynamic_sparsity_pattern.h>
#include <deal.II/lac/sparsity_tools.h>
#include <deal.II/numerics/vector_tools.h>

#include <algorithm>
#include <cmath>
#include <limits>
#include <map>

namespace fickcast
{
  using namespace dealii;

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
  std::string DiffusionProblem<dim>::linear_solver_description() const
  {
    return solver_ ? solver_->description() : std::string("none");
  }

  template <int dim>
  void DiffusionProblem<dim>::make_mesh()
  {
    if constexpr (dim == 1)
      triangulation_ = std::make_unique<Triangulation<dim>>();
    else
      triangulation_ = std::make_unique<parallel::distributed::Triangulation<dim>>(communicator_);
    fickcast::make_mesh<dim>(*triangulation_, description_.geometry);
    names_ = mesh_names(description_.geometry, dim);
  }

  template <int dim>
  void DiffusionProblem<dim>::build_mesh()
  {
    make_mesh();

    // Regions: how each diffusivity enters the operator.
    n_unit_ = 0;
    for (const auto &name : names_.regions)
      {
        const RegionSpec *region = description_.find_region(name);
        AssertThrow(region != nullptr, ExcMessage("region without description: " + name));
        materials_.emplace_back(*region, description_.temperature, description_.initial, dim, &bad_coefficient_,
                                &non_finite_);
        const Material &material = materials_.back();
        source_depends_on_space_ = source_depends_on_space_ || material.source_function().depends_on_space();
        const Diffusivity &d = material.diffusivity_shape();
        const bool dynamic = d.depends_on_concentration() || (!d.uniform_in_space() && d.depends_on_time());
        dynamic_.push_back(dynamic);
        nonlinear_ = nonlinear_ || d.depends_on_concentration();
        dispersed_ = dispersed_ || material.has_dispersed_phase();
        flow_ = flow_ || material.has_flow();
        if (!dynamic && d.uniform_in_space() && d.depends_on_time())
          {
            unit_index_.push_back(n_unit_++);
            if (clock_region_ < 0)
              {
                clock_region_ = static_cast<int>(materials_.size()) - 1;
                clock_reference_ = material.diffusivity(0, 0, 0, 0, 0);
                if (!(clock_reference_ > 0))
                  clock_reference_ = 1;
              }
          }
        else
          unit_index_.push_back(-1);
      }
    refine_near_open_faces();
    check_flow();
    check_point_placement(triangulation(), description_, names_.regions, communicator_);
  }

  template <int dim>
  void DiffusionProblem<dim>::setup()
  {
    PhaseTimer::Scope scope(timer_, "setup");
    build_mesh();

    // K of the region touching each boundary (any rank that sees the boundary reports it).
    boundary_partition_.assign(names_.boundaries.size(), -1.0);
    for (const auto &cell : triangulation_->active_cell_iterators())
      if (cell->is_locally_owned())
        for (const unsigned int f : cell->face_indices())
          if (cell->face(f)->at_boundary())
            boundary_partition_[cell->face(f)->boundary_id()] = partition(cell->material_id());
    for (double &k : boundary_partition_)
      {
        k = Utilities::MPI::max(k, communicator_);
        if (k < 0)
          k = 1.0;
      }
    // A `value` on a face is a phase concentration: on a face whose cells have different
    // partition coefficients it is ambiguous (the built-in geometries are checked when the case
    // is read; a mesh file's faces here, collectively).
    std::vector<double> lowest_partition(names_.boundaries.size(), std::numeric_limits<double>::infinity());
    for (const auto &cell : triangulation_->active_cell_iterators())
      if (cell->is_locally_owned())
        for (const unsigned int f : cell->face_indices())
          if (cell->face(f)->at_boundary())
            lowest_partition[cell->face(f)->boundary_id()] =
              std::min(lowest_partition[cell->face(f)->boundary_id()], partition(cell->material_id()));
    for (std::size_t b = 0; b < lowest_partition.size(); ++b)
      {
        const double low = Utilities::MPI::min(lowest_partition[b], communicator_);
        if (!(low < boundary_partition_[b] * (1 - 1e-12)))
          continue;
        for (const StageSpec &stage : description_.stages)
          if (const BoundarySpec *face = stage.find_boundary(names_.boundaries[b]))
            if (face->kind == BoundaryKind::concentration && !face->value_is_ambient)
              throw InputError(description_.file, "boundary." + face->name + ".value",
                               "ambiguous: the face touches regions with different partition coefficients (" +
                                 number_text(low) + " and " + number_text(boundary_partition_[b]) +
                                 "); give 'ambient' (the outside concentration, reference phase) instead, or "
                                 "split the face into one physical group per region in the mesh");
      }

    setup_dofs();
    make_operators();

    bath_value_.assign(names_.boundaries.size(), 0.0);
    bath_value_prev_ = bath_value_;
    bath_trial_ = bath_value_;
    set_stage(0);
  }

  template <int dim>
  void DiffusionProblem<dim>::make_operators()
  {
    system_.clear();
    modified_.clear();
    unit_.resize(static_cast<std::size_t>(n_unit_));
    const bool serial = Utilities::MPI::n_mpi_processes(communicator_) == 1;
    const bool direct = choose_direct_solver(description_.numerics.linear_solver, dim, n_dofs(), serial);
    if (solver_)
      setups_before_ += solver_->n_setups();
    solver_ = std::make_unique<LinearSolver>(direct, description_.numerics.solver_tolerance, fe_.degree > 1,
                                             description_.numerics.linear_solver);
    // Without matrices where the products can do without them (sized on first need).
    matrices_sized_ = false;
    matrices_ready_ = false;
    matrix_free_.reset();
    if (!matrix_free_applies())
      size_matrices();
  }

  template <int dim>
  void DiffusionProblem<dim>::size_matrices()
  {
    reinit(mass_);
    reinit(static_);
    for (auto &pair : unit_)
      reinit(pair);
    if (std::any_of(dynamic_.begin(), dynamic_.end(), [](bool d) { return d; }))
      reinit(dynamic_matrices_);
    matrices_sized_ = true;
  }

  template <int dim>
  void DiffusionProblem<dim>::setup_dofs(const bool attach)
  {
    if (attach)
      dof_handler_.reinit(*triangulation_);
    dof_handler_.distribute_dofs(fe_);
    // A run that remeshes numbers the unknowns by the cell tree (coarse cells, then children in
    // order), which does not depend on the order the cells were made in: a checkpoint's vectors
    // fit the same mesh made again by rebuild().
    if (description_.numerics.remesh)
      DoFRenumbering::hierarchical(dof_handler_);
    owned_ = dof_handler_.locally_owned_dofs();
    DoFTools::extract_locally_relevant_dofs(dof_handler_, relevant_);
    spare_vectors_.clear();
    owned_template_.reinit(owned_, communicator_);
    ghosted_template_.reinit(owned_, relevant_, communicator_);
    hanging_.clear();
    hanging_.reinit(relevant_);
    DoFTools::make_hanging_node_constraints(dof_handler_, hanging_);
    hanging_.close();
    has_hanging_ = Utilities::MPI::max(hanging_.n_constraints(), communicator_) > 0;
    reserve_ = make_vector();
    reserve_trial_ = make_vector();
    saturation_ = make_vector();
    dispersed_node_.assign(owned_.n_elements(), false);
    if (!dispersed_)
      return;
    // Saturation value of u per node (the lowest of the regions sharing it), infinite elsewhere.
    saturation_ = std::numeric_limits<double>::max();
    std::vector<types::global_dof_index> dofs(fe_.n_dofs_per_cell());
    for (const auto &cell : dof_handler_.active_cell_iterators())
      {
        if (!cell->is_locally_owned() && !cell->is_ghost())
          continue;
        const Material &material = materials_[cell->material_id()];
        if (!material.has_dispersed_phase())
          continue;
        cell->get_dof_indices(dofs);
        for (const auto dof : dofs)
          if (owned_.is_element(dof))
            {
              saturation_[dof] = std::min(static_cast<double>(saturation_[dof]), material.saturation());
              dispersed_node_[owned_.index_within_set(dof)] = true;
            }
      }
    saturation_.compress(VectorOperation::insert);
  }

  template <int dim>
  void DiffusionProblem<dim>::reinit(MatrixPair &pair)
  {
    rows_next_to_fixed_valid_ = false;
    part_diagonals_.clear();
    DynamicSparsityPattern pattern(relevant_);
    DoFTools::make_sparsity_pattern(dof_handler_, pattern, hanging_, true);
    SparsityTools::distribute_sparsity_pattern(pattern, owned_, communicator_, relevant_);
    pair.full.reinit(owned_, owned_, pattern, communicator_);
    pair.constrained.reinit(owned_, owned_, pattern, communicator_);
    if (system_.m() == 0)
      system_.reinit(owned_, owned_, pattern, communicator_);
  }

  template <int dim>
  void DiffusionProblem<dim>::set_stage(const unsigned int stage)
  {
    AssertThrow(stage < description_.stages.size(), ExcMessage("no such stage"));
    const std::vector<unsigned int> previous_baths = baths_;
    stage_ = stage;
    const StageSpec &spec = description_.stages[stage];
    boundaries_.clear();
    static const BoundarySpec sealed;
    for (unsigned int b = 0; b < names_.boundaries.size(); ++b)
      {
        const BoundarySpec *boundary = spec.find_boundary(names_.boundaries[b]);
        boundaries_.emplace_back(boundary ? *boundary : sealed, boundary_partition_[b], dim, &non_finite_,
                                 description_.stages.size() > 1 ? spec.name : std::string(), &negative_boundary_);
      }
    baths_.clear();
    for (unsigned int b = 0; b < boundaries_.size(); ++b)
      if (boundaries_[b].kind() == BoundaryKind::bath)
        {
          baths_.push_back(b);
          if (std::find(previous_baths.begin(), previous_baths.end(), b) == previous_baths.end())
            bath_value_[b] = bath_value_prev_[b] = bath_trial_[b] = boundaries_[b].bath_initial_value();
        }
    setup_fixed_unknowns();
    assemble_constant_parts();
    system_key_.clear();
    hierarchy_key_.clear(); // a new stage's matrix gets its own preconditioner
    dynamic_valid_ = false;
  }

  template <int dim>
  void DiffusionProblem<dim>::setup_fixed_unknowns()
  {
    // Fixed unknowns: concentration boundaries and baths; the first boundary (by id) wins at corners.
    rows_next_to_fixed_valid_ = false;
    constraints_.clear();
    constraints_.reinit(relevant_);
    DoFTools::make_hanging_node_constraints(dof_handler_, constraints_);
    fixed_dofs_.clear();
    fixed_points_.clear();
    std::map<types::global_dof_index, unsigned int> owner_boundary;
    for (unsigned int b = 0; b < boundaries_.size(); ++b)
      {
        if (!boundaries_[b].is_fixed())
          continue;
        std::map<types::global_dof_index, double> values;
        VectorTools::interpolate_boundary_values(mapping_, dof_handler_, static_cast<types::boundary_id>(b),
                                                 Functions::ZeroFunction<dim>(), values);
        for (const auto &[dof, value] : values)
          {
            (void)value;
            // A hanging node on the face follows its parents (which carry the value).
            if (owner_boundary.count(dof) == 0 && !hanging_.is_constrained(dof))
              owner_boundary[dof] = b;
          }
      }
    std::map<types::global_dof_index, Point<dim>> support_points;
    if (Utilities::MPI::sum(owner_boundary.size(), communicator_) > 0)
      DoFTools::map_dofs_to_support_points(mapping_, dof_handler_, support_points);
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
  }

  template <int dim>
  double DiffusionProblem<dim>::effective_diffusivity(const types::material_id region, const Point<dim> &point,
                                                      const double t, const double c) const
  {
    return materials_[region].effective_diffusivity(point[0], dim > 1 ? point[1] : 0.0, dim > 2 ? point[2] : 0.0, t, c);
  }

  template <int dim>
  double DiffusionProblem<dim>::conductance(const types::material_id region, const Point<dim> &point, const double t,
                                            const double c) const
  {
    return materials_[region].conductance(point[0], dim > 1 ? point[1] : 0.0, dim > 2 ? point[2] : 0.0, t, c);
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
  std::string DiffusionProblem<dim>::non_finite_expression() const
  {
    const unsigned int rank = Utilities::MPI::this_mpi_process(communicator_);
    const unsigned int n_ranks = Utilities::MPI::n_mpi_processes(communicator_);
    const unsigned int reporter = Utilities::MPI::min(non_finite_.empty() ? n_ranks : rank, communicator_);
    if (reporter == n_ranks)
      return "";
    return Utilities::MPI::broadcast(communicator_, non_finite_, reporter);
  }

  template <int dim>
  std::string DiffusionProblem<dim>::negative_boundary_value() const
  {
    const unsigned int rank = Utilities::MPI::this_mpi_process(communicator_);
    const unsigned int n_ranks = Utilities::MPI::n_mpi_processes(communicator_);
    const unsigned int reporter = Utilities::MPI::min(negative_boundary_.empty() ? n_ranks : rank, communicator_);
    if (reporter == n_ranks)
      return "";
    return Utilities::MPI::broadcast(communicator_, negative_boundary_, reporter);
  }

  template <int dim>
  bool DiffusionProblem<dim>::is_finite(const Vector &u) const
  {
    bool finite = true;
    for (const double value : u) // the locally owned entries
      finite = finite && std::isfinite(value);
    for (const unsigned int b : baths_)
      finite = finite && std::isfinite(bath_trial_[b]);
    if (dispersed_)
      for (const double value : reserve_trial_)
        finite = finite && std::isfinite(value);
    return Utilities::MPI::min(finite ? 1 : 0, communicator_) == 1;
  }

  template <int dim>
  double DiffusionProblem<dim>::coordinate_weight(const Point<dim> &point) const
  {
    // Amounts over the full revolution: 2 pi r per unit length (cylinder), 4 pi r^2 (sphere),
    // 2 pi r (axisymmetric, r = x).
    constexpr double two_pi = 2 * M_PI;
    switch (description_.geometry.coordinates)
      {
        case Coordinates::cylinder:
        case Coordinates::axisymmetric:
          return two_pi * point[0];
        case Coordinates::sphere:
          return 2 * two_pi * point[0] * point[0];
        case Coordinates::cartesian:
          break;
      }
    return 1.0;
  }

  template <int dim>
  double DiffusionProblem<dim>::clock_rate(const double t) const
  {
    if (clock_region_ < 0)
      return 1.0;
    return materials_[static_cast<std::size_t>(clock_region_)].diffusivity(0, 0, 0, t, 0) / clock_reference_;
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
  void DiffusionProblem<dim>::distribute(Vector &v) const
  {
    if (has_hanging_)
      hanging_.distribute(v);
  }

  template <int dim>
  void DiffusionProblem<dim>::zero_hanging(Vector &v) const
  {
    for (const auto &line : hanging_.get_lines())
      if (owned_.is_element(line.index))
        v[line.index] = 0;
    v.compress(VectorOperation::insert);
  }

  template <int dim>
  bool DiffusionProblem<dim>::depleted_in_last_step() const
  {
    return Utilities::MPI::sum(depleted_.size(), communicator_) > 0;
  }

  template <int dim>
  void DiffusionProblem<dim>::zero_depleted(Vector &v) const
  {
    for (const auto dof : depleted_)
      v[dof] = 0;
    v.compress(VectorOperation::insert);
  }

  template <int dim>
  double DiffusionProblem<dim>::concentration_scale(const double t) const
  {
    double scale = 0;
    if (description_.initial.is_constant())
      scale = std::abs(description_.initial.value);
    for (const Material &material : materials_)
      {
        if (material.has_own_initial() && material.initial_is_constant())
          scale = std::max(scale, std::abs(material.initial_constant()) / material.partition());
        if (material.has_dispersed_phase())
          scale = std::max(scale, material.saturation());
      }
    for (std::size_t k = 0; k < fixed_dofs_.size(); ++k)
      {
        const unsigned int b = fixed_dofs_[k].second;
        if (boundaries_[b].kind() == BoundaryKind::concentration)
          {
            const Point<dim> &p = fixed_points_[k];
            const double value = boundaries_[b].fixed_value(p[0], dim > 1 ? p[1] : 0.0, dim > 2 ? p[2] : 0.0, t);
            scale = std::max(scale, std::abs(value));
          }
      }
    for (const unsigned int b : baths_)
      scale = std::max(scale, std::abs(bath_value_[b]));
    for (unsigned int b = 0; b < boundaries_.size(); ++b)
      if (boundaries_[b].kind() == BoundaryKind::transfer && !boundaries_[b].ambient_function().depends_on_space())
        scale = std::max(scale, std::abs(boundaries_[b].driving_at_time(t)));
    return Utilities::MPI::max(scale, communicator_);
  }

  template <int dim>
  void DiffusionProblem<dim>::initial_state(Vector &u)
  {
    u = make_vector();
    reserve_ = 0;
    const Quadrature<dim> support(fe_.get_unit_support_points());
    FEValues<dim> fe_values(mapping_, fe_, support, update_quadrature_points);
    std::vector<types::global_dof_index> dofs(fe_.n_dofs_per_cell());
    // The value each cell's region gives its support point i.
    const auto region_value = [&](const auto &cell, const unsigned int i) {
      const Material &material = materials_[cell->material_id()];
      const auto &p = fe_values.quadrature_point(i);
      return material.initial_concentration(p[0], dim > 1 ? p[1] : 0.0, dim > 2 ? p[2] : 0.0) / material.partition();
    };

    // A node shared by regions with different initial values takes their mean weighted by the
    // capacity (porosity x retardation x partition) times the measure (with the radial weight)
    // of each region's cells around it, so the ramp that replaces the jump adds to one side the
    // amount it takes from the other; the same on any number
    // of ranks, whatever the cell order. Owned and ghost cells are visited, so every region
    // touching an owned node is seen.
    // Most nodes see one region: kept in vectors; only nodes where regions meet go to a map.
    struct Candidate
    {
      double value = 0, weight = 0;
    };
    const auto none = numbers::invalid_material_id;
    std::vector<types::material_id> first_region(owned_.n_elements(), none);
    std::vector<Candidate> first(owned_.n_elements());
    std::map<types::global_dof_index, std::map<types::material_id, Candidate>> shared;
    for (const auto &cell : dof_handler_.active_cell_iterators())
      {
        if (!cell->is_locally_owned() && !cell->is_ghost())
          continue;
        fe_values.reinit(cell);
        cell->get_dof_indices(dofs);
        const types::material_id id = cell->material_id();
        const double weight = cell->measure() * coordinate_weight(cell->center()) * materials_[id].capacity();
        for (unsigned int i = 0; i < dofs.size(); ++i)
          if (owned_.is_element(dofs[i]))
            {
              const auto k = owned_.index_within_set(dofs[i]);
              if (first_region[k] == none)
                {
                  first_region[k] = id;
                  first[k] = {region_value(cell, i), 0.0};
                }
              if (first_region[k] == id)
                first[k].weight += weight;
              else
                {
                  Candidate &c = shared[dofs[i]][id];
                  c.value = region_value(cell, i);
                  c.weight += weight;
                }
            }
      }
    double scale = 0;
    for (std::size_t k = 0; k < first.size(); ++k)
      if (first_region[k] != none)
        {
          const auto dof = owned_.nth_index_in_set(k);
          u[dof] = first[k].value;
          scale = std::max(scale, std::abs(first[k].value));
          const auto other = shared.find(dof);
          if (other == shared.end())
            continue;
          double sum = first[k].weight * first[k].value, weights = first[k].weight;
          for (const auto &[region, c] : other->second)
            {
              sum += c.weight * c.value;
              weights += c.weight;
              scale = std::max(scale, std::abs(c.value));
            }
          u[dof] = sum / weights;
        }
    u.compress(VectorOperation::insert);

    // Higher-degree elements: a cell whose vertex values differ from its own region's (it
    // borders a jump of the initial values) gets the multilinear interpolant of its vertex
    // values at its other nodes, so the step is a monotone ramp across that cell instead of a
    // polynomial that over- and undershoots.
    if (fe_.degree > 1)
      {
        const Vector ghosted = make_ghosted(u);
        const unsigned int n_vertices = GeometryInfo<dim>::vertices_per_cell;
        const auto &unit_points = fe_.get_unit_support_points();
        scale = Utilities::MPI::max(scale, communicator_);
        for (const auto &cell : dof_handler_.active_cell_iterators())
          {
            if (!cell->is_locally_owned() && !cell->is_ghost())
              continue;
            fe_values.reinit(cell);
            cell->get_dof_indices(dofs);
            bool borders_jump = false;
            for (unsigned int v = 0; v < n_vertices; ++v)
              borders_jump = borders_jump || std::abs(ghosted[dofs[v]] - region_value(cell, v)) > 1e-12 * scale;
            if (!borders_jump)
              continue;
            for (unsigned int i = n_vertices; i < dofs.size(); ++i)
              if (owned_.is_element(dofs[i]))
                {
                  double value = 0;
                  for (unsigned int v = 0; v < n_vertices; ++v)
                    value += GeometryInfo<dim>::d_linear_shape_function(unit_points[i], v) * ghosted[dofs[v]];
                  u[dofs[i]] = value;
                }
          }
        u.compress(VectorOperation::insert);
      }

    // Undissolved reserve: the loading above what the pores hold at saturation, lumped to nodes.
    if (dispersed_)
      {
        const QGauss<dim> quadrature(fe_.degree + 1);
        FEValues<dim> values(mapping_, fe_, quadrature, update_values | update_quadrature_points | update_JxW_values);
        dealii::Vector<double> local(fe_.n_dofs_per_cell());
        for (const auto &cell : dof_handler_.active_cell_iterators())
          {
            if (!cell->is_locally_owned())
              continue;
            const Material &material = materials_[cell->material_id()];
            const double excess = material.undissolved_loading(); // per bulk volume
            if (!material.has_dispersed_phase() || excess <= 0)
              continue;
            values.reinit(cell);
            cell->get_dof_indices(dofs);
            local = 0;
            for (unsigned int q = 0; q < quadrature.size(); ++q)
              for (unsigned int i = 0; i < dofs.size(); ++i)
                local(i) +=
                  excess * values.shape_value(i, q) * coordinate_weight(values.quadrature_point(q)) * values.JxW(q);
            hanging_.distribute_local_to_global(local, dofs, reserve_);
          }
        reserve_.compress(VectorOperation::add);
      }
    reserve_trial_ = reserve_;
    distribute(u);
    check_coefficients(); // a non-finite initial value on any rank: one InputError on every rank
  }

  template <int dim>
  void DiffusionProblem<dim>::accept_step()
  {
    for (const unsigned int b : baths_)
      {
        bath_value_prev_[b] = bath_value_[b];
        bath_value_[b] = bath_trial_[b];
      }
    if (dispersed_)
      reserve_ = reserve_trial_;
  }

  template <int dim>
  ProblemState DiffusionProblem<dim>::saved_state() const
  {
    ProblemState state;
    state.stage = stage_;
    state.bath_value = bath_value_;
    state.bath_value_prev = bath_value_prev_;
    state.bath_trial = bath_trial_;
    if (dispersed_)
      state.reserve.assign(reserve_.begin(), reserve_.end());
    state.preconditioner_key = hierarchy_key_;
    state.matrix_setups = n_matrix_setups();
    state.system_key = system_key_;
    if (solver_)
      state.solver_statistics = solver_->statistics();
    return state;
  }

  template <int dim>
  void DiffusionProblem<dim>::restore(const ProblemState &state)
  {
    const auto local = static_cast<std::size_t>(reserve_.end() - reserve_.begin());
    if (state.stage >= description_.stages.size() || state.bath_value.size() != bath_value_.size() ||
        state.bath_value_prev.size() != bath_value_.size() || state.bath_trial.size() != bath_value_.size() ||
        (dispersed_ && state.reserve.size() != local))
      throw IoError("the checkpoint's stage, baths or undissolved reserve do not fit this case's mesh");
    if (state.stage != stage_)
      set_stage(state.stage);
    bath_value_ = state.bath_value;
    bath_value_prev_ = state.bath_value_prev;
    bath_trial_ = state.bath_trial;
    if (dispersed_)
      {
        std::copy(state.reserve.begin(), state.reserve.end(), reserve_.begin());
        reserve_trial_ = reserve_;
      }
    // The preconditioner (or factorisation) is kept across steps (build_system): rebuild it on the
    // very matrix it was built on, so the solves repeat the uninterrupted run to the last bit.
    // Keys with a part assembled anew (dynamic, Jacobian) never keep one.
    const std::vector<double> &key = state.preconditioner_key;
    std::size_t units = 0;
    for (const int index : unit_index_)
      units += index >= 0 ? 1 : 0;
    auto reusable = [&](const std::vector<double> &k) {
      return !k.empty() && dynamic_matrices_.full.m() == 0 && k.back() == 0.0 && k.size() == units + 3;
    };
    solver_->restore_statistics(state.solver_statistics);
    if (solver_->is_direct())
      {
        if (reusable(key))
          {
            compose_system(key);
            solver_->set_matrix(system_, 0, true);
            hierarchy_key_ = key;
            system_key_ = key;
          }
      }
    else
      {
        // Multigrid on the matrix it was built on, then the step matrix in use with the
        // preconditioner it had (the diagonal, or that multigrid kept).
        if (reusable(key))
          {
            compose_system(key);
            solver_->rebuild_multigrid(system_);
            hierarchy_key_ = key;
            system_key_ = key;
          }
        if (reusable(state.system_key))
          {
            if (!use_matrix_free(state.system_key))
              {
                compose_system(state.system_key);
                solver_->set_matrix(system_, 1.0, true, diffusion_number(state.system_key));
              }
            system_key_ = state.system_key;
          }
      }
    const unsigned int now = solver_->n_setups();
    setups_before_ = state.matrix_setups > now ? state.matrix_setups - now : 0;
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
  double DiffusionProblem<dim>::undissolved_amount() const
  {
    if (!dispersed_)
      return 0;
    return reserve_.mean_value() * static_cast<double>(reserve_.size());
  }

  template <int dim>
  double DiffusionProblem<dim>::bath_concentration(const unsigned int b) const
  {
    if (boundaries_[b].kind() != BoundaryKind::bath)
      return std::numeric_limits<double>::quiet_NaN();
    return boundaries_[b].bath_concentration(bath_value_[b]);
  }

  template <int dim>
  double DiffusionProblem<dim>::bath_amount(const unsigned int b) const
  {
    if (boundaries_[b].kind() != BoundaryKind::bath)
      return 0;
    return boundaries_[b].bath_volume() * bath_concentration(b);
  }

  template <int dim>
  TermRates DiffusionProblem<dim>::rates(const Vector &u, const double t) const
  {
    TermRates rates;
    rates.boundary_inflow.assign(boundaries_.size(), 0.0);
    for (unsigned int b = 0; b < boundaries_.size(); ++b)
      {
        if (boundaries_[b].kind() == BoundaryKind::flux || boundaries_[b].kind() == BoundaryKind::inflow)
          rates.boundary_inflow[b] = boundary_forcing(b, t, nullptr);
        else if (boundaries_[b].kind() == BoundaryKind::transfer)
          rates.boundary_inflow[b] = boundary_forcing(b, t, nullptr) - transfer_rowsum_[b] * u;
        else if (boundaries_[b].kind() == BoundaryKind::outflow)
          rates.boundary_inflow[b] = advective_weights_.empty() ? 0.0 : -(advective_weights_[b] * u); // all advected
      }
    if (!source_depends_on_space_)
      for (unsigned int r = 0; r < materials_.size(); ++r)
        rates.source += materials_[r].source(0, 0, 0, t) * region_load_total_[r];
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
