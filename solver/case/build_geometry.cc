// The case builder's [geometry]: built-in layers or a mesh file, with the coordinates and dimension.
#include "case/section_builders.h"

#include "case/input_error.h"
#include "case/mesh_file.h"

#include <algorithm>
#include <cmath>
#include <filesystem>
#include <set>

namespace fickcast
{
  namespace
  {
    /// geometry.mesh: the file's dimension, cell types, regions and boundaries; sets reader.mesh.
    void build_mesh_geometry(SectionReader &reader, CaseDescription &c, const SettingValue &mesh)
    {
      GeometrySpec &g = c.geometry;
      reader.mesh = mesh.text;
      std::filesystem::path path(mesh.text);
      if (path.is_relative() && mesh.origin != "--set")
        path = std::filesystem::path(reader.settings.file).parent_path() / path;
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
      if (info.dimension != static_cast<int>(reader.dimension))
        reader.fail(mesh, "expected a mesh of dimension " + std::to_string(reader.dimension) +
                            " (this case's), found one whose "
                            "physical groups go up to dimension " +
                            std::to_string(info.dimension) + " in " + g.mesh_file);
      const std::set<int> quadrilaterals{1, 3, 8, 10, 15, 16}, hexahedra{1, 3, 5, 8, 10, 12, 15, 16, 17};
      for (const int type : info.element_types)
        if ((reader.dimension == 2 && !quadrilaterals.count(type)) || (reader.dimension == 3 && !hexahedra.count(type)))
          reader.fail(mesh, "expected " + std::string(reader.dimension == 2 ? "quadrilateral" : "hexahedral") +
                              " cells (Recombine the mesh in Gmsh), found element type " + std::to_string(type) +
                              " in " + g.mesh_file);
      for (const auto &group : info.groups_of(static_cast<int>(reader.dimension)))
        {
          if (std::find(g.mesh_regions.begin(), g.mesh_regions.end(), group.name) != g.mesh_regions.end())
            reader.fail(mesh, "expected distinct region names in the mesh, found '" + group.name + "' twice");
          g.mesh_regions.push_back(group.name);
          g.mesh_region_tags.push_back(group.tag);
        }
      if (g.mesh_regions.empty())
        reader.fail(mesh, "the mesh has no named physical group of dimension " + std::to_string(reader.dimension) +
                            " (regions) in " + g.mesh_file);
      for (const auto &group : info.groups_of(static_cast<int>(reader.dimension) - 1))
        {
          g.mesh_boundaries.push_back(group.name);
          g.mesh_boundary_tags.push_back(group.tag);
        }
    }
  } // namespace

  void build_geometry(SectionReader &reader, CaseDescription &c)
  {
    GeometrySpec &g = c.geometry;
    const std::string coordinates = reader.text("case", "coordinates");
    g.coordinates = coordinates == "cylinder"       ? Coordinates::cylinder
                    : coordinates == "sphere"       ? Coordinates::sphere
                    : coordinates == "axisymmetric" ? Coordinates::axisymmetric
                                                    : Coordinates::cartesian;
    const unsigned int needed = g.radial() ? 1u : g.coordinates == Coordinates::axisymmetric ? 2u : 0u;
    if (needed != 0 && reader.dimension != needed)
      reader.fail(*reader.get("case", "dimension"), "expected dimension = " + std::to_string(needed) +
                                                      " with coordinates = " + coordinates + ", found " +
                                                      std::to_string(reader.dimension));
    auto forbid = [&](const char *key, const std::string &why) {
      if (const auto *v = reader.get("geometry", key))
        reader.fail(*v, "not used " + why + ", found '" + v->written + "'");
    };
    g.refine = static_cast<unsigned int>(reader.quantity("geometry", "refine", 0));
    const std::string open_faces = reader.text("geometry", "open_face_refinement");
    g.open_face_refinement = open_faces == "on"    ? OpenFaceRefinement::on
                             : open_faces == "off" ? OpenFaceRefinement::off
                                                   : OpenFaceRefinement::automatic;
    g.open_face_cell = reader.quantity("geometry", "open_face_cell", 0.0);
    g.open_face_band = reader.quantity("geometry", "open_face_band", 0.0);
    for (const char *key : {"open_face_cell", "open_face_band"})
      if (g.open_face_refinement == OpenFaceRefinement::off)
        forbid(key, "with geometry.open_face_refinement = off");
    if (const auto *mesh = reader.get("geometry", "mesh"))
      {
        for (const char *key : {"layers", "width", "length", "radius", "inner_radius", "side_coating", "grade_toward",
                                "grading", "cell_size"})
          forbid(key, "with geometry.mesh (the mesh file sets the shape and the cells; use geometry.refine)");
        build_mesh_geometry(reader, c, *mesh);
        return;
      }
    const auto *layers = reader.get("geometry", "layers");
    if (layers == nullptr)
      reader.missing("geometry", "layers",
                     "the layers from the top face inward, such as 'clay 0.9 m, sand 0.3 m' "
                     "(or geometry.mesh = FILE.msh)");
    g.layers = layers->layers;
    const double total = g.total_thickness();
    g.cell_size = reader.quantity("geometry", "cell_size", total / 100.0);
    const bool cartesian = g.coordinates == Coordinates::cartesian;
    if (cartesian && reader.dimension >= 2)
      {
        if (!reader.is_set("geometry", "width"))
          reader.missing("geometry", "width",
                         "the extent along x of this " + std::to_string(reader.dimension) + "-D case");
        g.width = reader.quantity("geometry", "width", 0);
      }
    else
      forbid("width", cartesian ? "in a 1-D case (it is the extent along x in 2-D and 3-D)"
                                : "with coordinates = " + coordinates + " (axisymmetric cases give radius)");
    if (cartesian && reader.dimension == 3)
      {
        if (!reader.is_set("geometry", "length"))
          reader.missing("geometry", "length", "the extent along y of this 3-D case");
        g.length = reader.quantity("geometry", "length", 0);
      }
    else
      forbid("length", "except in 3-D Cartesian cases (it is the extent along y)");
    if (g.coordinates == Coordinates::axisymmetric)
      {
        if (!reader.is_set("geometry", "radius"))
          reader.missing("geometry", "radius", "the outer radius of the layers of this axisymmetric case");
        g.radius = reader.quantity("geometry", "radius", 0);
      }
    else
      forbid("radius", "except with coordinates = axisymmetric (radial cases list their layers outward)");
    if (cartesian)
      forbid("inner_radius", "in Cartesian cases");
    g.inner_radius = reader.quantity("geometry", "inner_radius", 0);
    if (g.coordinates == Coordinates::axisymmetric && g.inner_radius >= g.radius)
      reader.fail(*reader.get("geometry", "inner_radius"),
                  "expected an inner radius below the radius (" + format_si(g.radius, "m") + ")");
    if (const auto *coating = reader.get("geometry", "side_coating"))
      {
        if (g.coordinates != Coordinates::axisymmetric)
          reader.fail(*coating, "only used with coordinates = axisymmetric (a band around the layers)");
        if (coating->layers.size() != 1)
          reader.fail(*coating, "expected one 'name thickness unit', found " + std::to_string(coating->layers.size()));
        g.side_coating = coating->layers.front();
      }
    const std::string grade = reader.text("geometry", "grade_toward");
    // Radial cases list layers from the centre outward: the outer surface ends the stack.
    if (g.radial() && (grade == "top" || grade == "bottom"))
      reader.fail(*reader.get("geometry", "grade_toward"),
                  "expected outer or inner (centre) in a radial case, found " + grade);
    if (!g.radial() && (grade == "outer" || grade == "inner" || grade == "centre"))
      reader.fail(*reader.get("geometry", "grade_toward"),
                  "expected top or bottom (the faces the layers stack between), found " + grade);
    g.grade_toward = grade == "top" || grade == "inner" || grade == "centre" ? Face::top
                     : grade == "bottom" || grade == "outer"                 ? Face::bottom
                                                                             : Face::none;
    g.grading = reader.quantity("geometry", "grading", 1.0);
    if (g.grade_toward == Face::none && g.grading != 1.0)
      reader.fail(*reader.get("geometry", "grading"), "expected grade_toward with a grading other than 1, "
                                                      "found grade_toward = none");
    // Each length is finite as read; their sums are the coordinates of the outer faces.
    const auto *inner = reader.get("geometry", "inner_radius");
    if (!std::isfinite(total) || !std::isfinite(g.inner_radius + total))
      reader.fail(inner != nullptr && std::isfinite(total) ? *inner : *layers,
                  "expected layers whose total thickness (from the inner radius) stays within the range of "
                  "numbers, found an outer face beyond 1.8e308 m");
    if (!std::isfinite(g.radius + g.side_coating.thickness))
      reader.fail(*reader.get("geometry", "side_coating"),
                  "expected a radius and side coating whose sum stays within the range of numbers, found one beyond "
                  "1.8e308 m");
  }
} // namespace fickcast
