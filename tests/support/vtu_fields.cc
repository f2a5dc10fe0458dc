#include "vtu_fields.h"

#include <vtkCell.h>
#include <vtkCellData.h>
#include <vtkDataArray.h>
#include <vtkIdList.h>
#include <vtkPointData.h>
#include <vtkSmartPointer.h>
#include <vtkUnstructuredGrid.h>
#include <vtkXMLPUnstructuredGridReader.h>
#include <vtkXMLUnstructuredGridReader.h>

#include <cmath>
#include <fstream>
#include <regex>
#include <sstream>
#include <stdexcept>

namespace fickcast::testing
{
  const std::vector<double> &FieldSnapshot::array(const std::string &name) const
  {
    const auto it = point_data.find(name);
    if (it == point_data.end())
      throw std::runtime_error("no point data '" + name + "'");
    return it->second;
  }

  double FieldSnapshot::integrate(const std::vector<double> &values) const
  {
    auto sub = [](const std::array<double, 3> &a, const std::array<double, 3> &b) {
      return std::array<double, 3>{a[0] - b[0], a[1] - b[1], a[2] - b[2]};
    };
    auto cross = [](const std::array<double, 3> &a, const std::array<double, 3> &b) {
      return std::array<double, 3>{a[1] * b[2] - a[2] * b[1], a[2] * b[0] - a[0] * b[2], a[0] * b[1] - a[1] * b[0]};
    };
    auto norm = [](const std::array<double, 3> &a) { return std::sqrt(a[0] * a[0] + a[1] * a[1] + a[2] * a[2]); };
    double total = 0;
    for (const auto &cell : cells)
      {
        double mean = 0;
        for (const long long id : cell)
          mean += values[static_cast<std::size_t>(id)];
        mean /= static_cast<double>(cell.size());
        double measure = 0;
        const auto &p0 = points[static_cast<std::size_t>(cell[0])];
        if (cell.size() == 2)
          measure = norm(sub(points[static_cast<std::size_t>(cell[1])], p0));
        else if (cell.size() == 4)
          {
            // VTK quad: 0,1,2,3 counter-clockwise; axis-aligned patches: two triangles.
            const auto &p1 = points[static_cast<std::size_t>(cell[1])];
            const auto &p2 = points[static_cast<std::size_t>(cell[2])];
            const auto &p3 = points[static_cast<std::size_t>(cell[3])];
            measure = 0.5 * norm(cross(sub(p1, p0), sub(p2, p0))) + 0.5 * norm(cross(sub(p2, p0), sub(p3, p0)));
          }
        else if (cell.size() == 8)
          {
            const auto &p1 = points[static_cast<std::size_t>(cell[1])];
            const auto &p3 = points[static_cast<std::size_t>(cell[3])];
            const auto &p4 = points[static_cast<std::size_t>(cell[4])];
            const auto a = sub(p1, p0), b = sub(p3, p0), c = sub(p4, p0);
            const auto axb = cross(a, b);
            measure = std::abs(axb[0] * c[0] + axb[1] * c[1] + axb[2] * c[2]); // parallelepiped patches
          }
        else
          throw std::runtime_error("unexpected cell with " + std::to_string(cell.size()) + " points");
        total += mean * measure;
      }
    return total;
  }

  std::vector<std::pair<double, std::string>> read_pvd(const std::string &pvd_path)
  {
    std::ifstream in(pvd_path);
    if (!in)
      throw std::runtime_error("cannot open " + pvd_path);
    std::stringstream buffer;
    buffer << in.rdbuf();
    const std::string text = buffer.str();
    const std::regex entry(R"DELIM(<DataSet\s+timestep="([^"]+)"[^>]*file="([^"]+)")DELIM");
    std::vector<std::pair<double, std::string>> records;
    const std::string folder = pvd_path.substr(0, pvd_path.find_last_of('/') + 1);
    for (auto it = std::sregex_iterator(text.begin(), text.end(), entry); it != std::sregex_iterator(); ++it)
      records.emplace_back(std::stod((*it)[1].str()), folder + (*it)[2].str());
    return records;
  }

  FieldSnapshot read_fields(const std::string &path, const double time)
  {
    vtkSmartPointer<vtkUnstructuredGrid> grid;
    if (path.size() > 5 && path.compare(path.size() - 5, 5, ".pvtu") == 0)
      {
        auto reader = vtkSmartPointer<vtkXMLPUnstructuredGridReader>::New();
        reader->SetFileName(path.c_str());
        reader->Update();
        grid = reader->GetOutput();
      }
    else
      {
        auto reader = vtkSmartPointer<vtkXMLUnstructuredGridReader>::New();
        reader->SetFileName(path.c_str());
        reader->Update();
        grid = reader->GetOutput();
      }
    if (grid == nullptr || grid->GetNumberOfPoints() == 0)
      throw std::runtime_error("no points read from " + path);
    FieldSnapshot snapshot;
    snapshot.time = time;
    const vtkIdType n_points = grid->GetNumberOfPoints();
    snapshot.points.resize(static_cast<std::size_t>(n_points));
    for (vtkIdType i = 0; i < n_points; ++i)
      grid->GetPoint(i, snapshot.points[static_cast<std::size_t>(i)].data());
    vtkPointData *data = grid->GetPointData();
    for (int a = 0; a < data->GetNumberOfArrays(); ++a)
      {
        vtkDataArray *array = data->GetArray(a);
        if (array == nullptr || array->GetName() == nullptr)
          continue;
        std::vector<double> values(static_cast<std::size_t>(n_points));
        for (vtkIdType i = 0; i < n_points; ++i)
          values[static_cast<std::size_t>(i)] = array->GetComponent(i, 0);
        snapshot.point_data[array->GetName()] = values;
      }
    auto ids = vtkSmartPointer<vtkIdList>::New();
    for (vtkIdType c = 0; c < grid->GetNumberOfCells(); ++c)
      {
        grid->GetCellPoints(c, ids);
        std::vector<long long> cell;
        for (vtkIdType k = 0; k < ids->GetNumberOfIds(); ++k)
          cell.push_back(ids->GetId(k));
        snapshot.cells.push_back(cell);
      }
    return snapshot;
  }

  std::vector<FieldSnapshot> read_all_fields(const std::string &pvd_path)
  {
    std::vector<FieldSnapshot> snapshots;
    for (const auto &[time, file] : read_pvd(pvd_path))
      snapshots.push_back(read_fields(file, time));
    return snapshots;
  }
} // namespace fickcast::testing
