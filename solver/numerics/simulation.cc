#include "numerics/simulation.h"

#include "case/input_error.h"
#include "numerics/diffusion_problem.h"
#include "numerics/step_controller.h"
#include "results/csv_writer.h"
#include "results/field_writer.h"
#include "results/point_evaluator.h"

#include <deal.II/base/mpi.h>

#include <algorithm>
#include <atomic>
#include <chrono>
#include <cmath>
#include <deque>

namespace fickcast
{
  using namespace dealii;

  namespace
  {
    std::atomic<bool> stop_flag{false};

    /// Output times: listed times, multiples of fields_every, and the end, sorted and unique.
    std::vector<double> output_schedule(const CaseDescription &c)
    {
      std::vector<double> times = c.output.times;
      if (c.output.fields_every > 0)
        for (double t = c.output.fields_every; t < c.time.end * (1 - 1e-12); t += c.output.fields_every)
          times.push_back(t);
      times.push_back(c.time.end);
      std::sort(times.begin(), times.end());
      std::vector<double> unique;
      for (const double t : times)
        if (t > 0 && (unique.empty() || t - unique.back() > 1e-12 * c.time.end))
          unique.push_back(t);
      return unique;
    }

    /// One remembered state for error estimation and BDF2.
    template <typename Vector>
    struct Snapshot
    {
      double time;
      Vector state;
    };
  } // namespace

  void request_stop()
  {
    stop_flag = true;
  }

  bool stop_requested()
  {
    return stop_flag;
  }

  template <int dim>
  RunRecord simulate(const CaseDescription &c, MPI_Comm communicator, const std::string &folder,
                     const ProgressCallback &progress, const StateObserver<dim> &observer)
  {
    using Vector = typename DiffusionProblem<dim>::Vector;
    const auto wall_start = std::chrono::steady_clock::now();
    const bool root = Utilities::MPI::this_mpi_process(communicator) == 0;

    DiffusionProblem<dim> problem(c, communicator);
    problem.setup();

    RunRecord record;
    record.dimension = dim;
    record.cells = problem.n_cells();
    record.unknowns = problem.n_dofs();
    record.degree = problem.degree();
    record.ranks = Utilities::MPI::n_mpi_processes(communicator);
    record.linear_solver = problem.uses_direct_solver() ? "direct (KLU)" : "CG with algebraic multigrid";
    record.regions = problem.names().regions;
    record.boundaries = problem.names().boundaries;
    const unsigned int n_boundaries = record.boundaries.size();
    record.boundary_entered.assign(n_boundaries, 0.0);

    // Probes, thresholds, depths.
    std::vector<Point<dim>> probe_points;
    for (const auto &probe : c.output.probes)
      {
        Point<dim> p;
        for (int d = 0; d < dim; ++d)
          p[d] = probe.point[d];
        probe_points.push_back(p);
        ProbeRecord probe_record;
        probe_record.name = probe.name;
        for (const auto &threshold : c.output.thresholds)
          if (threshold.name == probe.name)
            probe_record.threshold = threshold.level;
        record.probes.push_back(probe_record);
      }
    const PointEvaluator<dim> probes(problem, probe_points, "output.probe");

    const double total_thickness = c.geometry.total_thickness();
    std::vector<Point<dim>> line_points;
    {
      const std::size_t n_line =
        std::max<std::size_t>(400, 20 * static_cast<std::size_t>(std::ceil(total_thickness / c.geometry.cell_size)));
      for (std::size_t k = 0; k <= n_line; ++k)
        {
          Point<dim> p;
          if (dim >= 2)
            p[0] = 0.5 * c.geometry.width;
          if (dim == 3)
            p[1] = 0.5 * c.geometry.length;
          p[dim - 1] = total_thickness * static_cast<double>(k) / static_cast<double>(n_line);
          line_points.push_back(p);
        }
    }
    std::unique_ptr<PointEvaluator<dim>> line;
    if (!c.output.depths.empty())
      line = std::make_unique<PointEvaluator<dim>>(problem, line_points, "output.depth");
    for (const auto &depth : c.output.depths)
      record.depths.push_back(DepthRecord{depth.name, depth.level, {}, {}});

    // Series columns.
    const std::string amount_unit = c.units.amount;
    const std::string rate_unit = c.units.amount + "/s";
    std::vector<Column> columns{{"time", "s"}, {"step", ""}, {"dt", "s"}, {"amount.total", amount_unit}};
    for (const auto &r : record.regions)
      columns.push_back({"amount." + r, amount_unit});
    std::vector<unsigned int> active_boundaries;
    for (unsigned int b = 0; b < n_boundaries; ++b)
      if (problem.boundary_kind(b) != BoundaryKind::sealed)
        {
          active_boundaries.push_back(b);
          columns.push_back({"flux_in." + record.boundaries[b], rate_unit});
          columns.push_back({"amount_in." + record.boundaries[b], amount_unit});
        }
    bool has_source = false, has_decay = false;
    for (const auto &r : c.regions)
      {
        has_source = has_source || !(r.source.is_constant() && r.source.value == 0);
        has_decay = has_decay || r.decay_rate > 0;
      }
    if (has_source)
      columns.push_back({"source.total", amount_unit});
    if (has_decay)
      columns.push_back({"decayed.total", amount_unit});
    columns.push_back({"balance_error", amount_unit});
    for (const auto &probe : c.output.probes)
      columns.push_back({"probe." + probe.name, c.units.concentration});
    columns.push_back({"linear_iterations", ""});
    CsvWriter series;
    if (root)
      series.open(folder + "/series.csv", columns);

    std::unique_ptr<FieldWriter<dim>> fields;
    if (c.output.write_fields)
      fields = std::make_unique<FieldWriter<dim>>(problem, folder + "/fields");

    // Initial state.
    Vector u = problem.make_vector();
    problem.initial_state(u);
    std::deque<Snapshot<Vector>> history; // newest first: (t0,u0), (t-1,u-1), (t-2,u-2)
    history.push_front({0.0, u});
    record.initial_region_amounts = problem.region_amounts(u);
    double reference_amount = 0;
    for (const double a : record.initial_region_amounts)
      reference_amount += std::abs(a);

    TermRates rates_old = problem.rates(u, 0.0);
    std::vector<double> dirichlet_rate_old(n_boundaries, not_a_number);
    std::vector<double> amounts_prev(n_boundaries + 2, 0.0); // per boundary, source, decay (BDF2 recursion)
    double source_total = 0, decayed_total = 0, balance = 0;
    unsigned int last_iterations = 0;
    std::vector<double> probe_values = probes.concentrations(problem.make_ghosted(u));
    for (std::size_t k = 0; k < record.probes.size(); ++k)
      if (std::isfinite(record.probes[k].threshold) && probe_values[k] >= record.probes[k].threshold)
        record.probes[k].threshold_time = 0; // reached from the start

    auto write_row = [&](const double t, const unsigned int step, const double dt, const Vector &state,
                         const std::vector<double> &boundary_rates) {
      const auto amounts = problem.region_amounts(state);
      double total = 0;
      for (const double a : amounts)
        total += a;
      std::vector<double> row{t, static_cast<double>(step), dt, total};
      row.insert(row.end(), amounts.begin(), amounts.end());
      for (const unsigned int b : active_boundaries)
        {
          row.push_back(boundary_rates[b]);
          row.push_back(record.boundary_entered[b]);
        }
      if (has_source)
        row.push_back(source_total);
      if (has_decay)
        row.push_back(decayed_total);
      row.push_back(balance);
      row.insert(row.end(), probe_values.begin(), probe_values.end());
      row.push_back(last_iterations);
      if (root)
        series.write(row);
    };

    auto output_fields = [&](const double t, const Vector &state) {
      PhaseTimer::Scope scope(problem.timer(), "output");
      const Vector ghosted = problem.make_ghosted(state);
      if (observer)
        observer(t, problem, ghosted);
      if (fields)
        fields->write(ghosted, t);
      record.output_times.push_back(t);
      if (line)
        {
          const auto values = line->concentrations(ghosted);
          for (std::size_t k = 0; k < c.output.depths.size(); ++k)
            {
              const double level = c.output.depths[k].level;
              double depth = not_a_number;
              if (values.front() < level)
                depth = 0;
              else
                for (std::size_t i = 1; i < values.size(); ++i)
                  if (values[i] < level)
                    {
                      const double z0 = line_points[i - 1][dim - 1], z1 = line_points[i][dim - 1];
                      depth = z0 + (values[i - 1] - level) / (values[i - 1] - values[i]) * (z1 - z0);
                      break;
                    }
              record.depths[k].times.push_back(t);
              record.depths[k].depths.push_back(depth);
            }
        }
    };

    {
      std::vector<double> initial_rates = rates_old.boundary_inflow;
      for (unsigned int b = 0; b < n_boundaries; ++b)
        if (problem.boundary_kind(b) == BoundaryKind::concentration)
          initial_rates[b] = not_a_number; // undefined at the instant the condition starts
      write_row(0.0, 0, 0.0, u, initial_rates);
      output_fields(0.0, u);
    }

    const std::vector<double> schedule = output_schedule(c);
    StepController controller(c.time, c.time.end);
    const double scale = std::max(problem.concentration_scale(), 1e-300);
    double t = 0;
    unsigned int step = 0, steps_since_restart = 0;
    std::size_t next_output = 0;
    double previous_dt = 0;
    Vector u_new = problem.make_vector();

    try
      {
        while (next_output < schedule.size())
          {
            if (stop_requested())
              throw RunFailure("interrupted by a signal at t = " + std::to_string(t) + " s");
            const double hard = schedule[next_output];
            double dt = controller.step_from(t, hard, previous_dt);
            if (dt < controller.min_step())
              throw RunFailure("the time step fell below " + std::to_string(controller.min_step()) +
                               " s at t = " + std::to_string(t) + " s");
            const bool landing = std::abs(t + dt - hard) <= 1e-12 * c.time.end + 1e-300 || dt >= hard - t;
            const double t1 = landing ? hard : t + dt;
            dt = t1 - t;
            const bool shortened = dt < controller.proposal() * (1 - 1e-9);

            // Scheme for this step.
            StepPlan plan;
            plan.t0 = t;
            plan.t1 = t1;
            unsigned int order = 1;
            const TimeScheme scheme = c.time.scheme;
            if (scheme == TimeScheme::bdf2 && steps_since_restart >= 1 && history.size() >= 2)
              {
                const double omega = dt / (history[0].time - history[1].time);
                plan.bdf2 = true;
                plan.alpha0 = (1 + 2 * omega) / (1 + omega);
                plan.alpha1 = -(1 + omega);
                plan.alpha2 = omega * omega / (1 + omega);
                order = 2;
              }
            else if (scheme == TimeScheme::crank_nicolson && steps_since_restart >= c.time.start_steps)
              {
                plan.theta = 0.5;
                order = 2;
              }
            else
              plan.theta = 1.0;

            const Vector *u_prev = plan.bdf2 ? &history[1].state : nullptr;
            // Initial guess for an iterative solver: linear extrapolation of the last two states.
            u_new = u;
            if (history.size() >= 2)
              {
                const double ratio = dt / (history[0].time - history[1].time);
                u_new.sadd(1 + ratio, -ratio, history[1].state);
              }
            const auto step_start = std::chrono::steady_clock::now();
            const StepResult result = problem.advance(plan, u, u_prev, u_new);
            problem.timer().add("step",
                                std::chrono::duration<double>(std::chrono::steady_clock::now() - step_start).count());
            record.linear_iterations += result.linear_iterations;
            last_iterations = result.linear_iterations;

            // Local error estimate from extrapolating the history (free unknowns carry it all).
            bool accepted = true;
            if (controller.adaptive())
              {
                const unsigned int points = std::min<std::size_t>(history.size(), order + 1);
                if (points < 2)
                  controller.accept_unjudged(dt, shortened);
                else
                  {
                    const unsigned int q = points - 1; // order of the estimate actually possible
                    Vector predicted = problem.make_vector();
                    double factor = 0;
                    if (q == 1)
                      {
                        const double h1 = history[0].time - history[1].time;
                        predicted.equ(1 + dt / h1, history[0].state);
                        predicted.add(-dt / h1, history[1].state);
                        factor = dt / (dt + h1);
                        if (order == 2)
                          factor *= 0.5; // a second-order step judged with a first-order estimate
                      }
                    else
                      {
                        const double ta = history[0].time, tb = history[1].time, tc = history[2].time;
                        const double la = (t1 - tb) * (t1 - tc) / ((ta - tb) * (ta - tc));
                        const double lb = (t1 - ta) * (t1 - tc) / ((tb - ta) * (tb - tc));
                        const double lc = (t1 - ta) * (t1 - tb) / ((tc - ta) * (tc - tb));
                        predicted.equ(la, history[0].state);
                        predicted.add(lb, history[1].state);
                        predicted.add(lc, history[2].state);
                        const double h1 = ta - tb, h2 = tb - tc;
                        const double spread = (dt + h1) * (dt + h1 + h2);
                        factor = plan.bdf2 ? (4.0 / 3.0) * dt * dt / spread : 0.5 * dt * dt / spread;
                      }
                    predicted -= u_new;
                    problem.zero_fixed(predicted);
                    const double error =
                      factor * predicted.linfty_norm() / (c.time.tolerance * std::max(scale, u_new.linfty_norm()));
                    accepted = controller.judge(dt, error, order, shortened);
                  }
              }
            else
              controller.accept_unjudged(dt, shortened);
            if (!accepted)
              {
                ++record.steps_rejected;
                continue;
              }

            // Amounts moved in this step, consistent with the scheme (they close the balance).
            const TermRates rates_new = problem.rates(u_new, t1);
            std::vector<double> amounts(n_boundaries + 2, 0.0);
            std::vector<double> boundary_rates(n_boundaries, 0.0);
            for (unsigned int b = 0; b < n_boundaries; ++b)
              {
                if (problem.boundary_kind(b) == BoundaryKind::concentration)
                  {
                    if (plan.bdf2)
                      {
                        amounts[b] = result.dirichlet_terms[b];
                        boundary_rates[b] = result.dirichlet_terms[b] / dt;
                      }
                    else
                      {
                        amounts[b] = result.dirichlet_terms[b];
                        boundary_rates[b] = plan.theta == 1.0 || !std::isfinite(dirichlet_rate_old[b])
                                              ? result.dirichlet_terms[b] / dt
                                              : 2 * result.dirichlet_terms[b] / dt - dirichlet_rate_old[b];
                      }
                  }
                else
                  {
                    amounts[b] = plan.bdf2 ? dt * rates_new.boundary_inflow[b]
                                           : dt * (plan.theta * rates_new.boundary_inflow[b] +
                                                   (1 - plan.theta) * rates_old.boundary_inflow[b]);
                    boundary_rates[b] = rates_new.boundary_inflow[b];
                  }
              }
            amounts[n_boundaries] = plan.bdf2
                                      ? dt * rates_new.source
                                      : dt * (plan.theta * rates_new.source + (1 - plan.theta) * rates_old.source);
            amounts[n_boundaries + 1] = plan.bdf2
                                          ? dt * rates_new.decay
                                          : dt * (plan.theta * rates_new.decay + (1 - plan.theta) * rates_old.decay);
            if (plan.bdf2)
              for (std::size_t k = 0; k < amounts.size(); ++k)
                amounts[k] = (amounts[k] + plan.alpha2 * amounts_prev[k]) / plan.alpha0;

            const auto before = problem.region_amounts(u);
            const auto after = problem.region_amounts(u_new);
            double storage_change = 0;
            for (std::size_t r = 0; r < before.size(); ++r)
              storage_change += after[r] - before[r];
            double net = amounts[n_boundaries] - amounts[n_boundaries + 1];
            for (unsigned int b = 0; b < n_boundaries; ++b)
              {
                net += amounts[b];
                record.boundary_entered[b] += amounts[b];
              }
            source_total += amounts[n_boundaries];
            decayed_total += amounts[n_boundaries + 1];
            balance += storage_change - net;
            amounts_prev = amounts;
            for (unsigned int b = 0; b < n_boundaries; ++b)
              if (problem.boundary_kind(b) == BoundaryKind::concentration)
                dirichlet_rate_old[b] = boundary_rates[b];
            rates_old = rates_new;

            // Advance.
            history.push_front({t1, u_new});
            if (history.size() > 3)
              history.pop_back();
            u = u_new;
            previous_dt = dt;
            t = t1;
            ++step;
            ++steps_since_restart;
            ++record.steps_accepted;

            const std::vector<double> new_values = probes.concentrations(problem.make_ghosted(u));
            for (std::size_t k = 0; k < record.probes.size(); ++k)
              {
                auto &p = record.probes[k];
                const double v0 = probe_values[k], v1 = new_values[k];
                if (std::isfinite(p.threshold) && !std::isfinite(p.threshold_time) && v0 < p.threshold &&
                    v1 >= p.threshold)
                  p.threshold_time = t - dt + (p.threshold - v0) / (v1 - v0) * dt; // linear within the step
              }
            probe_values = new_values;
            write_row(t, step, dt, u, boundary_rates);
            if (landing)
              {
                output_fields(t, u);
                ++next_output;
              }
            if (progress)
              progress(t, c.time.end, step);
          }
      }
    catch (const RunFailure &failure)
      {
        record.status = "failed";
        record.message = failure.what();
        output_fields(t, u);
      }

    if (fields)
      fields->finish();
    if (root)
      series.close();
    record.end_time = t;
    record.final_region_amounts = problem.region_amounts(u);
    record.source_total = source_total;
    record.decayed_total = decayed_total;
    record.balance_error = balance;
    double moved = reference_amount;
    for (const double a : record.final_region_amounts)
      moved = std::max(moved, std::abs(a));
    for (const double a : record.boundary_entered)
      moved = std::max(moved, std::abs(a));
    moved = std::max({moved, std::abs(source_total), std::abs(decayed_total)});
    record.balance_error_relative = moved > 0 ? std::abs(balance) / moved : 0.0;
    for (std::size_t k = 0; k < record.probes.size(); ++k)
      record.probes[k].final_value = probe_values[k];
    record.matrix_setups = problem.n_matrix_setups();
    record.wall_time = std::chrono::duration<double>(std::chrono::steady_clock::now() - wall_start).count();
    record.timing = problem.timer().seconds();
    return record;
  }

  template RunRecord simulate<1>(const CaseDescription &, MPI_Comm, const std::string &, const ProgressCallback &,
                                 const StateObserver<1> &);
  template RunRecord simulate<2>(const CaseDescription &, MPI_Comm, const std::string &, const ProgressCallback &,
                                 const StateObserver<2> &);
  template RunRecord simulate<3>(const CaseDescription &, MPI_Comm, const std::string &, const ProgressCallback &,
                                 const StateObserver<3> &);
} // namespace fickcast
