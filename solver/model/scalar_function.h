// A ScalarField made callable: a constant, or a compiled expression of x, y, z, t.
#pragma once

#include "case/case_description.h"
#include "case/expression.h"

#include <memory>

namespace fickcast
{
  /**
   * Evaluates a ScalarField (constant, `{expression} unit` or a table against time) in SI at a
   * point and a time.
   * The expression sees x, y, z in m and t in s; its result is scaled to SI.
   * Not thread-safe (one muparser instance); copy it per thread if ever needed.
   */
  class ScalarFunction
  {
  public:
    ScalarFunction() = default;
    /// Compiles @p field; the expression may use any of x, y, z, t.
    explicit ScalarFunction(const ScalarField &field);

    /// Value at point (x, y, z) and time t, SI.
    double operator()(double x, double y, double z, double t) const;
    /// Value for a field that depends on time only (boundary values).
    double at_time(double t) const { return (*this)(0, 0, 0, t); }

    bool is_constant() const { return !expression_ && !table_; }
    bool depends_on_time() const { return table_ || (expression_ && expression_->uses("t")); }
    bool depends_on_space() const
    {
      return expression_ && (expression_->uses("x") || expression_->uses("y") || expression_->uses("z"));
    }

  private:
    double constant_ = 0;
    double scale_ = 1;
    double offset_ = 0;
    std::shared_ptr<Expression> expression_;
    std::shared_ptr<TimeTable> table_;
  };
} // namespace fickcast
