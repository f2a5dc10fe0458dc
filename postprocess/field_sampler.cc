#include "field_sampler.h"

#include "csv_table.h"
#include "field_series.h"
#include "post_error.h"

#include "patch_mesh.h"

#include "case/units.h"

#include <vtkCellData.h>
#include <vtkDataArray.h>
#include <vtkPointData.h>

#include <algorithm>
#include <cmath>
#include <limits>

namespace fickcast::post
{
  std::vector<Point> line_points(const Point &from, const Point &to, const unsigned int n)
  {
    std::vector<Point> points;
    for (unsigned int i = 0; i < n; ++i)
      {
        const double s = n > 1 ? static_cast<double>(i) / (n - 1) : 0.0;
        points.push_back(
          {from[0] + s * (to[0] - from[0]), from[1] + s * (to[1] - from[1]), from[2] + s * (to[2] - from[2])});
      }
    return points;
  }

  Point parse_point(const std::string &text, const unsigned int dimension, const std::string &where)
  {
    const auto cells = split_csv_line(text);
    Point point{0, 0, 0};
    const std::string expected = std::to_string(dimension) + " coordinate" + (dimension > 1 ? "s" : "") +
                                 " separated by commas, in m or with a length unit (the case is " +
                                 std::to_string(dimension) + "-D)";
    if (cells.size() != dimension)
      throw PostInputError(where, expected, "'" + text + "'");
    // Each coordinate: a number and an optional unit; bare numbers take the unit written after
    // the last coordinate (`0.1, 0.2 cm`), else metres.
    std::vector<std::string> numbers(dimension), units(dimension);
    for (unsigned int d = 0; d < dimension; ++d)
      {
        const auto split = cells[d].find_first_not_of("0123456789.eE+-");
        numbers[d] = cells[d].substr(0, split);
        if (split != std::string::npos)
          units[d] = cells[d].substr(split);
        while (!units[d].empty() && units[d].front() == ' ')
          units[d].erase(units[d].begin());
        while (!numbers[d].empty() && numbers[d].back() == ' ')
          numbers[d].pop_back();
      }
    const std::string shared_unit = units[dimension - 1];
    for (unsigned int d = 0; d < dimension; ++d)
      {
        double number = 0;
        if (!parse_number(numbers[d], number) || !std::isfinite(number))
          throw PostInputError(where, expected, "'" + text + "'");
        const std::string unit = units[d].empty() ? shared_unit : units[d];
        if (unit.empty())
          point[d] = number;
        else
          try
            {
              point[d] = UnitSystem::instance().to_si(number, unit, "m");
            }
          catch (const UnitError &)
            {
              throw PostInputError(where, "a length unit (m, cm, mm, um, nm, ft, in)",
                                   "'" + unit + "' in '" + text + "'");
            }
      }
    return point;
  }

  Samples sample_fields(vtkUnstructuredGrid *grid, const std::vector<Point> &points,
                        const std::vector<std::string> &fields, const unsigned int dimension, const unsigned int degree,
                        const std::string &file, const std::vector<Point> &sides)
  {
    for (const auto &name : fields)
      require_field(grid, name, file);
    Samples samples;
    samples.points = points;
    for (const auto &p : points)
      samples.distance.push_back(std::sqrt((p[0] - points[0][0]) * (p[0] - points[0][0]) +
                                           (p[1] - points[0][1]) * (p[1] - points[0][1]) +
                                           (p[2] - points[0][2]) * (p[2] - points[0][2])));

    const PatchMesh mesh(grid, dimension, degree, file);
    std::vector<std::size_t> element(points.size());
    std::vector<std::vector<double>> shape(points.size());
    samples.inside.resize(points.size());
    for (std::size_t i = 0; i < points.size(); ++i)
      {
        std::array<double, 3> xi;
        samples.inside[i] = i < sides.size() ? mesh.locate_beside(points[i], sides[i], element[i], xi)
                                             : mesh.locate(points[i], element[i], xi);
        if (samples.inside[i])
          mesh.shape_values(xi, shape[i]);
      }

    const std::vector<std::string> names = fields.empty() ? field_names(grid) : fields;
    const char *axes[3] = {".x", ".y", ".z"};
    for (const auto &name : names)
      {
        vtkDataArray *array = grid->GetPointData()->GetArray(name.c_str());
        const bool cell_data = array == nullptr;
        if (cell_data)
          array = grid->GetCellData()->GetArray(name.c_str());
        if (array == nullptr)
          continue;
        const int components = array->GetNumberOfComponents();
        const int kept = components == 1 ? 1 : std::min<int>(components, static_cast<int>(dimension));
        for (int c = 0; c < kept; ++c)
          {
            samples.columns.push_back(components == 1 ? name : name + axes[c]);
            std::vector<double> values(points.size(), std::numeric_limits<double>::quiet_NaN());
            for (std::size_t i = 0; i < points.size(); ++i)
              {
                if (!samples.inside[i])
                  continue;
                const auto &nodes = mesh.elements()[element[i]].nodes;
                if (cell_data)
                  {
                    const auto per_element = static_cast<vtkIdType>(grid->GetNumberOfCells() / mesh.elements().size());
                    values[i] = array->GetComponent(static_cast<vtkIdType>(element[i]) * per_element, c);
                    continue;
                  }
                double value = 0;
                for (std::size_t a = 0; a < nodes.size(); ++a)
                  value += shape[i][a] * array->GetComponent(nodes[a], c);
                values[i] = value;
              }
            samples.values.push_back(std::move(values));
          }
      }
    return samples;
  }
} // namespace fickcast::post
