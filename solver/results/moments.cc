#include "results/moments.h"

#include <deal.II/base/mpi.h>
#include <deal.II/base/quadrature_lib.h>
#include <deal.II/fe/fe_values.h>

namespace fickcast
{
  using namespace dealii;

  template <int dim>
  MomentsRecord spread_moments(const FieldView<dim> &field, const FieldVector &u, const double time)
  {
    const QGauss<dim> quadrature(field.degree() + 2);
    FEValues<dim> fe_values(*field.mapping, field.dof_handler->get_fe(), quadrature,
                            update_values | update_quadrature_points | update_JxW_values);
    std::vector<double> values(quadrature.size());
    // sums: amount, first moments (dim), second moment
    std::vector<double> sums(dim + 2, 0.0);
    for (const auto &cell : field.dof_handler->active_cell_iterators())
      {
        if (!cell->is_locally_owned())
          continue;
        fe_values.reinit(cell);
        fe_values.get_function_values(u, values);
        const double capacity = field.capacity(cell->material_id());
        for (unsigned int q = 0; q < quadrature.size(); ++q)
          {
            const auto &p = fe_values.quadrature_point(q);
            const double w = capacity * values[q] * field.coordinate_weight(p) * fe_values.JxW(q);
            sums[0] += w;
            for (int d = 0; d < dim; ++d)
              sums[1 + d] += p[d] * w;
            sums[dim + 1] += p.norm_square() * w;
          }
      }
    Utilities::MPI::sum(sums, field.communicator, sums);
    MomentsRecord record;
    record.time = time;
    record.amount = sums[0];
    if (sums[0] == 0)
      return record;
    double mean_square = 0;
    for (int d = 0; d < dim; ++d)
      {
        record.mean[d] = sums[1 + d] / sums[0];
        mean_square += record.mean[d] * record.mean[d];
      }
    record.variance = sums[dim + 1] / sums[0] - mean_square;
    return record;
  }

  template MomentsRecord spread_moments<1>(const FieldView<1> &, const FieldVector &, double);
  template MomentsRecord spread_moments<2>(const FieldView<2> &, const FieldVector &, double);
  template MomentsRecord spread_moments<3>(const FieldView<3> &, const FieldVector &, double);
} // namespace fickcast
