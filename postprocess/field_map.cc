#include "field_map.h"

#include "output_file.h"
#include "post_error.h"

#include <plplot.h>

#include <algorithm>
#include <cmath>
#include <tuple>

namespace fickcast::post
{
  namespace
  {
    constexpr int bands = 12;

    void render(const FieldMap &map, const std::vector<double> &shown, const double low, const double high,
                const std::string &device, const std::string &file)
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
      plscmap0n(4);
      plscol0(1, 0, 0, 0);
      plscol0(2, 150, 150, 150);
      // The ramp: pale sand (least) through sea green to deep blue (most); lightness falls
      // steadily, so it reads in greyscale too.
      PLFLT position[3] = {0.0, 0.5, 1.0};
      PLFLT red[3] = {250 / 255.0, 70 / 255.0, 20 / 255.0};
      PLFLT green[3] = {240 / 255.0, 160 / 255.0, 40 / 255.0};
      PLFLT blue[3] = {205 / 255.0, 150 / 255.0, 110 / 255.0};
      plscmap1n(256);
      plscmap1l(1, 3, position, red, green, blue, nullptr);
      plinit();
      plfontld(1);
      plschr(0, 1.15);
      pladv(0);

      // The body to scale inside the room left of the colour bar (page 1000 x 640 px).
      const double x0 = map.x.front(), x1 = map.x.back(), y0 = map.y.front(), y1 = map.y.back();
      const double room_left = 0.12, room_right = 0.80, room_bottom = 0.13, room_top = 0.89;
      // A slender body: its narrow side stretched (map_stretch; the caption says so).
      const double stretch = map_stretch(map);
      const double sx = (x1 - x0) * (x1 - x0 < y1 - y0 ? stretch : 1.0),
                   sy = (y1 - y0) * (y1 - y0 <= x1 - x0 ? stretch : 1.0);
      const double scale = std::min((room_right - room_left) * 1000 / sx, (room_top - room_bottom) * 640 / sy);
      const double width = sx * scale / 1000, height = sy * scale / 640;
      const double left = room_left + 0.5 * (room_right - room_left - width);
      const double bottom = room_bottom + 0.5 * (room_top - room_bottom - height);
      plvpor(left, left + width, bottom, bottom + height);
      if (map.downward)
        plwind(x0, x1, y1, y0);
      else
        plwind(x0, x1, y0, y1);

      const PLINT nx = static_cast<PLINT>(map.x.size()), ny = static_cast<PLINT>(map.y.size());
      std::vector<PLFLT> edges(bands + 1);
      for (int k = 0; k <= bands; ++k)
        edges[k] = low + (high - low) * k / bands;
      std::vector<PLFLT *> rows(map.x.size());
      std::vector<PLFLT> grid(shown);
      for (std::size_t i = 0; i < map.x.size(); ++i)
        rows[i] = grid.data() + i * map.y.size();
      plshades(rows.data(), nx, ny, nullptr, x0, x1, y0, y1, edges.data(), bands + 1, 1, 0, 0, plfill, 1, nullptr,
               nullptr);
      plcol0(1);
      plwidth(1);
      plsxax(6, 0);
      plsyax(6, 0);
      // About one labelled tick per 120 px of the side (a stretched narrow side gets few).
      auto step = [](const double span, const double pixels) {
        const double raw = span / std::max(2.0, std::floor(pixels / 120));
        const double decade = std::pow(10.0, std::floor(std::log10(raw)));
        for (const double m : {1.0, 2.0, 5.0, 10.0})
          if (m * decade >= raw)
            return m * decade;
        return 10 * decade;
      };
      plbox("bcnsti", step(x1 - x0, width * 1000), 0, "bcnstvi", step(y1 - y0, height * 640), 0);
      plmtex("b", 3.2, 0.5, 0.5, map.x_label.c_str());
      plmtex("l", 4.2, 0.5, 0.5, map.y_label.c_str());
      const std::string title = map.subject.empty() ? map.title : map.title + "  \u2013  " + map.subject;
      plvpor(room_left, 0.96, room_bottom, room_top);
      plschr(0, 1.15 * std::clamp(58.0 / std::max<double>(title.size(), 1), 0.5, 1.0));
      plmtex("t", 1.8, 0.0, 0.0, title.c_str());
      plschr(0, 1.15);

      // The colour bar: one box per band, its edges as ticks on the right.
      const int exponent = map.log_values ? 0 : axis_exponent(low, high);
      const double factor = std::pow(10.0, -exponent);
      plvpor(0.85, 0.88, room_bottom, room_top);
      plwind(0, 1, low * factor, high * factor);
      for (int k = 0; k < bands; ++k)
        {
          plcol1((k + 0.5) / bands);
          PLFLT bx[4] = {0, 1, 1, 0};
          PLFLT by[4] = {edges[k] * factor, edges[k] * factor, edges[k + 1] * factor, edges[k + 1] * factor};
          plfill(4, bx, by);
        }
      plcol0(1);
      plbox("bc", 0, 0, "bcmstv", 0, 0);
      plmtex("r", 5.0, 0.5, 0.5, label_with_exponent(map.value_label, exponent).c_str());
      plend1();
      plsstrm(previous);
    }
  } // namespace

  double map_stretch(const FieldMap &map)
  {
    if (map.x.size() < 2 || map.y.size() < 2)
      return 1;
    const double w = std::abs(map.x.back() - map.x.front()), h = std::abs(map.y.back() - map.y.front());
    const double ratio = std::min(w, h) / std::max(w, h);
    return ratio > 0 && ratio < 0.125 ? 0.25 / ratio : 1.0;
  }

  bool write_field_map(const FieldMap &map, const std::string &stem, const PlotFormats &formats)
  {
    if (map.x.size() < 2 || map.y.size() < 2 || map.values.size() != map.x.size() * map.y.size())
      return false;
    std::vector<double> shown(map.values);
    double low = INFINITY, high = -INFINITY;
    for (double &v : shown)
      {
        if (map.log_values)
          v = v > 0 ? std::log10(v) : std::nan("");
        if (std::isfinite(v))
          {
            low = std::min(low, v);
            high = std::max(high, v);
          }
      }
    if (map.log_values && std::isfinite(high))
      low = std::max(low, high - 6); // six decades below the largest, as the profiles
    if (!(high > low))
      return false;
    // Outside the body (and below the lowest band of a log map): below every band edge, unfilled.
    for (double &v : shown)
      if (!std::isfinite(v) || v < low)
        v = low - 1e3 * (high - low);
    render_formats(stem, formats, [&](const std::string &device, const std::string &file) {
      render(map, shown, low, high, device, file);
    });
    return true;
  }
} // namespace fickcast::post
