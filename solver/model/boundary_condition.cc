#include "model/boundary_condition.h"

#include "model/value_text.h"

#include <cmath>

namespace fickcast
{
  BoundaryCondition::BoundaryCondition(const BoundarySpec &spec, const double face_partition,
                                       const unsigned int dimension, std::string *non_finite_to,
                                       const std::string &stage, std::string *negative_to)
    : spec_(&spec)
    , face_partition_(face_partition)
    , value_(spec.value)
    , ambient_(spec.ambient)
    , dimension_(dimension)
    , non_finite_to_(non_finite_to)
    , stage_(stage)
    , negative_to_(negative_to)
  {
  }

  double BoundaryCondition::fixed_value(const double x, const double y, const double z, const double t) const
  {
    const double u = spec_->value_is_ambient ? ambient_(x, y, z, t) : value_(x, y, z, t) / face_partition_;
    check(u, spec_->value_is_ambient ? ambient_ : value_, spec_->value_is_ambient ? "ambient" : "value", x, y, z, t,
          true);
    return u;
  }

  double BoundaryCondition::driving_value(const double x, const double y, const double z, const double t) const
  {
    const double value = driving_function()(x, y, z, t);
    check(value, driving_function(), drives_by_value() ? "value" : "ambient", x, y, z, t, kind() != BoundaryKind::flux);
    return value;
  }

  void BoundaryCondition::check(const double value, const ScalarFunction &function, const char *name, const double x,
                                const double y, const double z, const double t, const bool concentration) const
  {
    // A stage that does not give the key takes it from [boundary.FACE]: name both.
    const auto key = [&] {
      return "boundary." + spec_->name + "." + name + (stage_.empty() ? "" : " (stage " + stage_ + ")");
    };
    // A concentration below zero means nothing physical (an expression that swings negative, a
    // table with a negative entry): the run goes on, and says so once.
    if (concentration && value < 0 && negative_to_ != nullptr && negative_to_->empty())
      *negative_to_ =
        key() + ": a concentration below zero (" +
        number_text(std::string(name) == "value" && kind() == BoundaryKind::concentration ? value * face_partition_
                                                                                          : value) +
        " in SI units) at " +
        (function.depends_on_space() ? describe_point(x, y, z, dimension_) + ", " : std::string()) +
        "t = " + number_text(t) + " s; the run used it as given: check the expression or table";
    if (std::isfinite(value) || non_finite_to_ == nullptr || !non_finite_to_->empty())
      return;
    report_non_finite(non_finite_to_, key(), value, function.depends_on_space(), x, y, z, t, dimension_);
  }
} // namespace fickcast
