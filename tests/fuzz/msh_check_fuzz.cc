// Fuzz harness: the bytes as a Gmsh .msh file, through what `fickcast check` does with a case's
// mesh before any finite-element space exists: the structural check on its own, then the case
// reader's look at the file (format, named groups, element types, with the builder's checks of
// dimension and cell type), deal.II's reader behind the structural check, the renumbering of
// groups, and the cell-validity check. An InputError is the expected answer to a bad mesh;
// anything else thrown, a crash, a hang or a sanitizer report is a finding.
#include "case/input_error.h"
#include "case/mesh_file.h"
#include "fuzz_scratch.h"
#include "geometry/mesh_import.h"
#include "geometry/mesh_quality.h"
#include "geometry/msh_check.h"

#include <deal.II/grid/tria.h>

#include <mpi.h>

#include <cstddef>
#include <cstdint>
#include <set>
#include <string>

namespace
{
  using namespace fickcast;

  /// The geometry the case builder makes of @p info (build_geometry.cc, build_mesh_geometry),
  /// or false where it refuses the mesh for a case of the mesh's own dimension.
  bool mesh_geometry(const MeshFileInfo &info, GeometrySpec &g)
  {
    const int dim = info.dimension;
    if (dim != 2 && dim != 3)
      return false;
    const std::set<int> quadrilaterals{1, 3, 8, 10, 15, 16}, hexahedra{1, 3, 5, 8, 10, 12, 15, 16, 17};
    for (const int type : info.element_types)
      if ((dim == 2 && !quadrilaterals.count(type)) || (dim == 3 && !hexahedra.count(type)))
        return false;
    g.mesh_file = info.path;
    for (const auto &group : info.groups_of(dim))
      {
        for (const auto &name : g.mesh_regions)
          if (name == group.name)
            return false;
        g.mesh_regions.push_back(group.name);
        g.mesh_region_tags.push_back(group.tag);
      }
    for (const auto &group : info.groups_of(dim - 1))
      {
        g.mesh_boundaries.push_back(group.name);
        g.mesh_boundary_tags.push_back(group.tag);
      }
    return !g.mesh_regions.empty();
  }

  template <int dim>
  void read_and_check(const GeometrySpec &geometry)
  {
    dealii::Triangulation<dim> triangulation;
    read_mesh_file<dim>(triangulation, geometry);
    check_mesh_quality(triangulation, geometry, MPI_COMM_SELF);
  }
} // namespace

#if defined(__SANITIZE_ADDRESS__)
#define FICKCAST_FUZZ_LSAN 1
#elif defined(__has_feature)
#if __has_feature(address_sanitizer)
#define FICKCAST_FUZZ_LSAN 1
#endif
#endif
#ifdef FICKCAST_FUZZ_LSAN
#include <sanitizer/lsan_interface.h>
#endif

/// MPI for the cell-validity check (a collective call, here on MPI_COMM_SELF). What Open MPI
/// allocates in MPI_Init is not ours: LeakSanitizer ignores it (libFuzzer checks leaks after
/// inputs, and those stacks end in plugins it cannot name, so tests/sanitizer/lsan.supp cannot
/// match them cheaply). MPI_Finalize is left out: it unloads those plugins, after which their
/// allocations look lost; a process started without mpirun ends cleanly without it.
extern "C" int LLVMFuzzerInitialize(int *, char ***)
{
  int initialized = 0;
  MPI_Initialized(&initialized);
  if (initialized == 0)
    {
#ifdef FICKCAST_FUZZ_LSAN
      __lsan_disable();
#endif
      MPI_Init(nullptr, nullptr);
#ifdef FICKCAST_FUZZ_LSAN
      __lsan_enable();
#endif
    }
  return 0;
}

extern "C" int LLVMFuzzerTestOneInput(const uint8_t *data, const std::size_t size)
{
  const std::string path = fuzz::write_input("mesh.msh", data, size);
  try
    {
      check_msh_structure(path);
    }
  catch (const InputError &)
    {
    }
  try
    {
      const MeshFileInfo info = read_mesh_file_info(path);
      GeometrySpec geometry;
      if (!mesh_geometry(info, geometry))
        return 0;
      if (info.dimension == 2)
        read_and_check<2>(geometry);
      else
        read_and_check<3>(geometry);
    }
  catch (const InputError &)
    {
    }
  return 0;
}
