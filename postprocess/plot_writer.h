// Line plots written with PLplot's cairo drivers (pngcairo, svgcairo).
#pragma once

#include <string>
#include <vector>

namespace fickcast::post
{
  /// One labelled curve. NaN values break the line (gaps outside the mesh, missing values).
  struct PlotCurve
  {
    std::string label;
    std::vector<double> x;
    std::vector<double> y;
    bool markers_only = false; ///< scattered points (a study's cases), no line
    bool reference = false;    ///< a thin grey reference line (threshold, percentile), no marker
  };

  /// A complete plot: axis labels carry the quantity and its unit.
  struct PlotSpec
  {
    std::string title;
    std::string x_label;
    std::string y_label;
    std::vector<PlotCurve> curves;
    bool log_y = false; ///< logarithmic value axis (non-positive values are left out)
  };

  /// Which files to write.
  struct PlotFormats
  {
    bool png = true;
    bool svg = true;
  };

  /**
   * Writes @p spec to STEM.png and/or STEM.svg (each through a partial file renamed when
   * complete). Curves are told apart by colour (the Okabe-Ito colour-blind-safe palette),
   * line style and marker, so they stay distinct in greyscale; a legend names them.
   * Returns false (writing nothing) if no curve has a finite point. PostIoError if PLplot's
   * cairo drivers are missing or a file cannot be written.
   */
  bool write_plot(const PlotSpec &spec, const std::string &stem, const PlotFormats &formats);

  /// True if this PLplot has the pngcairo and svgcairo devices.
  bool cairo_devices_available();
} // namespace fickcast::post
