// A structural check of ASCII Gmsh files before deal.II reads them: its reader trusts counts and
// references, and a damaged file could crash it instead of failing with a message.
#pragma once

#include <cstddef>
#include <string>
#include <vector>

namespace fickcast
{
  /// One element of a Gmsh file: its tag, the dimension of its type and its line.
  struct MshElement
  {
    long tag = 0;
    int dimension = 0;
    std::size_t line = 0;
  };

  /**
   * Reads @p path (ASCII Gmsh 2.2 or 4.1) token by token as deal.II's reader will, and checks
   * what that reader takes on trust: the sections it needs are present and closed, every count
   * matches the entries that follow, numbers are numbers (finite coordinates), node tags are
   * unique, every element has the node count of its type and refers to existing nodes, and (4.1)
   * every element block names an entity of $Entities. Throws InputError (key geometry.mesh, the
   * file and line of the first fault) otherwise. Returns the elements in file order (deal.II
   * makes its cells from those of the mesh's dimension in that order). No deal.II here.
   */
  std::vector<MshElement> check_msh_structure(const std::string &path);
} // namespace fickcast
