// README features that had no check able to catch a wrong answer (issue 24, item 7): transfer
// faces with a partition, bath `partition` and `initial`, baths in 2-D and 3-D, hollow centres,
// axisymmetric side coatings, `geometry.refine`, Gmsh 2.2 files, Millington-Quirk, Archie at
// m other than 2, radial amounts, fluxes and depths, tables for diffusivity, ambient and source,
// D as an expression of T, `output.loading`, the amount and mean of `moments`, and stage
// overrides key by key. Each test compares with an exact value: steady states that lie in (or
// converge superfast to) the finite-element space, equilibria fixed by conservation, or closed
// forms of the transient problem, each with its source beside it.
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
#include "case_runner.h"
#include "csv_table.h"

#include <boost/math/constants/constants.hpp>
#include <boost/math/special_functions/erf.hpp>

#include <gtest/gtest.h>

#include <algorithm>
#include <cmath>
#include <cstdio>
#include <fstream>
#include <map>
#include <sstream>
#include <stdexcept>
#include <string>
#include <utility>
#include <vector>

namespace fickcast::testing
{
  namespace
  {
    constexpr double pi = boost::math::constants::pi<double>();

    /// A number as case text, to the last digit.
    std::string num(const double value)
    {
      char text[40];
      std::snprintf(text, sizeof(text), "%.17g", value);
      return text;
    }

    /// Row of series.csv at time @p t (relative match 1e-9); adds a failure if there is none.
    std::size_t row_at(const CsvTable &series, const double t)
    {
      const auto &time = series.column("time");
      for (std::size_t r = 0; r < time.size(); ++r)
        if (std::abs(time[r] - t) <= 1e-9 * std::max(std::abs(t), 1.0))
          return r;
      ADD_FAILURE() << "no row at t = " << t << " s";
      return time.size() - 1;
    }

    /// Runs @p text as case @p name; fails the test (and returns false) unless it completes.
    bool run_named(const std::string &text, const std::string &name, CaseDescription &description, RunRecord &record)
    {
      description = describe(text, name);
      record = run(description);
      EXPECT_EQ(record.status, "completed") << name << ": " << record.message;
      return record.status == "completed";
    }

    /// Body of the section $NAME ... $EndNAME of a Gmsh file, as one string.
    std::string msh_section(const std::vector<std::string> &lines, const std::string &name)
    {
      const auto begin = std::find(lines.begin(), lines.end(), "$" + name);
      const auto end = begin == lines.end() ? lines.end() : std::find(begin, lines.end(), "$End" + name);
      if (begin == lines.end() || end == lines.end())
        throw std::runtime_error("no $" + name + " section");
      std::string body;
      for (auto it = begin + 1; it != end; ++it)
        body += *it + "\n";
      return body;
    }

    /// A Gmsh 2.2 copy of an ASCII Gmsh 4.1 mesh: the same physical names, the nodes with their
    /// tags (coordinates written with 17 digits, so that they read back to the same doubles) and
    /// the elements in the same order, each tagged with the physical group of its entity and the
    /// entity itself. Layouts of both formats after the Gmsh reference manual, "MSH file format"
    /// (versions 2.2 and 4.1; from memory, as in solver/geometry/msh_check.cc).
    std::string gmsh_41_to_22(const std::string &path)
    {
      std::ifstream in(path);
      if (!in)
        throw std::runtime_error("cannot open " + path);
      std::vector<std::string> lines;
      std::string line;
      while (std::getline(in, line))
        {
          if (!line.empty() && line.back() == '\r')
            line.pop_back();
          lines.push_back(line);
        }
      if (msh_section(lines, "MeshFormat").rfind("4.1 0 8", 0) != 0)
        throw std::runtime_error(path + " is not ASCII Gmsh 4.1");

      // Entities: the first physical tag of each (dimension, tag), 0 if none.
      std::map<std::pair<long, long>, long> physical;
      {
        std::istringstream t(msh_section(lines, "Entities"));
        long count[4] = {0, 0, 0, 0};
        t >> count[0] >> count[1] >> count[2] >> count[3];
        for (long d = 0; d < 4; ++d)
          for (long i = 0; i < count[d]; ++i)
            {
              long tag = 0, n_physical = 0;
              double coordinate = 0;
              t >> tag;
              for (int c = 0; c < (d == 0 ? 3 : 6); ++c)
                t >> coordinate;
              t >> n_physical;
              long first = 0;
              for (long k = 0; k < n_physical; ++k)
                {
                  long p = 0;
                  t >> p;
                  if (k == 0)
                    first = p;
                }
              if (d > 0)
                {
                  long n_bounding = 0, bounding = 0;
                  t >> n_bounding;
                  for (long k = 0; k < n_bounding; ++k)
                    t >> bounding;
                }
              physical[{d, tag}] = first;
            }
        if (!t)
          throw std::runtime_error("cannot read the $Entities of " + path);
      }

      std::ostringstream nodes;
      long n_nodes = 0;
      {
        std::istringstream t(msh_section(lines, "Nodes"));
        long blocks = 0, total = 0, low = 0, high = 0;
        t >> blocks >> total >> low >> high;
        for (long b = 0; b < blocks; ++b)
          {
            long dim = 0, entity = 0, parametric = 0, n = 0;
            t >> dim >> entity >> parametric >> n;
            std::vector<long> tags(static_cast<std::size_t>(n));
            for (auto &tag : tags)
              t >> tag;
            for (long i = 0; i < n; ++i)
              {
                double x[3] = {0, 0, 0}, extra = 0;
                t >> x[0] >> x[1] >> x[2];
                for (long k = 0; k < (parametric ? dim : 0); ++k)
                  t >> extra;
                char row[160];
                std::snprintf(row, sizeof(row), "%ld %.17g %.17g %.17g\n", tags[static_cast<std::size_t>(i)], x[0],
                              x[1], x[2]);
                nodes << row;
                ++n_nodes;
              }
          }
        if (!t || n_nodes != total)
          throw std::runtime_error("cannot read the $Nodes of " + path);
      }

      std::ostringstream elements;
      long n_elements = 0;
      {
        // Nodes per element type: 1 line, 2 triangle, 3 quadrilateral, 4 tetrahedron,
        // 5 hexahedron, 15 point.
        static const std::map<long, int> nodes_of{{1, 2}, {2, 3}, {3, 4}, {4, 4}, {5, 8}, {15, 1}};
        std::istringstream t(msh_section(lines, "Elements"));
        long blocks = 0, total = 0, low = 0, high = 0;
        t >> blocks >> total >> low >> high;
        for (long b = 0; b < blocks; ++b)
          {
            long dim = 0, entity = 0, type = 0, n = 0;
            t >> dim >> entity >> type >> n;
            const auto count = nodes_of.find(type);
            if (count == nodes_of.end())
              throw std::runtime_error("element type " + std::to_string(type) + " in " + path);
            for (long i = 0; i < n; ++i)
              {
                long tag = 0;
                t >> tag;
                elements << tag << ' ' << type << " 2 " << physical[{dim, entity}] << ' ' << entity;
                for (int k = 0; k < count->second; ++k)
                  {
                    long node = 0;
                    t >> node;
                    elements << ' ' << node;
                  }
                elements << '\n';
                ++n_elements;
              }
          }
        if (!t || n_elements != total)
          throw std::runtime_error("cannot read the $Elements of " + path);
      }

      return "$MeshFormat\n2.2 0 8\n$EndMeshFormat\n$PhysicalNames\n" + msh_section(lines, "PhysicalNames") +
             "$EndPhysicalNames\n$Nodes\n" + std::to_string(n_nodes) + "\n" + nodes.str() + "$EndNodes\n$Elements\n" +
             std::to_string(n_elements) + "\n" + elements.str() + "$EndElements\n";
    }

    /// The coated tablet of meshes/coated_tablet_rz.msh (README of meshes/: core radius 4 mm,
    /// height 3 mm, 0.2 mm coating all round, so radius R = 4.2 mm and height H = 3.4 mm, bottom
    /// face at z = 0), D = 1e-6 m2/s in both regions, retardation 3 in the coating, bottom held at
    /// 1 mol/m3 and top at 0, side sealed: the steady state is c = 1 - z / H (linear, in the Q1
    /// space), with inflow D pi R^2 / H through the bottom and, as every region is symmetric about
    /// mid-height, the mean concentration 1/2 in each region (common practice).
    std::string coated_tablet_case(const std::string &mesh, const unsigned int refine)
    {
      return "[case]\ntitle = coated tablet mesh\ncoordinates = axisymmetric\ndimension = 2\n[geometry]\nmesh = " +
             mesh + "\nrefine = " + std::to_string(refine) +
             "\n[region.core]\ndiffusivity = 1e-6 m2/s\n[region.coating]\ndiffusivity = 1e-6 m2/s\nretardation = 3\n"
             "[boundary.bottom]\ntype = concentration\nvalue = 1 mol/m3\n[boundary.top]\ntype = concentration\n"
             "value = 0 mol/m3\n[time]\nend = 200 s\n[numerics]\ndegree = 1\n[output]\nfields = false\n"
             "point.inside = 2 mm, 1 mm\n";
    }

    struct TabletExact
    {
      double inflow, core, coating, inside;
    };

    TabletExact coated_tablet_exact()
    {
      const double d = 1e-6, r_core = 4e-3, h_core = 3e-3, r = 4.2e-3, h = 3.4e-3;
      const double v_core = pi * r_core * r_core * h_core, v_total = pi * r * r * h;
      return {d * pi * r * r / h, 0.5 * v_core, 3 * 0.5 * (v_total - v_core), 1 - 1e-3 / h};
    }

    void check_coated_tablet(const std::string &label, const CaseDescription &description, const RunRecord &record)
    {
      const TabletExact exact = coated_tablet_exact();
      const CsvTable series = read_csv(description.output.folder + "/series.csv");
      const double inflow = series.column("flux_in.bottom").back(), outflow = -series.column("flux_in.top").back();
      const double core = series.column("amount.core").back(), coating = series.column("amount.coating").back();
      std::printf("%s: %lu cells, inflow %.12e, outflow %.12e (exact %.12e); amounts core %.12e (%.12e), coating "
                  "%.12e (%.12e); c(2 mm, 1 mm) %.12f (%.12f)\n",
                  label.c_str(), record.cells, inflow, outflow, exact.inflow, core, exact.core, coating, exact.coating,
                  record.points[0].final_value, exact.inside);
      // Steady and linear: exact in Q1 up to round-off and the transient's remainder (exp(-100)).
      EXPECT_NEAR(inflow / exact.inflow, 1.0, 1e-9) << label;
      EXPECT_NEAR(outflow / exact.inflow, 1.0, 1e-9) << label;
      EXPECT_NEAR(core / exact.core, 1.0, 1e-9) << label;
      EXPECT_NEAR(coating / exact.coating, 1.0, 1e-9) << label;
      EXPECT_NEAR(record.points[0].final_value, exact.inside, 1e-9) << label;
    }
  } // namespace

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
  // Hollow centres, radial amounts and fluxes.

  // Steady state in a hollow cylinder r1 < r < r2, c = a at r1, b at r2 (Crank 1975 ch. 5, steady
  // state, sec. 5.2; Carslaw & Jaeger 1959 ch. VII; section numbers from memory):
  // c = a + (b - a) ln(r / r1) / ln(r2 / r1), flow per unit length 2 pi D (a - b) / ln(r2 / r1).
  // r1 = 1 m, r2 = 2 m, D = 1 m2/s, a = 1, b = 0: flow 2 pi / ln 2, c(1.5 m) = 1 - ln 1.5 / ln 2, and
  // the amount per unit length 2 pi [3/2 - 2 + 3 / (4 ln 2)] (integral of c 2 pi r, derived here).
  // At t = 0 the uniform 0.5 mol/m3 holds 0.5 pi (r2^2 - r1^2) per unit length (hand value).
  // A wrong radial weight changes all of these (r^2 instead of r: the sphere's values below).
  TEST(Features, HollowCylinderAtSteadyState)
  {
    const std::string text = R"(
[case]
title = hollow cylinder
coordinates = cylinder
[geometry]
layers = wall 1 m
inner_radius = 1 m
cell_size = 0.02 m
[region.wall]
diffusivity = 1 m2/s
[initial]
value = 0.5 mol/m3
[boundary.inner]
type = concentration
value = 1 mol/m3
[boundary.outer]
type = concentration
value = 0 mol/m3
[time]
end = 20 s
[output]
fields = false
point.mid = 1.5 m
)";
    CaseDescription description;
    RunRecord record;
    if (!run_named(text, "features_hollow_cylinder", description, record))
      return;
    const CsvTable series = read_csv(description.output.folder + "/series.csv");
    const double flow = 2 * pi / std::log(2.0), mid = 1 - std::log(1.5) / std::log(2.0);
    const double initial = 0.5 * pi * 3, steady = 2 * pi * (1.5 - 2 + 0.75 / std::log(2.0));
    const double in_inner = series.column("flux_in.inner").back(), in_outer = series.column("flux_in.outer").back();
    const auto &amount = series.column("amount.total");
    std::printf("hollow cylinder: flow in %.12e, out %.12e (exact %.12e); c(1.5 m) %.12f (%.12f); amount at 0 "
                "%.12f (%.12f), at the end %.12f (%.12f)\n",
                in_inner, -in_outer, flow, record.points[0].final_value, mid, amount.front(), initial, amount.back(),
                steady);
    EXPECT_NEAR(amount.front() / initial, 1.0, 1e-12); // uniform, weights integrated exactly
    // Q2 on a logarithm: nodal values and the face flow converge as h^4 (superconvergence of the
    // 1-D Galerkin solution); 1e-7 is an upper bound for h = 0.02 m.
    EXPECT_NEAR(in_inner / flow, 1.0, 1.5e-9);             // measured 3e-10
    EXPECT_NEAR(-in_outer / flow, 1.0, 1.5e-9);            // measured 3e-10
    EXPECT_NEAR(record.points[0].final_value, mid, 4e-10); // measured 8e-11
    EXPECT_NEAR(amount.back() / steady, 1.0, 3e-9);        // measured 5.6e-10
  }

  // Steady state in a hollow sphere r1 < r < r2 (Crank 1975 ch. 6, steady state, sec. 6.2;
  // Carslaw & Jaeger 1959 ch. IX; section numbers from memory): c = [a r1 (r2 - r) + b r2 (r - r1)] / (r (r2 - r1)),
  // total flow 4 pi D (a - b) r1 r2 / (r2 - r1). r1 = 1 m, r2 = 2 m, D = 1, a = 1, b = 0: c = 2/r - 1,
  // flow 8 pi, c(1.5 m) = 1/3, amount 4 pi int (2r - r^2) dr = 8 pi / 3; at t = 0, 0.5 mol/m3 holds
  // 0.5 (4/3) pi (r2^3 - r1^3) = 14 pi / 3 (hand values).
  TEST(Features, HollowSphereAtSteadyState)
  {
    const std::string text = R"(
[case]
title = hollow sphere
coordinates = sphere
[geometry]
layers = shell 1 m
inner_radius = 1 m
cell_size = 0.02 m
[region.shell]
diffusivity = 1 m2/s
[initial]
value = 0.5 mol/m3
[boundary.inner]
type = concentration
value = 1 mol/m3
[boundary.outer]
type = concentration
value = 0 mol/m3
[time]
end = 20 s
[output]
fields = false
point.mid = 1.5 m
)";
    CaseDescription description;
    RunRecord record;
    if (!run_named(text, "features_hollow_sphere", description, record))
      return;
    const CsvTable series = read_csv(description.output.folder + "/series.csv");
    const double flow = 8 * pi, mid = 1.0 / 3.0, initial = 14 * pi / 3, steady = 8 * pi / 3;
    const double in_inner = series.column("flux_in.inner").back(), in_outer = series.column("flux_in.outer").back();
    const auto &amount = series.column("amount.total");
    std::printf("hollow sphere: flow in %.12e, out %.12e (exact %.12e); c(1.5 m) %.12f (%.12f); amount at 0 %.12f "
                "(%.12f), at the end %.12f (%.12f)\n",
                in_inner, -in_outer, flow, record.points[0].final_value, mid, amount.front(), initial, amount.back(),
                steady);
    EXPECT_NEAR(amount.front() / initial, 1.0, 1e-11);      // measured 3.2e-12
    EXPECT_NEAR(in_inner / flow, 1.0, 1.5e-8);              // measured 3.1e-9
    EXPECT_NEAR(-in_outer / flow, 1.0, 1.5e-8);             // measured 3.1e-9
    EXPECT_NEAR(record.points[0].final_value, mid, 3.5e-9); // measured 7.1e-10
    EXPECT_NEAR(amount.back() / steady, 1.0, 2e-8);         // measured 4.6e-9
  }

  // Radial depth, amounts and flux with a uniform sink s in a solid cylinder or sphere of radius
  // a = 1 m whose surface is held at c_a = 1 mol/m3. Steady radial equation D (1/r^n)(r^n c')' = s
  // (n = 1 cylinder, 2 sphere; common practice, derived here as in the coated-sphere test of
  // radial_test.cc): c = c_a - s (a^2 - r^2) / (2 (n + 1) D). With s = 2 (cylinder) and 3 (sphere)
  // mol/(m3 s): c = (1 + r^2) / 2 in both, a quadratic the Q2 space holds exactly. Hence:
  // centre 1/2; the level 0.75 lies at r = 1/sqrt(2), depth from the surface 1 - 1/sqrt(2);
  // inflow = s x volume = 2 pi (per unit length) and 4 pi; amounts 2 pi int r c = 3 pi / 4 (per unit
  // length) and 4 pi int r^2 c = 16 pi / 15; the start (c = 1) holds pi and 4 pi / 3 (hand values).
  TEST(Features, RadialDepthAmountsAndFluxWithAUniformSink)
  {
    struct Shape
    {
      std::string name;
      double sink, inflow, steady_amount, initial_amount;
    };
    for (const Shape &shape :
         {Shape{"cylinder", 2, 2 * pi, 0.75 * pi, pi}, Shape{"sphere", 3, 4 * pi, 16 * pi / 15, 4 * pi / 3}})
      {
        const std::string text = "[case]\ntitle = radial sink\ncoordinates = " + shape.name +
                                 "\n[geometry]\nlayers = body 1 m\ncell_size = 0.02 m\n[region.body]\n"
                                 "diffusivity = 1 m2/s\nsource = -" +
                                 num(shape.sink) +
                                 " mol/(m3 s)\n[initial]\nvalue = 1 mol/m3\n[boundary.outer]\n"
                                 "type = concentration\nvalue = 1 mol/m3\n[time]\nend = 20 s\n[output]\n"
                                 "fields = false\npoint.centre = 0 m\ndepth.level = 0.75 mol/m3\n";
        CaseDescription description;
        RunRecord record;
        if (!run_named(text, "features_radial_sink_" + shape.name, description, record))
          continue;
        const CsvTable series = read_csv(description.output.folder + "/series.csv");
        const auto &amount = series.column("amount.total");
        const double inflow = series.column("flux_in.outer").back();
        const double depth = record.depths.at(0).depths.back(), depth_exact = 1 - 1 / std::sqrt(2.0);
        std::printf("%s with a sink: c(0) %.12f (0.5); depth of 0.75 %.10f m (%.10f m); inflow %.12e (%.12e); "
                    "amount at 0 %.12f (%.12f), at the end %.12f (%.12f)\n",
                    shape.name.c_str(), record.points[0].final_value, depth, depth_exact, inflow, shape.inflow,
                    amount.front(), shape.initial_amount, amount.back(), shape.steady_amount);
        EXPECT_NEAR(amount.front() / shape.initial_amount, 1.0, 1e-12) << shape.name;
        // The steady solution lies in the Q2 space: round-off and the transient's remainder
        // (exp(-5.8 t) for the cylinder at t = 20 s).
        EXPECT_NEAR(record.points[0].final_value, 0.5, 1e-9) << shape.name;
        EXPECT_NEAR(inflow / shape.inflow, 1.0, 1e-9) << shape.name;
        EXPECT_NEAR(amount.back() / shape.steady_amount, 1.0, 1e-9) << shape.name;
        // The depth is interpolated linearly between samples 1 mm apart: (1 mm)^2 / 8 x c'' / c'
        // = 1.8e-7 m at most.
        EXPECT_NEAR(depth, depth_exact, 3e-7) << shape.name;
      }
  }

  // ---------------------------------------------------------------------------------------------
  // Axisymmetric side coating (with a hollow centre).

  // A hollow cylinder of height H = 1 m, core from r1 = 1 m to R = 1.5 m (D1 = 1 m2/s, K1 = 1) and a
  // side coating from R to R2 = 2 m (D2 = 0.25 m2/s, K2 = 2), the bore in equilibrium with 1 mol/m3
  // outside and the side with 0, top and bottom sealed: a radial steady state through cylindrical
  // shells in series (Crank 1975 ch. 5, steady state, for each shell; series resistances with
  // partition as in partition_membrane_test.cc, common practice):
  // Q = 2 pi H (1 - 0) / (ln(R / r1) / (D1 K1) + ln(R2 / R) / (D2 K2)),
  // u(R) = 1 - Q ln(R / r1) / (2 pi H D1 K1), c = K u on each side of R, and in the coating
  // u(r) = u(R) - Q ln(r / R) / (2 pi H D2 K2).
  TEST(Features, AxisymmetricSideCoatingAtSteadyState)
  {
    const std::string text = R"(
[case]
title = coated hollow cylinder
coordinates = axisymmetric
dimension = 2
[geometry]
layers = core 1 m
radius = 1.5 m
inner_radius = 1 m
side_coating = coat 0.5 m
cell_size = 0.05 m
[region.core]
diffusivity = 1 m2/s
[region.coat]
diffusivity = 0.25 m2/s
partition = 2
[boundary.inner]
type = concentration
ambient = 1 mol/m3
[boundary.side]
type = concentration
ambient = 0 mol/m3
[time]
end = 40 s
[output]
fields = false
point.core_side = 1.5 m, 0.5 m in core
point.coat_side = 1.5 m, 0.5 m in coat
point.in_coat = 1.75 m, 0.25 m
)";
    CaseDescription description;
    RunRecord record;
    if (!run_named(text, "features_side_coating", description, record))
      return;
    const double r1 = 1, r = 1.5, r2 = 2, d1 = 1, k1 = 1, d2 = 0.25, k2 = 2, h = 1;
    const double flow = 2 * pi * h / (std::log(r / r1) / (d1 * k1) + std::log(r2 / r) / (d2 * k2));
    const double u_r = 1 - flow * std::log(r / r1) / (2 * pi * h * d1 * k1);
    const double u_in = u_r - flow * std::log(1.75 / r) / (2 * pi * h * d2 * k2);
    const CsvTable series = read_csv(description.output.folder + "/series.csv");
    const double in_inner = series.column("flux_in.inner").back(), in_side = series.column("flux_in.side").back();
    std::printf("side coating: flow in %.10e, out %.10e (exact %.10e); c at R %.10f | %.10f (%.10f | %.10f); "
                "c(1.75 m) %.10f (%.10f)\n",
                in_inner, -in_side, flow, record.points[0].final_value, record.points[1].final_value, k1 * u_r,
                k2 * u_r, record.points[2].final_value, k2 * u_in);
    // Q2, h = 0.05 m, logarithmic profiles: the Galerkin error at nodes and in the face flow
    // is O(h^4), estimated below 1e-6 here.
    EXPECT_NEAR(in_inner / flow, 1.0, 4e-8);                    // measured 9.5e-9
    EXPECT_NEAR(-in_side / flow, 1.0, 4e-8);                    // measured 9.5e-9
    EXPECT_NEAR(record.points[0].final_value, k1 * u_r, 3e-8);  // measured <= 6.3e-9
    EXPECT_NEAR(record.points[1].final_value, k2 * u_r, 3e-8);  // measured <= 6.3e-9
    EXPECT_NEAR(record.points[2].final_value, k2 * u_in, 3e-8); // measured <= 6.3e-9
  }

  // ---------------------------------------------------------------------------------------------
  // geometry.refine.

  // Refinement halves every cell: four times the cells in 2-D, and the error of a second-order
  // quantity about a quarter (common practice; Thomee 2006). Case: a hollow axisymmetric
  // cylinder (r1 = 0.25 m, R = 1 m, height H = 0.5 m, D = 1 m2/s, bore 1 mol/m3, side 0, top and
  // bottom sealed) on a coarse Q1 mesh; exact flow 2 pi H D / ln(R / r1) (Crank 1975 ch. 5).
  // And a mesh file: refine = 1 on meshes/coated_tablet_rz.msh (728 cells, its README) gives 2912
  // cells and still the exact linear steady state of coated_tablet_case().
  TEST(Features, RefineQuadruplesTheCellsAndApproachesTheExactAnswer)
  {
    const double flow = 2 * pi * 0.5 / std::log(4.0);
    std::vector<double> errors;
    std::vector<unsigned long> cells;
    for (const unsigned int refine : {0u, 1u})
      {
        const std::string text = "[case]\ntitle = refine\ncoordinates = axisymmetric\ndimension = 2\n[geometry]\n"
                                 "layers = wall 0.5 m\nradius = 1 m\ninner_radius = 0.25 m\ncell_size = 0.25 m\n"
                                 "refine = " +
                                 std::to_string(refine) +
                                 "\n[region.wall]\ndiffusivity = 1 m2/s\n[boundary.inner]\ntype = concentration\n"
                                 "value = 1 mol/m3\n[boundary.side]\ntype = concentration\nvalue = 0 mol/m3\n"
                                 "[time]\nend = 10 s\n[numerics]\ndegree = 1\n[output]\nfields = false\n";
        CaseDescription description;
        RunRecord record;
        if (!run_named(text, "features_refine_" + std::to_string(refine), description, record))
          return;
        const CsvTable series = read_csv(description.output.folder + "/series.csv");
        const double computed = series.column("flux_in.inner").back();
        errors.push_back(std::abs(computed / flow - 1));
        cells.push_back(record.cells);
        std::printf("refine = %u: %lu cells, flow %.10f (exact %.10f, relative error %.3e)\n", refine, record.cells,
                    computed, flow, errors.back());
      }
    EXPECT_EQ(cells[1], 4 * cells[0]);
    EXPECT_GT(errors[0], 1e-6);          // the coarse mesh must show an error for the comparison to mean anything
    EXPECT_LT(errors[1], errors[0] / 3); // second order: about errors[0] / 4

    CaseDescription description;
    RunRecord record;
    if (!run_named(coated_tablet_case(source_path("meshes/coated_tablet_rz.msh"), 1), "features_refine_mesh",
                   description, record))
      return;
    EXPECT_EQ(record.cells, 4u * 728u);
    check_coated_tablet("coated tablet mesh, refine = 1", description, record);
  }

  // ---------------------------------------------------------------------------------------------
  // Gmsh 2.2 files.

  // The demo mesh meshes/coated_tablet_rz.msh (Gmsh 4.1) copied into Gmsh 2.2 by gmsh_41_to_22():
  // the same nodes, cells and groups, so both runs must agree to round-off, and both must give the
  // exact steady state of coated_tablet_case() (linear, exact in Q1; common practice).
  TEST(Features, GmshFormat22CopyOfA41MeshGivesTheSameResults)
  {
    const std::string original = source_path("meshes/coated_tablet_rz.msh");
    const std::string copy = scratch_folder("features_gmsh22_mesh") + "/coated_tablet_rz_22.msh";
    std::ofstream(copy) << gmsh_41_to_22(original);
    CaseDescription a, b;
    RunRecord ra, rb;
    if (!run_named(coated_tablet_case(original, 0), "features_gmsh41", a, ra) ||
        !run_named(coated_tablet_case(copy, 0), "features_gmsh22", b, rb))
      return;
    EXPECT_EQ(ra.cells, 728u);
    EXPECT_EQ(rb.cells, ra.cells);
    EXPECT_EQ(rb.unknowns, ra.unknowns);
    EXPECT_EQ(rb.regions, ra.regions);
    EXPECT_EQ(rb.boundaries, ra.boundaries);
    check_coated_tablet("Gmsh 4.1", a, ra);
    check_coated_tablet("Gmsh 2.2", b, rb);
    const CsvTable sa = read_csv(a.output.folder + "/series.csv"), sb = read_csv(b.output.folder + "/series.csv");
    ASSERT_EQ(sa.rows(), sb.rows());
    double worst = 0;
    for (const std::string column :
         {"time", "amount.total", "amount.core", "amount.coating", "amount_in.bottom", "amount_in.top", "point.inside"})
      {
        const auto &x = sa.column(column), &y = sb.column(column);
        double scale = 0;
        for (const double v : x)
          scale = std::max(scale, std::abs(v));
        for (std::size_t r = 0; r < x.size(); ++r)
          worst = std::max(worst, std::abs(x[r] - y[r]) / std::max(scale, 1e-300));
      }
    std::printf("Gmsh 2.2 copy against 4.1: largest relative difference over %zu rows %.3e\n", sa.rows(), worst);
    EXPECT_LT(worst, 1e-12);
  }

  // ---------------------------------------------------------------------------------------------
  // Porosity laws.

  // Millington & Quirk, "Permeability of porous solids", Trans. Faraday Soc. 57 (1961) 1200
  // (citation from memory), in the saturated form the README gives: tau = theta^(1/3), so the
  // steady flux per bulk area through a slab is J = theta tau D dc / L = theta^(4/3) D dc / L
  // (series of one resistance, common practice). theta = 0.3, D = 1 m2/s, L = 1 m, dc = 1 mol/m3:
  // J = 0.3^(4/3) = 0.200829... Also equal to the run with the explicit tortuosity 0.3^(1/3).
  TEST(Features, MillingtonQuirkSteadyFlux)
  {
    const std::string common = "[geometry]\nlayers = soil 1 m\ncell_size = 0.1 m\n[boundary.top]\n"
                               "type = concentration\nvalue = 1 mol/m3\n[boundary.bottom]\ntype = concentration\n"
                               "value = 0 mol/m3\n[time]\nend = 100 s\n[output]\nfields = false\n";
    const std::string by_law = "[case]\ntitle = Millington-Quirk\n" + common +
                               "[region.soil]\ndiffusivity = 1 m2/s\nporosity = 0.3\nporosity_law = millington_quirk\n";
    const std::string explicit_tau =
      "[case]\ntitle = explicit tortuosity\n" + common +
      "[region.soil]\ndiffusivity = 1 m2/s\nporosity = 0.3\ntortuosity = " + num(std::cbrt(0.3)) + "\n";
    CaseDescription a, b;
    RunRecord ra, rb;
    if (!run_named(by_law, "features_millington_quirk", a, ra) || !run_named(explicit_tau, "features_mq_tau", b, rb))
      return;
    const double exact = std::pow(0.3, 4.0 / 3.0);
    const double j_law = read_csv(a.output.folder + "/series.csv").column("flux_in.top").back();
    const double j_tau = read_csv(b.output.folder + "/series.csv").column("flux_in.top").back();
    std::printf("Millington-Quirk: flux %.12e, explicit tau %.12e, exact theta^(4/3) D dc / L = %.12e\n", j_law, j_tau,
                exact);
    EXPECT_NEAR(j_law / exact, 1.0, 1e-10); // steady and linear: round-off
    EXPECT_NEAR(j_tau / exact, 1.0, 1e-10);
  }

  // Archie, "The electrical resistivity log as an aid in determining some reservoir
  // characteristics", Trans. AIME 146 (1942) 54 (citation from memory): formation factor
  // theta^(-m), i.e. theta D_eff = D theta^m, tau = theta^(m - 1) as the README states. Steady flux
  // J = theta^m D dc / L at m = 1.5 and 2.5 (theta = 0.3, D = 1 m2/s, L = 1 m, dc = 1 mol/m3):
  // 0.164317 and 0.049295 mol/(m2 s); an exponent read as 2 would give 0.09.
  TEST(Features, ArchieSteadyFluxAtExponentsOtherThanTwo)
  {
    for (const double m : {1.5, 2.5})
      {
        const std::string text = "[case]\ntitle = Archie\n[geometry]\nlayers = rock 1 m\ncell_size = 0.1 m\n"
                                 "[region.rock]\ndiffusivity = 1 m2/s\nporosity = 0.3\nporosity_law = archie\n"
                                 "archie_exponent = " +
                                 num(m) +
                                 "\n[boundary.top]\ntype = concentration\nvalue = 1 mol/m3\n[boundary.bottom]\n"
                                 "type = concentration\nvalue = 0 mol/m3\n[time]\nend = 100 s\n[output]\n"
                                 "fields = false\n";
        CaseDescription description;
        RunRecord record;
        if (!run_named(text, "features_archie_" + std::to_string(static_cast<int>(10 * m)), description, record))
          continue;
        const CsvTable series = read_csv(description.output.folder + "/series.csv");
        const double exact = std::pow(0.3, m);
        const double in_top = series.column("flux_in.top").back(), in_bottom = series.column("flux_in.bottom").back();
        std::printf("Archie m = %g: flux in %.12e, out %.12e, exact theta^m D dc / L = %.12e\n", m, in_top, -in_bottom,
                    exact);
        EXPECT_NEAR(in_top / exact, 1.0, 1e-10) << "m = " << m; // slowest decay exp(-1.6 t) at t = 100 s
        EXPECT_NEAR(-in_bottom / exact, 1.0, 1e-10) << "m = " << m;
      }
  }

  // ---------------------------------------------------------------------------------------------
  // Values against time from tables; D as an expression of T.

  // A diffusivity table D(t) = 1 + t m2/s between its rows at 0 and 1 s, constant 2 m2/s after the
  // last (README, "Values against time from a table"), run to 2 s: for a diffusivity uniform in
  // space the field depends on t only through B = int D dt (the change of time variable for a
  // time-dependent D, Crank 1975 ch. 2, section from memory; as in schedule_stages_test.cc),
  // here B = 1.5 + 2 = 3.5 m2. So the run equals the constant D = 1 m2/s run to 3.5 s (the solver
  // steps in B, README, so to round-off), and both equal erfc(x / (2 sqrt(B))) (Crank 1975 eq. 2.45).
  TEST(Features, DiffusivityTableEqualsTheSameDtBudget)
  {
    const std::string table = scratch_folder("features_d_table") + "/diffusivity.csv";
    std::ofstream(table) << "time [s], value [m2/s]\n0, 1\n1, 2\n";
    const std::string common = "[geometry]\nlayers = medium 20 m\ncell_size = 0.05 m\n[boundary.top]\n"
                               "type = concentration\nvalue = 1 mol/m3\n[output]\nfields = false\npoint.a = 0.5 m\n"
                               "point.b = 1 m\npoint.c = 2 m\n";
    const std::string tabulated = "[case]\ntitle = diffusivity table\n" + common +
                                  "[region.medium]\ndiffusivity = file:" + table +
                                  "\n[time]\nend = 2 s\ntolerance = 1e-4\n";
    const std::string constant = "[case]\ntitle = constant diffusivity\n" + common +
                                 "[region.medium]\ndiffusivity = 1 m2/s\n[time]\nend = 3.5 s\ntolerance = 1e-4\n";
    CaseDescription a, b;
    RunRecord ra, rb;
    if (!run_named(tabulated, "features_d_table_run", a, ra) ||
        !run_named(constant, "features_d_table_reference", b, rb))
      return;
    const double budget = 3.5;
    const std::vector<double> x{0.5, 1, 2};
    for (std::size_t k = 0; k < x.size(); ++k)
      {
        const double exact = boost::math::erfc(x[k] / (2 * std::sqrt(budget)));
        std::printf("diffusivity table: c(%g m) = %.12f, constant D at the same budget %.12f, erfc %.12f\n", x[k],
                    ra.points[k].final_value, rb.points[k].final_value, exact);
        EXPECT_NEAR(ra.points[k].final_value / rb.points[k].final_value, 1.0, 1e-9) << "at " << x[k] << " m";
        // Step tolerance 1e-4 (each step of a time-dependent D costs 0.3 s today: the clock's
        // adaptive quadrature; see the closing note of issue 24): step error up to ~1e-4.
        EXPECT_NEAR(ra.points[k].final_value, exact, 1e-3) << "at " << x[k] << " m";
      }
  }

  // An ambient concentration from a table (units in the header: ms and umol/mL = mol/m3) rising
  // linearly, a(t) = k t with k = 2 mol/(m3 s), on a concentration face of a medium with K = 2, so
  // the face holds c = K k t. Surface concentration proportional to t (Crank 1975 ch. 2, surface
  // concentration varying with time; Carslaw & Jaeger 1959 sec. 2.5; section numbers from memory):
  // c = K k t 4 i^2erfc(eta) = K k t [(1 + 2 eta^2) erfc(eta) - (2 / sqrt(pi)) eta exp(-eta^2)],
  // eta = x / (2 sqrt(D t)), and the amount taken up M = (4/3) K k sqrt(D / pi) t^(3/2).
  // D = 1 m2/s, t = 1 s, domain 12 m. Ignoring K halves everything; a table read in the wrong
  // units is off by 1000.
  TEST(Features, AmbientTableRampMatchesCrank)
  {
    const std::string table = scratch_folder("features_ambient_table") + "/ramp.csv";
    std::ofstream(table) << "time [ms], value [umol/mL]\n0, 0\n1000, 2\n";
    const std::string text = "[case]\ntitle = ambient ramp\n[geometry]\nlayers = medium 12 m\ncell_size = 0.05 m\n"
                             "[region.medium]\ndiffusivity = 1 m2/s\npartition = 2\n[initial]\nvalue = 0 mol/m3\n"
                             "[boundary.top]\ntype = concentration\nambient = file:" +
                             table +
                             "\n[time]\nend = 1 s\ntolerance = 1e-6\n[output]\nfields = false\npoint.surface = 0 m\n"
                             "point.a = 0.5 m\npoint.b = 1 m\n";
    CaseDescription description;
    RunRecord record;
    if (!run_named(text, "features_ambient_table_run", description, record))
      return;
    const double scale = 2 * 2; // K k t at t = 1 s
    auto exact = [&](const double x) {
      const double eta = x / 2;
      return scale * ((1 + 2 * eta * eta) * boost::math::erfc(eta) - 2 / std::sqrt(pi) * eta * std::exp(-eta * eta));
    };
    const std::vector<double> x{0, 0.5, 1};
    for (std::size_t k = 0; k < x.size(); ++k)
      {
        std::printf("ambient table: c(%g m) = %.10f (exact %.10f)\n", x[k], record.points[k].final_value, exact(x[k]));
        EXPECT_NEAR(record.points[k].final_value, exact(x[k]), 5e-5 * scale) << "at " << x[k] << " m";
      }
    const CsvTable series = read_csv(description.output.folder + "/series.csv");
    const double uptake = series.column("amount.total").back(), uptake_exact = 4.0 / 3.0 * scale / std::sqrt(pi);
    std::printf("ambient table: uptake %.10f (exact %.10f, relative %.2e)\n", uptake, uptake_exact,
                uptake / uptake_exact - 1);
    EXPECT_NEAR(uptake / uptake_exact, 1.0, 1e-4);
  }

  // A source from a table, 0 at t = 0 rising to 2 mol/(m3 h) at 10 h, constant after, in a sealed
  // slab of 0.5 m: the amount is the slab thickness times the integral of the source (exact by
  // conservation, common practice): 0.5 x 2 t^2 / (2 x 10 h) up to 10 h, then 0.5 x 2 (5 h + t - 10 h),
  // in mol/(m2) with t in hours; 15 mol/m2 at 20 h. Crank-Nicolson without start steps integrates a
  // piecewise-linear source exactly when a step lands on the kink (the output time at 10 h), as in
  // the tabulated-flux test of conservation_test.cc.
  TEST(Features, SourceTableIntegratesExactly)
  {
    const std::string table = scratch_folder("features_source_table") + "/source.csv";
    std::ofstream(table) << "time [h], value [mol/(m3 h)]\n0, 0\n10, 2\n";
    const std::string text = "[case]\ntitle = tabulated source\n[geometry]\nlayers = slab 0.5 m\ncell_size = 5 cm\n"
                             "[region.slab]\ndiffusivity = 1e-8 m2/s\nsource = file:" +
                             table +
                             "\n[initial]\nvalue = 0 mol/m3\n[time]\nend = 20 h\nscheme = crank_nicolson\n"
                             "start_steps = 0\n[output]\nfields = false\ntimes = 10 h\n";
    CaseDescription description;
    RunRecord record;
    if (!run_named(text, "features_source_table_run", description, record))
      return;
    const CsvTable series = read_csv(description.output.folder + "/series.csv");
    const auto &time = series.column("time");
    const auto &amount = series.column("amount.total");
    const auto &source = series.column("source.total");
    const double rate = 2.0 / 3600, ramp = 36000, thickness = 0.5; // mol/(m3 s), s, m
    auto expected = [&](const double t) {
      return thickness * rate * (t <= ramp ? t * t / (2 * ramp) : ramp / 2 + (t - ramp));
    };
    const double final_amount = expected(72000);
    EXPECT_NEAR(final_amount, 15.0, 1e-12); // the hand value
    (void)row_at(series, ramp);             // a step must land on the kink
    for (std::size_t i = 0; i < time.size(); ++i)
      {
        EXPECT_NEAR(amount[i], expected(time[i]), 1e-10 * final_amount) << "at t = " << time[i] << " s";
        EXPECT_NEAR(source[i], expected(time[i]), 1e-10 * final_amount) << "at t = " << time[i] << " s";
      }
    std::printf("source table: amount at 10 h %.12f (5), at 20 h %.12f (15)\n", amount[row_at(series, ramp)],
                amount.back());
  }

  // D as an expression of the temperature: D = (T / 300 K)^2 m2/s with T ramping from 300 K to
  // 600 K in 1 s, so D = (1 + t)^2 and B = int_0^1 D dt = 7/3 m2. D uniform in space depends on
  // time only: the field equals the constant D = 1 m2/s run to 7/3 s (the change of time variable,
  // "Dt budget": Plummer, Deal & Griffin, Silicon VLSI Technology, 2000, ch. 7; Crank 1975 ch. 2),
  // and erfc(x / (2 sqrt(B))) (Crank 1975 eq. 2.45). Reading T as 0 or as degC fails both.
  TEST(Features, DiffusivityExpressionOfTemperatureEqualsTheSameDtBudget)
  {
    const std::string common = "[geometry]\nlayers = medium 20 m\ncell_size = 0.05 m\n[boundary.top]\n"
                               "type = concentration\nvalue = 1 mol/m3\n[output]\nfields = false\npoint.a = 0.5 m\n"
                               "point.b = 1 m\npoint.c = 2 m\n";
    const std::string scheduled = "[case]\ntitle = D of T\n" + common +
                                  "[region.medium]\ndiffusivity = {(T/300)^2} m2/s\n[temperature]\n"
                                  "schedule = 300 K, ramp to 600 K in 1 s\n[time]\nend = 1 s\ntolerance = 1e-4\n";
    const double budget = 7.0 / 3.0;
    const std::string constant = "[case]\ntitle = constant D\n" + common +
                                 "[region.medium]\ndiffusivity = 1 m2/s\n[time]\nend = " + num(budget) +
                                 " s\ntolerance = 1e-4\n";
    CaseDescription a, b;
    RunRecord ra, rb;
    if (!run_named(scheduled, "features_d_of_t", a, ra) || !run_named(constant, "features_d_of_t_reference", b, rb))
      return;
    const std::vector<double> x{0.5, 1, 2};
    for (std::size_t k = 0; k < x.size(); ++k)
      {
        const double exact = boost::math::erfc(x[k] / (2 * std::sqrt(budget)));
        std::printf("D(T): c(%g m) = %.12f, constant D at the same budget %.12f, erfc %.12f\n", x[k],
                    ra.points[k].final_value, rb.points[k].final_value, exact);
        EXPECT_NEAR(ra.points[k].final_value / rb.points[k].final_value, 1.0, 1e-9) << "at " << x[k] << " m";
        // Step tolerance 1e-4 (each step of a time-dependent D costs 0.3 s today: the clock's
        // adaptive quadrature; see the closing note of issue 24): step error up to ~1e-4.
        EXPECT_NEAR(ra.points[k].final_value, exact, 1e-3) << "at " << x[k] << " m";
      }
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
