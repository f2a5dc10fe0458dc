#include "model/material.h"

#include "model/value_text.h"

#include <algorithm>
#include <cmath>
#include <string>

namespace fickcast
{
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
                     const unsigned int dimension, std::string *report_to, std::string *non_finite_to)
    : region_(&region)
    , dimension_(dimension)
    , tortuosity_(tortuosity_factor(region))
    , retardation_(retardation_factor(region))
    , diffusivity_(region, temperature)
    , source_(region.source)
    , initial_field_(region.initial ? *region.initial : initial)
    , initial_(initial_field_)
    , report_to_(report_to)
    , non_finite_to_(non_finite_to)
  {
  }

  double Material::source(const double x, const double y, const double z, const double t) const
  {
    const double s = source_(x, y, z, t);
    if (!std::isfinite(s))
      report_non_finite(non_finite_to_, "region." + region_->name + ".source", s, source_.depends_on_space(), x, y, z,
                        t, dimension_);
    return s;
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
