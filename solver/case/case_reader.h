// Reading a case file into a validated, SI-valued CaseDescription.
#pragma once

#include "case/case_description.h"

#include <string>
#include <vector>

namespace fickcast
{
  /**
   * Reads the case file @p path, applies the `section.key=value` @p overrides (from `--set`),
   * checks every key against the schema and converts every quantity to SI.
   * Throws InputError (one line: where, key, expected vs found) on any mistake.
   */
  CaseDescription read_case(const std::string &path, const std::vector<std::string> &overrides = {});

  /// Same, from text in memory; @p name stands for the file name in messages.
  CaseDescription read_case_text(const std::string &text, const std::string &name,
                                 const std::vector<std::string> &overrides = {});
} // namespace fickcast
