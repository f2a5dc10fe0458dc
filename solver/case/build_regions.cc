// The case builder's [region.NAME] sections: one per region of the geometry, with their cross-key checks.
#include "case/section_builders.h"

#include "case/input_error.h"
#include "case/quantity_text.h"

#include <algorithm>
#include <cmath>

namespace fickcast
{
  namespace
  {
    /// The region's Darcy flux and dispersivities, checked against the dimension and coordinates.
    void read_flow(const SectionReader &reader, const std::string &section, const CaseDescription &c,
                   RegionSpec &region)
    {
      region.longitudinal_dispersivity = reader.quantity(section, "longitudinal_dispersivity", 0);
      region.transverse_dispersivity = reader.quantity(section, "transverse_dispersivity", 0);
      // The region's own flux, else the case's [flow] darcy_flux.
      const auto *flux = reader.get(section, "darcy_flux");
      if (flux == nullptr)
        flux = reader.get("flow", "darcy_flux");
      if (flux == nullptr)
        {
          for (const char *key : {"longitudinal_dispersivity", "transverse_dispersivity"})
            if (const auto *given = reader.get(section, key); given && given->si != 0)
              reader.fail(*given,
                          "a dispersivity needs water flowing: give darcy_flux in [" + section + "] or in [flow]");
          return;
        }
      const unsigned int n = reader.dimension;
      if (flux->list.size() != n)
        reader.fail(*flux, "expected " +
                             std::string(n == 1 ? "one value" : std::to_string(n) + " values, one per axis") +
                             " for a " + std::to_string(n) + "-D case, found " + std::to_string(flux->list.size()));
      for (const double q : flux->list)
        if (!std::isfinite(q))
          reader.fail(*flux, "expected finite values");
      region.darcy_flux = flux->list;
      if (!region.has_flow())
        return;
      if (c.geometry.radial())
        reader.fail(*flux, "water flow is not available with coordinates = " +
                             std::string(c.geometry.coordinates == Coordinates::sphere ? "sphere" : "cylinder") +
                             " (a constant radial flux would not conserve water); use cartesian or axisymmetric");
      if (c.geometry.coordinates == Coordinates::axisymmetric && region.darcy_flux[0] != 0)
        reader.fail(*flux, "in an axisymmetric case only flow along the axis (r component 0) keeps a constant flux "
                           "free of sources; found an r component of " +
                             std::to_string(region.darcy_flux[0]) + " m/s");
      if (n == 1 && reader.get(section, "transverse_dispersivity") &&
          reader.get(section, "transverse_dispersivity")->si != 0)
        reader.fail(*reader.get(section, "transverse_dispersivity"),
                    "a 1-D case has no direction across the flow; give longitudinal_dispersivity only");
    }
  } // namespace

  void build_regions(const SectionReader &reader, CaseDescription &c)
  {
    const bool from_mesh = !c.geometry.mesh_file.empty();
    const std::vector<std::string> region_names = c.geometry.region_names();
    for (const auto &name : reader.settings.names_of("region"))
      if (std::find(region_names.begin(), region_names.end(), name) == region_names.end())
        {
          std::string list;
          for (const auto &n : region_names)
            list += (list.empty() ? "" : ", ") + n;
          const std::string suggestion = nearest(name, region_names);
          throw InputError(reader.where("region." + name), "region." + name,
                           (from_mesh ? "the mesh has no region of that name (regions in " + c.geometry.mesh_file + ": "
                                      : "names no layer of geometry.layers (layers: ") +
                             list + ")" + (suggestion.empty() ? "" : "; did you mean [region." + suggestion + "]?"));
        }
    for (const auto &name : region_names)
      {
        const std::string section = "region." + name;
        if (reader.settings.section_origins.count(section) == 0)
          throw InputError(reader.where("geometry"), from_mesh ? "geometry.mesh" : "geometry.layers",
                           "region '" + name + "' has no [" + section +
                             "] section: expected one with at least its diffusivity");
        RegionSpec region;
        region.name = name;
        const auto *diffusivity = reader.get(section, "diffusivity");
        const auto *prefactor = reader.get(section, "diffusivity_prefactor");
        const auto *activation = reader.get(section, "activation_energy");
        if (diffusivity && prefactor)
          reader.fail(*prefactor, "expected either diffusivity or diffusivity_prefactor with activation_energy, "
                                  "found both (diffusivity at " +
                                    diffusivity->origin + ")");
        if (prefactor && !activation)
          reader.missing(section, "activation_energy",
                         "the activation energy that goes with diffusivity_prefactor, "
                         "such as 3.46 eV");
        if (activation && !prefactor)
          reader.fail(*activation, "expected diffusivity_prefactor with activation_energy, found no prefactor");
        if (!diffusivity && !prefactor)
          reader.missing(section, "diffusivity",
                         "the diffusivity of " + name +
                           ", such as 1e-9 m2/s (or diffusivity_prefactor and activation_energy)");
        if (diffusivity)
          region.diffusivity = diffusivity->field;
        else
          {
            region.arrhenius = true;
            region.prefactor = prefactor->si;
            region.activation_energy = activation->si;
          }
        region.porosity = reader.quantity(section, "porosity", 1);
        region.tortuosity = reader.quantity(section, "tortuosity", 1);
        const std::string law = reader.text(section, "porosity_law");
        const auto *exponent = reader.get(section, "archie_exponent");
        if (law != "none" && reader.get(section, "tortuosity"))
          reader.fail(*reader.get(section, "tortuosity"), "expected either tortuosity or porosity_law, found both");
        if (law == "archie")
          {
            if (!exponent)
              reader.missing(section, "archie_exponent", "Archie's exponent m for porosity_law = archie, such as 2");
            region.porosity_law = PorosityLaw::archie;
            region.archie_exponent = exponent->si;
          }
        else if (exponent)
          reader.fail(*exponent, "only used with porosity_law = archie");
        if (law == "millington_quirk")
          region.porosity_law = PorosityLaw::millington_quirk;
        // The tortuosity a law gives, and the retardation of rho_b and Kd: model/material.cc.
        const auto *retardation = reader.get(section, "retardation");
        const auto *density = reader.get(section, "bulk_density");
        const auto *kd = reader.get(section, "distribution_coefficient");
        if (retardation && (density || kd))
          reader.fail(*retardation, "expected either retardation or bulk_density with distribution_coefficient, "
                                    "found both");
        if ((density != nullptr) != (kd != nullptr))
          reader.fail(density ? *density : *kd, "expected bulk_density and distribution_coefficient together "
                                                "(R = 1 + rho_b Kd / theta), found only one");
        region.retardation = retardation ? retardation->si : 1.0;
        region.bulk_density = density ? density->si : 0.0;
        region.distribution_coefficient = kd ? kd->si : 0.0;
        region.partition = reader.quantity(section, "partition", 1);
        const auto *rate = reader.get(section, "decay_rate");
        const auto *half_life = reader.get(section, "half_life");
        if (rate && half_life)
          reader.fail(*half_life,
                      "expected either decay_rate or half_life, found both (decay_rate at " + rate->origin + ")");
        region.decay_rate = rate ? rate->si : half_life ? std::log(2.0) / half_life->si : 0.0;
        region.decay_dissolved_only = reader.text(section, "decay_applies_to") == "dissolved";
        const auto *loading = reader.get(section, "loading");
        const auto *solubility = reader.get(section, "solubility");
        if (loading && !solubility)
          reader.fail(*loading, "expected a solubility with the loading (the content above it stays undissolved)");
        if (solubility)
          {
            region.solubility = solubility->si;
            region.loading = loading ? loading->si : 0.0;
            if (reader.get(section, "initial") && loading)
              reader.fail(*loading, "expected either loading (total content) or initial (dissolved concentration), "
                                    "found both");
          }
        region.source = reader.field(section, "source");
        if (const auto *initial = reader.get(section, "initial"))
          region.initial = initial->field;
        region.cell_size = reader.quantity(section, "cell_size", 0);
        if (from_mesh && reader.get(section, "cell_size"))
          reader.fail(*reader.get(section, "cell_size"), "not used with geometry.mesh (set sizes in the .geo, or use "
                                                         "geometry.refine)");
        read_flow(reader, section, c, region);
        for (auto &layer : c.geometry.layers)
          if (layer.name == name)
            layer.cell_size = region.cell_size;
        c.regions.push_back(region);
      }
  }
} // namespace fickcast
