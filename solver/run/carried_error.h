// The time error carried by the state of an adaptive run: each step's local error estimate,
// transported by the later steps, so that time.tolerance bounds the error of the state itself.
#pragma once

#include "numerics/diffusion_problem.h"
#include "results/run_record.h"
#include "run/checkpoint.h"

#include <vector>

namespace fickcast
{
  /**
   * The shortest time diffusion takes to cross a node spacing of the mesh: the smallest (cell
   * size / degree)^2 / D over the cells, D the effective diffusivity of the cell's region at
   * @p t (collective). Steps far shorter than this only resolve the fastest modes of the
   * discretised equation, which the mesh represents poorly anyway (a sudden surface value), so
   * the global controller takes no step below a tenth of it (Eriksson and Johnson's argument for
   * balancing space and time errors, "Adaptive finite element methods for parabolic problems I",
   * SIAM J. Numer. Anal. 28, 1991; reference from memory).
   */
  template <int dim>
  double fastest_cell_time(const DiffusionProblem<dim> &problem, double t);

  /**
   * Global error estimation by transporting the local errors (the error of the state obeys the
   * step's homogeneous equation, driven by each step's local error; see Lang and Verwer, "On
   * global error estimation and control for initial value problems", SIAM J. Sci. Comput. 29,
   * 2007; reference from memory). Carrying costs one more solve with the step's matrix and
   * preconditioner, and none while nothing is carried.
   *
   * Control: a step is accepted when its local error fits in what the carried error leaves of
   * the tolerance, tol - |carried|, but never less than tol x step / duration (errors that do not
   * decay then add up to at most one more tolerance over the run). While the carried error is
   * above the tolerance (the first steps of a sudden surface value, kept at the controller's
   * floor), a step may add half of what diffusion damped of it in that step. Where diffusion
   * damps earlier errors (a front's start), steps are large; where it does not, they are sized
   * per unit step, which makes the error proportional to the tolerance.
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
      // Above the tolerance (after steps kept at the floor): half of what diffusion damped in
      // this step, so the carried error keeps falling until it is back within the tolerance.
      const double budget =
        std::max({tolerance_ - carried_size_, 0.5 * (final_ - carried_size_), tolerance_ * step / duration_});
      scaled_ = norm(local) / budget;
      return scaled_;
    }
    /// The step is accepted: the carried error (plus the judged local error) becomes current.
    template <typename Norm>
    void accept(bool judged, const Norm &norm, const double t)
    {
      if (!active_)
        return;
      previous_ = current_;
      current_ = carried_;
      if (judged)
        current_ += local_;
      nonzero_ = nonzero_ || judged;
      if (judged && scaled_ > 1)
        ++at_floor_;
      final_ = norm(current_);
      if (final_ > largest_)
        {
          largest_ = final_;
          largest_time_ = t;
        }
    }
    /// The vectors a remeshing must carry to the new mesh (none when not active); after it,
    /// remeshed() sizes the scratch vectors for the new mesh.
    std::vector<Vector *> states()
    {
      return active_ ? std::vector<Vector *>{&current_, &previous_} : std::vector<Vector *>{};
    }
    void remeshed()
    {
      if (!active_)
        return;
      carried_ = problem_.make_vector();
      local_ = problem_.make_vector();
    }
    /// A new stage: the history restarts; the error carried so far stays.
    void restart() { previous_ = current_; }
    /// Largest and last carried error over the run, relative as the tolerance (-1 if not active).
    double largest() const { return active_ ? largest_ : -1.0; }
    double last() const { return active_ ? final_ : -1.0; }
    /// Steps accepted with their error above the budget (kept at the controller's floor).
    unsigned int steps_at_floor() const { return at_floor_; }
    /// When the largest carried error was seen (s).
    double largest_time() const { return largest_time_; }
    /// Puts the carried error into @p record, with a warning when it ends above the tolerance
    /// (steps kept at the floor in a body that damps their error slowly).
    void report(RunRecord &record) const;
    /// Writes the carried error to a checkpoint, and reads it back (IoError naming @p folder if
    /// it does not fit this case).
    void save(StateArchive &archive) const;
    void load(StateArchive &archive, const std::string &folder);

  private:
    DiffusionProblem<dim> &problem_;
    bool active_;
    double tolerance_, duration_;
    Vector current_, previous_, carried_, local_;
    bool nonzero_ = false;
    double carried_size_ = 0, final_ = 0, largest_ = 0, largest_time_ = 0, scaled_ = 0;
    unsigned int at_floor_ = 0;
  };
} // namespace fickcast
