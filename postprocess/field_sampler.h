// Field values at points or along a straight line, interpolated in the cells VTK finds them in.
#pragma once

#include <vtkUnstructuredGrid.h>

#include <array>
#include <string>
#include <vector>

namespace fickcast::post
{
  /// A point in space (metres); unused coordinates are 0, as in the VTU files.
  using Point = std::array<double, 3>;

  /// Field values at a list of points.
  struct Samples
  {
    std::vector<Point> points;
    std::vector<double> distance;            ///< along the line from its start (0 for single points)
    std::vector<bool> inside;                ///< false where a point lies outside the mesh
    std::vector<std::string> columns;        ///< field names; vectors as NAME.x, NAME.y, NAME.z
    std::vector<std::vector<double>> values; ///< values[column][point] (NaN outside the mesh)
  };

  /// @p n points evenly spaced from @p from to @p to, both included (n >= 2).
  std::vector<Point> line_points(const Point &from, const Point &to, unsigned int n);

  /**
   * Evaluates the fields of @p grid at @p points: VTK's static cell locator finds the written
   * sub-cell holding each point, and the value is that of the cell's Lagrange function of
   * degree @p degree (see PatchMesh), i.e. the finite-element function itself, not a linear
   * interpolation between output points. A point on an interface between cells takes the value
   * of one of them (the concentration may jump there). @p fields empty means every field.
   * @p dimension limits vector components (x only in 1-D). PostInputError for an unknown field.
   */
  Samples sample_fields(vtkUnstructuredGrid *grid, const std::vector<Point> &points,
                        const std::vector<std::string> &fields, unsigned int dimension, unsigned int degree,
                        const std::string &file, const std::vector<Point> &sides = {});

  /// Parses `X[,Y[,Z]]` with exactly @p dimension coordinates, each in metres or with a length unit
  /// (`50 cm`); bare numbers take the unit after the last coordinate (`0.1, 0.2 cm`). PostInputError
  /// otherwise.
  Point parse_point(const std::string &text, unsigned int dimension, const std::string &where);
} // namespace fickcast::post
