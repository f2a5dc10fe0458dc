#include "model/boundary_condition.h"

namespace fickcast
{
  BoundaryCondition::BoundaryCondition(const BoundarySpec &spec, const double face_partition)
    : spec_(&spec)
    , face_partition_(face_partition)
    , value_(spec.value)
    , ambient_(spec.ambient)
  {
  }
} // namespace fickcast
