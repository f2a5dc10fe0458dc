// Reading the fields fickcast writes (PVD index, VTU or PVTU pieces) with the VTK library.
#pragma once

#include <array>
#include <map>
#include <string>
#include <vector>

namespace fickcast::testing
{
  /// One output time as read back from disk: points, point data, and cell connectivity.
  struct FieldSnapshot
  {
    double time = 0;
    std::vector<std::array<double, 3>> points;
    std::map<std::string, std::vector<double>> point_data; ///< scalar arrays (first component)
    std::vector<std::vector<long long>> cells;             ///< point ids of each cell

    const std::vector<double> &array(const std::string &name) const;
    /// Integral over the mesh of @p values (one per point), by linear interpolation per cell
    /// (lines, quadrilaterals, hexahedra of the output patches).
    double integrate(const std::vector<double> &values) const;
  };

  /// (time, file) records of a PVD index, in file order.
  std::vector<std::pair<double, std::string>> read_pvd(const std::string &pvd_path);

  /// Reads the VTU or PVTU file @p path (relative names resolved next to the PVD).
  FieldSnapshot read_fields(const std::string &path, double time);

  /// All snapshots listed by @p pvd_path.
  std::vector<FieldSnapshot> read_all_fields(const std::string &pvd_path);
} // namespace fickcast::testing
