// One face's boundary condition in one stage: what it imposes on u, the reference-phase
// concentration, at a point and a time. The numerics asks; it knows no phase or unit.
#pragma once

#include "case/case_description.h"
#include "model/scalar_function.h"

#include <string>

namespace fickcast
{
  /**
   * A named face's condition (DESIGN.md section 2), SI:
   * - concentration: u fixed at the face, from `value` (the phase concentration of the region
   *   that touches the face, divided by its partition K) or from `ambient` (reference phase);
   * - flux: a given inward flux;
   * - transfer: outward flux h (c_face - K c_ambient) = h K (u - u_ambient);
   * - bath: a well-stirred finite volume whose u is an unknown of the step;
   * - sealed: nothing;
   * - inflow: water enters with a given concentration c_in; the inward flux is -q.n c_in;
   * - outflow: water leaves with the concentration it has; the outward flux is q.n K u.
   *
   * A value, flux or ambient that is not finite where it is asked for is reported to
   * @p non_finite_to (if that is still empty) as "KEY: message", for a collective check by the
   * caller: an expression that went wrong during the run, a numerical failure rather than an
   * input error. Not thread-safe (muparser).
   */
  class BoundaryCondition
  {
  public:
    /// @p face_partition is K of the region that touches the face; @p dimension is the dimension
    /// of the points asked for and @p stage the stage's name, if the case has stages (for
    /// messages); @p non_finite_to (may be null) must outlive this. @p negative_to (may be null)
    /// gets the first concentration (value or ambient) below zero, once, as a warning.
    BoundaryCondition(const BoundarySpec &spec, double face_partition, unsigned int dimension = 1,
                      std::string *non_finite_to = nullptr, const std::string &stage = "",
                      std::string *negative_to = nullptr);

    BoundaryKind kind() const { return spec_->kind; }
    bool is_fixed() const { return kind() == BoundaryKind::concentration || kind() == BoundaryKind::bath; }

    /// Concentration faces: the u imposed at a point and time; remembers a value that is not finite.
    double fixed_value(double x, double y, double z, double t) const;

    /// Flux and transfer faces: the given function that drives the face (the inward flux, or the
    /// ambient u); the load is its integral against the test functions times load_factor. Ask
    /// its values through driving_value, which checks them.
    const ScalarFunction &driving_function() const { return drives_by_value() ? value_ : ambient_; }
    /// Whether `value` drives the face (a given flux, or the concentration of entering water).
    bool drives_by_value() const { return kind() == BoundaryKind::flux || kind() == BoundaryKind::inflow; }
    /// Whether the face has a load (a given flux, transfer, entering water).
    bool has_load() const
    {
      return kind() == BoundaryKind::flux || kind() == BoundaryKind::transfer || kind() == BoundaryKind::inflow;
    }
    /// The driving function's value at a point and time; remembers a value that is not finite.
    double driving_value(double x, double y, double z, double t) const;
    /// The driving function's value, if it is the same everywhere on the face, at time @p t.
    double driving_at_time(double t) const { return driving_value(0, 0, 0, t); }
    /// The factor of the face load and, for transfer, of the face operator: h K of the region on
    /// the face's cell for transfer, 1 for a given flux (for inflow the assembly multiplies by -q.n).
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
    /// Remembers a value of @p function, key `boundary.FACE.NAME`, that is not finite.
    void check(double value, const ScalarFunction &function, const char *name, double x, double y, double z, double t,
               bool concentration) const;

    const BoundarySpec *spec_;
    double face_partition_;
    ScalarFunction value_, ambient_;
    unsigned int dimension_;
    std::string *non_finite_to_;
    std::string stage_;
    std::string *negative_to_; ///< first concentration or ambient value below zero (a warning), or null
  };
} // namespace fickcast
