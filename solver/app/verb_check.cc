#include "app/verbs.h"

#include "case/case_reader.h"
#include "case/key_schema.h"
#include "numerics/mesh_statistics.h"

#include <deal.II/base/mpi.h>

#include <algorithm>
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
    const MeshStatistics mesh = count_mesh(description, communicator);
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
              << " m\n\n"
              << pad("key", key_width) << "  " << pad("value as written", written_width) << "  "
              << pad("SI value", si_width) << "  from\n";
    for (const auto &record : description.settings)
      std::cout << pad(record.key, key_width) << "  " << pad(record.written, written_width) << "  "
                << pad(record.si, si_width) << "  " << record.origin << '\n';
    return 0;
  }
} // namespace fickcast
