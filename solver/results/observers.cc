#include "results/observers.h"

#include "case/input_error.h"
#include "results/moments.h"

#include <deal.II/base/mpi.h>

#include <algorithm>
#include <cmath>

namespace fickcast
{
  using namespace dealii;

  template <int dim>
  Observers<dim>::Observers(const FieldView<dim> &field, const CaseDescription &description, const std::string &folder,
                            const double initial_amount, const double equilibrium_amount, const bool resume)
    : field_(field)
    , c_(description)
    , root_(Utilities::MPI::this_mpi_process(field.communicator) == 0)
  {
    std::vector<Point<dim>> &points = points_;
    std::vector<std::string> &regions = point_regions_, &names = point_names_, &origins = origins_;
    for (const auto &named_point : c_.output.points)
      {
        names.push_back(named_point.name);
        origins.push_back(named_point.origin);
        Point<dim> p;
        for (int d = 0; d < dim; ++d)
          p[d] = named_point.point[d];
        points.push_back(p);
        regions.push_back(named_point.region);
        NamedPointRecord record;
        record.name = named_point.name;
        for (const auto &threshold : c_.output.thresholds)
          if (threshold.name == named_point.name)
            record.threshold = threshold.level;
        point_records_.push_back(record);
      }
    named_points_ = std::make_unique<PointEvaluator<dim>>(field_, points, "output.point", regions, names, origins);

    for (const auto &spec : c_.output.lines)
      {
        Point<dim> from, to;
        for (int d = 0; d < dim; ++d)
          {
            from[d] = spec.from[d];
            to[d] = spec.to[d];
          }
        lines_.push_back(make_line(spec.name, from, to, spec.samples, "output.line." + spec.name));
      }
    for (const auto &depth : c_.output.depths)
      {
        const auto named =
          std::find_if(lines_.begin(), lines_.end(), [&](const Line &l) { return l.name == depth.name; });
        if (named != lines_.end())
          {
            // A finer copy of the named line, so the crossing is located within a cell or so.
            depth_lines_.push_back(make_line(depth.name, named->points.front(), named->points.back(),
                                             std::max<std::size_t>(2001, named->points.size()),
                                             "output.line." + depth.name));
          }
        else
          depth_lines_.push_back(default_depth_line());
        depths_.push_back(DepthRecord{depth.name, depth.level, {}, {}});
      }

    initial_amount_ = initial_amount;
    if (c_.output.uptake)
      reference_ = equilibrium_amount > initial_amount ? equilibrium_amount - initial_amount : 0.0;
    else
      reference_ = c_.output.loading > 0 ? c_.output.loading : initial_amount;
    for (const auto &release : c_.output.releases)
      releases_.push_back(ReleaseRecord{release.name, release.level, not_a_number});

    if (root_ && !lines_.empty())
      {
        std::vector<Column> columns{{"time", "s"}, {"line", ""}, {"distance", "m"}};
        const char *axes[] = {"x", "y", "z"};
        for (int d = 0; d < dim; ++d)
          columns.push_back({axes[d], "m"});
        columns.push_back({"concentration", c_.units.concentration});
        profiles_path_ = folder + "/profiles.csv";
        profiles_columns_ = columns.size();
        if (!resume)
          profiles_.open(profiles_path_, columns);
      }
  }

  template <int dim>
  typename Observers<dim>::Line Observers<dim>::make_line(const std::string &name, const Point<dim> &from,
                                                          const Point<dim> &to, const std::size_t samples,
                                                          const std::string &what) const
  {
    Line line;
    line.name = name;
    for (std::size_t k = 0; k < samples; ++k)
      {
        const double fraction = static_cast<double>(k) / static_cast<double>(samples - 1);
        line.points.push_back(from + fraction * (to - from));
        line.distance.push_back(fraction * from.distance(to));
      }
    line.evaluator = std::make_unique<PointEvaluator<dim>>(field_, line.points, what);
    line.what = what;
    return line;
  }

  template <int dim>
  void Observers<dim>::relocate()
  {
    named_points_ =
      std::make_unique<PointEvaluator<dim>>(field_, points_, "output.point", point_regions_, point_names_, origins_);
    for (auto *list : {&lines_, &depth_lines_})
      for (Line &line : *list)
        line.evaluator = std::make_unique<PointEvaluator<dim>>(field_, line.points, line.what);
  }

  template <int dim>
  typename Observers<dim>::Line Observers<dim>::default_depth_line() const
  {
    // The stacking axis from the top face (Cartesian, at the lateral centre), from the outer
    // surface inward (radial), along the axis (axisymmetric), or along the last axis through the
    // centre of the mesh's bounding box (mesh files).
    const GeometrySpec &g = c_.geometry;
    Point<dim> start, end;
    std::size_t samples = 401;
    if (g.mesh_file.empty())
      {
        const double total = g.total_thickness();
        samples = std::max<std::size_t>(401, 20 * static_cast<std::size_t>(std::ceil(total / g.cell_size)) + 1);
        if (g.radial())
          {
            start[0] = g.inner_radius + total;
            end[0] = g.inner_radius;
          }
        else
          {
            if (g.coordinates == Coordinates::axisymmetric)
              start[0] = end[0] = g.inner_radius;
            else if (dim >= 2)
              start[0] = end[0] = 0.5 * g.width;
            if (dim == 3)
              start[1] = end[1] = 0.5 * g.length;
            end[dim - 1] = total;
          }
      }
    else
      {
        std::vector<double> low(dim, 1e300), high(dim, -1e300);
        for (const auto &cell : field_.triangulation().active_cell_iterators())
          if (cell->is_locally_owned())
            for (const unsigned int v : cell->vertex_indices())
              for (int d = 0; d < dim; ++d)
                {
                  low[d] = std::min(low[d], cell->vertex(v)[d]);
                  high[d] = std::max(high[d], cell->vertex(v)[d]);
                }
        for (int d = 0; d < dim; ++d)
          {
            low[d] = Utilities::MPI::min(low[d], field_.communicator);
            high[d] = Utilities::MPI::max(high[d], field_.communicator);
            start[d] = end[d] = 0.5 * (low[d] + high[d]);
          }
        start[dim - 1] = low[dim - 1];
        end[dim - 1] = high[dim - 1];
        samples = 2001;
      }
    return make_line("depth", start, end, samples, "output.depth");
  }

  template <int dim>
  double Observers<dim>::released_fraction(const double remaining) const
  {
    if (reference_ <= 0)
      return not_a_number;
    // What has left since the start, as a fraction of the reference (the initial content, or
    // output.loading: a label claim that may differ from what the body holds at t = 0); in an
    // uptake case, what has come in, as a fraction of what equilibrium would bring.
    if (c_.output.uptake)
      return (remaining - initial_amount_) / reference_;
    return (initial_amount_ - remaining) / reference_;
  }

  template <int dim>
  void Observers<dim>::start(const Vector &ghosted, const double remaining)
  {
    point_values_ = named_points_->concentrations(ghosted);
    for (std::size_t k = 0; k < point_records_.size(); ++k)
      if (std::isfinite(point_records_[k].threshold) && point_values_[k] >= point_records_[k].threshold)
        point_records_[k].threshold_time = 0; // reached from the start
    last_released_ = released_fraction(remaining);
  }

  template <int dim>
  void Observers<dim>::step(const double t0, const double t1, const Vector &ghosted, const double remaining)
  {
    const std::vector<double> values = named_points_->concentrations(ghosted);
    for (std::size_t k = 0; k < point_records_.size(); ++k)
      {
        auto &p = point_records_[k];
        const double v0 = point_values_[k], v1 = values[k];
        if (std::isfinite(p.threshold) && !std::isfinite(p.threshold_time) && v0 < p.threshold && v1 >= p.threshold)
          p.threshold_time = t0 + (p.threshold - v0) / (v1 - v0) * (t1 - t0);
      }
    point_values_ = values;
    const double released = released_fraction(remaining);
    for (auto &event : releases_)
      if (!std::isfinite(event.time) && last_released_ < event.level && released >= event.level)
        event.time = t0 + (event.level - last_released_) / (released - last_released_) * (t1 - t0);
    last_released_ = released;
  }

  template <int dim>
  void Observers<dim>::output(const double t, const Vector &ghosted)
  {
    for (const auto &line : lines_)
      {
        const auto values = line.evaluator->concentrations(ghosted);
        if (!root_)
          continue;
        for (std::size_t i = 0; i < values.size(); ++i)
          {
            std::vector<std::string> cells{CsvWriter::format(t), line.name, CsvWriter::format(line.distance[i])};
            for (int d = 0; d < dim; ++d)
              cells.push_back(CsvWriter::format(line.points[i][d]));
            cells.push_back(CsvWriter::format(values[i]));
            profiles_.write_cells(cells);
          }
      }
    for (std::size_t k = 0; k < depths_.size(); ++k)
      {
        const Line &line = depth_lines_[k];
        const auto values = line.evaluator->concentrations(ghosted);
        const double level = depths_[k].level;
        double depth = not_a_number;
        if (values.front() < level)
          depth = 0;
        else
          for (std::size_t i = 1; i < values.size(); ++i)
            if (values[i] < level)
              {
                const double z0 = line.distance[i - 1], z1 = line.distance[i];
                depth = z0 + (values[i - 1] - level) / (values[i - 1] - values[i]) * (z1 - z0);
                break;
              }
        depths_[k].times.push_back(t);
        depths_[k].depths.push_back(depth);
      }
    if (c_.output.moments)
      moments_.push_back(spread_moments(field_, ghosted, t));
  }

  template <int dim>
  ObserverState Observers<dim>::saved_state()
  {
    ObserverState state;
    state.point_values = point_values_;
    for (const auto &p : point_records_)
      state.threshold_times.push_back(p.threshold_time);
    for (const auto &d : depths_)
      {
        state.depth_times.push_back(d.times);
        state.depth_values.push_back(d.depths);
      }
    state.last_released = last_released_;
    for (const auto &r : releases_)
      state.release_times.push_back(r.time);
    state.moments = moments_;
    if (profiles_.is_open())
      state.profiles_size = profiles_.flush();
    return state;
  }

  template <int dim>
  void Observers<dim>::restore(const ObserverState &state)
  {
    if (state.point_values.size() != point_values_.size() && !point_values_.empty())
      throw IoError("the checkpoint holds " + std::to_string(state.point_values.size()) + " points, the case " +
                    std::to_string(point_records_.size()));
    if (state.threshold_times.size() != point_records_.size() || state.depth_times.size() != depths_.size() ||
        state.depth_values.size() != depths_.size() || state.release_times.size() != releases_.size())
      throw IoError("the checkpoint's points, depths or release levels do not match the case");
    point_values_ = state.point_values;
    for (std::size_t k = 0; k < point_records_.size(); ++k)
      point_records_[k].threshold_time = state.threshold_times[k];
    for (std::size_t k = 0; k < depths_.size(); ++k)
      {
        depths_[k].times = state.depth_times[k];
        depths_[k].depths = state.depth_values[k];
      }
    last_released_ = state.last_released;
    for (std::size_t k = 0; k < releases_.size(); ++k)
      releases_[k].time = state.release_times[k];
    moments_ = state.moments;
    if (root_ && !profiles_path_.empty())
      profiles_.reopen(profiles_path_, profiles_columns_, state.profiles_size);
  }

  template <int dim>
  void Observers<dim>::finish(RunRecord &record)
  {
    for (std::size_t k = 0; k < point_records_.size(); ++k)
      point_records_[k].final_value = point_values_[k];
    record.points = point_records_;
    record.depths = depths_;
    record.releases = releases_;
    record.released_reference = reference_;
    record.uptake = c_.output.uptake;
    record.released_final = last_released_;
    record.moments = moments_;
    for (const auto &line : lines_)
      record.lines.push_back(line.name);
    if (profiles_.is_open())
      profiles_.close();
  }

  template class Observers<1>;
  template class Observers<2>;
  template class Observers<3>;
} // namespace fickcast
