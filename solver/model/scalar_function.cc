#include "model/scalar_function.h"

namespace fickcast
{
  ScalarFunction::ScalarFunction(const ScalarField &field)
    : constant_(field.value)
    , scale_(field.scale)
    , offset_(field.offset)
  {
    if (!field.table.empty())
      table_ = std::make_shared<TimeTable>(field.table);
    else if (!field.expression.empty())
      expression_ = std::make_shared<Expression>(field.expression, std::vector<std::string>{"x", "y", "z", "t"});
  }

  double ScalarFunction::operator()(const double x, const double y, const double z, const double t) const
  {
    if (table_)
      return table_->at(t);
    if (!expression_)
      return constant_;
    const double values[4] = {x, y, z, t};
    return scale_ * expression_->evaluate(values, 4) + offset_;
  }
} // namespace fickcast
