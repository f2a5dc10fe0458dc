// VTU (PVTU when distributed) field files at output times, with a PVD index.
#pragma once

#include "results/field_view.h"

#include <string>
#include <utility>
#include <vector>

namespace fickcast
{
  /**
   * Writes, per output time, the phase concentration c = K u, the reference-phase u, the
   * amount per bulk volume C u, the flux vector -G grad u, the region (material id) and the
   * effective diffusivity, into `fields/fields_NNNN.vtu` (one rank) or `.pvtu` pieces (several),
   * and keeps `fields/fields.pvd` listing them with their times (seconds).
   */
  template <int dim>
  class FieldWriter
  {
  public:
    using Vector = FieldVector;

    /// @p folder is the `fields` folder; it must exist.
    FieldWriter(const FieldView<dim> &field, const std::string &folder);

    /// Writes the ghosted state @p u at time @p t (collective).
    void write(const Vector &u, double t);
    /// Writes the PVD index (rank 0); call after the last write().
    void finish() const;
    /// The files written so far with their times (for a checkpoint).
    const std::vector<std::pair<double, std::string>> &records() const { return records_; }
    /// Continues a resumed run after the files in @p records (later ones are written anew).
    void restore(const std::vector<std::pair<double, std::string>> &records) { records_ = records; }

  private:
    FieldView<dim> field_;
    std::string folder_;
    std::vector<std::pair<double, std::string>> records_;
  };
} // namespace fickcast
