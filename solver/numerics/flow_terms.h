// Water flow in one cell: the advective flux, the mechanical dispersion tensor and the
// streamline-upwind stabilisation of C du/dt = div(G grad u) - div(q K u) - k u + s.
#pragma once

#include "model/material.h"

#include <deal.II/base/point.h>
#include <deal.II/base/tensor.h>

#include <vector>

namespace fickcast
{
  /// The Darcy flux q of @p material as a vector (zero where it has none).
  template <int dim>
  dealii::Tensor<1, dim> darcy_flux_vector(const Material &material);

  /// K times the mechanical dispersion tensor alpha_T |q| I + (alpha_L - alpha_T) q q^T / |q|
  /// (Bear, Dynamics of Fluids in Porous Media, 1972, ch. 10): the conductance it adds to
  /// theta tau K D. Zero without flow.
  template <int dim>
  dealii::Tensor<2, dim> dispersion_conductance(const Material &material);

  /// The extent of @p vertices along the unit vector @p direction (the cell length the flow sees).
  template <int dim>
  double length_along(const std::vector<dealii::Point<dim>> &vertices, const dealii::Tensor<1, dim> &direction);

  /// What the flow does in one cell.
  template <int dim>
  struct CellFlow
  {
    dealii::Tensor<1, dim> flux;       ///< q K: the advective flux per unit u (m/s)
    dealii::Tensor<2, dim> dispersion; ///< dispersion_conductance (m2/s)
    dealii::Tensor<1, dim> velocity;   ///< q K / C: the speed at which u is carried (m/s)
    double tau = 0;                    ///< streamline-upwind parameter (s)
    double peclet = 0;                 ///< cell Peclet number: |q K| h / (G along the flow)
    double crossing_rate = 0;          ///< |velocity| / h (1/s): the Courant number of a step of 1 s
  };

  /**
   * The flow terms of a cell of @p material whose extent along the flow is @p length, with the
   * molecular conductance @p conductance (theta tau K D) and elements of degree @p degree.
   * The stabilisation parameter is that of Brooks and Hughes (Comput. Methods Appl. Mech. Eng.
   * 32 (1982) 199-259, eq. 3.3.5): tau = h / (2 |a|) (coth(Pe) - 1 / Pe), Pe = |a| h / (2 kappa),
   * with a = q K / C, kappa the diffusivity along a, and h the length over the degree (common
   * practice for higher-order elements).
   */
  template <int dim>
  CellFlow<dim> cell_flow(const Material &material, double conductance, double length, unsigned int degree);
} // namespace fickcast
