// What the results writers see of a discretised field: the FE space, names, and the material
// coefficients at points. The run layer makes one from the problem; results never see numerics.
#pragma once

#include "geometry/layered_mesh.h"

#include <deal.II/base/point.h>
#include <deal.II/dofs/dof_handler.h>
#include <deal.II/fe/mapping.h>
#include <deal.II/lac/trilinos_vector.h>

#include <mpi.h>

#include <functional>
#include <string>

namespace fickcast
{
  /// The state vector of a field (distributed; ghosted where results read it).
  using FieldVector = dealii::TrilinosWrappers::MPI::Vector;

  /**
   * A narrow view of one discretised field u (the reference-phase concentration): the finite
   * element space it lives in and, per region (material id), the coefficients the writers need to
   * turn u into what a user reads (phase concentration K u, amount C u, flux -G grad u). The
   * references and functions must outlive the view; all calls are rank-local except
   * check_coefficients, which is collective.
   */
  template <int dim>
  struct FieldView
  {
    const dealii::DoFHandler<dim> *dof_handler = nullptr;
    const dealii::Mapping<dim> *mapping = nullptr;
    MPI_Comm communicator = MPI_COMM_SELF;
    const MeshNames *names = nullptr;
    std::string case_file; ///< for messages

    /// Partition coefficient K of a region: phase concentration c = K u.
    std::function<double(unsigned int region)> partition;
    /// Storage capacity C of a region: amount per bulk volume C u.
    std::function<double(unsigned int region)> capacity;
    /// Conductance G at a point, time and phase concentration: flux -G grad u.
    std::function<double(unsigned int region, const dealii::Point<dim> &, double t, double c)> conductance;
    /// Effective diffusivity tau D at a point and time (c = 0).
    std::function<double(unsigned int region, const dealii::Point<dim> &, double t)> effective_diffusivity;
    /// Weight of the coordinate system at a point (1 for Cartesian).
    std::function<double(const dealii::Point<dim> &)> coordinate_weight;
    /// Throws InputError on every rank if a coefficient asked for was not physical (collective).
    std::function<void()> check_coefficients;

    unsigned int degree() const { return dof_handler->get_fe().degree; }
    const dealii::Triangulation<dim> &triangulation() const { return dof_handler->get_triangulation(); }
  };
} // namespace fickcast
