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
    constexpr int grid_colour = 2, reference_colour = 3, frame_colour = 4;

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
      plscol0(grid_colour, 232, 232, 232);
      plscol0(frame_colour, 150, 150, 150);
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
      xr.pad(std::any_of(spec.curves.begin(), spec.curves.end(), [](const PlotCurve &c) { return c.markers_only; })
               ? 0.05
               : 0.02);
      yr.pad(0.05);
      // One power of ten per axis, written into the label; the drawn numbers stay short.
      const int x_exponent = axis_exponent(xr.min, xr.max);
      const int y_exponent = spec.log_y ? 0 : axis_exponent(yr.min, yr.max);
      const double x_scale = std::pow(10.0, -x_exponent), y_scale = std::pow(10.0, -y_exponent);
      xr.min *= x_scale;
      xr.max *= x_scale;
      yr.min *= y_scale;
      yr.max *= y_scale;

      // The legend goes below the frame, in up to four columns; the frame keeps the full width.
      std::size_t n_entries = spec.curves.size(), longest = 0;
      for (const auto &curve : spec.curves)
        longest = std::max(longest, curve.label.size());
      const PLINT n_columns =
        static_cast<PLINT>(std::max<std::size_t>(1, std::min<std::size_t>({n_entries, 4, 90 / (longest + 8)})));
      const PLINT n_rows =
        static_cast<PLINT>((n_entries + static_cast<std::size_t>(n_columns) - 1) / static_cast<std::size_t>(n_columns));
      const double legend_room = 0.045 * n_rows;
      const double bottom = 0.13 + legend_room;
      plvpor(0.135, 0.96, bottom, 0.89);
      if (spec.downward)
        plwind(xr.min, xr.max, yr.max, yr.min);
      else
        plwind(xr.min, xr.max, yr.min, yr.max);
      plsxax(5, 0);
      plsyax(5, 0);
      plcol0(grid_colour);
      plwidth(1);
      plbox("g", 0, 0, "g", 0, 0);
      plcol0(frame_colour);
      plbox("bc", 0, 0, "bc", 0, 0); // the frame, no ticks
      plcol0(1);
      plbox("bnsti", 0, 0, spec.log_y ? "bnstvil" : "bnstvi", 0, 0); // ticks out, left and bottom only
      plmtex("b", 3.2, 0.5, 0.5, label_with_exponent(spec.x_label, x_exponent).c_str());
      plmtex("l", 5.0, 0.5, 0.5, label_with_exponent(spec.y_label, y_exponent).c_str());
      const std::string title_line = spec.subject.empty() ? spec.title : spec.title + "  \u2013  " + spec.subject;
      // One line: a long case title shrinks the line's characters rather than running off the page.
      // About 58 characters fit at full size (measured on the 1000 px page); beyond 116 (at the
      // smallest size) the line is cut. Characters, not bytes: UTF-8 continuation bytes not counted.
      std::string shown_title = title_line;
      auto characters = [](const std::string &text) {
        return static_cast<std::size_t>(std::count_if(
          text.begin(), text.end(), [](const char c) { return (static_cast<unsigned char>(c) & 0xC0) != 0x80; }));
      };
      if (characters(shown_title) > 116)
        {
          std::size_t end = 0;
          for (std::size_t n = 0; end < shown_title.size() && n <= 113; ++end)
            n += (static_cast<unsigned char>(shown_title[end]) & 0xC0) != 0x80 ? 1 : 0;
          shown_title = shown_title.substr(0, end - 1) + "...";
        }
      const double fits = 58.0 / static_cast<double>(std::max<std::size_t>(characters(shown_title), 1));
      plschr(0, 1.15 * std::clamp(fits, 0.5, 1.0));
      plmtex("t", 1.3, 0.0, 0.0, shown_title.c_str());
      plschr(0, 1.15);

      std::vector<PLINT> opts, line_colours, line_styles, symbol_colours, symbol_numbers, text_colours;
      std::vector<PLFLT> line_widths, symbol_scales;
      std::vector<const char *> texts, symbols;
      int index = 0;
      for (const auto &curve : spec.curves)
        {
          std::vector<double> x(curve.x), y(curve.y.size());
          for (auto &v : x)
            v *= x_scale;
          for (std::size_t i = 0; i < y.size(); ++i)
            {
              y[i] = value_of(curve.y[i], spec.log_y) * y_scale;
              if (spec.log_y && y[i] < yr.min)
                y[i] = std::numeric_limits<double>::quiet_NaN(); // below the axis: left out
            }
          const PLINT colour =
            curve.reference ? reference_colour : colour_base + static_cast<PLINT>(index % palette.size());
          const PLINT style = curve.reference ? 2 : 1 + (index % 8);
          const char *marker = markers[static_cast<std::size_t>(index) % markers.size()];
          plcol0(colour);
          if (curve.filled)
            {
              std::vector<PLFLT> fx, fy;
              for (std::size_t i = 0; i < x.size(); ++i)
                if (std::isfinite(x[i]) && std::isfinite(y[i]))
                  {
                    fx.push_back(x[i]);
                    fy.push_back(y[i]);
                  }
              if (fx.size() >= 3)
                plfill(static_cast<PLINT>(fx.size()), fx.data(), fy.data());
            }
          if (!curve.markers_only)
            {
              pllsty(style);
              plwidth(curve.reference ? 1.2 : 2.4);
              draw_runs(x, y);
              pllsty(1);
            }
          PLINT opt = curve.markers_only ? 0 : PL_LEGEND_LINE;
          if (curve.filled)
            ++index; // its own colour, no marker
          else if (!curve.reference)
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
          symbol_numbers.push_back(curve.reference || curve.filled ? 0 : 1);
          symbols.push_back(curve.reference || curve.filled ? "" : marker);
        }
      PLFLT legend_width = 0, legend_height = 0;
      const PLINT n = static_cast<PLINT>(texts.size());
      plschr(0, 0.95);
      // Below the frame, clear of the x numbers and label (offsets in viewport fractions).
      const double below = (0.125 / (0.89 - bottom));
      pllegend(&legend_width, &legend_height, PL_LEGEND_ROW_MAJOR, PL_POSITION_BOTTOM | PL_POSITION_OUTSIDE, 0.0, below,
               0.05, 0, 1, 1, n_rows, n_columns, n, opts.data(), 0.8, 0.9, 1.6, 0.0, text_colours.data(), texts.data(),
               nullptr, nullptr, nullptr, nullptr, line_colours.data(), line_styles.data(), line_widths.data(),
               symbol_colours.data(), symbol_scales.data(), symbol_numbers.data(), symbols.data());
      plend1();
      plsstrm(previous);
    }
  } // namespace

  int axis_exponent(const double low, const double high)
  {
    const double largest = std::max(std::abs(low), std::abs(high));
    if (!(largest > 0) || !std::isfinite(largest))
      return 0;
    const int e = static_cast<int>(std::floor(std::log10(largest)));
    if (e >= -2 && e <= 3)
      return 0;
    return 3 * static_cast<int>(std::floor(e / 3.0));
  }

  std::string label_with_exponent(const std::string &label, const int exponent)
  {
    if (exponent == 0)
      return label;
    const std::string power = "10#u" + std::to_string(exponent) + "#d";
    const auto open = label.rfind('[');
    if (open != std::string::npos && !label.empty() && label.back() == ']')
      return label.substr(0, open + 1) + power + " " + label.substr(open + 1);
    return label + " [" + power + "]";
  }

  void render_formats(const std::string &stem, const PlotFormats &formats,
                      const std::function<void(const std::string &device, const std::string &file)> &render)
  {
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
        render(device, partial);
        publish_file(partial, path);
      }
  }

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
    render_formats(stem, formats,
                   [&](const std::string &device, const std::string &file) { render(spec, device, file); });
    return true;
  }
} // namespace fickcast::post
