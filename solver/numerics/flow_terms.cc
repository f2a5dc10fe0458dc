#include "numerics/flow_terms.h"

#include <algorithm>
#include <cmath>
#include <limits>

namespace fickcast
{
  using namespace dealii;

  template <int dim>
  Tensor<1, dim> darcy_flux_vector(const Material &material)
  {
    Tensor<1, dim> q;
    const auto &given = material.darcy_flux();
    for (unsigned int d = 0; d < dim && d < given.size(); ++d)
      q[d] = given[d];
    return q;
  }

  template <int dim>
  Tensor<2, dim> dispersion_conductance(const Material &material)
  {
    Tensor<2, dim> g;
    const Tensor<1, dim> q = darcy_flux_vector<dim>(material);
    const double speed = q.norm();
    if (speed == 0)
      return g;
    const double k = material.partition();
    const double along = material.longitudinal_dispersivity();
    const double across = material.transverse_dispersivity();
    for (unsigned int i = 0; i < dim; ++i)
      {
        g[i][i] += k * across * speed;
        for (unsigned int j = 0; j < dim; ++j)
          g[i][j] += k * (along - across) * q[i] * q[j] / speed;
      }
    return g;
  }

  template <int dim>
  double length_along(const std::vector<Point<dim>> &vertices, const Tensor<1, dim> &direction)
  {
    double low = std::numeric_limits<double>::max(), high = -low;
    for (const auto &v : vertices)
      {
        const double s = v * direction;
        low = std::min(low, s);
        high = std::max(high, s);
      }
    return high - low;
  }

  template <int dim>
  CellFlow<dim> cell_flow(const Material &material, const double conductance, const double length,
                          const unsigned int degree)
  {
    CellFlow<dim> flow;
    const Tensor<1, dim> q = darcy_flux_vector<dim>(material);
    const double speed = q.norm();
    if (speed == 0)
      return flow;
    const double k = material.partition();
    flow.flux = k * q;
    flow.dispersion = dispersion_conductance<dim>(material);
    const double capacity = material.capacity();
    flow.velocity = flow.flux / capacity;
    const Tensor<1, dim> along = q / speed;
    const double g_along = conductance + along * (flow.dispersion * along);
    const double a = flow.velocity.norm();
    flow.crossing_rate = length > 0 ? a / length : 0.0;
    flow.peclet = g_along > 0 ? k * speed * length / g_along : std::numeric_limits<double>::infinity();
    const double h = length / degree;
    const double kappa = g_along / capacity;
    const double pe = kappa > 0 ? a * h / (2 * kappa) : std::numeric_limits<double>::infinity();
    // coth(Pe) - 1/Pe, by its series where the difference would cancel.
    const double xi = pe < 1e-3 ? pe / 3 - pe * pe * pe / 45 : pe > 20 ? 1 - 1 / pe : 1 / std::tanh(pe) - 1 / pe;
    flow.tau = h / (2 * a) * xi;
    return flow;
  }

  template Tensor<1, 1> darcy_flux_vector<1>(const Material &);
  template Tensor<1, 2> darcy_flux_vector<2>(const Material &);
  template Tensor<1, 3> darcy_flux_vector<3>(const Material &);
  template Tensor<2, 1> dispersion_conductance<1>(const Material &);
  template Tensor<2, 2> dispersion_conductance<2>(const Material &);
  template Tensor<2, 3> dispersion_conductance<3>(const Material &);
  template double length_along<1>(const std::vector<Point<1>> &, const Tensor<1, 1> &);
  template double length_along<2>(const std::vector<Point<2>> &, const Tensor<1, 2> &);
  template double length_along<3>(const std::vector<Point<3>> &, const Tensor<1, 3> &);
  template CellFlow<1> cell_flow<1>(const Material &, double, double, unsigned int);
  template CellFlow<2> cell_flow<2>(const Material &, double, double, unsigned int);
  template CellFlow<3> cell_flow<3>(const Material &, double, double, unsigned int);
} // namespace fickcast
