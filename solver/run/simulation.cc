#include "run/simulation.h"

#include "case/input_error.h"
#include "model/clock.h"
#include "numerics/diffusion_problem.h"
#include "numerics/step_controller.h"
#include "results/csv_writer.h"
#include "results/field_writer.h"
#include "results/observers.h"
#include "run/carried_error.h"
#include "run/checkpoint.h"
#include "run/equilibrium_amount.h"
#include "run/face_histories.h"
#include "run/field_view_of.h"
#include "run/flow_report.h"
#include "run/guards.h"
#include "run/landing_times.h"
#include "run/run_remeshing.h"
#include "run/series_layout.h"
#include "run/starting_step.h"
#include "run/step_error.h"

#include <deal.II/base/mpi.h>

#include <algorithm>
#include <atomic>
#include <chrono>
#include <cmath>
#include <cstdio>
#include <deque>

namespace fickcast
{
  using namespace dealii;

  namespace
  {
    std::atomic<bool> stop_flag{false};

    /// A time in a message: six significant digits, any magnitude.
    std::string time_text(const double t)
    {
      char buffer[32];
      std::snprintf(buffer, sizeof(buffer), "%.6g", t);
      return buffer;
    }

    /// One remembered state: clock reading, time and u.
    template <typename Vector>
    struct Snapshot
    {
      double clock;
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
                     const ProgressCallback &progress, const StateObserver<dim> &observer,
                     const CheckpointPolicy &checkpoints)
  {
    using Vector = typename DiffusionProblem<dim>::Vector;
    const auto wall_start = std::chrono::steady_clock::now();
    const bool root = Utilities::MPI::this_mpi_process(communicator) == 0;

    DiffusionProblem<dim> problem(c, communicator);
    problem.setup();
    const FieldView<dim> field = field_view_of(problem);

    // Checkpoints: this run's identity, and the newest checkpoint if the run resumes.
    CheckpointStore store(folder, communicator);
    CheckpointIdentity identity;
    identity.fingerprint = c.fingerprint;
    identity.dimension = dim;
    identity.ranks = Utilities::MPI::n_mpi_processes(communicator);
    if (!c.numerics.remesh) // a remeshed run's checkpoint holds its mesh; its vectors are checked on it
      {
        identity.unknowns = problem.n_dofs();
        const Vector probe = problem.make_vector();
        identity.local_unknowns = static_cast<std::uint64_t>(probe.end() - probe.begin());
      }
    std::optional<StateArchive> resumed;
    if (checkpoints.resume)
      resumed = store.read_latest(identity);

    RunRecord record;
    record.dimension = dim;
    record.cells = problem.n_cells();
    record.unknowns = problem.n_dofs();
    record.degree = problem.degree();
    record.ranks = Utilities::MPI::n_mpi_processes(communicator);
    record.linear_solver = problem.linear_solver_description();
    record.regions = problem.names().regions;
    record.boundaries = problem.names().boundaries;
    const unsigned int n_boundaries = record.boundaries.size();
    record.boundary_entered.assign(n_boundaries, 0.0);
    for (const auto &stage : c.stages)
      record.stages.push_back({stage.name, stage.start, stage.end()});

    record.bath_final.assign(n_boundaries, not_a_number);
    const SeriesLayout layout =
      series_layout(c, record.regions, record.boundaries, problem.has_dispersed_phase(), problem.is_nonlinear());
    const std::vector<bool> &active_boundary = layout.active_boundary, &bath_boundary = layout.bath_boundary;
    const bool has_source = layout.has_source, has_decay = layout.has_decay;
    CsvWriter series;
    if (root && !resumed)
      series.open(folder + "/series.csv", layout.columns);

    std::unique_ptr<FieldWriter<dim>> fields;
    if (c.output.write_fields)
      fields = std::make_unique<FieldWriter<dim>>(field, folder + "/fields");

    // The clock: tau = int phi dt when a region's D changes in time only (temperature schedules).
    Clock clock;
    if (problem.has_clock())
      {
        std::vector<double> breaks = c.temperature.times;
        for (const auto &stage : c.stages)
          breaks.push_back(stage.start);
        clock = Clock([&problem](double t) { return problem.clock_rate(t); }, breaks, c.time.end);
      }

    // Initial state.
    Vector u = problem.make_vector();
    problem.initial_state(u);
    const std::vector<double> outputs = output_schedule(c);
    RunRemeshing<dim> remeshing(problem, c, std::max({problem.concentration_scale(), u.linfty_norm(), 1e-300}),
                                first_output_time(c.time.end, outputs));
    // A remeshed run's checkpoint starts with its mesh, its initial amounts (of the initial state
    // on the fitted mesh) and the change no term booked yet.
    double resumed_unbooked = 0;
    std::vector<double> resumed_initial;
    if (!resumed)
      remeshing.fit_initial(u);
    else if (remeshing.active())
      {
        remeshing.resume(*resumed);
        u = problem.make_vector();
        resumed_initial = resumed->get_values();
        resumed_unbooked = resumed->get();
      }
    std::deque<Snapshot<Vector>> history; // newest first
    history.push_front({0.0, 0.0, u});
    record.initial_region_amounts = resumed_initial.empty() ? problem.region_amounts(u) : resumed_initial;
    record.initial_undissolved = problem.undissolved_amount();
    double reference_amount = std::abs(record.initial_undissolved);
    for (const double a : record.initial_region_amounts)
      reference_amount += std::abs(a);

    Observers<dim> observers(field, c, folder, reference_amount, equilibrium_amount(problem, c), resumed.has_value());
    auto remaining = [&problem](const Vector &state) {
      double total = problem.undissolved_amount();
      for (const double a : problem.region_amounts(state))
        total += a;
      return total;
    };
    if (!resumed)
      observers.start(problem.make_ghosted(u), remaining(u));
    FaceHistories faces(c, problem.names().boundaries);

    TermRates rates_old = problem.rates(u, 0.0);
    std::vector<double> reaction_rate_old(n_boundaries, not_a_number);
    std::vector<double> amounts_prev(n_boundaries + 2, 0.0); // per boundary, source, decay
    double source_total = 0, decayed_total = 0, balance = 0;
    unsigned int last_iterations = 0, last_nonlinear = 0;
    auto write_row = [&](const double t, const unsigned int step, const double dt, const Vector &state,
                         const std::vector<double> &boundary_rates) {
      const auto amounts = problem.region_amounts(state);
      const double undissolved = problem.undissolved_amount();
      double total = undissolved;
      for (const double a : amounts)
        total += a;
      std::vector<double> row{t, static_cast<double>(step), dt};
      if (c.stages.size() > 1)
        row.push_back(problem.stage());
      if (!c.temperature.empty())
        row.push_back(c.temperature.at(t));
      row.push_back(total);
      row.insert(row.end(), amounts.begin(), amounts.end());
      if (problem.has_dispersed_phase())
        row.push_back(undissolved);
      for (unsigned int b = 0; b < n_boundaries; ++b)
        if (active_boundary[b])
          {
            row.push_back(boundary_rates[b]);
            row.push_back(record.boundary_entered[b]);
          }
      if (problem.has_flow()) // the advective and dispersive parts of each flux
        for (const double part : flow_parts(problem, state, boundary_rates, active_boundary))
          row.push_back(part);
      for (unsigned int b = 0; b < n_boundaries; ++b)
        if (bath_boundary[b])
          row.push_back(problem.bath_concentration(b));
      if (has_source)
        row.push_back(source_total);
      if (has_decay)
        row.push_back(decayed_total);
      row.push_back(balance);
      row.push_back(observers.released_fraction(total));
      const auto &point_values = observers.point_values();
      row.insert(row.end(), point_values.begin(), point_values.end());
      row.push_back(last_iterations);
      if (problem.is_nonlinear())
        row.push_back(last_nonlinear);
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
      observers.output(t, ghosted);
    };

    // A wrong answer is never a result: an expression that gave a value that is not finite (first
    // cause), or a state that is not finite, ends the run before the state is written (collective).
    auto check_finite = [&](const Vector &state, const unsigned int at_step, const double at_t) {
      std::string cause = problem.non_finite_expression();
      if (cause.empty() && !problem.is_finite(state))
        cause = "the state became non-finite at step " + std::to_string(at_step) + ", t = " + time_text(at_t) + " s";
      if (!cause.empty())
        throw RunFailure(cause);
    };
    bool have_good_state = false; // whether u may be written

    const std::vector<double> hard = hard_times(c, outputs);
    const double clock_end = clock.tau(c.time.end);
    TimeSpec steps = c.time;
    if (!clock.is_identity() && steps.adaptive)
      {
        // Step limits are given in time; the controller works on the clock.
        const double ratio = clock_end / c.time.end;
        steps.initial_step *= ratio;
        steps.max_step *= ratio;
      }
    StepController controller(steps, clock_end);
    const double scale = std::max(problem.concentration_scale(), 1e-300);
    // auto is local for now: global control keeps its word but costs 1.5-5.5 times the steps at the
    // same tolerance through a start's stiff transient (benchmark_solver --steps).
    const bool carry_errors = controller.adaptive() && c.time.error_control == ErrorControl::global;
    CarriedError<dim> carried(problem, carry_errors, c.time.tolerance, clock_end);
    if (carried.active())
      controller.set_floor(0.1 * fastest_cell_time(problem, 0.0) * clock_end / c.time.end);

    // Guards: a mesh too coarse where the species enters; values outside the range of the data.
    record.warnings = resolution_warnings(problem, c, first_output_time(c.time.end, outputs));
    if (!problem.refinement_warning().empty())
      record.warnings.insert(record.warnings.begin(), problem.refinement_warning());
    const double crossing_rate = note_flow(problem, record); // Peclet, warnings
    record.warnings.insert(record.warnings.begin(), c.input_warnings.begin(), c.input_warnings.end());
    RangeGuard range(1e-6, !has_source, c.numerics.accuracy > 0);
    double range_upper = std::max(scale, u.linfty_norm());
    const bool dispersed = problem.has_dispersed_phase();
    double t = 0, s = 0;
    unsigned int step = 0, steps_since_restart = 0;
    double unbooked = resumed_unbooked; // change between the last two states no term booked (remeshing)
    std::size_t next_hard = 0, next_output = 0;
    double previous_ds = 0;
    Vector u_new = problem.make_vector();
    const auto step_norm = [&](const Vector &v) {
      return weighted_step_error(v, u_new, scale, c.time.error_floor, dispersed, communicator);
    };

    // The named points' step error, each relative to its own value but to no less than a floor:
    // time.error_floor (set by the accuracy check from the solve before), else in the check's
    // first solve 1e-6 of the scale (the wafer demo's 1-D tail, 7.8e-6 of the scale, came out 15 %
    // high when only the field was judged); without the check they are not judged. The field's
    // measure keeps a floor of 1e-3 of the scale (deeper costs many steps in 3-D).
    const double point_floor =
      c.time.error_floor > 0 ? c.time.error_floor : (c.numerics.accuracy > 0 ? 1e-6 * scale : 0.0);
    const auto point_step_error = [&](const Vector &difference) {
      if (!(point_floor > 0) || c.output.points.empty())
        return 0.0;
      const auto errors = observers.point_values_of(problem.make_ghosted(difference));
      const auto values = observers.point_values_of(problem.make_ghosted(u_new));
      double worst = 0;
      for (std::size_t k = 0; k < errors.size(); ++k)
        worst = std::max(worst, std::abs(errors[k]) / std::max(std::abs(values[k]), point_floor));
      return worst;
    };

    // The first step of the run: what the initial state allows (starting_step.h).
    const auto measure = [&](const Vector &v) { return std::max(step_norm(v), point_step_error(v)); };
    const auto propose_start = [&]() {
      u_new = u;
      if (!dispersed)
        controller.propose_start(starting_step<dim>(problem, u, t, clock.rate(t), controller.cautious_start(),
                                                    clock_end, c.time.tolerance, measure));
    };

    // Everything the loop carries from step to step, in one order for writing and reading.
    auto save_checkpoint = [&]() {
      PhaseTimer::Scope scope(problem.timer(), "checkpoint");
      StateArchive a;
      if (remeshing.active())
        {
          remeshing.save(a);
          a.put(record.initial_region_amounts);
          a.put(unbooked);
        }
      a.put_count(root ? series.flush() : 0);
      put(a, observers.saved_state());
      for (const std::uint64_t n :
           {std::uint64_t(step), std::uint64_t(steps_since_restart), std::uint64_t(next_hard),
            std::uint64_t(next_output), std::uint64_t(last_iterations), std::uint64_t(last_nonlinear),
            std::uint64_t(record.steps_accepted), std::uint64_t(record.steps_rejected),
            std::uint64_t(record.linear_iterations), std::uint64_t(record.nonlinear_iterations)})
        a.put_count(n);
      for (const double x : {t, s, previous_ds, controller.proposal(), rates_old.source, rates_old.decay, source_total,
                             decayed_total, balance})
        a.put(x);
      a.put(rates_old.boundary_inflow);
      a.put(reaction_rate_old);
      a.put(amounts_prev);
      a.put(record.boundary_entered);
      a.put(record.output_times);
      std::vector<double> guard = range.saved();
      guard.push_back(range_upper);
      a.put(guard);
      a.put(owned_values(u));
      a.put_count(history.size());
      for (const auto &h : history)
        {
          a.put(h.clock);
          a.put(h.time);
          a.put(owned_values(h.state));
        }
      carried.save(a);
      faces.save(a);
      put(a, problem.saved_state());
      const std::vector<std::pair<double, std::string>> none;
      const auto &written = fields ? fields->records() : none;
      a.put_count(written.size());
      for (const auto &[when, name] : written)
        {
          a.put(when);
          a.put(name);
        }
      store.write(step, identity, a);
    };

    // A resumed run takes all of it back and goes on from its step.
    if (resumed)
      {
        StateArchive &a = *resumed;
        const std::uint64_t series_size = a.get_count();
        if (root)
          series.reopen(folder + "/series.csv", layout.columns.size(), series_size);
        ObserverState seen;
        get(a, seen);
        observers.restore(seen);
        step = static_cast<unsigned int>(a.get_count());
        steps_since_restart = static_cast<unsigned int>(a.get_count());
        next_hard = a.get_count();
        next_output = a.get_count();
        last_iterations = static_cast<unsigned int>(a.get_count());
        last_nonlinear = static_cast<unsigned int>(a.get_count());
        record.steps_accepted = static_cast<unsigned int>(a.get_count());
        record.steps_rejected = static_cast<unsigned int>(a.get_count());
        record.linear_iterations = a.get_count();
        record.nonlinear_iterations = a.get_count();
        t = a.get();
        s = a.get();
        previous_ds = a.get();
        controller.restore_proposal(a.get());
        rates_old.source = a.get();
        rates_old.decay = a.get();
        source_total = a.get();
        decayed_total = a.get();
        balance = a.get();
        rates_old.boundary_inflow = a.get_values();
        reaction_rate_old = a.get_values();
        amounts_prev = a.get_values();
        record.boundary_entered = a.get_values();
        record.output_times = a.get_values();
        {
          std::vector<double> guard = a.get_values();
          if (guard.empty())
            throw IoError("the checkpoint in " + folder + " is damaged (range guard)");
          range_upper = guard.back();
          guard.pop_back();
          range.restore(guard);
        }
        set_owned_values(u, a.get_values());
        const std::uint64_t kept = a.get_count();
        if (kept > 3 || rates_old.boundary_inflow.size() != n_boundaries || reaction_rate_old.size() != n_boundaries ||
            amounts_prev.size() != n_boundaries + 2 || record.boundary_entered.size() != n_boundaries ||
            next_hard > hard.size() || next_output > outputs.size())
          throw IoError("the checkpoint in " + folder + " does not fit this case (a damaged file)");
        history.clear();
        for (std::uint64_t k = 0; k < kept; ++k)
          {
            Snapshot<Vector> h{a.get(), a.get(), problem.make_vector()};
            set_owned_values(h.state, a.get_values());
            history.push_back(std::move(h));
          }
        carried.load(a, folder);
        faces.load(a, folder);
        ProblemState state;
        get(a, state);
        problem.restore(state);
        std::vector<std::pair<double, std::string>> written(a.get_count());
        for (auto &[when, name] : written)
          {
            when = a.get();
            name = a.get_text();
          }
        if (fields)
          fields->restore(written);
        if (!a.at_end())
          throw IoError("the checkpoint in " + folder + " holds more than this version of fickcast reads");
        record.resumed_at = t;
        have_good_state = true;
      }
    auto last_checkpoint = std::chrono::steady_clock::now();
    // The mesh line comes once the case's input has passed every check (an input error stays the
    // only line on stderr).
    if (progress)
      progress({0, c.time.end, 0, record.cells, record.unknowns, true});

    try
      {
        if (!resumed)
          {
            check_finite(u, 0, 0.0);
            have_good_state = true;
            std::vector<double> initial_rates = rates_old.boundary_inflow;
            for (unsigned int b = 0; b < n_boundaries; ++b)
              if (problem.boundary_kind(b) == BoundaryKind::concentration ||
                  problem.boundary_kind(b) == BoundaryKind::bath)
                initial_rates[b] = not_a_number; // undefined at the instant the condition starts
            write_row(0.0, 0, 0.0, u, initial_rates);
            output_fields(0.0, u);
            propose_start();
          }
        while (next_hard < hard.size())
          {
            const double hard_t = hard[next_hard];
            const double hard_s = clock.tau(hard_t);
            double ds = 0, t1 = 0;
            bool landing = false;
            if (controller.adaptive())
              {
                ds = controller.step_from(s, hard_s, previous_ds);
                landing = std::abs(s + ds - hard_s) <= 1e-12 * clock_end || ds >= hard_s - s;
                t1 = landing ? hard_t : clock.time(s + ds);
                if (landing)
                  ds = hard_s - s;
              }
            else
              {
                const double dt_fixed = std::min(c.time.step, hard_t - t);
                landing = t + dt_fixed >= hard_t * (1 - 1e-12) || hard_t - (t + dt_fixed) < 1e-9 * c.time.step;
                t1 = landing ? hard_t : t + dt_fixed;
                ds = clock.tau(t1) - s;
              }
            if (ds < controller.min_step())
              throw RunFailure("the time step fell below " + std::to_string(controller.min_step()) +
                               " s at t = " + std::to_string(t) + " s");
            const bool shortened = ds < controller.proposal() * (1 - 1e-9);
            const double phi0 = clock.rate(t), phi1 = clock.rate(t1);

            // Scheme for this step (BDF2 is not used with an undissolved reserve).
            StepPlan plan;
            plan.t0 = t;
            plan.t1 = t1;
            unsigned int order = 1;
            bool bdf2 = false;
            const TimeScheme scheme = c.time.scheme;
            if (scheme == TimeScheme::bdf2 && !dispersed && steps_since_restart >= 1 && history.size() >= 2)
              {
                const double omega = ds / (history[0].clock - history[1].clock);
                plan.a0 = (1 + 2 * omega) / (1 + omega);
                plan.a1 = -(1 + omega);
                plan.a2 = omega * omega / (1 + omega);
                plan.w1 = ds / phi1;
                bdf2 = true;
                order = 2;
              }
            else if (scheme == TimeScheme::crank_nicolson && steps_since_restart >= c.time.start_steps)
              {
                plan.w1 = 0.5 * ds / phi1;
                plan.w0 = 0.5 * ds / phi0;
                order = 2;
              }
            else
              plan.w1 = ds / phi1;

            const Vector *u_prev = bdf2 ? &history[1].state : nullptr;
            u_new = u;
            if (history.size() >= 2 && steps_since_restart >= 1)
              {
                const double ratio = ds / (history[0].clock - history[1].clock);
                u_new.sadd(1 + ratio, -ratio, history[1].state);
              }
            const auto step_start = std::chrono::steady_clock::now();
            const StepResult result = problem.advance(plan, u, u_prev, u_new);
            problem.timer().add("step",
                                std::chrono::duration<double>(std::chrono::steady_clock::now() - step_start).count());
            record.linear_iterations += result.linear_iterations;
            last_iterations = result.linear_iterations;
            last_nonlinear = result.nonlinear_iterations;
            record.nonlinear_iterations += result.nonlinear_iterations;
            // An expression that is not finite at t1 stays so whatever the step: no retry.
            if (const std::string cause = problem.non_finite_expression(); !cause.empty())
              throw RunFailure(cause);

            if (!result.converged)
              {
                ++record.steps_rejected;
                if (!controller.adaptive())
                  throw RunFailure("the nonlinear iteration did not converge within " +
                                   std::to_string(c.numerics.max_nonlinear_iterations) + " iterations at t = " +
                                   std::to_string(t1) + " s (a fixed step cannot be reduced; try step = auto)");
                controller.cut(ds);
                if (controller.proposal() < controller.min_step())
                  throw RunFailure("the nonlinear iteration did not converge within " +
                                   std::to_string(c.numerics.max_nonlinear_iterations) +
                                   " iterations, even with the smallest step, at t = " + std::to_string(t) + " s");
                continue;
              }

            check_finite(u_new, step + 1, t1);
            record.linear_iterations += carried.carry(plan, bdf2);

            // Local error estimate from extrapolating the history (in the clock variable).
            bool accepted = true, judged = false;
            if (controller.adaptive())
              {
                const unsigned int points = std::min<std::size_t>(history.size(), order + 1);
                if (points < 2 || steps_since_restart == 0)
                  controller.accept_unjudged(ds, shortened);
                else
                  {
                    Vector predicted = problem.make_vector();
                    std::vector<double> clocks;
                    std::vector<const Vector *> states;
                    for (unsigned int k = 0; k < points; ++k)
                      {
                        clocks.push_back(history[k].clock);
                        states.push_back(&history[k].state);
                      }
                    const double factor = extrapolate(clocks, states, s + ds, ds, bdf2, order, predicted);
                    predicted -= u_new;
                    problem.zero_fixed(predicted);
                    problem.zero_depleted(predicted);
                    double error = 0;
                    if (carried.active())
                      {
                        predicted *= -factor; // the local error, signed as the state's: u_new - extrapolation
                        error = carried.judge(predicted, ds, step_norm);
                      }
                    else
                      error = factor * std::max(step_norm(predicted), point_step_error(predicted)) / c.time.tolerance;
                    judged = true;
                    accepted = controller.judge(ds, error, order, shortened);
                  }
              }
            if (!accepted)
              {
                ++record.steps_rejected;
                continue;
              }
            carried.accept(judged, step_norm, t1);

            // Amounts moved in this step, consistent with the scheme (they close the balance).
            const TermRates rates_new = problem.rates(u_new, t1);
            if (const std::string cause = problem.non_finite_expression(); !cause.empty())
              throw RunFailure(cause);
            const double undissolved_before = problem.undissolved_amount();
            problem.accept_step();
            std::vector<double> amounts(n_boundaries + 2, 0.0);
            std::vector<double> boundary_rates(n_boundaries, 0.0);
            for (unsigned int b = 0; b < n_boundaries; ++b)
              {
                const BoundaryKind kind = problem.boundary_kind(b);
                if (kind == BoundaryKind::concentration || kind == BoundaryKind::bath)
                  {
                    amounts[b] = result.reactions[b];
                    if (plan.w0 == 0 || !std::isfinite(reaction_rate_old[b]))
                      boundary_rates[b] = result.reactions[b] / (plan.w1 + plan.w0);
                    else
                      boundary_rates[b] = (result.reactions[b] - plan.w0 * reaction_rate_old[b]) / plan.w1;
                  }
                else
                  {
                    amounts[b] = plan.w1 * rates_new.boundary_inflow[b] + plan.w0 * rates_old.boundary_inflow[b];
                    boundary_rates[b] = rates_new.boundary_inflow[b];
                  }
              }
            amounts[n_boundaries] = plan.w1 * rates_new.source + plan.w0 * rates_old.source;
            amounts[n_boundaries + 1] = plan.w1 * rates_new.decay + plan.w0 * rates_old.decay;
            if (bdf2)
              for (std::size_t k = 0; k < amounts.size(); ++k)
                amounts[k] = (amounts[k] + plan.a2 * amounts_prev[k]) / plan.a0;

            const auto before = problem.region_amounts(u);
            const auto after = problem.region_amounts(u_new);
            double storage_change = problem.undissolved_amount() - undissolved_before;
            for (std::size_t r = 0; r < before.size(); ++r)
              storage_change += after[r] - before[r];
            double net = amounts[n_boundaries] - amounts[n_boundaries + 1];
            // BDF2 books the previous step's amounts for the change between the two older states;
            // a remeshing changed that by unbooked (coarsening is not conservative): a part of the
            // remeshing term, carried on into the following steps as BDF2 carries it.
            const double remeshing_part = bdf2 ? plan.a2 * unbooked / plan.a0 : 0.0;
            net += remeshing_part;
            remeshing.book(remeshing_part);
            unbooked = remeshing_part;
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
              reaction_rate_old[b] = boundary_rates[b];
            rates_old = rates_new;

            // Advance. Where the dissolution front passed a node the history has a kink: restart it.
            if (dispersed && problem.depleted_in_last_step())
              {
                history.clear();
                steps_since_restart = 0;
              }
            history.push_front({s + ds, t1, u_new});
            if (history.size() > 3)
              history.pop_back();
            u = u_new;
            previous_ds = ds;
            record.courant = std::max(record.courant, crossing_rate * (t1 - t));
            t = t1;
            s += ds;
            ++step;
            ++steps_since_restart;
            ++record.steps_accepted;

            range_upper = std::max(range_upper, problem.concentration_scale(t));
            range.observe(u.min(), u.max(), range_upper, t);
            observers.step(plan.t0, t1, problem.make_ghosted(u), remaining(u));
            faces.record(t, boundary_rates, record.boundary_entered);
            write_row(t, step, t1 - plan.t0, u, boundary_rates);
            if (landing)
              {
                if (next_output < outputs.size() && std::abs(outputs[next_output] - t) <= 1e-12 * c.time.end)
                  {
                    output_fields(t, u);
                    ++next_output;
                  }
                ++next_hard;
                // A stage ends here: the next one's conditions start, the history restarts.
                const unsigned int stage = problem.stage();
                if (stage + 1 < c.stages.size() && t >= c.stages[stage].end() * (1 - 1e-12))
                  {
                    problem.set_stage(stage + 1);
                    carried.restart();
                    history.clear();
                    history.push_front({s, t, u});
                    steps_since_restart = 0;
                    previous_ds = 0;
                    std::fill(amounts_prev.begin(), amounts_prev.end(), 0.0);
                    std::fill(reaction_rate_old.begin(), reaction_rate_old.end(), not_a_number);
                    rates_old = problem.rates(u, t);
                  }
              }
            // Runtime remeshing: every state the next steps use goes to the new mesh.
            if (remeshing.due(step) && next_hard < hard.size())
              {
                std::vector<Vector *> others = carried.states();
                for (auto &h : history)
                  others.push_back(&h.state);
                const double older_before = history.size() >= 2 ? remaining(history[1].state) : 0.0;
                const double current_before = remaining(u);
                if (remeshing.remesh(u, others))
                  {
                    if (history.size() >= 2)
                      unbooked += (remaining(u) - current_before) - (remaining(history[1].state) - older_before);
                    u_new = problem.make_vector();
                    carried.remeshed();
                    observers.relocate();
                    rates_old = problem.rates(u, t);
                    if (carried.active())
                      controller.set_floor(0.1 * fastest_cell_time(problem, t) * clock_end / c.time.end);
                  }
              }
            if (progress)
              progress({t, c.time.end, step, 0, 0, false});

            // A stop request (on any rank) and a checkpoint that is due are decided together.
            int flags[2] = {stop_requested() ? 1 : 0, 0};
            if (checkpoints.write && next_hard < hard.size())
              flags[1] = std::chrono::duration<double>(std::chrono::steady_clock::now() - last_checkpoint).count() >=
                             checkpoints.every
                           ? 1
                           : 0;
            MPI_Allreduce(MPI_IN_PLACE, flags, 2, MPI_INT, MPI_MAX, communicator);
            if (checkpoints.write && (flags[0] || flags[1]))
              {
                save_checkpoint();
                last_checkpoint = std::chrono::steady_clock::now();
              }
            if (flags[0] && next_hard < hard.size())
              {
                record.status = "interrupted";
                record.message = "interrupted at t = " + time_text(t) + " s (step " + std::to_string(step) + ")";
                break;
              }
          }
      }
    catch (const RunFailure &failure)
      {
        record.status = "failed";
        record.message = failure.what();
        if (have_good_state)
          output_fields(t, u);
        record.state_written = have_good_state;
      }

    if (fields && record.status != "interrupted")
      fields->finish();
    if (root)
      series.close();
    if (record.status != "interrupted")
      store.remove_all();
    record.end_time = t;
    record.final_region_amounts = problem.region_amounts(u);
    record.final_undissolved = problem.undissolved_amount();
    for (unsigned int b = 0; b < n_boundaries; ++b)
      if (bath_boundary[b])
        record.bath_final[b] = problem.bath_concentration(b);
    remeshing.report(record);
    record.linear_solver = problem.linear_solver_description();
    if (remeshing.active())
      {
        record.cells = problem.n_cells();
        record.unknowns = problem.n_dofs();
      }
    record.source_total = source_total;
    record.decayed_total = decayed_total;
    record.balance_error = balance;
    carried.report(record);
    double moved = reference_amount;
    for (const double a : record.final_region_amounts)
      moved = std::max(moved, std::abs(a));
    for (const double a : record.boundary_entered)
      moved = std::max(moved, std::abs(a));
    moved = std::max({moved, std::abs(source_total), std::abs(decayed_total)});
    record.balance_error_relative = moved > 0 ? std::abs(balance) / moved : 0.0;
    observers.finish(record);
    record.time_lags = faces.time_lags(c, record.boundary_entered, t);
    record.face_results = faces.results(c, t);
    // A boundary below zero explains a state below zero better than the mesh does.
    const std::string negative = problem.negative_boundary_value();
    if (!negative.empty())
      record.warnings.push_back(negative);
    for (const auto &warning : range.warnings())
      if (negative.empty() || warning.rfind("the concentration went below zero", 0) != 0)
        record.warnings.push_back(warning);
    record.matrix_setups = problem.n_matrix_setups();
    record.wall_time = std::chrono::duration<double>(std::chrono::steady_clock::now() - wall_start).count();
    record.timing = problem.timer().seconds();
    return record;
  }

  template RunRecord simulate<1>(const CaseDescription &, MPI_Comm, const std::string &, const ProgressCallback &,
                                 const StateObserver<1> &, const CheckpointPolicy &);
  template RunRecord simulate<2>(const CaseDescription &, MPI_Comm, const std::string &, const ProgressCallback &,
                                 const StateObserver<2> &, const CheckpointPolicy &);
  template RunRecord simulate<3>(const CaseDescription &, MPI_Comm, const std::string &, const ProgressCallback &,
                                 const StateObserver<3> &, const CheckpointPolicy &);
} // namespace fickcast
