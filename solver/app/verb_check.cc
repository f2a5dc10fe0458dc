#include "app/verbs.h"

#include "case/case_reader.h"
#include "case/display_units.h"
#include "case/key_schema.h"
#include "numerics/linear_solver.h"
#include "numerics/mesh_statistics.h"
#include "numerics/run_size.h"
#include "run/guards.h"
#include "studies/result_names.h"
#include "studies/sizing.h"
#include "studies/study_plan.h"

#include <deal.II/base/mpi.h>

#include <algorithm>
#include <cstdio>
#include <iostream>

namespace fickcast
{
  namespace
  {
    void list_keys()
    {
      std::string section;
      for (const auto &spec : key_schema())
        {
          const std::string heading =
            spec.section == "region" || spec.section == "boundary" ? spec.section + ".NAME" : spec.section;
          if (heading != section)
            {
              section = heading;
              std::cout << "\n[" << section << "]\n";
            }
          std::string fallback = spec.required ? "(required)" : spec.fallback.empty() ? "(optional)" : spec.fallback;
          std::cout << "  " << spec.key << std::string(spec.key.size() < 16 ? 16 - spec.key.size() : 1, ' ') << fallback
                    << std::string(fallback.size() < 16 ? 16 - fallback.size() : 1, ' ') << spec.help << '\n';
        }
    }

    /// The study of the case checked as sweep or sizing would check it before running anything
    /// (every swept value read into the case, limits, sizing range and target); one line saying
    /// what would run, or empty without a study. Throws InputError.
    std::string check_study(const CaseDescription &description, const Invocation &invocation)
    {
      const SizeSpec &size = description.size;
      if (size.given())
        {
          const SizingOutcome sizing = prepare_sizing(description, invocation.case_file, invocation.overrides);
          return "size: `fickcast size` would search " + sizing.key + " from " + size.parameter.values.at(0) + " to " +
                 size.parameter.values.at(1) + " for " + sizing.result_name + " = " + size.aim +
                 " (both ends accepted by the case)";
        }
      const SweepSpec &sweep = description.sweep;
      if (!sweep.given())
        return {};
      for (const auto &limit : sweep.limits)
        result_level(description, limit.result, limit.level, limit.origin,
                     std::string("sweep.") + (limit.above ? "exceed." : "below.") + limit.result);
      const std::size_t n = plan_study(description).size();
      check_study_values(description, invocation.case_file, invocation.overrides);
      std::string keys;
      for (const auto &p : sweep.sample.empty() ? sweep.vary : sweep.sample)
        keys += (keys.empty() ? "" : ", ") + p.key;
      if (sweep.sample.empty())
        return "sweep: `fickcast sweep` would run " + std::to_string(n) + " cases (" +
               (sweep.zip ? "lists zipped" : "every combination") + " over " + keys +
               "); every value accepted by the case";
      return "sweep: `fickcast sweep` would run " + std::to_string(n) + " Latin hypercube samples of " + keys +
             " (seed " + std::to_string(sweep.seed) + "); the case accepts each distribution's median";
    }
  } // namespace

  int verb_check(const Invocation &invocation, MPI_Comm communicator)
  {
    const bool root = dealii::Utilities::MPI::this_mpi_process(communicator) == 0;
    if (invocation.list_keys)
      {
        if (root)
          list_keys();
        return 0;
      }
    CaseDescription description = read_case(invocation.case_file, invocation.overrides);
    if (!invocation.output.empty())
      description.output.folder = invocation.output;
    const RunSize size = estimate_run_size(description);
    check_run_size(description, size, installed_memory());
    const MeshStatistics mesh = count_mesh(description, communicator);
    const std::string study = check_study(description, invocation);
    if (!root || invocation.quiet)
      return 0;

    std::size_t key_width = 3, written_width = 14, si_width = 8;
    for (const auto &record : description.settings)
      {
        key_width = std::max(key_width, record.key.size());
        written_width = std::max(written_width, record.written.size());
        si_width = std::max(si_width, record.si.size());
      }
    written_width = std::min<std::size_t>(written_width, 40);
    si_width = std::min<std::size_t>(si_width, 40);
    auto pad = [](const std::string &text, const std::size_t width) {
      return text + std::string(text.size() < width ? width - text.size() : 0, ' ');
    };
    std::cout << "case " << description.file << ": " << description.title << " (" << description.dimension << "-D)\n"
              << "concentration: SI " << description.units.concentration
              << " (as written: " << description.units.as_written << "); amounts in " << description.units.amount
              << "\n"
              << "mesh: " << mesh.cells << " cells, " << mesh.unknowns << " unknowns (degree "
              << description.numerics.degree << "), cell sizes " << mesh.smallest_cell << " to " << mesh.largest_cell
              << " m\n";
    if (size.memory > 0 && size.unknowns > 0)
      {
        // Per unknown as estimated, for the unknowns the mesh really has (refinement next to
        // open faces included).
        const double bytes = size.memory / size.unknowns * static_cast<double>(mesh.unknowns);
        const double gib = 1073741824.0;
        char memory[112];
        if (bytes < gib)
          std::snprintf(memory, sizeof(memory),
                        "memory: about %.3g MiB for the solve (estimate; this machine has %.3g GiB)\n",
                        bytes / 1048576.0, installed_memory() / gib);
        else
          std::snprintf(memory, sizeof(memory),
                        "memory: about %.3g GiB for the solve (estimate; this machine has %.3g GiB)\n", bytes / gib,
                        installed_memory() / gib);
        std::cout << memory;
      }
    {
      int ranks = 1;
      MPI_Comm_size(communicator, &ranks);
      std::cout << "linear solver: "
                << linear_solver_plan(choose_direct_solver(description.numerics.linear_solver, description.dimension,
                                                           mesh.unknowns, ranks == 1),
                                      description.numerics.linear_solver,
                                      description.dimension > 1 && description.numerics.degree > 1 &&
                                        description.numerics.matrix_free)
                << "\n";
    }
    if (!mesh.refinement_note.empty())
      std::cout << "mesh near open faces: " << mesh.refinement_note << "\n";
    if (!mesh.refinement_warning.empty())
      std::cout << "warning: " << mesh.refinement_warning << "\n";
    if (mesh.cell_peclet > 0)
      {
        char peclet[32];
        std::snprintf(peclet, sizeof(peclet), "%.3g", mesh.cell_peclet);
        std::cout << "water flow: cell Peclet number up to " << peclet << " (" << mesh.cell_peclet_region
                  << "); the retarded front crosses the shortest cell in "
                  << DisplayUnits(description, 3).time(1.0 / mesh.crossing_rate)
                  << " (a step of that length has Courant number 1); streamline upwinding on\n";
      }
    for (const auto &warning : flow_warnings(mesh.flow_warning, mesh.cell_peclet, mesh.cell_peclet_region))
      std::cout << "warning: " << warning << "\n";
    for (const auto &warning : description.input_warnings)
      std::cout << "warning: " << warning << "\n";
    // A distortion measure (the smallest over the largest Jacobian determinant in a cell): 1 for
    // boxes and parallelograms; near 0 the cell is close to collapse and the solution there is poor.
    std::string centre;
    for (unsigned int d = 0; d < description.dimension; ++d)
      {
        char number[32];
        std::snprintf(number, sizeof(number), "%.6g", mesh.worst_cell_centre[d]);
        centre += (d ? ", " : "") + std::string(number);
      }
    std::printf("mesh shape: worst cell Jacobian ratio %.3g at (%s) m%s\n\n", mesh.worst_jacobian_ratio, centre.c_str(),
                mesh.worst_jacobian_ratio < 0.1 ? ": strongly distorted (below 0.1); expect poor accuracy near it, "
                                                  "or remesh"
                                                : " (1 for boxes and parallelograms)");
    std::fflush(stdout);
    std::cout << pad("key", key_width) << "  " << pad("value as written", written_width) << "  "
              << pad("SI value", si_width) << "  from\n";
    for (const auto &record : description.settings)
      std::cout << pad(record.key, key_width) << "  " << pad(record.written, written_width) << "  "
                << pad(record.si, si_width) << "  " << record.origin << '\n';
    if (!study.empty())
      std::cout << '\n' << study << '\n';
    return 0;
  }
} // namespace fickcast
