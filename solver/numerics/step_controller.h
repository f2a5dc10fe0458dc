// Step sizes: fixed, or adapted to a local error estimate; landing exactly on output times.
#pragma once

#include "case/case_description.h"

namespace fickcast
{
  /**
   * Chooses step sizes. In adaptive mode the local error of each step is estimated by the
   * caller (difference between the new state and a polynomial extrapolation of the previous
   * ones, scaled to the method's leading error term) and judged here against the tolerance:
   * accept when the scaled error is at most 1, and propose dt * clamp(0.9 err^(-1/(q+1)),
   * 0.2, 2). Growth below 1.5x is not taken, so the step matrix is not refactored for small
   * gains. Steps never overshoot the next output time and never more than double (which keeps
   * variable-step BDF2 zero-stable).
   */
  class StepController
  {
  public:
    StepController(const TimeSpec &spec, double duration);

    bool adaptive() const { return adaptive_; }
    /// The step to take from @p t: at most the proposal, landing on @p hard (> t).
    double step_from(double t, double hard, double previous_step) const;
    /// Judges a step of size @p dt with scaled error @p error at order @p order (adaptive mode);
    /// returns whether it is accepted and updates the proposal. @p shortened: dt was cut to land.
    bool judge(double dt, double error, unsigned int order, bool shortened);
    /// A step of @p dt failed to converge: retry with a fifth of it (below any floor).
    void cut(double dt) { proposal_ = 0.2 * dt; }
    /// Accepts without an estimate (first step, fixed mode).
    void accept_unjudged(double dt, bool shortened);
    double proposal() const { return proposal_; }
    /// Continues with the proposal a checkpoint recorded (proposal()).
    void restore_proposal(const double proposal) { proposal_ = proposal; }
    /// Smallest step allowed before the run is declared failed.
    double min_step() const { return min_step_; }
    /// Steps are not cut below @p floor for accuracy: a step of at least that size whose error
    /// estimate is too large is accepted all the same (its error is then reported, not hidden).
    /// Starts there unless time.initial_step is given.
    void set_floor(double floor);
    /// The first step of the run from an estimate of what the initial state allows
    /// (starting_step), unless time.initial_step is given; kept within the floor and the largest
    /// step. (A later stage keeps the proposal it reached, as before: a shorter restart there
    /// cost the staged restart case 300 more steps of 619.)
    void propose_start(double step);
    /// The start before any estimate: a hundred-millionth of the run.
    double cautious_start() const { return cautious_start_; }

  private:
    bool adaptive_;
    double proposal_;
    double max_step_;
    double min_step_;
    double fixed_;
    double floor_ = 0;
    bool initial_given_;
    double cautious_start_;
  };
} // namespace fickcast
