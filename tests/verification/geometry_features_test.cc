// README geometry features checked against exact values (issue 24, item 7).
// Hollow centres (cylinder and sphere), radial amounts, fluxes and depths, axisymmetric side
// coatings, `geometry.refine` and Gmsh 2.2 files: features that had no check able to catch a
// wrong answer.
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
  using feature_cases::num;
  using feature_cases::pi;
  using feature_cases::run_named;

  namespace
  {
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

} // namespace fickcast::testing
