#include "geometry/layer_spacing.h"

#include <gtest/gtest.h>

#include <algorithm>
#include <numeric>

namespace fickcast
{
  namespace
  {
    GeometrySpec two_layers()
    {
      GeometrySpec g;
      g.layers = {{"a", 0.3, 0}, {"b", 0.7, 0.05}};
      g.cell_size = 0.01;
      return g;
    }
  } // namespace

  TEST(LayerSpacing, FillsEachLayerExactly)
  {
    const AxisSpacing s = stack_spacing(two_layers());
    double a = 0, b = 0;
    for (std::size_t i = 0; i < s.sizes.size(); ++i)
      (s.layer_of_cell[i] == 0 ? a : b) += s.sizes[i];
    EXPECT_NEAR(a, 0.3, 1e-14);
    EXPECT_NEAR(b, 0.7, 1e-14);
    EXPECT_EQ(std::count(s.layer_of_cell.begin(), s.layer_of_cell.end(), 0u), 30);
    EXPECT_EQ(std::count(s.layer_of_cell.begin(), s.layer_of_cell.end(), 1u), 14);
  }

  TEST(LayerSpacing, GradingMakesCellsGrowAwayFromTheFace)
  {
    GeometrySpec g = two_layers();
    g.layers[1].cell_size = 0;
    g.grade_toward = Face::top;
    g.grading = 1.1;
    g.cell_size = 0.002;
    const AxisSpacing s = stack_spacing(g);
    EXPECT_NEAR(std::accumulate(s.sizes.begin(), s.sizes.end(), 0.0), 1.0, 1e-13);
    EXPECT_LT(s.sizes.front(), 0.0025);
    EXPECT_GT(s.sizes.back(), 10 * s.sizes.front());
    for (std::size_t i = 1; i < s.sizes.size(); ++i)
      if (s.layer_of_cell[i] == s.layer_of_cell[i - 1])
        EXPECT_LE(s.sizes[i] / s.sizes[i - 1], 1.12);
  }

  TEST(LayerSpacing, CoarseningKeepsLayerBoundaries)
  {
    const AxisSpacing fine = stack_spacing(two_layers());
    const AxisSpacing coarse = coarsen(fine, 2);
    double a = 0;
    for (std::size_t i = 0; i < coarse.sizes.size(); ++i)
      if (coarse.layer_of_cell[i] == 0)
        a += coarse.sizes[i];
    EXPECT_NEAR(a, 0.3, 1e-14);
    EXPECT_EQ(std::count(coarse.layer_of_cell.begin(), coarse.layer_of_cell.end(), 0u), 8); // ceil(30/4)
  }
  TEST(LayerSpacing, EstimateCountsWhatTheSpacingMakes)
  {
    // estimate_stack() guards against meshes that cannot fit (issue 14): it must count exactly
    // the cells stack_spacing() makes, without making them.
    GeometrySpec geometry;
    geometry.layers = {{"cap", 0.05e-6, 0}, {"silicon", 2e-6, 0}};
    geometry.cell_size = 5e-9;
    for (const double grading : {1.0, 1.05, 1.3})
      for (const Face face : {Face::top, Face::bottom})
        {
          geometry.grading = grading;
          geometry.grade_toward = grading == 1.0 ? Face::none : face;
          const AxisSpacing spacing = stack_spacing(geometry);
          const StackEstimate estimate = estimate_stack(geometry);
          EXPECT_EQ(estimate.cells, static_cast<double>(spacing.sizes.size())) << grading;
          const double largest = *std::max_element(spacing.sizes.begin(), spacing.sizes.end());
          EXPECT_DOUBLE_EQ(estimate.largest, largest) << grading;
        }
    // A 2 m column graded from 1 nm: a few hundred cells, not 2e9.
    geometry.layers = {{"column", 2.0, 0}};
    geometry.cell_size = 1e-9;
    geometry.grading = 1.1;
    geometry.grade_toward = Face::top;
    EXPECT_LT(estimate_stack(geometry).cells, 1000.0);
  }
} // namespace fickcast
