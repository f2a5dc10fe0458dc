// Spread moments of the content of a field: amount, mean position, variance.
#pragma once

#include "results/field_view.h"
#include "results/run_record.h"

namespace fickcast
{
  /**
   * Amount int C u, mean position int x C u / int C u and variance int |x - mean|^2 C u / int C u
   * of the dissolved and sorbed content (the coordinate weight included), by Gauss quadrature
   * over the cells (collective). The second moment of an instantaneous source grows as 2 d D t
   * (common practice: mean-square displacement).
   */
  template <int dim>
  MomentsRecord spread_moments(const FieldView<dim> &field, const FieldVector &u, double time);
} // namespace fickcast
