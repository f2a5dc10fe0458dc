// The HTML report renders in a real browser (Debian's headless Chromium): every image loads,
// the console stays silent, the screenshot shows a drawn page, not a blank one, and its plots show
// curves: a page whose plot images are blank still has text and tables enough for the whole-page
// checks (measured on this report: 474 colours, 3.9 % non-white), so a plot check counts the
// pixels in the plot writer's curve colours, in each plot image and in the screenshot, and a
// negative control shows that blank plots fail it.
#include "case_runner.h"

#include "html_page.h"
#include "output_file.h"
#include "report.h"

#include "case/case_reader.h"
#include "studies/study_plan.h"
#include "studies/study_runner.h"

#include <vtkImageData.h>
#include <vtkPNGReader.h>
#include <vtkPNGWriter.h>
#include <vtkSmartPointer.h>

#include <gtest/gtest.h>

#include <algorithm>
#include <array>
#include <cstdio>
#include <cstdlib>
#include <filesystem>
#include <fstream>
#include <regex>
#include <sstream>
#include <vector>

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

    /// The screenshot: tall enough for the whole report (its three plots end near 4300 px at this
    /// width; at 2000 px only the top of the first plot was in view).
    const char *screenshot_size = "--window-size=1200,5000";

    /// Okabe & Ito's curve colours as postprocess/plot_writer.cc draws them (its seventh, black,
    /// left out: text, ticks and frames are black too).
    constexpr std::array<std::array<int, 3>, 6> curve_colours{
      {{0, 114, 178}, {213, 94, 0}, {0, 158, 115}, {204, 121, 167}, {230, 159, 0}, {86, 180, 233}}};

    /// What the checks read from a PNG (a plot image or a screenshot of the page).
    struct Look
    {
      int width = 0, height = 0;
      std::size_t colours = 0; ///< distinct RGB colours
      double non_white = 0;    ///< fraction of pixels with a channel below 245
      long curve_pixels = 0;   ///< pixels within an L1 distance of 40 of a curve colour
    };

    /// Reads @p png. The slack of 40 (as in plot_look_test.cc) takes the cores of the drawn lines
    /// and markers, not their anti-aliased edges; no colour of text, tables or grid comes near.
    Look look_at(const std::string &png)
    {
      Look look;
      if (!std::filesystem::is_regular_file(png))
        return look;
      auto reader = vtkSmartPointer<vtkPNGReader>::New();
      reader->SetFileName(png.c_str());
      reader->Update();
      vtkImageData *image = reader->GetOutput();
      int dims[3];
      image->GetDimensions(dims);
      look.width = dims[0];
      look.height = dims[1];
      if (image->GetNumberOfScalarComponents() < 3 || image->GetScalarType() != VTK_UNSIGNED_CHAR)
        return look; // greyscale or 16-bit: no curve colour to find (ours are 8-bit RGB)
      // One flag per RGB colour, to count the distinct ones.
      std::vector<bool> seen(1 << 24, false);
      long non_white = 0;
      for (int y = 0; y < dims[1]; ++y)
        for (int x = 0; x < dims[0]; ++x)
          {
            const auto *p = static_cast<unsigned char *>(image->GetScalarPointer(x, y, 0));
            const std::size_t colour = (std::size_t(p[0]) << 16) | (std::size_t(p[1]) << 8) | std::size_t(p[2]);
            look.colours += seen[colour] ? 0 : 1;
            seen[colour] = true;
            non_white += (p[0] < 245 || p[1] < 245 || p[2] < 245) ? 1 : 0;
            for (const auto &c : curve_colours)
              if (std::abs(p[0] - c[0]) + std::abs(p[1] - c[1]) + std::abs(p[2] - c[2]) <= 40)
                {
                  ++look.curve_pixels;
                  break;
                }
          }
      const long pixels = static_cast<long>(dims[0]) * dims[1];
      look.non_white = pixels > 0 ? static_cast<double>(non_white) / static_cast<double>(pixels) : 0.0;
      return look;
    }

    /// The whole-page check: many colours and a fair share of non-white pixels. Rendered text
    /// and tables alone pass it.
    bool page_drawn(const Look &shot)
    {
      return shot.width == 1200 && shot.colours >= 16 && shot.non_white > 0.03;
    }

    /// The plot checks, one threshold per plot image and one for the page. Measured on this
    /// report's plots (1000 x 640): 1558 curve pixels in the point history (one curve), 4218 in
    /// the amounts, 6702 in the profiles; 6606 in the 1200 x 5000 screenshot of the page (the
    /// browser scales the images by 0.99 and blends edges); 0 for blank plots. The minimum of 500
    /// per image is a third of the smallest, the page's 1500 is 500 for each of three plots.
    constexpr long minimum_curve_pixels_per_plot = 500, minimum_curve_pixels_on_page = 1500;

    bool plot_drawn(const Look &plot)
    {
      return plot.curve_pixels >= minimum_curve_pixels_per_plot;
    }
    bool plots_on_page_drawn(const Look &shot)
    {
      return shot.curve_pixels >= minimum_curve_pixels_on_page;
    }

    /// The PNG images among a report's images.
    std::vector<std::string> png_images(const ReportOutcome &outcome)
    {
      std::vector<std::string> pngs;
      for (const auto &image : outcome.images)
        if (image.size() > 4 && image.substr(image.size() - 4) == ".png")
          pngs.push_back(image);
      return pngs;
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
    for (const auto &image : outcome.images)
      EXPECT_TRUE(std::filesystem::is_regular_file(image)) << image;
    const auto plots = png_images(outcome);
    const std::size_t pngs = plots.size();
    // Profile along the line, point history, amounts, the uptake fraction (the body starts empty
    // under a held face: an uptake, no released fraction) and the rate through the open face.
    EXPECT_EQ(pngs, 5u);
    EXPECT_FALSE(std::filesystem::exists(folder + "/report/released_fraction.png"));
    for (const char *stem : {"profile_depth.png", "points.png", "amounts.png", "uptake_fraction.png", "rate_top.png"})
      EXPECT_TRUE(std::filesystem::is_regular_file(folder + "/report/" + stem)) << stem;
    // Each plot image shows curves in the plot palette.
    for (const auto &png : plots)
      {
        const Look plot = look_at(png);
        std::printf("plot %s: %dx%d, %ld curve pixels\n", png.c_str(), plot.width, plot.height, plot.curve_pixels);
        EXPECT_TRUE(plot_drawn(plot)) << png << ": " << plot.curve_pixels << " curve pixels, fewer than "
                                      << minimum_curve_pixels_per_plot;
      }

    // Images load: the page's own script counts them after load.
    std::string log;
    const std::string dom = chromium("--dump-dom", outcome.html, scratch, log);
    EXPECT_EQ(images_ok(dom), std::to_string(pngs) + "/" + std::to_string(pngs));
    EXPECT_NE(dom.find("Cautions"), std::string::npos);
    EXPECT_NE(dom.find("do not replace"), std::string::npos);
    EXPECT_TRUE(console_lines(log).empty()) << console_lines(log).front();

    // Screenshot: a drawn page has many colours and a fair share of non-white pixels, and its
    // plots show curves.
    const std::string shot_file = scratch + "/report.png";
    chromium(std::string(screenshot_size) + " --screenshot=" + shot_file, outcome.html, scratch, log);
    EXPECT_TRUE(console_lines(log).empty()) << console_lines(log).front();
    ASSERT_TRUE(std::filesystem::is_regular_file(shot_file));
    const Look shot = look_at(shot_file);
    std::printf("screenshot %dx%d: %zu distinct colours, %.1f %% non-white pixels, %ld curve pixels, images %s\n",
                shot.width, shot.height, shot.colours, 100 * shot.non_white, shot.curve_pixels, images_ok(dom).c_str());
    EXPECT_EQ(shot.width, 1200);
    EXPECT_GE(shot.colours, 16u);
    EXPECT_GT(shot.non_white, 0.03);
    EXPECT_TRUE(page_drawn(shot));
    EXPECT_TRUE(plots_on_page_drawn(shot))
      << shot.curve_pixels << " curve pixels on the page, fewer than " << minimum_curve_pixels_on_page;
  }

  // Negative control for the plots: the same report with every plot image replaced by a white
  // image of the same size (and embedded so in the page) still loads every image and still looks
  // drawn as a page, but fails the plot checks, per image and on the screenshot.
  TEST(ReportBrowser, PlotChecksFailOnBlankPlots)
  {
    ASSERT_TRUE(std::filesystem::exists(FICKCAST_CHROMIUM))
      << FICKCAST_CHROMIUM << " is missing: install Debian's chromium (listed in .ci/debian-packages)";
    const CaseDescription description = testing::describe(report_case, "post_report_blank_plots");
    ASSERT_EQ(testing::run(description).status, "completed");
    const std::string folder = description.output.folder;
    const std::string scratch = std::filesystem::path(folder).parent_path().string();
    const ReportOutcome outcome = make_report(folder, {});
    const auto plots = png_images(outcome);
    ASSERT_EQ(plots.size(), 5u);

    // Blank each plot: white, same size, written with VTK's PNG writer over the report's file.
    for (const auto &png : plots)
      {
        const Look drawn = look_at(png);
        ASSERT_TRUE(plot_drawn(drawn)) << png << " before blanking";
        auto white = vtkSmartPointer<vtkImageData>::New();
        white->SetDimensions(drawn.width, drawn.height, 1);
        white->AllocateScalars(VTK_UNSIGNED_CHAR, 3);
        auto *bytes = static_cast<unsigned char *>(white->GetScalarPointer());
        std::fill(bytes, bytes + 3L * drawn.width * drawn.height, static_cast<unsigned char>(255));
        auto writer = vtkSmartPointer<vtkPNGWriter>::New();
        writer->SetFileName(png.c_str());
        writer->SetInputData(white);
        writer->Write();
        ASSERT_EQ(writer->GetErrorCode(), 0u) << png;
        const Look blank = look_at(png);
        EXPECT_EQ(blank.width, drawn.width) << png;
        EXPECT_EQ(blank.height, drawn.height) << png;
        EXPECT_EQ(blank.curve_pixels, 0) << png;
        EXPECT_FALSE(plot_drawn(blank)) << png;
      }

    // The page embeds its images (data: URIs): embed the blank ones in their place, in order.
    std::string page = read_file(outcome.html, "the report page");
    const std::string prefix = "src=\"data:image/png;base64,";
    std::size_t at = 0, replaced = 0;
    while ((at = page.find(prefix, at)) != std::string::npos && replaced < plots.size())
      {
        const std::size_t close = page.find('"', at + prefix.size());
        ASSERT_NE(close, std::string::npos);
        const std::string tag = html_embedded_png(plots[replaced], "blank");
        const std::size_t src = tag.find("src=\"");
        const std::string blank_src = tag.substr(src, tag.find('"', src + 5) + 1 - src);
        page.replace(at, close + 1 - at, blank_src);
        at += blank_src.size();
        ++replaced;
      }
    ASSERT_EQ(replaced, plots.size());
    write_file(outcome.html, page);

    // The same browser checks as above, in one call.
    std::string log;
    const std::string shot_file = scratch + "/blank_plots.png";
    const std::string dom =
      chromium(std::string(screenshot_size) + " --dump-dom --screenshot=" + shot_file, outcome.html, scratch, log);
    EXPECT_EQ(images_ok(dom), "5/5"); // the blank images load: only their content is wrong
    EXPECT_TRUE(console_lines(log).empty()) << console_lines(log).front();
    ASSERT_TRUE(std::filesystem::is_regular_file(shot_file));
    const Look shot = look_at(shot_file);
    std::printf("blank plots: screenshot %dx%d, %zu distinct colours, %.1f %% non-white pixels (whole-page check "
                "%s), %ld curve pixels\n",
                shot.width, shot.height, shot.colours, 100 * shot.non_white, page_drawn(shot) ? "passed" : "failed",
                shot.curve_pixels);
    EXPECT_EQ(shot.width, 1200);
    EXPECT_FALSE(plots_on_page_drawn(shot)) << shot.curve_pixels << " curve pixels on a page of blank plots";
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

  namespace
  {
    /// A small liner for the study reports (invented numbers): clay over sand, a held top face.
    const char *study_case = R"(
[case]
title = Study report check: clay liner (invented numbers)
[geometry]
layers = clay 0.8 m, sand 0.4 m
cell_size = 0.02 m
[region.clay]
diffusivity = 1.9e-9 m2/s
porosity = 0.38
tortuosity = 0.33
[region.sand]
diffusivity = 1.9e-9 m2/s
[boundary.top]
type = concentration
value = 1500 mg/L
[time]
end = 25 yr
tolerance = 1e-3
[output]
fields = false
point.base = end of clay
threshold.base = 250 mg/L
)";

    /// Runs the study @p sweep_section of study_case into @p name/study, makes its report, and
    /// checks it in Chromium: every image loads, no console line, the screenshot is drawn with
    /// curves. Returns the page as Chromium saw it.
    std::string study_report_in_browser(const std::string &sweep_section, const std::string &name, std::size_t &images)
    {
      const std::string file = testing::write_case(std::string(study_case) + sweep_section, name);
      const CaseDescription base = read_case(file);
      StudyOptions options;
      options.case_file = file;
      options.folder = file.substr(0, file.rfind('/')) + "/study";
      options.overwrite = true;
      run_study(base, plan_study(base), options, MPI_COMM_SELF, {});
      const ReportOutcome outcome = make_study_report(options.folder, {});
      const auto plots = png_images(outcome);
      images = plots.size();
      // Each plot shows curves or marks in the palette; a scatter of a dozen cases has fewer such
      // pixels than a curve (about 600 measured), hence a lower bar than plot_drawn's.
      for (const auto &png : plots)
        {
          const long pixels = look_at(png).curve_pixels;
          EXPECT_GT(pixels, 200) << png;
          std::printf("plot %s: %ld curve pixels\n", std::filesystem::path(png).filename().c_str(), pixels);
        }
      const std::string scratch = options.folder;
      std::string log;
      const std::string dom = chromium("--dump-dom", outcome.html, scratch, log);
      EXPECT_EQ(images_ok(dom), std::to_string(images) + "/" + std::to_string(images));
      EXPECT_TRUE(console_lines(log).empty()) << console_lines(log).front();
      const std::string shot_file = scratch + "/report.png";
      chromium(std::string(screenshot_size) + " --screenshot=" + shot_file, outcome.html, scratch, log);
      const Look shot = look_at(shot_file);
      std::printf("%s: screenshot %dx%d, %zu colours, %.1f %% non-white, %ld curve pixels, images %s\n", name.c_str(),
                  shot.width, shot.height, shot.colours, 100 * shot.non_white, shot.curve_pixels,
                  images_ok(dom).c_str());
      EXPECT_TRUE(page_drawn(shot));
      EXPECT_TRUE(plots_on_page_drawn(shot));
      return dom;
    }

    /// The cells of the table row whose first cell is @p first (tags stripped), empty if none.
    std::vector<std::string> table_row(const std::string &dom, const std::string &first)
    {
      const std::regex row("<tr>(.*?)</tr>");
      const std::regex cell("<t[dh][^>]*>(.*?)</t[dh]>");
      for (auto r = std::sregex_iterator(dom.begin(), dom.end(), row); r != std::sregex_iterator(); ++r)
        {
          const std::string text = (*r)[1].str();
          std::vector<std::string> cells;
          for (auto c = std::sregex_iterator(text.begin(), text.end(), cell); c != std::sregex_iterator(); ++c)
            cells.push_back((*c)[1].str());
          if (!cells.empty() && cells.front() == first)
            return cells;
        }
      return {};
    }
  } // namespace

  // A what-if grid (2 x 3 cases) is reported as one: no mean or percentiles, each result against
  // each parameter with one line per value of the other, the case title as heading.
  TEST(ReportBrowser, WhatIfGridReport)
  {
    std::size_t images = 0;
    const std::string dom = study_report_in_browser(
      "[sweep]\nvary.region.clay.tortuosity = 0.2, 0.4, 0.8\nvary.layer.clay.thickness = 0.5 m, 0.8 m\n",
      "post_report_grid", images);
    EXPECT_NE(dom.find("<h1>Study report check: clay liner (invented numbers)</h1>"), std::string::npos);
    EXPECT_NE(dom.find("What-if study: 6 cases"), std::string::npos);
    EXPECT_EQ(dom.find("Uncertainty study"), std::string::npos);
    EXPECT_EQ(dom.find("<th>P95</th>"), std::string::npos) << "a grid has no percentiles";
    EXPECT_EQ(table_row(dom, "threshold.base").size(), 5u) << "result, unit, cases, smallest, largest";
    EXPECT_NE(dom.find("one line per value of the other varied parameters"), std::string::npos);
    EXPECT_EQ(images, 8u); // 4 results x 2 parameters (amount, point, threshold, uptake fraction)
  }

  // An uncertainty study's limit probability stands in the results table, in the case's units, on
  // the threshold's row; a rank-correlation chart per result says which inputs drive it.
  TEST(ReportBrowser, UncertaintyReportShowsTheLimitProbability)
  {
    std::size_t images = 0;
    const std::string dom = study_report_in_browser(
      "[sweep]\nsample.region.clay.tortuosity = lognormal(0.33, 0.3)\nsample.layer.clay.thickness = "
      "uniform(0.6 m, 1 m)\nsamples = 12\nseed = 5\nbelow.threshold.base = 10 yr\n",
      "post_report_uncertainty", images);
    EXPECT_NE(dom.find("Uncertainty study: 12 samples"), std::string::npos);
    const auto row = table_row(dom, "threshold.base");
    ASSERT_EQ(row.size(), 10u) << "result, unit, cases, mean, P5, P50, P95, smallest, largest, limit probability";
    std::printf("threshold.base row: limit probability '%s'\n", row[9].c_str());
    EXPECT_EQ(row[9].rfind("P(below 10 yr) = ", 0), 0u) << row[9];
    EXPECT_NE(row[9].find("n = 12"), std::string::npos) << row[9];
    EXPECT_NE(dom.find("Which inputs drive each result"), std::string::npos);
    EXPECT_NE(dom.find("What drives threshold.base"), std::string::npos);
  }

  // A 2-D run with a partition jump (a coat holding 50 times the core's concentration): the report
  // has a picture of the field (a map at the middle and the last output time) and profiles on a
  // logarithmic axis that say why, and it renders in Chromium.
  TEST(ReportBrowser, TwoDimensionalRunWithPartitionsHasFieldMaps)
  {
    ASSERT_TRUE(std::filesystem::exists(FICKCAST_CHROMIUM));
    const CaseDescription description = testing::describe(R"(
[case]
title = Report check: coated block in 2-D (invented numbers)
dimension = 2
[geometry]
layers = coat 0.1 m, core 0.4 m
width = 0.3 m
cell_size = 0.02 m
[region.coat]
diffusivity = 1e-3 m2/s
partition = 50
[region.core]
diffusivity = 1e-2 m2/s
[boundary.top]
type = concentration
ambient = 2 mg/L
[time]
end = 10 s
[output]
fields_every = 2.5 s
point.middle = 0.15 m, 0.3 m
)",
                                                          "post_report_two_d");
    ASSERT_EQ(testing::run(description).status, "completed");
    const std::string folder = description.output.folder;
    const ReportOutcome outcome = make_report(folder, {});
    const auto plots = png_images(outcome);
    std::size_t maps = 0;
    for (const auto &png : plots)
      if (std::filesystem::path(png).filename().string().rfind("field_map_", 0) == 0)
        {
          ++maps;
          const Look map = look_at(png);
          std::printf("map %s: %dx%d, %zu colours, %.1f %% non-white\n", png.c_str(), map.width, map.height,
                      map.colours, 100 * map.non_white);
          EXPECT_GE(map.colours, 12u) << png << ": the twelve bands of the ramp";
          EXPECT_GT(map.non_white, 0.15) << png;
        }
    EXPECT_EQ(maps, 2u) << "the middle and the last output time";
    const std::string html = read_file(outcome.html, "the report");
    EXPECT_NE(html.find("Logarithmic axis: the regions' partition coefficients differ more than tenfold"),
              std::string::npos);
    std::string log;
    const std::string scratch = std::filesystem::path(folder).parent_path().string();
    const std::string dom = chromium("--dump-dom", outcome.html, scratch, log);
    EXPECT_EQ(images_ok(dom), std::to_string(plots.size()) + "/" + std::to_string(plots.size()));
    EXPECT_TRUE(console_lines(log).empty()) << console_lines(log).front();
    const std::string shot_file = scratch + "/report_two_d.png";
    chromium(std::string(screenshot_size) + " --screenshot=" + shot_file, outcome.html, scratch, log);
    const Look shot = look_at(shot_file);
    std::printf("2-D report: screenshot %dx%d, %zu colours, %.1f %% non-white, images %s\n", shot.width, shot.height,
                shot.colours, 100 * shot.non_white, images_ok(dom).c_str());
    EXPECT_TRUE(page_drawn(shot));
  }
} // namespace fickcast::post
