// Line plots written with PLplot's cairo drivers (pngcairo, svgcairo).
#pragma once

#include <functional>
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
    bool filled = false;       ///< a closed outline filled in its colour (a bar), no marker
  };

  /// A complete plot: axis labels carry the quantity and its unit.
  struct PlotSpec
  {
    std::string title;   ///< what the plot shows, e.g. "Concentration profiles"
    std::string x_label; ///< quantity and unit, e.g. "time [yr]"; a power of ten goes into the brackets
    std::string y_label;
    std::vector<PlotCurve> curves;
    bool log_y = false;    ///< logarithmic value axis (non-positive values are left out)
    std::string subject;   ///< the case it belongs to (its title); shown on the title line
    bool downward = false; ///< the value axis grows downward (a depth), its largest value at the bottom
  };

  /// Which files to write.
  struct PlotFormats
  {
    bool png = true;
    bool svg = true;
  };

  /**
   * Writes @p spec to STEM.png and/or STEM.svg (each through a partial file renamed when
   * complete), in fickcast's one plot look: a title line naming the plot and the case, a light
   * grid, ticks outside on the left and bottom axes, a common power of ten written into the axis
   * label (`concentration [10^18 1/cm3]`) rather than floating beside the axis, and the legend in
   * columns below the frame (never beside it). Curves are told apart by colour (the Okabe-Ito
   * colour-blind-safe palette), line style and marker, so they stay distinct in greyscale.
   * Returns false (writing nothing) if no curve has a finite point. PostIoError if PLplot's
   * cairo drivers are missing or a file cannot be written.
   */
  bool write_plot(const PlotSpec &spec, const std::string &stem, const PlotFormats &formats);

  /**
   * The power of ten written into an axis label for values spanning [@p low, @p high]: a
   * multiple of 3 that brings the largest magnitude into [1, 1000), or 0 when the plain numbers
   * read well (largest magnitude from 0.01 to 9999).
   */
  int axis_exponent(double low, double high);

  /// @p label with 10^@p exponent written into its unit brackets ("c [mg/L]", 6 -> "c [10^6 mg/L]"
  /// in PLplot's superscript escapes, `10#u6#d`); without brackets, " [10^6]" is appended.
  std::string label_with_exponent(const std::string &label, int exponent);

  /// True if this PLplot has the pngcairo and svgcairo devices.
  bool cairo_devices_available();

  /**
   * Calls @p render(device, file) for each format wanted (pngcairo to STEM.png, svgcairo to
   * STEM.svg), each into a partial file renamed when complete, holding the PLplot lock (PLplot
   * keeps global state). PostIoError if the cairo devices are missing.
   */
  void render_formats(const std::string &stem, const PlotFormats &formats,
                      const std::function<void(const std::string &device, const std::string &file)> &render);
} // namespace fickcast::post
