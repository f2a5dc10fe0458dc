// The case builder's boundaries, stages and temperature: faces, conditions and what changes per stage.
#include "case/section_builders.h"

#include "case/expression.h"
#include "case/input_error.h"
#include "case/quantity_text.h"

#include <algorithm>
#include <cmath>

namespace fickcast
{
  namespace
  {
    /// Throws unless @p name (in @p key at @p origin) is a boundary of the geometry that takes a condition.
    void check_face_name(const SectionReader &reader, const std::string &name, const std::string &key,
                         const std::string &origin)
    {
      if (GeometrySpec::is_symmetry_face(name) &&
          std::find(reader.faces.begin(), reader.faces.end(), name) != reader.faces.end())
        throw InputError(origin, key,
                         "the " + name + " is a symmetry " + (name == "axis" ? "axis" : "point") +
                           " with no flux across it; it takes no boundary condition");
      if (std::find(reader.faces.begin(), reader.faces.end(), name) != reader.faces.end())
        return;
      std::vector<std::string> settable;
      for (const auto &f : reader.faces)
        if (!GeometrySpec::is_symmetry_face(f))
          settable.push_back(f);
      std::string list;
      for (const auto &f : settable)
        list += (list.empty() ? "" : ", ") + f;
      const std::string suggestion = nearest(name, settable);
      const std::string what = reader.mesh.empty() ? "the built-in " + std::to_string(reader.dimension) + "-D geometry"
                                                   : "the mesh " + reader.mesh;
      throw InputError(origin, key,
                       "unknown boundary of " + what + " (boundaries: " + list + ")" +
                         (suggestion.empty() ? "" : "; did you mean '" + suggestion + "'?"));
    }

    /// A `value` (inside the material) is ambiguous on a face touching regions with different
    /// partition coefficients; `ambient` is not.
    void check_unambiguous_phase(const SectionReader &reader, const CaseDescription &c, const BoundarySpec &boundary,
                                 const SettingValue *value)
    {
      if (value == nullptr || !c.geometry.mesh_file.empty())
        return; // on a mesh file the solver checks the cells along the face
      const GeometrySpec &g = c.geometry;
      std::vector<std::string> names;
      const std::string first = g.layers.front().name, last = g.layers.back().name;
      const bool coated = g.side_coating.thickness > 0;
      if ((boundary.name == "top" && !g.radial()) || boundary.name == "inner")
        names = {first};
      else if (boundary.name == "bottom" || boundary.name == "outer")
        names = {last};
      else if (boundary.name == "side" && coated)
        names = {g.side_coating.name};
      else
        for (const auto &layer : g.layers)
          names.push_back(layer.name);
      if (coated && (boundary.name == "top" || boundary.name == "bottom"))
        names.push_back(g.side_coating.name);
      if (boundary.name == "inner" && g.coordinates == Coordinates::axisymmetric)
        for (const auto &layer : g.layers)
          names.push_back(layer.name);
      std::vector<const RegionSpec *> touching;
      for (const auto &name : names)
        touching.push_back(c.find_region(name));
      for (const auto *r : touching)
        if (r->partition != touching.front()->partition)
          reader.fail(*value, "ambiguous: the face touches regions with different partition coefficients (" +
                                touching.front()->name + " and " + r->name +
                                "); give 'ambient' (the outside concentration, reference phase) instead");
    }

    /// The boundary @p face, from [boundary.FACE], or in stage @p stage_section (`stage.NAME`):
    /// if the stage gives boundary.FACE.type its keys define the face alone, otherwise they
    /// override the [boundary.FACE] keys one by one.
    BoundarySpec build_boundary(const SectionReader &reader, const CaseDescription &c, const std::string &face,
                                const std::string &stage_section)
    {
      const std::string base = "boundary." + face;
      const bool stage_defines = !stage_section.empty() && reader.get(stage_section, base + ".type") != nullptr;
      auto key = [&](const std::string &name) -> const SettingValue * {
        if (!stage_section.empty())
          if (const auto *v = reader.get(stage_section, base + "." + name))
            return v;
        return stage_defines ? nullptr : reader.get(base, name);
      };
      const std::string context = stage_section.empty() ? base : stage_section;
      const std::string key_prefix = stage_section.empty() ? "" : base + ".";
      BoundarySpec boundary;
      boundary.name = face;
      const bool any = key("type") || key("value") || key("ambient") || key("coefficient") || key("volume");
      if (!any)
        return boundary; // sealed
      const auto *type = key("type");
      if (type == nullptr)
        reader.missing(context, key_prefix + "type", "one of concentration, flux, transfer, sealed, bath");
      const auto *value = key("value");
      const auto *ambient = key("ambient");
      const auto *coefficient = key("coefficient");
      const auto *volume = key("volume");
      const auto *bath_partition = key("partition");
      const auto *bath_initial = key("initial");
      auto forbid = [&](const SettingValue *v, const std::string &why) {
        if (v)
          reader.fail(*v, "not used with type = " + type->text + " (" + why + ")");
      };
      if (type->text != "bath")
        {
          forbid(volume, "only a bath has a volume");
          forbid(bath_partition, "only a bath has a partition coefficient here");
          forbid(bath_initial, "only a bath has an initial concentration here");
        }
      if (type->text == "concentration")
        {
          boundary.kind = BoundaryKind::concentration;
          forbid(coefficient, "the concentration is imposed");
          if (value && ambient)
            reader.fail(*ambient, "expected either value (inside the material) or ambient (outside, "
                                  "reference phase), found both (value at " +
                                    value->origin + ")");
          if (!value && !ambient)
            reader.missing(context, key_prefix + "value", "the concentration at the face, such as 250 mg/L");
          boundary.value_is_ambient = ambient != nullptr;
          boundary.value = value ? value->field : ambient->field;
          if (ambient)
            boundary.ambient = ambient->field;
          check_unambiguous_phase(reader, c, boundary, value);
        }
      else if (type->text == "flux")
        {
          boundary.kind = BoundaryKind::flux;
          forbid(coefficient, "the flux is imposed");
          forbid(ambient, "the flux is imposed");
          if (!value)
            reader.missing(context, key_prefix + "value", "the inward flux, such as 1e-6 kg/(m2 s)");
          boundary.value = value->field;
        }
      else if (type->text == "transfer")
        {
          boundary.kind = BoundaryKind::transfer;
          forbid(value, "give ambient for the outside concentration and coefficient for h");
          if (!coefficient)
            reader.missing(context, key_prefix + "coefficient", "the transfer coefficient h, such as 1e-7 m/s");
          boundary.coefficient = coefficient->si;
          boundary.ambient = ambient ? ambient->field : ScalarField::constant(0);
        }
      else if (type->text == "bath")
        {
          boundary.kind = BoundaryKind::bath;
          forbid(value, "the bath concentration follows from what crosses the face; give initial");
          forbid(ambient, "the bath concentration follows from what crosses the face; give initial");
          forbid(coefficient, "the bath is well stirred and in equilibrium with the face");
          if (!volume)
            reader.missing(context, key_prefix + "volume", "the bath volume (" + describe_dim(Dim::bath_volume) + ")");
          boundary.volume = volume->si;
          boundary.bath_partition = bath_partition ? bath_partition->si : 1.0;
          boundary.bath_initial = bath_initial ? bath_initial->si : 0.0;
        }
      else if (type->text == "inflow")
        {
          boundary.kind = BoundaryKind::inflow;
          forbid(coefficient, "the entering water carries the species");
          forbid(ambient, "give value, the concentration of the entering water");
          if (!value)
            reader.missing(context, key_prefix + "value", "the concentration of the entering water, such as 250 mg/L");
          boundary.value = value->field;
        }
      else if (type->text == "outflow")
        {
          boundary.kind = BoundaryKind::outflow;
          forbid(value, "the water leaves with the concentration it has at the face");
          forbid(ambient, "the water leaves with the concentration it has at the face");
          forbid(coefficient, "the water leaves with the concentration it has at the face");
        }
      else
        {
          boundary.kind = BoundaryKind::sealed;
          forbid(value, "a sealed face has no value");
          forbid(ambient, "a sealed face has no value");
          forbid(coefficient, "a sealed face has no value");
        }
      return boundary;
    }
  } // namespace

  void build_boundaries(SectionReader &reader, CaseDescription &c)
  {
    reader.faces = c.geometry.face_names(reader.dimension);
    for (const auto &name : reader.settings.names_of("boundary"))
      check_face_name(reader, name, "boundary." + name, reader.where("boundary." + name));
    for (const auto &face : reader.faces)
      c.boundaries.push_back(build_boundary(reader, c, face, ""));
  }

  void build_stages(const SectionReader &reader, CaseDescription &c)
  {
    const auto names = reader.settings.names_of("stage");
    const auto *end = reader.get("time", "end");
    if (names.empty())
      {
        if (end == nullptr)
          reader.missing("time", "end", "the end time of the run, such as 60 yr");
        StageSpec stage;
        stage.name = "run";
        stage.duration = end->si;
        stage.boundaries = c.boundaries;
        c.stages.push_back(stage);
        return;
      }
    double start = 0;
    for (const auto &name : names)
      {
        const std::string section = "stage." + name;
        const auto *duration = reader.get(section, "duration");
        if (duration == nullptr)
          reader.missing(section, "duration", "the duration of stage " + name + ", such as 30 min");
        for (const auto &v : reader.settings.all())
          if (v.section == section && v.key.rfind("boundary.", 0) == 0)
            {
              const auto dot = v.key.find('.', 9);
              check_face_name(reader, v.key.substr(9, dot - 9), v.full_key(), v.origin);
            }
        StageSpec stage;
        stage.name = name;
        stage.start = start;
        stage.duration = duration->si;
        for (const auto &face : reader.faces)
          stage.boundaries.push_back(build_boundary(reader, c, face, section));
        start += stage.duration;
        if (!std::isfinite(start))
          reader.fail(*duration, "expected stage durations whose sum stays within the range of numbers, found a "
                                 "total beyond 1.8e308 s at stage " +
                                   name);
        c.stages.push_back(stage);
      }
    if (end && std::abs(end->si - start) > 1e-9 * start)
      reader.fail(*end, "expected the end time to equal the sum of the stage durations (" + format_si(start, "s") +
                          ") or to be left out, found '" + end->written + "'");
  }

  void build_temperature(const SectionReader &reader, CaseDescription &c)
  {
    const auto *global = reader.get("temperature", "schedule");
    bool any_stage = false;
    for (const auto &stage : c.stages)
      any_stage = any_stage || reader.get("stage." + stage.name, "temperature") != nullptr;
    if (global && any_stage)
      reader.fail(*global, "expected the temperature either in [temperature] or in the stages, found both");
    if (global)
      c.temperature = global->schedule;
    else if (any_stage)
      {
        double last = -1;
        for (const auto &stage : c.stages)
          {
            const auto *own = reader.get("stage." + stage.name, "temperature");
            if (own)
              {
                // The stage's schedule, then a hold at its last temperature to the stage end.
                TemperatureSchedule within = own->schedule;
                if (within.times.back() < stage.duration)
                  {
                    within.times.push_back(stage.duration);
                    within.temperatures.push_back(within.temperatures.back());
                  }
                else if (within.times.back() > stage.duration * (1 + 1e-12))
                  reader.fail(*own, "expected a temperature schedule within the stage duration (" +
                                      format_si(stage.duration, "s") + "), found one lasting " +
                                      format_si(within.times.back(), "s"));
                c.temperature.append(within, stage.start);
                last = within.temperatures.back();
              }
            else if (last < 0)
              throw InputError(reader.where("stage." + stage.name), "stage." + stage.name + ".temperature",
                               "missing: the first stage with a temperature must be the first stage, so that "
                               "the temperature is known from the start");
            else
              {
                TemperatureSchedule hold;
                hold.times = {0.0, stage.duration};
                hold.temperatures = {last, last};
                c.temperature.append(hold, stage.start);
              }
          }
      }
    for (const auto &region : c.regions)
      {
        bool uses_temperature = region.arrhenius;
        if (!region.diffusivity.expression.empty())
          uses_temperature =
            uses_temperature || Expression(region.diffusivity.expression, {"x", "y", "z", "t", "T", "c"}).uses("T");
        if (uses_temperature && c.temperature.empty())
          throw InputError(reader.where("region." + region.name), "region." + region.name + ".diffusivity",
                           "depends on temperature, but no temperature is given: expected [temperature] "
                           "schedule = ... or a temperature in each stage");
      }
  }
} // namespace fickcast
