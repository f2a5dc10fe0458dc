// Integrals of fields over the named regions of one output time, with exact cell quadrature.
#pragma once

#include "run_summary.h"

#include <vtkUnstructuredGrid.h>

#include <string>
#include <vector>

namespace fickcast::post
{
  /// Integrals of each requested field over each region (and their sum) at one output time.
  struct RegionIntegrals
  {
    std::vector<std::string> regions;        ///< region names, by material id
    std::vector<double> measure;             ///< length, area or volume of each region (weighted as below)
    std::vector<std::string> fields;         ///< the integrated fields
    std::vector<std::vector<double>> values; ///< values[field][region]
    std::string method;                      ///< how the cells were integrated, for the record
  };

  /**
   * Integrates point-data fields over each region of @p grid (region ids from the `region`
   * data, names from @p summary). Each finite-element cell (see PatchMesh) is integrated as its
   * Lagrange function of the written degree p on its isoparametric cell with Gauss-Legendre
   * quadrature of 2p + 2 points per axis: exact for the finite-element function on the solver's
   * affine or bilinear cells, including the radial weight 2 pi r (cylinder, axisymmetric) or
   * 4 pi r^2 (sphere), up to the single-precision (float32) values and coordinates of the VTU.
   * Amounts come out per unit area (1-D), per unit length (2-D) or whole, as series.csv gives them.
   * PostInputError if a field is unknown or not a scalar point field.
   */
  RegionIntegrals integrate_regions(vtkUnstructuredGrid *grid, const RunSummary &summary,
                                    const std::vector<std::string> &fields, const std::string &file);
} // namespace fickcast::post
