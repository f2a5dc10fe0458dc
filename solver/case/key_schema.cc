#include "case/key_schema.h"

namespace fickcast
{
  namespace
  {
    constexpr double infinity = std::numeric_limits<double>::infinity();

    KeySpec make(const std::string &section, const std::string &key, ValueKind kind, Dim dim,
                 const std::string &fallback, const std::string &help)
    {
      KeySpec spec;
      spec.section = section;
      spec.key = key;
      spec.kind = kind;
      spec.dim = dim;
      spec.fallback = fallback;
      spec.help = help;
      return spec;
    }

    KeySpec required(KeySpec spec)
    {
      spec.required = true;
      return spec;
    }

    KeySpec bounded(KeySpec spec, double lower, bool lower_open, double upper = infinity, bool upper_open = false)
    {
      spec.lower = lower;
      spec.lower_open = lower_open;
      spec.upper = upper;
      spec.upper_open = upper_open;
      return spec;
    }

    KeySpec positive(KeySpec spec)
    {
      return bounded(std::move(spec), 0, true);
    }

    KeySpec with_auto(KeySpec spec)
    {
      spec.allow_auto = true;
      spec.fallback = "auto";
      return spec;
    }

    KeySpec choices(KeySpec spec, std::vector<std::string> words)
    {
      spec.choices = std::move(words);
      return spec;
    }

    KeySpec variables(KeySpec spec, std::vector<std::string> names)
    {
      spec.variables = std::move(names);
      return spec;
    }

    std::vector<KeySpec> build_schema()
    {
      using K = ValueKind;
      std::vector<KeySpec> s;
      // [case]
      s.push_back(make("case", "title", K::text, Dim::none, "untitled case", "a title for reports"));
      s.push_back(bounded(
        make("case", "dimension", K::integer, Dim::none, "1", "1, 2 or 3 space dimensions (2 for axisymmetric cases)"),
        1, false, 3, false));
      s.push_back(choices(make("case", "coordinates", K::choice, Dim::none, "cartesian",
                               "cartesian, cylinder or sphere (radial 1-D), axisymmetric (2-D r, z)"),
                          {"cartesian", "cylinder", "sphere", "axisymmetric"}));
      // [geometry]
      s.push_back(make("geometry", "layers", K::layers, Dim::length, "",
                       "layers from the top face inward (radial: from the centre outward): "
                       "'name thickness unit, ...'; a name may repeat"));
      s.push_back(make("geometry", "mesh", K::text, Dim::none, "",
                       "a Gmsh mesh file (.msh 2.2 or 4.1, quadrilaterals or hexahedra) with named physical "
                       "groups, instead of layers"));
      s.push_back(bounded(make("geometry", "refine", K::integer, Dim::none, "0",
                               "global refinements of the mesh (each halves the cell size)"),
                          0, false, 8, false));
      s.push_back(choices(make("geometry", "open_face_refinement", K::choice, Dim::none, "auto",
                               "refine the cells in a band next to the faces where the species enters or leaves "
                               "(concentration, transfer, bath): on, off, or auto (on when numerics.accuracy is on)"),
                          {"auto", "on", "off"}));
      s.push_back(with_auto(positive(make("geometry", "open_face_cell", K::quantity, Dim::length, "",
                                          "largest cell in that band; auto: element degree x the diffusion length "
                                          "sqrt(D t) of the whole run / 4"))));
      s.push_back(with_auto(positive(make("geometry", "open_face_band", K::quantity, Dim::length, "",
                                          "depth of that band; auto: 8 diffusion lengths of the whole run"))));
      s.push_back(with_auto(positive(
        make("geometry", "cell_size", K::quantity, Dim::length, "", "target cell size; auto: total thickness / 100"))));
      s.push_back(positive(make("geometry", "width", K::quantity, Dim::length, "", "extent along x (2-D and 3-D)")));
      s.push_back(positive(make("geometry", "length", K::quantity, Dim::length, "", "extent along y (3-D)")));
      s.push_back(positive(
        make("geometry", "radius", K::quantity, Dim::length, "", "outer radius of the layers (axisymmetric)")));
      s.push_back(bounded(make("geometry", "inner_radius", K::quantity, Dim::length, "",
                               "radius of a hollow centre (radial and axisymmetric)"),
                          0, false));
      s.push_back(make("geometry", "side_coating", K::layers, Dim::length, "",
                       "axisymmetric: a band 'name thickness unit' around the side of the layers"));
      s.push_back(choices(make("geometry", "grade_toward", K::choice, Dim::none, "none",
                               "face toward which cells get smaller: top or bottom (radial: outer or centre)"),
                          {"none", "top", "bottom", "outer", "inner", "centre"}));
      s.push_back(bounded(make("geometry", "grading", K::quantity, Dim::dimensionless, "1",
                               "size ratio of neighbouring cells away from grade_toward"),
                          1, false, 2, false));
      // [region.NAME]
      s.push_back(variables(positive(make("region", "diffusivity", K::field, Dim::diffusivity, "",
                                          "free diffusivity D: constant, {expression of x, y, z, t, T, c} or "
                                          "file:TABLE.csv; required unless diffusivity_prefactor is given")),
                            {"x", "y", "z", "t", "T", "c"}));
      s.push_back(positive(make("region", "diffusivity_prefactor", K::quantity, Dim::diffusivity, "",
                                "Arrhenius prefactor D0: D = D0 exp(-Ea / (k_B T)) with the temperature schedule")));
      s.push_back(bounded(make("region", "activation_energy", K::quantity, Dim::activation_energy, "",
                               "Arrhenius activation energy Ea, per particle (eV) or per mole (kJ/mol)"),
                          0, false));
      s.push_back(bounded(
        make("region", "porosity", K::quantity, Dim::dimensionless, "1", "porosity theta in (0, 1]; 1 for a solid"), 0,
        true, 1, false));
      s.push_back(bounded(make("region", "tortuosity", K::quantity, Dim::dimensionless, "1",
                               "tortuosity factor tau in (0, 1]: D_eff = tau D"),
                          0, true, 1, false));
      s.push_back(choices(make("region", "porosity_law", K::choice, Dim::none, "none",
                               "tortuosity from porosity: none, archie (tau = theta^(m-1)), "
                               "millington_quirk (tau = theta^(1/3))"),
                          {"none", "archie", "millington_quirk"}));
      s.push_back(bounded(make("region", "archie_exponent", K::quantity, Dim::dimensionless, "",
                               "Archie's exponent m (porosity_law = archie), typically 1.3 to 2.5"),
                          1, false, 5, false));
      s.push_back(bounded(make("region", "retardation", K::quantity, Dim::dimensionless, "1",
                               "retardation factor R >= 1 (linear sorption)"),
                          1, false));
      s.push_back(positive(make("region", "bulk_density", K::quantity, Dim::density, "",
                                "dry bulk density rho_b; with distribution_coefficient: R = 1 + rho_b Kd / theta")));
      s.push_back(bounded(make("region", "distribution_coefficient", K::quantity, Dim::specific_volume, "",
                               "linear sorption coefficient Kd (with bulk_density)"),
                          0, false));
      s.push_back(positive(make("region", "partition", K::quantity, Dim::dimensionless, "1",
                                "partition coefficient K: phase concentration = K x reference phase")));
      s.push_back(bounded(make("region", "decay_rate", K::quantity, Dim::rate, "0",
                               "first-order decay rate lambda (dissolved and sorbed)"),
                          0, false));
      s.push_back(positive(make("region", "half_life", K::quantity, Dim::time, "",
                                "first-order half-life; sets decay_rate = ln 2 / half_life")));
      s.push_back(choices(make("region", "decay_applies_to", K::choice, Dim::none, "total",
                               "total (dissolved and sorbed decay) or dissolved (sorbed amount is stable)"),
                          {"total", "dissolved"}));
      s.push_back(bounded(make("region", "loading", K::quantity, Dim::concentration, "",
                               "total initial content per bulk volume, dissolved and undissolved (with solubility)"),
                          0, false));
      s.push_back(positive(make("region", "solubility", K::quantity, Dim::concentration, "",
                                "saturation concentration (phase); content above it stays undissolved")));
      s.push_back(variables(make("region", "source", K::field, Dim::source, "0",
                                 "volumetric source per bulk volume ({expression of x, y, z, t} allowed)"),
                            {"x", "y", "z", "t"}));
      s.push_back(variables(make("region", "initial", K::field, Dim::concentration, "",
                                 "initial concentration in this region (overrides [initial] value)"),
                            {"x", "y", "z"}));
      s.push_back(positive(make("region", "cell_size", K::quantity, Dim::length, "",
                                "cell size in this layer (overrides geometry.cell_size)")));
      // [flow]
      s.push_back(make("flow", "darcy_flux", K::quantity_list, Dim::velocity, "",
                       "Darcy flux of every region that gives none (in 1-D the same water crosses every layer: "
                       "one key to vary in a sweep)"));
      s.push_back(make("region", "darcy_flux", K::quantity_list, Dim::velocity, "",
                       "Darcy flux q (water volume per area and time; seepage velocity q / porosity): one value "
                       "in 1-D (positive from the top face toward the bottom), one per axis in 2-D and 3-D"));
      s.push_back(bounded(make("region", "longitudinal_dispersivity", K::quantity, Dim::length, "0",
                               "dispersivity along the flow, alpha_L: adds alpha_L |q| to the dispersion"),
                          0, false));
      s.push_back(bounded(make("region", "transverse_dispersivity", K::quantity, Dim::length, "0",
                               "dispersivity across the flow, alpha_T (2-D and 3-D)"),
                          0, false));
      // [boundary.NAME]
      s.push_back(required(
        choices(make("boundary", "type", K::choice, Dim::none, "",
                     "concentration, flux, transfer, sealed, bath, inflow or outflow (faces that water crosses)"),
                {"concentration", "flux", "transfer", "sealed", "bath", "inflow", "outflow"})));
      s.push_back(variables(make("boundary", "value", K::field, Dim::boundary_value, "",
                                 "concentration inside the material at the face (type concentration), "
                                 "inward flux (type flux) or concentration of the entering water (type inflow); "
                                 "{expression of x, y, z, t} allowed"),
                            {"x", "y", "z", "t"}));
      s.push_back(variables(make("boundary", "ambient", K::field, Dim::concentration, "",
                                 "concentration in the medium outside (reference phase); "
                                 "{expression of x, y, z, t} allowed"),
                            {"x", "y", "z", "t"}));
      s.push_back(positive(make("boundary", "coefficient", K::quantity, Dim::velocity, "",
                                "transfer coefficient h: outward flux = h (c_face - K ambient)")));
      s.push_back(positive(make("boundary", "volume", K::quantity, Dim::bath_volume, "",
                                "bath volume (type bath), in the measure of the amounts: whole (m3) in 3-D, "
                                "for a sphere and axisymmetric; per unit length (m2) in 2-D and for a "
                                "cylinder; per unit area (m) in 1-D")));
      s.push_back(positive(make("boundary", "partition", K::quantity, Dim::dimensionless, "",
                                "bath liquid's partition coefficient against the reference phase (type bath)")));
      s.push_back(bounded(make("boundary", "initial", K::quantity, Dim::concentration, "",
                               "initial concentration in the bath (type bath)"),
                          0, false));
      // [initial]
      s.push_back(variables(make("initial", "value", K::field, Dim::concentration, "0",
                                 "initial concentration ({expression of x, y, z} allowed)"),
                            {"x", "y", "z"}));
      // [time]
      s.push_back(positive(
        make("time", "end", K::quantity, Dim::time, "", "end time of the run (required unless stages give it)")));
      s.push_back(with_auto(positive(
        make("time", "step", K::quantity, Dim::time, "", "fixed time step, or auto for error-controlled steps"))));
      s.push_back(bounded(make("time", "tolerance", K::quantity, Dim::dimensionless, "1e-4",
                               "time error allowed in the state of an adaptive run, relative to the concentration "
                               "scale (see time.error_control)"),
                          0, true, 0.1, false));
      s.push_back(choices(make("time", "error_control", K::choice, Dim::none, "auto",
                               "what time.tolerance bounds: global (the error carried to every step: each step's "
                               "local error transported by the later steps), local (each step's own error; cheaper, "
                               "the final error may be many times the tolerance), or auto (local for now)"),
                          {"auto", "global", "local"}));
      s.push_back(
        choices(make("time", "scheme", K::choice, Dim::none, "bdf2", "implicit_euler, crank_nicolson or bdf2"),
                {"implicit_euler", "crank_nicolson", "bdf2"}));
      s.push_back(bounded(make("time", "start_steps", K::integer, Dim::none, "4",
                               "implicit-Euler steps after each discontinuity (Crank-Nicolson)"),
                          0, false, 50, false));
      s.push_back(
        with_auto(positive(make("time", "initial_step", K::quantity, Dim::time, "", "first step of an adaptive run"))));
      s.push_back(with_auto(positive(
        make("time", "max_step", K::quantity, Dim::time, "", "largest step of an adaptive run; auto: end / 20"))));
      // [numerics]
      s.push_back(bounded(
        make("numerics", "degree", K::integer, Dim::none, "2",
             "polynomial degree of the Lagrange elements: 1 to 4 (3 and 4 pay in 2-D and 3-D with the matrix-free "
             "operator, on smooth fields)"),
        1, false, 4, false));
      s.push_back(choices(make("numerics", "linear_solver", K::choice, Dim::none, "auto",
                               "auto, direct (sparse LU), iterative (CG with the diagonal or algebraic multigrid, "
                               "after the step matrix), or CG with one of them always: diagonal or multigrid"),
                          {"auto", "direct", "iterative", "diagonal", "multigrid"}));
      s.push_back(choices(
        make("numerics", "matrix_free", K::choice, Dim::none, "auto",
             "auto: 2-D and 3-D linear steps of degree 2 or more solved with the diagonal apply the step operator "
             "cell by cell without assembling its matrix; off: always the assembled matrix "
             "(for checking one against the other)"),
        {"auto", "off"}));
      s.push_back(bounded(make("numerics", "solver_tolerance", K::quantity, Dim::dimensionless, "1e-12",
                               "relative residual reduction of the iterative solver"),
                          0, true, 1e-3, false));
      s.push_back(choices(make("numerics", "nonlinear_solver", K::choice, Dim::none, "newton",
                               "newton or picard, for a concentration-dependent diffusivity"),
                          {"newton", "picard"}));
      s.push_back(bounded(make("numerics", "nonlinear_tolerance", K::quantity, Dim::dimensionless, "1e-8",
                               "largest change per iteration relative to the concentration scale"),
                          0, true, 1e-2, false));
      s.push_back(bounded(make("numerics", "max_nonlinear_iterations", K::integer, Dim::none, "30",
                               "iterations before a step is retried smaller or the run fails"),
                          1, false, 1000, false));
      s.push_back(make("numerics", "accuracy", K::text, Dim::none, "1e-3",
                       "relative accuracy of each named result (e.g. 1e-3 or 0.1 %), checked by solving again "
                       "finer; off: one unchecked solve"));
      s.push_back(bounded(make("numerics", "accuracy_solves", K::integer, Dim::none, "3",
                               "most solves an accuracy check may take (each one refinement finer)"),
                          2, false, 6, false));
      s.push_back(choices(make("numerics", "remesh", K::choice, Dim::none, "off",
                               "on: refine the mesh where the concentration needs it and coarsen it where it no "
                               "longer does, during the run"),
                          {"off", "on"}));
      s.push_back(bounded(make("numerics", "remesh_error", K::quantity, Dim::dimensionless, "1e-3",
                               "largest interpolation error of the concentration the remeshing allows in a cell, "
                               "relative to the concentration scale"),
                          0, true, 0.1, false));
      s.push_back(
        bounded(make("numerics", "remesh_every", K::integer, Dim::none, "5", "accepted steps between remeshings"), 1,
                false, 1e6, false));
      s.push_back(with_auto(positive(make("numerics", "smallest_cell", K::quantity, Dim::length, "",
                                          "smallest cell the remeshing may make (diameter); auto: the largest cell of "
                                          "the mesh as given / 1024 in 1-D, / 64 in 2-D, / 16 in 3-D, but no "
                                          "smaller than a node spacing of 1/8 of the shortest diffusion length "
                                          "sqrt(D t) of the first output interval"))));
      s.push_back(with_auto(positive(make("numerics", "largest_cell", K::quantity, Dim::length, "",
                                          "largest cell the remeshing may coarsen to (diameter); auto: no bound "
                                          "below the cells of the mesh as given"))));
      // [sweep]
      s.push_back(make("sweep", "vary.*", K::text, Dim::none, "",
                       "what-if: values of a case key, comma separated with units, or whole strings separated by |"));
      s.push_back(choices(make("sweep", "combine", K::choice, Dim::none, "grid",
                               "grid (every combination of the vary lists) or zip (element by element)"),
                          {"grid", "zip"}));
      s.push_back(make("sweep", "sample.*", K::text, Dim::none, "",
                       "uncertainty: normal(mean, sd), lognormal(median, sigma of ln), uniform(low, high) or "
                       "triangular(low, mode, high), with units"));
      s.push_back(bounded(make("sweep", "samples", K::integer, Dim::none, "100", "number of Latin hypercube samples"),
                          2, false, 1000000, false));
      s.push_back(bounded(make("sweep", "seed", K::integer, Dim::none, "1", "seed of the sampling (reproducible)"), 0,
                          false, 2147483647, false));
      s.push_back(make("sweep", "exceed.*", K::text, Dim::none, "",
                       "a named result and a level: report the probability that the result exceeds it"));
      s.push_back(make("sweep", "below.*", K::text, Dim::none, "",
                       "a named result and a level: report the probability that the result falls below it"));
      // [size]
      s.push_back(make("size", "parameter", K::text, Dim::none, "",
                       "the case key to adjust (a number with units), or layer.NAME.thickness"));
      s.push_back(make("size", "from", K::text, Dim::none, "", "one end of the range searched, with units"));
      s.push_back(make("size", "to", K::text, Dim::none, "", "the other end of the range searched"));
      s.push_back(make("size", "result", K::text, Dim::none, "", "the named result that must take the aimed value"));
      s.push_back(make("size", "aim", K::text, Dim::none, "", "the value the result must take, with units"));
      s.push_back(bounded(
        make("size", "tolerance", K::quantity, Dim::dimensionless, "1e-4", "relative tolerance on the parameter"), 0,
        true, 0.1, false));
      s.push_back(
        bounded(make("size", "max_runs", K::integer, Dim::none, "40", "runs before giving up"), 3, false, 1000, false));
      // [temperature]
      s.push_back(make("temperature", "schedule", K::schedule, Dim::temperature, "",
                       "temperature history: '1050 degC', or '800 degC, ramp 10 degC/min to 1100 degC, hold 1 h, "
                       "ramp to 800 degC in 2 h'"));
      // [stage.NAME]
      s.push_back(required(positive(make("stage", "duration", K::quantity, Dim::time, "", "duration of the stage"))));
      s.push_back(make("stage", "temperature", K::schedule, Dim::temperature, "",
                       "temperature during the stage (times from the stage start); default: the previous stage's "
                       "last temperature"));
      s.push_back(make("stage", "boundary.*", K::text, Dim::none, "",
                       "boundary condition during the stage: boundary.NAME.KEY with the keys of [boundary.NAME]"));
      // [output]
      s.push_back(make("output", "folder", K::text, Dim::none, "",
                       "results folder (relative to the working directory); default results/CASE"));
      s.push_back(
        positive(make("output", "fields_every", K::quantity, Dim::time, "", "interval between field outputs (VTU)")));
      s.push_back(
        positive(make("output", "times", K::quantity_list, Dim::time, "", "extra output times, comma separated")));
      s.push_back(make("output", "fields", K::flag, Dim::none, "true", "write VTU fields"));
      s.push_back(bounded(make("output", "checkpoint_every", K::quantity, Dim::time, "600 s",
                               "wall-clock time between checkpoints, from which `fickcast run --resume` continues an "
                               "interrupted run; 0 s: after every step"),
                          0, false));
      s.push_back(make("output", "point.*", K::point, Dim::length, "",
                       "a named point: one coordinate per axis, each with its unit; the last may be 'start of "
                       "LAYER' or 'end of LAYER' (follows the layer when its thickness changes); '... in REGION' "
                       "reads that side of an interface"));
      s.push_back(bounded(make("output", "threshold.*", K::quantity, Dim::concentration, "",
                               "first time the point of the same name reaches this concentration"),
                          0, false));
      s.push_back(bounded(make("output", "depth.*", K::quantity, Dim::concentration, "",
                               "depth where the concentration first falls below this level, along the line of "
                               "the same name if there is one, else from the top face (radial: the outer surface)"),
                          0, false));
      s.push_back(make("output", "line.*", K::segment, Dim::length, "",
                       "a named sampling line 'FROM to TO' (points as for points); profiles.csv at output times"));
      s.push_back(bounded(make("output", "samples.*", K::integer, Dim::none, "101",
                               "number of sampling points on the line of the same name"),
                          2, false, 100000, false));
      s.push_back(bounded(make("output", "release.*", K::quantity, Dim::dimensionless, "",
                               "the time the released fraction reaches this level, such as 50 %"),
                          0, true, 1, false));
      s.push_back(bounded(make("output", "uptake.*", K::quantity, Dim::dimensionless, "",
                               "the time the uptake fraction reaches this level, such as 50 % (a case that takes "
                               "the species up: every open face holds one constant concentration above the initial)"),
                          0, true, 1, false));
      s.push_back(positive(make("output", "loading", K::quantity, Dim::amount, "",
                                "amount the released fraction refers to (default: the initial amount)")));
      s.push_back(make("output", "time_lag.*", K::text, Dim::none, "",
                       "a boundary name: time lag of the amount through it, from its linear asymptote"));
      s.push_back(make("output", "flux.*", K::text, Dim::none, "",
                       "'in|out through FACE [at TIME]': the rate through a boundary at a time (the end if none), "
                       "in the case's amount per time"));
      s.push_back(make("output", "crossed.*", K::text, Dim::none, "",
                       "'in|out through FACE [by TIME]': the amount that crossed a boundary by a time (the end if "
                       "none)"));
      s.push_back(make("output", "peak_flux.*", K::text, Dim::none, "",
                       "'in|out through FACE': the largest rate through a boundary, and when (peak_flux.NAME.time)"));
      s.push_back(make("output", "flux_limit.*", K::text, Dim::none, "",
                       "'in|out through FACE reaches RATE': the first time the rate through a boundary reaches a "
                       "limit"));
      s.push_back(make("output", "crossed_limit.*", K::text, Dim::none, "",
                       "'in|out through FACE reaches AMOUNT': the first time the amount crossed reaches a limit"));
      s.push_back(make("output", "steady_flux.*", K::text, Dim::none, "",
                       "'in|out through FACE': the rate at the end, and whether it has become steady (changed by "
                       "less than 0.1 % over the last fifth of the run)"));
      s.push_back(make("output", "moments", K::flag, Dim::none, "false",
                       "mean position and variance of the content at output times"));
      return s;
    }
  } // namespace

  bool KeySpec::matches(const std::string &name) const
  {
    if (!is_pattern())
      return name == key;
    const std::string prefix = key.substr(0, key.size() - 1); // keeps the dot
    return name.size() > prefix.size() && name.compare(0, prefix.size(), prefix) == 0;
  }

  const std::vector<KeySpec> &key_schema()
  {
    static const std::vector<KeySpec> schema = build_schema();
    return schema;
  }

  const std::vector<std::string> &fixed_sections()
  {
    static const std::vector<std::string> names = {"case",     "geometry", "flow",        "initial", "time",
                                                   "numerics", "output",   "temperature", "sweep",   "size"};
    return names;
  }

  const std::vector<std::string> &named_section_kinds()
  {
    static const std::vector<std::string> names = {"region", "boundary", "stage"};
    return names;
  }

  std::string section_kind(const std::string &section)
  {
    const auto dot = section.find('.');
    if (dot == std::string::npos)
      return section;
    return section.substr(0, dot);
  }

  const KeySpec *find_key(const std::string &kind, const std::string &key)
  {
    for (const auto &spec : key_schema())
      if (spec.section == kind && spec.matches(key))
        return &spec;
    return nullptr;
  }

  std::vector<std::string> keys_of(const std::string &kind)
  {
    std::vector<std::string> keys;
    for (const auto &spec : key_schema())
      if (spec.section == kind)
        keys.push_back(spec.key);
    return keys;
  }

  std::string describe_dim(const Dim dim)
  {
    switch (dim)
      {
        case Dim::dimensionless:
          return "a pure number";
        case Dim::length:
          return "a length such as 2 mm";
        case Dim::time:
          return "a time such as 3 h";
        case Dim::diffusivity:
          return "a diffusivity such as 1e-9 m2/s";
        case Dim::velocity:
          return "a velocity such as 1e-7 m/s (a transfer coefficient, a Darcy flux)";
        case Dim::temperature:
          return "a temperature such as 1050 degC";
        case Dim::rate:
          return "a rate such as 0.07 1/yr";
        case Dim::concentration:
          return "a concentration such as 250 mg/L";
        case Dim::flux:
          return "a flux such as 1e-6 kg/(m2 s)";
        case Dim::source:
          return "a source such as 1e-3 kg/(m3 s)";
        case Dim::density:
          return "a density such as 1.6 g/cm3";
        case Dim::specific_volume:
          return "a distribution coefficient such as 0.5 mL/g";
        case Dim::activation_energy:
          return "an activation energy such as 3.46 eV or 148 kJ/mol";
        case Dim::bath_volume:
          return "a bath volume (whole, m3, in 3-D, for a sphere and axisymmetric; m2 per unit length in 2-D "
                 "and for a cylinder; m per unit area in 1-D)";
        case Dim::amount:
          return "an amount in this case's amount units";
        case Dim::boundary_value:
          return "a concentration or a flux";
        case Dim::none:
          break;
      }
    return "a value";
  }
} // namespace fickcast
