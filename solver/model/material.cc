#include "model/material.h"

#include <algorithm>
#include <cmath>
#include <cstdio>
#include <string>

namespace fickcast
{
  namespace
  {
    std::string describe_point(const double x, const double y, const double z, const unsigned int dim)
    {
      char buffer[128];
      if (dim == 1)
        std::snprintf(buffer, sizeof(buffer), "x = %.6g m", x);
      else if (dim == 2)
        std::snprintf(buffer, sizeof(buffer), "(x, y) = (%.6g, %.6g) m", x, y);
      else
        std::snprintf(buffer, sizeof(buffer), "(x, y, z) = (%.6g, %.6g, %.6g) m", x, y, z);
      return buffer;
    }

    /// A value in a message: six significant digits, any magnitude (-1e-09, not -0.000000).
    std::string number_text(const double value)
    {
      if (std::isnan(value))
        return "NaN";
      char buffer[32];
      std::snprintf(buffer, sizeof(buffer), "%.6g", value);
      return buffer;
    }
  } // namespace

  double tortuosity_factor(const RegionSpec &region)
  {
    switch (region.porosity_law)
      {
        case PorosityLaw::archie:
          return std::pow(region.porosity, region.archie_exponent - 1.0);
        case PorosityLaw::millington_quirk:
          return std::cbrt(region.porosity);
        case PorosityLaw::none:
          break;
      }
    return region.tortuosity;
  }

  double retardation_factor(const RegionSpec &region)
  {
    if (region.bulk_density > 0)
      return 1.0 + region.bulk_density * region.distribution_coefficient / region.porosity;
    return region.retardation;
  }

  Material::Material(const RegionSpec &region, const TemperatureSchedule &temperature, const ScalarField &initial,
                     const unsigned int dimension, std::string *report_to)
    : region_(&region)
    , dimension_(dimension)
    , tortuosity_(tortuosity_factor(region))
    , retardation_(retardation_factor(region))
    , diffusivity_(region, temperature)
    , source_(region.source)
    , initial_field_(region.initial ? *region.initial : initial)
    , initial_(initial_field_)
    , report_to_(report_to)
  {
  }

  double Material::diffusivity(const double x, const double y, const double z, const double t, const double c) const
  {
    return diffusivity_(x, y, z, t, c);
  }

  double Material::effective_diffusivity(const double x, const double y, const double z, const double t,
                                         const double c) const
  {
    const double d = diffusivity_(x, y, z, t, c);
    if ((!(d > 0) || !std::isfinite(d)) && report_to_ != nullptr && report_to_->empty())
      *report_to_ = "region." + region_->name + ".diffusivity: expected a diffusivity > 0 everywhere, found " +
                    number_text(d) + " m2/s at " + describe_point(x, y, z, dimension_) + ", t = " + number_text(t) +
                    " s" + (diffusivity_.depends_on_concentration() ? ", c = " + number_text(c) : "");
    return tortuosity_ * d;
  }

  double Material::initial_concentration(const double x, const double y, const double z) const
  {
    double c = initial_(x, y, z, 0.0);
    if (!std::isfinite(c) && report_to_ != nullptr && report_to_->empty())
      *report_to_ = (region_->initial ? "region." + region_->name + ".initial" : std::string("initial.value")) +
                    ": expected a finite concentration everywhere, found " + number_text(c) + " at " +
                    describe_point(x, y, z, dimension_);
    if (region_->has_dispersed_phase() && region_->loading > 0)
      c = std::min(region_->loading / (region_->porosity * retardation_), region_->solubility);
    return c;
  }
} // namespace fickcast
