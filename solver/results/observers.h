// What a run watches: points and their thresholds, sampling lines (profiles.csv) and the depths
// along them, the released fraction and its events, spread moments.
#pragma once

#include "results/csv_writer.h"
#include "results/field_view.h"
#include "results/point_evaluator.h"
#include "results/run_record.h"

#include <cstdint>
#include <memory>
#include <string>
#include <vector>

namespace fickcast
{
  /// What the observers have seen so far, for a checkpoint (plain data).
  struct ObserverState
  {
    std::vector<double> point_values;
    std::vector<double> threshold_times;
    std::vector<std::vector<double>> depth_times, depth_values;
    double last_released = 0;
    std::vector<double> release_times;
    std::vector<MomentsRecord> moments;
    std::uint64_t profiles_size = 0; ///< bytes of profiles.csv written (rank 0)
  };

  /**
   * Observes the state after every accepted step and at every output time, and keeps the event
   * results in a RunRecord. Events are interpolated linearly within the step that crosses them
   * (not rounded to a step). Collective: every rank calls every member.
   */
  template <int dim>
  class Observers
  {
  public:
    using Vector = FieldVector;

    /// Locates points and line points (InputError if outside the mesh); opens profiles.csv in
    /// @p folder on rank 0 when there are lines. @p initial_amount is the content at t = 0;
    /// @p equilibrium_amount the content at the equilibrium of an uptake case (else unused).
    /// With @p resume, profiles.csv is left as it is until restore().
    Observers(const FieldView<dim> &field, const CaseDescription &description, const std::string &folder,
              double initial_amount, double equilibrium_amount, bool resume = false);
    /// Everything seen so far; flushes profiles.csv (rank 0).
    ObserverState saved_state();
    /// Continues from @p state (what saved_state() gave on the same rank): profiles.csv is cut
    /// to what it held then and appended to. Throws IoError.
    void restore(const ObserverState &state);

    /// Point values at the last observed state (SI concentrations).
    const std::vector<double> &point_values() const { return point_values_; }
    /// The named points' values of any ghosted field @p ghosted (a state or a difference of
    /// states; collective), without observing it.
    std::vector<double> point_values_of(const Vector &ghosted) const
    {
      return named_points_ ? named_points_->concentrations(ghosted) : std::vector<double>{};
    }
    /// The content fraction for a content @p remaining: released (M0 - M) / reference, or, in an
    /// uptake case, taken up (M - M0) / (M_eq - M0); NaN without a reference amount.
    double released_fraction(double remaining) const;
    bool has_release() const { return reference_ > 0; }

    /// The state at t = 0.
    void start(const Vector &ghosted, double remaining);
    /// The state after a step from @p t0 to @p t1.
    void step(double t0, double t1, const Vector &ghosted, double remaining);
    /// An output time: profiles, depths, moments.
    void output(double t, const Vector &ghosted);
    /// Locates the points and lines anew after the mesh changed (runtime remeshing); what was
    /// observed so far stays.
    void relocate();
    /// Moves the event results into @p record and closes profiles.csv.
    void finish(RunRecord &record);

  private:
    struct Line
    {
      std::string name;
      std::vector<dealii::Point<dim>> points;
      std::vector<double> distance;
      std::unique_ptr<PointEvaluator<dim>> evaluator;
      std::string what; ///< the key that placed it, for messages
    };

    Line make_line(const std::string &name, const dealii::Point<dim> &from, const dealii::Point<dim> &to,
                   std::size_t samples, const std::string &what) const;
    Line default_depth_line() const;

    FieldView<dim> field_;
    const CaseDescription &c_;
    bool root_;
    std::unique_ptr<PointEvaluator<dim>> named_points_;
    std::vector<dealii::Point<dim>> points_;                         ///< the named points
    std::vector<std::string> point_regions_, point_names_, origins_; ///< their regions, names and places
    std::vector<double> point_values_;
    std::vector<NamedPointRecord> point_records_;
    std::vector<Line> lines_;       ///< named sampling lines
    std::vector<Line> depth_lines_; ///< one per depth (a named line, or the default one)
    std::vector<DepthRecord> depths_;
    double reference_ = 0;      ///< what the released fraction refers to: output.loading or the initial content
    double initial_amount_ = 0; ///< content at t = 0
    double last_released_ = 0;
    std::vector<ReleaseRecord> releases_;
    std::vector<MomentsRecord> moments_;
    std::string profiles_path_;
    std::size_t profiles_columns_ = 0;
    CsvWriter profiles_;
  };
} // namespace fickcast
