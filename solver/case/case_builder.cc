#include "case/case_builder.h"

#include "case/input_error.h"
#include "case/quantity_text.h"

#include <algorithm>
#include <cmath>
#include <filesystem>

namespace fickcast
{
  namespace
  {
    class Builder
    {
    public:
      Builder(const Settings &settings_in, const unsigned int dimension_in)
        : settings(settings_in)
        , dimension(dimension_in)
      {
      }

      CaseDescription build()
      {
        CaseDescription c;
        c.file = settings.file;
        c.dimension = dimension;
        c.units = settings.units;
        c.title = text("case", "title");
        build_geometry(c);
        build_regions(c);
        build_boundaries(c);
        c.initial = field("initial", "value");
        build_time(c);
        build_numerics(c);
        build_output(c);
        record_settings(c);
        return c;
      }

    private:
      const Settings &settings;
      const unsigned int dimension;

      const SettingValue *get(const std::string &section, const std::string &key) const
      {
        return settings.find(section, key);
      }

      std::string where(const std::string &section) const
      {
        const auto it = settings.section_origins.find(section);
        if (it != settings.section_origins.end())
          return it->second;
        return settings.file;
      }

      [[noreturn]] void missing(const std::string &section, const std::string &key, const std::string &expected) const
      {
        const bool has_section = settings.section_origins.count(section) != 0;
        throw InputError(where(section), section + "." + key,
                         "missing required key: expected " + expected +
                           (has_section ? "" : " (there is no [" + section + "] section)"));
      }

      const KeySpec &spec(const std::string &section, const std::string &key) const
      {
        const KeySpec *s = find_key(section_kind(section), key);
        if (s == nullptr)
          throw std::logic_error("fickcast: key not in schema: " + section + "." + key);
        return *s;
      }

      std::string text(const std::string &section, const std::string &key) const
      {
        if (const auto *v = get(section, key))
          return v->text;
        return spec(section, key).fallback;
      }

      double quantity(const std::string &section, const std::string &key, const double fallback) const
      {
        if (const auto *v = get(section, key); v && !v->is_auto)
          return v->si;
        return fallback;
      }

      bool is_set(const std::string &section, const std::string &key) const
      {
        const auto *v = get(section, key);
        return v != nullptr && !v->is_auto;
      }

      ScalarField field(const std::string &section, const std::string &key) const
      {
        if (const auto *v = get(section, key))
          return v->field;
        const std::string fallback = spec(section, key).fallback;
        return ScalarField::constant(fallback.empty() ? 0.0 : std::stod(fallback));
      }

      [[noreturn]] void fail(const SettingValue &value, const std::string &message) const
      {
        throw InputError(value.origin, value.full_key(), message);
      }

      void build_geometry(CaseDescription &c) const
      {
        const auto *layers = get("geometry", "layers");
        if (layers == nullptr)
          missing("geometry", "layers", "the layers from the top face inward, such as 'clay 0.9 m, sand 0.3 m'");
        c.geometry.layers = layers->layers;
        const double total = c.geometry.total_thickness();
        c.geometry.cell_size = quantity("geometry", "cell_size", total / 100.0);
        if (dimension >= 2)
          {
            if (!is_set("geometry", "width"))
              missing("geometry", "width", "the extent along x of this " + std::to_string(dimension) + "-D case");
            c.geometry.width = quantity("geometry", "width", 0);
          }
        else if (const auto *w = get("geometry", "width"))
          fail(*w, "expected no width in a 1-D case (it is used in 2-D and 3-D), found '" + w->written + "'");
        if (dimension == 3)
          {
            if (!is_set("geometry", "length"))
              missing("geometry", "length", "the extent along y of this 3-D case");
            c.geometry.length = quantity("geometry", "length", 0);
          }
        else if (const auto *l = get("geometry", "length"))
          fail(*l, "expected no length in a " + std::to_string(dimension) +
                     "-D case (it is the extent along y in 3-D), found '" + l->written + "'");
        const std::string grade = text("geometry", "grade_toward");
        c.geometry.grade_toward = grade == "top" ? Face::top : grade == "bottom" ? Face::bottom : Face::none;
        c.geometry.grading = quantity("geometry", "grading", 1.0);
        if (c.geometry.grade_toward == Face::none && c.geometry.grading != 1.0)
          fail(*get("geometry", "grading"), "expected grade_toward = top or bottom with a grading other than 1, "
                                            "found grade_toward = none");
      }

      void build_regions(CaseDescription &c) const
      {
        std::vector<std::string> layer_names;
        for (const auto &layer : c.geometry.layers)
          layer_names.push_back(layer.name);
        for (const auto &name : settings.names_of("region"))
          if (std::find(layer_names.begin(), layer_names.end(), name) == layer_names.end())
            {
              std::string list;
              for (const auto &n : layer_names)
                list += (list.empty() ? "" : ", ") + n;
              const std::string suggestion = nearest(name, layer_names);
              throw InputError(where("region." + name), "region." + name,
                               "names no layer of geometry.layers (layers: " + list + ")" +
                                 (suggestion.empty() ? "" : "; did you mean [region." + suggestion + "]?"));
            }
        for (auto &layer : c.geometry.layers)
          {
            const std::string section = "region." + layer.name;
            if (settings.section_origins.count(section) == 0)
              throw InputError(where("geometry"), "geometry.layers",
                               "layer '" + layer.name + "' has no [" + section +
                                 "] section: expected one with at least its diffusivity");
            RegionSpec region;
            region.name = layer.name;
            if (get(section, "diffusivity") == nullptr)
              missing(section, "diffusivity", "the diffusivity of " + layer.name + ", such as 1e-9 m2/s");
            region.diffusivity = field(section, "diffusivity");
            region.porosity = quantity(section, "porosity", 1);
            region.tortuosity = quantity(section, "tortuosity", 1);
            region.retardation = quantity(section, "retardation", 1);
            region.partition = quantity(section, "partition", 1);
            const auto *rate = get(section, "decay_rate");
            const auto *half_life = get(section, "half_life");
            if (rate && half_life)
              fail(*half_life,
                   "expected either decay_rate or half_life, found both (decay_rate at " + rate->origin + ")");
            region.decay_rate = rate ? rate->si : half_life ? std::log(2.0) / half_life->si : 0.0;
            region.source = field(section, "source");
            if (const auto *initial = get(section, "initial"))
              region.initial = initial->field;
            region.cell_size = quantity(section, "cell_size", 0);
            layer.cell_size = region.cell_size;
            c.regions.push_back(region);
          }
      }

      void build_boundaries(CaseDescription &c) const
      {
        const auto faces = builtin_face_names(dimension);
        for (const auto &name : settings.names_of("boundary"))
          if (std::find(faces.begin(), faces.end(), name) == faces.end())
            {
              std::string list;
              for (const auto &f : faces)
                list += (list.empty() ? "" : ", ") + f;
              const std::string suggestion = nearest(name, faces);
              throw InputError(where("boundary." + name), "boundary." + name,
                               "unknown boundary of the built-in " + std::to_string(dimension) +
                                 "-D geometry (boundaries: " + list + ")" +
                                 (suggestion.empty() ? "" : "; did you mean [boundary." + suggestion + "]?"));
            }
        for (const auto &face : faces)
          {
            const std::string section = "boundary." + face;
            BoundarySpec boundary;
            boundary.name = face;
            if (settings.section_origins.count(section) == 0)
              {
                c.boundaries.push_back(boundary); // sealed
                continue;
              }
            const auto *type = get(section, "type");
            if (type == nullptr)
              missing(section, "type", "one of concentration, flux, transfer, sealed");
            const auto *value = get(section, "value");
            const auto *ambient = get(section, "ambient");
            const auto *coefficient = get(section, "coefficient");
            auto forbid = [&](const SettingValue *v, const std::string &why) {
              if (v)
                fail(*v, "not used with type = " + type->text + " (" + why + ")");
            };
            if (type->text == "concentration")
              {
                boundary.kind = BoundaryKind::concentration;
                forbid(coefficient, "the concentration is imposed");
                if (value && ambient)
                  fail(*ambient, "expected either value (inside the material) or ambient (outside, "
                                 "reference phase), found both (value at " +
                                   value->origin + ")");
                if (!value && !ambient)
                  missing(section, "value", "the concentration at the face, such as 250 mg/L");
                boundary.value_is_ambient = ambient != nullptr;
                boundary.value = value ? value->field : ambient->field;
                if (ambient)
                  boundary.ambient = ambient->field;
                check_unambiguous_phase(c, boundary, value);
              }
            else if (type->text == "flux")
              {
                boundary.kind = BoundaryKind::flux;
                forbid(coefficient, "the flux is imposed");
                forbid(ambient, "the flux is imposed");
                if (!value)
                  missing(section, "value", "the inward flux, such as 1e-6 kg/(m2 s)");
                boundary.value = value->field;
              }
            else if (type->text == "transfer")
              {
                boundary.kind = BoundaryKind::transfer;
                forbid(value, "give ambient for the outside concentration and coefficient for h");
                if (!coefficient)
                  missing(section, "coefficient", "the transfer coefficient h, such as 1e-7 m/s");
                boundary.coefficient = coefficient->si;
                boundary.ambient = ambient ? ambient->field : ScalarField::constant(0);
              }
            else
              {
                boundary.kind = BoundaryKind::sealed;
                forbid(value, "a sealed face has no value");
                forbid(ambient, "a sealed face has no value");
                forbid(coefficient, "a sealed face has no value");
              }
            c.boundaries.push_back(boundary);
          }
      }

      /// A `value` (inside the material) is ambiguous on a face touching regions with different
      /// partition coefficients; `ambient` is not.
      void check_unambiguous_phase(const CaseDescription &c, const BoundarySpec &boundary,
                                   const SettingValue *value) const
      {
        if (value == nullptr)
          return;
        std::vector<const RegionSpec *> touching;
        if (boundary.name == "top")
          touching.push_back(&c.regions.front());
        else if (boundary.name == "bottom")
          touching.push_back(&c.regions.back());
        else
          for (const auto &r : c.regions)
            touching.push_back(&r);
        for (const auto *r : touching)
          if (r->partition != touching.front()->partition)
            fail(*value, "ambiguous: the face touches regions with different partition coefficients (" +
                           touching.front()->name + " and " + r->name +
                           "); give 'ambient' (the outside concentration, reference phase) instead");
      }

      void build_time(CaseDescription &c) const
      {
        const auto *end = get("time", "end");
        if (end == nullptr)
          missing("time", "end", "the end time of the run, such as 60 yr");
        c.time.end = end->si;
        const auto *step = get("time", "step");
        c.time.adaptive = step == nullptr || step->is_auto;
        c.time.step = c.time.adaptive ? 0 : step->si;
        if (!c.time.adaptive && c.time.step > c.time.end)
          fail(*step, "expected a step no longer than time.end (" + format_si(c.time.end, "s") + "), found '" +
                        step->written + "'");
        c.time.tolerance = quantity("time", "tolerance", 1e-4);
        const std::string scheme = text("time", "scheme");
        c.time.scheme = scheme == "implicit_euler"   ? TimeScheme::implicit_euler
                        : scheme == "crank_nicolson" ? TimeScheme::crank_nicolson
                                                     : TimeScheme::bdf2;
        c.time.start_steps = static_cast<unsigned int>(quantity("time", "start_steps", 4));
        c.time.initial_step = quantity("time", "initial_step", 0);
        c.time.max_step = quantity("time", "max_step", 0);
        for (const char *key : {"initial_step", "max_step"})
          if (const auto *v = get("time", key); v && !v->is_auto && v->si > c.time.end)
            fail(*v, "expected at most time.end (" + format_si(c.time.end, "s") + "), found '" + v->written + "'");
      }

      void build_numerics(CaseDescription &c) const
      {
        c.numerics.degree = static_cast<unsigned int>(quantity("numerics", "degree", 2));
        const std::string solver = text("numerics", "linear_solver");
        c.numerics.linear_solver = solver == "direct"      ? LinearSolverKind::direct
                                   : solver == "iterative" ? LinearSolverKind::iterative
                                                           : LinearSolverKind::automatic;
        c.numerics.solver_tolerance = quantity("numerics", "solver_tolerance", 1e-12);
      }

      void build_output(CaseDescription &c) const
      {
        c.output.folder = text("output", "folder");
        if (c.output.folder.empty())
          c.output.folder = "results/" + std::filesystem::path(settings.file).stem().string();
        c.output.fields_every = quantity("output", "fields_every", 0);
        if (const auto *times = get("output", "times"))
          {
            for (const double t : times->list)
              if (t > c.time.end)
                fail(*times, "expected output times within the run (<= " + format_si(c.time.end, "s") + "), found " +
                               format_si(t, "s"));
            c.output.times = times->list;
            std::sort(c.output.times.begin(), c.output.times.end());
          }
        if (const auto *fields = get("output", "fields"))
          c.output.write_fields = fields->flag;

        const double total = c.geometry.total_thickness();
        for (const auto &value : settings.all())
          {
            if (value.section != "output")
              continue;
            const auto dot = value.key.find('.');
            if (dot == std::string::npos)
              continue;
            const std::string prefix = value.key.substr(0, dot);
            const std::string name = value.key.substr(dot + 1);
            if (prefix == "probe")
              {
                ProbeSpec probe;
                probe.name = name;
                for (unsigned int d = 0; d < dimension; ++d)
                  probe.point[d] = value.list[d];
                const double extent[3] = {dimension == 1 ? total : c.geometry.width,
                                          dimension == 2 ? total : c.geometry.length, total};
                const double tolerance = 1e-9 * std::max(total, 1e-30);
                for (unsigned int d = 0; d < dimension; ++d)
                  if (probe.point[d] < -tolerance || probe.point[d] > extent[d] + tolerance)
                    fail(value, "expected a point inside the geometry (axis " + std::string(1, "xyz"[d]) +
                                  " from 0 to " + format_si(extent[d], "m") + "), found " +
                                  format_si(probe.point[d], "m") + " (the probe is outside)");
                c.output.probes.push_back(probe);
              }
          }
        for (const auto &value : settings.all())
          {
            if (value.section != "output")
              continue;
            const auto dot = value.key.find('.');
            if (dot == std::string::npos)
              continue;
            const std::string prefix = value.key.substr(0, dot);
            const std::string name = value.key.substr(dot + 1);
            if (prefix == "threshold")
              {
                const bool has_probe = std::any_of(c.output.probes.begin(), c.output.probes.end(),
                                                   [&](const ProbeSpec &p) { return p.name == name; });
                if (!has_probe)
                  fail(value, "expected a probe of the same name (output.probe." + name + " = ...), found none");
                c.output.thresholds.push_back(LevelSpec{name, value.si});
              }
            else if (prefix == "depth")
              c.output.depths.push_back(LevelSpec{name, value.si});
          }
      }

      void add_record(CaseDescription &c, const std::string &section, const KeySpec &key_spec) const
      {
        if (const auto *v = get(section, key_spec.key))
          c.settings.push_back(SettingRecord{v->full_key(), v->written, v->si_text(), v->origin});
        else if (!key_spec.fallback.empty())
          {
            std::string si = key_spec.fallback;
            if (key_spec.kind == ValueKind::quantity || key_spec.kind == ValueKind::field)
              if (key_spec.fallback != "auto")
                {
                  si =
                    format_si(std::stod(key_spec.fallback), key_spec.dim == Dim::concentration ? c.units.concentration
                                                            : key_spec.dim == Dim::source      ? c.units.source
                                                            : key_spec.dim == Dim::rate        ? "1/s"
                                                                                               : "");
                }
            c.settings.push_back(SettingRecord{section + "." + key_spec.key, key_spec.fallback, si, "default"});
          }
      }

      void record_settings(CaseDescription &c) const
      {
        for (const auto &section : fixed_sections())
          for (const auto &key_spec : key_schema())
            {
              if (key_spec.section != section)
                continue;
              if (key_spec.is_pattern())
                {
                  for (const auto &v : settings.all())
                    if (v.section == section && v.spec == &key_spec)
                      c.settings.push_back(SettingRecord{v.full_key(), v.written, v.si_text(), v.origin});
                }
              else
                add_record(c, section, key_spec);
            }
        for (const auto &region : c.regions)
          for (const auto &key_spec : key_schema())
            if (key_spec.section == "region")
              add_record(c, "region." + region.name, key_spec);
        for (const auto &boundary : c.boundaries)
          {
            const std::string section = "boundary." + boundary.name;
            if (settings.section_origins.count(section) == 0)
              {
                c.settings.push_back(SettingRecord{section + ".type", "sealed", "sealed", "default"});
                continue;
              }
            for (const auto &key_spec : key_schema())
              if (key_spec.section == "boundary")
                add_record(c, section, key_spec);
          }
        if (get("output", "folder") == nullptr)
          c.settings.push_back(SettingRecord{"output.folder", "", c.output.folder, "default"});
      }
    };
  } // namespace

  CaseDescription build_case(const Settings &settings, const unsigned int dimension)
  {
    return Builder(settings, dimension).build();
  }
} // namespace fickcast
