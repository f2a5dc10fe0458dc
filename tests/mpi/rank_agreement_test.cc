// The same 2-D case on 1 and on 2 MPI ranks gives the same answer to solver tolerance.
// Run with mpirun -np 2: the two-rank run uses MPI_COMM_WORLD (p4est-distributed mesh, CG with
// algebraic multigrid), the one-rank run uses MPI_COMM_SELF on rank 0 (sparse direct solver).
#include "case_runner.h"

#include "numerics/diffusion_problem.h"
#include "results/point_evaluator.h"
#include "run/field_view_of.h"
#include "run/simulation.h"

#include <deal.II/base/mpi.h>

#include <gtest/gtest.h>

#include <numeric>

#include <cmath>
#include <cstdio>
#include <filesystem>
#include <numeric>

namespace fickcast::testing
{
  namespace
  {
    const char *case_text = R"(
[case]
title = rank agreement
dimension = 2
[geometry]
layers = cap 0.2 m, body 0.8 m
width = 1.5 m
cell_size = 0.05 m
# Cells next to the top and right faces refined (hanging nodes where the bands end).
open_face_refinement = on
open_face_cell = 0.0125 m
open_face_band = 0.15 m
[region.cap]
diffusivity = {2e-9*(1 + 0.5*x)} m2/s
partition = 0.5
[region.body]
diffusivity = 1e-9 m2/s
porosity = 0.3
retardation = 2
decay_rate = 1e-9 1/s
[boundary.top]
type = concentration
ambient = {1 + 0.2*x} mol/m3
[boundary.right]
type = transfer
coefficient = 1e-8 m/s
ambient = 0.3 mol/m3
[time]
end = 5 yr
[output]
fields_every = 1 yr
point.a = 0.75 m, 0.3 m
)";

    struct Observed
    {
      std::vector<double> times;
      std::vector<std::vector<double>> values; ///< concentrations at the sample points per time
      RunRecord record;
    };

    Observed run_on(MPI_Comm communicator, const std::string &name)
    {
      CaseDescription description = describe(case_text, name, communicator);
      std::filesystem::create_directories(description.output.folder + "/fields");
      Observed observed;
      std::vector<dealii::Point<2>> points;
      for (int i = 0; i <= 10; ++i)
        for (int j = 0; j <= 10; ++j)
          points.emplace_back(0.15 * i, 0.1 * j);
      const StateObserver<2> observer = [&](double t, const DiffusionProblem<2> &problem,
                                            const dealii::TrilinosWrappers::MPI::Vector &state) {
        const PointEvaluator<2> evaluator(field_view_of(problem), points, "sample");
        observed.times.push_back(t);
        observed.values.push_back(evaluator.concentrations(state));
      };
      observed.record = simulate<2>(description, communicator, description.output.folder, {}, observer);
      return observed;
    }

    /// The 2-D case @p text on both ranks and then on rank 0 alone (the second record is empty
    /// on rank 1): {one rank, two ranks}.
    std::pair<RunRecord, RunRecord> on_one_and_two_ranks(const char *text, const std::string &name)
    {
      auto run_with = [&](MPI_Comm communicator, const std::string &folder) {
        CaseDescription description = describe(text, folder, communicator);
        std::filesystem::create_directories(description.output.folder + "/fields");
        return simulate<2>(description, communicator, description.output.folder, {});
      };
      const RunRecord many = run_with(MPI_COMM_WORLD, name + "_two");
      RunRecord one;
      if (dealii::Utilities::MPI::this_mpi_process(MPI_COMM_WORLD) == 0)
        one = run_with(MPI_COMM_SELF, name + "_one");
      return {one, many};
    }
  } // namespace

  TEST(RankAgreement, TwoRanksMatchOneRankToSolverTolerance)
  {
    const unsigned int n_ranks = dealii::Utilities::MPI::n_mpi_processes(MPI_COMM_WORLD);
    ASSERT_EQ(n_ranks, 2u) << "run this test with mpirun -np 2";
    const unsigned int rank = dealii::Utilities::MPI::this_mpi_process(MPI_COMM_WORLD);
    const Observed many = run_on(MPI_COMM_WORLD, "agreement_two");
    Observed one;
    if (rank == 0)
      one = run_on(MPI_COMM_SELF, "agreement_one");
    if (rank != 0)
      return;
    EXPECT_EQ(many.record.ranks, 2u);
    EXPECT_EQ(one.record.ranks, 1u);
    ASSERT_EQ(one.times.size(), many.times.size());
    double scale = 0;
    for (const auto &row : one.values)
      for (const double v : row)
        scale = std::max(scale, std::abs(v));
    for (std::size_t k = 0; k < one.times.size(); ++k)
      {
        EXPECT_DOUBLE_EQ(one.times[k], many.times[k]);
        for (std::size_t i = 0; i < one.values[k].size(); ++i)
          EXPECT_NEAR(one.values[k][i], many.values[k][i], 1e-8 * scale) << "time " << k << ", point " << i;
      }
    for (std::size_t r = 0; r < one.record.final_region_amounts.size(); ++r)
      EXPECT_NEAR(one.record.final_region_amounts[r] / many.record.final_region_amounts[r], 1.0, 1e-8);
    double moved = 0;
    for (const double amount : one.record.boundary_entered)
      moved = std::max(moved, std::abs(amount));
    ASSERT_GT(moved, 0);
    for (std::size_t b = 0; b < one.record.boundary_entered.size(); ++b)
      EXPECT_NEAR(one.record.boundary_entered[b], many.record.boundary_entered[b], 1e-8 * moved)
        << "boundary " << one.record.boundaries[b];
    EXPECT_EQ(one.record.steps_accepted, many.record.steps_accepted);
  }
  // Points, fluxes and events (threshold, release, depth, time lag) of a 2-D case on one and two
  // ranks, both with CG and algebraic multigrid to a relative residual of 1e-14 and fixed steps,
  // agree to 1e-10 relative.
  TEST(RankAgreement, ProbesFluxesAndEventsAgreeTo1e10)
  {
    const char *text = R"(
[case]
title = events on one and two ranks
dimension = 2
[geometry]
layers = liner 0.4 m, base 0.6 m
width = 0.8 m
cell_size = 0.025 m
[region.liner]
diffusivity = 3e-10 m2/s
porosity = 0.35
[region.base]
diffusivity = 1e-9 m2/s
porosity = 0.3
[initial]
value = {0.5 + 5*exp(-((x-0.4)^2 + (y-0.7)^2)/0.01)} mol/m3
[boundary.bottom]
type = concentration
value = 0 mol/m3
[time]
end = 2 yr
step = 0.01 yr
[numerics]
linear_solver = iterative
solver_tolerance = 1e-14
[output]
fields = false
fields_every = 0.5 yr
point.mid = 0.55 m, 0.7 m
threshold.mid = 1.2 mol/m3
line.down = 0.4 m, 0.7 m to 0.4 m, 1 m
depth.down = 0.3 mol/m3
release.some = 5 %
time_lag.out = bottom
)";
    const auto [one, many] = on_one_and_two_ranks(text, "events");
    if (dealii::Utilities::MPI::this_mpi_process(MPI_COMM_WORLD) != 0)
      return;
    auto same = [](double a, double b, const std::string &what) {
      EXPECT_TRUE(std::isfinite(a) && std::isfinite(b)) << what << ": " << a << ", " << b;
      EXPECT_NEAR(a, b, 1e-10 * std::max(std::abs(a), std::abs(b))) << what;
      std::printf("%s: one rank %.15g, two ranks %.15g\n", what.c_str(), a, b);
    };
    same(one.points[0].final_value, many.points[0].final_value, "point.mid");
    same(one.points[0].threshold_time, many.points[0].threshold_time, "threshold.mid");
    same(one.releases[0].time, many.releases[0].time, "release.some");
    same(one.time_lags[0].final_flux, many.time_lags[0].final_flux, "flux through bottom");
    same(one.time_lags[0].time_lag, many.time_lags[0].time_lag, "time_lag.out");
    // At t = 0 the whole line is above the level (no depth): both runs say so.
    EXPECT_TRUE(std::isnan(one.depths[0].depths[0]) && std::isnan(many.depths[0].depths[0]));
    for (std::size_t k = 1; k < one.depths[0].depths.size(); ++k)
      same(one.depths[0].depths[k], many.depths[0].depths[k], "depth.down at output " + std::to_string(k));
    for (std::size_t b = 0; b < one.boundary_entered.size(); ++b)
      if (one.boundary_entered[b] != 0)
        same(one.boundary_entered[b], many.boundary_entered[b], "amount in through " + one.boundaries[b]);
  }

  // A sealed body with a source under runtime remeshing, on one and two ranks (CG to 1e-14, fixed
  // steps): the same meshes (the same remeshings and cells), the same amounts to 1e-10, and on
  // each the content grows by exactly s V t plus the reported remeshing term (conservation,
  // common practice).
  TEST(RankAgreement, RemeshedSealedBodyAgreesAndConserves)
  {
    const char *text = R"(
[case]
title = sealed body remeshed on one and two ranks
dimension = 2
[geometry]
layers = body 1 m
width = 1 m
cell_size = 0.125 m
[region.body]
diffusivity = 1e-3 m2/s
source = 2 mol/(m3 s)
[initial]
value = {100*exp(-((x-0.5)^2+(y-0.5)^2)/0.005)} mol/m3
[time]
end = 20 s
step = 0.25 s
[numerics]
accuracy = off
linear_solver = iterative
solver_tolerance = 1e-14
remesh = on
remesh_every = 2
smallest_cell = 3 mm
[output]
fields = false
)";
    const auto [one, many] = on_one_and_two_ranks(text, "remesh");
    if (dealii::Utilities::MPI::this_mpi_process(MPI_COMM_WORLD) != 0)
      return;
    EXPECT_GT(one.remeshings, 2u);
    EXPECT_EQ(one.remeshings, many.remeshings);
    EXPECT_EQ(one.cells_largest, many.cells_largest);
    EXPECT_EQ(one.cells, many.cells);
    const auto total = [](const std::vector<double> &v) { return std::accumulate(v.begin(), v.end(), 0.0); };
    for (const RunRecord *r : {&one, &many})
      {
        const double initial = total(r->initial_region_amounts), final = total(r->final_region_amounts);
        std::printf("%u rank(s): %u remeshings, final %.15g, remeshing term %.6e\n", r->ranks, r->remeshings, final,
                    r->remeshed_amount);
        EXPECT_NEAR(final, initial + 2.0 * 20.0 + r->remeshed_amount, 1e-10 * final);
      }
    EXPECT_NEAR(total(one.final_region_amounts), total(many.final_region_amounts),
                1e-10 * total(one.final_region_amounts));
    EXPECT_NEAR(one.remeshed_amount, many.remeshed_amount, 1e-8 * std::abs(one.remeshed_amount));
  }

  // Water flowing diagonally through two layers with dispersion, retardation, decay and a source,
  // entering through two faces and leaving through the other two, on one and two ranks (GMRES
  // with algebraic multigrid to 1e-12, fixed steps): on each the storage change equals the net
  // inflow (advective and dispersive) minus decay plus the source to 1e-10 of the amounts moved
  // (conservation, common practice), and the two agree to solver tolerance.
  TEST(RankAgreement, FlowingCaseConservesAndAgrees)
  {
    const char *text = R"(
[case]
title = flow on one and two ranks
dimension = 2
[geometry]
layers = upper 0.3 m, lower 0.7 m
width = 1.5 m
cell_size = 0.05 m
[region.upper]
diffusivity = 1e-9 m2/s
porosity = 0.4
darcy_flux = 4e-8 m/s, 2e-8 m/s
longitudinal_dispersivity = 5 cm
transverse_dispersivity = 5 mm
decay_rate = 1e-9 1/s
[region.lower]
diffusivity = 1e-9 m2/s
porosity = 0.3
retardation = 2
darcy_flux = 4e-8 m/s, 2e-8 m/s
longitudinal_dispersivity = 10 cm
transverse_dispersivity = 1 cm
source = 1e-9 mol/(m3 s)
[boundary.left]
type = inflow
value = 1 mol/m3
[boundary.top]
type = inflow
value = 0.5 mol/m3
[boundary.right]
type = outflow
[boundary.bottom]
type = outflow
[time]
end = 2 yr
step = 0.05 yr
[numerics]
accuracy = off
linear_solver = iterative
solver_tolerance = 1e-12
[output]
fields = false
)";
    const auto [one, many] = on_one_and_two_ranks(text, "flow");
    if (dealii::Utilities::MPI::this_mpi_process(MPI_COMM_WORLD) != 0)
      return;
    const auto total = [](const std::vector<double> &v) { return std::accumulate(v.begin(), v.end(), 0.0); };
    for (const RunRecord *r : {&one, &many})
      {
        std::printf("%u rank(s): final amount %.12g, balance error %.2e relative, cell Peclet %.3g\n", r->ranks,
                    total(r->final_region_amounts), r->balance_error_relative, r->cell_peclet);
        EXPECT_LT(r->balance_error_relative, 1e-10);
        EXPECT_GT(r->cell_peclet, 1.0);
      }
    EXPECT_NEAR(total(one.final_region_amounts), total(many.final_region_amounts),
                1e-8 * total(one.final_region_amounts));
    for (std::size_t b = 0; b < one.boundary_entered.size(); ++b)
      EXPECT_NEAR(one.boundary_entered[b], many.boundary_entered[b], 1e-8 * std::abs(one.boundary_entered[0]))
        << one.boundaries[b];
  }
} // namespace fickcast::testing
