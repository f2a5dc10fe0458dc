// JSON files (summary.json, sweep_summary.json, size_summary.json, verification_report.json)
// through JsonCpp, the one JSON library of fickcast (the post-processor reads them with it too).
#pragma once

#include <json/value.h>

#include <string>

namespace fickcast
{
  /**
   * The text fickcast writes for @p value: two-space indentation, `"key": value`, 17 significant
   * digits (every double reads back exactly), integers as integers, UTF-8 text as it is (`µm`
   * stays `µm`), non-finite numbers as null (JSON has no NaN or infinity), and a final newline.
   * JsonCpp lists the keys of an object in alphabetical order: a reader that needs another order
   * keeps its own list (result_order() for the named results).
   */
  std::string json_text(const Json::Value &value);

  /// Writes json_text(@p value) to @p path. Throws IoError.
  void write_json(const Json::Value &value, const std::string &path);

  /// Reads the JSON file @p path. Throws IoError if it cannot be read or is not valid JSON.
  Json::Value read_json(const std::string &path);
} // namespace fickcast
