// One region's material: the coefficients of C du/dt = div(G grad u) - k u + s at a point, a time
// and a concentration, from the porous-medium laws. The numerics asks; it knows no law or unit.
#pragma once

#include "case/case_description.h"
#include "model/diffusivity.h"
#include "model/scalar_function.h"

#include <string>
#include <vector>

namespace fickcast
{
  /// Tortuosity factor tau of a region: given directly, or from its porosity law (Archie:
  /// theta^(m - 1); Millington-Quirk, saturated form: theta^(1/3)).
  double tortuosity_factor(const RegionSpec &region);

  /// Retardation factor R of linear equilibrium sorption: given directly, or 1 + rho_b Kd / theta
  /// from the bulk density and the distribution coefficient (common practice).
  double retardation_factor(const RegionSpec &region);

  /**
   * The material of one region in the capacity/conductance form (DESIGN.md section 2), SI. The
   * unknown u is the reference-phase concentration; the region's phase concentration is c = K u.
   *
   *   capacity     C = theta R K
   *   conductance  G = theta tau K D(x, t, T, c)
   *   reaction     k = lambda theta K R (lambda theta K when only the dissolved part decays)
   *   source       s(x, t), per bulk volume
   *
   * plus the content laws: the initial phase concentration, and with a solubility the saturation
   * and the undissolved reserve. A diffusivity that is not positive and finite, or an initial value
   * that is not finite, where it is asked for is reported to @p report_to (if that is still empty)
   * as "KEY: message", for a collective check by the caller (an input error). A source that is not
   * finite where it is asked for is reported the same way to @p non_finite_to: an expression that
   * went wrong during the run, a numerical failure rather than an input error. Not thread-safe
   * (muparser).
   */
  class Material
  {
  public:
    /// @p initial is the case's [initial] value, used where the region gives none; @p dimension
    /// is the dimension of the points asked for (for messages); @p report_to and @p non_finite_to
    /// (either may be null) must outlive this.
    Material(const RegionSpec &region, const TemperatureSchedule &temperature, const ScalarField &initial,
             unsigned int dimension, std::string *report_to, std::string *non_finite_to = nullptr);

    const std::string &name() const { return region_->name; }

    // --- storage and transport
    double partition() const { return region_->partition; }
    double capacity() const { return region_->porosity * retardation_ * region_->partition; }
    double tortuosity() const { return tortuosity_; }
    double retardation() const { return retardation_; }
    /// Free diffusivity D (no tortuosity).
    double diffusivity(double x, double y, double z, double t, double c) const;
    /// Effective diffusivity tau D; remembers a value that is not positive and finite.
    double effective_diffusivity(double x, double y, double z, double t, double c) const;
    /// G = theta K tau D.
    double conductance(double x, double y, double z, double t, double c) const
    {
      return region_->porosity * region_->partition * effective_diffusivity(x, y, z, t, c);
    }
    /// G / D = theta K tau: the factor of a unit-diffusivity operator.
    double conductance_factor() const { return region_->porosity * region_->partition * tortuosity_; }
    /// dG/du = theta tau K K dD/dc (Newton's extra term; 0 unless D depends on c).
    double conductance_derivative(double x, double y, double z, double t, double c) const
    {
      return region_->porosity * tortuosity_ * region_->partition * region_->partition *
             diffusivity_.derivative(x, y, z, t, c);
    }
    /// How D depends on position, time and concentration (decides how operators are built).
    const Diffusivity &diffusivity_shape() const { return diffusivity_; }

    // --- water flow (advection and mechanical dispersion)
    bool has_flow() const { return region_->has_flow(); }
    /// Darcy flux q, m/s, one component per axis (empty: none).
    const std::vector<double> &darcy_flux() const { return region_->darcy_flux; }
    double porosity() const { return region_->porosity; }
    double longitudinal_dispersivity() const { return region_->longitudinal_dispersivity; }
    double transverse_dispersivity() const { return region_->transverse_dispersivity; }

    // --- reactions and sources
    double reaction() const
    {
      return region_->decay_rate * region_->porosity * region_->partition *
             (region_->decay_dissolved_only ? 1.0 : retardation_);
    }
    /// Source s at a point and time; remembers a value that is not finite.
    double source(double x, double y, double z, double t) const;
    const ScalarFunction &source_function() const { return source_; }

    // --- content
    /// Initial phase concentration at a point (capped at the solubility where the region holds
    /// an undissolved loading); remembers a value that is not finite.
    double initial_concentration(double x, double y, double z) const;
    /// Whether the initial value is one constant, and that value (phase concentration).
    bool initial_is_constant() const { return initial_field_.is_constant(); }
    double initial_constant() const { return initial_field_.value; }
    bool has_own_initial() const { return region_->initial.has_value(); }
    /// Whether part of the content may be undissolved (solid above solubility).
    bool has_dispersed_phase() const { return region_->has_dispersed_phase(); }
    /// Phase concentration at saturation.
    double solubility() const { return region_->solubility; }
    /// u at saturation: the solubility over the partition.
    double saturation() const { return region_->solubility / region_->partition; }
    /// Undissolved content per bulk volume at t = 0: the loading above what the pores hold at
    /// saturation (<= 0: none).
    double undissolved_loading() const
    {
      return region_->loading - region_->porosity * retardation_ * region_->solubility;
    }

  private:
    const RegionSpec *region_;
    unsigned int dimension_;
    double tortuosity_;
    double retardation_;
    Diffusivity diffusivity_;
    ScalarFunction source_;
    ScalarField initial_field_;
    ScalarFunction initial_;
    std::string *report_to_;
    std::string *non_finite_to_;
  };
} // namespace fickcast
