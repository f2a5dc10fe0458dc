// Largest differences between two results folders, per field and output time (regression, QA).
#pragma once

#include "field_sampler.h"

#include <string>
#include <vector>

namespace fickcast::post
{
  /// The largest difference of one field at one output time.
  struct FieldDifference
  {
    double time = 0;
    std::string field;
    std::string unit;
    double largest = 0;       ///< max over points (cells for cell data) of |A - B| (vector: |A - B| in length)
    double magnitude = 0;     ///< max of |A| over the same points, the scale of the field
    double relative = 0;      ///< largest / magnitude (largest itself when the field is zero in A)
    Point where{0, 0, 0};     ///< where the largest difference is
    std::size_t compared = 0; ///< points or cells compared
  };

  /// The result of comparing folder B against folder A.
  struct Comparison
  {
    std::vector<FieldDifference> rows;
    std::string method; ///< `same points` or `B interpolated at the points of A`
  };

  /**
   * Compares the fields of results folders @p a and @p b at every output time of A.
   * Both must have the same output times (to 1e-6 relative) and every field of A (or of
   * @p fields if not empty). Same mesh: point by point and cell by cell. Different meshes: B is
   * interpolated at A's points (points of A outside B's mesh are left out).
   * PostInputError if a folder, time or field is missing.
   */
  Comparison compare_results(const std::string &a, const std::string &b, const std::vector<std::string> &fields);

  /// The SI unit of field @p name for a case whose concentrations are in @p concentration_unit.
  std::string field_unit(const std::string &name, const std::string &concentration_unit);
} // namespace fickcast::post
