// The validated, SI-valued description of one case: what the rest of fickcast works from.
#pragma once

#include "case/temperature_schedule.h"
#include "case/time_table.h"

#include <array>
#include <cstdint>
#include <optional>
#include <string>
#include <vector>

namespace fickcast
{
  /**
   * A scalar given as a constant (SI), as an expression in SI variables (x, y, z in m, t in s,
   * T in K, c in the case's concentration unit) evaluated with muparser, or as a table of values
   * against time read from a CSV file. An expression's result is in the unit written after it;
   * @p scale and @p offset convert it to SI.
   */
  struct ScalarField
  {
    double value = 0;       ///< the constant, SI (used when expression and table are empty)
    std::string expression; ///< muparser expression, empty for a constant
    double scale = 1;       ///< SI value of one unit of the expression's result
    double offset = 0;      ///< SI offset (temperatures in degC)
    TimeTable table;        ///< value against time (file:NAME.csv), SI

    bool is_constant() const { return expression.empty() && table.empty(); }
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
    top,   ///< the start of the stack (x = 0 in 1-D; the centre or inner radius in radial cases)
    bottom ///< the end of the stack (the outer surface in radial cases)
  };

  /// Coordinate systems: Cartesian 1-D/2-D/3-D; radial 1-D cylinder (amounts per unit length)
  /// and sphere; axisymmetric 2-D (x = r, y = z). Amounts integrate over the full revolution.
  enum class Coordinates
  {
    cartesian,
    cylinder,
    sphere,
    axisymmetric
  };

  enum class OpenFaceRefinement
  {
    automatic, ///< on when numerics.accuracy is on
    on,
    off
  };

  /// Built-in geometry: layers stacked along the last axis (x in 1-D, y in 2-D, z in 3-D),
  /// starting at the top face (coordinate 0) and growing into the material.
  struct GeometrySpec
  {
    Coordinates coordinates = Coordinates::cartesian;
    std::vector<LayerSpec> layers; ///< a name may repeat: the layers then share one region
    double cell_size = 0;          ///< m, target cell size along every axis
    double width = 0;              ///< m, extent along x (2-D and 3-D Cartesian)
    double length = 0;             ///< m, extent along y (3-D)
    double radius = 0;             ///< m, outer radius of the layer stack (axisymmetric)
    double inner_radius = 0;       ///< m, a hollow centre (radial and axisymmetric)
    LayerSpec side_coating;        ///< axisymmetric: a band around the stack (thickness 0: none)
    Face grade_toward = Face::none;
    double grading = 1;      ///< ratio of neighbouring cell sizes (>= 1) growing away from grade_toward
    std::string mesh_file;   ///< Gmsh mesh; empty: the built-in layered geometry
    unsigned int refine = 0; ///< global refinements of the mesh
    /// Local refinement in a band next to the faces where the species enters or leaves
    /// (concentration, transfer and bath faces of any stage), after the global refinements.
    /// automatic: on when numerics.accuracy is on (the user's mesh is kept when it is off).
    OpenFaceRefinement open_face_refinement = OpenFaceRefinement::automatic;
    double open_face_cell = 0;             ///< m, largest cell in the band; 0: degree x diffusion length of the run / 4
    double open_face_band = 0;             ///< m, depth of the band; 0: 8 diffusion lengths of the run
    double open_face_scale = 1;            ///< factor on the cell target (the accuracy check halves it per solve)
    std::vector<std::string> mesh_regions; ///< physical groups of the mesh's dimension, by id
    std::vector<int> mesh_region_tags;     ///< their physical tags
    std::vector<std::string> mesh_boundaries; ///< physical groups one dimension lower, by id
    std::vector<int> mesh_boundary_tags;

    bool radial() const { return coordinates == Coordinates::cylinder || coordinates == Coordinates::sphere; }
    /// Region names in material-id order: layers (first appearance) and the side coating, or the mesh's.
    std::vector<std::string> region_names() const;
    /// Boundary names in boundary-id order for a @p dimension-D case (symmetry faces included).
    std::vector<std::string> face_names(unsigned int dimension) const;
    /// Whether face @p name is a symmetry point or axis (centre, axis): sealed, not settable.
    static bool is_symmetry_face(const std::string &name) { return name == "centre" || name == "axis"; }

    double total_thickness() const
    {
      double sum = 0;
      for (const auto &layer : layers)
        sum += layer.thickness;
      return sum;
    }
  };

  /// Empirical laws giving the tortuosity factor from the porosity.
  enum class PorosityLaw
  {
    none,            ///< tortuosity given directly (default 1)
    archie,          ///< tau = theta^(m - 1), i.e. D_eff theta = D theta^m (Archie, exponent m)
    millington_quirk ///< tau = theta^(1/3), i.e. D_eff theta = D theta^(4/3) (saturated form)
  };

  /// One material zone (a layer, later a mesh group) and its coefficients, SI.
  struct RegionSpec
  {
    std::string name;
    ScalarField diffusivity;      ///< free diffusivity D, m2/s (x, y, z, t, T, c allowed)
    bool arrhenius = false;       ///< D = prefactor exp(-activation_energy / (k_B T))
    double prefactor = 0;         ///< D0, m2/s
    double activation_energy = 0; ///< J per particle
    double porosity = 1;          ///< theta in (0, 1]
    double tortuosity = 1;        ///< factor tau in (0, 1] given directly (a porosity law: model/material)
    PorosityLaw porosity_law = PorosityLaw::none;
    double archie_exponent = 0;
    double retardation = 1;              ///< R >= 1 (linear sorption) given directly
    double bulk_density = 0;             ///< rho_b, kg/m3, with distribution_coefficient (0: not given)
    double distribution_coefficient = 0; ///< Kd, m3/kg: R = 1 + rho_b Kd / theta (model/material)
    double partition = 1;                ///< K > 0: phase concentration c = K u
    double decay_rate = 0;               ///< lambda >= 0, 1/s
    bool decay_dissolved_only = false;   ///< decay acts on the dissolved phase only (not the sorbed)
    ScalarField source;                  ///< volumetric source, concentration units per second, per bulk volume
    std::optional<ScalarField> initial;  ///< phase concentration, overrides [initial] value
    double loading = 0;                  ///< total initial content per bulk volume (with a dispersed phase); 0: none
    double solubility = 0;               ///< phase concentration at saturation; 0: unlimited
    double cell_size = 0;                ///< m; 0: the geometry's
    /// Darcy flux q, m/s: one component per axis of the mesh (empty: no flow). The seepage
    /// velocity is q / theta; in 1-D positive q flows from the top face toward the bottom face.
    std::vector<double> darcy_flux;
    double longitudinal_dispersivity = 0; ///< alpha_L, m
    double transverse_dispersivity = 0;   ///< alpha_T, m

    /// Whether part of the content may be undissolved (solid above solubility).
    bool has_dispersed_phase() const { return solubility > 0; }
    /// Whether water flows through the region (a Darcy flux that is not zero).
    bool has_flow() const
    {
      for (const double q : darcy_flux)
        if (q != 0)
          return true;
      return false;
    }
  };

  enum class BoundaryKind
  {
    concentration, ///< fixed concentration
    flux,          ///< prescribed inward flux
    transfer,      ///< outward flux = h (c_face - K c_ambient)
    sealed,        ///< zero flux (also symmetry)
    bath,          ///< a finite well-stirred bath of given volume
    inflow,        ///< water enters with a given concentration: total inward flux = -q.n c_in
    outflow        ///< water leaves freely: total outward flux = q.n c (no dispersive flux)
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
    double volume = 0;             ///< bath volume (per unit area in 1-D, per unit length in 2-D)
    double bath_partition = 1;     ///< K of the bath liquid against the reference phase
    double bath_initial = 0;       ///< initial concentration in the bath (bath phase)
  };

  /// One stage of a process: its duration, its boundary conditions (the temperature is chained
  /// into CaseDescription::temperature).
  struct StageSpec
  {
    std::string name;
    double start = 0;                     ///< s, from the start of the run
    double duration = 0;                  ///< s
    std::vector<BoundarySpec> boundaries; ///< every face, as in this stage

    double end() const { return start + duration; }
    const BoundarySpec *find_boundary(const std::string &boundary) const;
  };

  enum class TimeScheme
  {
    implicit_euler,
    crank_nicolson,
    bdf2
  };

  /// What time.tolerance bounds in an adaptive run.
  enum class ErrorControl
  {
    automatic, ///< local for now (global costs 1.5-5.5x the steps through a start's transient)
    global,    ///< the carried (global) error of the state: each step's local error transported
    local      ///< each step's local error (0.7.0; cheaper, final error 0.3-30 x the tolerance)
  };

  struct TimeSpec
  {
    double end = 0;          ///< s
    bool adaptive = true;    ///< step = auto
    double step = 0;         ///< s, fixed step when not adaptive
    double tolerance = 1e-4; ///< relative error of the state (adaptive; see error_control)
    ErrorControl error_control = ErrorControl::automatic;
    TimeScheme scheme = TimeScheme::bdf2;
    unsigned int start_steps = 4; ///< implicit-Euler steps after every discontinuity (Crank-Nicolson)
    double initial_step = 0;      ///< s; 0: chosen from tolerance and end time
    double max_step = 0;          ///< s; 0: end / 20
    /// Concentration (SI) under which a node's step error is measured absolutely (above it,
    /// relative to the node's own value); 0: the concentration scale for every node. Set by the
    /// accuracy check from the levels and point values asked for, not by a key.
    double error_floor = 0;
  };

  enum class LinearSolverKind
  {
    automatic,
    direct,
    iterative, ///< CG, preconditioned after the step matrix (the diagonal or multigrid)
    diagonal,  ///< CG with the diagonal always (for checking one against the other)
    multigrid  ///< CG with algebraic multigrid always
  };

  struct NumericsSpec
  {
    unsigned int degree = 2;
    LinearSolverKind linear_solver = LinearSolverKind::automatic;
    double solver_tolerance = 1e-12; ///< relative residual of the iterative solver
    /// Apply the step operator without its matrix where that works (numerics.matrix_free).
    bool matrix_free = true;
    bool newton = true;                ///< Newton (else Picard) for concentration-dependent D
    double nonlinear_tolerance = 1e-8; ///< change per iteration relative to the concentration scale
    unsigned int max_nonlinear_iterations = 30;
    /// Relative accuracy asked of each named result; 0: off. A case file's default is 1e-3;
    /// a description built in code is off unless it says otherwise.
    double accuracy = 0;
    unsigned int accuracy_solves = 3; ///< most solves of the check
    /// Runtime remeshing (numerics.remesh*): on or off, the largest interpolation error per cell
    /// relative to the concentration scale, accepted steps between remeshings, and the smallest
    /// and largest cell diameter (0: auto).
    bool remesh = false;
    double remesh_error = 1e-3;
    unsigned int remesh_every = 5;
    double smallest_cell = 0, largest_cell = 0;
  };

  struct NamedPointSpec
  {
    std::string name;
    std::array<double, 3> point{{0, 0, 0}}; ///< m
    std::string region;                     ///< side to read at an interface (`... in REGION`); empty: any
    std::string origin;                     ///< file:line or --set
  };

  /// A named sampling line from one point to another, with its number of points.
  struct LineSpec
  {
    std::string name;
    std::array<double, 3> from{{0, 0, 0}}, to{{0, 0, 0}}; ///< m
    unsigned int samples = 101;
  };

  /// A named level: first time the point of the same name reaches it (threshold), or the
  /// depth along the stacking axis where the concentration falls below it (depth).
  struct LevelSpec
  {
    std::string name;
    double level = 0; ///< concentration, SI
  };

  /// A named result through a face (output.flux.NAME, crossed.*, peak_flux.*, flux_limit.*,
  /// crossed_limit.*, steady_flux.*): the rate or the amount through one boundary, counted in the
  /// direction the case names.
  struct FaceResultSpec
  {
    enum class Kind
    {
      flux,          ///< the rate at a time (the end if none)
      crossed,       ///< the amount crossed by a time (the end if none)
      peak_flux,     ///< the largest rate and when
      flux_limit,    ///< the first time the rate reaches a limit
      crossed_limit, ///< the first time the amount crossed reaches a limit
      steady_flux    ///< the rate at the end, with whether it has become steady
    };
    Kind kind = Kind::flux;
    std::string name;
    std::string boundary;
    bool outward = true;        ///< counted out of the body (else into it)
    double time = -1;           ///< s, for flux and crossed; < 0: the end
    double limit = 0;           ///< amount per time (flux_limit) or amount (crossed_limit), SI
    std::string origin;         ///< file:line or --set
    std::string prefix() const; ///< `flux`, `crossed`, ...
    std::string full_name() const { return prefix() + "." + name; }
  };

  struct OutputSpec
  {
    std::string folder;            ///< results folder, relative to the working directory
    std::vector<double> times;     ///< s, extra output times
    double fields_every = 0;       ///< s; 0: only the end (and listed times)
    double checkpoint_every = 600; ///< s of wall-clock time between checkpoints; 0: after every step
    bool write_fields = true;
    std::vector<NamedPointSpec> points;
    std::vector<LevelSpec> thresholds;
    std::vector<LevelSpec> depths;
    std::vector<LineSpec> lines;
    std::vector<LevelSpec> releases; ///< levels of the content fraction (0, 1]: release.* or, uptake, uptake.*
    double loading = 0;              ///< reference amount of the released fraction; 0: the initial amount
    /// The content fraction is an uptake (case/content_fraction.h): (M - M0) / (M_eq - M0), with
    /// M_eq the content at the reference-phase concentration `equilibrium` everywhere.
    bool uptake = false;
    double equilibrium = 0; ///< reference phase, SI (uptake only)

    /// `uptake` or `release`: the prefix of the content fraction's events.
    std::string fraction_event_prefix() const { return uptake ? "uptake" : "release"; }
    /// `uptake_fraction` or `released_fraction`: its series column and (with `.final`) result.
    std::string fraction_name() const { return uptake ? "uptake_fraction" : "released_fraction"; }
    std::vector<std::pair<std::string, std::string>> time_lags; ///< name, boundary
    std::vector<FaceResultSpec> face_results;
    bool moments = false;
  };

  /// One parameter of a study: a case key (or `layer.NAME.thickness`) and its values as written.
  struct StudyParameter
  {
    std::string key;                 ///< e.g. region.clay.porosity
    std::vector<std::string> values; ///< sweep: the values as written (with units)
    std::string distribution;        ///< sample: e.g. normal(2e-10 m2/s, 2e-11 m2/s)
    std::string origin;              ///< file:line or --set
  };

  /// A limit whose crossing probability an uncertainty study reports.
  struct StudyLimit
  {
    std::string result; ///< a named result, e.g. threshold.base
    std::string level;  ///< as written, in the result's dimension
    bool above = true;  ///< probability of exceeding (true) or of falling below (false)
    std::string origin;
  };

  /// The [sweep] section: the cases `fickcast sweep` runs (a what-if grid, zipped lists or samples).
  struct SweepSpec
  {
    std::vector<StudyParameter> vary;   ///< what-if: values per key
    bool zip = false;                   ///< pair the lists element by element instead of every combination
    std::vector<StudyParameter> sample; ///< uncertainty: a distribution per key
    unsigned int samples = 100;
    unsigned long seed = 1;
    std::vector<StudyLimit> limits;

    bool given() const { return !vary.empty() || !sample.empty(); }
  };

  /// The [size] section: the one parameter `fickcast size` adjusts so that a result takes a value.
  struct SizeSpec
  {
    StudyParameter parameter; ///< the case key, and values {from, to}
    std::string result;       ///< the named result that must take the aimed value
    std::string aim;          ///< the aimed value as written, in the result's dimension
    double tolerance = 1e-4;  ///< relative, on the parameter
    unsigned int max_runs = 40;
    std::string aim_origin;    ///< file:line of `aim`
    std::string result_origin; ///< file:line of `result`

    bool given() const { return !parameter.key.empty(); }
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
    std::string file;                        ///< the case file it came from
    std::vector<std::string> input_warnings; ///< readings to confirm (a time or temperature without its unit)
    /// Of the case's entries after --set values, except where results go and checkpoint timing:
    /// a resumed run continues only the same case.
    std::uint64_t fingerprint = 0;
    unsigned int dimension = 1;
    GeometrySpec geometry;
    std::vector<RegionSpec> regions;
    std::vector<BoundarySpec> boundaries; ///< every face of the geometry, sealed unless given
    std::vector<StageSpec> stages;        ///< at least one; without [stage.*], one over the whole run
    TemperatureSchedule temperature;      ///< over the whole run (stages chained); empty: none given
    ScalarField initial;                  ///< phase concentration, SI
    TimeSpec time;
    NumericsSpec numerics;
    OutputSpec output;
    ConcentrationUnits units;
    SweepSpec sweep;
    SizeSpec size;
    std::vector<SettingRecord> settings;

    const RegionSpec *find_region(const std::string &name) const;
    const BoundarySpec *find_boundary(const std::string &name) const;
  };

  /// Names of the faces of the built-in Cartesian geometry in @p dimension (top, bottom, left, ...).
  std::vector<std::string> builtin_face_names(unsigned int dimension);
} // namespace fickcast
