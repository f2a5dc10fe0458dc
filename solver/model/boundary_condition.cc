#include "model/boundary_condition.h"

#include "model/value_text.h"

#include <cmath>

namespace fickcast
{
  BoundaryCondition::BoundaryCondition(const BoundarySpec &spec, const double face_partition,
                                       const unsigned int dimension, std::string *non_finite_to,
                                       const std::string &stage)
    : spec_(&spec)
    , face_partition_(face_partition)
    , value_(spec.value)
    , ambient_(spec.ambient)
    , dimension_(dimension)
    , non_finite_to_(non_finite_to)
    , stage_(stage)
  {
  }

  double BoundaryCondition::fixed_value(const double x, const double y, const double z, const double t) const
  {
    const double u = spec_->value_is_ambient ? ambient_(x, y, z, t) : value_(x, y, z, t) / face_partition_;
    check(u, spec_->value_is_ambient ? ambient_ : value_, spec_->value_is_ambient ? "ambient" : "value", x, y, z, t);
    return u;
  }

  double BoundaryCondition::driving_value(const double x, const double y, const double z, const double t) const
  {
    const double value = driving_function()(x, y, z, t);
    check(value, driving_function(), kind() == BoundaryKind::flux ? "value" : "ambient", x, y, z, t);
    return value;
  }

  void BoundaryCondition::check(const double value, const ScalarFunction &function, const char *name, const double x,
                                const double y, const double z, const double t) const
  {
    if (std::isfinite(value) || non_finite_to_ == nullptr || !non_finite_to_->empty())
      return;
    // A stage that does not give the key takes it from [boundary.FACE]: name both.
    const std::string key = "boundary." + spec_->name + "." + name + (stage_.empty() ? "" : " (stage " + stage_ + ")");
    report_non_finite(non_finite_to_, key, value, function.depends_on_space(), x, y, z, t, dimension_);
  }
} // namespace fickcast
