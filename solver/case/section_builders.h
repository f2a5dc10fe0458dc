// The case builder's sections: each fills its part of a CaseDescription and checks the keys it joins.
#pragma once

#include "case/case_description.h"
#include "case/section_reader.h"

namespace fickcast
{
  // build_case calls these in this order, with the time and numerics (case_builder.cc) before the
  // output; each section may use what the earlier ones filled in.

  /// [geometry] (layers or a mesh file) against case.coordinates and dimension; sets reader.mesh.
  void build_geometry(SectionReader &reader, CaseDescription &c);

  /// [region.NAME] for each region of the geometry: diffusivity, porosity, sorption, decay, solubility.
  void build_regions(const SectionReader &reader, CaseDescription &c);

  /// [boundary.FACE] for each face of the geometry, after checking the face names; sets reader.faces.
  void build_boundaries(SectionReader &reader, CaseDescription &c);

  /// The stages: [stage.NAME] with their boundary overrides, or one stage up to time.end.
  void build_stages(const SectionReader &reader, CaseDescription &c);

  /// The temperature, from [temperature] or the stages, and one for every temperature-dependent region.
  void build_temperature(const SectionReader &reader, CaseDescription &c);

  /// [output]: folder, times, points, lines, thresholds, depths, releases, time lags, moments.
  void build_output(const SectionReader &reader, CaseDescription &c);

  /// [sweep] and [size]: studies over whole runs.
  void build_sweep_and_size(const SectionReader &reader, CaseDescription &c);
} // namespace fickcast
