#include "region_integrator.h"

#include "field_series.h"
#include "patch_mesh.h"
#include "post_error.h"

#include <vtkDataArray.h>
#include <vtkPointData.h>

#include <algorithm>
#include <array>
#include <cmath>

namespace fickcast::post
{
  namespace
  {
    double coordinate_weight(const std::string &coordinates, const double r)
    {
      if (coordinates == "cylinder" || coordinates == "axisymmetric")
        return 2 * M_PI * r;
      if (coordinates == "sphere")
        return 4 * M_PI * r * r;
      return 1;
    }

    double determinant(const unsigned int dim, const double j[3][3])
    {
      if (dim == 1)
        return j[0][0];
      if (dim == 2)
        return j[0][0] * j[1][1] - j[0][1] * j[1][0];
      return j[0][0] * (j[1][1] * j[2][2] - j[1][2] * j[2][1]) - j[0][1] * (j[1][0] * j[2][2] - j[1][2] * j[2][0]) +
             j[0][2] * (j[1][0] * j[2][1] - j[1][1] * j[2][0]);
    }
  } // namespace

  RegionIntegrals integrate_regions(vtkUnstructuredGrid *grid, const RunSummary &summary,
                                    const std::vector<std::string> &fields, const std::string &file)
  {
    const unsigned int dim = summary.dimension;
    std::vector<vtkDataArray *> arrays;
    for (const auto &name : fields)
      {
        require_field(grid, name, file);
        vtkDataArray *array = grid->GetPointData()->GetArray(name.c_str());
        if (array == nullptr || array->GetNumberOfComponents() != 1)
          throw PostInputError(file, "a scalar point field to integrate", "'" + name + "'");
        arrays.push_back(array);
      }
    const PatchMesh mesh(grid, dim, summary.degree, file);
    const unsigned int m = mesh.order();
    const unsigned int q1 = 2 * m + 2;

    RegionIntegrals result;
    result.method = mesh.description() + ", Gauss-Legendre " + std::to_string(q1) + " points per axis";
    int n_regions = static_cast<int>(summary.regions.size());
    for (const auto &element : mesh.elements())
      n_regions = std::max(n_regions, element.region + 1);
    for (int r = 0; r < n_regions; ++r)
      result.regions.push_back(summary.region_name(r));
    result.fields = fields;
    result.measure.assign(static_cast<std::size_t>(n_regions), 0.0);
    result.values.assign(fields.size(), std::vector<double>(static_cast<std::size_t>(n_regions), 0.0));

    // Tensor-product Gauss rule on [0,1]^dim, shape values and gradients at its points.
    std::vector<double> gp, gw;
    gauss_legendre(q1, gp, gw);
    unsigned int n_q = 1;
    for (unsigned int d = 0; d < dim; ++d)
      n_q *= q1;
    std::vector<std::vector<double>> shape(n_q);
    std::vector<std::vector<std::array<double, 3>>> grad(n_q);
    std::vector<double> qweight(n_q, 1.0);
    for (unsigned int q = 0; q < n_q; ++q)
      {
        const unsigned int qi[3] = {q % q1, (q / q1) % q1, q / (q1 * q1)};
        std::array<double, 3> xi{0, 0, 0};
        for (unsigned int d = 0; d < dim; ++d)
          {
            xi[d] = gp[qi[d]];
            qweight[q] *= gw[qi[d]];
          }
        mesh.shape_gradients(xi, shape[q], grad[q]);
      }

    const std::size_t n_nodes = shape.front().size();
    std::vector<std::array<double, 3>> x(n_nodes);
    std::vector<std::vector<double>> f(arrays.size(), std::vector<double>(n_nodes));
    for (const auto &element : mesh.elements())
      {
        for (std::size_t a = 0; a < n_nodes; ++a)
          {
            grid->GetPoint(element.nodes[a], x[a].data());
            for (std::size_t k = 0; k < arrays.size(); ++k)
              f[k][a] = arrays[k]->GetComponent(element.nodes[a], 0);
          }
        const auto r = static_cast<std::size_t>(element.region);
        for (unsigned int q = 0; q < n_q; ++q)
          {
            double jacobian[3][3] = {{0, 0, 0}, {0, 0, 0}, {0, 0, 0}};
            double radius = 0;
            for (std::size_t a = 0; a < n_nodes; ++a)
              {
                radius += shape[q][a] * x[a][0];
                for (unsigned int i = 0; i < dim; ++i)
                  for (unsigned int j = 0; j < dim; ++j)
                    jacobian[i][j] += x[a][i] * grad[q][a][j];
              }
            const double jxw =
              std::abs(determinant(dim, jacobian)) * qweight[q] * coordinate_weight(summary.coordinates, radius);
            result.measure[r] += jxw;
            for (std::size_t k = 0; k < arrays.size(); ++k)
              {
                double value = 0;
                for (std::size_t a = 0; a < n_nodes; ++a)
                  value += shape[q][a] * f[k][a];
                result.values[k][r] += value * jxw;
              }
          }
      }
    return result;
  }
} // namespace fickcast::post
