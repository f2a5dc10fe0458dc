// The case builder's [output]: times, named points and lines (with `start of LAYER`), and what refers to them.
#include "case/section_builders.h"

#include "case/face_result_text.h"
#include "case/quantity_text.h"

#include <algorithm>
#include <cmath>
#include <filesystem>

namespace fickcast
{
  namespace
  {
    /// Coordinate @p index of a point value along @p axis, resolving `start of LAYER` and
    /// `end of LAYER` on the stacking axis of the built-in geometry; @p layer gets the name.
    double coordinate(const SectionReader &reader, const CaseDescription &c, const SettingValue &value,
                      const std::size_t index, const unsigned int axis, std::string &layer)
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
        reader.fail(value, "expected coordinates (layers are known only in the built-in geometry, not in a mesh file), "
                           "found '" +
                             anchor + "'");
      if (axis + 1 != reader.dimension)
        reader.fail(value, "expected '" + anchor +
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
        reader.fail(value,
                    "expected a layer of geometry.layers (" + list + ") in '" + anchor + "', found '" + name + "'");
      layer = name;
      return start ? first : last;
    }
  } // namespace

  namespace
  {
    /// Calls @p handle(value, prefix, name) for every `[output]` key of the form PREFIX.NAME.
    template <typename Handle>
    void for_each_named_output(const SectionReader &reader, Handle &&handle)
    {
      for (const auto &value : reader.settings.all())
        {
          if (value.section != "output")
            continue;
          const auto dot = value.key.find('.');
          if (dot == std::string::npos)
            continue;
          handle(value, value.key.substr(0, dot), value.key.substr(dot + 1));
        }
    }
  } // namespace

  void build_output(const SectionReader &reader, CaseDescription &c)
  {
    c.output.folder = reader.text("output", "folder");
    if (c.output.folder.empty())
      c.output.folder = "results/" + std::filesystem::path(reader.settings.file).stem().string();
    c.output.fields_every = reader.quantity("output", "fields_every", 0);
    c.output.checkpoint_every = reader.quantity("output", "checkpoint_every", 600);
    if (const auto *times = reader.get("output", "times"))
      {
        for (const double t : times->list)
          if (t > c.time.end)
            reader.fail(*times, "expected output times within the run (<= " + format_si(c.time.end, "s") + "), found " +
                                  format_si(t, "s"));
        c.output.times = times->list;
        std::sort(c.output.times.begin(), c.output.times.end());
      }
    if (const auto *fields = reader.get("output", "fields"))
      c.output.write_fields = fields->flag;

    const double total = c.geometry.total_thickness();
    for_each_named_output(reader, [&](const SettingValue &value, const std::string &prefix, const std::string &name) {
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
              reader.fail(value, "expected '... in REGION' to name a region, found '" + named_point.region + "'" +
                                   (suggestion.empty() ? "" : " (did you mean '" + suggestion + "'?)"));
            }
          for (unsigned int d = 0; d < reader.dimension; ++d)
            {
              std::string layer;
              named_point.point[d] = coordinate(reader, c, value, d, d, layer);
              // At a layer's face, read the layer's own side unless told otherwise.
              if (!layer.empty() && named_point.region.empty())
                named_point.region = layer;
            }
          const GeometrySpec &g = c.geometry;
          if (g.mesh_file.empty())
            {
              // Bounds of the built-in geometry per axis (a mesh file is checked when read).
              double low[3] = {0, 0, 0};
              double high[3] = {reader.dimension == 1 ? total : g.width, reader.dimension == 2 ? total : g.length,
                                total};
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
              for (unsigned int d = 0; d < reader.dimension; ++d)
                if (named_point.point[d] < low[d] - tolerance || named_point.point[d] > high[d] + tolerance)
                  reader.fail(value, "expected a point inside the geometry (axis " + std::string(1, "xyz"[d]) +
                                       " from " + format_si(low[d], "m") + " to " + format_si(high[d], "m") +
                                       "), found " + format_si(named_point.point[d], "m") + " (the point is outside)");
            }
          c.output.points.push_back(named_point);
        }
    });
    for_each_named_output(reader, [&](const SettingValue &value, const std::string &prefix, const std::string &name) {
      if (prefix == "threshold")
        {
          const bool has_point = std::any_of(c.output.points.begin(), c.output.points.end(),
                                             [&](const NamedPointSpec &p) { return p.name == name; });
          if (!has_point)
            reader.fail(value, "expected a point of the same name (output.point." + name + " = ...), found none");
          c.output.thresholds.push_back(LevelSpec{name, value.si});
        }
      else if (prefix == "depth")
        c.output.depths.push_back(LevelSpec{name, value.si});
      else if (prefix == "line")
        {
          LineSpec line;
          line.name = name;
          std::string layer;
          for (unsigned int d = 0; d < reader.dimension; ++d)
            {
              line.from[d] = coordinate(reader, c, value, d, d, layer);
              line.to[d] = coordinate(reader, c, value, reader.dimension + d, d, layer);
            }
          if (line.from == line.to)
            reader.fail(value, "expected a line between two different points, found one point twice");
          if (const auto *samples = reader.get("output", "samples." + name))
            line.samples = static_cast<unsigned int>(samples->si);
          c.output.lines.push_back(line);
        }
      else if (prefix == "release" || prefix == "uptake") // which applies: case/content_fraction
        c.output.releases.push_back(LevelSpec{name, value.si});
      else if (prefix == "time_lag")
        {
          const auto &faces = reader.faces;
          if (std::find(faces.begin(), faces.end(), value.text) == faces.end() ||
              GeometrySpec::is_symmetry_face(value.text))
            {
              std::string list;
              for (const auto &f : faces)
                if (!GeometrySpec::is_symmetry_face(f))
                  list += (list.empty() ? "" : ", ") + f;
              reader.fail(value, "expected a boundary name (" + list + "), found '" + value.text + "'");
            }
          c.output.time_lags.emplace_back(name, value.text);
        }
      else if (is_face_result_prefix(prefix))
        c.output.face_results.push_back(parse_face_result(prefix, name, value.text, reader.faces, c.units.amount,
                                                          c.time.end, value.origin, value.full_key()));
    });
    for (const auto &value : reader.settings.all())
      if (value.section == "output" && value.key.rfind("samples.", 0) == 0)
        {
          const std::string name = value.key.substr(8);
          if (std::none_of(c.output.lines.begin(), c.output.lines.end(),
                           [&](const LineSpec &l) { return l.name == name; }))
            reader.fail(value, "expected a line of the same name (output.line." + name + " = FROM to TO), found none");
        }
    c.output.loading = reader.quantity("output", "loading", 0);
    if (const auto *moments = reader.get("output", "moments"))
      c.output.moments = moments->flag;
  }
} // namespace fickcast
