// The validated, SI-valued description of one case: what the rest of fickcast works from.
#pragma once

#include <array>
#include <optional>
#include <string>
#include <vector>

namespace fickcast
{
  /**
   * A scalar given either as a constant (SI) or as an expression in SI variables
   * (x, y, z in m, t in s), evaluated with deal.II's muparser-based FunctionParser. The
   * expression's result is in the unit that was written after it; @p scale converts it to SI.
   */
  struct ScalarField
  {
    double value = 0;       ///< the constant, SI (used when expression is empty)
    std::string expression; ///< muparser expression, empty for a constant
    double scale = 1;       ///< SI value of one unit of the expression's result
    double offset = 0;      ///< SI offset (temperatures in degC)

    bool is_constant() const { return expression.empty(); }
    static ScalarField constant(double si_value)
    {
      ScalarField field;
      field.value = si_value;
      return field;
    }
  };

  /// One layer of the built-in layered geometry, listed from the top face inward.
  struct LayerSpec
  {
    std::string name;
    double thickness = 0; ///< m
    double cell_size = 0; ///< m; 0 means the geometry's cell size
  };

  enum class Face
  {
    none,
    top,
    bottom
  };

  /// Built-in geometry: layers stacked along the last axis (x in 1-D, y in 2-D, z in 3-D),
  /// starting at the top face (coordinate 0) and growing into the material.
  struct GeometrySpec
  {
    std::vector<LayerSpec> layers;
    double cell_size = 0; ///< m, target cell size along every axis
    double width = 0;     ///< m, extent along x (2-D and 3-D)
    double length = 0;    ///< m, extent along y (3-D)
    Face grade_toward = Face::none;
    double grading = 1; ///< ratio of neighbouring cell sizes (>= 1) growing away from grade_toward

    double total_thickness() const
    {
      double sum = 0;
      for (const auto &layer : layers)
        sum += layer.thickness;
      return sum;
    }
  };

  /// One material zone (a layer, later a mesh group) and its coefficients, SI.
  struct RegionSpec
  {
    std::string name;
    ScalarField diffusivity;            ///< free diffusivity D, m2/s
    double porosity = 1;                ///< theta in (0, 1]
    double tortuosity = 1;              ///< factor tau in (0, 1]: D_eff = tau * D
    double retardation = 1;             ///< R >= 1 (linear sorption)
    double partition = 1;               ///< K > 0: phase concentration c = K u
    double decay_rate = 0;              ///< lambda >= 0, 1/s, acting on dissolved and sorbed amounts
    ScalarField source;                 ///< volumetric source, concentration units per second, per bulk volume
    std::optional<ScalarField> initial; ///< phase concentration, overrides [initial] value
    double cell_size = 0;               ///< m; 0: the geometry's

    /// Storage capacity C = theta R K (multiplies du/dt).
    double capacity() const { return porosity * retardation * partition; }
    /// Conductance factor G / D = theta tau K (multiplies D grad u).
    double conductance_factor() const { return porosity * tortuosity * partition; }
  };

  enum class BoundaryKind
  {
    concentration, ///< fixed concentration
    flux,          ///< prescribed inward flux
    transfer,      ///< outward flux = h (c_face - K c_ambient)
    sealed         ///< zero flux (also symmetry)
  };

  /**
   * One named boundary condition. Concentrations at boundaries may be given in two phases:
   * `value` is the concentration inside the material at the face (the phase of the region that
   * touches it); `ambient` is the concentration in the medium outside, in the reference phase of
   * the partition coefficients, so that the face concentration is K times it.
   */
  struct BoundarySpec
  {
    std::string name;
    BoundaryKind kind = BoundaryKind::sealed;
    ScalarField value;             ///< concentration at the face (concentration), or inward flux (flux)
    bool value_is_ambient = false; ///< concentration kind given through `ambient` instead of `value`
    ScalarField ambient;           ///< outside concentration, reference phase (transfer, or concentration)
    double coefficient = 0;        ///< transfer coefficient h, m/s
  };

  enum class TimeScheme
  {
    implicit_euler,
    crank_nicolson,
    bdf2
  };

  struct TimeSpec
  {
    double end = 0;          ///< s
    bool adaptive = true;    ///< step = auto
    double step = 0;         ///< s, fixed step when not adaptive
    double tolerance = 1e-4; ///< relative local error per step (adaptive)
    TimeScheme scheme = TimeScheme::bdf2;
    unsigned int start_steps = 4; ///< implicit-Euler steps after every discontinuity (Crank-Nicolson)
    double initial_step = 0;      ///< s; 0: chosen from tolerance and end time
    double max_step = 0;          ///< s; 0: end / 20
  };

  enum class LinearSolverKind
  {
    automatic,
    direct,
    iterative
  };

  struct NumericsSpec
  {
    unsigned int degree = 2;
    LinearSolverKind linear_solver = LinearSolverKind::automatic;
    double solver_tolerance = 1e-12; ///< relative residual of the iterative solver
  };

  struct ProbeSpec
  {
    std::string name;
    std::array<double, 3> point{{0, 0, 0}}; ///< m
  };

  /// A named level: first time the probe of the same name reaches it (threshold), or the
  /// depth along the stacking axis where the concentration falls below it (depth).
  struct LevelSpec
  {
    std::string name;
    double level = 0; ///< concentration, SI
  };

  struct OutputSpec
  {
    std::string folder;        ///< results folder, relative to the working directory
    std::vector<double> times; ///< s, extra output times
    double fields_every = 0;   ///< s; 0: only the end (and listed times)
    bool write_fields = true;
    std::vector<ProbeSpec> probes;
    std::vector<LevelSpec> thresholds;
    std::vector<LevelSpec> depths;
  };

  /// One effective setting as `fickcast check` prints it and summary.json echoes it.
  struct SettingRecord
  {
    std::string key;     ///< section.key
    std::string written; ///< the value as written (or the default)
    std::string si;      ///< SI value and unit, or the normalised text for non-quantities
    std::string origin;  ///< file:line, --set, or default
  };

  /// Units of the concentration family of a case and the quantities derived from it.
  struct ConcentrationUnits
  {
    std::string concentration = "1"; ///< SI unit of concentration: kg/m3, mol/m3, 1/m3 or 1
    std::string flux;                ///< amount per area per time
    std::string source;              ///< concentration per time
    std::string amount;              ///< amount (per unit area in 1-D, per unit depth in 2-D)
    std::string as_written;          ///< the first concentration unit the case used, e.g. mg/L
    std::string decided_by;          ///< key and origin of that first concentration
  };

  struct CaseDescription
  {
    std::string title;
    std::string file; ///< the case file it came from
    unsigned int dimension = 1;
    GeometrySpec geometry;
    std::vector<RegionSpec> regions;
    std::vector<BoundarySpec> boundaries; ///< every face of the geometry, sealed unless given
    ScalarField initial;                  ///< phase concentration, SI
    TimeSpec time;
    NumericsSpec numerics;
    OutputSpec output;
    ConcentrationUnits units;
    std::vector<SettingRecord> settings;

    const RegionSpec *find_region(const std::string &name) const;
    const BoundarySpec *find_boundary(const std::string &name) const;
  };

  /// Names of the faces of the built-in geometry in @p dimension (top, bottom, left, ...).
  std::vector<std::string> builtin_face_names(unsigned int dimension);
} // namespace fickcast
