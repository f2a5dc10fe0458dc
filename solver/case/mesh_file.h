// What a Gmsh mesh file offers before it is read as a mesh: format and named physical groups.
#pragma once

#include <set>
#include <string>
#include <vector>

namespace fickcast
{
  /// One named physical group of a Gmsh file.
  struct PhysicalGroup
  {
    int dimension = 0;
    int tag = 0;
    std::string name;
  };

  struct MeshFileInfo
  {
    std::string path;
    double version = 0;                ///< 2.2 or 4.x
    std::vector<PhysicalGroup> groups; ///< in file order
    std::set<int> element_types;       ///< Gmsh element type codes present
    int dimension = 0;                 ///< highest dimension of the physical groups

    /// Groups of dimension @p dimension, in increasing tag order.
    std::vector<PhysicalGroup> groups_of(int dimension) const;
  };

  /**
   * Reads the header, `$PhysicalNames` and the element types of an ASCII Gmsh file (format 2.2
   * or 4.1). Throws InputError naming the file and the key `geometry.mesh` when the file is
   * missing or unreadable, not an ASCII Gmsh file, or has no named physical groups.
   */
  MeshFileInfo read_mesh_file_info(const std::string &path);
} // namespace fickcast
