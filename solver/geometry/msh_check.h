// A structural check of ASCII Gmsh files before deal.II reads them: its reader trusts counts and
// references, and a damaged file could crash it instead of failing with a message.
#pragma once

#include <string>

namespace fickcast
{
  /**
   * Reads @p path (ASCII Gmsh 2.2 or 4.1) token by token as deal.II's reader will, and checks
   * what that reader takes on trust: the sections it needs are present and closed, every count
   * matches the entries that follow, numbers are numbers (finite coordinates), node tags are
   * unique, every element has the node count of its type and refers to existing nodes, and (4.1)
   * every element block names an entity of $Entities. Throws InputError (key geometry.mesh, the
   * file and line of the first fault) otherwise. No deal.II here.
   */
  void check_msh_structure(const std::string &path);
} // namespace fickcast
