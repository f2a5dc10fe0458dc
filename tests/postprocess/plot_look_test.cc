// fickcast's plot look, applied in one place (plot_writer): the power of ten goes into the axis
// label, the frame keeps the full width with the legend below it, ticks point outwards.
// Read back from the PNG the writer produced, pixel by pixel.
#include "plot_writer.h"

#include "case_runner.h"

#include <vtkImageData.h>
#include <vtkPNGReader.h>
#include <vtkSmartPointer.h>

#include <gtest/gtest.h>

#include <array>
#include <cmath>
#include <string>

namespace fickcast::post
{
  namespace
  {
    struct Picture
    {
      vtkSmartPointer<vtkImageData> image;
      int width = 0, height = 0;

      explicit Picture(const std::string &png)
      {
        auto reader = vtkSmartPointer<vtkPNGReader>::New();
        reader->SetFileName(png.c_str());
        reader->Update();
        image = reader->GetOutput();
        int dims[3];
        image->GetDimensions(dims);
        width = dims[0];
        height = dims[1];
      }
      /// Colour at column x, row y counted from the top of the picture.
      std::array<int, 3> at(const int x, const int y) const
      {
        const auto *p = static_cast<unsigned char *>(image->GetScalarPointer(x, height - 1 - y, 0));
        return {p[0], p[1], p[2]};
      }
      bool is(const int x, const int y, const std::array<int, 3> &colour, const int slack = 40) const
      {
        const auto c = at(x, y);
        return std::abs(c[0] - colour[0]) + std::abs(c[1] - colour[1]) + std::abs(c[2] - colour[2]) <= slack;
      }
    };

    constexpr std::array<int, 3> black{0, 0, 0}, first_curve{0, 114, 178};

    /// Three curves with long labels (a legend beside the frame would need a third of the width).
    PlotSpec three_curves()
    {
      PlotSpec spec;
      spec.title = "Look check";
      spec.subject = "invented numbers";
      spec.x_label = "depth [m]";
      spec.y_label = "concentration [1/cm3]";
      for (int k = 0; k < 3; ++k)
        {
          PlotCurve curve;
          curve.label = "a long legend label for curve number " + std::to_string(k + 1);
          for (int i = 0; i <= 100; ++i)
            {
              curve.x.push_back(i * 1e-3);
              curve.y.push_back(3e18 * std::exp(-i * (k + 1) / 40.0));
            }
          spec.curves.push_back(curve);
        }
      return spec;
    }
  } // namespace

  // The common power of ten: a multiple of 3 that leaves at most three digits before the point;
  // plain numbers from 0.01 to 9999 keep no exponent (common practice for readable axes).
  TEST(PlotLook, PowerOfTenGoesIntoTheAxisLabel)
  {
    EXPECT_EQ(axis_exponent(0, 3.2e18), 18);
    EXPECT_EQ(axis_exponent(0, 9.9e18), 18);
    EXPECT_EQ(axis_exponent(0, 1.1e19), 18);
    EXPECT_EQ(axis_exponent(-4.5e-5, 0), -6);
    EXPECT_EQ(axis_exponent(0, 250), 0);
    EXPECT_EQ(axis_exponent(0, 0.05), 0);
    EXPECT_EQ(axis_exponent(0, 12000), 3);
    EXPECT_EQ(axis_exponent(0, 0), 0);
    EXPECT_EQ(label_with_exponent("concentration [1/cm3]", 18), "concentration [10#u18#d 1/cm3]");
    EXPECT_EQ(label_with_exponent("released fraction", -3), "released fraction [10#u-3#d]");
    EXPECT_EQ(label_with_exponent("time [yr]", 0), "time [yr]");
  }

  TEST(PlotLook, FrameSpansTheWidthLegendBelowTicksOutwards)
  {
    const std::string stem = testing::scratch_folder("post_plot_look") + "/look";
    ASSERT_TRUE(write_plot(three_curves(), stem, {true, false}));
    const Picture picture(stem + ".png");
    ASSERT_GT(picture.width, 500);

    // The frame: its right edge is the right-most column that is drawn over most of the plot's
    // height, its bottom edge the lowest row drawn over most of the width.
    auto drawn = [&](const int x, const int y) {
      const auto c = picture.at(x, y);
      return c[0] + c[1] + c[2] < 660;
    };
    int right = -1, bottom = -1;
    for (int x = picture.width - 1; x >= 0 && right < 0; --x)
      {
        int count = 0;
        for (int y = picture.height / 5; y < picture.height * 3 / 5; ++y)
          count += drawn(x, y) ? 1 : 0;
        if (count > picture.height * 3 / 10)
          right = x;
      }
    for (int y = picture.height - 1; y >= 0 && bottom < 0; --y)
      {
        int count = 0;
        for (int x = picture.width / 5; x < picture.width * 4 / 5; ++x)
          count += drawn(x, y) ? 1 : 0;
        if (count > picture.width / 2)
          bottom = y;
      }
    std::printf("picture %dx%d, frame right edge at x = %d, bottom edge at y = %d\n", picture.width, picture.height,
                right, bottom);
    ASSERT_GT(bottom, 0);
    // The frame keeps (nearly) the whole width: no legend beside it.
    EXPECT_GT(right, 0.9 * picture.width);

    // The legend lies below the frame: the first curve's colour appears below the x axis
    // numbers and label, and never right of the frame.
    long legend_pixels = 0, beside_pixels = 0;
    for (int y = bottom + 40; y < picture.height; ++y)
      for (int x = 0; x < picture.width; ++x)
        legend_pixels += picture.is(x, y, first_curve) ? 1 : 0;
    for (int y = 0; y < picture.height; ++y)
      for (int x = right + 2; x < picture.width; ++x)
        beside_pixels += picture.is(x, y, first_curve) ? 1 : 0;
    EXPECT_GT(legend_pixels, 20);
    EXPECT_EQ(beside_pixels, 0);

    // Ticks point outwards: dark pixels just below the bottom edge (tick marks), none just
    // above it inside the frame (the grid there is light grey, the curves have decayed away
    // from the bottom right).
    long outside = 0, inside = 0;
    for (int x = static_cast<int>(0.55 * picture.width); x < right - 4; ++x)
      for (int d = 3; d <= 6; ++d)
        {
          outside += picture.is(x, bottom + d, black, 300) ? 1 : 0;
          inside += picture.is(x, bottom - d, black, 300) ? 1 : 0;
        }
    std::printf("dark pixels just outside the bottom edge: %ld, just inside: %ld\n", outside, inside);
    EXPECT_GT(outside, 8);
    EXPECT_EQ(inside, 0);
  }

  // A depth against time is drawn growing downward (as a section is): a rising curve runs from
  // the top left to the bottom right of the frame; without `downward` it runs the other way.
  TEST(PlotLook, DepthAxisGrowsDownward)
  {
    for (const bool downward : {true, false})
      {
        PlotSpec spec;
        spec.title = "Depth check";
        spec.x_label = "time [h]";
        spec.y_label = "depth [m]";
        spec.downward = downward;
        PlotCurve curve{"depth", {}, {}};
        for (int i = 0; i <= 50; ++i)
          {
            curve.x.push_back(i);
            curve.y.push_back(i * 0.02);
          }
        spec.curves.push_back(curve);
        const std::string stem =
          testing::scratch_folder(std::string("post_plot_depth_") + (downward ? "down" : "up")) + "/depth";
        ASSERT_TRUE(write_plot(spec, stem, {true, false}));
        const Picture picture(stem + ".png");
        // Mean row of the curve's colour in the left and the right fifth of the picture (above the legend).
        auto mean_row = [&](const int from, const int to) {
          double sum = 0;
          long n = 0;
          for (int x = from; x < to; ++x)
            for (int y = 0; y < picture.height * 4 / 5; ++y)
              if (picture.is(x, y, first_curve))
                {
                  sum += y;
                  ++n;
                }
          return n > 0 ? sum / n : std::nan("");
        };
        const double left = mean_row(picture.width / 5, picture.width * 2 / 5),
                     right = mean_row(picture.width * 3 / 5, picture.width * 4 / 5);
        std::printf("downward %d: curve at row %.0f on the left, %.0f on the right\n", downward, left, right);
        ASSERT_TRUE(std::isfinite(left) && std::isfinite(right));
        if (downward)
          EXPECT_LT(left + 50, right);
        else
          EXPECT_GT(left, right + 50);
      }
  }
} // namespace fickcast::post
