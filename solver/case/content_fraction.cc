#include "case/content_fraction.h"

#include "case/section_reader.h"

#include <algorithm>
#include <cmath>
#include <cstdio>
#include <optional>
#include <string>

namespace fickcast
{
  namespace
  {
    /// The outside concentration a face holds, in the reference phase, if it is one constant;
    /// nullopt for a face that rules an uptake out; NaN for a face with no say (sealed, no flux).
    std::optional<double> outside_value(const BoundarySpec &b, const CaseDescription &c)
    {
      switch (b.kind)
        {
          case BoundaryKind::sealed:
          case BoundaryKind::outflow:
            return std::nan("");
          case BoundaryKind::flux:
            if (b.value.is_constant() && b.value.value == 0)
              return std::nan("");
            return std::nullopt;
          case BoundaryKind::bath:
            return std::nullopt;
          case BoundaryKind::transfer:
            if (!b.ambient.is_constant())
              return std::nullopt;
            return b.ambient.value;
          case BoundaryKind::inflow:
          case BoundaryKind::concentration:
            {
              if (b.kind == BoundaryKind::concentration && b.value_is_ambient)
                return b.ambient.is_constant() ? std::optional<double>(b.ambient.value) : std::nullopt;
              if (!b.value.is_constant() || c.regions.empty())
                return std::nullopt;
              // A value inside the material: over the K of the region it touches, known here only
              // when every region has the same K.
              const double k = c.regions.front().partition;
              for (const auto &r : c.regions)
                if (r.partition != k)
                  return std::nullopt;
              return b.value.value / k;
            }
        }
      return std::nullopt;
    }

    /// The reference-phase concentration every open face holds, if the case tends to one.
    std::optional<double> equilibrium_value(const CaseDescription &c)
    {
      std::optional<double> common;
      for (const auto &stage : c.stages)
        for (const auto &b : stage.boundaries)
          {
            const auto value = outside_value(b, c);
            if (!value)
              return std::nullopt;
            if (std::isnan(*value))
              continue;
            if (common && std::abs(*value - *common) > 1e-12 * std::max(std::abs(*value), std::abs(*common)))
              return std::nullopt;
            common = *value;
          }
      return common;
    }

    std::string shown(const double value, const std::string &unit)
    {
      char text[64];
      std::snprintf(text, sizeof text, "%.4g", value);
      return std::string(text) + (unit == "1" ? "" : " " + unit);
    }

    bool is_uptake(const CaseDescription &c, double &equilibrium)
    {
      if (c.output.loading > 0)
        return false;
      const auto value = equilibrium_value(c);
      if (!value || !(*value > 0))
        return false;
      for (const auto &r : c.regions)
        {
          const ScalarField &initial = r.initial ? *r.initial : c.initial;
          if (r.loading > 0 || r.has_dispersed_phase() || !initial.is_constant() || initial.offset != 0)
            return false;
          if (!(initial.value / r.partition < *value * (1 - 1e-12)))
            return false;
        }
      equilibrium = *value;
      return true;
    }
  } // namespace

  void decide_content_fraction(const SectionReader &reader, CaseDescription &c)
  {
    c.output.uptake = is_uptake(c, c.output.equilibrium);
    const std::string wrong = c.output.uptake ? "release" : "uptake";
    for (const auto &event : c.output.releases)
      if (const auto *value = reader.get("output", wrong + "." + event.name))
        reader.fail(*value, c.output.uptake
                              ? "expected output.uptake." + event.name +
                                  ": this case takes the species up (every open face holds " +
                                  shown(c.output.equilibrium, c.units.concentration) +
                                  " in the reference phase, above the initial content), found a release level"
                              : "expected output.release." + event.name +
                                  ": output.uptake.* applies when every open face holds one constant concentration "
                                  "above a constant initial one (no loading, no bath, no inward flux), which this "
                                  "case does not");
  }
} // namespace fickcast
