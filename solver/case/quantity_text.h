// The text forms a value may take in a case file: "number unit", "{expression} unit", lists.
#pragma once

#include <string>
#include <vector>

namespace fickcast
{
  /// A value as written, split into its number (or expression) and its unit text.
  struct QuantityText
  {
    double number = 0;      ///< the number, if not an expression
    std::string expression; ///< the expression between braces, empty for a number
    std::string unit;       ///< unit text after the number or the closing brace, may be empty

    bool is_expression() const { return !expression.empty(); }
  };

  /**
   * Splits `1.9e-9 m2/s`, `250 mg/L`, `3 h` or `{1500*exp(-t/7200)} mg/L` into number or
   * expression and unit. Throws UnitError (with a one-line reason) for an unparsable number,
   * NaN, infinity, or an unterminated brace. Expressions are allowed only if @p allow_expression.
   */
  QuantityText split_quantity(const std::string &text, bool allow_expression);

  /// Splits at commas that are outside braces and parentheses; trims each item; drops empty
  /// trailing items. `a, b, c` -> {a, b, c}.
  std::vector<std::string> split_list(const std::string &text, char separator = ',');

  /// Levenshtein distance, for "did you mean" suggestions.
  std::size_t edit_distance(const std::string &a, const std::string &b);

  /// The candidate closest to @p word (distance at most 3 or a third of its length), or empty.
  std::string nearest(const std::string &word, const std::vector<std::string> &candidates);
} // namespace fickcast
