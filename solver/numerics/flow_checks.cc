// DiffusionProblem: water flow. The checks of the Darcy fluxes against the mesh and the faces,
// the cell Peclet and Courant figures, and the flow terms of a cell's operator.
#include "case/input_error.h"
#include "model/value_text.h"
#include "numerics/collective.h"
#include "numerics/diffusion_problem.h"
#include "numerics/flow_terms.h"

#include <deal.II/base/mpi.h>
#include <deal.II/base/quadrature_lib.h>

#include <cmath>

namespace fickcast
{
  using namespace dealii;

  namespace
  {
    /// The first of the ranks' texts that is not empty, on every rank ("" if none).
    std::string first_of_ranks(const std::string &mine, MPI_Comm communicator)
    {
      const unsigned int rank = Utilities::MPI::this_mpi_process(communicator);
      const unsigned int n_ranks = Utilities::MPI::n_mpi_processes(communicator);
      const unsigned int reporter = Utilities::MPI::min(mine.empty() ? n_ranks : rank, communicator);
      if (reporter == n_ranks)
        return "";
      return Utilities::MPI::broadcast(communicator, mine, reporter);
    }

    /// The flow terms of @p cell (cell_flow with its extent along the flow), D at t = 0.
    template <int dim, typename Cell>
    CellFlow<dim> flow_of_cell(const Cell &cell, const Material &material, const double conductance,
                               const unsigned int degree)
    {
      const Tensor<1, dim> q = darcy_flux_vector<dim>(material);
      std::vector<Point<dim>> vertices;
      for (const unsigned int v : cell->vertex_indices())
        vertices.push_back(cell->vertex(v));
      return cell_flow<dim>(material, conductance, length_along<dim>(vertices, q / q.norm()), degree);
    }
  } // namespace

  template <int dim>
  void DiffusionProblem<dim>::check_flow()
  {
    flow_warning_.clear();
    bool any_inflow_or_outflow = false;
    for (const StageSpec &stage : description_.stages)
      for (const BoundarySpec &b : stage.boundaries)
        any_inflow_or_outflow =
          any_inflow_or_outflow || b.kind == BoundaryKind::inflow || b.kind == BoundaryKind::outflow;
    if (!flow_ && !any_inflow_or_outflow)
      return;
    const QGauss<dim - 1> centre(1);
    const FE_Q<dim> linear(1);
    FEFaceValues<dim> face_values(mapping_, linear, centre, update_normal_vectors | update_quadrature_points);
    std::string warning;
    // The first input error of any rank, raised on every rank (numerics/collective.h).
    collectively(communicator_, [&] {
      const auto fail = [&](const std::string &key, const std::string &message) {
        throw InputError(description_.file, key, message);
      };
      for (const auto &cell : triangulation_->active_cell_iterators())
        {
          if (!cell->is_locally_owned())
            continue;
          const Material &material = materials_[cell->material_id()];
          const Tensor<1, dim> q = darcy_flux_vector<dim>(material);
          const double tolerance = 1e-9 * q.norm();
          for (const unsigned int f : cell->face_indices())
            {
              const auto face = cell->face(f);
              if (!face->at_boundary())
                {
                  // Water that would appear or vanish at an interface: the normal flux must match.
                  const auto neighbour = cell->neighbor(f);
                  if (neighbour->is_artificial() || neighbour->material_id() == cell->material_id())
                    continue;
                  const Material &other = materials_[neighbour->material_id()];
                  const Tensor<1, dim> q_other = darcy_flux_vector<dim>(other);
                  face_values.reinit(cell, f);
                  const Tensor<1, dim> normal = face_values.normal_vector(0);
                  const double mine = q * normal, theirs = q_other * normal;
                  if (std::abs(mine - theirs) > 1e-9 * std::max(q.norm(), q_other.norm()))
                    {
                      const Point<dim> &p = face_values.quadrature_point(0);
                      fail("region." + material.name() + ".darcy_flux",
                           "its component across the interface with " + other.name() + " (" + number_text(mine) +
                             " m/s) differs from that of region." + other.name() + " (" + number_text(theirs) +
                             " m/s) at " + describe_point(p[0], dim > 1 ? p[1] : 0.0, dim > 2 ? p[2] : 0.0, dim) +
                             ": water would appear or vanish there; give both regions the same flux across it");
                    }
                  continue;
                }
              face_values.reinit(cell, f);
              const double qn = q * face_values.normal_vector(0);
              const std::string &face_name = names_.boundaries[face->boundary_id()];
              for (const StageSpec &stage : description_.stages)
                {
                  const BoundarySpec *spec = stage.find_boundary(face_name);
                  const BoundaryKind kind = spec ? spec->kind : BoundaryKind::sealed;
                  const std::string key = "boundary." + face_name + ".type" +
                                          (description_.stages.size() > 1 ? " (stage " + stage.name + ")" : "");
                  const std::string crossing = "(q.n = " + number_text(qn) + " m/s from region." + material.name() +
                                               ".darcy_flux, n pointing out of the body)";
                  if ((kind == BoundaryKind::inflow || kind == BoundaryKind::outflow) && !material.has_flow())
                    {
                      // A study's no-flow case: the face acts as sealed; say so.
                      if (warning.empty())
                        warning = face_name + " is an " + (kind == BoundaryKind::inflow ? "inflow" : "outflow") +
                                  " face, but no water flows in region " + material.name() +
                                  " next to it (no darcy_flux): nothing crosses the face, which acts as sealed";
                    }
                  else if (kind == BoundaryKind::inflow && qn > tolerance)
                    fail(key, "inflow, but water leaves the body there " + crossing +
                                "; give type = outflow there, or turn the flux round");
                  else if (kind == BoundaryKind::outflow && qn < -tolerance)
                    fail(key, "outflow, but water enters the body there " + crossing +
                                "; give type = inflow with the concentration of the entering water");
                  else if (kind == BoundaryKind::sealed && std::abs(qn) > tolerance && warning.empty())
                    warning = "water crosses the sealed face " + face_name + " " + crossing +
                              ", but the species cannot: it piles up or thins out at the face; give type = " +
                              (qn > 0 ? "outflow" : "inflow") + " where water crosses a face";
                }
            }
        }
    });
    flow_warning_ = first_of_ranks(warning, communicator_);
  }

  template <int dim>
  FlowNumbers DiffusionProblem<dim>::flow_numbers() const
  {
    FlowNumbers numbers;
    if (!flow_)
      return numbers;
    double peclet = 0, rate = 0;
    int region = -1;
    for (const auto &cell : triangulation_->active_cell_iterators())
      {
        if (!cell->is_locally_owned())
          continue;
        const Material &material = materials_[cell->material_id()];
        if (!material.has_flow())
          continue;
        const CellFlow<dim> flow =
          flow_of_cell<dim>(cell, material, conductance(cell->material_id(), cell->center(), 0.0), fe_.degree);
        if (flow.peclet > peclet)
          {
            peclet = flow.peclet;
            region = cell->material_id();
          }
        rate = std::max(rate, flow.crossing_rate);
      }
    numbers.peclet = Utilities::MPI::max(peclet, communicator_);
    numbers.crossing_rate = Utilities::MPI::max(rate, communicator_);
    numbers.peclet_region =
      first_of_ranks(peclet == numbers.peclet && region >= 0 ? names_.regions[region] : std::string(), communicator_);
    return numbers;
  }

  template <int dim>
  void DiffusionProblem<dim>::add_flow_terms(const typename DoFHandler<dim>::active_cell_iterator &cell,
                                             const FEValues<dim> &fe_values, FullMatrix<double> &mass,
                                             FullMatrix<double> &stiffness, dealii::Vector<double> &load) const
  {
    // C du/dt + div(q K u - G grad u) + k u = s with q K u integrated by parts (the boundary
    // terms are those of the faces), plus tau (a . grad phi_i) times the strong residual
    // (streamline upwind Petrov-Galerkin; Brooks and Hughes 1982). The upwind weights sum to zero
    // over a cell's shape functions, so amounts and loads keep their totals.
    const auto region = cell->material_id();
    const Material &material = materials_[region];
    const double g = conductance(region, cell->center(), 0.0);
    const CellFlow<dim> flow = flow_of_cell<dim>(cell, material, g, fe_.degree);
    Tensor<2, dim> g_total = flow.dispersion;
    for (unsigned int d = 0; d < dim; ++d)
      g_total[d][d] += g;
    const double c = material.capacity(), k = material.reaction();
    const unsigned int n = fe_.n_dofs_per_cell();
    const bool second_derivatives = fe_.degree > 1;
    for (unsigned int point = 0; point < fe_values.n_quadrature_points; ++point)
      {
        const double w = coordinate_weight(fe_values.quadrature_point(point)) * fe_values.JxW(point);
        for (unsigned int i = 0; i < n; ++i)
          {
            const Tensor<1, dim> &grad_i = fe_values.shape_grad(i, point);
            const double upwind_i = flow.tau * (flow.velocity * grad_i);
            const double carried_i = flow.flux * grad_i;
            load(i) += upwind_i * w;
            for (unsigned int j = 0; j < n; ++j)
              {
                const double phi_j = fe_values.shape_value(j, point);
                const Tensor<1, dim> &grad_j = fe_values.shape_grad(j, point);
                double residual_j = flow.flux * grad_j + k * phi_j;
                if (second_derivatives)
                  residual_j -= scalar_product(g_total, fe_values.shape_hessian(j, point));
                mass(i, j) += upwind_i * c * phi_j * w;
                stiffness(i, j) +=
                  (-carried_i * phi_j + grad_i * (flow.dispersion * grad_j) + upwind_i * residual_j) * w;
              }
          }
      }
  }

  template <int dim>
  std::vector<double> DiffusionProblem<dim>::advective_inflow(const Vector &u) const
  {
    std::vector<double> rates(names_.boundaries.size(), 0.0);
    for (std::size_t b = 0; b < advective_weights_.size(); ++b)
      rates[b] = -(advective_weights_[b] * u);
    return rates;
  }

  template std::vector<double> DiffusionProblem<1>::advective_inflow(const Vector &) const;
  template std::vector<double> DiffusionProblem<2>::advective_inflow(const Vector &) const;
  template std::vector<double> DiffusionProblem<3>::advective_inflow(const Vector &) const;
  template void DiffusionProblem<1>::check_flow();
  template void DiffusionProblem<2>::check_flow();
  template void DiffusionProblem<3>::check_flow();
  template FlowNumbers DiffusionProblem<1>::flow_numbers() const;
  template FlowNumbers DiffusionProblem<2>::flow_numbers() const;
  template FlowNumbers DiffusionProblem<3>::flow_numbers() const;
  template void DiffusionProblem<1>::add_flow_terms(const DoFHandler<1>::active_cell_iterator &, const FEValues<1> &,
                                                    FullMatrix<double> &, FullMatrix<double> &,
                                                    dealii::Vector<double> &) const;
  template void DiffusionProblem<2>::add_flow_terms(const DoFHandler<2>::active_cell_iterator &, const FEValues<2> &,
                                                    FullMatrix<double> &, FullMatrix<double> &,
                                                    dealii::Vector<double> &) const;
  template void DiffusionProblem<3>::add_flow_terms(const DoFHandler<3>::active_cell_iterator &, const FEValues<3> &,
                                                    FullMatrix<double> &, FullMatrix<double> &,
                                                    dealii::Vector<double> &) const;
} // namespace fickcast
