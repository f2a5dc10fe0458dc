#include "plot_writer.h"

#include "output_file.h"
#include "post_error.h"

#include <plplot/plplot.h>

#include <algorithm>
#include <array>
#include <cmath>
#include <cstdio>
#include <limits>
#include <mutex>
#include <tuple>

namespace fickcast::post
{
  namespace
  {
    /// Okabe & Ito's colour-blind-safe palette (without yellow, too faint on white), in RGB.
    constexpr std::array<std::array<int, 3>, 7> palette{
      {{0, 114, 178}, {213, 94, 0}, {0, 158, 115}, {204, 121, 167}, {230, 159, 0}, {86, 180, 233}, {0, 0, 0}}};
    /// Markers drawn as text (so the legend shows the same glyph); 8 of them against 7 colours.
    constexpr std::array<const char *, 8> markers{"○", "×", "□", "△", "+", "◇", "▽", "∗"};
    constexpr int colour_base = 8; // cmap0 indices 8.. hold the palette
    constexpr int grid_colour = 2, reference_colour = 3;

    std::mutex plplot_mutex; // PLplot keeps global state

    struct Range
    {
      double min = std::numeric_limits<double>::infinity();
      double max = -std::numeric_limits<double>::infinity();
      void add(const double v)
      {
        if (std::isfinite(v))
          {
            min = std::min(min, v);
            max = std::max(max, v);
          }
      }
      bool valid() const { return min <= max; }
      void pad(const double fraction)
      {
        if (max == min)
          {
            const double half = min == 0 ? 1 : 0.05 * std::abs(min);
            min -= half;
            max += half;
          }
        else
          {
            const double span = max - min;
            min -= fraction * span;
            max += fraction * span;
          }
      }
    };

    double value_of(const double v, const bool log)
    {
      if (!std::isfinite(v))
        return std::numeric_limits<double>::quiet_NaN();
      if (log)
        return v > 0 ? std::log10(v) : std::numeric_limits<double>::quiet_NaN();
      return v;
    }

    /// Draws the finite runs of a curve as separate lines.
    void draw_runs(const std::vector<double> &x, const std::vector<double> &y)
    {
      std::vector<PLFLT> rx, ry;
      auto flush = [&]() {
        if (rx.size() > 1)
          plline(static_cast<PLINT>(rx.size()), rx.data(), ry.data());
        rx.clear();
        ry.clear();
      };
      for (std::size_t i = 0; i < x.size(); ++i)
        {
          if (std::isfinite(x[i]) && std::isfinite(y[i]))
            {
              rx.push_back(x[i]);
              ry.push_back(y[i]);
            }
          else
            flush();
        }
      flush();
    }

    void render(const PlotSpec &spec, const std::string &device, const std::string &file)
    {
      PLINT previous = 0, stream = 0;
      plgstrm(&previous);
      plmkstrm(&stream);
      if (stream < 0)
        throw PostIoError("PLplot could not open a plot stream for " + file);
      plsdev(device.c_str());
      plsfnam(file.c_str());
      plspage(0, 0, 1000, 640, 0, 0);
      plscolbg(255, 255, 255);
      plscmap0n(colour_base + static_cast<PLINT>(palette.size()));
      plscol0(1, 0, 0, 0);
      plscol0(grid_colour, 225, 225, 225);
      plscol0(reference_colour, 110, 110, 110);
      for (std::size_t i = 0; i < palette.size(); ++i)
        plscol0(colour_base + static_cast<PLINT>(i), palette[i][0], palette[i][1], palette[i][2]);
      plinit();
      plfontld(1);
      plschr(0, 1.15);
      pladv(0);

      Range xr, yr;
      for (const auto &curve : spec.curves)
        for (std::size_t i = 0; i < curve.x.size(); ++i)
          if (std::isfinite(value_of(curve.y[i], spec.log_y)))
            {
              xr.add(curve.x[i]);
              yr.add(value_of(curve.y[i], spec.log_y));
            }
      if (spec.log_y && yr.valid())
        yr.min = std::max(yr.min, std::floor(yr.max) - 6.0); // six decades below the largest value
      xr.pad(0.02);
      yr.pad(0.05);

      // Room on the right for the legend, from its longest label (about 0.0105 of the width a character).
      std::size_t longest = 0;
      for (const auto &curve : spec.curves)
        longest = std::max(longest, curve.label.size());
      const double right = std::clamp(0.95 - (0.10 + 0.0105 * static_cast<double>(longest)), 0.50, 0.80);
      plvpor(0.13, right, 0.12, 0.87);
      plwind(xr.min, xr.max, yr.min, yr.max);
      const std::string ybox = spec.log_y ? "bcnstvl" : "bcnstv";
      plcol0(grid_colour);
      plwidth(1);
      plbox("g", 0, 0, "g", 0, 0);
      plcol0(1);
      plbox("bcnst", 0, 0, ybox.c_str(), 0, 0);
      pllab(spec.x_label.c_str(), spec.y_label.c_str(), "");
      plmtex("t", 2.0, 0.0, 0.0, spec.title.c_str());

      std::vector<PLINT> opts, line_colours, line_styles, symbol_colours, symbol_numbers, text_colours;
      std::vector<PLFLT> line_widths, symbol_scales;
      std::vector<const char *> texts, symbols;
      int index = 0;
      for (const auto &curve : spec.curves)
        {
          std::vector<double> x(curve.x), y(curve.y.size());
          for (std::size_t i = 0; i < y.size(); ++i)
            {
              y[i] = value_of(curve.y[i], spec.log_y);
              if (spec.log_y && y[i] < yr.min)
                y[i] = std::numeric_limits<double>::quiet_NaN(); // below the axis: left out
            }
          const PLINT colour =
            curve.reference ? reference_colour : colour_base + static_cast<PLINT>(index % palette.size());
          const PLINT style = curve.reference ? 2 : 1 + (index % 8);
          const char *marker = markers[static_cast<std::size_t>(index) % markers.size()];
          plcol0(colour);
          if (!curve.markers_only)
            {
              pllsty(style);
              plwidth(curve.reference ? 1.2 : 2.4);
              draw_runs(x, y);
              pllsty(1);
            }
          PLINT opt = curve.markers_only ? 0 : PL_LEGEND_LINE;
          if (!curve.reference)
            {
              // Markers at about nine evenly spaced abscissae (not every point), staggered per curve.
              std::vector<PLFLT> mx, my;
              if (curve.markers_only)
                {
                  for (std::size_t i = 0; i < x.size(); ++i)
                    if (std::isfinite(x[i]) && std::isfinite(y[i]))
                      {
                        mx.push_back(x[i]);
                        my.push_back(y[i]);
                      }
                }
              else
                {
                  std::size_t last = x.size();
                  for (int k = 0; k < 9; ++k)
                    {
                      const double target = xr.min + (k + 0.2 + 0.6 * ((index * 0.37) - std::floor(index * 0.37))) *
                                                       (xr.max - xr.min) / 9.0;
                      std::size_t best = x.size();
                      for (std::size_t i = 0; i < x.size(); ++i)
                        if (std::isfinite(x[i]) && std::isfinite(y[i]) &&
                            (best == x.size() || std::abs(x[i] - target) < std::abs(x[best] - target)))
                          best = i;
                      if (best < x.size() && best != last)
                        {
                          mx.push_back(x[best]);
                          my.push_back(y[best]);
                          last = best;
                        }
                    }
                }
              plschr(0, 1.0);
              if (!mx.empty())
                plstring(static_cast<PLINT>(mx.size()), mx.data(), my.data(), marker);
              plschr(0, 1.15);
              opt |= PL_LEGEND_SYMBOL;
              ++index;
            }
          opts.push_back(opt);
          texts.push_back(curve.label.c_str());
          text_colours.push_back(1);
          line_colours.push_back(colour);
          line_styles.push_back(style);
          line_widths.push_back(curve.reference ? 1.2 : 2.4);
          symbol_colours.push_back(colour);
          symbol_scales.push_back(1.0);
          symbol_numbers.push_back(curve.reference ? 0 : 1);
          symbols.push_back(curve.reference ? "" : marker);
        }
      PLFLT legend_width = 0, legend_height = 0;
      const PLINT n = static_cast<PLINT>(texts.size());
      plschr(0, 0.95);
      pllegend(&legend_width, &legend_height, PL_LEGEND_BACKGROUND | PL_LEGEND_BOUNDING_BOX,
               PL_POSITION_RIGHT | PL_POSITION_OUTSIDE, 0.02, 0.0, 0.06, 0, 1, 1, 0, 0, n, opts.data(), 1.0, 1.0, 2.0,
               0.0, text_colours.data(), texts.data(), nullptr, nullptr, nullptr, nullptr, line_colours.data(),
               line_styles.data(), line_widths.data(), symbol_colours.data(), symbol_scales.data(),
               symbol_numbers.data(), symbols.data());
      plend1();
      plsstrm(previous);
    }
  } // namespace

  bool cairo_devices_available()
  {
    const std::lock_guard<std::mutex> lock(plplot_mutex);
    std::vector<const char *> menu(128), names(128);
    PLINT n = static_cast<PLINT>(menu.size());
    const char **menu_list = menu.data(), **name_list = names.data(); // filled by PLplot
    plgDevs(&menu_list, &name_list, &n);
    bool png = false, svg = false;
    for (PLINT i = 0; i < n; ++i)
      {
        png = png || std::string(names[i]) == "pngcairo";
        svg = svg || std::string(names[i]) == "svgcairo";
      }
    return png && svg;
  }

  bool write_plot(const PlotSpec &spec, const std::string &stem, const PlotFormats &formats)
  {
    bool any = false;
    for (const auto &curve : spec.curves)
      for (std::size_t i = 0; i < curve.x.size() && i < curve.y.size(); ++i)
        any = any || (std::isfinite(curve.x[i]) && std::isfinite(value_of(curve.y[i], spec.log_y)) && !curve.reference);
    if (!any)
      return false;
    if (!cairo_devices_available())
      throw PostIoError("PLplot has no pngcairo/svgcairo device: install the Debian package plplot-driver-cairo");
    const std::lock_guard<std::mutex> lock(plplot_mutex);
    for (const auto &[wanted, device, extension] :
         {std::make_tuple(formats.png, "pngcairo", ".png"), std::make_tuple(formats.svg, "svgcairo", ".svg")})
      {
        if (!wanted)
          continue;
        const std::string path = stem + extension;
        const std::string partial = partial_name(path);
        render(spec, device, partial);
        publish_file(partial, path);
      }
    return true;
  }
} // namespace fickcast::post
