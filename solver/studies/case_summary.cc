#include "studies/case_summary.h"

#include "case/input_error.h"
#include "results/json_file.h"

#include <algorithm>
#include <cmath>

namespace fickcast
{
  const NamedResult *CaseSummary::find(const std::string &name) const
  {
    for (const auto &r : results)
      if (r.name == name)
        return &r;
    return nullptr;
  }

  namespace
  {
    /// The member @p key of @p object; null if @p object is not an object or has no such member.
    const Json::Value &member(const Json::Value &object, const std::string &key)
    {
      static const Json::Value none;
      return object.isObject() && object.isMember(key) ? object[key] : none;
    }

    /// A number of summary.json; NaN for null (not finite when written) or anything else.
    double number(const Json::Value &value)
    {
      return value.isNumeric() ? value.asDouble() : std::nan("");
    }

    std::string text(const Json::Value &object, const std::string &key, const std::string &fallback)
    {
      const Json::Value &value = member(object, key);
      return value.isString() ? value.asString() : fallback;
    }
  } // namespace

  CaseSummary read_case_summary(const std::string &path, const std::vector<std::string> &order)
  {
    const Json::Value root = read_json(path);
    if (!root.isObject())
      throw IoError("cannot read " + path + ": expected a JSON object");
    CaseSummary summary;
    summary.status = text(root, "status", "unknown");
    summary.message = text(root, "message", "");
    const Json::Value &wall = member(member(root, "run"), "wall_time");
    if (wall.isObject() && wall.isMember("value"))
      summary.wall_time = number(wall["value"]);
    const Json::Value &results = member(root, "results");
    if (results.isObject())
      for (const auto &name : results.getMemberNames())
        {
          const Json::Value &node = results[name];
          if (name == "moments" || !node.isObject())
            continue;
          NamedResult result;
          result.name = name;
          if (node.isMember("value"))
            result.value = number(node["value"]);
          else if (node.isMember("final"))
            result.value = number(node["final"]);
          else
            continue;
          result.unit = text(node, "unit", "");
          summary.results.push_back(result);
        }
    const auto position = [&order](const NamedResult &r) {
      return static_cast<std::size_t>(std::find(order.begin(), order.end(), r.name) - order.begin());
    };
    std::sort(summary.results.begin(), summary.results.end(), [&](const NamedResult &a, const NamedResult &b) {
      const std::size_t pa = position(a), pb = position(b);
      return pa != pb ? pa < pb : pa == order.size() && a.name < b.name;
    });
    return summary;
  }
} // namespace fickcast
