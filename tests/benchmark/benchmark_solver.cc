// Performance figures of the solver (DESIGN.md section 7). A benchmark, not a test: it prints
// wall times, iterations, throughput and memory; nothing is asserted.
//
//   benchmark_solver [--1d] [--3d] [--large]       (default: --1d --3d, 3-D at 1e4 and 1e5, Q1 and Q2)
//   mpirun -np 2 benchmark_solver --3d --large     (3-D at 1e4, 1e5 and 1e6 unknowns on 2 ranks)
//   benchmark_solver --accuracy                     (time to a given accuracy against erfc: fickcast
//                                                    versus a plain uniform-grid Crank-Nicolson
//                                                    finite-difference solver written here, then
//                                                    the step controller against fixed steps)
//   benchmark_solver --steps                        (only the step controller against fixed steps)
#include "case/case_reader.h"
#include "run/run_case.h"
#include "run/simulation.h"

#include <deal.II/base/mpi.h>

#include <sys/resource.h>

#include <algorithm>
#include <chrono>
#include <cmath>
#include <cstdio>
#include <filesystem>
#include <string>
#include <vector>

namespace
{
  using namespace fickcast;

  double peak_memory_mib(MPI_Comm communicator)
  {
    rusage usage{};
    getrusage(RUSAGE_SELF, &usage);
    const double mine = static_cast<double>(usage.ru_maxrss) / 1024.0; // kB on Linux
    return dealii::Utilities::MPI::sum(mine, communicator);
  }

  RunRecord run_text(const std::string &text, const std::string &name, MPI_Comm communicator, const int dim)
  {
    const std::string folder = std::filesystem::temp_directory_path().string() + "/fickcast-benchmark/" + name;
    if (dealii::Utilities::MPI::this_mpi_process(communicator) == 0)
      {
        std::filesystem::remove_all(folder);
        std::filesystem::create_directories(folder + "/fields");
      }
    MPI_Barrier(communicator);
    const CaseDescription description = read_case_text(text, name + ".ini");
    switch (dim)
      {
        case 1:
          return simulate<1>(description, communicator, folder, {});
        case 2:
          return simulate<2>(description, communicator, folder, {});
        default:
          return simulate<3>(description, communicator, folder, {});
      }
  }

  void one_dimensional(MPI_Comm communicator, const bool root)
  {
    if (!root)
      return;
    std::printf("\n1-D layered case: 2000 cells, 1000 fixed steps (BDF2), series.csv every step, "
                "fields at the end\n");
    std::printf("%8s %10s %12s %12s %14s\n", "degree", "unknowns", "wall [s]", "steps", "setup+run [s]");
    for (const unsigned int degree : {1u, 2u})
      {
        const std::string text = "[case]\ntitle = bench 1d\n[geometry]\nlayers = liner 0.6 m, base 0.4 m\n"
                                 "cell_size = 0.5 mm\n[region.liner]\ndiffusivity = 5e-10 m2/s\nporosity = 0.4\n"
                                 "retardation = 2\n[region.base]\ndiffusivity = 2e-9 m2/s\nporosity = 0.3\n"
                                 "[boundary.top]\ntype = concentration\nvalue = 1 kg/m3\n[boundary.bottom]\n"
                                 "type = transfer\ncoefficient = 1e-8 m/s\nambient = 0 kg/m3\n[time]\nend = 30 yr\n"
                                 "step = 0.03 yr\n[numerics]\ndegree = " +
                                 std::to_string(degree) + "\n[output]\npoint.base = 0.6 m\n";
        const RunRecord r = run_text(text, "one_d_q" + std::to_string(degree), MPI_COMM_SELF, 1);
        std::printf("%8u %10lu %12.3f %12u %14.3f\n", degree, r.unknowns, r.wall_time, r.steps_accepted, r.wall_time);
      }
  }

  /// One table of the 3-D box: @p degree, cells per axis @p per_axis, fixed steps @p step to @p end.
  void box_table(MPI_Comm communicator, const bool root, const unsigned int degree,
                 const std::vector<unsigned int> &per_axis, const std::string &step, const std::string &end)
  {
    if (root)
      std::printf("%10s %8s %10s %10s %10s %10s %16s %12s\n", "unknowns", "cells", "s/step", "solve/step", "iter/step",
                  "setup [s]", "unknown*step/s", "peak [MiB]");
    for (const unsigned int n : per_axis)
      {
        const double h = 1.0 / n;
        char cell[32];
        std::snprintf(cell, sizeof(cell), "%.10g", h);
        const std::string text = std::string("[case]\ntitle = bench 3d\ndimension = 3\n[geometry]\n"
                                             "layers = upper 0.5 m, lower 0.5 m\nwidth = 1 m\nlength = 1 m\n"
                                             "cell_size = ") +
                                 cell +
                                 " m\n[region.upper]\ndiffusivity = 1e-9 m2/s\n[region.lower]\ndiffusivity = "
                                 "3e-9 m2/s\nporosity = 0.4\n[boundary.top]\ntype = concentration\nvalue = 1 mol/m3\n"
                                 "[time]\nend = " +
                                 end + "\nstep = " + step +
                                 "\n[numerics]\naccuracy = off\ndegree = " + std::to_string(degree) +
                                 "\nlinear_solver = iterative\nsolver_tolerance = 1e-8\n[output]\nfields = false\n";
        const RunRecord r =
          run_text(text, "three_d_q" + std::to_string(degree) + "_" + std::to_string(n), communicator, 3);
        const double memory = peak_memory_mib(communicator);
        if (!root)
          continue;
        const double solve = r.timing.count("step") ? r.timing.at("step") : r.wall_time;
        const double setup = r.timing.count("setup") ? r.timing.at("setup") : 0.0;
        const double per_step = solve / r.steps_accepted;
        const double linear = r.timing.count("linear solve") ? r.timing.at("linear solve") : 0.0;
        std::printf("%10lu %8lu %10.4f %10.4f %10.1f %10.2f %16.3e %12.0f\n", r.unknowns, r.cells, per_step,
                    linear / r.steps_accepted, static_cast<double>(r.linear_iterations) / r.steps_accepted, setup,
                    static_cast<double>(r.unknowns) / per_step, memory);
        std::printf("           phases [s]:");
        for (const auto &[phase, seconds] : r.timing)
          std::printf(" %s %.2f;", phase.c_str(), seconds);
        std::printf("\n           solver: %s\n", r.linear_solver.c_str());
      }
  }

  void three_dimensional(MPI_Comm communicator, const bool root, const bool large)
  {
    const unsigned int ranks = dealii::Utilities::MPI::n_mpi_processes(communicator);
    // Cells per axis: multiples of 8 so the coarse mesh refines evenly (Q1: about 1.6e4, 1.2e5,
    // 9.1e5 unknowns; Q2 on half as many cells per axis: 1.6e4, 1.2e5, 9.1e5).
    std::vector<unsigned int> q1{24, 48}, q2{12, 24};
    if (large)
      {
        q1.push_back(96);
        q2.push_back(48);
      }
    // Q2 first: the peak memory column is the process's peak so far.
    if (root)
      std::printf("\n3-D box 1 m, two layers (the lower porous), held on top; Q2, 10 fixed BDF2 steps of 1e7 s "
                  "(diffusion numbers 150 to 2400), no matrices: CG with geometric multigrid, %u rank%s\n",
                  ranks, ranks > 1 ? "s" : "");
    box_table(communicator, root, 2, q2, "1e7 s", "1e8 s");
    if (root)
      std::printf("\nThe same box, Q1, 10 fixed BDF2 steps of 1e6 s, assembled matrices, CG with "
                  "the diagonal or algebraic multigrid, %u rank%s\n",
                  ranks, ranks > 1 ? "s" : "");
    box_table(communicator, root, 1, q1, "1e6 s", "1e7 s");
  }

  // ---- time to a given accuracy (DESIGN.md section 7) ----
  // Semi-infinite medium, surface held at c0 = 1 from t = 0: c = erfc(x / (2 sqrt(D t)))
  // (Crank, The Mathematics of Diffusion, 2nd ed. 1975, eq. 2.45). Error: the largest
  // difference at 30 depths (5 mm to 150 mm) at the end time, relative to c0. The domain
  // (0.5 m, about 16 diffusion lengths) is deep enough that its far face does not matter.
  constexpr double accuracy_d = 1e-9, accuracy_end = 1e6, accuracy_depth = 0.5;
  constexpr int accuracy_points = 30;

  std::string number(const double value)
  {
    char buffer[32];
    std::snprintf(buffer, sizeof(buffer), "%.10g", value);
    return buffer;
  }

  double point_depth(const int i)
  {
    return 0.005 * (i + 1);
  }

  double erfc_profile(const double x)
  {
    return std::erfc(x / (2 * std::sqrt(accuracy_d * accuracy_end)));
  }

  struct Cost
  {
    std::string what;
    double seconds = 0, error = 0;
    unsigned int steps = 0;
  };

  Cost fickcast_run(const double cell, const double tolerance, const double step, const unsigned int degree,
                    const std::string &control = "local")
  {
    std::string text = "[case]\ntitle = accuracy\n[geometry]\nlayers = medium " + number(accuracy_depth) +
                       " m\ncell_size = " + number(cell) + " m\n[region.medium]\ndiffusivity = " + number(accuracy_d) +
                       " m2/s\n[boundary.top]\ntype = concentration\nvalue = 1 mol/m3\n"
                       "[time]\nend = " +
                       number(accuracy_end) + " s\n" +
                       (step > 0 ? "step = " + number(step) + " s"
                                 : "tolerance = " + number(tolerance) + "\nerror_control = " + control) +
                       "\n[numerics]\ndegree = " + std::to_string(degree) + "\n[output]\nfields = false\n";
    for (int i = 0; i < accuracy_points; ++i)
      text += "point.p" + std::to_string(i) + " = " + number(point_depth(i)) + " m\n";
    const auto start = std::chrono::steady_clock::now();
    const RunRecord r = run_text(text, "accuracy", MPI_COMM_SELF, 1);
    const double seconds = std::chrono::duration<double>(std::chrono::steady_clock::now() - start).count();
    double error = 0;
    for (const auto &named_point : r.points)
      error = std::max(
        error, std::abs(named_point.final_value - erfc_profile(point_depth(std::stoi(named_point.name.substr(1))))));
    char what[96];
    if (step > 0)
      std::snprintf(what, sizeof(what), "Q%u, h = %.3g mm, fixed step, %u steps", degree, 1e3 * cell, r.steps_accepted);
    else
      std::snprintf(what, sizeof(what), "Q%u, h = %.3g mm, %s tolerance %.0e, %u steps", degree, 1e3 * cell,
                    control.c_str(), tolerance, r.steps_accepted);
    return {what, seconds, error, r.steps_accepted};
  }

  // The accuracy check (numerics.accuracy): solves until each point's estimated error is within
  // the request relative to the point's value; the cost is all of its solves.
  Cost fickcast_checked_run(const double cell, const double accuracy)
  {
    std::string text =
      "[case]\ntitle = accuracy\n[geometry]\nlayers = medium " + number(accuracy_depth) +
      " m\ncell_size = " + number(cell) + " m\n[region.medium]\ndiffusivity = " + number(accuracy_d) +
      " m2/s\n[boundary.top]\ntype = concentration\nvalue = 1 mol/m3\n[time]\nend = " + number(accuracy_end) +
      " s\n[numerics]\naccuracy = " + number(accuracy) + "\naccuracy_solves = 5\n[output]\nfields = false\n";
    for (int i = 0; i < accuracy_points; ++i)
      text += "point.p" + std::to_string(i) + " = " + number(point_depth(i)) + " m\n";
    CaseDescription description = read_case_text(text, "checked.ini");
    description.output.folder = std::filesystem::temp_directory_path().string() + "/fickcast-benchmark/checked";
    RunOptions options;
    options.overwrite = true;
    const auto start = std::chrono::steady_clock::now();
    const RunRecord r = run_case(description, options, MPI_COMM_SELF).record;
    const double seconds = std::chrono::duration<double>(std::chrono::steady_clock::now() - start).count();
    double error = 0;
    for (const auto &named_point : r.points)
      error = std::max(
        error, std::abs(named_point.final_value - erfc_profile(point_depth(std::stoi(named_point.name.substr(1))))));
    std::string solves;
    for (const auto &solve : r.accuracy.solves)
      solves += (solves.empty() ? "" : ", ") + std::to_string(solve.cells) + "x" + std::to_string(solve.steps);
    char what[160];
    std::snprintf(what, sizeof(what), "check %.0e from h = %.3g mm, %s (cells x steps), %s", accuracy, 1e3 * cell,
                  solves.c_str(), r.accuracy.met ? "met" : "not met");
    return {what, seconds, error};
  }

  // The comparison: the finite-difference script an engineer writes by hand. Uniform grid,
  // Crank-Nicolson with a fixed step, Thomas algorithm, linear interpolation to the points.
  Cost finite_difference_run(const int intervals, const int steps)
  {
    const auto start = std::chrono::steady_clock::now();
    const double h = accuracy_depth / intervals, dt = accuracy_end / steps, r = accuracy_d * dt / (h * h);
    std::vector<double> c(intervals + 1, 0.0), rhs(intervals + 1), cp(intervals + 1), dp(intervals + 1);
    c[0] = 1; // surface held at c0 (the initial jump there is part of the problem)
    for (int n = 0; n < steps; ++n)
      {
        // interior rows: -r/2 c[i-1] + (1 + r) c[i] - r/2 c[i+1] = r/2 c[i-1] + (1 - r) c[i] + r/2 c[i+1]
        for (int i = 1; i < intervals; ++i)
          rhs[i] = 0.5 * r * c[i - 1] + (1 - r) * c[i] + 0.5 * r * c[i + 1];
        // Dirichlet rows at both ends (c = 1 at the surface, c = 0 deep down)
        cp[0] = 0;
        dp[0] = 1;
        for (int i = 1; i < intervals; ++i)
          {
            const double a = -0.5 * r, b = 1 + r, cc = -0.5 * r, m = b - a * cp[i - 1];
            cp[i] = cc / m;
            dp[i] = (rhs[i] - a * dp[i - 1]) / m;
          }
        c[intervals] = 0;
        for (int i = intervals - 1; i >= 1; --i)
          c[i] = dp[i] - cp[i] * c[i + 1];
        c[0] = 1;
      }
    double error = 0;
    for (int i = 0; i < accuracy_points; ++i)
      {
        const double x = point_depth(i) / h;
        const int k = std::min(static_cast<int>(x), intervals - 1);
        const double value = c[k] + (x - k) * (c[k + 1] - c[k]);
        error = std::max(error, std::abs(value - erfc_profile(point_depth(i))));
      }
    const double seconds = std::chrono::duration<double>(std::chrono::steady_clock::now() - start).count();
    char what[96];
    std::snprintf(what, sizeof(what), "FD-CN, h = %.3g mm, %d steps", 1e3 * h, steps);
    return {what, seconds, error};
  }

  // Step controller against fixed steps (issue: a controller that keeps its word). The mesh is fine
  // enough (Q2, h = 1.25 mm: its error is under 1e-8) that the time error dominates at every
  // tolerance asked. For each tolerance: the final error and its ratio to the tolerance, and the
  // cost against the cheapest fixed-step run on the same mesh that is at least as accurate.
  Cost fastest_of(const double cell, const double tolerance, const double step, const std::string &control = "local")
  {
    Cost best = fickcast_run(cell, tolerance, step, 2, control);
    for (int repeat = 0; repeat < 2; ++repeat)
      best.seconds = std::min(best.seconds, fickcast_run(cell, tolerance, step, 2, control).seconds);
    return best;
  }

  void step_controller_versus_fixed(const bool root)
  {
    if (!root)
      return;
    constexpr double cell = 0.00125;
    std::printf("\nStep controller against fixed steps: erfc as above, Q2, h = 1.25 mm, time error dominant\n");
    std::vector<Cost> fixed;
    for (const double steps : {10.0, 15.0, 20.0, 30.0, 40.0, 60.0, 80.0, 100.0, 150.0, 200.0, 300.0, 400.0, 600.0,
                               800.0, 1000.0, 1500.0, 2000.0, 3000.0, 4000.0})
      fixed.push_back(fastest_of(cell, 0, accuracy_end / steps));
    std::printf("  fixed steps (steps: error, seconds):");
    for (std::size_t i = 0; i < fixed.size(); ++i)
      std::printf("%s %u: %.2e, %.4f s", i % 4 == 0 ? "\n   " : ";", fixed[i].steps, fixed[i].error, fixed[i].seconds);
    std::printf("\n");
    std::printf("  %-17s %10s %10s %7s %10s | %-34s %8s\n", "control", "error", "error/tol", "steps", "seconds",
                "cheapest fixed run as accurate", "cost x");
    for (const std::string control : {"local", "global"})
      for (const double tolerance : {1e-3, 1e-4, 1e-5, 1e-6, 1e-7})
        {
          const Cost run = fastest_of(cell, tolerance, 0, control);
          const Cost *best = nullptr;
          for (const auto &f : fixed)
            if (f.error <= run.error && (!best || f.seconds < best->seconds))
              best = &f;
          char right[64] = "none of up to 4000 steps";
          if (best)
            std::snprintf(right, sizeof(right), "%u steps, error %.2e, %.4f s", best->steps, best->error,
                          best->seconds);
          char label[32];
          std::snprintf(label, sizeof(label), "%s %.0e", control.c_str(), tolerance);
          std::printf("  %-17s %10.2e %10.2f %7u %10.4f | %-34s", label, run.error, run.error / tolerance, run.steps,
                      run.seconds, right);
          if (best)
            std::printf(" %8.2f", run.seconds / best->seconds);
          std::printf("\n");
        }
  }

  void accuracy_versus_cost(const bool root)
  {
    if (!root)
      return;
    std::printf("\nTime to a given accuracy: erfc at t = 1e6 s, D = 1e-9 m2/s, largest error at 30 depths\n");
    std::vector<Cost> ours, theirs;
    for (const double cell : {0.02, 0.01, 0.005, 0.0025})
      for (const double tolerance : {1e-3, 1e-4, 1e-5, 1e-6})
        ours.push_back(fickcast_run(cell, tolerance, 0, 2));
    for (const double cell : {0.01, 0.005, 0.0025})
      for (const double steps : {100.0, 300.0, 1000.0})
        ours.push_back(fickcast_run(cell, 0, accuracy_end / steps, 2));
    for (const int intervals : {100, 200, 400, 800, 1600, 3200, 6400})
      for (const int steps : {10, 30, 100, 300, 1000, 3000, 10000, 30000})
        theirs.push_back(finite_difference_run(intervals, steps));
    const auto print = [](const Cost &c) {
      std::printf("    %-48s error %9.2e  %9.4f s\n", c.what.c_str(), c.error, c.seconds);
    };
    std::printf("  fickcast runs:\n");
    for (const auto &c : ours)
      print(c);
    std::printf("  fickcast accuracy check (all its solves; error at 30 points relative to c0 = 1, while the "
                "check asks it relative to each point's value):\n");
    for (const double accuracy : {1e-2, 1e-3, 1e-4})
      print(fickcast_checked_run(0.02, accuracy));
    std::printf("\n  %-10s %-60s %-60s %8s\n", "error <=", "fastest fickcast run", "fastest FD-CN run", "FD/ours");
    for (const double target : {1e-3, 1e-4, 1e-5, 1e-6})
      {
        const auto fastest = [target](const std::vector<Cost> &runs) {
          const Cost *best = nullptr;
          for (const auto &c : runs)
            if (c.error <= target && (!best || c.seconds < best->seconds))
              best = &c;
          return best;
        };
        const Cost *a = fastest(ours), *b = fastest(theirs);
        char left[128] = "none reached it", right[128] = "none reached it (up to 6400 intervals, 30000 steps)";
        if (a)
          std::snprintf(left, sizeof(left), "%.4f s (%s)", a->seconds, a->what.c_str());
        if (b)
          std::snprintf(right, sizeof(right), "%.4f s (%s)", b->seconds, b->what.c_str());
        std::printf("  %-10.0e %-60s %-60s", target, left, right);
        if (a && b)
          std::printf(" %8.2g", b->seconds / a->seconds);
        std::printf("\n");
      }
  }
} // namespace

int main(int argc, char **argv)
{
  dealii::Utilities::MPI::MPI_InitFinalize mpi(argc, argv, 1);
  const MPI_Comm communicator = MPI_COMM_WORLD;
  const bool root = dealii::Utilities::MPI::this_mpi_process(communicator) == 0;
  bool run_1d = false, run_3d = false, large = false, accuracy = false, steps = false;
  for (int i = 1; i < argc; ++i)
    {
      const std::string flag = argv[i];
      run_1d = run_1d || flag == "--1d";
      run_3d = run_3d || flag == "--3d";
      large = large || flag == "--large";
      accuracy = accuracy || flag == "--accuracy";
      steps = steps || flag == "--steps";
    }
  if (!run_1d && !run_3d && !accuracy && !steps)
    run_1d = run_3d = true;
  if (accuracy)
    accuracy_versus_cost(root);
  if (accuracy || steps)
    step_controller_versus_fixed(root);
  if (run_1d)
    one_dimensional(communicator, root);
  if (run_3d)
    three_dimensional(communicator, root, large);
  return 0;
}
