// Fuzz harness: the bytes as a case file, through the path `fickcast check` takes before the
// mesh: read_case (INI reader, schema, units, expressions, tables, the case builder with every
// section's checks, a mesh file's groups), then the size estimate and its limits.
// An InputError is the expected answer to bad input; anything else thrown, a crash, a hang, a
// sanitizer report or a non-finite number in an accepted case is a finding.
#include "case/case_reader.h"
#include "case/ini_document.h"
#include "case/input_error.h"
#include "fuzz_scratch.h"
#include "numerics/run_size.h"

#include <cmath>
#include <cstddef>
#include <cstdint>
#include <string>

namespace
{
  using namespace fickcast;

  void finite(const double value, const std::string &what)
  {
    if (!std::isfinite(value))
      fuzz::finding("the case was accepted with a non-finite " + what);
  }

  void finite(const ScalarField &field, const std::string &what)
  {
    finite(field.value, what);
    finite(field.scale, what + " (scale)");
    finite(field.offset, what + " (offset)");
    for (std::size_t i = 0; i < field.table.times.size(); ++i)
      {
        finite(field.table.times[i], what + " (table time)");
        finite(field.table.values[i], what + " (table value)");
      }
  }

  void finite(const BoundarySpec &b)
  {
    const std::string what = "boundary " + b.name;
    finite(b.value, what + " value");
    finite(b.ambient, what + " ambient");
    finite(b.coefficient, what + " coefficient");
    finite(b.volume, what + " volume");
    finite(b.bath_partition, what + " bath partition");
    finite(b.bath_initial, what + " bath initial");
  }

  /// Every number of an accepted case is finite: a NaN or an infinity is never a value.
  void check_finite(const CaseDescription &c)
  {
    const GeometrySpec &g = c.geometry;
    for (const double v : {g.cell_size, g.width, g.length, g.radius, g.inner_radius, g.grading,
                           g.side_coating.thickness, g.side_coating.cell_size})
      finite(v, "geometry value");
    finite(g.inner_radius + g.total_thickness(), "outer face of the layers");
    finite(g.radius + g.side_coating.thickness, "outer face of the side coating");
    for (const auto &layer : g.layers)
      {
        finite(layer.thickness, "layer thickness");
        finite(layer.cell_size, "layer cell size");
      }
    for (const auto &r : c.regions)
      {
        const std::string what = "region " + r.name;
        finite(r.diffusivity, what + " diffusivity");
        finite(r.source, what + " source");
        if (r.initial)
          finite(*r.initial, what + " initial");
        for (const double v : {r.prefactor, r.activation_energy, r.porosity, r.tortuosity, r.archie_exponent,
                               r.retardation, r.bulk_density, r.distribution_coefficient, r.partition, r.decay_rate,
                               r.loading, r.solubility, r.cell_size})
          finite(v, what + " coefficient");
      }
    for (const auto &b : c.boundaries)
      finite(b);
    for (const auto &stage : c.stages)
      {
        finite(stage.start, "stage start");
        finite(stage.duration, "stage duration");
        for (const auto &b : stage.boundaries)
          finite(b);
      }
    for (std::size_t i = 0; i < c.temperature.times.size(); ++i)
      {
        finite(c.temperature.times[i], "temperature schedule time");
        finite(c.temperature.temperatures[i], "temperature schedule temperature");
      }
    finite(c.initial, "initial value");
    for (const double v :
         {c.time.end, c.time.step, c.time.tolerance, c.time.initial_step, c.time.max_step, c.numerics.solver_tolerance,
          c.numerics.nonlinear_tolerance, c.output.fields_every, c.output.loading, c.size.tolerance})
      finite(v, "time, numerics or output value");
    for (const double t : c.output.times)
      finite(t, "output time");
    for (const auto &p : c.output.points)
      for (const double x : p.point)
        finite(x, "coordinate of point " + p.name);
    for (const auto &l : c.output.lines)
      for (std::size_t i = 0; i < 3; ++i)
        {
          finite(l.from[i], "coordinate of line " + l.name);
          finite(l.to[i], "coordinate of line " + l.name);
        }
    for (const auto *levels : {&c.output.thresholds, &c.output.depths, &c.output.releases})
      for (const auto &level : *levels)
        finite(level.level, "level " + level.name);
    if (!(c.time.end > 0))
      fuzz::finding("the case was accepted with an end time that is not positive");
  }
} // namespace

extern "C" int LLVMFuzzerTestOneInput(const uint8_t *data, const std::size_t size)
{
  const std::string folder = fuzz::scratch_folder() + "/case";
  const std::string path = folder + "/case.ini";
  // Files a case names (geometry.mesh, file: tables) must stay inside the scratch folder; an
  // input that names anything else is not run (and not kept by libFuzzer).
  try
    {
      const IniDocument document = IniDocument::parse(std::string(reinterpret_cast<const char *>(data), size), path);
      for (const auto &entry : document.entries())
        {
          const std::string &value = entry.value;
          if (!fuzz::inside_scratch(folder, value.rfind("file:", 0) == 0 ? value.substr(5) : value))
            return -1;
        }
    }
  catch (const InputError &)
    {
      // read_case below meets the same mistake before it opens any other file.
    }
  fuzz::write_input("case/case.ini", data, size);
  try
    {
      const CaseDescription description = read_case(path);
      check_finite(description);
      check_run_size(description, estimate_run_size(description), 24.0 * (1ul << 30));
    }
  catch (const InputError &)
    {
    }
  return 0;
}
