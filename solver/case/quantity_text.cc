#include "case/quantity_text.h"

#include "case/units.h"

#include <algorithm>
#include <cctype>
#include <cmath>
#include <regex>

namespace fickcast
{
  namespace
  {
    std::string trim(const std::string &text)
    {
      const auto first = text.find_first_not_of(" \t");
      if (first == std::string::npos)
        return "";
      const auto last = text.find_last_not_of(" \t");
      return text.substr(first, last - first + 1);
    }

    std::string lower(std::string text)
    {
      std::transform(text.begin(), text.end(), text.begin(),
                     [](unsigned char c) { return static_cast<char>(std::tolower(c)); });
      return text;
    }
  } // namespace

  QuantityText split_quantity(const std::string &raw, const bool allow_expression)
  {
    const std::string text = trim(raw);
    QuantityText result;
    if (text.empty())
      throw UnitError("expected a number with optional unit, found an empty value");
    if (text.front() == '{')
      {
        if (!allow_expression)
          throw UnitError("expected a number with optional unit, found an expression '" + text +
                          "' (this key takes constants only)");
        int depth = 0;
        std::size_t close = std::string::npos;
        for (std::size_t i = 0; i < text.size(); ++i)
          {
            if (text[i] == '{')
              ++depth;
            else if (text[i] == '}' && --depth == 0)
              {
                close = i;
                break;
              }
          }
        if (close == std::string::npos)
          throw UnitError("expected '{expression} unit', found no closing brace in '" + text + "'");
        result.expression = trim(text.substr(1, close - 1));
        if (result.expression.empty())
          throw UnitError("expected an expression between the braces, found '{}'");
        result.unit = trim(text.substr(close + 1));
        return result;
      }

    const std::string first_word = lower(text.substr(0, text.find_first_of(" \t")));
    for (const char *word : {"nan", "+nan", "-nan", "inf", "+inf", "-inf", "infinity", "+infinity", "-infinity"})
      if (first_word == word || first_word.rfind(std::string(word) + "*", 0) == 0)
        throw UnitError("expected a finite number, found '" + text + "' (NaN and infinity are not values)");

    static const std::regex number(R"(^[+-]?(\d+\.?\d*|\.\d+)([eE][+-]?\d+)?)");
    std::smatch match;
    if (!std::regex_search(text, match, number))
      throw UnitError("expected a number with optional unit, found '" + text + "'");
    const std::string digits = match.str(0);
    const std::string rest = text.substr(digits.size());
    if (!rest.empty())
      {
        const char next = rest.front();
        if (std::isdigit(static_cast<unsigned char>(next)) || next == '.' || next == 'e' || next == 'E' ||
            next == '+' || next == '-' || next == ',')
          throw UnitError("expected a number with optional unit, found '" + text + "'");
      }
    result.number = std::strtod(digits.c_str(), nullptr);
    if (!std::isfinite(result.number))
      throw UnitError("expected a finite number, found '" + digits + "' (out of range)");
    result.unit = trim(rest);
    return result;
  }

  std::vector<std::string> split_list(const std::string &text, const char separator)
  {
    std::vector<std::string> items;
    std::string current;
    int depth = 0;
    for (const char c : text)
      {
        if (c == '{' || c == '(')
          ++depth;
        else if (c == '}' || c == ')')
          --depth;
        if (c == separator && depth == 0)
          {
            items.push_back(trim(current));
            current.clear();
          }
        else
          current += c;
      }
    items.push_back(trim(current));
    while (!items.empty() && items.back().empty())
      items.pop_back();
    return items;
  }

  std::size_t edit_distance(const std::string &a, const std::string &b)
  {
    std::vector<std::size_t> previous(b.size() + 1), current(b.size() + 1);
    for (std::size_t j = 0; j <= b.size(); ++j)
      previous[j] = j;
    for (std::size_t i = 1; i <= a.size(); ++i)
      {
        current[0] = i;
        for (std::size_t j = 1; j <= b.size(); ++j)
          current[j] =
            std::min({previous[j] + 1, current[j - 1] + 1, previous[j - 1] + (a[i - 1] == b[j - 1] ? 0 : 1)});
        std::swap(previous, current);
      }
    return previous[b.size()];
  }

  std::string nearest(const std::string &word, const std::vector<std::string> &candidates)
  {
    std::string best;
    std::size_t best_distance = std::max<std::size_t>(3, word.size() / 3) + 1;
    for (const auto &candidate : candidates)
      {
        const std::size_t distance = edit_distance(lower(word), lower(candidate));
        if (distance < best_distance)
          {
            best = candidate;
            best_distance = distance;
          }
      }
    return best;
  }
} // namespace fickcast
