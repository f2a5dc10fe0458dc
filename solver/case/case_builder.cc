// build_case: the sections in order (section_builders.h), then [time], [numerics] and the settings record.
#include "case/case_builder.h"
#include "case/content_fraction.h"

#include "case/section_builders.h"

#include <stdexcept>
#include <string>

namespace fickcast
{
  namespace
  {
    /// [time]: fixed or adaptive steps within the end of the last stage, and the scheme.
    void build_time(const SectionReader &reader, CaseDescription &c)
    {
      c.time.end = c.stages.back().end();
      const auto *step = reader.get("time", "step");
      c.time.adaptive = step == nullptr || step->is_auto;
      c.time.step = c.time.adaptive ? 0 : step->si;
      if (!c.time.adaptive && c.time.step > c.time.end)
        reader.fail(*step, "expected a step no longer than time.end (" + format_si(c.time.end, "s") + "), found '" +
                             step->written + "'");
      c.time.tolerance = reader.quantity("time", "tolerance", 1e-4);
      const std::string control = reader.text("time", "error_control");
      c.time.error_control = control == "global"  ? ErrorControl::global
                             : control == "local" ? ErrorControl::local
                                                  : ErrorControl::automatic;
      const std::string scheme = reader.text("time", "scheme");
      c.time.scheme = scheme == "implicit_euler"   ? TimeScheme::implicit_euler
                      : scheme == "crank_nicolson" ? TimeScheme::crank_nicolson
                                                   : TimeScheme::bdf2;
      c.time.start_steps = static_cast<unsigned int>(reader.quantity("time", "start_steps", 4));
      c.time.initial_step = reader.quantity("time", "initial_step", 0);
      c.time.max_step = reader.quantity("time", "max_step", 0);
      for (const char *key : {"initial_step", "max_step"})
        if (const auto *v = reader.get("time", key); v && !v->is_auto && v->si > c.time.end)
          reader.fail(*v, "expected at most time.end (" + format_si(c.time.end, "s") + "), found '" + v->written + "'");
    }

    /// [numerics]: element degree, linear and nonlinear solvers.
    void build_numerics(const SectionReader &reader, CaseDescription &c)
    {
      c.numerics.degree = static_cast<unsigned int>(reader.quantity("numerics", "degree", 2));
      const std::string solver = reader.text("numerics", "linear_solver");
      c.numerics.linear_solver = solver == "direct"      ? LinearSolverKind::direct
                                 : solver == "iterative" ? LinearSolverKind::iterative
                                 : solver == "diagonal"  ? LinearSolverKind::diagonal
                                 : solver == "multigrid" ? LinearSolverKind::multigrid
                                                         : LinearSolverKind::automatic;
      c.numerics.solver_tolerance = reader.quantity("numerics", "solver_tolerance", 1e-12);
      c.numerics.matrix_free = reader.text("numerics", "matrix_free") != "off";
      c.numerics.newton = reader.text("numerics", "nonlinear_solver") == "newton";
      c.numerics.nonlinear_tolerance = reader.quantity("numerics", "nonlinear_tolerance", 1e-8);
      c.numerics.max_nonlinear_iterations =
        static_cast<unsigned int>(reader.quantity("numerics", "max_nonlinear_iterations", 30));
      c.numerics.accuracy = 1e-3;
      if (const auto *v = reader.get("numerics", "accuracy"))
        {
          const std::string &text = v->text;
          const std::string expected = "expected a relative accuracy between 1e-8 and 0.1 (such as 1e-3 or 0.1 %), or "
                                       "off, found '" +
                                       v->written + "'";
          if (text == "off")
            c.numerics.accuracy = 0;
          else
            {
              std::size_t used = 0;
              double value = 0;
              try
                {
                  value = std::stod(text, &used);
                }
              catch (const std::exception &)
                {
                  reader.fail(*v, expected);
                }
              std::string rest = text.substr(used);
              rest.erase(0, rest.find_first_not_of(' '));
              if (rest == "%")
                value /= 100;
              else if (!rest.empty())
                reader.fail(*v, expected);
              if (!(value >= 1e-8 && value <= 0.1))
                reader.fail(*v, expected);
              c.numerics.accuracy = value;
            }
        }
      c.numerics.accuracy_solves = static_cast<unsigned int>(reader.quantity("numerics", "accuracy_solves", 3));
      c.numerics.remesh = reader.text("numerics", "remesh") == "on";
      for (const RegionSpec &region : c.regions)
        if (c.numerics.remesh && region.has_dispersed_phase())
          reader.fail(*reader.get("numerics", "remesh"),
                      "expected off: region " + region.name +
                        " holds undissolved content (a solubility), which the remeshing does not carry yet; found on");
      c.numerics.remesh_error = reader.quantity("numerics", "remesh_error", 1e-3);
      c.numerics.remesh_every = static_cast<unsigned int>(reader.quantity("numerics", "remesh_every", 5));
      c.numerics.smallest_cell = reader.quantity("numerics", "smallest_cell", 0);
      c.numerics.largest_cell = reader.quantity("numerics", "largest_cell", 0);
    }

    /// Records @p section.@p key as given, or its default if it has one.
    void add_record(const SectionReader &reader, CaseDescription &c, const std::string &section,
                    const KeySpec &key_spec)
    {
      if (const auto *v = reader.get(section, key_spec.key))
        c.settings.push_back(SettingRecord{v->full_key(), v->written, v->si_text(), v->origin});
      else if (!key_spec.fallback.empty())
        {
          std::string si = key_spec.fallback;
          if (key_spec.kind == ValueKind::quantity || key_spec.kind == ValueKind::field)
            if (key_spec.fallback != "auto")
              {
                si = format_si(std::stod(key_spec.fallback), key_spec.dim == Dim::concentration ? c.units.concentration
                                                             : key_spec.dim == Dim::source      ? c.units.source
                                                             : key_spec.dim == Dim::rate        ? "1/s"
                                                                                                : "");
              }
          c.settings.push_back(SettingRecord{section + "." + key_spec.key, key_spec.fallback, si, "default"});
        }
    }

    /// The settings record: every key given or defaulted, with its SI value and origin.
    void record_settings(const SectionReader &reader, CaseDescription &c)
    {
      for (const auto &section : fixed_sections())
        for (const auto &key_spec : key_schema())
          {
            if (key_spec.section != section)
              continue;
            if (key_spec.is_pattern())
              {
                for (const auto &v : reader.settings.all())
                  if (v.section == section && v.spec == &key_spec)
                    c.settings.push_back(SettingRecord{v.full_key(), v.written, v.si_text(), v.origin});
              }
            else
              add_record(reader, c, section, key_spec);
          }
      for (const auto &region : c.regions)
        for (const auto &key_spec : key_schema())
          if (key_spec.section == "region")
            add_record(reader, c, "region." + region.name, key_spec);
      for (const auto &stage : c.stages)
        for (const auto &v : reader.settings.all())
          if (v.section == "stage." + stage.name)
            c.settings.push_back(SettingRecord{v.full_key(), v.written, v.si_text(), v.origin});
      for (const auto &boundary : c.boundaries)
        {
          const std::string section = "boundary." + boundary.name;
          if (reader.settings.section_origins.count(section) == 0)
            {
              c.settings.push_back(SettingRecord{section + ".type", "sealed", "sealed", "default"});
              continue;
            }
          for (const auto &key_spec : key_schema())
            if (key_spec.section == "boundary")
              add_record(reader, c, section, key_spec);
        }
      if (reader.get("output", "folder") == nullptr)
        c.settings.push_back(SettingRecord{"output.folder", "", c.output.folder, "default"});
    }
  } // namespace

  CaseDescription build_case(const Settings &settings, const unsigned int dimension)
  {
    SectionReader reader(settings, dimension);
    CaseDescription c;
    c.file = settings.file;
    c.dimension = dimension;
    c.units = settings.units;
    c.input_warnings = settings.warnings;
    c.title = reader.text("case", "title");
    build_geometry(reader, c);
    build_regions(reader, c);
    build_boundaries(reader, c);
    build_stages(reader, c);
    build_temperature(reader, c);
    c.initial = reader.field("initial", "value");
    build_time(reader, c);
    build_numerics(reader, c);
    build_output(reader, c);
    decide_content_fraction(reader, c);
    build_sweep_and_size(reader, c);
    record_settings(reader, c);
    return c;
  }
} // namespace fickcast
