#include "post_error.h"

namespace fickcast::post
{
  PostInputError::PostInputError(const std::string &where, const std::string &expected, const std::string &found)
    : std::runtime_error(where + ": expected " + expected + ", found " + one_line(found))
  {
  }

  std::string one_line(const std::string &text, const std::size_t limit)
  {
    std::string line;
    for (const char c : text)
      {
        const bool space = c == '\n' || c == '\r' || c == '\t';
        if (space && (line.empty() || line.back() == ' '))
          continue;
        line += space ? ' ' : c;
      }
    while (!line.empty() && line.back() == ' ')
      line.pop_back();
    if (line.size() > limit)
      line = line.substr(0, limit) + "...";
    return line;
  }
} // namespace fickcast::post
