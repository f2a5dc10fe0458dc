// Everything a run found out, in SI: what summary.json and the closing report are made from.
#pragma once

#include <array>
#include <cmath>
#include <limits>
#include <map>
#include <string>
#include <vector>

namespace fickcast
{
  constexpr double not_a_number = std::numeric_limits<double>::quiet_NaN();

  struct NamedPointRecord
  {
    std::string name;
    double final_value = not_a_number;    ///< concentration at the end, SI
    double threshold = not_a_number;      ///< level of output.threshold.NAME, if any
    double threshold_time = not_a_number; ///< first time the level was reached; NaN if never
  };

  struct DepthRecord
  {
    std::string name;
    double level = 0;
    std::vector<double> times;  ///< output times, s
    std::vector<double> depths; ///< m from the top face; NaN where c never falls below the level
  };

  /// When the released fraction reached a level.
  struct ReleaseRecord
  {
    std::string name;
    double level = 0;
    double time = not_a_number; ///< s; NaN if never
  };

  /// Time lag of the amount through a boundary, from the asymptote of its cumulative amount.
  struct TimeLagRecord
  {
    std::string name, boundary;
    double time_lag = not_a_number;   ///< s
    double final_flux = not_a_number; ///< amount per time, inward positive
    bool steady = false;              ///< the flux changed by less than 0.1 % over the last fifth of the run
  };

  /// A named result through a face (output.flux.*, crossed.*, peak_flux.*, flux_limit.*,
  /// crossed_limit.*, steady_flux.*), counted in its direction (out of or into the body).
  struct FaceResultRecord
  {
    std::string prefix, name, boundary; ///< prefix: flux, crossed, ...
    bool outward = true;
    double asked_time = not_a_number; ///< s: flux and crossed (the end if none was asked)
    double limit = not_a_number;      ///< flux_limit (amount per time), crossed_limit (amount)
    double value = not_a_number;      ///< rate (amount per time) or amount; for limits the time, s
    double when = not_a_number;       ///< peak_flux: when it came, s
    bool steady = false;              ///< steady_flux: changed by less than 0.1 % over the last fifth
    std::string note;                 ///< a caveat a person must read beside the value, or empty
    std::string full_name() const { return prefix + "." + name; }
  };

  /// Mean position and variance of the content at one output time.
  struct MomentsRecord
  {
    double time = 0;
    double amount = 0;
    std::array<double, 3> mean{{0, 0, 0}}; ///< m
    double variance = 0;                   ///< m2, sum over the axes
  };

  struct StageRecord
  {
    std::string name;
    double start = 0, end = 0; ///< s
  };

  /// One solve of an accuracy check (numerics.accuracy): the mesh and step control it used.
  struct SolveFacts
  {
    unsigned int refine = 0; ///< geometry.refine of this solve
    double step_control = 0; ///< time.tolerance (adaptive steps) or time.step in s (fixed steps)
    bool adaptive_steps = true;
    unsigned long cells = 0, unknowns = 0;
    unsigned int steps = 0;
    double wall_time = 0; ///< s
  };

  /// What the accuracy check found: each named result's estimated error (SI, its unit).
  struct AccuracyRecord
  {
    double requested = 0; ///< relative accuracy asked for; 0: off (one unchecked solve)
    bool checked = false; ///< at least two solves were compared
    bool met = false;     ///< every estimate within the request
    std::vector<SolveFacts> solves;
    std::map<std::string, double> estimates; ///< result name -> estimated error (SI); inf: the event
                                             ///< happened in one solve only
    std::string note;                        ///< why the check stopped short, if it did
  };

  struct RunRecord
  {
    std::string status = "completed"; ///< completed, failed, interrupted (then no results are written)
    double resumed_at = not_a_number;
    bool state_written = true; ///< a failed run wrote its last good state (false: it failed at t = 0) ///< s: where a
                               ///< resumed run took up its checkpoint
    std::string message;       ///< why it failed, if it did
    unsigned int dimension = 1;
    unsigned long cells = 0;
    unsigned long unknowns = 0;
    /// Runtime remeshing (numerics.remesh): how many times the mesh changed, the most cells and
    /// unknowns it had (cells and unknowns above are the last mesh's), and the amount the
    /// remeshings added in total (coarsening loses what the coarser mesh cannot hold; a term of
    /// the mass balance, not an error of it).
    unsigned int remeshings = 0;
    unsigned long cells_largest = 0, unknowns_largest = 0;
    double remeshed_amount = 0;
    unsigned int degree = 1;
    unsigned int ranks = 1;
    std::string linear_solver;
    /// Water flow: the largest cell Peclet number (and its region) and the largest Courant
    /// number of an accepted step (seepage velocity over retardation, times the step, over the
    /// cell length); 0 without flow.
    double cell_peclet = 0;
    std::string cell_peclet_region;
    double courant = 0;
    double end_time = 0; ///< s, time reached
    unsigned int steps_accepted = 0;
    unsigned int steps_rejected = 0;
    /// Time error carried by the state (time.error_control = global), relative like
    /// time.tolerance: at the end and the largest over the run; -1 when not estimated.
    double carried_time_error = -1, carried_time_error_largest = -1;
    double carried_time_error_largest_at = 0; ///< s
    unsigned int steps_at_floor = 0;          ///< accepted above the tolerance at the smallest step allowed
    unsigned long linear_iterations = 0;
    unsigned long nonlinear_iterations = 0;
    unsigned int matrix_setups = 0;
    double wall_time = 0; ///< s
    std::vector<std::string> regions, boundaries;
    std::vector<double> initial_region_amounts, final_region_amounts;
    double initial_undissolved = 0, final_undissolved = 0; ///< content above solubility
    std::vector<double> bath_final; ///< per boundary: final bath concentration (NaN if not a bath)
    std::vector<StageRecord> stages;
    std::vector<double> boundary_entered; ///< cumulative amount in through each boundary
    double source_total = 0;
    double decayed_total = 0;
    double balance_error = 0;          ///< cumulative: storage change - (in + source - decay)
    double balance_error_relative = 0; ///< |balance_error| / reference amount
    std::vector<NamedPointRecord> points;
    std::vector<DepthRecord> depths;
    std::vector<ReleaseRecord> releases;
    double released_reference = 0;        ///< amount the content fraction refers to (uptake: M_eq - M0)
    double released_final = not_a_number; ///< content fraction at the end: released, or taken up if `uptake`
    bool uptake = false;                  ///< the content fraction is an uptake (case/content_fraction.h)
    std::vector<TimeLagRecord> time_lags;
    std::vector<FaceResultRecord> face_results;
    std::vector<MomentsRecord> moments;
    std::vector<std::string> lines;
    std::vector<double> output_times;
    std::map<std::string, double> timing; ///< wall seconds per phase
    AccuracyRecord accuracy;
    /// Signs that the numbers may be poor (coarse mesh where the species enters, values out of
    /// range), one line each with the remedy.
    std::vector<std::string> warnings;
  };
} // namespace fickcast
