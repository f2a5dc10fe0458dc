// The fields a run wrote: the PVD index of output times and the VTU/PVTU file of each, via VTK.
#pragma once

#include <vtkSmartPointer.h>
#include <vtkUnstructuredGrid.h>

#include <cstddef>
#include <string>
#include <vector>

namespace fickcast::post
{
  /// One output time of the PVD index: time in seconds and the file (absolute path).
  struct OutputTime
  {
    double time = 0;
    std::string file;
  };

  /**
   * The output times of a results folder (`fields/fields.pvd`) and the loading of each one's
   * VTU (one rank) or PVTU (several ranks, pieces appended in order) with VTK's XML readers.
   */
  class FieldSeries
  {
  public:
    /// Reads RESULTS/fields/fields.pvd; PostInputError if it is missing or malformed.
    explicit FieldSeries(const std::string &results_folder);

    const std::vector<OutputTime> &times() const { return times_; }
    const std::string &pvd_path() const { return pvd_path_; }

    /**
     * Indices of the output times @p spec names: `all`, `last`, or a time (`3600`, `2 yr`)
     * that must match an output time to 1e-6 relative (of the last output time).
     * PostInputError naming the PVD file and listing the output times otherwise.
     */
    std::vector<std::size_t> select(const std::string &spec) const;

    /// Index of the output time equal to @p seconds (as in select), or npos.
    std::size_t find(double seconds) const;

    /// The grid of output time @p index, with its point and cell data; PostInputError if unreadable.
    vtkSmartPointer<vtkUnstructuredGrid> load(std::size_t index) const;

    static constexpr std::size_t npos = static_cast<std::size_t>(-1);

  private:
    std::string pvd_path_;
    std::vector<OutputTime> times_;
  };

  /// Reads one VTU or PVTU file; PostInputError naming it if it cannot be read or has no points.
  vtkSmartPointer<vtkUnstructuredGrid> read_grid(const std::string &path);

  /// Names of the point-data arrays of @p grid, then of its cell-data arrays.
  std::vector<std::string> field_names(vtkUnstructuredGrid *grid);

  /// Checks that @p grid has point or cell data @p name; PostInputError listing the fields otherwise.
  void require_field(vtkUnstructuredGrid *grid, const std::string &name, const std::string &file);
} // namespace fickcast::post
