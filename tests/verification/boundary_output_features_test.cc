// README boundary and output features checked against exact values (issue 24, item 7).
// Transfer faces with a partition, bath `partition` and `initial`, baths in 2-D and 3-D, stage
// overrides key by key, `output.loading`, and the amount and mean of `moments`: features that had
// no check able to catch a wrong answer.
// Each test compares with an exact value: steady states that lie in (or converge superfast to) the
// finite-element space, equilibria fixed by conservation, or closed forms of the transient problem,
// each with its source beside it. Shared helpers: feature_cases.h.
//
// Conventions used below (README, "Which phase a concentration refers to", and the key help of
// `fickcast check --keys`): a region has a partition coefficient K, c = K u with u the
// reference-phase concentration; storage theta R K du/dt, flux per bulk area theta tau K D grad u;
// a transfer face has outward flux h (c_face - K c_ambient) = h K (u_face - c_ambient); a bath of
// volume V and partition K_b holds c_bath = K_b u_face.
// Tolerances: discretisation errors were measured (the value in a comment) and the tolerance set
// at 3-5 times it. Checks that hold to round-off by construction (equilibria from conservation,
// linear steady states, runs that must equal each other) use 1e-9 to 1e-12: room for the linear
// solver's tolerance (1e-12 relative) and the remainder of a transient, not for a discretisation
// error.
#include "feature_cases.h"

#include <boost/math/special_functions/erf.hpp>

#include <gtest/gtest.h>

#include <algorithm>
#include <cmath>
#include <cstdio>
#include <string>
#include <vector>

namespace fickcast::testing
{
  using feature_cases::pi;
  using feature_cases::row_at;
  using feature_cases::run_named;

  // ---------------------------------------------------------------------------------------------
  // Transfer faces with a partition.

  // Steady state through a slab with a transfer face: the linear (Robin) surface condition of
  // Carslaw & Jaeger, Conduction of Heat in Solids, 2nd ed. 1959, sec. 2.7 (section number from
  // memory) at steady state, in series with the slab (series resistances, common practice; Crank,
  // The Mathematics of Diffusion, 2nd ed. 1975, ch. 4). In the reference phase the slab conducts
  // theta tau K D / L per unit area and the face h K, so
  // J = (u_top - c_ambient) / (L / (theta tau K D) + 1 / (h K)).
  // L = 1 m, D = 1 m2/s, theta = 0.5, tau = 0.8, K = 2; c = 4 mol/m3 held at the top (u = 2);
  // h = 0.5 m/s and ambient 0.5 mol/m3 at the base: J = 1.5 / (1.25 + 1) = 2/3 mol/(m2 s),
  // u(base) = 0.5 + J / (h K) = 7/6, so c(base) = 7/3 and c(0.5 m) = (4 + 7/3) / 2 = 19/6.
  // A transfer law without K (h (u - a), or h (c - a)) gives J = 0.46 or 0.78 instead.
  TEST(Features, TransferFaceWithAPartitionAtSteadyState)
  {
    const std::string text = R"(
[case]
title = transfer face with a partition
[geometry]
layers = film 1 m
cell_size = 0.1 m
[region.film]
diffusivity = 1 m2/s
porosity = 0.5
tortuosity = 0.8
partition = 2
[boundary.top]
type = concentration
value = 4 mol/m3
[boundary.bottom]
type = transfer
coefficient = 0.5 m/s
ambient = 0.5 mol/m3
[time]
end = 200 s
[output]
fields = false
point.mid = 0.5 m
point.base = 1 m
)";
    CaseDescription description;
    RunRecord record;
    if (!run_named(text, "features_transfer_steady", description, record))
      return;
    const CsvTable series = read_csv(description.output.folder + "/series.csv");
    const double flux = 2.0 / 3.0;
    const double in_top = series.column("flux_in.top").back(), in_bottom = series.column("flux_in.bottom").back();
    std::printf("transfer with K: flux in %.12e, out %.12e (exact %.12e); c(0.5 m) %.12f (%.12f), c(1 m) %.12f "
                "(%.12f)\n",
                in_top, -in_bottom, flux, record.points[0].final_value, 19.0 / 6.0, record.points[1].final_value,
                7.0 / 3.0);
    // Steady and linear: exact at the nodes up to round-off (as in partition_membrane_test.cc).
    EXPECT_NEAR(in_top / flux, 1.0, 1e-10);
    EXPECT_NEAR(-in_bottom / flux, 1.0, 1e-10);
    EXPECT_NEAR(record.points[0].final_value / (19.0 / 6.0), 1.0, 1e-10);
    EXPECT_NEAR(record.points[1].final_value / (7.0 / 3.0), 1.0, 1e-10);
  }

  // Uptake through a transfer face into a semi-infinite medium with partition K: in the
  // reference phase u_t = D u_xx and -D u_x = h (a - u) at x = 0 (the factor K cancels), so with
  // H = h / D (Carslaw & Jaeger 1959 sec. 2.7, section number from memory; Crank 1975 ch. 3):
  // c / (K a) = erfc(eta) - exp(H x + H^2 D t) erfc(eta + H sqrt(D t)), eta = x / (2 sqrt(D t)),
  // and the amount taken up M = (K a / H) [exp(H^2 D t) erfc(H sqrt(D t)) - 1 + 2 H sqrt(D t / pi)]
  // (the integral of the face flux h K a exp(H^2 D s) erfc(H sqrt(D s)); derived here).
  // D = 1 m2/s, h = 1 m/s, K = 2, a = 1 mol/m3, t = 1 s, domain 12 m (erfc(6) beyond).
  TEST(Features, TransferFaceWithAPartitionMatchesCarslawJaeger)
  {
    const std::string text = R"(
[case]
title = surface transfer with a partition
[geometry]
layers = medium 12 m
cell_size = 0.05 m
[region.medium]
diffusivity = 1 m2/s
partition = 2
[boundary.top]
type = transfer
coefficient = 1 m/s
ambient = 1 mol/m3
[time]
end = 1 s
tolerance = 1e-6
[output]
fields = false
point.surface = 0 m
point.a = 0.5 m
point.b = 1 m
)";
    const double k = 2; // partition
    auto exact = [&](const double x) {
      const double eta = x / 2;
      return k * (boost::math::erfc(eta) - std::exp(x + 1) * boost::math::erfc(eta + 1));
    };
    // The formula as coded against the 30-digit value of tests/verification/REFERENCES.md,
    // "Semi-infinite medium": c(0, 1 s) / (K a) = 1 - e erfc(1) = 0.5724164238.
    EXPECT_NEAR(exact(0) / k, 0.5724164238, 1e-9);
    CaseDescription description;
    RunRecord record;
    if (!run_named(text, "features_transfer_transient", description, record))
      return;
    const std::vector<double> depths{0, 0.5, 1};
    for (std::size_t i = 0; i < depths.size(); ++i)
      {
        std::printf("transfer with K, t = 1 s: c(%g m) = %.8f (exact %.8f)\n", depths[i], record.points[i].final_value,
                    exact(depths[i]));
        EXPECT_NEAR(record.points[i].final_value, exact(depths[i]), 5e-5 * k) << "at " << depths[i] << " m";
      }
    const CsvTable series = read_csv(description.output.folder + "/series.csv");
    const double uptake = series.column("amount_in.top").back();
    const double uptake_exact = k * (std::exp(1.0) * boost::math::erfc(1.0) - 1 + 2 / std::sqrt(pi));
    std::printf("transfer with K: uptake %.10f (exact %.10f, relative %.2e)\n", uptake, uptake_exact,
                uptake / uptake_exact - 1);
    EXPECT_NEAR(uptake / uptake_exact, 1.0, 4e-5); // measured 9.1e-6
  }

  // ---------------------------------------------------------------------------------------------
  // Finite baths.

  // A gel (L = 1 m, theta = 0.5, K = 2, c0 = 1 mol/m3, so u0 = 0.5 and 0.5 mol/m2) against a bath
  // of V = 0.5 m per unit area with partition K_b = 4 and initial 0.2 mol/m3 (u = 0.05, 0.1 mol/m2).
  // At equilibrium u is uniform and the total is kept (exact by conservation, common practice; the
  // final state of Crank 1975 ch. 4, diffusion from a well-stirred solution of limited volume):
  // u_eq = (0.5 + 0.1) / (theta K L + V K_b) = 0.6 / 3 = 0.2, so c(gel) = 0.4, c(bath) = 0.8, the gel
  // holds 0.2 mol/m2 and 0.3 mol/m2 left through the face. Ignoring K_b gives c(bath) = 0.4;
  // ignoring the initial bath concentration gives c(gel) = 0.33.
  TEST(Features, BathPartitionAndInitialConcentrationSetTheEquilibrium)
  {
    const std::string text = R"(
[case]
title = bath with a partition and an initial concentration
[geometry]
layers = gel 1 m
cell_size = 0.05 m
[region.gel]
diffusivity = 1 m2/s
porosity = 0.5
partition = 2
[initial]
value = 1 mol/m3
[boundary.top]
type = bath
volume = 0.5 m
partition = 4
initial = 0.2 mol/m3
[time]
end = 20 s
[output]
fields = false
point.base = 1 m
)";
    CaseDescription description;
    RunRecord record;
    if (!run_named(text, "features_bath_partition", description, record))
      return;
    const CsvTable series = read_csv(description.output.folder + "/series.csv");
    const auto &amount = series.column("amount.total");
    const auto &bath = series.column("bath.top");
    std::printf("bath with K_b: start gel %.12f (0.5), bath %.12f (0.2); end gel %.12f (0.2), bath %.12f (0.8), "
                "c(base) %.12f (0.4), through the face %.12f (-0.3)\n",
                amount.front(), bath.front(), amount.back(), bath.back(), record.points[0].final_value,
                series.column("amount_in.top").back());
    EXPECT_NEAR(amount.front(), 0.5, 1e-12);
    EXPECT_NEAR(bath.front(), 0.2, 1e-12);
    // Equilibrium (exp(-3.4 t) of the slowest mode at t = 20 s) and conservation: round-off.
    EXPECT_NEAR(amount.back() / 0.2, 1.0, 1e-9);
    EXPECT_NEAR(bath.back() / 0.8, 1.0, 1e-9);
    EXPECT_NEAR(record.points[0].final_value / 0.4, 1.0, 1e-9);
    EXPECT_NEAR(series.column("amount_in.top").back() / -0.3, 1.0, 1e-9);
  }

  // A bath on the top face of a 2-D box (width W = 0.5 m, depth 1 m, c0 = 4x mol/m3, i.e. 0.5 mol
  // per metre of length): V = 0.25 m2 per unit length, K_b = 2, initial 1 mol/m3 (u = 0.5, 0.25 mol/m).
  // Conservation (common practice): u_eq = 0.75 / (W L + V K_b) = 0.75 / 1 = 0.75, so c = 0.75 in
  // the box and 1.5 in the bath; the box ends with 0.375 mol/m, 0.125 mol/m having left through
  // the top. Reading V per unit area (times the width) would give u_eq = 0.83.
  TEST(Features, BathOnATwoDimensionalBox)
  {
    const std::string text = R"(
[case]
title = bath on a 2-D box
dimension = 2
[geometry]
layers = gel 1 m
width = 0.5 m
cell_size = 0.125 m
[region.gel]
diffusivity = 1 m2/s
[initial]
value = {4*x} mol/m3
[boundary.top]
type = bath
volume = 0.25 m2
partition = 2
initial = 1 mol/m3
[time]
end = 20 s
[output]
fields = false
point.corner = 0.5 m, 1 m
)";
    CaseDescription description;
    RunRecord record;
    if (!run_named(text, "features_bath_2d", description, record))
      return;
    const CsvTable series = read_csv(description.output.folder + "/series.csv");
    const auto &amount = series.column("amount.total");
    const auto &bath = series.column("bath.top");
    std::printf("2-D bath: start box %.12f (0.5), end box %.12f (0.375), bath %.12f (1.5), c(corner) %.12f (0.75), "
                "through the top %.12f (-0.125)\n",
                amount.front(), amount.back(), bath.back(), record.points[0].final_value,
                series.column("amount_in.top").back());
    EXPECT_NEAR(amount.front(), 0.5, 1e-12); // 4x is in the Q2 space: exact
    EXPECT_NEAR(amount.back() / 0.375, 1.0, 1e-9);
    EXPECT_NEAR(bath.back() / 1.5, 1.0, 1e-9);
    EXPECT_NEAR(record.points[0].final_value / 0.75, 1.0, 1e-9);
    EXPECT_NEAR(series.column("amount_in.top").back() / -0.125, 1.0, 1e-9);
  }

  // The same in 3-D: a box 0.4 m x 0.4 m x 1 m, c0 = 5y mol/m3 (0.16 mol), bath on the top face
  // with V = 0.04 m3, K_b = 1 (default), initial 4 mol/m3 (0.16 mol). Conservation (common
  // practice): u_eq = 0.32 / (0.16 + 0.04) = 1.6 in box and bath; the box ends with 0.256 mol and
  // 0.096 mol came in through the top.
  TEST(Features, BathOnAThreeDimensionalBox)
  {
    const std::string text = R"(
[case]
title = bath on a 3-D box
dimension = 3
[geometry]
layers = gel 1 m
width = 0.4 m
length = 0.4 m
cell_size = 0.2 m
[region.gel]
diffusivity = 1 m2/s
[initial]
value = {5*y} mol/m3
[boundary.top]
type = bath
volume = 0.04 m3
initial = 4 mol/m3
[time]
end = 20 s
[output]
fields = false
point.corner = 0.4 m, 0 m, 1 m
)";
    CaseDescription description;
    RunRecord record;
    if (!run_named(text, "features_bath_3d", description, record))
      return;
    const CsvTable series = read_csv(description.output.folder + "/series.csv");
    const auto &amount = series.column("amount.total");
    const auto &bath = series.column("bath.top");
    std::printf("3-D bath: start box %.12f (0.16), end box %.12f (0.256), bath %.12f (1.6), c(corner) %.12f (1.6), "
                "through the top %.12f (0.096)\n",
                amount.front(), amount.back(), bath.back(), record.points[0].final_value,
                series.column("amount_in.top").back());
    EXPECT_NEAR(amount.front() / 0.16, 1.0, 1e-12);
    EXPECT_NEAR(amount.back() / 0.256, 1.0, 1e-9);
    EXPECT_NEAR(bath.back() / 1.6, 1.0, 1e-9);
    EXPECT_NEAR(record.points[0].final_value / 1.6, 1.0, 1e-9);
    EXPECT_NEAR(series.column("amount_in.top").back() / 0.096, 1.0, 1e-9);
  }

  // ---------------------------------------------------------------------------------------------
  // output.loading.

  // The released fraction refers to `output.loading` when given (README, "Results a case can ask
  // for"): the content released divided by the loading. A sheet (half-thickness L = 1 m, centre
  // sealed, D = 1 m2/s) starting at 2 mol/m3 holds 2 mol/m2; with loading = 8 mol/m2 the fraction
  // is a quarter of the default one at every row (exact ratio: the same solve), 0 at the start,
  // and 12.5 % is reached when the default fraction reaches 50 %, at D t / (2L)^2 =
  // 0.0491826848809 (Crank 1975 eq. 4.18, root in tests/verification/REFERENCES.md, "Results").
  TEST(Features, OutputLoadingIsTheReferenceOfTheReleasedFraction)
  {
    const std::string common = "[geometry]\nlayers = sheet 1 m\ncell_size = 0.01 m\n[region.sheet]\n"
                               "diffusivity = 1 m2/s\n[initial]\nvalue = 2 mol/m3\n[boundary.top]\n"
                               "type = concentration\nvalue = 0 mol/m3\n[time]\nend = 0.5 s\ntolerance = 1e-6\n"
                               "[output]\nfields = false\n";
    const std::string plain = "[case]\ntitle = release\n" + common + "release.event = 50 %\n";
    const std::string loaded =
      "[case]\ntitle = release with loading\n" + common + "release.event = 12.5 %\nloading = 8 mol/m2\n";
    CaseDescription a, b;
    RunRecord ra, rb;
    if (!run_named(plain, "features_release_plain", a, ra) || !run_named(loaded, "features_release_loaded", b, rb))
      return;
    const CsvTable sa = read_csv(a.output.folder + "/series.csv"), sb = read_csv(b.output.folder + "/series.csv");
    ASSERT_EQ(sa.rows(), sb.rows());
    const auto &fa = sa.column("released_fraction"), &fb = sb.column("released_fraction");
    EXPECT_NEAR(fa.front(), 0.0, 1e-12);
    EXPECT_NEAR(fb.front(), 0.0, 1e-12);
    double worst = 0;
    for (std::size_t r = 0; r < fa.size(); ++r)
      worst = std::max(worst, std::abs(fb[r] - fa[r] / 4));
    const double t_half = 4 * 0.0491826848809;
    std::printf("loading: fraction at the end %.10f vs default / 4 = %.10f (largest difference %.2e); 12.5 %% at "
                "%.10f s, default 50 %% at %.10f s, Crank %.10f s\n",
                fb.back(), fa.back() / 4, worst, rb.releases.at(0).time, ra.releases.at(0).time, t_half);
    EXPECT_LT(worst, 1e-12);
    EXPECT_NEAR(rb.released_reference, 8.0, 1e-12);
    EXPECT_NEAR(rb.releases.at(0).time / ra.releases.at(0).time, 1.0, 1e-10);
    EXPECT_NEAR(rb.releases.at(0).time / t_half, 1.0, 2e-5); // as results_test.cc (measured 4.6e-6 there)
  }

  // ---------------------------------------------------------------------------------------------
  // Moments.

  // The amount, mean position and variance of `moments` (README: content, so theta R K u) for an
  // initial field in the Q2 space, c = x + 2y mol/m3 on the unit square (theta = 0.5), sealed:
  // hand integrals over [0, 1]^2 (common practice): amount 0.5 x 3/2 = 0.75 mol/m, mean
  // (int x c, int y c) / int c = ((5/6) / (3/2), (11/12) / (3/2)) = (5/9, 11/18), variance
  // (sum over the axes) (7/12 + 2/3) / (3/2) - (5/9)^2 - (11/18)^2 = 49/324. At the end the field
  // is uniform (exp(-pi^2 t) at t = 20 s): the amount kept, mean (1/2, 1/2), variance 1/6.
  TEST(Features, MomentsAmountMeanAndVariance)
  {
    const std::string text = R"(
[case]
title = moments
dimension = 2
[geometry]
layers = block 1 m
width = 1 m
cell_size = 0.25 m
[region.block]
diffusivity = 1 m2/s
porosity = 0.5
[initial]
value = {x + 2*y} mol/m3
[time]
end = 20 s
[output]
fields = false
moments = true
)";
    CaseDescription description;
    RunRecord record;
    if (!run_named(text, "features_moments", description, record))
      return;
    ASSERT_GE(record.moments.size(), 2u);
    const MomentsRecord &start = record.moments.front(), &end = record.moments.back();
    std::printf("moments at t = %g: amount %.14f (0.75), mean (%.14f, %.14f) (%.14f, %.14f), variance %.14f (%.14f)\n",
                start.time, start.amount, start.mean[0], start.mean[1], 5.0 / 9.0, 11.0 / 18.0, start.variance,
                49.0 / 324.0);
    std::printf("moments at t = %g: amount %.14f (0.75), mean (%.14f, %.14f) (0.5, 0.5), variance %.14f (%.14f)\n",
                end.time, end.amount, end.mean[0], end.mean[1], end.variance, 1.0 / 6.0);
    EXPECT_EQ(start.time, 0.0);
    EXPECT_NEAR(start.amount, 0.75, 1e-12);
    EXPECT_NEAR(start.mean[0], 5.0 / 9.0, 1e-12);
    EXPECT_NEAR(start.mean[1], 11.0 / 18.0, 1e-12);
    EXPECT_NEAR(start.variance, 49.0 / 324.0, 1e-12);
    EXPECT_NEAR(end.time, 20.0, 1e-9);
    EXPECT_NEAR(end.amount, 0.75, 1e-10);
    EXPECT_NEAR(end.mean[0], 0.5, 1e-9);
    EXPECT_NEAR(end.mean[1], 0.5, 1e-9);
    EXPECT_NEAR(end.variance, 1.0 / 6.0, 1e-9);
  }

  // ---------------------------------------------------------------------------------------------
  // Stages: overrides key by key.

  // README, "Stages": a stage's boundary.FACE.KEY overrides the [boundary.FACE] keys one by one,
  // unless the stage gives boundary.FACE.type, which then defines the face alone. Slab L = 1 m,
  // D = 1 m2/s, base held at 0; top a transfer face, h = 0.5 m/s, ambient 1 mol/m3. Stage 1 keeps
  // it; stage 2 overrides the ambient alone (3 mol/m3; h kept); stage 3 makes the top a held face
  // (2 mol/m3; h and ambient dropped). Each stage lasts 50 s (slowest decay exp(-3.4 t)), so each
  // ends at its steady state (Robin condition at steady state, Carslaw & Jaeger 1959 sec. 2.7, in
  // series with the slab, common practice): J = a / (L / D + 1 / h) = a / 3, c(top) = a - J / h:
  // stage 1: J = 1/3, c = 1/3; stage 2: J = 1, c = 1; stage 3: J = 2, c = 2.
  TEST(Features, StageOverridesBoundaryKeysOneByOne)
  {
    const std::string text = R"(
[case]
title = stage overrides
[geometry]
layers = slab 1 m
cell_size = 0.1 m
[region.slab]
diffusivity = 1 m2/s
[boundary.top]
type = transfer
coefficient = 0.5 m/s
ambient = 1 mol/m3
[boundary.bottom]
type = concentration
value = 0 mol/m3
[stage.first]
duration = 50 s
[stage.second]
duration = 50 s
boundary.top.ambient = 3 mol/m3
[stage.third]
duration = 50 s
boundary.top.type = concentration
boundary.top.value = 2 mol/m3
[output]
fields = false
point.top = 0 m
)";
    CaseDescription description;
    RunRecord record;
    if (!run_named(text, "features_stage_overrides", description, record))
      return;
    ASSERT_EQ(description.stages.size(), 3u);
    const BoundarySpec *second = description.stages[1].find_boundary("top");
    const BoundarySpec *third = description.stages[2].find_boundary("top");
    ASSERT_NE(second, nullptr);
    ASSERT_NE(third, nullptr);
    EXPECT_EQ(second->kind, BoundaryKind::transfer);
    EXPECT_DOUBLE_EQ(second->coefficient, 0.5);
    EXPECT_DOUBLE_EQ(second->ambient.value, 3.0);
    EXPECT_EQ(third->kind, BoundaryKind::concentration);
    EXPECT_DOUBLE_EQ(third->value.value, 2.0);
    const CsvTable series = read_csv(description.output.folder + "/series.csv");
    const auto &flux = series.column("flux_in.top");
    const auto &top = series.column("point.top");
    const double ends[3] = {50, 100, 150}, fluxes[3] = {1.0 / 3.0, 1.0, 2.0}, tops[3] = {1.0 / 3.0, 1.0, 2.0};
    for (int k = 0; k < 3; ++k)
      {
        const std::size_t r = row_at(series, ends[k]);
        std::printf("stage %d at %g s: flux in %.12f (%.12f), c(top) %.12f (%.12f)\n", k + 1, ends[k], flux[r],
                    fluxes[k], top[r], tops[k]);
        // Steady and linear at the end of each stage: round-off.
        EXPECT_NEAR(flux[r] / fluxes[k], 1.0, 1e-10) << "stage " << k + 1;
        EXPECT_NEAR(top[r] / tops[k], 1.0, 1e-10) << "stage " << k + 1;
      }
  }
} // namespace fickcast::testing
