// The cases of a study: which overrides each one applies to the base case.
#pragma once

#include "case/case_description.h"
#include "case/input_error.h"

#include <string>
#include <vector>

namespace fickcast
{
  /// One case of a study.
  struct StudyCase
  {
    std::string id;                                              ///< case_0001, ...
    std::vector<std::pair<std::string, std::string>> parameters; ///< key, value as written
    std::vector<std::string> overrides;                          ///< section.key=value, applied after --set
  };

  /**
   * The `section.key=value` overrides that give the study parameter @p key the value @p value:
   * the key itself, or for `layer.NAME.thickness` the geometry.layers list with that layer's
   * thickness replaced. Throws InputError (naming @p origin) for a layer the case lacks.
   */
  std::vector<std::string> parameter_overrides(const CaseDescription &base, const std::string &key,
                                               const std::string &value, const std::string &origin);

  /// A study parameter's value in one case.
  struct ParameterValue
  {
    std::string key;    ///< e.g. layer.clay.thickness
    std::string value;  ///< as written, with its unit
    std::string origin; ///< file:line of the study key
  };

  /**
   * The overrides of one case with all its parameter values: several `layer.NAME.thickness`
   * edits go into one geometry.layers list. Throws InputError when a case would both replace
   * geometry.layers and edit a layer's thickness (one would silently undo the other).
   */
  std::vector<std::string> case_overrides(const CaseDescription &base, const std::vector<ParameterValue> &values);

  /// Cases of a sweep (every combination, or element by element with combine = zip) or of an
  /// uncertainty study (Latin hypercube sample of the distributions). Throws InputError.
  std::vector<StudyCase> plan_study(const CaseDescription &base);

  /**
   * Reads the case once per value of each swept parameter (and once with the median of each
   * sampled one), so that an unknown key or a value the case rejects stops the study before any
   * run: throws InputError naming the study key, its origin and the case's complaint.
   */
  void check_study_values(const CaseDescription &base, const std::string &case_file,
                          const std::vector<std::string> &base_overrides);

  /**
   * Why the case rejected a study's value, for a message: the key and explanation alone when
   * the value came in as a --set override (the study's own way of applying it), else the whole
   * error.
   */
  std::string rejection_reason(const InputError &error);

  /// A stable text of the plan (ids and overrides), to recognise a study when it is resumed.
  std::string plan_fingerprint(const std::vector<StudyCase> &cases, const std::vector<std::string> &base_overrides);
} // namespace fickcast
