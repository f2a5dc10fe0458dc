#include "patch_mesh.h"

#include "post_error.h"

#include <vtkCellData.h>
#include <vtkCellType.h>
#include <vtkDataArray.h>
#include <vtkGenericCell.h>
#include <vtkIdList.h>
#include <vtkPointData.h>
#include <vtkPoints.h>

#include <algorithm>
#include <cmath>
#include <limits>

namespace fickcast::post
{
  namespace
  {
    unsigned int power(const unsigned int base, const unsigned int exponent)
    {
      unsigned int result = 1;
      for (unsigned int i = 0; i < exponent; ++i)
        result *= base;
      return result;
    }

    /// Lexicographic index of lattice node (i, j, k) with m+1 nodes per axis.
    unsigned int lattice(const unsigned int m, const unsigned int i, const unsigned int j, const unsigned int k)
    {
      return i + (m + 1) * (j + (m + 1) * k);
    }

    /// Corners of sub-cell (i, j, k) as lattice indices, in VTK's vertex order.
    std::vector<unsigned int> sub_cell_corners(const unsigned int dim, const unsigned int m, const unsigned int i,
                                               const unsigned int j, const unsigned int k)
    {
      if (dim == 1)
        return {lattice(m, i, 0, 0), lattice(m, i + 1, 0, 0)};
      std::vector<unsigned int> corners{lattice(m, i, j, k), lattice(m, i + 1, j, k), lattice(m, i + 1, j + 1, k),
                                        lattice(m, i, j + 1, k)};
      if (dim == 3)
        for (unsigned int c = 0; c < 4; ++c)
          corners.push_back(corners[c] + (m + 1) * (m + 1));
      return corners;
    }

    /// 1-D Lagrange polynomials on m+1 equally spaced nodes of [0,1]: values and slopes at s.
    void lagrange(const unsigned int m, const double s, double *value, double *slope)
    {
      for (unsigned int a = 0; a <= m; ++a)
        {
          const double ta = static_cast<double>(a) / m;
          double v = 1, d = 0;
          for (unsigned int b = 0; b <= m; ++b)
            if (b != a)
              v *= (s - static_cast<double>(b) / m) / (ta - static_cast<double>(b) / m);
          for (unsigned int skip = 0; skip <= m; ++skip)
            {
              if (skip == a)
                continue;
              double term = 1 / (ta - static_cast<double>(skip) / m);
              for (unsigned int b = 0; b <= m; ++b)
                if (b != a && b != skip)
                  term *= (s - static_cast<double>(b) / m) / (ta - static_cast<double>(b) / m);
              d += term;
            }
          value[a] = v;
          slope[a] = d;
        }
    }
  } // namespace

  void gauss_legendre(const unsigned int n, std::vector<double> &points, std::vector<double> &weights)
  {
    points.assign(n, 0);
    weights.assign(n, 0);
    for (unsigned int i = 0; i < n; ++i)
      {
        double x = std::cos(M_PI * (i + 0.75) / (n + 0.5));
        double derivative = 1;
        for (int iteration = 0; iteration < 100; ++iteration)
          {
            double p0 = 1, p1 = x;
            for (unsigned int k = 2; k <= n; ++k)
              {
                const double p2 = ((2.0 * k - 1) * x * p1 - (k - 1.0) * p0) / k;
                p0 = p1;
                p1 = p2;
              }
            derivative = n * (x * p1 - p0) / (x * x - 1);
            const double step = p1 / derivative;
            x -= step;
            if (std::abs(step) < 1e-16)
              break;
          }
        points[i] = 0.5 * (1 - x);
        weights[i] = 1.0 / ((1 - x * x) * derivative * derivative);
      }
  }

  PatchMesh::PatchMesh(vtkUnstructuredGrid *grid, const unsigned int dim, const unsigned int degree,
                       const std::string &file)
    : grid_(grid)
    , dim_(dim)
    , order_(std::max(1u, degree))
  {
    // deal.II writes cell data as point data constant on each patch; accept either.
    vtkDataArray *cell_region = grid->GetCellData()->GetArray("region");
    vtkDataArray *point_region = grid->GetPointData()->GetArray("region");
    if (cell_region == nullptr && point_region == nullptr)
      throw PostInputError(file, "a field `region` (material ids, cell or point data)", "none");

    const unsigned int m = order_;
    const vtkIdType per_points = power(m + 1, dim), per_cells = power(m, dim);
    const vtkIdType n_points = grid->GetNumberOfPoints(), n_cells = grid->GetNumberOfCells();
    patches_ = m <= 7 && n_points % per_points == 0 && n_cells == n_points / per_points * per_cells;
    auto ids = vtkSmartPointer<vtkIdList>::New();
    for (vtkIdType p = 0; patches_ && p < n_points / per_points; ++p)
      {
        vtkIdType cell = p * per_cells;
        for (unsigned int k = 0; k < (dim > 2 ? m : 1) && patches_; ++k)
          for (unsigned int j = 0; j < (dim > 1 ? m : 1) && patches_; ++j)
            for (unsigned int i = 0; i < m && patches_; ++i, ++cell)
              {
                grid->GetCellPoints(cell, ids);
                const auto corners = sub_cell_corners(dim, m, i, j, k);
                patches_ = static_cast<std::size_t>(ids->GetNumberOfIds()) == corners.size();
                for (std::size_t c = 0; patches_ && c < corners.size(); ++c)
                  patches_ = ids->GetId(static_cast<vtkIdType>(c)) == p * per_points + corners[c];
              }
      }
    if (patches_)
      for (vtkIdType p = 0; p < n_points / per_points; ++p)
        {
          PatchElement element;
          for (vtkIdType n = 0; n < per_points; ++n)
            element.nodes.push_back(p * per_points + n);
          elements_.push_back(std::move(element));
        }
    else
      {
        order_ = 1;
        static const int quad_order[4] = {0, 1, 3, 2}, hex_order[8] = {0, 1, 3, 2, 4, 5, 7, 6};
        const int expected = dim == 1 ? VTK_LINE : dim == 2 ? VTK_QUAD : VTK_HEXAHEDRON;
        for (vtkIdType c = 0; c < n_cells; ++c)
          {
            if (grid->GetCellType(c) != expected)
              throw PostInputError(file,
                                   "lines, quadrilaterals or hexahedra as in a " + std::to_string(dim) + "-D case",
                                   "VTK cell type " + std::to_string(grid->GetCellType(c)));
            grid->GetCellPoints(c, ids);
            PatchElement element;
            for (vtkIdType n = 0; n < ids->GetNumberOfIds(); ++n)
              element.nodes.push_back(ids->GetId(dim == 1 ? n : dim == 2 ? quad_order[n] : hex_order[n]));
            elements_.push_back(std::move(element));
          }
      }
    const vtkIdType cells_per_element = patches_ ? per_cells : 1;
    for (std::size_t e = 0; e < elements_.size(); ++e)
      {
        const double id = cell_region ? cell_region->GetComponent(static_cast<vtkIdType>(e) * cells_per_element, 0)
                                      : point_region->GetComponent(elements_[e].nodes.front(), 0);
        elements_[e].region = static_cast<int>(std::lround(id));
        if (elements_[e].region < 0)
          throw PostInputError(file, "non-negative region ids", std::to_string(elements_[e].region));
      }
  }

  std::string PatchMesh::description() const
  {
    return patches_ ? "degree-" + std::to_string(order_) + " Lagrange patches" : "multilinear cells";
  }

  bool PatchMesh::locate(const std::array<double, 3> &point, std::size_t &element, std::array<double, 3> &xi) const
  {
    if (locator_ == nullptr)
      {
        unit_scale_ = grid_->GetLength() > 0 ? 1 / grid_->GetLength() : 1.0;
        auto points = vtkSmartPointer<vtkPoints>::New();
        points->SetDataTypeToDouble();
        points->SetNumberOfPoints(grid_->GetNumberOfPoints());
        for (vtkIdType i = 0; i < grid_->GetNumberOfPoints(); ++i)
          {
            double p[3];
            grid_->GetPoint(i, p);
            points->SetPoint(i, p[0] * unit_scale_, p[1] * unit_scale_, p[2] * unit_scale_);
          }
        unit_grid_ = vtkSmartPointer<vtkUnstructuredGrid>::New();
        unit_grid_->ShallowCopy(grid_);
        unit_grid_->SetPoints(points);
        locator_ = vtkSmartPointer<vtkStaticCellLocator>::New();
        locator_->SetDataSet(unit_grid_);
        locator_->BuildLocator();
      }
    auto cell = vtkSmartPointer<vtkGenericCell>::New();
    double pcoords[3], weights[8];
    const double tolerance = 1e-7; // of the unit diagonal
    double x[3] = {point[0] * unit_scale_, point[1] * unit_scale_, point[2] * unit_scale_};
    const vtkIdType id = locator_->FindCell(x, tolerance * tolerance, cell, pcoords, weights);
    if (id < 0)
      return false;
    const unsigned int m = order_;
    const vtkIdType per_cells = patches_ ? power(m, dim_) : 1;
    element = static_cast<std::size_t>(id / per_cells);
    const auto local = static_cast<unsigned int>(id % per_cells);
    const unsigned int sub[3] = {local % m, (local / m) % m, local / (m * m)};
    for (unsigned int d = 0; d < 3; ++d)
      xi[d] = d < dim_ ? std::clamp((sub[d] + pcoords[d]) / m, 0.0, 1.0) : 0.0;
    if (!patches_)
      for (unsigned int d = 0; d < dim_; ++d)
        xi[d] = std::clamp(pcoords[d], 0.0, 1.0);
    return true;
  }

  bool PatchMesh::locate_beside(const std::array<double, 3> &point, const std::array<double, 3> &inside_point,
                                std::size_t &element, std::array<double, 3> &xi) const
  {
    std::array<double, 3> unused;
    if (!locate(inside_point, element, unused))
      return false;
    const unsigned int m = order_;
    const vtkIdType per_cells = patches_ ? power(m, dim_) : 1;
    const double tolerance = 1e-7 * grid_->GetLength();
    auto cell = vtkSmartPointer<vtkGenericCell>::New();
    double x[3] = {point[0], point[1], point[2]};
    double best = std::numeric_limits<double>::infinity();
    for (vtkIdType local = 0; local < per_cells; ++local)
      {
        grid_->GetCell(static_cast<vtkIdType>(element) * per_cells + local, cell);
        double closest[3], pcoords[3], distance2 = 0, weights[8];
        int sub_id = 0;
        if (cell->EvaluatePosition(x, closest, sub_id, pcoords, distance2, weights) < 0 || !(distance2 < best))
          continue;
        best = distance2;
        const auto l = static_cast<unsigned int>(local);
        const unsigned int sub[3] = {l % m, (l / m) % m, l / (m * m)};
        for (unsigned int d = 0; d < 3; ++d)
          xi[d] = d < dim_ ? std::clamp(patches_ ? (sub[d] + pcoords[d]) / m : pcoords[d], 0.0, 1.0) : 0.0;
      }
    return best <= tolerance * tolerance;
  }

  void PatchMesh::shape_gradients(const std::array<double, 3> &xi, std::vector<double> &values,
                                  std::vector<std::array<double, 3>> &gradients) const
  {
    const unsigned int m = order_, per_axis = m + 1, n = power(per_axis, dim_);
    double v[3][8], s[3][8];
    for (unsigned int d = 0; d < dim_; ++d)
      lagrange(m, xi[d], v[d], s[d]);
    values.assign(n, 1.0);
    gradients.assign(n, {0, 0, 0});
    for (unsigned int a = 0; a < n; ++a)
      {
        const unsigned int ai[3] = {a % per_axis, (a / per_axis) % per_axis, a / (per_axis * per_axis)};
        for (unsigned int d = 0; d < dim_; ++d)
          values[a] *= v[d][ai[d]];
        for (unsigned int g = 0; g < dim_; ++g)
          {
            double derivative = 1;
            for (unsigned int d = 0; d < dim_; ++d)
              derivative *= d == g ? s[d][ai[d]] : v[d][ai[d]];
            gradients[a][g] = derivative;
          }
      }
  }

  void PatchMesh::shape_values(const std::array<double, 3> &xi, std::vector<double> &values) const
  {
    std::vector<std::array<double, 3>> unused;
    shape_gradients(xi, values, unused);
  }
} // namespace fickcast::post
