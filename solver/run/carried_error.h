// The time error carried by the state of an adaptive run: each step's local error estimate,
// transported by the later steps, so that time.tolerance bounds the error of the state itself.
#pragma once

#include "numerics/diffusion_problem.h"

#include <vector>

namespace fickcast
{
  /**
   * Global error estimation by transporting the local errors (the error of the state obeys the
   * step's homogeneous equation, driven by each step's local error; see Lang and Verwer, "On
   * global error estimation and control for initial value problems", SIAM J. Sci. Comput. 29,
   * 2007, section 2). Carrying costs one more solve with the step's matrix and preconditioner,
   * and none while nothing is carried.
   *
   * Control: a step is accepted when its local error fits in what the carried error leaves of
   * the tolerance, tol - |carried|, but never less than tol x step / duration (errors that do not
   * decay then add up to at most one more tolerance over the run). Where diffusion damps earlier
   * errors (a front's start), steps are large; where it does not, they are sized per unit step,
   * which makes the error proportional to the tolerance.
   */
  template <int dim>
  class CarriedError
  {
  public:
    using Vector = typename DiffusionProblem<dim>::Vector;

    CarriedError(DiffusionProblem<dim> &problem, bool active, double tolerance, double duration);

    bool active() const { return active_; }
    /// Carries the error of the state through the step just taken (after advance()); returns
    /// the linear iterations spent.
    unsigned int carry(const StepPlan &plan, bool bdf2);
    /// The local error @p local of that step against what the carried error leaves of the
    /// tolerance (accept when <= 1). @p norm measures a vector the way the step error is measured.
    template <typename Norm>
    double judge(const Vector &local, double step, const Norm &norm)
    {
      local_ = local;
      carried_size_ = norm(carried_);
      const double budget = std::max(tolerance_ - carried_size_, tolerance_ * step / duration_);
      return norm(local) / budget;
    }
    /// The step is accepted: the carried error (plus the judged local error) becomes current.
    template <typename Norm>
    void accept(bool judged, const Norm &norm)
    {
      if (!active_)
        return;
      previous_ = current_;
      current_ = carried_;
      if (judged)
        current_ += local_;
      nonzero_ = nonzero_ || judged;
      final_ = norm(current_);
      largest_ = std::max(largest_, final_);
    }
    /// A new stage: the history restarts; the error carried so far stays.
    void restart() { previous_ = current_; }
    /// Largest and last carried error over the run, relative as the tolerance (-1 if not active).
    double largest() const { return active_ ? largest_ : -1.0; }
    double last() const { return active_ ? final_ : -1.0; }
    /// The carried state, for a checkpoint, and back.
    std::vector<const Vector *> vectors() const { return {&current_, &previous_}; }
    void restore(const std::vector<double> &sizes);
    Vector &current() { return current_; }
    Vector &previous() { return previous_; }

  private:
    DiffusionProblem<dim> &problem_;
    bool active_;
    double tolerance_, duration_;
    Vector current_, previous_, carried_, local_;
    bool nonzero_ = false;
    double carried_size_ = 0, final_ = 0, largest_ = 0;
  };
} // namespace fickcast
