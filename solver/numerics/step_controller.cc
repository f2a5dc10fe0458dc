#include "numerics/step_controller.h"

#include <algorithm>
#include <cmath>

namespace fickcast
{
  StepController::StepController(const TimeSpec &spec, const double duration)
    : adaptive_(spec.adaptive)
    , max_step_(spec.max_step > 0 ? spec.max_step : duration / 20.0)
    , min_step_(duration * 1e-14)
    , fixed_(spec.step)
    , initial_given_(spec.initial_step > 0)
    , cautious_start_(std::min(max_step_, duration * 1e-8))
  {
    if (adaptive_)
      proposal_ = spec.initial_step > 0 ? spec.initial_step : cautious_start_;
    else
      proposal_ = fixed_;
    proposal_ = std::min(proposal_, duration);
  }

  double StepController::step_from(const double t, const double hard, const double previous_step) const
  {
    double dt = proposal_;
    if (previous_step > 0)
      dt = std::min(dt, 2.0 * previous_step);
    const double remaining = hard - t;
    if (remaining <= dt * (1 + 1e-9))
      return remaining;
    if (adaptive_ && remaining < 2 * dt)
      return remaining / 2;
    return dt;
  }

  bool StepController::judge(const double dt, const double error, const unsigned int order, const bool shortened)
  {
    const double exponent = 1.0 / (order + 1.0);
    double factor = error > 0 ? 0.9 * std::pow(error, -exponent) : 2.0;
    factor = std::clamp(factor, 0.2, 2.0);
    if (error > 1.0)
      {
        if (floor_ > 0 && dt <= floor_ * (1 + 1e-9))
          {
            proposal_ = std::min(floor_, max_step_); // at the floor: accepted, and stays there
            return true;
          }
        proposal_ = std::max(dt * std::min(factor, 0.9), floor_);
        return false;
      }
    if (factor < 1.0)
      proposal_ = dt * factor;
    else if (shortened)
      proposal_ = std::max(proposal_, dt); // a landing step says nothing against the proposal
    else if (factor >= 1.5)
      proposal_ = dt * factor;
    else
      proposal_ = dt;
    proposal_ = std::min(std::max(proposal_, floor_), max_step_);
    return true;
  }

  void StepController::set_floor(const double floor)
  {
    floor_ = std::min(floor, max_step_);
    if (!initial_given_)
      proposal_ = std::max(proposal_, floor_);
  }

  void StepController::propose_start(const double step)
  {
    if (adaptive_ && step > 0 && !initial_given_)
      proposal_ = std::min(std::max(step, floor_), max_step_);
  }

  void StepController::accept_unjudged(const double dt, const bool shortened)
  {
    if (!adaptive_)
      return;
    if (!shortened)
      proposal_ = std::min(max_step_, proposal_);
    (void)dt;
  }
} // namespace fickcast
