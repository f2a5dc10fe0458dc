// User expressions such as {1500*exp(-t/(2*h))}, evaluated with the muparser library.
#pragma once

#include <memory>
#include <stdexcept>
#include <string>
#include <vector>

namespace mu
{
  class Parser;
}

namespace fickcast
{
  /// An expression failed to parse or uses a variable it may not use.
  class ExpressionError : public std::runtime_error
  {
  public:
    using std::runtime_error::runtime_error;
  };

  /**
   * A scalar expression of named variables, compiled once and evaluated many times.
   *
   * Built on muparser, the expression library under deal.II's FunctionParser; used directly
   * because fickcast's expressions take variables beyond x, y, z, t (temperature T and
   * concentration c). Besides muparser's functions (sin, exp, sqrt, min, max, `a ? b : c`, ...)
   * it knows erf, erfc, pow, floor, ceil, the constants pi and e, and unit constants in SI:
   * s, h, d, yr (Julian), m, cm, mm, um, nm (not min: that is the minimum function), so `{1500*exp(-t/(2*h))}` reads
   * naturally. Not thread-safe: evaluate one object from one thread (copies are independent).
   */
  class Expression
  {
  public:
    /// Compiles @p text with the given variable names. Throws ExpressionError.
    Expression(const std::string &text, const std::vector<std::string> &variables);
    Expression(const Expression &other);
    Expression &operator=(const Expression &other);
    ~Expression();

    /// Evaluates with @p values in the order of the variable names given to the constructor.
    double operator()(const std::vector<double> &values) const;
    /// Same, for up to the first @p count values of a plain array.
    double evaluate(const double *values, std::size_t count) const;

    /// Whether the expression uses variable @p name.
    bool uses(const std::string &name) const;
    const std::string &text() const { return text_; }
    const std::vector<std::string> &variables() const { return variables_; }

  private:
    void compile();

    std::string text_;
    std::vector<std::string> variables_;
    std::unique_ptr<double[]> storage_;
    std::unique_ptr<mu::Parser> parser_;
    std::vector<std::string> used_;
  };
} // namespace fickcast
