// One face's boundary condition in one stage: what it imposes on u, the reference-phase
// concentration, at a point and a time. The numerics asks; it knows no phase or unit.
#pragma once

#include "case/case_description.h"
#include "model/scalar_function.h"

namespace fickcast
{
  /**
   * A named face's condition (DESIGN.md section 2), SI:
   * - concentration: u fixed at the face, from `value` (the phase concentration of the region
   *   that touches the face, divided by its partition K) or from `ambient` (reference phase);
   * - flux: a given inward flux;
   * - transfer: outward flux h (c_face - K c_ambient) = h K (u - u_ambient);
   * - bath: a well-stirred finite volume whose u is an unknown of the step;
   * - sealed: nothing.
   */
  class BoundaryCondition
  {
  public:
    /// @p face_partition is K of the region that touches the face.
    BoundaryCondition(const BoundarySpec &spec, double face_partition);

    BoundaryKind kind() const { return spec_->kind; }
    bool is_fixed() const { return kind() == BoundaryKind::concentration || kind() == BoundaryKind::bath; }

    /// Concentration faces: the u imposed at a point and time.
    double fixed_value(double x, double y, double z, double t) const
    {
      return spec_->value_is_ambient ? ambient_(x, y, z, t) : value_(x, y, z, t) / face_partition_;
    }

    /// Flux and transfer faces: the given function that drives the face (the inward flux, or the
    /// ambient u); the load is its integral against the test functions times load_factor.
    const ScalarFunction &driving_function() const { return kind() == BoundaryKind::flux ? value_ : ambient_; }
    /// The factor of the face load and, for transfer, of the face operator: h K of the region on
    /// the face's cell for transfer, 1 for a given flux.
    double load_factor(const double cell_partition) const
    {
      return kind() == BoundaryKind::transfer ? spec_->coefficient * cell_partition : 1.0;
    }
    /// Transfer faces: the ambient value, if it is the same everywhere on the face, at time @p t.
    const ScalarFunction &ambient_function() const { return ambient_; }

    // --- baths
    double bath_volume() const { return spec_->volume; }
    /// K of the bath liquid against the reference phase.
    double bath_partition() const { return spec_->bath_partition; }
    /// The bath's u at the start of its stage.
    double bath_initial_value() const { return spec_->bath_initial / spec_->bath_partition; }
    /// The bath-phase concentration of a bath u.
    double bath_concentration(const double u) const { return u * spec_->bath_partition; }
    /// Capacity of the bath for its u: volume times its partition.
    double bath_capacity() const { return spec_->volume * spec_->bath_partition; }

  private:
    const BoundarySpec *spec_;
    double face_partition_;
    ScalarFunction value_, ambient_;
  };
} // namespace fickcast
