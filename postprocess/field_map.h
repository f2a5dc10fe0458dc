// Filled-contour pictures of a 2-D field (a section of the body), in fickcast's plot look.
#pragma once

#include "plot_writer.h"

#include <string>
#include <vector>

namespace fickcast::post
{
  /// A field sampled on a regular grid, ready to draw.
  struct FieldMap
  {
    std::string title;          ///< e.g. "Concentration at t = 2 yr"
    std::string subject;        ///< the case title
    std::string x_label;        ///< e.g. "x [mm]"
    std::string y_label;        ///< e.g. "y [mm]"
    std::string value_label;    ///< e.g. "concentration [mg/L]"
    std::vector<double> x;      ///< grid abscissae, increasing (display units)
    std::vector<double> y;      ///< grid ordinates, increasing
    std::vector<double> values; ///< values[i * y.size() + j] at (x[i], y[j]); NaN outside the body
    bool log_values = false;    ///< colours by decade (number densities that span decades)
    bool downward = false;      ///< y grows downward (a depth from the top face), as layers are drawn
  };

  /**
   * How much the narrow side of @p map is stretched when drawn: 1 (to scale) unless it is less
   * than an eighth of the long side, then enough to make it a quarter of it (a slender column
   * drawn to scale would be a line). The caption must say so when it is not 1.
   */
  double map_stretch(const FieldMap &map);

  /**
   * Writes @p map as STEM.png and/or STEM.svg: the field in twelve filled bands of a sequential
   * colour ramp of our own (pale sand to deep blue, lighter meaning less), the body drawn to scale
   * (equal lengths on both axes) but for map_stretch(), points outside it left white, and a colour bar with the band
   * edges on the right. Returns false (writing nothing) if the map has fewer than two distinct
   * finite values. PostIoError as write_plot.
   */
  bool write_field_map(const FieldMap &map, const std::string &stem, const PlotFormats &formats);
} // namespace fickcast::post
