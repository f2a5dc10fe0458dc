#include "results_comparison.h"

#include "field_series.h"
#include "patch_mesh.h"
#include "post_error.h"
#include "run_summary.h"
#include "time_units.h"

#include <vtkCellData.h>
#include <vtkDataArray.h>
#include <vtkIdList.h>
#include <vtkPointData.h>
#include <vtkSmartPointer.h>

#include <algorithm>
#include <cmath>

namespace fickcast::post
{
  namespace
  {
    bool same_points(vtkUnstructuredGrid *a, vtkUnstructuredGrid *b)
    {
      if (a->GetNumberOfPoints() != b->GetNumberOfPoints() || a->GetNumberOfCells() != b->GetNumberOfCells())
        return false;
      const double tolerance = 1e-6 * std::max(a->GetLength(), 1e-300);
      double pa[3], pb[3];
      for (vtkIdType i = 0; i < a->GetNumberOfPoints(); ++i)
        {
          a->GetPoint(i, pa);
          b->GetPoint(i, pb);
          if (std::abs(pa[0] - pb[0]) > tolerance || std::abs(pa[1] - pb[1]) > tolerance ||
              std::abs(pa[2] - pb[2]) > tolerance)
            return false;
        }
      return true;
    }

    /// Largest |A - B| of one array pair over @p n tuples; @p location gives each tuple's point.
    template <typename Location>
    void largest_difference(vtkDataArray *a, vtkDataArray *b, const vtkIdType n, const std::vector<bool> *use,
                            Location location, FieldDifference &row)
    {
      const int components = std::min(a->GetNumberOfComponents(), b->GetNumberOfComponents());
      for (vtkIdType i = 0; i < n; ++i)
        {
          if (use != nullptr && !(*use)[static_cast<std::size_t>(i)])
            continue;
          double difference = 0, size = 0;
          for (int c = 0; c < components; ++c)
            {
              const double va = a->GetComponent(i, c), vb = b->GetComponent(i, c);
              difference += (va - vb) * (va - vb);
              size += va * va;
            }
          difference = std::sqrt(difference);
          size = std::sqrt(size);
          ++row.compared;
          row.magnitude = std::max(row.magnitude, size);
          if (row.compared == 1 || difference > row.largest)
            {
              row.largest = difference;
              row.where = location(i);
            }
        }
    }
  } // namespace

  std::string field_unit(const std::string &name, const std::string &concentration_unit)
  {
    if (name == "concentration" || name == "reference_concentration" || name == "amount_per_volume")
      return concentration_unit;
    if (name == "flux")
      {
        const auto slash = concentration_unit.rfind("/m3");
        if (slash != std::string::npos)
          return concentration_unit.substr(0, slash) + "/m2/s";
        return concentration_unit == "1" ? "m/s" : concentration_unit + " m/s";
      }
    if (name == "effective_diffusivity")
      return "m2/s";
    return "1";
  }

  Comparison compare_results(const std::string &a, const std::string &b, const std::vector<std::string> &fields)
  {
    const RunSummary summary_a = read_run_summary(a + "/summary.json");
    const RunSummary summary_b = read_run_summary(b + "/summary.json");
    if (summary_a.dimension != summary_b.dimension)
      throw PostInputError(summary_b.path, "a " + std::to_string(summary_a.dimension) + "-D case as in " + a,
                           std::to_string(summary_b.dimension) + "-D");
    const FieldSeries series_a(a), series_b(b);
    if (series_a.times().size() != series_b.times().size())
      throw PostInputError(series_b.pvd_path(),
                           std::to_string(series_a.times().size()) + " output times as in " + series_a.pvd_path(),
                           std::to_string(series_b.times().size()));

    Comparison comparison;
    for (std::size_t k = 0; k < series_a.times().size(); ++k)
      {
        const double time = series_a.times()[k].time;
        const std::size_t kb = series_b.find(time);
        if (kb == FieldSeries::npos)
          throw PostInputError(series_b.pvd_path(), "output time " + format_number(time, 8) + " s as in " + a,
                               "no such time");
        const auto grid_a = series_a.load(k);
        const auto grid_b = series_b.load(kb);
        const std::vector<std::string> names = fields.empty() ? field_names(grid_a) : fields;
        for (const auto &name : names)
          require_field(grid_a, name, series_a.times()[k].file);
        for (const auto &name : names)
          require_field(grid_b, name, series_b.times()[kb].file);

        const bool same = same_points(grid_a, grid_b);
        comparison.method = same ? "same points" : "B interpolated at the points of A";
        auto point_of = [&](vtkIdType i) {
          Point p;
          grid_a->GetPoint(i, p.data());
          return p;
        };
        auto cell_point = [&](vtkIdType c) {
          auto ids = vtkSmartPointer<vtkIdList>::New();
          grid_a->GetCellPoints(c, ids);
          return point_of(ids->GetId(0));
        };

        vtkSmartPointer<vtkDataSet> resampled;
        std::vector<bool> inside;
        if (!same)
          {
            std::vector<Point> points(static_cast<std::size_t>(grid_a->GetNumberOfPoints()));
            for (vtkIdType i = 0; i < grid_a->GetNumberOfPoints(); ++i)
              points[static_cast<std::size_t>(i)] = point_of(i);
            // Like with like: each point of A is read in B on the side of A's own cell (the cell
            // holding its centre), so values that jump at region interfaces and gradients that
            // jump across faces compare each side with the same side.
            const PatchMesh mesh_a(grid_a, summary_a.dimension, summary_a.degree, series_a.times()[k].file);
            std::vector<Point> sides(points.size());
            for (const auto &element : mesh_a.elements())
              {
                Point centre{0, 0, 0};
                for (const vtkIdType node : element.nodes)
                  for (unsigned int d = 0; d < 3; ++d)
                    centre[d] += points[static_cast<std::size_t>(node)][d] / static_cast<double>(element.nodes.size());
                for (const vtkIdType node : element.nodes)
                  sides[static_cast<std::size_t>(node)] = centre;
              }
            const Samples samples = sample_fields(grid_b, points, names, summary_b.dimension, summary_b.degree,
                                                  series_b.times()[kb].file, sides);
            inside = samples.inside;
            // Rebuild B's arrays at A's points from the samples (vector components in order).
            resampled = vtkSmartPointer<vtkUnstructuredGrid>::New();
            for (const auto &name : names)
              {
                vtkDataArray *pa = grid_a->GetPointData()->GetArray(name.c_str());
                if (pa == nullptr)
                  pa = grid_a->GetCellData()->GetArray(name.c_str());
                vtkSmartPointer<vtkDataArray> array;
                array.TakeReference(pa->NewInstance());
                array->SetName(name.c_str());
                array->SetNumberOfComponents(pa->GetNumberOfComponents());
                array->SetNumberOfTuples(grid_a->GetNumberOfPoints());
                for (int c = 0; c < pa->GetNumberOfComponents(); ++c)
                  {
                    const std::string column = pa->GetNumberOfComponents() == 1 ? name
                                                                                : name + std::string(c == 0   ? ".x"
                                                                                                     : c == 1 ? ".y"
                                                                                                              : ".z");
                    const auto it = std::find(samples.columns.begin(), samples.columns.end(), column);
                    for (vtkIdType i = 0; i < grid_a->GetNumberOfPoints(); ++i)
                      array->SetComponent(i, c,
                                          it == samples.columns.end()
                                            ? 0.0
                                            : samples.values[static_cast<std::size_t>(it - samples.columns.begin())]
                                                            [static_cast<std::size_t>(i)]);
                  }
                resampled->GetPointData()->AddArray(array);
              }
          }

        for (const auto &name : names)
          {
            FieldDifference row;
            row.time = time;
            row.field = name;
            row.unit = field_unit(name, summary_a.unit_concentration);
            vtkDataArray *pa = grid_a->GetPointData()->GetArray(name.c_str());
            const bool cell_data = pa == nullptr;
            if (same)
              {
                if (cell_data)
                  largest_difference(grid_a->GetCellData()->GetArray(name.c_str()),
                                     grid_b->GetCellData()->GetArray(name.c_str()), grid_a->GetNumberOfCells(), nullptr,
                                     cell_point, row);
                else
                  largest_difference(pa, grid_b->GetPointData()->GetArray(name.c_str()), grid_a->GetNumberOfPoints(),
                                     nullptr, point_of, row);
              }
            else
              {
                if (cell_data)
                  {
                    // Cell data of A at its points: the value of the cell each point belongs to.
                    vtkDataArray *ca = grid_a->GetCellData()->GetArray(name.c_str());
                    vtkSmartPointer<vtkDataArray> at_points;
                    at_points.TakeReference(ca->NewInstance());
                    at_points->SetNumberOfComponents(ca->GetNumberOfComponents());
                    at_points->SetNumberOfTuples(grid_a->GetNumberOfPoints());
                    auto ids = vtkSmartPointer<vtkIdList>::New();
                    for (vtkIdType c = 0; c < grid_a->GetNumberOfCells(); ++c)
                      {
                        grid_a->GetCellPoints(c, ids);
                        for (vtkIdType j = 0; j < ids->GetNumberOfIds(); ++j)
                          for (int k2 = 0; k2 < ca->GetNumberOfComponents(); ++k2)
                            at_points->SetComponent(ids->GetId(j), k2, ca->GetComponent(c, k2));
                      }
                    largest_difference(at_points, resampled->GetPointData()->GetArray(name.c_str()),
                                       grid_a->GetNumberOfPoints(), &inside, point_of, row);
                  }
                else
                  largest_difference(pa, resampled->GetPointData()->GetArray(name.c_str()), grid_a->GetNumberOfPoints(),
                                     &inside, point_of, row);
              }
            row.relative = row.magnitude > 0 ? row.largest / row.magnitude : row.largest;
            comparison.rows.push_back(row);
          }
      }
    return comparison;
  }
} // namespace fickcast::post
