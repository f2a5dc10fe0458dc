// Warnings that a run's numbers may be wrong, without an accuracy check: a mesh too coarse where
// the species enters, and concentrations outside the range the data allow.
#pragma once

#include "case/case_description.h"
#include "numerics/diffusion_problem.h"

#include <string>
#include <vector>

namespace fickcast
{
  /**
   * One warning per boundary that lets the species in or out (a concentration, transfer or bath
   * condition in some stage) whose adjacent cells are coarser than the diffusion length
   * sqrt(D t) of the first output interval (to @p first_output): the node spacing (cell size
   * over the element degree) exceeds it, so the values near that boundary are poor until the
   * front has crossed several cells. D is the effective diffusivity of the cell's region at
   * half the interval, at zero concentration. Collective.
   */
  template <int dim>
  std::vector<std::string> resolution_warnings(const DiffusionProblem<dim> &problem, const CaseDescription &c,
                                               double first_output);

  /**
   * Water flow: a sealed face that water crosses (DiffusionProblem::flow_warning), and cells whose
   * Peclet number exceeds 50, beyond which the streamline upwinding keeps a front free of wiggles
   * only by smearing it over a cell or two (the method's own limit is in tests/verification).
   */
  std::vector<std::string> flow_warnings(const std::string &sealed_face_warning, double cell_peclet,
                                         const std::string &peclet_region);

  /**
   * Watches the state for values outside [0, largest initial or boundary value] (a diffusion
   * problem without sources stays inside it; leaving it beyond round-off means the mesh or the
   * step is too coarse for a front). Remembers the worst excursion each way; warnings() gives one
   * line each. Collective.
   */
  class RangeGuard
  {
  public:
    /// @p check_upper: false when sources can raise the state above every boundary value;
    /// @p checked: the accuracy check is on (the remedy then does not ask for it).
    RangeGuard(double relative_tolerance, bool check_upper, bool checked)
      : tolerance_(relative_tolerance)
      , check_upper_(check_upper)
      , checked_(checked)
    {
    }

    /// Looks at @p u at time @p t; @p upper is the largest initial or boundary value so far (> 0).
    void observe(double lowest, double highest, double upper, double t);
    std::vector<std::string> warnings() const;
    /// What a checkpoint keeps, and taking it up again (throws IoError if it does not fit).
    std::vector<double> saved() const
    {
      return {worst_below_, below_time_, worst_above_, above_time_, last_below_, last_above_};
    }
    void restore(const std::vector<double> &saved);

  private:
    double tolerance_;
    bool check_upper_;
    bool checked_;
    double worst_below_ = 0, below_time_ = 0; ///< most negative value / upper
    double worst_above_ = 0, above_time_ = 0; ///< largest (value - upper) / upper
    double last_below_ = 0, last_above_ = 0;  ///< the same at the last look
  };
} // namespace fickcast
