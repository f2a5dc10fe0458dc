#include "case/case_builder.h"

#include "case/expression.h"
#include "case/input_error.h"
#include "case/mesh_file.h"
#include "case/quantity_text.h"

#include <algorithm>
#include <cmath>
#include <filesystem>
#include <set>

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
        build_stages(c);
        build_temperature(c);
        c.initial = field("initial", "value");
        build_time(c);
        build_numerics(c);
        build_output(c);
        build_sweep_and_size(c);
        record_settings(c);
        return c;
      }

    private:
      const Settings &settings;
      const unsigned int dimension;
      mutable std::vector<std::string> faces_; ///< boundary names of the geometry, by id
      mutable std::string settings_mesh_;      ///< the mesh file, if any (for messages)

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
        GeometrySpec &g = c.geometry;
        const std::string coordinates = text("case", "coordinates");
        g.coordinates = coordinates == "cylinder"       ? Coordinates::cylinder
                        : coordinates == "sphere"       ? Coordinates::sphere
                        : coordinates == "axisymmetric" ? Coordinates::axisymmetric
                                                        : Coordinates::cartesian;
        const unsigned int needed = g.radial() ? 1u : g.coordinates == Coordinates::axisymmetric ? 2u : 0u;
        if (needed != 0 && dimension != needed)
          fail(*get("case", "dimension"), "expected dimension = " + std::to_string(needed) + " with coordinates = " +
                                            coordinates + ", found " + std::to_string(dimension));
        auto forbid = [&](const char *key, const std::string &why) {
          if (const auto *v = get("geometry", key))
            fail(*v, "not used " + why + ", found '" + v->written + "'");
        };
        g.refine = static_cast<unsigned int>(quantity("geometry", "refine", 0));
        if (const auto *mesh = get("geometry", "mesh"))
          {
            for (const char *key : {"layers", "width", "length", "radius", "inner_radius", "side_coating",
                                    "grade_toward", "grading", "cell_size"})
              forbid(key, "with geometry.mesh (the mesh file sets the shape and the cells; use geometry.refine)");
            build_mesh_geometry(c, *mesh);
            return;
          }
        const auto *layers = get("geometry", "layers");
        if (layers == nullptr)
          missing("geometry", "layers",
                  "the layers from the top face inward, such as 'clay 0.9 m, sand 0.3 m' "
                  "(or geometry.mesh = FILE.msh)");
        g.layers = layers->layers;
        const double total = g.total_thickness();
        g.cell_size = quantity("geometry", "cell_size", total / 100.0);
        const bool cartesian = g.coordinates == Coordinates::cartesian;
        if (cartesian && dimension >= 2)
          {
            if (!is_set("geometry", "width"))
              missing("geometry", "width", "the extent along x of this " + std::to_string(dimension) + "-D case");
            g.width = quantity("geometry", "width", 0);
          }
        else
          forbid("width", cartesian ? "in a 1-D case (it is the extent along x in 2-D and 3-D)"
                                    : "with coordinates = " + coordinates + " (axisymmetric cases give radius)");
        if (cartesian && dimension == 3)
          {
            if (!is_set("geometry", "length"))
              missing("geometry", "length", "the extent along y of this 3-D case");
            g.length = quantity("geometry", "length", 0);
          }
        else
          forbid("length", "except in 3-D Cartesian cases (it is the extent along y)");
        if (g.coordinates == Coordinates::axisymmetric)
          {
            if (!is_set("geometry", "radius"))
              missing("geometry", "radius", "the outer radius of the layers of this axisymmetric case");
            g.radius = quantity("geometry", "radius", 0);
          }
        else
          forbid("radius", "except with coordinates = axisymmetric (radial cases list their layers outward)");
        if (cartesian)
          forbid("inner_radius", "in Cartesian cases");
        g.inner_radius = quantity("geometry", "inner_radius", 0);
        if (g.coordinates == Coordinates::axisymmetric && g.inner_radius >= g.radius)
          fail(*get("geometry", "inner_radius"),
               "expected an inner radius below the radius (" + format_si(g.radius, "m") + ")");
        if (const auto *coating = get("geometry", "side_coating"))
          {
            if (g.coordinates != Coordinates::axisymmetric)
              fail(*coating, "only used with coordinates = axisymmetric (a band around the layers)");
            if (coating->layers.size() != 1)
              fail(*coating, "expected one 'name thickness unit', found " + std::to_string(coating->layers.size()));
            g.side_coating = coating->layers.front();
          }
        const std::string grade = text("geometry", "grade_toward");
        // Radial cases list layers from the centre outward: the outer surface ends the stack.
        if (g.radial() && (grade == "top" || grade == "bottom"))
          fail(*get("geometry", "grade_toward"), "expected outer or inner (centre) in a radial case, found " + grade);
        if (!g.radial() && (grade == "outer" || grade == "inner" || grade == "centre"))
          fail(*get("geometry", "grade_toward"),
               "expected top or bottom (the faces the layers stack between), found " + grade);
        g.grade_toward = grade == "top" || grade == "inner" || grade == "centre" ? Face::top
                         : grade == "bottom" || grade == "outer"                 ? Face::bottom
                                                                                 : Face::none;
        g.grading = quantity("geometry", "grading", 1.0);
        if (g.grade_toward == Face::none && g.grading != 1.0)
          fail(*get("geometry", "grading"), "expected grade_toward with a grading other than 1, "
                                            "found grade_toward = none");
      }

      void build_mesh_geometry(CaseDescription &c, const SettingValue &mesh) const
      {
        GeometrySpec &g = c.geometry;
        settings_mesh_ = mesh.text;
        std::filesystem::path path(mesh.text);
        if (path.is_relative() && mesh.origin != "--set")
          path = std::filesystem::path(settings.file).parent_path() / path;
        g.mesh_file = path.lexically_normal().string();
        MeshFileInfo info;
        try
          {
            info = read_mesh_file_info(g.mesh_file);
          }
        catch (const InputError &error)
          {
            throw InputError(error.where(), "geometry.mesh (" + mesh.origin + ")", error.message());
          }
        if (info.dimension != static_cast<int>(dimension))
          fail(mesh, "expected a mesh of dimension " + std::to_string(dimension) +
                       " (this case's), found one whose "
                       "physical groups go up to dimension " +
                       std::to_string(info.dimension) + " in " + g.mesh_file);
        const std::set<int> quadrilaterals{1, 3, 8, 10, 15, 16}, hexahedra{1, 3, 5, 8, 10, 12, 15, 16, 17};
        for (const int type : info.element_types)
          if ((dimension == 2 && !quadrilaterals.count(type)) || (dimension == 3 && !hexahedra.count(type)))
            fail(mesh, "expected " + std::string(dimension == 2 ? "quadrilateral" : "hexahedral") +
                         " cells (Recombine the mesh in Gmsh), found element type " + std::to_string(type) + " in " +
                         g.mesh_file);
        for (const auto &group : info.groups_of(static_cast<int>(dimension)))
          {
            if (std::find(g.mesh_regions.begin(), g.mesh_regions.end(), group.name) != g.mesh_regions.end())
              fail(mesh, "expected distinct region names in the mesh, found '" + group.name + "' twice");
            g.mesh_regions.push_back(group.name);
            g.mesh_region_tags.push_back(group.tag);
          }
        if (g.mesh_regions.empty())
          fail(mesh, "the mesh has no named physical group of dimension " + std::to_string(dimension) +
                       " (regions) in " + g.mesh_file);
        for (const auto &group : info.groups_of(static_cast<int>(dimension) - 1))
          {
            g.mesh_boundaries.push_back(group.name);
            g.mesh_boundary_tags.push_back(group.tag);
          }
      }

      void build_regions(CaseDescription &c) const
      {
        const bool from_mesh = !c.geometry.mesh_file.empty();
        const std::vector<std::string> region_names = c.geometry.region_names();
        for (const auto &name : settings.names_of("region"))
          if (std::find(region_names.begin(), region_names.end(), name) == region_names.end())
            {
              std::string list;
              for (const auto &n : region_names)
                list += (list.empty() ? "" : ", ") + n;
              const std::string suggestion = nearest(name, region_names);
              throw InputError(
                where("region." + name), "region." + name,
                (from_mesh ? "the mesh has no region of that name (regions in " + c.geometry.mesh_file + ": "
                           : "names no layer of geometry.layers (layers: ") +
                  list + ")" + (suggestion.empty() ? "" : "; did you mean [region." + suggestion + "]?"));
            }
        for (const auto &name : region_names)
          {
            const std::string section = "region." + name;
            if (settings.section_origins.count(section) == 0)
              throw InputError(where("geometry"), from_mesh ? "geometry.mesh" : "geometry.layers",
                               "region '" + name + "' has no [" + section +
                                 "] section: expected one with at least its diffusivity");
            RegionSpec region;
            region.name = name;
            const auto *diffusivity = get(section, "diffusivity");
            const auto *prefactor = get(section, "diffusivity_prefactor");
            const auto *activation = get(section, "activation_energy");
            if (diffusivity && prefactor)
              fail(*prefactor, "expected either diffusivity or diffusivity_prefactor with activation_energy, "
                               "found both (diffusivity at " +
                                 diffusivity->origin + ")");
            if (prefactor && !activation)
              missing(section, "activation_energy",
                      "the activation energy that goes with diffusivity_prefactor, "
                      "such as 3.46 eV");
            if (activation && !prefactor)
              fail(*activation, "expected diffusivity_prefactor with activation_energy, found no prefactor");
            if (!diffusivity && !prefactor)
              missing(section, "diffusivity",
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
            region.porosity = quantity(section, "porosity", 1);
            region.tortuosity = quantity(section, "tortuosity", 1);
            const std::string law = text(section, "porosity_law");
            const auto *exponent = get(section, "archie_exponent");
            if (law != "none" && get(section, "tortuosity"))
              fail(*get(section, "tortuosity"), "expected either tortuosity or porosity_law, found both");
            if (law == "archie")
              {
                if (!exponent)
                  missing(section, "archie_exponent", "Archie's exponent m for porosity_law = archie, such as 2");
                region.porosity_law = PorosityLaw::archie;
                region.archie_exponent = exponent->si;
                region.tortuosity = std::pow(region.porosity, exponent->si - 1.0);
              }
            else if (exponent)
              fail(*exponent, "only used with porosity_law = archie");
            if (law == "millington_quirk")
              {
                region.porosity_law = PorosityLaw::millington_quirk;
                region.tortuosity = std::cbrt(region.porosity);
              }
            const auto *retardation = get(section, "retardation");
            const auto *density = get(section, "bulk_density");
            const auto *kd = get(section, "distribution_coefficient");
            if (retardation && (density || kd))
              fail(*retardation, "expected either retardation or bulk_density with distribution_coefficient, "
                                 "found both");
            if ((density != nullptr) != (kd != nullptr))
              fail(density ? *density : *kd, "expected bulk_density and distribution_coefficient together "
                                             "(R = 1 + rho_b Kd / theta), found only one");
            region.retardation = retardation ? retardation->si
                                 : density   ? 1.0 + density->si * kd->si / region.porosity
                                             : 1.0;
            region.partition = quantity(section, "partition", 1);
            const auto *rate = get(section, "decay_rate");
            const auto *half_life = get(section, "half_life");
            if (rate && half_life)
              fail(*half_life,
                   "expected either decay_rate or half_life, found both (decay_rate at " + rate->origin + ")");
            region.decay_rate = rate ? rate->si : half_life ? std::log(2.0) / half_life->si : 0.0;
            region.decay_dissolved_only = text(section, "decay_applies_to") == "dissolved";
            const auto *loading = get(section, "loading");
            const auto *solubility = get(section, "solubility");
            if (loading && !solubility)
              fail(*loading, "expected a solubility with the loading (the content above it stays undissolved)");
            if (solubility)
              {
                region.solubility = solubility->si;
                region.loading = loading ? loading->si : 0.0;
                if (get(section, "initial") && loading)
                  fail(*loading, "expected either loading (total content) or initial (dissolved concentration), "
                                 "found both");
              }
            region.source = field(section, "source");
            if (const auto *initial = get(section, "initial"))
              region.initial = initial->field;
            region.cell_size = quantity(section, "cell_size", 0);
            if (from_mesh && get(section, "cell_size"))
              fail(*get(section, "cell_size"), "not used with geometry.mesh (set sizes in the .geo, or use "
                                               "geometry.refine)");
            for (auto &layer : c.geometry.layers)
              if (layer.name == name)
                layer.cell_size = region.cell_size;
            c.regions.push_back(region);
          }
      }

      void build_boundaries(CaseDescription &c) const
      {
        faces_ = c.geometry.face_names(dimension);
        for (const auto &name : settings.names_of("boundary"))
          check_face_name(name, "boundary." + name, where("boundary." + name));
        for (const auto &face : faces_)
          c.boundaries.push_back(build_boundary(c, face, ""));
      }

      void check_face_name(const std::string &name, const std::string &key, const std::string &origin) const
      {
        if (GeometrySpec::is_symmetry_face(name) && std::find(faces_.begin(), faces_.end(), name) != faces_.end())
          throw InputError(origin, key,
                           "the " + name + " is a symmetry " + (name == "axis" ? "axis" : "point") +
                             " with no flux across it; it takes no boundary condition");
        if (std::find(faces_.begin(), faces_.end(), name) != faces_.end())
          return;
        std::vector<std::string> settable;
        for (const auto &f : faces_)
          if (!GeometrySpec::is_symmetry_face(f))
            settable.push_back(f);
        std::string list;
        for (const auto &f : settable)
          list += (list.empty() ? "" : ", ") + f;
        const std::string suggestion = nearest(name, settable);
        const std::string what = settings_mesh_.empty() ? "the built-in " + std::to_string(dimension) + "-D geometry"
                                                        : "the mesh " + settings_mesh_;
        throw InputError(origin, key,
                         "unknown boundary of " + what + " (boundaries: " + list + ")" +
                           (suggestion.empty() ? "" : "; did you mean '" + suggestion + "'?"));
      }

      /// The boundary @p face, from [boundary.FACE], or in stage @p stage_section (`stage.NAME`):
      /// if the stage gives boundary.FACE.type its keys define the face alone, otherwise they
      /// override the [boundary.FACE] keys one by one.
      BoundarySpec build_boundary(const CaseDescription &c, const std::string &face,
                                  const std::string &stage_section) const
      {
        const std::string base = "boundary." + face;
        const bool stage_defines = !stage_section.empty() && get(stage_section, base + ".type") != nullptr;
        auto key = [&](const std::string &name) -> const SettingValue * {
          if (!stage_section.empty())
            if (const auto *v = get(stage_section, base + "." + name))
              return v;
          return stage_defines ? nullptr : get(base, name);
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
          missing(context, key_prefix + "type", "one of concentration, flux, transfer, sealed, bath");
        const auto *value = key("value");
        const auto *ambient = key("ambient");
        const auto *coefficient = key("coefficient");
        const auto *volume = key("volume");
        const auto *bath_partition = key("partition");
        const auto *bath_initial = key("initial");
        auto forbid = [&](const SettingValue *v, const std::string &why) {
          if (v)
            fail(*v, "not used with type = " + type->text + " (" + why + ")");
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
              fail(*ambient, "expected either value (inside the material) or ambient (outside, "
                             "reference phase), found both (value at " +
                               value->origin + ")");
            if (!value && !ambient)
              missing(context, key_prefix + "value", "the concentration at the face, such as 250 mg/L");
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
              missing(context, key_prefix + "value", "the inward flux, such as 1e-6 kg/(m2 s)");
            boundary.value = value->field;
          }
        else if (type->text == "transfer")
          {
            boundary.kind = BoundaryKind::transfer;
            forbid(value, "give ambient for the outside concentration and coefficient for h");
            if (!coefficient)
              missing(context, key_prefix + "coefficient", "the transfer coefficient h, such as 1e-7 m/s");
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
              missing(context, key_prefix + "volume", "the bath volume (" + describe_dim(Dim::bath_volume) + ")");
            boundary.volume = volume->si;
            boundary.bath_partition = bath_partition ? bath_partition->si : 1.0;
            boundary.bath_initial = bath_initial ? bath_initial->si : 0.0;
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

      void build_stages(CaseDescription &c) const
      {
        const auto names = settings.names_of("stage");
        const auto *end = get("time", "end");
        if (names.empty())
          {
            if (end == nullptr)
              missing("time", "end", "the end time of the run, such as 60 yr");
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
            const auto *duration = get(section, "duration");
            if (duration == nullptr)
              missing(section, "duration", "the duration of stage " + name + ", such as 30 min");
            for (const auto &v : settings.all())
              if (v.section == section && v.key.rfind("boundary.", 0) == 0)
                {
                  const auto dot = v.key.find('.', 9);
                  check_face_name(v.key.substr(9, dot - 9), v.full_key(), v.origin);
                }
            StageSpec stage;
            stage.name = name;
            stage.start = start;
            stage.duration = duration->si;
            for (const auto &face : faces_)
              stage.boundaries.push_back(build_boundary(c, face, section));
            start += stage.duration;
            c.stages.push_back(stage);
          }
        if (end && std::abs(end->si - start) > 1e-9 * start)
          fail(*end, "expected the end time to equal the sum of the stage durations (" + format_si(start, "s") +
                       ") or to be left out, found '" + end->written + "'");
      }

      void build_temperature(CaseDescription &c) const
      {
        const auto *global = get("temperature", "schedule");
        bool any_stage = false;
        for (const auto &stage : c.stages)
          any_stage = any_stage || get("stage." + stage.name, "temperature") != nullptr;
        if (global && any_stage)
          fail(*global, "expected the temperature either in [temperature] or in the stages, found both");
        if (global)
          c.temperature = global->schedule;
        else if (any_stage)
          {
            double last = -1;
            for (const auto &stage : c.stages)
              {
                const auto *own = get("stage." + stage.name, "temperature");
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
                      fail(*own, "expected a temperature schedule within the stage duration (" +
                                   format_si(stage.duration, "s") + "), found one lasting " +
                                   format_si(within.times.back(), "s"));
                    c.temperature.append(within, stage.start);
                    last = within.temperatures.back();
                  }
                else if (last < 0)
                  throw InputError(where("stage." + stage.name), "stage." + stage.name + ".temperature",
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
              throw InputError(where("region." + region.name), "region." + region.name + ".diffusivity",
                               "depends on temperature, but no temperature is given: expected [temperature] "
                               "schedule = ... or a temperature in each stage");
          }
      }

      /// A `value` (inside the material) is ambiguous on a face touching regions with different
      /// partition coefficients; `ambient` is not.
      void check_unambiguous_phase(const CaseDescription &c, const BoundarySpec &boundary,
                                   const SettingValue *value) const
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
            fail(*value, "ambiguous: the face touches regions with different partition coefficients (" +
                           touching.front()->name + " and " + r->name +
                           "); give 'ambient' (the outside concentration, reference phase) instead");
      }

      void build_time(CaseDescription &c) const
      {
        c.time.end = c.stages.back().end();
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

      /// Coordinate @p index of a point value along @p axis, resolving `start of LAYER` and
      /// `end of LAYER` on the stacking axis of the built-in geometry; @p layer gets the name.
      double coordinate(const CaseDescription &c, const SettingValue &value, const std::size_t index,
                        const unsigned int axis, std::string &layer) const
      {
        if (index >= value.anchors.size() || value.anchors[index].empty())
          return value.list[index];
        const std::string &anchor = value.anchors[index];
        const bool start = anchor.rfind("start of ", 0) == 0;
        std::string name = anchor.substr(start ? 9 : 7);
        name.erase(0, name.find_first_not_of(" \t"));
        name.erase(name.find_last_not_of(" \t") + 1);
        const GeometrySpec &g = c.geometry;
        if (!g.mesh_file.empty())
          fail(value, "expected coordinates (layers are known only in the built-in geometry, not in a mesh file), "
                      "found '" +
                        anchor + "'");
        if (axis + 1 != dimension)
          fail(value, "expected '" + anchor +
                        "' only for the last coordinate (the axis the layers are stacked "
                        "along), found it for axis " +
                        std::string(1, "xyz"[axis]));
        double position = g.radial() ? g.inner_radius : 0;
        double first = std::nan(""), last = std::nan("");
        std::string list;
        for (const auto &l : g.layers)
          {
            if (l.name == name)
              {
                if (std::isnan(first))
                  first = position;
                last = position + l.thickness;
              }
            position += l.thickness;
            list += (list.empty() ? "" : ", ") + l.name;
          }
        if (std::isnan(first))
          fail(value, "expected a layer of geometry.layers (" + list + ") in '" + anchor + "', found '" + name + "'");
        layer = name;
        return start ? first : last;
      }

      void build_sweep_and_size(CaseDescription &c) const
      {
        SweepSpec &s = c.sweep;
        for (const auto &value : settings.all())
          {
            if (value.section != "sweep")
              continue;
            const auto dot = value.key.find('.');
            const std::string prefix = dot == std::string::npos ? value.key : value.key.substr(0, dot);
            const std::string rest = dot == std::string::npos ? "" : value.key.substr(dot + 1);
            if (prefix == "vary")
              {
                StudyParameter p;
                p.key = rest;
                p.origin = value.origin;
                // Whole strings (such as layer lists) are separated by |, numbers by commas.
                if (value.text.find('|') != std::string::npos)
                  {
                    std::string item;
                    for (const char ch : value.text + "|")
                      if (ch == '|')
                        {
                          const auto a = item.find_first_not_of(" \t");
                          if (a == std::string::npos)
                            fail(value, "expected values between the | separators, found an empty one");
                          p.values.push_back(item.substr(a, item.find_last_not_of(" \t") - a + 1));
                          item.clear();
                        }
                      else
                        item += ch;
                  }
                else
                  p.values = split_list(value.text);
                if (p.values.empty())
                  fail(value, "expected at least one value, found none");
                s.vary.push_back(p);
              }
            else if (prefix == "sample")
              {
                StudyParameter p;
                p.key = rest;
                p.distribution = value.text;
                p.origin = value.origin;
                s.sample.push_back(p);
              }
            else if (prefix == "exceed" || prefix == "below")
              s.limits.push_back(StudyLimit{rest, value.text, prefix == "exceed", value.origin});
          }
        s.zip = text("sweep", "combine") == "zip";
        s.samples = static_cast<unsigned int>(quantity("sweep", "samples", 100));
        s.seed = static_cast<unsigned long>(quantity("sweep", "seed", 1));
        if (!s.vary.empty() && !s.sample.empty())
          fail(*get("sweep", "sample." + s.sample.front().key),
               "expected either vary.* (a sweep) or sample.* (an uncertainty study), found both");
        if (s.zip)
          for (const auto &p : s.vary)
            if (p.values.size() != s.vary.front().values.size())
              fail(*get("sweep", "vary." + p.key), "expected as many values as vary." + s.vary.front().key + " (" +
                                                     std::to_string(s.vary.front().values.size()) +
                                                     ") with combine = zip, found " + std::to_string(p.values.size()));
        SizeSpec &z = c.size;
        if (const auto *key = get("size", "parameter"))
          {
            z.parameter.key = key->text;
            z.parameter.origin = key->origin;
            for (const char *part : {"from", "to", "result", "aim"})
              if (!get("size", part))
                missing("size", part, "the rest of the sizing definition (from, to, result, aim)");
            z.parameter.values = {get("size", "from")->text, get("size", "to")->text};
            z.result = get("size", "result")->text;
            z.aim = get("size", "aim")->text;
            z.aim_origin = get("size", "aim")->origin;
            z.tolerance = quantity("size", "tolerance", 1e-4);
            z.max_runs = static_cast<unsigned int>(quantity("size", "max_runs", 40));
          }
        else
          for (const char *part : {"from", "to", "result", "aim"})
            if (const auto *v = get("size", part))
              fail(*v, "expected size.parameter with the other sizing keys, found none");
      }

      void build_numerics(CaseDescription &c) const
      {
        c.numerics.degree = static_cast<unsigned int>(quantity("numerics", "degree", 2));
        const std::string solver = text("numerics", "linear_solver");
        c.numerics.linear_solver = solver == "direct"      ? LinearSolverKind::direct
                                   : solver == "iterative" ? LinearSolverKind::iterative
                                                           : LinearSolverKind::automatic;
        c.numerics.solver_tolerance = quantity("numerics", "solver_tolerance", 1e-12);
        c.numerics.newton = text("numerics", "nonlinear_solver") == "newton";
        c.numerics.nonlinear_tolerance = quantity("numerics", "nonlinear_tolerance", 1e-8);
        c.numerics.max_nonlinear_iterations =
          static_cast<unsigned int>(quantity("numerics", "max_nonlinear_iterations", 30));
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
            if (prefix == "point")
              {
                NamedPointSpec named_point;
                named_point.name = name;
                named_point.origin = value.origin;
                named_point.region = value.text;
                if (!named_point.region.empty() && c.find_region(named_point.region) == nullptr)
                  {
                    std::vector<std::string> regions;
                    for (const auto &r : c.regions)
                      regions.push_back(r.name);
                    const std::string suggestion = nearest(named_point.region, regions);
                    fail(value, "expected '... in REGION' to name a region, found '" + named_point.region + "'" +
                                  (suggestion.empty() ? "" : " (did you mean '" + suggestion + "'?)"));
                  }
                for (unsigned int d = 0; d < dimension; ++d)
                  {
                    std::string layer;
                    named_point.point[d] = coordinate(c, value, d, d, layer);
                    // At a layer's face, read the layer's own side unless told otherwise.
                    if (!layer.empty() && named_point.region.empty())
                      named_point.region = layer;
                  }
                const GeometrySpec &g = c.geometry;
                if (g.mesh_file.empty())
                  {
                    // Bounds of the built-in geometry per axis (a mesh file is checked when read).
                    double low[3] = {0, 0, 0};
                    double high[3] = {dimension == 1 ? total : g.width, dimension == 2 ? total : g.length, total};
                    if (g.radial())
                      {
                        low[0] = g.inner_radius;
                        high[0] = g.inner_radius + total;
                      }
                    if (g.coordinates == Coordinates::axisymmetric)
                      {
                        low[0] = g.inner_radius;
                        high[0] = g.radius + g.side_coating.thickness;
                      }
                    const double tolerance = 1e-9 * std::max(total, 1e-30);
                    for (unsigned int d = 0; d < dimension; ++d)
                      if (named_point.point[d] < low[d] - tolerance || named_point.point[d] > high[d] + tolerance)
                        fail(value, "expected a point inside the geometry (axis " + std::string(1, "xyz"[d]) +
                                      " from " + format_si(low[d], "m") + " to " + format_si(high[d], "m") +
                                      "), found " + format_si(named_point.point[d], "m") + " (the point is outside)");
                  }
                c.output.points.push_back(named_point);
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
                const bool has_point = std::any_of(c.output.points.begin(), c.output.points.end(),
                                                   [&](const NamedPointSpec &p) { return p.name == name; });
                if (!has_point)
                  fail(value, "expected a point of the same name (output.point." + name + " = ...), found none");
                c.output.thresholds.push_back(LevelSpec{name, value.si});
              }
            else if (prefix == "depth")
              c.output.depths.push_back(LevelSpec{name, value.si});
            else if (prefix == "line")
              {
                LineSpec line;
                line.name = name;
                std::string layer;
                for (unsigned int d = 0; d < dimension; ++d)
                  {
                    line.from[d] = coordinate(c, value, d, d, layer);
                    line.to[d] = coordinate(c, value, dimension + d, d, layer);
                  }
                if (line.from == line.to)
                  fail(value, "expected a line between two different points, found one point twice");
                if (const auto *samples = get("output", "samples." + name))
                  line.samples = static_cast<unsigned int>(samples->si);
                c.output.lines.push_back(line);
              }
            else if (prefix == "release")
              c.output.releases.push_back(LevelSpec{name, value.si});
            else if (prefix == "time_lag")
              {
                const auto &faces = faces_;
                if (std::find(faces.begin(), faces.end(), value.text) == faces.end() ||
                    GeometrySpec::is_symmetry_face(value.text))
                  {
                    std::string list;
                    for (const auto &f : faces)
                      if (!GeometrySpec::is_symmetry_face(f))
                        list += (list.empty() ? "" : ", ") + f;
                    fail(value, "expected a boundary name (" + list + "), found '" + value.text + "'");
                  }
                c.output.time_lags.emplace_back(name, value.text);
              }
          }
        for (const auto &value : settings.all())
          if (value.section == "output" && value.key.rfind("samples.", 0) == 0)
            {
              const std::string name = value.key.substr(8);
              if (std::none_of(c.output.lines.begin(), c.output.lines.end(),
                               [&](const LineSpec &l) { return l.name == name; }))
                fail(value, "expected a line of the same name (output.line." + name + " = FROM to TO), found none");
            }
        c.output.loading = quantity("output", "loading", 0);
        if (const auto *moments = get("output", "moments"))
          c.output.moments = moments->flag;
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
        for (const auto &stage : c.stages)
          for (const auto &v : settings.all())
            if (v.section == "stage." + stage.name)
              c.settings.push_back(SettingRecord{v.full_key(), v.written, v.si_text(), v.origin});
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
