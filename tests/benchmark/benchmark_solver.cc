// Performance figures of the solver (DESIGN.md section 7). A benchmark, not a test: it prints
// wall times, iterations, throughput and memory; nothing is asserted.
//
//   benchmark_solver [--1d] [--3d] [--large]       (default: --1d --3d, 3-D at 1e4 and 1e5)
//   mpirun -np 2 benchmark_solver --3d --large     (3-D at 1e4, 1e5 and 1e6 unknowns on 2 ranks)
#include "case/case_reader.h"
#include "numerics/simulation.h"

#include <deal.II/base/mpi.h>

#include <sys/resource.h>

#include <cmath>
#include <cstdio>
#include <filesystem>
#include <string>

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
                                 std::to_string(degree) + "\n[output]\nprobe.base = 0.6 m\n";
        const RunRecord r = run_text(text, "one_d_q" + std::to_string(degree), MPI_COMM_SELF, 1);
        std::printf("%8u %10lu %12.3f %12u %14.3f\n", degree, r.unknowns, r.wall_time, r.steps_accepted, r.wall_time);
      }
  }

  void three_dimensional(MPI_Comm communicator, const bool root, const bool large)
  {
    const unsigned int ranks = dealii::Utilities::MPI::n_mpi_processes(communicator);
    if (root)
      {
        std::printf("\n3-D box, Q1, layered (two regions), 10 fixed BDF2 steps, CG with algebraic multigrid, "
                    "%u rank%s\n",
                    ranks, ranks > 1 ? "s" : "");
        std::printf("%10s %8s %10s %10s %10s %10s %16s %12s\n", "unknowns", "cells", "s/step", "solve/step",
                    "iter/step", "setup [s]", "unknown*step/s", "peak [MiB]");
      }
    // Cells per axis: multiples of 8 so the coarse mesh refines evenly (about 1.6e4, 1.2e5, 9.1e5 unknowns).
    std::vector<unsigned int> per_axis{24, 48};
    if (large)
      per_axis.push_back(96);
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
                                 "[time]\nend = 1e7 s\nstep = 1e6 s\n[numerics]\ndegree = 1\nlinear_solver = "
                                 "iterative\nsolver_tolerance = 1e-8\n[output]\nfields = false\n";
        const RunRecord r = run_text(text, "three_d_" + std::to_string(n), communicator, 3);
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
        std::printf("\n");
      }
  }
} // namespace

int main(int argc, char **argv)
{
  dealii::Utilities::MPI::MPI_InitFinalize mpi(argc, argv, 1);
  const MPI_Comm communicator = MPI_COMM_WORLD;
  const bool root = dealii::Utilities::MPI::this_mpi_process(communicator) == 0;
  bool run_1d = false, run_3d = false, large = false;
  for (int i = 1; i < argc; ++i)
    {
      const std::string flag = argv[i];
      run_1d = run_1d || flag == "--1d";
      run_3d = run_3d || flag == "--3d";
      large = large || flag == "--large";
    }
  if (!run_1d && !run_3d)
    run_1d = run_3d = true;
  if (run_1d)
    one_dimensional(communicator, root);
  if (run_3d)
    three_dimensional(communicator, root, large);
  return 0;
}
