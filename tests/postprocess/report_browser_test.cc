// The HTML report renders in a real browser (Debian's headless Chromium): every image loads,
// the console stays silent, and the screenshot shows a drawn page, not a blank one.
#include "case_runner.h"

#include "html_page.h"
#include "output_file.h"
#include "report.h"

#include <vtkImageData.h>
#include <vtkPNGReader.h>
#include <vtkSmartPointer.h>

#include <gtest/gtest.h>

#include <cstdio>
#include <cstdlib>
#include <filesystem>
#include <fstream>
#include <regex>
#include <set>
#include <sstream>

#ifndef FICKCAST_CHROMIUM
#define FICKCAST_CHROMIUM "/usr/bin/chromium"
#endif

namespace fickcast::post
{
  namespace
  {
    const char *report_case = R"(
[case]
title = Report check: two layers with a sampling line (invented numbers)
[geometry]
layers = coat 0.2 m, core 0.8 m
cell_size = 0.02 m
[region.coat]
diffusivity = 2e-3 m2/s
porosity = 0.4
[region.core]
diffusivity = 1e-2 m2/s
[boundary.top]
type = concentration
value = 3 mg/L
[time]
end = 20 s
[output]
fields_every = 5 s
point.middle = 0.5 m
threshold.middle = 0.5 mg/L
line.depth = 0 m to 1 m
samples.depth = 51
)";

    /// Runs chromium headless with @p arguments on @p page; returns its stdout, stderr in @p log.
    std::string chromium(const std::string &arguments, const std::string &page, const std::string &scratch,
                         std::string &log)
    {
      static int call = 0;
      const std::string profile = scratch + "/profile" + std::to_string(call++);
      const std::string out = scratch + "/chromium.out", err = scratch + "/chromium.err";
      const std::string command =
        std::string(FICKCAST_CHROMIUM) +
        " --headless --no-sandbox --disable-gpu --disable-background-networking --disable-component-update"
        " --disable-sync --no-first-run --user-data-dir=" +
        profile + " --enable-logging=stderr --v=0 --virtual-time-budget=5000 " + arguments + " file://" + page + " >" +
        out + " 2>" + err;
      const int status = std::system(command.c_str());
      EXPECT_EQ(status, 0) << command;
      std::ifstream error_stream(err);
      std::stringstream e;
      e << error_stream.rdbuf();
      log = e.str();
      std::ifstream output_stream(out);
      std::stringstream o;
      o << output_stream.rdbuf();
      return o.str();
    }

    /// Console messages in Chromium's log. Found empirically with Chromium 156: both
    /// console.error and uncaught exceptions are logged as `INFO:CONSOLE` lines (an uncaught
    /// one says "Uncaught"); our pages log nothing, so any console line is a failure.
    std::vector<std::string> console_lines(const std::string &log)
    {
      std::vector<std::string> lines;
      std::istringstream in(log);
      std::string line;
      while (std::getline(in, line))
        if (line.find(":CONSOLE") != std::string::npos || line.find("Uncaught") != std::string::npos)
          lines.push_back(line);
      return lines;
    }

    std::string images_ok(const std::string &dom)
    {
      std::smatch match;
      const std::regex attribute("<body[^>]*data-images-ok=\"([0-9]+/[0-9]+)\"");
      return std::regex_search(dom, match, attribute) ? match[1].str() : "";
    }
  } // namespace

  TEST(ReportBrowser, RendersWithAllImagesAndNoConsoleErrors)
  {
    ASSERT_TRUE(std::filesystem::exists(FICKCAST_CHROMIUM))
      << FICKCAST_CHROMIUM << " is missing: install Debian's chromium (listed in .ci/debian-packages)";
    const CaseDescription description = testing::describe(report_case, "post_report_browser");
    ASSERT_EQ(testing::run(description).status, "completed");
    const std::string folder = description.output.folder;
    const std::string scratch = std::filesystem::path(folder).parent_path().string();
    const ReportOutcome outcome = make_report(folder, {});
    ASSERT_TRUE(std::filesystem::is_regular_file(outcome.html));
    std::size_t pngs = 0;
    for (const auto &image : outcome.images)
      {
        EXPECT_TRUE(std::filesystem::is_regular_file(image)) << image;
        pngs += image.size() > 4 && image.substr(image.size() - 4) == ".png" ? 1 : 0;
      }
    // Profile along the line, point history, amounts (no released fraction: the body starts empty).
    EXPECT_EQ(pngs, 3u);
    for (const char *stem : {"profile_depth.png", "points.png", "amounts.png"})
      EXPECT_TRUE(std::filesystem::is_regular_file(folder + "/report/" + stem)) << stem;

    // Images load: the page's own script counts them after load.
    std::string log;
    const std::string dom = chromium("--dump-dom", outcome.html, scratch, log);
    EXPECT_EQ(images_ok(dom), std::to_string(pngs) + "/" + std::to_string(pngs));
    EXPECT_NE(dom.find("Cautions"), std::string::npos);
    EXPECT_NE(dom.find("do not replace"), std::string::npos);
    EXPECT_TRUE(console_lines(log).empty()) << console_lines(log).front();

    // Screenshot: a drawn page has many colours and a fair share of non-white pixels.
    const std::string shot = scratch + "/report.png";
    chromium("--window-size=1200,2000 --screenshot=" + shot, outcome.html, scratch, log);
    EXPECT_TRUE(console_lines(log).empty()) << console_lines(log).front();
    ASSERT_TRUE(std::filesystem::is_regular_file(shot));
    auto reader = vtkSmartPointer<vtkPNGReader>::New();
    reader->SetFileName(shot.c_str());
    reader->Update();
    vtkImageData *image = reader->GetOutput();
    int dims[3];
    image->GetDimensions(dims);
    const int components = image->GetNumberOfScalarComponents();
    ASSERT_GE(components, 3);
    std::set<long> colours;
    long non_white = 0, pixels = 0;
    for (int y = 0; y < dims[1]; ++y)
      for (int x = 0; x < dims[0]; ++x)
        {
          const auto *p = static_cast<unsigned char *>(image->GetScalarPointer(x, y, 0));
          colours.insert((long(p[0]) << 16) | (long(p[1]) << 8) | long(p[2]));
          non_white += (p[0] < 245 || p[1] < 245 || p[2] < 245) ? 1 : 0;
          ++pixels;
        }
    const double fraction = static_cast<double>(non_white) / static_cast<double>(pixels);
    std::printf("screenshot %dx%d: %zu distinct colours, %.1f %% non-white pixels, images %s\n", dims[0], dims[1],
                colours.size(), 100 * fraction, images_ok(dom).c_str());
    EXPECT_EQ(dims[0], 1200);
    EXPECT_GE(colours.size(), 16u);
    EXPECT_GT(fraction, 0.03);
  }

  // The checks above can fail: a page with a missing image and a script error is caught.
  TEST(ReportBrowser, DetectorsCatchABrokenPage)
  {
    ASSERT_TRUE(std::filesystem::exists(FICKCAST_CHROMIUM))
      << FICKCAST_CHROMIUM << " is missing: install Debian's chromium (listed in .ci/debian-packages)";
    const std::string scratch = testing::scratch_folder("post_report_broken");
    const std::string page = scratch + "/broken.html";
    write_file(page, html_document("broken", "<p>x</p><img src=\"missing.png\" alt=\"missing\">"
                                             "<script>not_a_function();</script>"));
    std::string log;
    const std::string dom = chromium("--dump-dom", page, scratch, log);
    EXPECT_EQ(images_ok(dom), "0/1");
    EXPECT_FALSE(console_lines(log).empty());
  }
} // namespace fickcast::post
