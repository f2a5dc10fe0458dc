#include "case/renamed_spellings.h"

#include <map>

namespace fickcast
{
  std::string renamed_spelling(const std::string &section, const std::string &key)
  {
    if (section == "study")
      {
        static const std::map<std::string, std::string> sizing = {
          {"seek.key", "parameter"},           {"seek.low", "from"},   {"seek.high", "to"},
          {"seek.result", "result"},           {"seek.target", "aim"}, {"seek.tolerance", "tolerance"},
          {"seek.max_evaluations", "max_runs"}};
        if (key.empty())
          return "[sweep] (vary, combine, sample, samples, seed, exceed, below) or [size] (parameter, from, to, "
                 "result, aim, tolerance, max_runs)";
        const auto found = sizing.find(key);
        if (found != sizing.end())
          return "`" + found->second + "` in a [size] section";
        if (key.rfind("seek.", 0) == 0)
          return "a key of the [size] section (parameter, from, to, result, aim, tolerance, max_runs)";
        return "`" + key + "` in a [sweep] section";
      }
    if (section == "output" && key.rfind("probe.", 0) == 0)
      return "`point." + key.substr(6) + "` in [output]";
    return {};
  }

  std::string renamed_message(const std::string &section, const std::string &key, const std::string &replacement)
  {
    const std::string old = key.empty() ? "[" + section + "]" : "[" + section + "] " + key;
    return old + " is a spelling of fickcast 0.7; write " + replacement + " instead";
  }

  std::string renamed_verb(const std::string &verb)
  {
    if (verb == "seek")
      return "size";
    return {};
  }
} // namespace fickcast
