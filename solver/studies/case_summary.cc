#include "studies/case_summary.h"

#include "case/input_error.h"

#include <boost/property_tree/json_parser.hpp>
#include <boost/property_tree/ptree.hpp>

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
    double number(const boost::property_tree::ptree &node)
    {
      const std::string text = node.get_value<std::string>();
      if (text.empty() || text == "null")
        return std::nan("");
      try
        {
          return std::stod(text);
        }
      catch (...)
        {
          return std::nan("");
        }
    }
  } // namespace

  CaseSummary read_case_summary(const std::string &path, const std::vector<std::string> &order)
  {
    boost::property_tree::ptree tree;
    try
      {
        boost::property_tree::read_json(path, tree);
      }
    catch (const std::exception &error)
      {
        throw IoError("cannot read " + path + ": " + error.what());
      }
    CaseSummary summary;
    summary.status = tree.get<std::string>("status", "unknown");
    summary.message = tree.get<std::string>("message", "");
    if (const auto wall = tree.get_child_optional("run.wall_time.value"))
      summary.wall_time = number(*wall);
    if (const auto results = tree.get_child_optional("results"))
      for (const auto &[name, node] : *results)
        {
          if (name == "moments")
            continue;
          NamedResult result;
          result.name = name;
          if (const auto value = node.get_child_optional("value"))
            {
              result.value = number(*value);
              result.unit = node.get<std::string>("unit", "");
            }
          else if (const auto final = node.get_child_optional("final"))
            {
              result.value = number(*final);
              result.unit = node.get<std::string>("unit", "");
            }
          else
            continue;
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
