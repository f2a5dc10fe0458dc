// The text of a named result through a face: `out through base at 50 yr`, `in through top reaches
// 2 mg/m2`.
#pragma once

#include "case/case_description.h"

#include <string>
#include <vector>

namespace fickcast
{
  /**
   * Reads the value of output.PREFIX.NAME for a result through a face:
   *
   *     DIRECTION through FACE [at TIME | by TIME | reaches LIMIT]
   *
   * DIRECTION is `in` (into the body) or `out`; FACE one of @p faces (not a symmetry face).
   * `flux` takes `at TIME` and `crossed` takes `by TIME` (both optional: the end of the run);
   * `flux_limit` needs `reaches RATE` (an amount per time in @p amount_unit per second),
   * `crossed_limit` needs `reaches AMOUNT` (in @p amount_unit); `peak_flux` and `steady_flux`
   * take nothing after the face. Times must lie in (0, @p end]. Throws InputError at @p origin
   * and @p key with what was expected and what was found.
   */
  FaceResultSpec parse_face_result(const std::string &prefix, const std::string &name, const std::string &text,
                                   const std::vector<std::string> &faces, const std::string &amount_unit, double end,
                                   const std::string &origin, const std::string &key);

  /// Whether @p prefix (the part of an [output] key before the dot) names a result through a face.
  bool is_face_result_prefix(const std::string &prefix);
} // namespace fickcast
