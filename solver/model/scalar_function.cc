#include "model/scalar_function.h"

namespace fickcast
{
  ScalarFunction::ScalarFunction(const ScalarField &field)
    : constant_(field.value)
    , scale_(field.scale)
    , offset_(field.offset)
  {
    if (!field.is_constant())
      expression_ = std::make_shared<Expression>(field.expression, std::vector<std::string>{"x", "y", "z", "t"});
  }

  double ScalarFunction::operator()(const double x, const double y, const double z, const double t) const
  {
    if (!expression_)
      return constant_;
    const double values[4] = {x, y, z, t};
    return scale_ * expression_->evaluate(values, 4) + offset_;
  }
} // namespace fickcast
